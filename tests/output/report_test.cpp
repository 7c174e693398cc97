// The JSON report and the count table: fields, values against textbook counts, pass records, alignment.
#include <doctest/doctest.h>

#include <sstream>

#include "support/harbor_circuits.h"
#include "ir/resources.h"
#include "output/compile_report.h"

using namespace whittle;

TEST_CASE("count json of the textbook Toffoli has the book's counts") {
    // Nielsen & Chuang Fig. 4.9 (memory): 7 T/T-dagger, 6 CNOT, 2 H, 15 gates.
    ir::Circuit c = testing::textbook_toffoli();
    lowering::Json j = lowering::count_json(c, "toffoli.wq");
    CHECK(j["schema"] == lowering::kReportSchema);
    CHECK(j["input"] == "toffoli.wq");
    CHECK(j["qubits"] == 3);
    CHECK(j["t_count"] == 7);
    CHECK(j["cnot_count"] == 6);
    CHECK(j["two_qubit_count"] == 6);
    CHECK(j["ops"] == 15);
    CHECK(j["gates"]["h"] == 2);
    CHECK(j["gates"]["cx"] == 6);
    CHECK(j["gates"]["t"] == 4);
    CHECK(j["gates"]["tdg"] == 3);
    CHECK(j["qubits_by_role"]["data"] == 3);
    for (const char* key : {"t_depth", "depth", "toffoli_count", "mcx_count", "measurements"}) CHECK(j.contains(key));
}

TEST_CASE("roles are counted by kind of wire") {
    ir::Circuit c = testing::crane_check();
    lowering::Json j = lowering::count_json(c, "crane.wq");
    CHECK(j["qubits"] == 8);  // crane[3], berth[2], flag, w[1], d
    CHECK(j["qubits_by_role"]["data"] == 6);
    CHECK(j["qubits_by_role"]["ancilla"] == 1);
    CHECK(j["qubits_by_role"]["borrow"] == 1);
    CHECK(j["measurements"] == 1);
}

TEST_CASE("compile report carries options, passes, constructions and the error total") {
    ir::Circuit src = testing::crane_check();
    ir::Circuit out = testing::textbook_toffoli();
    lowering::CompileReportInput in;
    in.input = "crane.wq";
    in.source = &src;
    in.output = &out;
    in.options.target = ir::parse_optional_target("clifford+t");
    in.options.level = 3;
    in.options.optimize_for = passes::Metric::TwoQubit;
    in.emit = "qasm2";
    passes::PassRecord a;
    a.name = "lower-controls";
    a.changed = true;
    a.ops_before = 13;
    a.ops_after = 20;
    a.result.count("mcx-lowered", 1);
    a.result.constructions.push_back({"flag ^= crane[2] & !berth[0] & berth[1]", "clean-ladder", "1 clean wire free: w[0]",
                                      ir::SourceLoc{0, 7, 3}, 14, 12});
    passes::PassRecord b;
    b.name = "approx-rotations";
    b.result.error_bound = 1e-10;
    b.result.notes.push_back("rz(pi/8) berth[0]: 52 T");
    passes::PassRecord b2 = b;
    b2.result.error_bound = 2e-10;
    in.records = {a, b, b2};
    lowering::Json j = lowering::compile_report(in);
    CHECK(j["target"] == "clifford+t");
    CHECK(j["level"] == 3);
    CHECK(j["options"]["optimize_for"] == "2q");
    CHECK(j["options"]["emit"] == "qasm2");
    CHECK(j["t_count"] == 7);                       // the output's counts at the top level
    CHECK(j["input_resources"]["qubits"] == 8);     // the input's counts beside them
    REQUIRE(j["passes"].size() == 3);
    CHECK(j["passes"][0]["name"] == "lower-controls");
    CHECK(j["passes"][0]["ops_after"] == 20);
    CHECK(j["passes"][0]["stats"]["mcx-lowered"] == 1);
    CHECK(j["passes"][0]["checked_by"].is_null());
    CHECK(j["passes"][1]["notes"][0] == "rz(pi/8) berth[0]: 52 T");
    REQUIRE(j["constructions"].size() == 1);
    CHECK(j["constructions"][0]["pass"] == "lower-controls");
    CHECK(j["constructions"][0]["method"] == "clean-ladder");
    CHECK(j["constructions"][0]["loc"]["line"] == 7);
    CHECK(j["constructions"][0]["t_count"] == 14);
    CHECK(j["approximation_error_bound"].get<double>() == doctest::Approx(3e-10));
}

TEST_CASE("no approximation means an error bound of exactly 0") {
    ir::Circuit c = testing::textbook_toffoli();
    lowering::CompileReportInput in;
    in.source = &c;
    in.output = &c;
    lowering::Json j = lowering::compile_report(in);
    CHECK(j["approximation_error_bound"].get<double>() == 0.0);
    CHECK(j["target"].is_null());
    CHECK(j["passes"].empty());
}

TEST_CASE("count table values start in one column") {
    ir::Circuit c = testing::crane_check();
    std::string t = lowering::resource_table(ir::count_resources(c));
    std::istringstream in(t);
    size_t value_col = std::string::npos;
    int rows = 0;
    for (std::string line; std::getline(in, line);) {
        if (line == "gates by name") continue;
        size_t gap = line.find("  ", line.find_first_not_of(' '));
        REQUIRE(gap != std::string::npos);
        size_t col = line.find_first_not_of(' ', gap);
        if (value_col == std::string::npos) value_col = col;
        CHECK(col == value_col);
        ++rows;
    }
    CHECK(rows >= 10 + 8);  // the fixed rows and the 8+ gate names of the crane check
    CHECK(t.find("multi-controlled X") != std::string::npos);
}
