// One function per subcommand; each adds itself to the app and stores its exit code in `exit_code`.
#pragma once

#include <CLI/CLI.hpp>

namespace whittle::cli {

void add_compile_command(CLI::App& app, int& exit_code);
void add_count_command(CLI::App& app, int& exit_code);
void add_equiv_command(CLI::App& app, int& exit_code);
void add_draw_command(CLI::App& app, int& exit_code);
void add_demo_command(CLI::App& app, int& exit_code);
void add_passes_command(CLI::App& app, int& exit_code);  // lists the registered passes
void add_matrix_command(CLI::App& app, int& exit_code);  // hidden testing aid

}  // namespace whittle::cli
