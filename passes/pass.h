// What every pass sees and returns: the options of the run and a report of what it changed.
#pragma once

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

/// What the user asked the compiler to minimise when constructions compete.
enum class Metric : uint8_t { TCount, TwoQubit, Depth };

/// Options every pass may read. Filled from the command line (frontend/cli) or the Python module.
struct PassOptions {
    std::string target = "";          ///< gate set name ("clifford+t", "nct", ...); empty = stay high level
    int level = 2;                    ///< -O level
    Metric optimize_for = Metric::TCount;
    bool allow_measurement = false;   ///< measurement-based uncompute and feed-forward allowed
    uint32_t extra_ancillas = 0;      ///< fresh clean wires the lowering may add
    double epsilon = 1e-10;           ///< per-rotation approximation error (clifford+t)
};

/// What a pass did. `changed` is false exactly when the circuit was left untouched.
struct PassResult {
    bool changed = false;
    std::vector<std::pair<std::string, int64_t>> stats;  ///< named counters ("pairs-cancelled", 3)
    std::vector<std::string> notes;                      ///< e.g. the construction chosen for an op
    void count(const std::string& name, int64_t by = 1);
};

using PassFn = PassResult (*)(ir::Circuit&, const PassOptions&);

/// Where in the pipeline a pass belongs; the registry keeps them in this order of stages.
enum class Stage : uint8_t { HighLevel, Lowering, LowLevel };

struct PassInfo {
    const char* name;     ///< the name used by --passes and --dump-after
    const char* summary;  ///< one line for --help and the report
    Stage stage;
    PassFn run;
};

}  // namespace whittle::passes
