// T-counts of the library's routines after the Clifford+T lowering, against the published counts.
#include <doctest/doctest.h>

#include <iostream>

#include "frontend/load.h"
#include "ir/circuit.h"
#include "ir/classical_sim.h"
#include "ir/resources.h"
#include "passes/pipeline.h"
#include "support/families.h"

using namespace whittle;

namespace {

ir::Circuit load(const std::string& program) {
    frontend::SourceManager sm;
    return frontend::load_text(program, "tcount.wq", frontend::InputFormat::Wq, sm);
}

int64_t t_count_after(const std::string& program, int level, bool measure) {
    ir::Circuit c = load(program);
    passes::PassOptions o;
    o.target = ir::parse_optional_target("clifford+t");
    o.level = level;
    o.allow_measurement = measure;
    passes::run_passes(c, passes::pipeline_for(o), o);
    return int64_t(ir::count_resources(c).t_count);
}

std::string adder(unsigned n) {
    return "use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) + "]\nadd_and(a, b)\n";
}

}  // namespace

TEST_CASE("add_and: T-count with measured erase <= 4n, without measurement <= 8n + 8") {
    // Gidney 2018 (arXiv:1709.06648), Fig. 1: 4(n-1) T with the temporary AND's measured erase
    // (seen; formula derived, CHECKS.md). Without measurement the goal of issue 7 is 8n + 8.
    for (unsigned n : {2u, 4u, 5u, 8u, 16u, 32u}) {
        CAPTURE(n);
        int64_t with_measurement = t_count_after(adder(n), 2, true);
        int64_t without = t_count_after(adder(n), 2, false);
        MESSAGE("add_and n=" << n << ": T " << with_measurement << " with measurement, " << without << " without");
        CHECK(with_measurement <= int64_t(4 * n));
        CHECK(without <= int64_t(8 * n + 8));
    }
    CHECK(t_count_after(adder(5), 2, true) <= 16);  // the 5-bit adder of Gidney 2018: 16 T
}

TEST_CASE("gf2_mul n = 4, 5, 6 after -O2, against the published counts") {
    // GF(2^n) multipliers (x^4+x+1, x^5+x^2+1, x^6+x+1): n^2 Toffolis = 112, 175, 252 T unoptimized
    // (seen, CHECKS.md); 68, 115, 150 after phase folding (Amy-Maslov-Mosca 2014 arXiv:1303.2042 /
    // Nam et al. 2018 arXiv:1710.07345; memory, medium) and 39, 59, 77 best known (Ruiz et al. 2025,
    // arXiv:2402.14396, Table 1; seen). The library keeps the benchmark circuit's layout (low half,
    // c x^n mod p, high half; with c pre-divided by x^n so that any c works) and its Toffoli count;
    // -O2 must reach at most the phase-folding counts.
    const struct {
        unsigned n;
        int poly;
        int64_t original, phase_folding, best_known;
    } cases[] = {{4, 19, 112, 68, 39}, {5, 37, 175, 115, 59}, {6, 67, 252, 150, 77}};
    for (const auto& k : cases) {
        std::string n = std::to_string(k.n);
        std::string program = "use \"arith\"\nqubit a[" + n + "], b[" + n + "], c[" + n + "]\ngf2_mul(a, b, c, " +
                              std::to_string(k.poly) + ")\n";
        int64_t o0 = t_count_after(program, 0, false);
        int64_t o2 = t_count_after(program, 2, false);
        MESSAGE("gf2_mul n=" << k.n << ": T " << o0 << " at -O0, " << o2 << " at -O2 (published: " << k.original << ", "
                             << k.phase_folding << " phase folding, " << k.best_known << " best known)");
        CHECK(o0 == k.original);
        CHECK(o2 <= k.phase_folding);
    }
}

TEST_CASE("gf2_mul n = 8 after -O2 is no costlier than the published construction's circuit") {
    // The GF(2^8) multiplier of Maslov, Mathew, Cheung, Pradhan 2009 (arXiv:0710.1093) for
    // x^8+x^4+x^3+x+1, rebuilt in tests/support/families.h and compiled the same way: the library's
    // routine (which also works for c != 0) must not cost more T.
    const std::string program = "use \"arith\"\nqubit a[8], b[8], c[8]\ngf2_mul(a, b, c, 283)\n";
    const int64_t library = t_count_after(program, 2, false);
    ir::Circuit published = test::gf2_multiplier(8, 0x11B).circuit;
    passes::PassOptions o;
    o.target = ir::parse_optional_target("clifford+t");
    o.level = 2;
    passes::run_passes(published, passes::pipeline_for(o), o);
    const int64_t reference = int64_t(ir::count_resources(published).t_count);
    MESSAGE("gf2_mul n=8 at -O2: T " << library << "; the published construction's circuit: " << reference);
    CHECK(library <= reference);
}

TEST_CASE("less_than_and: 4 T per carry with measured erase, half of less_than's") {
    // One temporary AND per carry (n of them) at 4 T each, its erase a measurement: the AND of
    // Gidney 2018 (arXiv:1709.06648: the temporary AND costs 4 T and its erase none; from memory).
    // The MAJ-chain less_than keeps 2n Toffolis.
    for (unsigned n : {2u, 4u, 8u, 16u}) {
        CAPTURE(n);
        const std::string decl = "use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) + "], f\n";
        const int64_t with_and = t_count_after(decl + "less_than_and(a, b, f)\n", 2, true);
        const int64_t chain = t_count_after(decl + "less_than(a, b, f)\n", 2, true);
        MESSAGE("n=" << n << ": less_than_and " << with_and << " T, less_than " << chain << " T (with measurement)");
        CHECK(with_and == int64_t(4 * n));
        CHECK(with_and < chain);
    }
}
