// The one compile entry point: a program and typed options in, the compiled circuit, its text, the
// report and the check's verdict out. The CLI, the Python module, `whittle demo` and the benchmarks call it.
#pragma once

#include <array>
#include <cstdint>
#include <functional>
#include <iosfwd>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "ir/circuit.h"
#include "ir/target.h"
#include "output/cost_by_line.h"
#include "output/report.h"
#include "passes/pipeline.h"

namespace whittle::frontend {
class SourceManager;
}

namespace whittle::compiler {

/// The output text's format; None emits nothing (the caller only wants the circuit or the report).
enum class Emit : uint8_t { None, Wq, Qasm2, Qasm3 };
/// "", "wq", "qasm2", "qasm3" (the report's "emit" field).
const char* emit_name(Emit e);

/// Everything a compile can be asked. A new option is a field here, read in compile.cpp.
struct CompileOptions {
    std::optional<ir::Target> target;  ///< the native gate set; none = stay high level
    int level = 2;                     ///< -O level
    ir::Metric optimize_for = ir::Metric::TCount;
    bool allow_measurement = false;    ///< measurement-based uncompute and feed-forward allowed
    uint32_t extra_ancillas = 0;       ///< fresh clean wires the lowering may add
    /// Fresh clean wires reduce-t may add to replace inner H gates by measured Hadamard gadgets
    /// (only with allow_measurement; 0 = none). Every stretch reuses them.
    uint32_t gadget_wires = 0;
    double epsilon = 1e-10;            ///< per-rotation approximation error (clifford+t), in [1e-15, 1)
    /// Budget of the rule search at -O3 (rewrite-search, docs/rules.md): 0 turns it off; each unit
    /// adds 32 search rounds, 4000 rewrites and 150000 match attempts (a 1 s cap). At most 100.
    uint32_t rewrite_effort = 1;
    uint32_t resynth_effort = 0;    ///< resynth-3q budget at -O3 (0 = off; PassOptions::resynth_effort)
    /// split-work-lives before the lowering (PassOptions::split_work_lives); compile also tries the
    /// runs without it when it split anything (inputs up to 2^20 ops), and keeps the cheaper.
    bool split_work_lives = true;
    /// lower-controls takes work wires only where they are live already (PassOptions::
    /// work_wires_within_lives); compile tries it under qubit_limit.
    bool work_wires_within_lives = false;
    /// The approximation error allowed for the whole circuit (clifford+t): split evenly over the
    /// rotations the synthesis approximates, so the report's approximation_error_bound stays within
    /// it; replaces `epsilon` (set one or the other). In [1e-15, 1).
    std::optional<double> total_error;
    /// The most qubits the output may have: among the runs compile tries (levels, with and without
    /// --allow-measurement and --extra-ancillas, each construction metric, shared or fresh work
    /// wires, work wires taken only inside their lives) the cheapest that fits is kept, even when an unlimited run is cheaper; UserError when
    /// none fits. Inputs of any size then try the alternative runs.
    std::optional<uint32_t> qubit_limit;
    std::string passes;                ///< run exactly this comma-separated list ("" = the -O pipeline)
    std::vector<std::string> dump_after;  ///< print the circuit after these passes ("all": every one)
    bool stats = false;                   ///< one line per pass with its changes and counters
    bool time_passes = false;             ///< one line per pass with its time and peak memory
    /// Where the dump_after, stats and time_passes text goes, as it happens (none: nowhere).
    std::ostream* log = nullptr;
    /// Check the output against the input (within max(2 s, 10% of the compile time), inputs up to
    /// kFinalCheckMaxOps ops) and refuse an input whose declared ancillas are left dirty.
    bool check = true;
    Emit emit = Emit::None;
    bool report = false;               ///< build the JSON report (CompileResult::report)
    std::string input_name;            ///< the input as the user named it (report, messages)
    std::vector<std::string> include_dirs;  ///< extra folders searched by `use` (compile_file)
    /// Sum the output's cost by source line (CompileResult::line_costs, the report's "cost_by_line");
    /// compile_file then locates what an outermost routine call makes at the call.
    bool cost_by_line = false;
    /// With cost_by_line: each op's cost stays at the line that wrote it, inside its routine (in a
    /// `use` file too), instead of moving to the outermost call (the per-routine view).
    bool cost_in_routines = false;
    /// Roles declared for registers of the input, by name (`--role NAME=ROLE`): an OpenQASM file
    /// cannot say which wires start clean. Set on the input before anything else, so a declared
    /// `ancilla` is held to its contract like one declared in a .wq program; a name that is not a
    /// quantum register of the input is refused.
    std::vector<std::pair<std::string, ir::Role>> register_roles;

    /// Per-pass translation validation (PipelineHooks::verify): returns the engine that decided,
    /// throws PassCheckFailure for a pass that changed the meaning. Unset = not checked per pass.
    std::function<std::string(const std::string&, const ir::Circuit&, const ir::Circuit&)> verify_pass;
    /// Progress: (pass name, index, count), and once when the passes are done.
    std::function<void(const std::string&, size_t, size_t)> progress;
    std::function<void()> passes_done;
};

/// Thrown by a `verify_pass` hook: a pass produced a circuit that is not equivalent to its input.
/// The message names the pass and the counterexample; compile() returns it as PassCheckFailed.
class PassCheckFailure : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

enum class CompileStatus : uint8_t {
    Ok,
    PassCheckFailed,   ///< verify_pass refused a pass (CompileResult::failure)
    CheckFailed,       ///< the output is not equivalent to the input (CompileResult::failure)
};

struct CompileResult {
    CompileStatus status = CompileStatus::Ok;
    std::string failure;        ///< the message when status is not Ok (ends with a newline)
    ir::Circuit circuit;        ///< the compiled circuit
    std::string text;           ///< `circuit` in CompileOptions::emit's format
    lowering::Json report;      ///< the compile report when CompileOptions::report (else null)
    std::vector<passes::PassRecord> records;  ///< one per pass run
    /// The check's verdict: "verified exact (path-sum) in 0.02 s", "not checked: ...", with a note
    /// when the ancillas were not proven returned; "" when CompileOptions::check is off.
    std::string check_summary;
    /// When a run with fewer options or another construction metric gave the kept result (see
    /// alternative_runs): its label, e.g. "without --allow-measurement"; "" for the run asked for.
    std::string kept_run;
    /// The output's cost by source line, largest first (CompileOptions::cost_by_line; else empty).
    std::vector<lowering::LineCost> line_costs;
    /// With CompileOptions::qubit_limit, when the cheapest run did not fit: what the limit cost,
    /// e.g. "--qubit-limit 12: T 290 instead of 269 (17 qubits)"; else "".
    std::string limit_note;
};

/// Inputs up to this many ops keep a copy of themselves for the final check; larger ones are
/// reported as not checked (the copy and the check would cost more than the compile's budget).
inline constexpr size_t kFinalCheckMaxOps = size_t(1) << 18;

/// The pass options these compile options give.
passes::PassOptions pass_options(const CompileOptions& o);

/// The pass names a compile with these options runs.
std::vector<std::string> pass_names(const CompileOptions& o);

/// Refuses option values that would be ignored or would make the output or the report say
/// something that is not so (UserError). compile() calls it; a driver may call it before reading
/// any input.
void check_options(const CompileOptions& o);

/// The other runs a compile of an input of `input_ops` ops also tries, each labelled by how it
/// differs ("at -O1, without --allow-measurement"): every combination of a level from -O1 up, fewer
/// options (no measurement, no extra wires) and the construction metrics. Empty for an explicit
/// --passes list, -O0/-O1, no target, or inputs over 2000 ops. compile() keeps the cheapest result
/// under CompileOptions::optimize_for (the run asked for on a tie).
std::vector<std::pair<std::string, CompileOptions>> alternative_runs(const CompileOptions& o, size_t input_ops);

/// The lexicographic cost of a circuit under `o`: over --qubit-limit first (0 or 1), then the
/// metric of --optimize-for, the other metrics, and qubits.
std::array<uint64_t, 5> cost_under(const ir::Resources& r, const CompileOptions& o);

/// Compiles `input`. UserError for bad options, an input that leaves a declared ancilla dirty, or
/// a --passes list that leaves the target; a failed check is a status, not an exception.
CompileResult compile(ir::Circuit input, const CompileOptions& o);

/// Reads `path` (.wq or .qasm, `use` searched in o.include_dirs; sources go into `sm` for
/// messages) and compiles it.
CompileResult compile_file(const std::string& path, const CompileOptions& o, frontend::SourceManager& sm);

}  // namespace whittle::compiler
