// Benchmark: the equivalence checker on large Clifford+T adders, by the path sum and by the zx engine.
#include <chrono>
#include <cstdio>
#include <cstring>

#include "compiler/compile.h"
#include "ir/resources.h"
#include "support/textbook_circuits.h"
#include "verify/equiv_engines.h"
#include "verify/equivalence.h"
#include "zx/from_circuit.h"
#include "zx/simplify.h"

using namespace whittle;

namespace {

double seconds_since(std::chrono::steady_clock::time_point t0) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

/// `copies` ripple-carry adders in a row on one set of wires (a += b, `copies` times).
ir::Circuit repeated_adder(uint32_t n, bool clifford_t, uint32_t copies) {
    ir::Circuit c = testing::cuccaro_adder(n, clifford_t);
    const std::vector<ir::Op> one = c.ops;
    for (uint32_t k = 1; k < copies; ++k) c.ops.insert(c.ops.end(), one.begin(), one.end());
    return c;
}

void row(const char* what, const ir::Circuit& a, const ir::Circuit& b, double budget, bool zx_only) {
    passes::EquivOptions opts;
    opts.time_budget_seconds = budget;
    const auto t0 = std::chrono::steady_clock::now();
    passes::EquivResult r;
    if (zx_only) {
        const passes::equiv::Aligned al = passes::equiv::align(a, b);
        const passes::equiv::Deadline dl(budget);
        const auto e = passes::equiv::check_zx(al, opts, dl, budget);
        r = e ? *e : passes::EquivResult{};
        r.engine = "zx";
    } else {
        r = passes::check_equivalence(a, b, opts);
    }
    const double s = seconds_since(t0);
    std::printf("%-34s %-7u %-8zu %-8zu %-16s %-12s %.3f\n", what, b.num_qubits(), a.ops.size(), b.ops.size(),
                passes::verdict_name(r.verdict), r.engine.c_str(), s);
}

}  // namespace

int main(int argc, char** argv) {
    const bool quick = argc > 1 && std::strcmp(argv[1], "--quick") == 0;
    std::printf("%-34s %-7s %-8s %-8s %-16s %-12s %s\n", "pair", "qubits", "ops a", "ops b", "verdict", "engine",
                "seconds");
    // The checker as dispatched (zx first on wide circuits), Toffoli form against Clifford+T.
    for (uint32_t n : {4u, 8u, 16u, 29u, 48u, 64u}) {
        if (quick && n > 16) break;
        char what[64];
        std::snprintf(what, sizeof what, "adder %u bits: toffoli vs 7-T", n);
        row(what, testing::cuccaro_adder(n, false), testing::cuccaro_adder(n, true), 120, false);
    }
    // The goal of issue 22: an adder against its optimized form, ~100 qubits and 10^4 gates. Two
    // optimized forms: the -O2 pipeline without reduce-t (gate cancellation and phase folding, which
    // merge phases on equal parities), and the whole -O2 pipeline, whose reduce-t rewrites phase
    // polynomials by identities that hold as functions only (TODD), which graph-like simplification
    // does not derive.
    const char* without_todd =
        "normalize,cancel,merge-controls,fold-phases,cancel,pair-uncompute,plan-ancillas,lower-controls,"
        "pair-uncompute,lower-toffoli,gate-cancel,fold-rotations,gate-cancel,to-target,fuse-1q";
    for (uint32_t copies : {1u, 3u, 6u}) {
        if (quick && copies > 1) break;
        const ir::Circuit ct = repeated_adder(49, true, copies);
        for (int full = 0; full < 2; ++full) {
            compiler::CompileOptions co;
            co.target = ir::Target::CliffordT;
            co.level = 2;
            co.check = false;
            if (!full) co.passes = without_todd;
            const compiler::CompileResult opt = compiler::compile(ct, co);
            char what[64];
            std::snprintf(what, sizeof what, "%ux adder 49 bits vs %s (zx)", copies, full ? "-O2" : "-O2 no TODD");
            row(what, ct, opt.circuit, 60, true);
            std::snprintf(what, sizeof what, "%ux adder 49 bits vs %s (all)", copies, full ? "-O2" : "-O2 no TODD");
            row(what, ct, opt.circuit, full ? 20 : 60, false);
            std::printf("  (T %llu -> %llu)\n", (unsigned long long)ir::count_t_and_cnot(ct).t_count,
                        (unsigned long long)ir::count_t_and_cnot(opt.circuit).t_count);
        }
    }
    // Growth: the diagram of one circuit (N Clifford+T adders in a row, 100 wires) simplified,
    // at 10^4 and 10^5 ops.
    std::printf("\n%-34s %-8s %-10s %-10s %-10s %s\n", "simplify one diagram", "ops", "vertices", "left",
                "rewrites", "seconds");
    for (uint32_t copies : {6u, 60u}) {
        if (quick && copies > 6) break;
        const ir::Circuit ct = repeated_adder(49, true, copies);
        const auto t0 = std::chrono::steady_clock::now();
        zx::Graph g;
        zx::circuit_to_graph(ct, g);
        const size_t built = g.num_vertices();
        zx::SimplifyStats st;
        const bool done = zx::reduce_to_fixpoint(g, st, std::chrono::steady_clock::now() + std::chrono::seconds(120));
        char what[64];
        std::snprintf(what, sizeof what, "%ux adder 49 bits%s", copies, done ? "" : " (stopped)");
        std::printf("%-34s %-8zu %-10zu %-10zu %-10zu %.3f\n", what, ct.ops.size(), built, g.num_vertices(), st.total(),
                    seconds_since(t0));
    }
    return 0;
}
