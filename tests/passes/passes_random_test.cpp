// Every optimization pass on the shared random circuits (every op kind, conditions, measurement,
// pairs, ancillas): IR invariants, the project's equivalence checker, and the state-vector
// simulator as an independent cross-check on measurement-free circuits.
#include <doctest/doctest.h>

#include <cstdlib>
#include <iostream>

#include "ir/printer.h"
#include "verify/equivalence.h"
#include "passes/registry.h"
#include "pass_check.h"
#include "support/random_circuit.h"

using namespace whittle;

namespace {

bool has_measurement(const ir::Circuit& c) {
    for (const ir::Op& op : c.ops)
        if (op.kind == ir::OpKind::Measure || op.kind == ir::OpKind::Reset || op.is_conditioned()) return true;
    return false;
}

bool has_iswap(const ir::Circuit& c) {
    for (const ir::Op& op : c.ops)
        if (op.kind == ir::OpKind::ISwap) return true;
    return false;
}

/// With measurement: both circuits from the same random state with the same random draws. The
/// passes never move an op across a measurement, so equal states before each measurement give
/// equal outcomes, and the final states must agree (global phase included).
double branch_distance(const ir::Circuit& a, const ir::Circuit& b, uint64_t seed) {
    double worst = 0;
    for (uint64_t k = 0; k < 4; ++k) {
        std::mt19937_64 init(seed + k);
        ir::StateVector sa(a.num_qubits());
        sa.randomize(init);
        ir::StateVector sb = sa;
        std::mt19937_64 ra(seed * 31 + k), rb(seed * 31 + k);
        std::vector<uint8_t> ba, bb;
        sa.run(a, ba, ra);
        sb.run(b, bb, rb);
        worst = std::max(worst, (sa.amplitudes() - sb.amplitudes()).norm());
        if (ba != bb) worst = std::max(worst, 1.0);
    }
    return worst;
}

}  // namespace

TEST_CASE("each pass keeps the shared random circuits equivalent (checker + state vector)") {
    const char* mine[] = {"normalize", "cancel", "merge-controls", "fold-phases", "gate-cancel", "fold-rotations"};
    for (const char* name : mine) {
        const passes::PassInfo* info = passes::find_pass(name);
        REQUIRE(info);
        std::mt19937_64 rng(std::hash<std::string>{}(std::string(name)));
        int changed = 0, checked = 0, unitary = 0;
        for (int i = 0; i < 300; ++i) {
            test::RandomCircuitOptions o;
            o.max_ops = 50;
            o.measurement = i % 3 == 0;  // a third with measurement, conditions and resets
            o.barriers = i % 2 == 0;
            ir::Circuit before = test::random_circuit(rng, o);
            if (before.num_qubits() > 10) continue;
            ir::Circuit after = before;
            passes::PassResult r = info->run(after, {});
            ir::verify(after);
            if (!r.changed) {
                CHECK(after.ops.size() == before.ops.size());
                continue;
            }
            ++changed;
            if (has_measurement(before)) {  // the checker's branch engine is exercised by its own tests
                CHECK(branch_distance(before, after, uint64_t(i)) < 1e-9);
                continue;
            }
            passes::EquivOptions eo;
            eo.time_budget_seconds = 2;
            passes::EquivResult e = passes::check_equivalence(before, after, eo);
            INFO(std::string(name) << " circuit " << i << ": " << e.engine << " " << e.confidence << " " << e.detail);
            // Known checker issue at this commit: its path-sum engine reports iSWAP circuits that
            // differ only in control order as not equivalent; the state vector decides those.
            if (!has_iswap(before)) CHECK(e.verdict != passes::Verdict::NotEquivalent);
            if (e.verdict == passes::Verdict::NotEquivalent && std::getenv("WHITTLE_DUMP"))
                std::cout << ir::print_wq(before) << "----\n" << ir::print_wq(after);
            if (e.verdict == passes::Verdict::Equivalent) ++checked;
            ++unitary;
            CHECK(test::state_distance(before, after, rng) < 1e-9);
        }
        MESSAGE(std::string(name) << ": " << changed << " changed, " << unitary << " without measurement, " << checked
                                  << " of those proved equivalent by the checker");
        CHECK(changed > 0);
        CHECK(checked * 10 >= unitary * 8);
    }
}
