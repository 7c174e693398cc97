// Builds the JSON resource object, `count --json` and the aligned count table from resource counts.
#include "output/report.h"

#include <algorithm>
#include <vector>
#include <utility>

#include <fmt/format.h>

namespace whittle::lowering {

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
    j["rotation_depth"] = r.rotation_depth;
    j["peak_live_qubits"] = r.peak_live_qubits;
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

std::string resource_table(const ir::Resources& r) {
    std::vector<std::pair<std::string, std::string>> rows = {
        {"qubits", fmt::format("{} (data {}, ancilla {}, borrow {})", r.qubits, r.data_qubits, r.clean_qubits,
                               r.dirty_qubits)},
        {"peak live qubits", fmt::format("{}", r.peak_live_qubits)},
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
    if (r.non_clifford_rotations) {
        rows.push_back({"non-Clifford angles", fmt::format("{}", r.non_clifford_rotations)});
        rows.push_back({"rotation depth", fmt::format("{}", r.rotation_depth)});
    }
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
