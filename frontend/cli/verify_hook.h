// `compile --verify`: the per-pass equivalence check (translation validation) and its failure files.
#pragma once

#include <stdexcept>
#include <string>

#include "ir/circuit.h"
#include "passes/equivalence.h"

namespace whittle::cli {

/// A pass produced a circuit that is not equivalent to its input. The message names the pass,
/// the counterexample and the files written.
class VerifyFailure : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

/// Checks each pass's output against its input (PipelineHooks::verify). On a difference writes
/// whittle-verify-<pass>-before.wq, -after.wq and -counterexample.txt into `folder` and throws
/// VerifyFailure; an undecided check prints a warning and is recorded as "inconclusive". `tag`
/// goes after "whittle-verify-" so that parallel compiles into one folder write distinct files.
class PassVerifier {
public:
    PassVerifier(std::string folder, passes::EquivOptions opts, std::string tag = "")
        : folder_(std::move(folder)), opts_(opts), tag_(std::move(tag)) {}
    /// Returns the engine that decided, for PassRecord::checked_by.
    std::string operator()(const std::string& pass, const ir::Circuit& before, const ir::Circuit& after) const;

private:
    std::string folder_;
    passes::EquivOptions opts_;
    std::string tag_;
};

/// The folder failure files go to: the output's folder, or the current one for stdout.
std::string verify_folder_for(const std::string& output);

}  // namespace whittle::cli

namespace whittle::cli {

/// The check of a compile's output against its input, run by default (`--no-check` skips it).
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

}  // namespace whittle::cli
