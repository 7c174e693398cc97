// `whittle matrix IN`: the full unitary as JSON, for cross-checks against independent computations.
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "cli/commands.h"
#include "cli/driver.h"
#include "frontend/load.h"
#include "ir/statevector.h"

namespace whittle::cli {

void add_matrix_command(CLI::App& app, int& exit_code) {
    auto input = std::make_shared<std::string>();
    CLI::App* cmd = app.add_subcommand(
        "matrix", "print a program's unitary as JSON {n, wires, re, im}; basis bit w is wire w (up to 12 qubits)");
    cmd->group("");  // a testing aid, kept out of --help
    cmd->add_option("input", *input, "program (.wq or .qasm)")->required();
    cmd->callback([input, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int {
            const ir::Circuit c = frontend::load_file(*input, sm);
            const Eigen::MatrixXcd u = ir::circuit_unitary(c);
            nlohmann::json j;
            j["n"] = c.num_qubits();
            j["wires"] = nlohmann::json::array();
            for (uint32_t w = 0; w < c.num_qubits(); ++w) j["wires"].push_back(c.wire_name(w));
            nlohmann::json re = nlohmann::json::array(), im = nlohmann::json::array();
            for (Eigen::Index r = 0; r < u.rows(); ++r) {
                nlohmann::json rr = nlohmann::json::array(), ii = nlohmann::json::array();
                for (Eigen::Index k = 0; k < u.cols(); ++k) {
                    rr.push_back(u(r, k).real());
                    ii.push_back(u(r, k).imag());
                }
                re.push_back(std::move(rr));
                im.push_back(std::move(ii));
            }
            j["re"] = std::move(re);
            j["im"] = std::move(im);
            std::cout << j.dump() << "\n";
            return kOk;
        });
    });
}

}  // namespace whittle::cli
