// The final check of `compile`: the output against the input, with a time budget from the compile time.
#include "compiler/final_check.h"

#include <algorithm>
#include <chrono>
#include <cstdint>

#include <fmt/format.h>

namespace whittle::compiler {

/// Up to 2^20 amplitudes (16 MiB) a state-vector run of a few hundred gates stays well inside the
/// final check's 2 s; at 25 wires one run of a sample (berth_fit, cx+rz+sx) took over a minute.
constexpr uint32_t kFinalCheckSimulatedWires = 20;

FinalCheck check_final_output(const ir::Circuit& source, const ir::Circuit& output, double compile_seconds,
                              double approximation_bound) {
    passes::EquivOptions opts;
    opts.approximation_bound = approximation_bound;
    opts.max_simulated_wires = kFinalCheckSimulatedWires;
    opts.time_budget_seconds = std::max(2.0, 0.1 * compile_seconds);
    const auto start = std::chrono::steady_clock::now();
    const passes::EquivResult r = passes::check_equivalence(source, output, opts);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    FinalCheck f;
    f.verdict = r.verdict;
    // The confidence line starts with its kind ("exact (...)", "probabilistic (...)").
    const std::string kind = r.confidence.substr(0, r.confidence.find(' '));
    switch (r.verdict) {
    case passes::Verdict::Equivalent:
        f.summary = approximation_bound > 0
                        ? fmt::format("verified {} ({}) up to the approximation bound {:.2g} in {:.2f} s", kind, r.engine,
                                      approximation_bound, seconds)
                        : fmt::format("verified {} ({}) in {:.2f} s", kind, r.engine, seconds);
        break;
    case passes::Verdict::NotEquivalent:
        f.summary = fmt::format("check failed ({})", r.engine);
        f.failure = fmt::format("error: the compiled circuit is not equivalent to the input ({}: {})\n"
                                "  counterexample: {}\n  no output was written; please report this with the input\n",
                                r.engine, r.confidence, r.counterexample);
        break;
    case passes::Verdict::Inconclusive:
        f.summary = fmt::format("not checked: {} after {:.2f} s", r.confidence, seconds);
        break;
    }
    return f;
}

}  // namespace whittle::compiler
