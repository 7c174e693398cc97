// Builds the compile report: the output's resources, the options, each pass's record and construction.
#include "output/compile_report.h"

#include <algorithm>
#include <utility>

#include "ir/resources.h"

namespace whittle::lowering {

namespace {

Json loc_json(const ir::SourceLoc& loc) {
    if (!loc.known()) return nullptr;
    return {{"line", uint32_t(loc.line)}, {"column", uint32_t(loc.column)}};
}

Json pass_json(const passes::PassRecord& r) {
    Json stats = Json::object();
    for (const auto& [name, value] : r.result.stats) stats[name] = value;
    Json j;
    j["name"] = r.name;
    j["changed"] = r.changed;
    j["ops_before"] = r.ops_before;
    j["ops_after"] = r.ops_after;
    j["t_before"] = r.t_before;
    j["t_after"] = r.t_after;
    j["cnot_before"] = r.cnot_before;
    j["cnot_after"] = r.cnot_after;
    j["seconds"] = r.seconds;
    j["checked_by"] = r.checked_by.empty() ? Json(nullptr) : Json(r.checked_by);
    j["stats"] = stats;
    j["notes"] = r.result.notes;
    j["error_bound"] = r.result.error_bound;
    return j;
}

Json construction_json(const std::string& pass, const passes::Construction& k) {
    Json j;
    j["pass"] = pass;
    j["op"] = k.op;
    j["method"] = k.method;
    j["reason"] = k.reason;
    j["loc"] = loc_json(k.loc);
    j["t_count"] = k.t_count < 0 ? Json(nullptr) : Json(k.t_count);
    j["cnot_count"] = k.cnot_count < 0 ? Json(nullptr) : Json(k.cnot_count);
    return j;
}

int64_t stat_of(const passes::PassRecord& r, const char* name) {
    for (const auto& [k, v] : r.result.stats)
        if (k == name) return v;
    return 0;
}

}  // namespace

LogicalCounts logical_counts(const std::vector<passes::PassRecord>& records, const ir::Circuit& output) {
    LogicalCounts n;
    const ir::Resources out = ir::count_resources(output);
    bool synthesized = false;
    for (const passes::PassRecord& r : records) {
        if (r.name == "lower-toffoli") {
            n.toffoli += uint64_t(stat_of(r, "toffoli-7t") + stat_of(r, "toffoli-tdepth3") + stat_of(r, "ccz-7t") +
                                  stat_of(r, "ccz-tdepth3"));
            n.relative_phase_toffoli += uint64_t(stat_of(r, "toffoli-relative-phase"));
            n.temporary_and += uint64_t(stat_of(r, "temporary-and"));
            n.measured_uncompute += uint64_t(stat_of(r, "measured-erase"));
        }
        if (r.name == "to-target" && stat_of(r, "rotations-approximated") > 0) {
            synthesized = true;
            n.rotations += uint64_t(stat_of(r, "rotations-approximated"));
            n.rotation_depth = std::max(n.rotation_depth, uint64_t(stat_of(r, "rotation-layers")));
        }
    }
    // What is still in the output (no target, or one that keeps Toffolis or rotations).
    const auto ccz = out.gates.find("ccz");
    n.toffoli += out.toffoli_count + (ccz == out.gates.end() ? 0 : ccz->second);
    n.mcx = out.mcx_count;
    if (!synthesized) {
        n.rotations = out.non_clifford_rotations;
        n.rotation_depth = out.rotation_depth;
    }
    n.peak_live_qubits = out.peak_live_qubits;
    return n;
}

Json compile_report(const CompileReportInput& in) {
    Json j;
    j["schema"] = kReportSchema;
    j["input"] = in.input;
    j["target"] = in.options.target ? Json(ir::target_name(*in.options.target)) : Json(nullptr);
    j["level"] = in.options.level;
    j["options"] = {
        {"optimize_for", ir::metric_name(in.options.optimize_for)},
        {"allow_measurement", in.options.allow_measurement},
        {"extra_ancillas", in.options.extra_ancillas},
        {"gadget_wires", in.options.gadget_wires},
        {"rewrite_effort", in.options.rewrite_effort},
        {"resynth_effort", in.options.resynth_effort},
        {"epsilon", in.options.epsilon},
        {"passes", in.explicit_passes.empty() ? Json(nullptr) : Json(in.explicit_passes)},
        {"emit", in.emit},
        {"verify", in.verify},
    };
    j["kept_run"] = in.kept_run.empty() ? Json(nullptr) : Json(in.kept_run);
    if (in.output) {
        j.update(resources_json(ir::count_resources(*in.output)));
        const LogicalCounts n = logical_counts(in.records, *in.output);
        j["logical_counts"] = {
            {"toffoli", n.toffoli},
            {"relative_phase_toffoli", n.relative_phase_toffoli},
            {"temporary_and", n.temporary_and},
            {"measured_uncompute", n.measured_uncompute},
            {"mcx", n.mcx},
            {"rotations", n.rotations},
            {"rotation_depth", n.rotation_depth},
            {"peak_live_qubits", n.peak_live_qubits},
        };
    }
    j["input_resources"] = in.source ? resources_json(ir::count_resources(*in.source)) : Json(nullptr);
    Json pass_list = Json::array();
    Json constructions = Json::array();
    double error = 0;
    double seconds = 0;
    for (const passes::PassRecord& r : in.records) {
        pass_list.push_back(pass_json(r));
        for (const passes::Construction& k : r.result.constructions) constructions.push_back(construction_json(r.name, k));
        error += r.result.error_bound;
        seconds += r.seconds;
    }
    j["passes"] = std::move(pass_list);
    j["constructions"] = std::move(constructions);
    j["approximation_error_bound"] = error;
    j["pass_seconds"] = seconds;
    return j;
}

}  // namespace whittle::lowering
