// whittle's command line: compile, count, equiv, draw, demo.
#include <CLI/CLI.hpp>

#include "frontend/cli/commands.h"
#include "frontend/cli/driver.h"

int main(int argc, char** argv) {
    CLI::App app{"whittle: compiles high-level quantum circuits (.wq, OpenQASM 2.0) into the cheapest correct "
                 "circuit in a native gate set, proves it equivalent and reports its resources"};
    app.require_subcommand(1);
    app.set_version_flag("--version", "whittle 0.1.0");
    int exit_code = 0;
    whittle::cli::add_compile_command(app, exit_code);
    whittle::cli::add_count_command(app, exit_code);
    whittle::cli::add_equiv_command(app, exit_code);
    whittle::cli::add_draw_command(app, exit_code);
    whittle::cli::add_demo_command(app, exit_code);
    whittle::cli::add_matrix_command(app, exit_code);
    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
        int rc = app.exit(e);
        return rc == 0 ? 0 : whittle::cli::kInputError;
    }
    return exit_code;
}
