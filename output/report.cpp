// Builds the JSON resource report and the aligned count table from resource counts and pass records.
#include "output/report.h"

#include <algorithm>
#include <utility>

#include <fmt/format.h>

namespace whittle::lowering {

const char* metric_name(passes::Metric m) {
    switch (m) {
    case passes::Metric::TCount: return "t";
    case passes::Metric::TwoQubit: return "2q";
    case passes::Metric::Depth: return "depth";
    }
    return "?";
}

Json resources_json(const ir::Resources& r) {
    Json j;
    j["qubits"] = r.qubits;
    j["qubits_by_role"] = {{"data", r.data_qubits}, {"ancilla", r.clean_qubits}, {"borrow", r.dirty_qubits}};
    j["ops"] = r.ops;
    j["t_count"] = r.t_count;
    j["t_depth"] = r.t_depth;
    j["cnot_count"] = r.cnot_count;
    j["two_qubit_count"] = r.two_qubit_count;
    j["toffoli_count"] = r.toffoli_count;
    j["mcx_count"] = r.mcx_count;
    j["measurements"] = r.measurements;
    j["non_clifford_rotations"] = r.non_clifford_rotations;
    j["depth"] = r.depth;
    j["gates"] = r.gates;  // std::map: keys come out sorted
    return j;
}

Json count_json(const ir::Circuit& c, const std::string& input) {
    Json j;
    j["schema"] = kReportSchema;
    j["input"] = input;
    j.update(resources_json(ir::count_resources(c)));
    return j;
}

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
    j["target"] = in.options.target.empty() ? Json(nullptr) : Json(in.options.target);
    j["level"] = in.options.level;
    j["options"] = {
        {"optimize_for", metric_name(in.options.optimize_for)},
        {"allow_measurement", in.options.allow_measurement},
        {"extra_ancillas", in.options.extra_ancillas},
        {"epsilon", in.options.epsilon},
        {"passes", in.explicit_passes.empty() ? Json(nullptr) : Json(in.explicit_passes)},
        {"emit", in.emit},
        {"verify", in.verify},
    };
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

std::string resource_table(const ir::Resources& r) {
    std::vector<std::pair<std::string, std::string>> rows = {
        {"qubits", fmt::format("{} (data {}, ancilla {}, borrow {})", r.qubits, r.data_qubits, r.clean_qubits,
                               r.dirty_qubits)},
        {"ops", fmt::format("{}", r.ops)},
        {"T-count", fmt::format("{}", r.t_count)},
        {"T-depth", fmt::format("{}", r.t_depth)},
        {"CNOT", fmt::format("{}", r.cnot_count)},
        {"two-qubit", fmt::format("{}", r.two_qubit_count)},
        {"Toffoli", fmt::format("{}", r.toffoli_count)},
        {"multi-controlled X", fmt::format("{}", r.mcx_count)},
        {"depth", fmt::format("{}", r.depth)},
    };
    if (r.measurements) rows.push_back({"measurements", fmt::format("{}", r.measurements)});
    if (r.non_clifford_rotations) rows.push_back({"non-Clifford angles", fmt::format("{}", r.non_clifford_rotations)});
    // Gate rows are indented by two; every value starts in the same column.
    size_t key_width = 0;
    for (const auto& row : rows) key_width = std::max(key_width, row.first.size());
    for (const auto& gate : r.gates) key_width = std::max(key_width, gate.first.size() + 2);
    std::string out;
    for (const auto& [k, v] : rows) out += fmt::format("{:<{}}  {}\n", k, key_width, v);
    if (r.gates.empty()) return out;
    out += "gates by name\n";
    for (const auto& [k, v] : r.gates) out += fmt::format("  {:<{}}  {}\n", k, key_width - 2, v);
    return out;
}

}  // namespace whittle::lowering
