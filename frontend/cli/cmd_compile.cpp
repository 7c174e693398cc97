// `whittle compile`: read, optimize, lower, check and emit.
#include <iostream>
#include <memory>

#include <fmt/format.h>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"
#include "frontend/cli/progress.h"
#include "frontend/cli/verify_hook.h"
#include "frontend/load.h"
#include "ir/printer.h"
#include "lowering/emit_qasm.h"
#include "lowering/report.h"
#include "passes/pipeline.h"

namespace whittle::cli {
namespace {

struct CompileArgs {
    std::string input;
    std::string output;
    std::string target;
    int level = 2;
    std::string optimize_for = "t";
    bool allow_measurement = false;
    bool verify = false;
    std::string report;
    std::string emit;
    std::string passes;
    std::vector<std::string> dump_after;
    bool time_passes = false;
    bool stats = false;
    uint32_t extra_ancillas = 0;
    double epsilon = 1e-10;
    bool quiet = false;
    std::vector<std::string> include_dirs;
};

std::string emit_format(const CompileArgs& a) {
    if (!a.emit.empty()) return a.emit;
    auto ends = [&](const char* ext) {
        std::string e(ext);
        return a.output.size() >= e.size() && a.output.compare(a.output.size() - e.size(), e.size(), e) == 0;
    };
    if (ends(".qasm3")) return "qasm3";
    if (ends(".qasm")) return "qasm2";
    return "wq";
}

passes::Metric parse_metric(const std::string& s) {
    if (s == "t") return passes::Metric::TCount;
    if (s == "2q") return passes::Metric::TwoQubit;
    if (s == "depth") return passes::Metric::Depth;
    throw UserError(fmt::format("--optimize-for takes t, 2q or depth, not '{}'", s));
}

int run_compile(const CompileArgs& a) {
    frontend::SourceManager sm;
    return guarded(sm, [&]() -> int {
        refuse_overwriting_input(a.input, a.output);
        frontend::LoadOptions lo;
        lo.include_dirs = a.include_dirs;
        ir::Circuit c = frontend::load_file(a.input, sm, lo);

        passes::PassOptions po;
        po.target = a.target;
        po.level = a.level;
        po.optimize_for = parse_metric(a.optimize_for);
        po.allow_measurement = a.allow_measurement;
        po.extra_ancillas = a.extra_ancillas;
        po.epsilon = a.epsilon;

        std::vector<std::string> names = a.passes.empty() ? passes::pipeline_for(po) : passes::parse_pass_list(a.passes);
        passes::PipelineHooks hooks;
        if (!a.dump_after.empty()) {
            hooks.after_pass = [&](const std::string& name, const ir::Circuit& now) {
                for (const std::string& d : a.dump_after)
                    if (d == name || d == "all") std::cerr << "# after " << name << "\n" << ir::print_wq(now);
            };
        }
        // The input as read, kept for the report's "input_resources" only when a report is asked for.
        ir::Circuit source;
        if (!a.report.empty()) source = c;
        if (a.verify) hooks.verify = PassVerifier(verify_folder_for(a.output), passes::EquivOptions{});
        ProgressLine progress(!a.quiet);
        hooks.progress = [&](const std::string& name, size_t i, size_t n) { progress.update(name, i, n); };
        std::vector<passes::PassRecord> records;
        try {
            records = passes::run_passes(c, names, po, hooks);
        } catch (const VerifyFailure& failure) {
            progress.finish();
            std::cerr << failure.what();
            return kCheckFailed;
        }
        progress.finish();
        if (a.stats || a.time_passes) {
            for (const passes::PassRecord& r : records) {
                std::string line = fmt::format("{:<18} ops {:>8} -> {:<8} T {:>6} -> {:<6} CNOT {:>6} -> {:<6}",
                                               r.name, r.ops_before, r.ops_after, r.t_before, r.t_after,
                                               r.cnot_before, r.cnot_after);
                if (a.time_passes) line += fmt::format(" {:9.3f} ms", r.seconds * 1e3);
                if (a.stats)
                    for (const auto& [k, v] : r.result.stats) line += fmt::format(" {}={}", k, v);
                std::cerr << line << "\n";
            }
        }
        std::string format = emit_format(a);
        std::string text;
        if (format == "wq") text = ir::print_wq(c);
        else if (format == "qasm2") text = lowering::emit_qasm2(c);
        else if (format == "qasm3") text = lowering::emit_qasm3(c);
        else throw UserError(fmt::format("--emit takes wq, qasm2 or qasm3, not '{}'", format));
        if (!a.report.empty()) {
            lowering::CompileReportInput ri;
            ri.input = a.input;
            ri.source = &source;
            ri.output = &c;
            ri.options = po;
            ri.explicit_passes = a.passes;
            ri.emit = format;
            ri.verify = a.verify;
            ri.records = std::move(records);
            refuse_overwriting_input(a.input, a.report);
            write_output(a.report, lowering::compile_report(ri).dump(2) + "\n");
        }
        write_output(a.output, text);
        return kOk;
    });
}

}  // namespace

void add_compile_command(CLI::App& app, int& exit_code) {
    auto args = std::make_shared<CompileArgs>();
    CLI::App* cmd = app.add_subcommand("compile", "optimize and lower a program, then emit it");
    cmd->add_option("input", args->input, "program to compile (.wq or .qasm)")->required();
    cmd->add_option("-o,--output", args->output, "output file (format by extension: .wq, .qasm, .qasm3); stdout when absent");
    cmd->add_option("--target", args->target,
                    "native gate set: clifford+t, cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, u+cx, nct (default: stay high level)");
    // One short option with an attached value: CLI11 reads -O0 .. -O3 as -O with 0 .. 3.
    cmd->add_option("-O", args->level, "optimization level: -O0 none, -O1 cheap local, -O2 the default pipeline, -O3 everything")
        ->check(CLI::Range(0, 3));
    cmd->add_option("--optimize-for", args->optimize_for, "metric the constructions compete on: t, 2q or depth")
        ->capture_default_str();
    cmd->add_flag("--allow-measurement", args->allow_measurement,
                  "allow measurement-based uncompute and classical feed-forward in the output");
    cmd->add_flag("--verify", args->verify, "check equivalence after every pass; stop at the first pass that breaks it");
    cmd->add_option("--report", args->report, "write a JSON resource report to this file");
    cmd->add_option("--emit", args->emit, "output format: wq, qasm2 or qasm3 (overrides the extension)");
    cmd->add_option("--passes", args->passes, "run exactly this comma-separated list of passes instead of an -O pipeline");
    cmd->add_option("--dump-after", args->dump_after, "print the circuit to stderr after the named pass (or 'all')");
    cmd->add_flag("--time-passes", args->time_passes, "print each pass's time to stderr");
    cmd->add_flag("--stats", args->stats, "print each pass's changes to stderr");
    cmd->add_option("--extra-ancillas", args->extra_ancillas, "fresh clean wires the lowering may add (default 0)");
    cmd->add_option("--epsilon", args->epsilon, "error bound per approximated rotation (clifford+t)")->capture_default_str();
    cmd->add_flag("-q,--quiet", args->quiet, "no progress indicator");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->callback([args, &exit_code]() { exit_code = run_compile(*args); });
}

}  // namespace whittle::cli
