// The figures a resource estimate is made of: peak live qubits, rotation layers, the logical counts
// of a compile (Toffolis, ANDs, rotations before synthesis) and the whole-circuit error budget.
// Expected values are hand counts of the small programs below, the textbook Toffoli cost (7 T,
// Amy, Maslov, Mosca, Roetteler 2013, arXiv:1206.0758) and the triangle inequality for the budget
// (operator-norm errors of a product add up: common practice); the budget's distance is measured
// with tests/support/dense_unitary.h, which shares no code with the compiler.
#include <doctest/doctest.h>

#include <map>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <cmath>
#include <optional>
#include <string>
#include <vector>

#include <Eigen/Eigenvalues>

#include "compiler/compile.h"
#include "frontend/load.h"
#include "ir/resources.h"
#include "output/compile_report.h"
#include "support/dense_unitary.h"
#include "support/equivalence_helpers.h"

using namespace whittle;

namespace {

ir::Circuit load(const std::string& text) {
    frontend::SourceManager sm;
    return frontend::load_text(text, "estimate.wq", frontend::InputFormat::Wq, sm);
}

compiler::CompileResult compile(const std::string& text, std::optional<ir::Target> target, int level = 2) {
    compiler::CompileOptions o;
    o.target = target;
    o.level = level;
    o.report = true;
    return compiler::compile(load(text), o);
}

/// min over phi of the operator norm of a - e^{i phi} b for unitaries: the eigenvalues e^{i t_k} of
/// b^dagger a lie on an arc of length L (the shortest that holds them all), and the distance is
/// 2 sin(L / 4), reached with phi at the arc's middle (common practice).
double operator_distance_up_to_phase(const test::Mat& a, const test::Mat& b) {
    Eigen::ComplexEigenSolver<test::Mat> es(b.adjoint() * a);
    std::vector<double> t;
    for (Eigen::Index k = 0; k < es.eigenvalues().size(); ++k) t.push_back(std::arg(es.eigenvalues()(k)));
    std::sort(t.begin(), t.end());
    double gap = 2 * M_PI - (t.back() - t.front());  // the largest gap between neighbours on the circle
    for (size_t k = 1; k < t.size(); ++k) gap = std::max(gap, t[k] - t[k - 1]);
    return 2 * std::sin((2 * M_PI - gap) / 4);
}

/// Distance up to global phase of the output from the input on inputs with clean wires at |0>,
/// on the output's wires (the input mapped onto them by register name: added wires start clean).
double testing_distance(const ir::Circuit& in, const ir::Circuit& out) {
    return whittle::testing::distance_on_clean_inputs(whittle::testing::on_wires_of(out, in), out);
}

}  // namespace

TEST_CASE("peak live qubits: data wires throughout, work wires from first to last touch") {
    // Two data wires; w[0] is used by ops 0-1, w[1] by ops 2-3, w[2] never: at most one work
    // wire is live at a time, so the peak is 3 of the 5 declared wires.
    const ir::Circuit c = load(
        "qubit a[2]\nancilla w[3]\n"
        "w[0] ^= a[0] & a[1]\nw[0] ^= a[0] & a[1]\n"
        "w[1] ^= a[0]\nw[1] ^= a[0]\n");
    const ir::Resources r = ir::count_resources(c);
    CHECK(r.qubits == 5);
    CHECK(r.peak_live_qubits == 3);
    // Overlapping ranges: w[1] opens before w[0] closes, so both are live at once.
    const ir::Circuit d = load(
        "qubit a[2]\nancilla w[2]\n"
        "w[0] ^= a[0]\nw[1] ^= a[1]\nw[0] ^= a[0]\nw[1] ^= a[1]\n");
    CHECK(ir::count_resources(d).peak_live_qubits == 4);
}

TEST_CASE("rotation depth: layers of rotations that are not multiples of pi/4") {
    // rz(0.3) on a, then rz(0.2) on b in parallel (one layer), then a CNOT joins them and a third
    // rotation on b follows: two layers. T gates (pi/4) are not counted.
    const ir::Circuit c = load("qubit a, b\nrz(0.3) a\nrz(0.2) b\nt a\nb ^= a\nrz(0.1) b\n");
    const ir::Resources r = ir::count_resources(c);
    CHECK(r.non_clifford_rotations == 3);
    CHECK(r.rotation_depth == 2);
}

TEST_CASE("logical counts: Toffolis before lowering, rotations before synthesis") {
    // Two independent Toffolis (not a compute/uncompute pair): lowered exactly, 7 T each.
    const compiler::CompileResult r =
        compile("qubit a[2], b[2], t[2]\nt[0] ^= a[0] & a[1]\nt[1] ^= b[0] & b[1]\n", ir::Target::CliffordT);
    REQUIRE(r.status == compiler::CompileStatus::Ok);
    const lowering::LogicalCounts n = lowering::logical_counts(r.records, r.circuit);
    CHECK(n.toffoli == 2);
    CHECK(n.relative_phase_toffoli == 0);
    // At most 7 T each; reduce-t finds 13 for the pair (checked with numpy against the two Toffolis
    // when this test was written): the logical count stays 2 whatever the lowered T.
    CHECK(ir::count_resources(r.circuit).t_count <= 14);
    CHECK(r.report["logical_counts"]["toffoli"] == 2);
    // Left high level (no target): the Toffolis are still in the output and counted there.
    const compiler::CompileResult high = compile("qubit a[2], t\nt ^= a[0] & a[1]\n", std::nullopt, 1);
    CHECK(lowering::logical_counts(high.records, high.circuit).toffoli == 1);
    // Two rotations in parallel and one after them: three approximated, two layers before synthesis.
    const compiler::CompileResult rot =
        compile("qubit a, b\nrz(0.3) a\nrz(0.2) b\nb ^= a\nrz(0.1) b\n", ir::Target::CliffordT);
    const lowering::LogicalCounts m = lowering::logical_counts(rot.records, rot.circuit);
    CHECK(m.rotations == 3);
    CHECK(m.rotation_depth == 2);
    // On a rotation target the rotations stay in the output and are counted there.
    const compiler::CompileResult native =
        compile("qubit a, b\nrz(0.3) a\nrz(0.2) b\nb ^= a\nrz(0.1) b\n", ir::Target::CxRzSx);
    CHECK(lowering::logical_counts(native.records, native.circuit).rotations == 3);
}

TEST_CASE("total error: split over the approximated rotations, the output within it") {
    const std::string program = "qubit a, b\nh a\nrz(0.3) a\nrz(0.2) b\nb ^= a\nrz(0.1) b\nry(0.7) a\n";
    for (double budget : {1e-2, 1e-4}) {
        compiler::CompileOptions o;
        o.target = ir::Target::CliffordT;
        o.total_error = budget;
        o.report = true;
        const ir::Circuit in = load(program);
        const compiler::CompileResult r = compiler::compile(in, o);
        REQUIRE(r.status == compiler::CompileStatus::Ok);
        const double bound = r.report["approximation_error_bound"].get<double>();
        const uint64_t rotations = r.report["logical_counts"]["rotations"].get<uint64_t>();
        CHECK(rotations >= 4);
        CHECK(bound <= budget);
        CHECK(r.report["options"]["epsilon"].get<double>() == doctest::Approx(budget / double(rotations)));
        // The operator-norm distance (up to global phase) is within the budget too.
        CHECK(operator_distance_up_to_phase(test::dense_unitary(in), test::dense_unitary(r.circuit)) <= budget);
    }
    // Both ways of setting the error at once are refused.
    compiler::CompileOptions both;
    both.target = ir::Target::CliffordT;
    both.total_error = 1e-3;
    both.epsilon = 1e-4;
    CHECK_THROWS_AS(compiler::compile(load(program), both), UserError);
}

TEST_CASE("cost by source line: a routine call's cost at the call, columns adding up to the whole") {
    // Hand counts: line 5 is one T gate; the call on line 6 runs the routine's two T gates on two
    // wires (nothing to merge) and its H; the routine's own lines get nothing.
    const std::filesystem::path dir = std::filesystem::temp_directory_path() / "whittle_cost_by_line_test";
    std::filesystem::create_directories(dir);
    const std::string path = (dir / "costs.wq").string();
    {
        std::ofstream f(path);
        f << "routine two_t(x, y) {\n  t x\n  h y; t y\n}\nqubit a, b, c\nt a\ntwo_t(b, c)\nc ^= a\n";
    }
    compiler::CompileOptions o;
    o.target = ir::Target::CliffordT;
    o.level = 1;
    o.cost_by_line = true;
    o.report = true;
    frontend::SourceManager sm;
    const compiler::CompileResult r = compiler::compile_file(path, o, sm);
    REQUIRE(r.status == compiler::CompileStatus::Ok);
    const ir::Resources all = ir::count_resources(r.circuit);
    uint64_t t = 0, two = 0, ops = 0, qubits = 0;
    for (const lowering::LineCost& row : r.line_costs) {
        t += row.t_count;
        two += row.two_qubit;
        ops += row.ops;
        qubits += row.qubits;
        CHECK((row.line == 0 || row.line >= 5));  // nothing inside the routine (lines 1-4)
    }
    CHECK(t == all.t_count);
    CHECK(two == all.two_qubit_count);
    CHECK(ops == all.ops);
    CHECK(qubits == all.qubits);
    REQUIRE(r.line_costs.size() >= 3);
    CHECK(r.line_costs[0].line == 7);  // the call, largest first
    CHECK(r.line_costs[0].t_count == 2);
    CHECK(r.line_costs[1].line == 6);
    CHECK(r.line_costs[1].t_count == 1);
    CHECK(r.report["cost_by_line"][0]["line"] == 7);
    // The per-routine view: the routine's T gates stay at their own lines 2 and 3, the call gets none.
    o.cost_in_routines = true;
    frontend::SourceManager sm2;
    const compiler::CompileResult in = compiler::compile_file(path, o, sm2);
    REQUIRE(in.status == compiler::CompileStatus::Ok);
    std::map<uint32_t, uint64_t> t_at;
    uint64_t t_sum = 0;
    for (const lowering::LineCost& row : in.line_costs) {
        t_at[row.line] += row.t_count;
        t_sum += row.t_count;
    }
    CHECK(t_sum == ir::count_resources(in.circuit).t_count);
    CHECK(t_at[2] == 1);
    CHECK(t_at[3] == 1);
    CHECK(t_at[6] == 1);
    CHECK(t_at[7] == 0);
    std::filesystem::remove_all(dir);
}

TEST_CASE("qubit limit: the cheapest run that fits, what it cost, and a clear error when none fits") {
    // A 5-control X with no work wire: with --extra-ancillas 3 the lowering has clean wires for a
    // ladder (fewer T); under a limit of the program's own 6 wires it must do without them.
    const std::string program = "qubit c[5], t\nt ^= c[0] & c[1] & c[2] & c[3] & c[4]\n";
    compiler::CompileOptions o;
    o.target = ir::Target::CliffordT;
    o.extra_ancillas = 3;
    o.report = true;
    const compiler::CompileResult wide = compiler::compile(load(program), o);
    const ir::Resources w = ir::count_resources(wide.circuit);
    REQUIRE(w.qubits > 6);  // the extra wires pay for themselves without a limit
    o.qubit_limit = 6;
    const compiler::CompileResult narrow = compiler::compile(load(program), o);
    REQUIRE(narrow.status == compiler::CompileStatus::Ok);
    const ir::Resources n = ir::count_resources(narrow.circuit);
    CHECK(n.qubits <= 6);
    CHECK(n.t_count >= w.t_count);
    if (n.t_count > w.t_count) CHECK(narrow.limit_note.find("instead of") != std::string::npos);
    CHECK(narrow.report["options"]["qubit_limit"] == 6);
    // The output is still the program (dense check against the input).
    CHECK(testing_distance(load(program), narrow.circuit) < 1e-9);
    // A looser limit is never worse: with one extra wire allowed the run takes it.
    o.qubit_limit = 7;
    const compiler::CompileResult seven = compiler::compile(load(program), o);
    const ir::Resources s7 = ir::count_resources(seven.circuit);
    CHECK(s7.qubits <= 7);
    CHECK(s7.t_count <= n.t_count);
    CHECK(s7.t_count >= w.t_count);
    CHECK(testing_distance(load(program), seven.circuit) < 1e-9);
    // Fewer wires than the program's own data: refused, naming the fewest found.
    o.qubit_limit = 5;
    CHECK_THROWS_WITH_AS(compiler::compile(load(program), o), doctest::Contains("no compile of this input fits"), UserError);
}

TEST_CASE("qubit limit down to the program's own peak: a controlled modular adder in 2n+5 wires") {
    // when ctl { mod_add_const(b, 5, 13) } with n = 4: the library routine's high-level peak is
    // 2n + 5 = 13 live wires (ctl, b, its n + 1 sum wires, a carry and a flag); the lowering's
    // work wires used to widen it to 17, and a limit under 17 found no compile. With work wires
    // taken only inside their lives the limit of 13 fits. Checked against integer arithmetic:
    // every basis input |ctl, b> with b < 13 goes to |ctl, ctl ? (b + 5) mod 13 : b> with every
    // other wire back at |0> (the expected map is the modular adder's definition, not a count).
    const std::string program = "use \"arith\"\nqubit ctl\nqubit b[4]\nwhen ctl { mod_add_const(b, 5, 13) }\n";
    compiler::CompileOptions o;
    o.target = ir::Target::CliffordT;
    o.qubit_limit = 13;
    const compiler::CompileResult r = compiler::compile(load(program), o);
    REQUIRE(r.status == compiler::CompileStatus::Ok);
    const ir::Circuit& c = r.circuit;
    CHECK(c.num_qubits() <= 13);
    // The wires of ctl and b by name (the lowering may add wires after them).
    uint32_t ctl = UINT32_MAX;
    std::vector<uint32_t> b(4, UINT32_MAX);
    for (uint32_t w = 0; w < c.num_qubits(); ++w) {
        const std::string& name = c.registers[c.qubits[w].reg].name;
        if (name == "ctl") ctl = w;
        if (name == "b") b[c.qubits[w].index] = w;
    }
    REQUIRE(ctl != UINT32_MAX);
    for (uint32_t w : b) REQUIRE(w != UINT32_MAX);
    const size_t dim = size_t(1) << c.num_qubits();
    for (uint32_t on = 0; on < 2; ++on) {
        for (uint32_t x = 0; x < 13; ++x) {
            auto index_of = [&](uint32_t value) {
                size_t k = size_t(on) << ctl;
                for (uint32_t i = 0; i < 4; ++i) k |= size_t((value >> i) & 1u) << b[i];
                return k;
            };
            Eigen::VectorXcd v = Eigen::VectorXcd::Zero(Eigen::Index(dim));
            v[Eigen::Index(index_of(x))] = 1;
            for (const ir::Op& op : c.ops) test::apply_op(op, v);
            const uint32_t want = on ? (x + 5) % 13 : x;
            CHECK(std::abs(std::abs(v[Eigen::Index(index_of(want))]) - 1.0) < 1e-9);
        }
    }
    // The limit's cost is reported against the run without it.
    CHECK(r.limit_note.find("instead of") != std::string::npos);
}
