// The check of a compile's output against its input, run by default (`--no-check` skips it).
#pragma once

#include <string>

#include "ir/circuit.h"
#include "verify/equivalence.h"

namespace whittle::compiler {

struct FinalCheck {
    passes::Verdict verdict = passes::Verdict::Inconclusive;
    std::string summary;  ///< "verified exact (path-sum) in 0.02 s", "not checked: over budget (...)"
    std::string failure;  ///< for NotEquivalent: the error message with the counterexample
};

/// Checks `output` against `source` within max(2 s, 10% of `compile_seconds`): the exact engines
/// first, the probabilistic ones (labelled so) when no exact one applies. `approximation_bound` is
/// the compile's total rotation-approximation error (the passes' error_bound summed).
FinalCheck check_final_output(const ir::Circuit& source, const ir::Circuit& output, double compile_seconds,
                              double approximation_bound);

}  // namespace whittle::compiler
