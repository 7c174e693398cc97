// `compile --verify` when a pass breaks equivalence: a deliberately wrong pass, added through the
// library's register_pass (the shipped CLI has no way to add one), runs inside the real compile
// command; it must exit 1, name the pass and leave the counterexample and both circuits on disk.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <iostream>
#include <sstream>
#include <unistd.h>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include "cli/commands.h"
#include "frontend/load.h"
#include "verify/equivalence.h"
#include "passes/registry.h"
#include "support/dense_unitary.h"

using namespace whittle;
namespace fs = std::filesystem;

namespace {

constexpr const char* kBrokenPass = "test-flip-first-t";

/// Wrong on purpose: turns the first T (a phase of pi/4 on one wire) into T-dagger. T and T-dagger
/// differ by more than a global phase (T = diag(1, e^{i pi/4}); Nielsen & Chuang, ch. 4).
passes::PassResult flip_first_t(ir::Circuit& c, const passes::PassOptions&) {
    passes::PassResult r;
    for (ir::Op& op : c.ops) {
        if (op.kind != ir::OpKind::Phase || op.controls.size() != 1 || !(op.angle == ir::Angle::pi_times(1, 4)))
            continue;
        op.angle = -op.angle;
        r.changed = true;
        break;
    }
    return r;
}

void register_broken_pass_once() {
    if (!passes::find_pass(kBrokenPass))
        passes::register_pass({kBrokenPass, "test only: T becomes T-dagger", passes::Stage::HighLevel, flip_first_t});
}

struct CliRun {
    int exit_code = -1;
    std::string err;
};

/// Runs `whittle ARGS...` in-process through the same subcommand the executable uses.
CliRun run_whittle(std::vector<std::string> args) {
    CLI::App app{"whittle (test)"};
    app.require_subcommand(1);
    CliRun run;
    int exit_code = 0;
    cli::add_compile_command(app, exit_code);
    args.insert(args.begin(), "whittle");
    std::vector<char*> argv;
    for (std::string& a : args) argv.push_back(a.data());
    std::ostringstream captured;
    std::streambuf* saved = std::cerr.rdbuf(captured.rdbuf());
    try {
        app.parse(int(argv.size()), argv.data());
        run.exit_code = exit_code;
    } catch (const CLI::ParseError& e) {
        run.exit_code = 100 + app.exit(e);
    }
    std::cerr.rdbuf(saved);
    run.err = captured.str();
    return run;
}

std::string read_text(const fs::path& p) {
    std::ifstream in(p);
    std::stringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

ir::Circuit load(const fs::path& p) {
    frontend::SourceManager sm;
    return frontend::load_file(p.string(), sm);
}

/// A fresh, empty folder for one test case.
fs::path scratch_folder(const std::string& name) {
    fs::path dir = fs::temp_directory_path() / fmt::format("whittle-verify-test-{}-{}", name, ::getpid());
    fs::remove_all(dir);
    fs::create_directories(dir);
    return dir;
}

// Harbor Logistics: the berth-occupancy flag, with one T on the berth wire in superposition.
constexpr const char* kProgram = R"(qubit berth[2]
h berth[0]
t berth[0]
berth[1] ^= berth[0]
)";

}  // namespace

TEST_CASE("compile --verify stops at a pass that breaks equivalence, names it and writes the evidence") {
    register_broken_pass_once();
    const fs::path dir = scratch_folder("fail");
    const fs::path in = dir / "berth.wq", out = dir / "out.wq";
    std::ofstream(in) << kProgram;

    const CliRun run = run_whittle({"compile", in.string(), "-o", out.string(), "--passes",
                                    std::string("normalize,") + kBrokenPass + ",cancel", "--verify", "--quiet"});
    INFO(run.err);
    CHECK(run.exit_code == 1);
    CHECK(run.err.find(fmt::format("pass '{}'", kBrokenPass)) != std::string::npos);
    CHECK(run.err.find("counterexample") != std::string::npos);
    CHECK_FALSE(fs::exists(out));  // no output from a failed verification

    const std::string stem = (dir / fmt::format("whittle-verify-{}", kBrokenPass)).string();
    REQUIRE(fs::exists(stem + "-before.wq"));
    REQUIRE(fs::exists(stem + "-after.wq"));
    REQUIRE(fs::exists(stem + "-counterexample.txt"));
    const std::string cex = read_text(stem + "-counterexample.txt");
    CHECK(cex.find(fmt::format("pass: {}", kBrokenPass)) != std::string::npos);
    CHECK(cex.find("counterexample: ") != std::string::npos);

    // The files are the circuits around the broken pass: "before" is the program (normalize kept
    // its meaning), "after" is not, by the checker and by the independent dense matrices.
    const ir::Circuit source = load(in), before = load(stem + "-before.wq"), after = load(stem + "-after.wq");
    CHECK(passes::check_equivalence(source, before).verdict == passes::Verdict::Equivalent);
    CHECK(passes::check_equivalence(before, after).verdict == passes::Verdict::NotEquivalent);
    CHECK(test::distance_up_to_phase(test::dense_unitary(source), test::dense_unitary(before)) < 1e-9);
    CHECK(test::distance_up_to_phase(test::dense_unitary(before), test::dense_unitary(after)) > 0.1);
    // Only the first failing pass leaves files.
    CHECK_FALSE(fs::exists(dir / "whittle-verify-cancel-before.wq"));
    fs::remove_all(dir);
}

TEST_CASE("without --verify the final check catches the broken pass; --no-check lets it through") {
    register_broken_pass_once();
    const fs::path dir = scratch_folder("pass");
    const fs::path in = dir / "berth.wq", out = dir / "out.wq";
    std::ofstream(in) << kProgram;

    // The default final check compares the output with the input: exit 1, no output file.
    CliRun run = run_whittle({"compile", in.string(), "-o", out.string(), "--passes",
                              std::string("normalize,") + kBrokenPass, "--quiet"});
    INFO(run.err);
    CHECK(run.exit_code == 1);
    CHECK(run.err.find("not equivalent to the input") != std::string::npos);
    CHECK(run.err.find("counterexample") != std::string::npos);
    CHECK_FALSE(fs::exists(out));

    // A correct compile prints its summary line with the verdict.
    run = run_whittle({"compile", in.string(), "-o", out.string(), "--target", "clifford+t"});
    CHECK(run.exit_code == 0);
    CHECK(run.err.find("verified exact") != std::string::npos);
    fs::remove(out);

    // With --no-check the wrong circuit is written (the user asked for no check).
    run = run_whittle({"compile", in.string(), "-o", out.string(), "--passes",
                       std::string("normalize,") + kBrokenPass, "--quiet", "--no-check"});
    CHECK(run.exit_code == 0);
    REQUIRE(fs::exists(out));
    CHECK(passes::check_equivalence(load(in), load(out)).verdict == passes::Verdict::NotEquivalent);

    fs::remove(out);
    run = run_whittle({"compile", in.string(), "-o", out.string(), "-O2", "--target", "clifford+t", "--verify", "--quiet"});
    INFO(run.err);
    CHECK(run.exit_code == 0);
    CHECK(fs::exists(out));
    for (const fs::directory_entry& e : fs::directory_iterator(dir))
        CHECK_MESSAGE(e.path().filename().string().rfind("whittle-verify-", 0) != 0, e.path().string());
    fs::remove_all(dir);
}

TEST_CASE("register_pass refuses a name that exists") {
    register_broken_pass_once();
    CHECK_THROWS_AS(passes::register_pass({"cancel", "again", passes::Stage::HighLevel, flip_first_t}), UserError);
    CHECK_THROWS_AS(passes::register_pass({kBrokenPass, "again", passes::Stage::HighLevel, flip_first_t}), UserError);
    // Registered passes are found by name but stay out of the built-in list and the -O pipelines.
    for (const passes::PassInfo& p : passes::all_passes()) CHECK(std::string(p.name) != kBrokenPass);
}
