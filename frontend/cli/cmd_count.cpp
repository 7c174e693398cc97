// `whittle count`: the resource table of a program (or its JSON form).
#include <iostream>
#include <memory>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"
#include "frontend/load.h"
#include "ir/resources.h"

namespace whittle::cli {
namespace {

struct CountArgs {
    std::string input;
    bool json = false;
    std::vector<std::string> include_dirs;
};

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
    std::string out;
    for (auto& [k, v] : rows) out += fmt::format("{:<20} {}\n", k, v);
    out += "gates by name:\n";
    for (auto& [k, v] : r.gates) out += fmt::format("  {:<18} {}\n", k, v);
    return out;
}

}  // namespace

nlohmann::json resources_json(const ir::Resources& r) {
    nlohmann::json j;
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
    j["depth"] = r.depth;
    j["gates"] = r.gates;
    return j;
}

void add_count_command(CLI::App& app, int& exit_code) {
    auto args = std::make_shared<CountArgs>();
    CLI::App* cmd = app.add_subcommand("count", "print a program's resources: qubits, gates by kind, T-count, CNOT, depth");
    cmd->add_option("input", args->input, "program (.wq or .qasm)")->required();
    cmd->add_flag("--json", args->json, "print JSON instead of a table");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->callback([args, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int {
            frontend::LoadOptions lo;
            lo.include_dirs = args->include_dirs;
            ir::Circuit c = frontend::load_file(args->input, sm, lo);
            ir::Resources r = ir::count_resources(c);
            if (args->json) std::cout << resources_json(r).dump(2) << "\n";
            else std::cout << resource_table(r);
            return kOk;
        });
    });
}

}  // namespace whittle::cli
