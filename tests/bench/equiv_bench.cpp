// Benchmark: the path-sum checker on Clifford+T ripple-carry adders against their Toffoli form.
#include <chrono>
#include <cstdio>

#include "verify/equivalence.h"
#include "support/textbook_circuits.h"

int main() {
    using namespace whittle;
    std::printf("%-8s %-8s %-8s %-16s %-12s %s\n", "bits", "qubits", "T", "verdict", "engine", "seconds");
    for (uint32_t n : {4u, 8u, 16u, 29u, 48u, 64u}) {
        const ir::Circuit spec = testing::cuccaro_adder(n, false), ct = testing::cuccaro_adder(n, true);
        passes::EquivOptions opts;
        opts.time_budget_seconds = 120;
        const auto t0 = std::chrono::steady_clock::now();
        const passes::EquivResult r = passes::check_equivalence(spec, ct, opts);
        const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        std::printf("%-8u %-8u %-8u %-16s %-12s %.3f\n", n, ct.num_qubits(), 14 * n, passes::verdict_name(r.verdict),
                    r.engine.c_str(), s);
    }
    return 0;
}
