// `compile --verify`: the per-pass equivalence check (translation validation) and its failure files.
#pragma once

#include <string>

#include "compiler/compile.h"
#include "ir/circuit.h"
#include "verify/equivalence.h"

namespace whittle::cli {

/// A pass produced a circuit that is not equivalent to its input. The message names the pass,
/// the counterexample and the files written; compiler::compile turns it into PassCheckFailed.
using VerifyFailure = compiler::PassCheckFailure;

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
