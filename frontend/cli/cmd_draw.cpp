// `whittle draw IN -o OUT.svg|OUT.txt`: a circuit diagram.
#include <memory>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"

namespace whittle::cli {

void add_draw_command(CLI::App& app, int& exit_code) {
    auto input = std::make_shared<std::string>();
    auto output = std::make_shared<std::string>();
    CLI::App* cmd = app.add_subcommand("draw", "draw a circuit diagram as SVG or text");
    cmd->add_option("input", *input, "program (.wq or .qasm)")->required();
    cmd->add_option("-o,--output", *output, "diagram file: .svg or .txt")->required();
    cmd->callback([&exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int { throw UserError("draw: not built yet"); });
    });
}

}  // namespace whittle::cli
