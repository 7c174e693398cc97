// `whittle demo`: compiles a built-in sample and prints it with its resource table.
#include <iostream>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"

namespace whittle::cli {

void add_demo_command(CLI::App& app, int& exit_code) {
    CLI::App* cmd = app.add_subcommand("demo", "compile a built-in sample and show the before/after table");
    cmd->callback([&exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int { throw UserError("demo: not built yet"); });
    });
}

}  // namespace whittle::cli
