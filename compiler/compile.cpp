// The compile entry point: options check, ancilla contract, pipeline, run, final check, emit, report.
#include "compiler/compile.h"

#include <algorithm>
#include <array>
#include <chrono>
#include <ostream>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "compiler/final_check.h"
#include "frontend/load.h"
#include "ir/printer.h"
#include "ir/resources.h"
#include "lowering/targets.h"
#include "output/compile_report.h"
#include "output/emit_qasm.h"
#include "passes/registry.h"
#include "verify/ancilla_contract.h"

namespace whittle::compiler {
namespace {

/// The time the input's ancilla contract check may take.
constexpr double kContractSeconds = 1.0;

/// The --epsilon range: the rotation synthesis is bounded in time and memory over all of it
/// (README "Rotations"; tests/cli/compile_options_test.cpp measures both ends).
constexpr double kMinEpsilon = 1e-15;

std::string emit_text(const ir::Circuit& c, Emit e) {
    switch (e) {
    case Emit::None: return "";
    case Emit::Wq: return ir::print_wq(c);
    case Emit::Qasm2: return lowering::emit_qasm2(c);
    case Emit::Qasm3: return lowering::emit_qasm3(c);
    }
    return "";
}

/// Inputs up to this many ops also compile the alternative runs (compile_alternatives).
constexpr size_t kAlternativesMaxOps = 2000;
/// Up to this many input ops a compile with gadget wires or --allow-measurement also runs without
/// them (see alternative_runs).
constexpr size_t kOptionAlternativeMaxOps = size_t(1) << 20;

}  // namespace

std::array<uint64_t, 5> cost_under(const ir::Resources& r, const CompileOptions& o) {
    const uint64_t over = o.qubit_limit && r.qubits > *o.qubit_limit ? 1 : 0;
    switch (o.optimize_for) {
    case ir::Metric::TCount: return {over, r.t_count, r.two_qubit_count, r.depth, r.qubits};
    case ir::Metric::TwoQubit: return {over, r.two_qubit_count, r.t_count, r.depth, r.qubits};
    case ir::Metric::Depth: return {over, r.depth, r.t_count, r.two_qubit_count, r.qubits};
    }
    return {};
}

std::vector<std::pair<std::string, CompileOptions>> alternative_runs(const CompileOptions& o, size_t input_ops) {
    std::vector<std::pair<std::string, CompileOptions>> alts;
    if (!o.passes.empty() || o.level < 2 || !o.target) return alts;
    const bool gadgets = o.allow_measurement && o.gadget_wires > 0;
    if (input_ops > kAlternativesMaxOps && !o.qubit_limit) {
        // A large input compiles the run asked for and, so that an option never makes the result
        // worse, the runs without each option that can: with gadget wires, the run without them
        // (reduce-t keeps its gadget copy only for fewer T, but the passes after it, gate-cancel at
        // -O3 and fuse-1q, might still take more from the plain circuit; beyond kGadgetMaxOps
        // reduce-t does not try gadgets at all); with --allow-measurement, the run without it (a
        // measured erase can stop a cancellation or a fold the unitary form allows).
        if (input_ops <= kOptionAlternativeMaxOps) {
            auto add = [&](const char* why, bool measurement) {
                CompileOptions a = o;
                a.gadget_wires = 0;
                a.allow_measurement = measurement;
                a.passes_done = nullptr;
                a.progress = nullptr;
                alts.emplace_back(why, std::move(a));
            };
            if (gadgets) add("without --gadget-wires", true);
            if (o.allow_measurement) add("without --allow-measurement", false);
        }
        return alts;
    }
    // Extra wires as asked or none; under --qubit-limit every count in between too, so a run that
    // fits takes as many as fit.
    std::vector<uint32_t> extra_counts = {o.extra_ancillas};
    if (o.qubit_limit)
        for (uint32_t k = o.extra_ancillas; k-- > 0;) extra_counts.push_back(k);
    else if (o.extra_ancillas != 0)
        extra_counts.push_back(0);
    // Every combination of: each level from -O1 up, measurement as asked or off, extra wires as
    // asked or none, each metric; gadget wires only in the run asked for (every alternative runs
    // without them); under --qubit-limit also each with work wires taken only where they are live
    // already. The set of a run with fewer options is a subset of this one's, so the kept result
    // can only improve as options are added.
    std::vector<bool> within_lives = {o.work_wires_within_lives};
    if (o.qubit_limit && !o.work_wires_within_lives) within_lives.push_back(true);
    for (bool within : within_lives)
    for (int level = o.level; level >= 1; --level)
        for (bool measurement : {o.allow_measurement, false})
            for (uint32_t extra : extra_counts)
                for (ir::Metric m : {o.optimize_for, ir::Metric::TCount, ir::Metric::TwoQubit, ir::Metric::Depth}) {
                    if (measurement && !o.allow_measurement) continue;
                    if (within && extra != 0 && !o.work_wires_within_lives) continue;  // adds no wire there
                    CompileOptions a = o;
                    a.work_wires_within_lives = within;
                    a.level = level;
                    a.allow_measurement = measurement;
                    a.gadget_wires = 0;
                    a.extra_ancillas = extra;
                    a.optimize_for = m;
                    a.passes_done = nullptr;
                    a.progress = nullptr;
                    std::vector<std::string> why;
                    if (level != o.level) why.push_back(fmt::format("at -O{}", level));
                    if (measurement != o.allow_measurement) why.push_back("without --allow-measurement");
                    else if (o.gadget_wires > 0) why.push_back("without --gadget-wires");
                    if (extra != o.extra_ancillas)
                        why.push_back(extra == 0 ? std::string("without --extra-ancillas") : fmt::format("with --extra-ancillas {}", extra));
                    if (m != o.optimize_for) why.push_back(fmt::format("with constructions chosen for {}", ir::metric_name(m)));
                    if (within != o.work_wires_within_lives) why.push_back("with work wires taken only where they are live");
                    if (why.empty()) continue;  // the run asked for, or a repeat of it
                    const std::string label = fmt::format("{}", fmt::join(why, ", "));
                    if (std::any_of(alts.begin(), alts.end(), [&](const auto& p) { return p.first == label; })) continue;
                    alts.emplace_back(label, std::move(a));
                }
    return alts;
}

const char* emit_name(Emit e) {
    switch (e) {
    case Emit::None: return "";
    case Emit::Wq: return "wq";
    case Emit::Qasm2: return "qasm2";
    case Emit::Qasm3: return "qasm3";
    }
    return "";
}

passes::PassOptions pass_options(const CompileOptions& o) {
    passes::PassOptions po;
    po.target = o.target;
    po.level = o.level;
    po.optimize_for = o.optimize_for;
    po.allow_measurement = o.allow_measurement;
    po.extra_ancillas = o.extra_ancillas;
    po.gadget_wires = o.gadget_wires;
    po.epsilon = o.epsilon;
    po.rewrite_effort = o.rewrite_effort;
    po.resynth_effort = o.resynth_effort;
    po.split_work_lives = o.split_work_lives;
    po.work_wires_within_lives = o.work_wires_within_lives;
    po.qubit_limit = o.qubit_limit;
    return po;
}

std::vector<std::string> pass_names(const CompileOptions& o) {
    return o.passes.empty() ? passes::pipeline_for(pass_options(o)) : passes::parse_pass_list(o.passes);
}

void check_options(const CompileOptions& o) {
    if (!(o.epsilon >= kMinEpsilon && o.epsilon < 1))
        throw UserError(fmt::format("--epsilon must lie in [1e-15, 1), got {}", o.epsilon));
    if (o.total_error) {
        if (!(*o.total_error >= kMinEpsilon && *o.total_error < 1))
            throw UserError(fmt::format("--total-error must lie in [1e-15, 1), got {}", *o.total_error));
        if (o.epsilon != CompileOptions{}.epsilon)
            throw UserError("--total-error and --epsilon both set: --total-error splits the whole circuit's error over "
                            "its rotations, --epsilon sets each rotation's; give one");
    }
    if (o.resynth_effort > 100) throw UserError(fmt::format("--resynth-effort must lie in 0..100, got {}", o.resynth_effort));
    if (o.rewrite_effort > 100) throw UserError(fmt::format("--rewrite-effort must lie in 0..100, got {}", o.rewrite_effort));
    if (o.gadget_wires > 0 && !o.allow_measurement)
        throw UserError("--gadget-wires needs --allow-measurement (a Hadamard gadget measures its wire)");
    for (size_t i = 0; i < o.register_roles.size(); ++i)
        for (size_t j = 0; j < i; ++j)
            if (o.register_roles[i].first == o.register_roles[j].first)
                throw UserError(fmt::format("--role names register '{}' twice", o.register_roles[i].first));
    const passes::PassOptions po = pass_options(o);
    const std::vector<std::string> names = pass_names(o);
    if (!o.passes.empty() && o.target && std::find(names.begin(), names.end(), "to-target") == names.end())
        throw UserError(fmt::format("--passes runs only the passes listed, and '{}' has no to-target: the output would not be "
                                    "in --target '{}'; list the lowering passes too (-O{} uses: {}) or leave out --passes",
                                    o.passes, ir::target_name(*o.target), o.level, fmt::join(passes::pipeline_for(po), ",")));
    for (const std::string& d : o.dump_after) {
        if (d == "all") continue;
        if (!passes::find_pass(d)) throw UserError(fmt::format("--dump-after '{}' is not a pass (see --passes for the names)", d));
        if (std::find(names.begin(), names.end(), d) == names.end())
            throw UserError(fmt::format("--dump-after '{}': that pass does not run here (the passes are: {})", d, fmt::join(names, ",")));
    }
}

namespace {

/// Sets the roles CompileOptions::register_roles declares (UserError for a name the input lacks).
void declare_roles(ir::Circuit& c, const CompileOptions& o) {
    for (const auto& [name, role] : o.register_roles) {
        const int r = c.find_register(name);
        if (r < 0) {
            std::vector<std::string> names;
            for (const ir::Register& reg : c.registers) names.push_back(reg.name);
            std::string file = o.input_name;
            if (file.empty() && !c.files.empty()) file = c.files[0];
            throw UserError(fmt::format("--role {}={}: the input has no quantum register '{}' (its registers: {})",
                                        name, ir::role_name(role), name,
                                        names.empty() ? "none" : fmt::format("{}", fmt::join(names, ", "))),
                            {}, file);
        }
        ir::Register& reg = c.registers[size_t(r)];
        reg.role = role;
        for (uint32_t i = 0; i < reg.size; ++i) c.qubits[reg.first + i].role = role;
    }
}

}  // namespace

namespace {

CompileResult compile_once(ir::Circuit c, const CompileOptions& o) {
    declare_roles(c, o);
    const passes::PassOptions po = pass_options(o);
    const std::vector<std::string> names = pass_names(o);
    passes::PipelineHooks hooks;
    if (!o.dump_after.empty() && o.log) {
        hooks.after_pass = [&](const std::string& name, const ir::Circuit& now) {
            for (const std::string& d : o.dump_after)
                if (d == name || d == "all") *o.log << "# after " << name << "\n" << ir::print_wq(now);
        };
    }
    // The input as read, kept for the report's "input_resources" and for the final check.
    ir::Circuit source;
    const bool final_check = o.check && c.ops.size() <= kFinalCheckMaxOps;
    // The lowering takes a declared ancilla for a clean work wire wherever the program does not
    // use it, so a program that leaves one dirty would compile into a wrong circuit: refuse it.
    std::string contract_note, contract_method;
    if (final_check &&
        std::any_of(c.qubits.begin(), c.qubits.end(), [](const ir::Qubit& q) { return q.role == ir::Role::Clean; })) {
        const passes::AncillaContract contract = passes::check_ancilla_contract(c, kContractSeconds);
        if (contract.status == passes::AncillaContract::Status::Violated) throw passes::contract_violation(c, contract);
        if (contract.status == passes::AncillaContract::Status::Undecided) {
            contract_note = fmt::format(" (ancillas not proven returned to |0>: {})", contract.method);
            contract_method = contract.method;
        }
    }
    if (o.report || final_check) source = c;
    ir::Circuit alternatives_input;
    // (split-work-lives may run, and then the runs without it: only with clean wires to split, and
    // up to the size where the other option runs stop too.)
    const bool may_split = o.split_work_lives && o.passes.empty() && o.level >= 2 && o.target &&
                           c.ops.size() <= kOptionAlternativeMaxOps &&
                           std::any_of(c.qubits.begin(), c.qubits.end(),
                                       [](const ir::Qubit& q) { return q.role == ir::Role::Clean; });
    if (may_split || !alternative_runs(o, c.ops.size()).empty()) alternatives_input = c;
    const auto compile_start = std::chrono::steady_clock::now();
    if (o.verify_pass) hooks.verify = o.verify_pass;
    if (o.progress) hooks.progress = o.progress;
    CompileResult r;
    try {
        r.records = passes::run_passes(c, names, po, hooks);
    } catch (const PassCheckFailure& failure) {
        if (o.passes_done) o.passes_done();
        r.status = CompileStatus::PassCheckFailed;
        r.failure = failure.what();
        return r;
    }
    if (o.passes_done) o.passes_done();
    // Monotone in the options: a run with fewer options (no measurement, no extra wires, a lower
    // level) or with constructions priced for another metric may end cheaper under the chosen
    // metric, since each op's construction is priced before the later passes see it. Small inputs
    // compile those runs too and keep the cheapest (the first on a tie: the run asked for).
    CompileOptions kept_options;
    // With --qubit-limit: the cheapest run whatever its width, to say what the limit cost.
    CompileOptions unlimited = o;
    unlimited.qubit_limit.reset();
    ir::Resources unlimited_best = ir::count_resources(c);
    uint32_t fewest_qubits = unlimited_best.qubits;
    if (o.qubit_limit && !alternatives_input.ops.empty()) {
        // The runs under the limit already steer by it (reduce-t undoes rebuilds that pass it), so
        // the run asked for without the limit, once, for what the limit cost.
        ir::Circuit a = alternatives_input;
        CompileOptions free_run = unlimited;
        free_run.passes_done = nullptr;
        free_run.progress = nullptr;
        try {
            passes::run_passes(a, pass_names(free_run), pass_options(free_run));
            const ir::Resources res = ir::count_resources(a);
            if (cost_under(res, unlimited) < cost_under(unlimited_best, unlimited)) unlimited_best = res;
        } catch (const UserError&) {
            // That run has no form for some op (e.g. no work wire for an NCT lowering): no note.
        }
    }
    if (!alternatives_input.ops.empty()) {
        auto best = cost_under(unlimited_best, o);
        const CompileOptions* kept = nullptr;
        std::vector<std::pair<std::string, CompileOptions>> runs = alternative_runs(o, alternatives_input.ops.size());
        // Where split-work-lives changed the run asked for, every run also without it (splitting
        // frees wires and often saves T, but may split what the lowering would have paired).
        const bool split = may_split && std::any_of(r.records.begin(), r.records.end(), [](const passes::PassRecord& rec) {
            return rec.name == "split-work-lives" && rec.changed;
        });
        if (split) {
            const size_t n = runs.size();
            CompileOptions asked = o;
            asked.passes_done = nullptr;
            asked.progress = nullptr;
            runs.emplace_back("", asked);
            for (size_t k = 0; k <= n; ++k) {
                CompileOptions a = runs[k].second;
                a.split_work_lives = false;
                runs.emplace_back(runs[k].first.empty() ? std::string("without splitting work-wire lives")
                                                        : runs[k].first + ", without splitting work-wire lives",
                                  std::move(a));
            }
            runs.erase(runs.begin() + ptrdiff_t(n));  // the asked run itself is not run again
        }
        for (auto& [why, alt] : runs) {
            ir::Circuit a = alternatives_input;
            std::vector<passes::PassRecord> records;
            try {
                records = passes::run_passes(a, pass_names(alt), pass_options(alt));
            } catch (const UserError&) {
                // A run with fewer options may have no form for some op (an NCT lowering with no
                // work wire): it is not a candidate, and the run asked for stands.
                continue;
            }
            const ir::Resources res = ir::count_resources(a);
            const auto cost = cost_under(res, o);
            if (cost_under(res, unlimited) < cost_under(unlimited_best, unlimited)) unlimited_best = res;
            fewest_qubits = std::min(fewest_qubits, res.qubits);
            if (cost < best) {
                best = cost;
                c = std::move(a);
                r.records = std::move(records);
                r.kept_run = why;
                kept_options = alt;
                kept = &kept_options;
            }
        }
        // --verify checks each pass of the run whose result is kept: the runs are deterministic,
        // so that run again, with the hook, gives the same circuit.
        if (kept && o.verify_pass) {
            ir::Circuit a = alternatives_input;
            passes::PipelineHooks verify_hooks;
            verify_hooks.verify = o.verify_pass;
            try {
                r.records = passes::run_passes(a, pass_names(*kept), pass_options(*kept), verify_hooks);
            } catch (const PassCheckFailure& failure) {
                r.status = CompileStatus::PassCheckFailed;
                r.failure = failure.what();
                return r;
            }
            WHITTLE_ASSERT(ir::print_wq(a) == ir::print_wq(c));  // the rerun gave the kept circuit
        }
    }
    if (o.qubit_limit) {
        const ir::Resources kept_res = ir::count_resources(c);
        if (kept_res.qubits > *o.qubit_limit)
            throw UserError(fmt::format("--qubit-limit {}: no compile of this input fits (the fewest qubits found: {}{})",
                                        *o.qubit_limit, fewest_qubits,
                                        o.target ? "" : "; a --target lets compile try more constructions"));
        if (cost_under(kept_res, unlimited) != cost_under(unlimited_best, unlimited)) {
            const bool t = o.optimize_for == ir::Metric::TCount;
            const bool two = o.optimize_for == ir::Metric::TwoQubit;
            const char* what = t ? "T" : two ? "two-qubit" : "depth";
            const uint64_t got = t ? kept_res.t_count : two ? kept_res.two_qubit_count : kept_res.depth;
            const uint64_t free = t ? unlimited_best.t_count : two ? unlimited_best.two_qubit_count : unlimited_best.depth;
            r.limit_note = fmt::format("--qubit-limit {}: {} {} instead of {} ({} qubits)", *o.qubit_limit, what, got, free,
                                       unlimited_best.qubits);
        }
    }
    if (!o.passes.empty() && o.target) {
        // A hand-written list may end with a pass that leaves the target (the report would claim it).
        for (const ir::Op& op : c.ops)
            if (!lowering::in_target(op, *o.target))
                throw UserError(fmt::format("--passes '{}' leaves {} outside --target '{}'; end the list with "
                                            "to-target (and its cleanup passes)",
                                            o.passes, ir::op_kind_name(op.kind), ir::target_name(*o.target)),
                                op.loc);
    }
    const double compile_seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - compile_start).count();
    if (o.check) r.check_summary = fmt::format("not checked: the input has over {} ops", kFinalCheckMaxOps);
    if (final_check) {
        double approximation = 0;
        for (const passes::PassRecord& rec : r.records) approximation += rec.result.error_bound;
        const FinalCheck check = check_final_output(source, c, compile_seconds, approximation);
        if (check.verdict == passes::Verdict::NotEquivalent) {
            r.status = CompileStatus::CheckFailed;
            r.failure = check.failure;
            if (!contract_method.empty())
                r.failure += fmt::format("  note: the input's declared ancillas were not proven returned to |0> ({}); an input "
                                         "that leaves an `ancilla` dirty compiles into a different program: declare such "
                                         "wires `qubit`\n",
                                         contract_method);
            return r;
        }
        r.check_summary = check.summary + contract_note;
    }
    if ((o.stats || o.time_passes) && o.log) {
        for (const passes::PassRecord& rec : r.records) {
            std::string line = fmt::format("{:<18} ops {:>8} -> {:<8} T {:>6} -> {:<6} CNOT {:>6} -> {:<6}",
                                           rec.name, rec.ops_before, rec.ops_after, rec.t_before, rec.t_after,
                                           rec.cnot_before, rec.cnot_after);
            if (o.time_passes)
                line += fmt::format(" {:9.3f} ms  peak {:>6} MiB", rec.seconds * 1e3, rec.peak_rss_kib / 1024);
            if (o.stats)
                for (const auto& [k, v] : rec.result.stats) line += fmt::format(" {}={}", k, v);
            *o.log << line << "\n";
        }
    }
    r.text = emit_text(c, o.emit);
    if (o.cost_by_line) r.line_costs = lowering::cost_by_line(c, r.records, o.optimize_for);
    if (o.report) {
        lowering::CompileReportInput ri;
        ri.input = o.input_name;
        ri.source = &source;
        ri.output = &c;
        ri.options = po;
        ri.explicit_passes = o.passes;
        ri.emit = emit_name(o.emit);
        ri.verify = bool(o.verify_pass);
        ri.kept_run = r.kept_run;
        ri.records = r.records;
        r.report = lowering::compile_report(ri);
        if (o.cost_by_line) r.report["cost_by_line"] = lowering::cost_by_line_json(r.line_costs, c);
        if (o.qubit_limit) {
            r.report["options"]["qubit_limit"] = *o.qubit_limit;
            r.report["qubit_limit_cost"] = r.limit_note.empty() ? lowering::Json(nullptr) : lowering::Json(r.limit_note);
        }
    }
    r.circuit = std::move(c);
    return r;
}

/// The sum of the passes' approximation error bounds.
double approximation_of(const std::vector<passes::PassRecord>& records) {
    double e = 0;
    for (const passes::PassRecord& rec : records) e += rec.result.error_bound;
    return e;
}

/// The rotations the Clifford+T synthesis approximated in a run.
int64_t rotations_approximated(const std::vector<passes::PassRecord>& records) {
    int64_t n = 0;
    for (const passes::PassRecord& rec : records)
        if (rec.name == "to-target")
            for (const auto& [k, v] : rec.result.stats)
                if (k == "rotations-approximated") n += v;
    return n;
}

}  // namespace

CompileResult compile(ir::Circuit c, const CompileOptions& o) {
    check_options(o);
    if (!o.total_error) return compile_once(std::move(c), o);
    // The whole circuit's error budget E over N approximated rotations: each gets E / N, and the
    // bounds add up (triangle inequality) to at most E. N is learned from a run (the constructions
    // priced with the per-rotation epsilon may change it, so the split is redone until it holds).
    const double budget = *o.total_error;
    CompileOptions each = o;
    each.total_error.reset();
    each.epsilon = budget;
    ir::Circuit probe = c;
    int64_t n = rotations_approximated(passes::run_passes(probe, pass_names(each), pass_options(each)));
    for (int attempt = 0;; ++attempt) {
        if (n > 1) each.epsilon = budget / double(n);
        if (each.epsilon < kMinEpsilon)
            throw UserError(fmt::format("--total-error {} over the {} rotations this circuit approximates is {:.2g} each, "
                                        "below the synthesis's floor of 1e-15: raise the total",
                                        budget, n, each.epsilon));
        CompileResult r = compile_once(attempt == 2 ? std::move(c) : ir::Circuit(c), each);
        if (r.status != CompileStatus::Ok || approximation_of(r.records) <= budget) {
            if (o.report) r.report["options"]["total_error"] = budget;
            return r;
        }
        // A run kept among the alternatives approximated more rotations: split over those.
        WHITTLE_ASSERT(attempt < 2 && "the error split did not converge");
        n = std::max<int64_t>(rotations_approximated(r.records), 2 * n);
    }
}

CompileResult compile_file(const std::string& path, const CompileOptions& o, frontend::SourceManager& sm) {
    frontend::LoadOptions lo;
    lo.include_dirs = o.include_dirs;
    lo.locate_at_call_site = o.cost_by_line && !o.cost_in_routines;
    ir::Circuit c = frontend::load_file(path, sm, lo);
    if (frontend::format_for_path(path) != frontend::InputFormat::Wq || alternative_runs(o, c.ops.size()).empty())
        return compile(std::move(c), o);
    // Shared work wires save qubits but may cost T (fewer clean wires for the lowering, more order
    // between calls): a small program also compiles with fresh wires per call, and the cheaper
    // result under the chosen metric (qubits break the last tie) is kept.
    lo.reuse_work_wires = false;
    frontend::SourceManager fresh_sm;  // the same files in the same order: the same file indices
    ir::Circuit fresh = frontend::load_file(path, fresh_sm, lo);
    if (fresh.num_qubits() == c.num_qubits()) return compile(std::move(c), o);
    CompileResult shared = compile(std::move(c), o);
    if (shared.status != CompileStatus::Ok) return shared;
    CompileOptions quiet = o;
    quiet.log = nullptr;
    quiet.progress = nullptr;
    quiet.passes_done = nullptr;
    quiet.dump_after.clear();
    CompileResult own;
    try {
        own = compile(std::move(fresh), quiet);
    } catch (const UserError&) {
        if (!o.qubit_limit) throw;
        return shared;  // fresh wires per call do not fit in --qubit-limit; shared ones do
    }
    if (own.status != CompileStatus::Ok) return own;
    if (cost_under(ir::count_resources(own.circuit), o) < cost_under(ir::count_resources(shared.circuit), o)) {
        own.kept_run = own.kept_run.empty() ? "with fresh work wires per call"
                                            : "with fresh work wires per call, " + own.kept_run;
        if (o.report) own.report["kept_run"] = own.kept_run;
        return own;
    }
    return shared;
}

}  // namespace whittle::compiler
