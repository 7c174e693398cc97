// `whittle count`: the resource table of a program (or its JSON form, docs/report-schema.md).
#include <iostream>
#include <memory>

#include "cli/commands.h"
#include "cli/driver.h"
#include "frontend/load.h"
#include "ir/resources.h"
#include "output/report.h"

namespace whittle::cli {

void add_count_command(CLI::App& app, int& exit_code) {
    struct CountArgs {
        std::string input;
        bool json = false;
        std::vector<std::string> include_dirs;
    };
    auto args = std::make_shared<CountArgs>();
    CLI::App* cmd = app.add_subcommand("count", "print a program's resources: qubits, gates by kind, T-count, CNOT, depth");
    cmd->add_option("input", args->input, "program (.wq or .qasm)")->required();
    cmd->add_flag("--json", args->json, "print JSON instead of a table (schema: docs/report-schema.md)");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->callback([args, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int {
            frontend::LoadOptions lo;
            lo.include_dirs = args->include_dirs;
            ir::Circuit c = frontend::load_file(args->input, sm, lo);
            if (args->json) std::cout << lowering::count_json(c, args->input).dump(2) << "\n";
            else std::cout << lowering::resource_table(ir::count_resources(c));
            return kOk;
        });
    });
}

}  // namespace whittle::cli
