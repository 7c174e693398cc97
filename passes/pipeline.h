// The -O0..-O3 pipelines and the runner that executes a list of passes with logging and checks.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// The pass names run for these options (level and target), in order. The lists live in pipeline.cpp.
std::vector<std::string> pipeline_for(const PassOptions& opts);

/// Per-pass record for --stats, --time-passes and the JSON report.
struct PassRecord {
    std::string name;
    bool changed = false;
    size_t ops_before = 0, ops_after = 0;
    int64_t t_before = 0, t_after = 0;
    int64_t cnot_before = 0, cnot_after = 0;
    double seconds = 0;      ///< wall time of the pass
    double cpu_seconds = 0;  ///< CPU time of the pass on its thread (meaningful on a busy machine)
    /// The process's peak resident memory so far, read after the pass (KiB; 0 where the system
    /// does not tell). It is the whole process's: meaningful when one compile runs at a time.
    long peak_rss_kib = 0;
    std::string checked_by;  ///< equivalence engine that validated this pass under --verify ("" = unchecked)
    PassResult result;
};

/// Hooks the driver can set; all optional.
struct PipelineHooks {
    /// Called after each pass with (name, circuit before, circuit after); may throw to stop the run.
    /// Only called when set (copying the circuit before each pass costs memory).
    std::function<std::string(const std::string&, const ir::Circuit&, const ir::Circuit&)> verify;
    /// Called after each pass that changed the circuit (for --dump-after).
    std::function<void(const std::string&, const ir::Circuit&)> after_pass;
    /// Progress: (pass name, index, count).
    std::function<void(const std::string&, size_t, size_t)> progress;
};

/// Runs the named passes in order. Throws UserError for an unknown pass name.
std::vector<PassRecord> run_passes(ir::Circuit& c, const std::vector<std::string>& names,
                                   const PassOptions& opts, const PipelineHooks& hooks = {});

/// Splits "a,b,c" into names and checks each exists (UserError naming the unknown one).
std::vector<std::string> parse_pass_list(const std::string& list);

}  // namespace whittle::passes
