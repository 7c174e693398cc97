// `whittle draw IN -o OUT.svg|OUT.txt [--compare OTHER] [--zx]`: a circuit diagram (output/draw.h) or a ZX diagram.
#include <chrono>
#include <filesystem>
#include <memory>

#include <fmt/format.h>

#include "cli/commands.h"
#include "cli/driver.h"
#include "frontend/load.h"
#include "output/draw.h"
#include "zx/describe.h"
#include "zx/from_circuit.h"
#include "zx/simplify.h"

namespace whittle::cli {
namespace {

constexpr int kZxSeconds = 30;  // simplification time limit for --zx

}  // namespace

void add_draw_command(CLI::App& app, int& exit_code) {
    struct DrawArgs {
        std::string input, output, compare;
        unsigned width = 24;
        bool ascii = false, no_counts = false, zx = false;
        std::vector<std::string> include_dirs;
    };
    auto args = std::make_shared<DrawArgs>();
    CLI::App* cmd = app.add_subcommand("draw", "draw a circuit diagram as SVG or text");
    cmd->add_option("input", args->input, "program (.wq or .qasm)")->required();
    cmd->add_option("-o,--output", args->output, "diagram file: .svg or .txt ('-' = text on stdout)")->required();
    cmd->add_option("--compare", args->compare, "a second program drawn below the first (before/after)");
    cmd->add_option("--width", args->width, "columns per row before the diagram wraps (0 = never)")->capture_default_str();
    cmd->add_flag("--ascii", args->ascii, "text diagrams in plain ASCII instead of UTF-8 symbols");
    cmd->add_flag("--no-counts", args->no_counts, "leave out the resource counts under each title");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->add_flag("--zx", args->zx, "the ZX diagram after graph-like simplification, as text (docs/zx.md)");
    cmd->callback([args, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int {
            const std::string ext = std::filesystem::path(args->output).extension().string();
            const bool svg = ext == ".svg";
            if (!svg && ext != ".txt" && args->output != "-")
                throw UserError(fmt::format("cannot tell the diagram format of '{}': use a .svg or .txt file", args->output));
            refuse_overwriting_input(args->input, args->output);
            frontend::LoadOptions lo;
            lo.include_dirs = args->include_dirs;
            ir::Circuit first = frontend::load_file(args->input, sm, lo);
            if (args->zx) {
                if (svg) throw UserError("--zx draws text only: use a .txt file or '-'");
                if (!args->compare.empty()) throw UserError("--zx draws one program: leave out --compare");
                std::vector<zx::Step> steps;
                for (const ir::Op& op : first.ops)
                    if (auto why = zx::lower_op(op, zx::kNoSource, steps))
                        throw UserError(fmt::format("{} has no ZX diagram here", *why), op.loc);
                zx::Graph g;
                zx::circuit_to_graph(first, g);
                const size_t before = g.num_vertices() - 2 * first.num_qubits();
                zx::SimplifyStats st;
                const bool done = zx::reduce_to_fixpoint(
                    g, st, std::chrono::steady_clock::now() + std::chrono::seconds(kZxSeconds));
                write_output(args->output,
                             fmt::format("ZX diagram of {} after graph-like simplification ({} spiders before, {} "
                                         "rewrites{})\n{}",
                                         args->input, before, st.total(), done ? "" : ", stopped at its time limit",
                                         zx::describe(g, first)));
                return kOk;
            }
            ir::Circuit second;
            std::vector<lowering::DrawPanel> panels;
            if (args->compare.empty()) {
                panels.push_back({&first, args->input});
            } else {
                second = frontend::load_file(args->compare, sm, lo);
                panels.push_back({&first, "before: " + args->input});
                panels.push_back({&second, "after: " + args->compare});
            }
            lowering::DrawOptions opts;
            opts.width = args->width;
            opts.ascii = args->ascii;
            opts.counts = !args->no_counts;
            write_output(args->output, svg ? lowering::draw_svg(panels, opts) : lowering::draw_text(panels, opts));
            return kOk;
        });
    });
}

}  // namespace whittle::cli
