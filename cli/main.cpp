// whittle's command line: compile, count, equiv, draw, demo, passes.
#include <cstdio>
#include <iostream>

#include <CLI/CLI.hpp>

#include "cli/commands.h"
#include "cli/driver.h"

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
    whittle::cli::add_passes_command(app, exit_code);
    whittle::cli::add_matrix_command(app, exit_code);
    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
        int rc = app.exit(e);
        return rc == 0 ? 0 : whittle::cli::kInputError;
    }
    // Whatever a subcommand printed must have arrived: a failed write to stdout (a full disk,
    // /dev/full) is an error even when the subcommand itself succeeded.
    std::cout.flush();
    if (!std::cout || std::fflush(stdout) != 0) {
        if (exit_code == whittle::cli::kOk) std::cerr << "error: cannot write to standard output\n";
        return exit_code == whittle::cli::kOk ? whittle::cli::kInputError : exit_code;
    }
    return exit_code;
}
