// What every pass sees and returns: the options of the run and a report of what it changed.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "ir/circuit.h"
#include "ir/target.h"

namespace whittle::passes {

/// What the user asked the compiler to minimise when constructions compete (ir/target.h).
using ir::Metric;

/// Options every pass may read. Filled by compiler::compile from its typed options.
struct PassOptions {
    std::optional<ir::Target> target; ///< the native gate set; none = stay high level
    int level = 2;                    ///< -O level
    Metric optimize_for = Metric::TCount;
    bool allow_measurement = false;   ///< measurement-based uncompute and feed-forward allowed
    uint32_t extra_ancillas = 0;      ///< fresh clean wires the lowering may add
    uint32_t gadget_wires = 0;        ///< fresh clean wires reduce-t may add for Hadamard gadgets (with allow_measurement)
    double epsilon = 1e-10;           ///< per-rotation approximation error (clifford+t)
    uint32_t resynth_effort = 0;      ///< resynth-3q budget (0 = off, the default; each unit: 4000 optimizer steps per block, 400000 per pass)
    bool split_work_lives = true;     ///< run split-work-lives before the lowering (-O2 and up, with a target)
    bool work_wires_within_lives = false;
    std::optional<uint32_t> qubit_limit;  ///< --qubit-limit: reduce-t keeps no rebuild that lifts the peak of live qubits above it ///< lower-controls takes or borrows a work wire only where it is live already (no wire added)
    uint32_t rewrite_effort = 1;      ///< rewrite-search budget (0 = off; each unit: 32 rounds, 4000 rewrites, 150000 match attempts)
};

/// The decomposition a lowering step chose for one op; the JSON report lists these under
/// "constructions" (docs/report-schema.md). Lowering passes push one per op they rewrite.
struct Construction {
    std::string op;          ///< the op as it read before lowering (ir::print_op), e.g. "flag ^= a[0] & a[1] & a[2]"
    std::string method;      ///< the construction's name, e.g. "clean-ladder", "toffoli-7t", "temporary-and"
    std::string reason;      ///< why it won, e.g. "2 clean wires free: w[0], w[1]" ("" = the only choice)
    ir::SourceLoc loc;       ///< where the op came from (line 0 = compiler-made)
    int64_t t_count = -1;    ///< T gates it cost (-1 = not counted)
    int64_t cnot_count = -1; ///< CNOTs it cost (-1 = not counted)
};

/// What a pass did. `changed` is false exactly when the circuit was left untouched.
struct PassResult {
    bool changed = false;
    std::vector<std::pair<std::string, int64_t>> stats;  ///< named counters ("pairs-cancelled", 3)
    std::vector<std::string> notes;                      ///< free-form remarks, listed per pass in the report
    std::vector<Construction> constructions;             ///< the construction chosen for each lowered op
    double error_bound = 0;  ///< operator-norm error this pass introduced (rotation approximation); 0 = exact
    void count(const std::string& name, int64_t by = 1);
};

using PassFn = PassResult (*)(ir::Circuit&, const PassOptions&);

/// Where in the pipeline a pass belongs; the registry keeps them in this order of stages.
enum class Stage : uint8_t { HighLevel, Lowering, LowLevel };

struct PassInfo {
    const char* name;     ///< the name used by --passes and --dump-after
    const char* summary;  ///< one line for `whittle passes`
    Stage stage;
    PassFn run;
};

}  // namespace whittle::passes
