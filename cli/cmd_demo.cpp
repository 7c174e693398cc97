// `whittle demo`: compiles a built-in sample (the Harbor Logistics crane-collision oracle) at -O0 and
// -O2 into clifford+t and prints the program with a before/after resource table.
#include <iostream>

#include <fmt/format.h>

#include "cli/commands.h"
#include "cli/driver.h"
#include "frontend/load.h"
#include "ir/resources.h"
#include "compiler/compile.h"

namespace whittle::cli {
namespace {

// Kept in step with samples/crane_collision.wq (the golden tests compile that file).
constexpr const char* kDemoProgram = R"(# Harbor Logistics, yard team: phase oracle marking crane schedules that collide.
# Two gantry cranes each pick one of four bays (2 bits each). They collide when both pick the
# same bay, or when crane A is in bay 3 while crane B works the neighbouring bay 2 with its boom out.
qubit a[2], b[2], boom
ancilla same[2]

# same[i] = (a[i] == b[i]); computed, used as controls, then uncomputed by the compute block
compute {
  for i in 0..1 { same[i] ^= !(a[i] ^ b[i]) }
} then {
  phase(pi) same[0] & same[1]                         # both bits equal: same bay
  phase(pi) a[0] & a[1] & !b[0] & b[1] & boom         # A in bay 3, B in bay 2, boom out
}
)";

struct Row {
    std::string label;
    ir::Resources r;
};

int run_demo() {
    frontend::SourceManager sm;
    return guarded(sm, [&]() -> int {
        ir::Circuit input = frontend::load_text(kDemoProgram, "demo.wq", frontend::InputFormat::Wq, sm);
        std::cout << "whittle demo: the crane-collision oracle of the Harbor Logistics yard team\n\n"
                  << kDemoProgram << "\n";
        std::vector<Row> rows;
        rows.push_back({"as written (high level)", ir::count_resources(input)});
        struct Variant {
            const char* label;
            int level;
            bool measure;
        };
        const Variant variants[] = {{"clifford+t, -O0 (lower only)", 0, false},
                                    {"clifford+t, -O2", 2, false},
                                    {"clifford+t, -O2 --allow-measurement", 2, true}};
        for (const Variant& v : variants) {
            compiler::CompileOptions o;
            o.target = ir::Target::CliffordT;
            o.level = v.level;
            o.allow_measurement = v.measure;
            o.check = false;  // the table compares resources; `whittle compile` checks
            rows.push_back({v.label, ir::count_resources(compiler::compile(input, o).circuit)});
        }
        std::cout << fmt::format("{:<38} {:>6} {:>7} {:>6} {:>6} {:>6} {:>6}\n", "circuit", "qubits", "T-count",
                                 "CNOT", "ops", "depth", "meas");
        for (const Row& row : rows)
            std::cout << fmt::format("{:<38} {:>6} {:>7} {:>6} {:>6} {:>6} {:>6}\n", row.label, row.r.qubits,
                                     row.r.t_count, row.r.cnot_count, row.r.ops, row.r.depth, row.r.measurements);
        std::cout << "\nTry: whittle compile samples/crane_collision.wq --target clifford+t -O2 --verify\n";
        return kOk;
    });
}

}  // namespace

void add_demo_command(CLI::App& app, int& exit_code) {
    CLI::App* cmd = app.add_subcommand("demo", "compile a built-in sample and show the before/after table");
    cmd->callback([&exit_code]() { exit_code = run_demo(); });
}

}  // namespace whittle::cli
