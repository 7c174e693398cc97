// Builds the compile report: the output's resources, the options, each pass's record and construction.
#include "output/compile_report.h"

#include <utility>

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

}  // namespace

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
        {"epsilon", in.options.epsilon},
        {"passes", in.explicit_passes.empty() ? Json(nullptr) : Json(in.explicit_passes)},
        {"emit", in.emit},
        {"verify", in.verify},
    };
    j["kept_run"] = in.kept_run.empty() ? Json(nullptr) : Json(in.kept_run);
    if (in.output) j.update(resources_json(ir::count_resources(*in.output)));
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
