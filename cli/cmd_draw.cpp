// `whittle draw IN -o OUT.svg|.txt|.png|.pdf [--compare OTHER] [--target T] [--zx]`: a circuit diagram
// (output/draw.h), of the input or of its compiled form, or a ZX diagram.
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <memory>

#include <fmt/format.h>

#include "cli/commands.h"
#include "cli/driver.h"
#include "compiler/compile.h"
#include "frontend/load.h"
#include "output/draw.h"
#include "zx/describe.h"
#include "zx/from_circuit.h"
#include "zx/simplify.h"

namespace whittle::cli {
namespace {

constexpr int kZxSeconds = 30;  // simplification time limit for --zx

/// A temporary file that is removed when it goes out of scope.
struct TempFile {
    std::string path;
    explicit TempFile(const char* suffix) {
        std::string pattern = (std::filesystem::temp_directory_path() / "whittle-draw-XXXXXX").string() + suffix;
        const int fd = mkstemps(pattern.data(), int(std::string(suffix).size()));
        if (fd < 0) throw UserError("cannot create a temporary file for the diagram");
        close(fd);
        path = pattern;
    }
    ~TempFile() {
        std::error_code ec;
        std::filesystem::remove(path, ec);
    }
};

extern "C" char** environ;

/// `svg` rendered as PNG or PDF (`format` "png" or "pdf") by rsvg-convert (librsvg).
std::string render_with_rsvg(const std::string& svg, const std::string& format) {
    TempFile in(".svg"), out(format == "png" ? ".png" : ".pdf");
    {
        std::ofstream f(in.path, std::ios::binary);
        f << svg;
        if (!f) throw UserError("cannot write a temporary file for the diagram");
    }
    std::vector<std::string> argv_s = {"rsvg-convert", "-f", format, "-o", out.path, in.path};
    std::vector<char*> argv;
    for (std::string& a : argv_s) argv.push_back(a.data());
    argv.push_back(nullptr);
    pid_t pid = 0;
    if (posix_spawnp(&pid, "rsvg-convert", nullptr, nullptr, argv.data(), environ) != 0)
        throw UserError(fmt::format("{} diagrams are made from the SVG by rsvg-convert (Debian package librsvg2-bin), "
                                    "which was not found: install it, or write .svg",
                                    format == "png" ? "PNG" : "PDF"));
    int status = 0;
    if (waitpid(pid, &status, 0) < 0 || !WIFEXITED(status) || WEXITSTATUS(status) != 0)
        throw UserError(fmt::format("rsvg-convert could not make the {} diagram", format == "png" ? "PNG" : "PDF"));
    std::ifstream f(out.path, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
    if (bytes.empty()) throw UserError("rsvg-convert wrote an empty diagram");
    return bytes;
}

}  // namespace

void add_draw_command(CLI::App& app, int& exit_code) {
    struct DrawArgs {
        std::string input, output, compare, target;
        unsigned width = 24;
        int level = 2;
        bool ascii = false, no_counts = false, zx = false, hide_idle = false, by_line = false;
        std::vector<std::string> include_dirs;
    };
    auto args = std::make_shared<DrawArgs>();
    CLI::App* cmd = app.add_subcommand("draw", "draw a circuit diagram as SVG or text");
    cmd->add_option("input", args->input, "program (.wq or .qasm)")->required();
    cmd->add_option("-o,--output", args->output,
                    "diagram file: .svg, .txt ('-' = text on stdout), or .png / .pdf (made from the SVG by rsvg-convert)")
        ->required();
    cmd->add_option("--compare", args->compare, "a second program drawn below the first (before/after)");
    cmd->add_option("--width", args->width, "columns per row before the diagram wraps (0 = never)")->capture_default_str();
    cmd->add_flag("--ascii", args->ascii, "text diagrams in plain ASCII instead of UTF-8 symbols");
    cmd->add_flag("--no-counts", args->no_counts, "leave out the resource counts under each title");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->add_flag("--zx", args->zx, "the ZX diagram after graph-like simplification, as text (docs/zx.md)");
    cmd->add_option("--target", args->target,
                    "draw the program compiled to this gate set (as `compile --target`, checked), not as written");
    cmd->add_option("-O", args->level, "optimization level of --target's compile (default 2)")->check(CLI::Range(0, 3));
    cmd->add_flag("--hide-idle", args->hide_idle, "leave out the wires and classical registers no op touches");
    cmd->add_flag("--by-line", args->by_line,
                  "bracket the ops made by each source line (with --target: what each line was compiled into)");
    cmd->callback([args, &exit_code]() {
        frontend::SourceManager sm;
        exit_code = guarded(sm, [&]() -> int {
            const std::string ext = std::filesystem::path(args->output).extension().string();
            const bool image = ext == ".png" || ext == ".pdf";
            const bool svg = ext == ".svg" || image;
            if (!svg && ext != ".txt" && args->output != "-")
                throw UserError(fmt::format("cannot tell the diagram format of '{}': use a .svg, .txt, .png or .pdf file",
                                            args->output));
            refuse_overwriting_input(args->input, args->output);
            if (!args->target.empty() && args->zx) throw UserError("--zx draws the program as written: leave out --target");
            frontend::LoadOptions lo;
            lo.include_dirs = args->include_dirs;
            // With --by-line, what a routine call makes is placed at the call's line of the input.
            lo.locate_at_call_site = args->by_line;
            // The program as written, or compiled as `compile --target T -O N` would (its check included).
            auto load = [&](const std::string& path) {
                if (args->target.empty()) return frontend::load_file(path, sm, lo);
                compiler::CompileOptions co;
                co.target = ir::parse_target(args->target);
                co.level = args->level;
                co.include_dirs = args->include_dirs;
                co.cost_by_line = args->by_line;  // locates a call's ops at the call, as above
                compiler::CompileResult r = compiler::compile_file(path, co, sm);
                if (r.status != compiler::CompileStatus::Ok) throw UserError(r.failure.substr(0, r.failure.find_last_not_of('\n') + 1));
                return std::move(r.circuit);
            };
            ir::Circuit first = load(args->input);
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
                second = load(args->compare);
                panels.push_back({&first, "before: " + args->input});
                panels.push_back({&second, "after: " + args->compare});
            }
            lowering::DrawOptions opts;
            opts.width = args->width;
            opts.ascii = args->ascii;
            opts.counts = !args->no_counts;
            opts.hide_idle = args->hide_idle;
            opts.by_line = args->by_line;
            if (image) {
                write_output(args->output, render_with_rsvg(lowering::draw_svg(panels, opts), ext.substr(1)));
                return kOk;
            }
            write_output(args->output, svg ? lowering::draw_svg(panels, opts) : lowering::draw_text(panels, opts));
            return kOk;
        });
    });
}

}  // namespace whittle::cli
