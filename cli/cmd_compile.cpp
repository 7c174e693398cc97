// `whittle compile`: the arguments, the output files and the summary line around compiler::compile; -j runs a batch.
#include <algorithm>
#include <atomic>
#include <chrono>
#include <filesystem>
#include <iostream>
#include <map>
#include <memory>
#include <mutex>
#include <sstream>
#include <thread>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "cli/commands.h"
#include "cli/driver.h"
#include "cli/progress.h"
#include "cli/verify_hook.h"
#include "compiler/compile.h"
#include "frontend/diagnostics.h"
#include "ir/resources.h"
#include "passes/registry.h"

namespace whittle::cli {
namespace {

struct CompileArgs {
    std::vector<std::string> inputs;
    std::string output;
    unsigned jobs = 1;
    std::string target;
    bool target_given = false;  // --target was on the command line (even as '')
    int level = 2;
    std::string optimize_for = "t";
    bool allow_measurement = false;
    bool verify = false;
    bool no_check = false;
    std::string report;
    std::string emit;
    std::string passes;
    std::vector<std::string> dump_after;
    bool time_passes = false;
    bool stats = false;
    uint32_t extra_ancillas = 0;
    uint32_t gadget_wires = 0;
    uint32_t rewrite_effort = 1;
    uint32_t resynth_effort = 0;
    double epsilon = 1e-10;
    std::optional<double> total_error;
    std::optional<uint32_t> qubit_limit;
    bool quiet = false;
    bool cost_by_line = false;
    bool cost_in_routines = false;
    std::vector<std::string> include_dirs;
    std::vector<std::string> roles;  // --role NAME=ROLE, as written
};

/// One compile: an input, where its output and its report go ("" = stdout / no report), and the tag
/// that keeps its --verify failure files apart from the other inputs' in a batch.
struct Job {
    std::string input;
    std::string output;
    std::string verify_tag;
    std::string report;
};

/// What a batch's closing table shows of one job; `done` is false when it failed.
struct JobRow {
    bool done = false;
    uint64_t qubits = 0, cost = 0, two_qubit = 0, depth = 0;
    double seconds = 0;
    std::string check;
};

/// The check's verdict in a few words: "verified exact (path-sum) in 0.02 s (...)" -> "verified
/// exact", with " (ancillas unproven)" when the clean wires were not proven returned.
std::string short_verdict(const std::string& summary) {
    size_t cut = summary.size();
    for (const char* stop : {" (", " in ", ":", ";"}) cut = std::min(cut, summary.find(stop));
    std::string v = summary.substr(0, cut);
    if (summary.find("ancillas not proven") != std::string::npos) v += " (ancillas unproven)";
    return v;
}

/// On a rotation target every non-Clifford rotation is one native rotation, so that is the cost
/// figure shown; T on clifford+t (and nct, which has none) and with no target.
bool rotation_target(const CompileArgs& a) { return !a.target.empty() && a.target != "clifford+t" && a.target != "nct"; }

std::string emit_format(const CompileArgs& a, const std::string& output) {
    if (!a.emit.empty()) return a.emit;
    auto ends = [&](const char* ext) {
        std::string e(ext);
        return output.size() >= e.size() && output.compare(output.size() - e.size(), e.size(), e) == 0;
    };
    if (ends(".qasm3")) return "qasm3";
    if (ends(".qasm")) return "qasm2";
    return "wq";
}

bool ends_with(const std::string& s, const char* ext) {
    const std::string e(ext);
    return s.size() >= e.size() && s.compare(s.size() - e.size(), e.size(), e) == 0;
}

compiler::Emit parse_emit(const std::string& e) {
    if (e == "wq") return compiler::Emit::Wq;
    if (e == "qasm2") return compiler::Emit::Qasm2;
    if (e == "qasm3") return compiler::Emit::Qasm3;
    throw UserError(fmt::format("--emit takes wq, qasm2 or qasm3, not '{}'", e));
}

/// One `--role NAME=ROLE`: ROLE is a .wq declaration word (qubit, ancilla, borrow).
std::pair<std::string, ir::Role> parse_role(const std::string& arg) {
    const size_t eq = arg.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == arg.size())
        throw UserError(fmt::format("--role '{}' needs REGISTER=ROLE, ROLE one of qubit, ancilla, borrow", arg));
    const std::string name = arg.substr(0, eq), word = arg.substr(eq + 1);
    for (ir::Role r : {ir::Role::Data, ir::Role::Clean, ir::Role::Dirty})
        if (word == ir::role_name(r)) return {name, r};
    throw UserError(fmt::format("--role '{}': unknown role '{}' (expected qubit, ancilla or borrow)", arg, word));
}

/// The compile options of the command line, the target and the metric parsed here once; the
/// output format and the report are per job (compile_one).
compiler::CompileOptions compile_options(const CompileArgs& a) {
    if (a.target_given && a.target.empty())
        throw UserError(fmt::format("--target needs a gate set (known targets: {})", ir::known_target_names()));
    compiler::CompileOptions o;
    if (!a.target.empty()) {
        bool known = false;
        for (ir::Target t : ir::all_targets()) known = known || a.target == ir::target_name(t);
        if (!known)
            throw UserError(fmt::format("--target '{}' is not a known target (known targets: {})", a.target,
                                        ir::known_target_names()));
        o.target = ir::parse_target(a.target);
    }
    if (!a.emit.empty()) parse_emit(a.emit);
    o.optimize_for = ir::parse_metric(a.optimize_for, "--optimize-for");
    o.level = a.level;
    o.allow_measurement = a.allow_measurement;
    o.extra_ancillas = a.extra_ancillas;
    o.gadget_wires = a.gadget_wires;
    o.rewrite_effort = a.rewrite_effort;
    o.resynth_effort = a.resynth_effort;
    o.epsilon = a.epsilon;
    o.total_error = a.total_error;
    o.qubit_limit = a.qubit_limit;
    o.passes = a.passes;
    o.dump_after = a.dump_after;
    o.stats = a.stats;
    o.time_passes = a.time_passes;
    o.check = !a.no_check;
    o.include_dirs = a.include_dirs;
    o.cost_by_line = a.cost_by_line || a.cost_in_routines;
    o.cost_in_routines = a.cost_in_routines;
    for (const std::string& r : a.roles) o.register_roles.push_back(parse_role(r));
    return o;
}

/// Refuses, before any input is read, option values that would be ignored or would make the output
/// or the report say something that is not so.
void check_options(const CompileArgs& a) {
    namespace fs = std::filesystem;
    compiler::check_options(compile_options(a));

    // One input: the output's format comes from its extension unless --emit names it.
    std::error_code ec;
    const bool to_stdout = a.output.empty() || a.output == "-";
    if (a.inputs.size() == 1 && !to_stdout && a.emit.empty() && !ends_with(a.output, ".wq") && !ends_with(a.output, ".qasm") &&
        !ends_with(a.output, ".qasm3")) {
        const fs::file_status st = fs::status(a.output, ec);
        const bool special = !ec && fs::exists(st) && !fs::is_regular_file(st);  // a folder (batch), /dev/null, a pipe
        if (!special)
            throw UserError(fmt::format("-o '{}': the extension names no output format (.wq, .qasm or .qasm3); add --emit wq, "
                                        "qasm2 or qasm3 to write this name",
                                        a.output));
    }
    if (!a.report.empty()) {
        const bool report_stdout = a.report == "-";
        if ((report_stdout && to_stdout) ||
            (!report_stdout && !to_stdout && !fs::is_directory(a.report, ec) &&
             fs::weakly_canonical(a.report, ec) == fs::weakly_canonical(a.output, ec)))
            throw UserError(fmt::format("--report '{}' and the output are the same file; give the report a name of its own",
                                        report_stdout ? std::string("-") : a.report));
    }
}

/// The --cost-by-line table: one row per source line, largest first, at most kMaxCostRows of them.
std::string cost_table(const compiler::CompileResult& r, const frontend::SourceManager& sm) {
    constexpr size_t kMaxCostRows = 20;
    const ir::Resources all = ir::count_resources(r.circuit);
    std::string out = fmt::format("cost by source line (in all: T {}, two-qubit {}, rotations {}, qubits {}):\n",
                                  all.t_count, all.two_qubit_count, all.non_clifford_rotations, all.qubits);
    out += fmt::format("{:>8} {:>9} {:>9} {:>8} {:>6}  {}\n", "T", "two-qubit", "rotations", "ops", "qubits", "line");
    size_t shown = 0;
    for (const lowering::LineCost& row : r.line_costs) {
        const bool last = &row == &r.line_costs.back();
        if (shown == kMaxCostRows && !last) {
            out += fmt::format("{:>8} ({} more lines)\n", "...", r.line_costs.size() - shown - 1);
            shown = r.line_costs.size();  // print only the unattributed row after this
            continue;
        }
        if (shown > kMaxCostRows && row.line != 0) continue;
        ++shown;
        std::string where = "(no single line: merged or rebuilt by the optimizer, or added by the compiler)";
        if (row.line != 0) {
            const std::string file = row.file < r.circuit.files.size() ? r.circuit.files[row.file] : "?";
            std::string text;
            if (row.file < sm.size()) text = std::string(sm.line(row.file, row.line));
            const size_t b = text.find_first_not_of(" \t");
            text = b == std::string::npos ? "" : text.substr(b);
            if (text.size() > 60) text = text.substr(0, 57) + "...";
            where = fmt::format("{}:{}  {}", std::filesystem::path(file).filename().string(), row.line, text);
        }
        if (!row.constructions.empty()) where += fmt::format("  [{}]", fmt::join(row.constructions, ", "));
        out += fmt::format("{:>8} {:>9} {:>9} {:>8} {:>6}  {}\n", row.t_count, row.two_qubit, row.rotations, row.ops,
                           row.qubits, where);
    }
    return out;
}

/// Compiles one input; diagnostics and --stats / --dump-after text go to `err`. With `row` (a batch)
/// the figures go there for the closing table instead of a summary line on `err`.
int compile_one(const CompileArgs& a, const Job& job, bool show_progress, std::ostream& err, JobRow* row = nullptr) {
    frontend::SourceManager sm;
    const auto start = std::chrono::steady_clock::now();
    return guarded(sm, [&]() -> int {
        refuse_overwriting_input(job.input, job.output);
        compiler::CompileOptions o = compile_options(a);
        o.emit = parse_emit(emit_format(a, job.output));
        o.report = !job.report.empty();
        o.input_name = job.input;
        o.log = &err;
        if (a.verify) o.verify_pass = PassVerifier(verify_folder_for(job.output), passes::EquivOptions{}, job.verify_tag);
        ProgressLine progress(show_progress);
        o.progress = [&](const std::string& name, size_t i, size_t n) { progress.update(name, i, n); };
        o.passes_done = [&] { progress.finish(); };
        const compiler::CompileResult r = compiler::compile_file(job.input, o, sm);
        if (r.status != compiler::CompileStatus::Ok) {
            err << r.failure;
            return kCheckFailed;
        }
        if (!job.report.empty()) {
            refuse_overwriting_input(job.input, job.report);
            write_output(job.report, r.report.dump(2) + "\n");
        }
        write_output(job.output, r.text);
        const std::string verdict = a.no_check ? "not checked (--no-check)" : r.check_summary;
        if (row) {
            const ir::Resources res = ir::count_resources(r.circuit);
            *row = JobRow{true, res.qubits, rotation_target(a) ? res.t_count + res.non_clifford_rotations : res.t_count,
                          res.two_qubit_count, res.depth,
                          std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count(),
                          short_verdict(verdict)};
        } else if (!a.quiet) {
            const ir::Resources res = ir::count_resources(r.circuit);
            std::string kept = r.kept_run.empty() ? ""
                                                  : fmt::format(" (kept the run {}: {})", r.kept_run,
                                                                r.limit_note.empty() ? "cheaper" : "it fits --qubit-limit");
            if (!r.limit_note.empty()) kept += fmt::format(" ({})", r.limit_note);
            const std::string cost = rotation_target(a)
                ? fmt::format("non-Clifford rotations {}", res.t_count + res.non_clifford_rotations)
                : fmt::format("T {}", res.t_count);
            err << fmt::format("{}: {} qubits, {}, two-qubit {}, depth {}{}; {}\n", job.input, res.qubits, cost,
                               res.two_qubit_count, res.depth, kept, verdict);
        }
        if (a.cost_by_line || a.cost_in_routines) err << cost_table(r, sm);
        return kOk;
    }, err);
}

/// The file extension of an output in --emit's format (batch outputs are named stem + this).
const char* extension_of(const std::string& emit) {
    if (emit == "qasm2") return ".qasm";
    if (emit == "qasm3") return ".qasm3";
    if (emit.empty() || emit == "wq") return ".wq";
    throw UserError(fmt::format("--emit takes wq, qasm2 or qasm3, not '{}'", emit));
}

/// The jobs of a batch: one output per input in the folder `a.output`, named by the input's stem.
/// Two inputs with one stem would write one file, so that is refused before anything runs.
std::vector<Job> batch_jobs(const CompileArgs& a) {
    namespace fs = std::filesystem;
    if (a.output.empty() || a.output == "-")
        throw UserError("several inputs need -o FOLDER: each output is written there as the input's name with the --emit extension");
    std::error_code ec;
    if (!fs::is_directory(a.output, ec))
        throw UserError(fmt::format("-o '{}' must be an existing folder when several inputs are given", a.output));
    const bool report_folder = !a.report.empty() && fs::is_directory(a.report, ec);
    if (!a.report.empty() && !report_folder && a.inputs.size() > 1)
        throw UserError(fmt::format("--report '{}' must be an existing folder when several inputs are given: each "
                                    "input's report is written there as the input's name with .json",
                                    a.report));
    const std::string ext = extension_of(a.emit);
    std::vector<Job> jobs;
    std::map<std::string, std::string> by_output;
    for (const std::string& in : a.inputs) {
        const std::string stem = fs::path(in).stem().string();
        Job job{in, (fs::path(a.output) / (stem + ext)).string(), stem + "-",
                report_folder ? (fs::path(a.report) / (stem + ".json")).string() : a.report};
        auto [it, fresh] = by_output.emplace(job.output, in);
        if (!fresh)
            throw UserError(fmt::format("inputs '{}' and '{}' would both write '{}'; give them different names", it->second, in,
                                        job.output));
        jobs.push_back(std::move(job));
    }
    return jobs;
}

/// The batch's closing table: one row per input in the order given, then the totals.
std::string batch_table(const CompileArgs& a, const std::vector<Job>& jobs, const std::vector<JobRow>& rows) {
    size_t name_width = 5;
    for (const Job& j : jobs) name_width = std::max(name_width, j.input.size());
    const char* cost = rotation_target(a) ? "rotations" : "T";
    std::string out = fmt::format("{:<{}} {:>7} {:>9} {:>9} {:>8} {:>8}  {}\n", "input", name_width, "qubits", cost,
                                  "two-qubit", "depth", "seconds", "check");
    JobRow total;
    size_t failed = 0;
    for (size_t i = 0; i < jobs.size(); ++i) {
        const JobRow& r = rows[i];
        if (!r.done) {
            ++failed;
            out += fmt::format("{:<{}} {:>7} {:>9} {:>9} {:>8} {:>8}  {}\n", jobs[i].input, name_width, "-", "-", "-", "-", "-",
                               "failed (message above)");
            continue;
        }
        out += fmt::format("{:<{}} {:>7} {:>9} {:>9} {:>8} {:>8.2f}  {}\n", jobs[i].input, name_width, r.qubits, r.cost,
                           r.two_qubit, r.depth, r.seconds, r.check);
        total.cost += r.cost;
        total.two_qubit += r.two_qubit;
        total.seconds += r.seconds;
    }
    out += fmt::format("{:<{}} {:>7} {:>9} {:>9} {:>8} {:>8.2f}  {} of {} compiled\n", "total", name_width, "", total.cost,
                       total.two_qubit, "", total.seconds, jobs.size() - failed, jobs.size());
    return out;
}

/// Runs the jobs on `a.jobs` threads. Each job's messages are printed whole when it ends, so the
/// lines of two files never interleave; a table of all the results closes the batch (not with -q).
/// The exit code is the worst of the jobs' (2 over 1 over 0).
int run_batch(const CompileArgs& a, const std::vector<Job>& jobs) {
    std::atomic<size_t> next{0};
    std::mutex print_mutex;
    int worst = kOk;
    std::vector<JobRow> rows(jobs.size());
    auto worker = [&]() {
        for (size_t i = next++; i < jobs.size(); i = next++) {
            std::ostringstream err;
            int rc = compile_one(a, jobs[i], false, err, &rows[i]);
            std::lock_guard<std::mutex> lock(print_mutex);
            std::cerr << err.str();
            std::cerr.flush();
            worst = std::max(worst, rc);
        }
    };
    const size_t threads = std::min<size_t>(std::max(1u, a.jobs), jobs.size());
    std::vector<std::thread> pool;
    for (size_t t = 1; t < threads; ++t) pool.emplace_back(worker);
    worker();
    for (std::thread& t : pool) t.join();
    if (!a.quiet) std::cerr << batch_table(a, jobs, rows);
    return worst;
}

int run_compile(const CompileArgs& a) {
    {
        frontend::SourceManager none;
        int rc = guarded(none, [&]() -> int {
            check_options(a);
            return kOk;
        });
        if (rc != kOk) return rc;
    }
    std::error_code ec;
    const bool one = a.inputs.size() == 1 && !std::filesystem::is_directory(a.output, ec);
    if (one) return compile_one(a, Job{a.inputs[0], a.output, "", a.report}, !a.quiet, std::cerr);
    std::vector<Job> jobs;
    frontend::SourceManager no_sources;
    int rc = guarded(no_sources, [&]() -> int {
        jobs = batch_jobs(a);
        return kOk;
    });
    if (rc != kOk) return rc;
    return run_batch(a, jobs);
}

}  // namespace

void add_compile_command(CLI::App& app, int& exit_code) {
    auto args = std::make_shared<CompileArgs>();
    CLI::App* cmd = app.add_subcommand("compile", "optimize and lower a program, then emit it");
    cmd->add_option("input", args->inputs,
                    "program(s) to compile (.wq or .qasm); several inputs need -o FOLDER and compile in parallel with -j")
        ->required();
    cmd->add_option("-o,--output", args->output,
                    "output file (format by extension: .wq, .qasm, .qasm3); stdout when absent. With several inputs, "
                    "or when it is an existing folder: the folder that gets one output per input, named by the "
                    "input's stem and the --emit extension (.wq by default)");
    cmd->add_option("-j,--jobs", args->jobs, "compile up to N inputs at once (threads; default 1)")
        ->check(CLI::Range(1u, 1024u));
    CLI::Option* target = cmd->add_option("--target", args->target,
                    "native gate set: clifford+t, cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, u+cx, nct (default: stay high level)");
    // One short option with an attached value: CLI11 reads -O0 .. -O3 as -O with 0 .. 3.
    cmd->add_option("-O", args->level, "optimization level: -O0 none, -O1 cheap local, -O2 the default pipeline, -O3 everything")
        ->check(CLI::Range(0, 3));
    cmd->add_option("--optimize-for", args->optimize_for, "metric the constructions compete on: t, 2q or depth")
        ->capture_default_str();
    cmd->add_flag("--allow-measurement", args->allow_measurement,
                  "allow measurement-based uncompute and classical feed-forward in the output");
    cmd->add_flag("--verify", args->verify, "check equivalence after every pass; stop at the first pass that breaks it");
    cmd->add_flag("--no-check", args->no_check,
                  "skip the check of the output against the input (run by default within max(2 s, 10% of the compile time))");
    cmd->add_option("--report", args->report,
                    "write a JSON resource report to this file; with several inputs, an existing folder that gets "
                    "one report per input (the input's name with .json)");
    cmd->add_option("--emit", args->emit, "output format: wq, qasm2 or qasm3 (overrides the extension)");
    cmd->add_option("--passes", args->passes, "run exactly this comma-separated list of passes instead of an -O pipeline");
    cmd->add_option("--dump-after", args->dump_after, "print the circuit to stderr after the named pass (or 'all')");
    cmd->add_flag("--time-passes", args->time_passes, "print each pass's time to stderr");
    cmd->add_flag("--stats", args->stats, "print each pass's changes to stderr");
    cmd->add_option("--role", args->roles,
                    "REGISTER=ROLE: declare a register of the input qubit, ancilla (starts and ends at |0>, checked) or "
                    "borrow (any state, restored); for OpenQASM inputs, which cannot declare it (repeatable)");
    cmd->add_option("--extra-ancillas", args->extra_ancillas, "fresh clean wires the lowering may add (default 0)");
    cmd->add_option("--gadget-wires", args->gadget_wires,
                    "with --allow-measurement on clifford+t at -O2/-O3: fresh clean wires reduce-t may add to replace "
                    "inner Hadamards by measured gadgets, kept only for fewer T (default 0)");
    cmd->add_option("--rewrite-effort", args->rewrite_effort,
                    "budget of the identity-library search at -O3 on the rotation targets (rewrite-search): 0 off, "
                    "each unit 32 rounds, 4000 rewrites, 150000 match attempts (1 s cap), at most 100")
        ->capture_default_str();
    cmd->add_option("--resynth-effort", args->resynth_effort,
                    "budget of the three-wire block resynthesis at -O3 on the rotation targets (resynth-3q): 0 off "
                    "(default), each unit 4000 optimizer steps per block and 400000 per compile, at most 100")
        ->capture_default_str();
    cmd->add_option("--epsilon", args->epsilon, "error bound per approximated rotation (clifford+t), in [1e-15, 1)")->capture_default_str();
    cmd->add_option("--total-error", args->total_error,
                    "error bound for the whole circuit (clifford+t), split evenly over the rotations it approximates; "
                    "instead of --epsilon");
    cmd->add_option("--qubit-limit", args->qubit_limit,
                    "the most qubits the output may have: the cheapest run that fits is kept (what the limit cost is "
                    "printed); an error when none fits");
    cmd->add_flag("--cost-by-line", args->cost_by_line,
                  "print the output's T, two-qubit gates, rotations and qubits by source line, largest first (a "
                  "routine call's cost at the call's line)");
    cmd->add_flag("--cost-in-routines", args->cost_in_routines,
                  "--cost-by-line with each op's cost at the line that wrote it inside its routine (library files "
                  "too), not at the outermost call");
    cmd->add_flag("-q,--quiet", args->quiet, "no progress indicator");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->callback([args, target, &exit_code]() {
        args->target_given = target->count() > 0;
        exit_code = run_compile(*args);
    });
}

void add_passes_command(CLI::App& app, int& exit_code) {
    CLI::App* cmd = app.add_subcommand("passes", "list the passes `compile --passes` can run: name, stage, what it does");
    cmd->callback([&exit_code]() {
        for (const passes::PassInfo& p : passes::all_passes()) {
            const char* stage = p.stage == passes::Stage::HighLevel ? "high-level"
                                : p.stage == passes::Stage::Lowering ? "lowering"
                                                                     : "low-level";
            std::cout << fmt::format("{:<16} {:<11} {}\n", p.name, stage, p.summary);
        }
        exit_code = kOk;
    });
}

}  // namespace whittle::cli
