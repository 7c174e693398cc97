// `whittle equiv A B`: exit 0 equivalent, 1 not equivalent, 2 error or inconclusive.
#include <memory>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"

namespace whittle::cli {

void add_equiv_command(CLI::App& app, int& exit_code) {
    auto files = std::make_shared<std::vector<std::string>>();
    CLI::App* cmd = app.add_subcommand("equiv", "check that two programs are equivalent (up to global phase)");
    cmd->add_option("programs", *files, "the two programs (.wq or .qasm)")->required()->expected(2);
    cmd->callback([files, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int { throw UserError("equiv: not built yet"); });
    });
}

}  // namespace whittle::cli
