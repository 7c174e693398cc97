// OpenQASM 2.0 import: ops as the high-level IR, exact angles, header gates against the header's own
// bodies (arXiv:1707.03429), broadcasting, includes, limits and located errors.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <random>

#include <fmt/format.h>

#include "frontend/load.h"
#include "support/dense_unitary.h"
#include "support/qelib1_reference.h"

using namespace whittle;
using ir::Angle;
using ir::Lit;
using ir::OpKind;

namespace {

const char* kHead = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

ir::Circuit load(const std::string& text, const frontend::LoadOptions& opts = {}) {
    frontend::SourceManager sm;
    ir::Circuit c = frontend::load_text(text, "t.qasm", frontend::InputFormat::Qasm2, sm, opts);
    ir::verify(c);
    return c;
}

ir::Circuit load_body(const std::string& body) { return load(std::string(kHead) + body); }

/// "line:col: message" of the error the text raises, or "no error".
std::string error_of(const std::string& text, const frontend::LoadOptions& opts = {}) {
    frontend::SourceManager sm;
    try {
        frontend::load_text(text, "t.qasm", frontend::InputFormat::Qasm2, sm, opts);
    } catch (const UserError& e) {
        return fmt::format("{}:{}: {}", e.loc().line, e.loc().column, e.what());
    }
    return "no error";
}

}  // namespace

TEST_CASE("registers keep their names and sizes") {
    ir::Circuit c = load_body("qreg q[5];\nqreg anc[2];\ncreg m[3];\n");
    REQUIRE(c.registers.size() == 2);
    CHECK(c.registers[0].name == "q");
    CHECK(c.registers[0].size == 5);
    CHECK(c.registers[0].role == ir::Role::Data);
    CHECK(c.registers[1].name == "anc");
    CHECK(c.registers[1].first == 5);
    CHECK(c.num_qubits() == 7);
    REQUIRE(c.cregs.size() == 1);
    CHECK(c.cregs[0].name == "m");
    CHECK(c.num_cbits == 3);
    REQUIRE(c.files.size() == 1);
    CHECK(c.files[0] == "t.qasm");
}

TEST_CASE("controlled gates become the high-level ops they are") {
    ir::Circuit c = load_body(
        "qreg q[3];\n"
        "ccx q[0],q[1],q[2];\n"  // 0
        "cx q[2],q[0];\n"        // 1
        "cz q[0],q[1];\n"        // 2
        "t q[1];\n"              // 3
        "cu1(pi/8) q[1],q[2];\n" // 4
        "crz(pi/4) q[0],q[1];\n" // 5
        "ch q[1],q[0];\n"        // 6
        "cy q[0],q[2];\n"        // 7
        "cswap q[0],q[1],q[2];\n"// 8
        "sdg q[2];\n"            // 9
        "id q[0];\n"             // (nothing)
        "sx q[0];\n"             // 10
        "sxdg q[1];\n"           // 11
        "u3(pi/2,0,pi) q[2];\n"  // 12
        "u2(0,pi) q[1];\n"       // 13
        "rxx(pi/2) q[0],q[2];\n" // 14
        "rzz(pi/4) q[0],q[1];\n" // 15
        "swap q[0],q[2];\n"      // 16
        "p(pi/3) q[0];\n"        // 17
        "cp(pi/3) q[0],q[1];\n"  // 18
        "ry(pi/5) q[1];\n");     // 19
    REQUIRE(c.ops.size() == 20);
    const auto& o = c.ops;
    CHECK(o[0].kind == OpKind::X);
    CHECK(o[0].target == 2);
    CHECK(o[0].controls == ir::LitVec{Lit::pos(0), Lit::pos(1)});
    CHECK(o[1].kind == OpKind::X);
    CHECK(o[1].target == 0);
    CHECK(o[1].controls == ir::LitVec{Lit::pos(2)});
    CHECK(o[2].kind == OpKind::Phase);
    CHECK(o[2].angle == Angle::pi_times(1));
    CHECK(o[2].controls == ir::LitVec{Lit::pos(0), Lit::pos(1)});
    CHECK(o[3].kind == OpKind::Phase);
    CHECK(o[3].angle == Angle::pi_times(1, 4));
    CHECK(o[3].controls == ir::LitVec{Lit::pos(1)});
    CHECK(o[4].kind == OpKind::Phase);
    CHECK(o[4].angle == Angle::pi_times(1, 8));
    CHECK(o[4].controls.size() == 2);
    CHECK(o[5].kind == OpKind::RZ);
    CHECK(o[5].target == 1);
    CHECK(o[5].controls == ir::LitVec{Lit::pos(0)});
    CHECK(o[6].kind == OpKind::H);
    CHECK(o[6].controls == ir::LitVec{Lit::pos(1)});
    CHECK(o[7].kind == OpKind::Y);
    CHECK(o[7].controls == ir::LitVec{Lit::pos(0)});
    CHECK(o[8].kind == OpKind::Swap);
    CHECK(o[8].target == 1);
    CHECK(o[8].target2 == 2);
    CHECK(o[8].controls == ir::LitVec{Lit::pos(0)});
    CHECK(o[9].kind == OpKind::Phase);
    CHECK(o[9].angle == Angle::pi_times(-1, 2));
    CHECK(o[10].kind == OpKind::SX);
    CHECK(o[11].kind == OpKind::SXdg);
    CHECK(o[12].kind == OpKind::U);
    CHECK(o[12].angle == Angle::pi_times(1, 2));
    CHECK(o[12].lambda() == Angle::pi_times(1));
    CHECK(o[13].kind == OpKind::U);
    CHECK(o[13].angle == Angle::pi_times(1, 2));
    CHECK(o[14].kind == OpKind::XX);
    CHECK(o[14].target2 == 2);
    CHECK(o[15].kind == OpKind::Parity);
    CHECK(o[15].angle == Angle::pi_times(1, 4));
    CHECK(c.global_phase == Angle::pi_times(-1, 8));  // rzz(t) = e^{-it/2} e^{it(a xor b)}
    CHECK(o[16].kind == OpKind::Swap);
    CHECK(o[16].controls.empty());
    CHECK(o[17].kind == OpKind::Phase);
    CHECK(o[18].kind == OpKind::Phase);
    CHECK(o[18].controls.size() == 2);
    CHECK(o[19].kind == OpKind::RY);
    for (const ir::Op& op : o) CHECK(op.loc.known());
    CHECK(o[0].loc.line == 4);
    CHECK(o[0].loc.column == 1);
}

TEST_CASE("angles stay exact when the expression is a rational multiple of pi") {
    ir::Circuit c = load_body(
        "qreg q[1];\n"
        "u1(pi/4) q[0];\n"
        "u1(-pi/8) q[0];\n"
        "u1(3*pi/4) q[0];\n"
        "u1(pi/2+pi/4) q[0];\n"
        "u1(0.5*pi) q[0];\n"
        "u1(-(pi)/-(3)) q[0];\n"
        "u1(pi*2^-2) q[0];\n"
        "u1(pi/pi*pi) q[0];\n"
        "u1(pi*pi) q[0];\n"
        "u1(sin(pi/6)) q[0];\n"
        "u1(0.25) q[0];\n"
        "u1(1e-1*pi) q[0];\n");
    REQUIRE(c.ops.size() == 12);
    CHECK(c.ops[0].angle == Angle::pi_times(1, 4));
    CHECK(c.ops[1].angle == Angle::pi_times(-1, 8));
    CHECK(c.ops[1].angle.is_exact());
    CHECK(c.ops[2].angle == Angle::pi_times(3, 4));
    CHECK(c.ops[3].angle == Angle::pi_times(3, 4));
    CHECK(c.ops[3].angle.is_exact());
    CHECK(c.ops[4].angle == Angle::pi_times(1, 2));
    CHECK(c.ops[4].angle.is_exact());
    CHECK(c.ops[5].angle == Angle::pi_times(1, 3));
    CHECK(c.ops[5].angle.is_exact());
    CHECK(c.ops[6].angle == Angle::pi_times(1, 4));
    CHECK(c.ops[6].angle.is_exact());
    CHECK(c.ops[7].angle == Angle::pi_times(1));
    CHECK(c.ops[7].angle.is_exact());
    CHECK_FALSE(c.ops[8].angle.is_exact());
    CHECK(c.ops[8].angle.to_radians() == doctest::Approx(std::fmod(M_PI * M_PI, 2 * M_PI)));
    CHECK_FALSE(c.ops[9].angle.is_exact());
    CHECK(c.ops[9].angle.to_radians() == doctest::Approx(0.5));
    CHECK(c.ops[10].angle.to_radians() == doctest::Approx(0.25));
    CHECK(c.ops[11].angle == Angle::pi_times(1, 10));
    CHECK(c.ops[11].angle.is_exact());
}

TEST_CASE("user gates expand inline with their parameters bound exactly") {
    ir::Circuit c = load_body(
        "gate berth(theta, k) a, b { crz(theta/2) a, b; u1(-theta*k) b; barrier a, b; }\n"
        "gate crane a, b, c { berth(3*pi/4, 2) c, a; ccx a, b, c; }\n"
        "qreg y[3];\n"
        "crane y[0], y[1], y[2];\n");
    REQUIRE(c.ops.size() == 4);
    CHECK(c.ops[0].kind == OpKind::RZ);
    CHECK(c.ops[0].angle == Angle::pi_times(3, 8));
    CHECK(c.ops[0].target == 0);
    CHECK(c.ops[0].controls == ir::LitVec{Lit::pos(2)});
    CHECK(c.ops[1].kind == OpKind::Phase);
    CHECK(c.ops[1].angle == Angle::pi_times(-3, 2));
    CHECK(c.ops[2].kind == OpKind::Barrier);
    CHECK(c.ops[3].kind == OpKind::X);
    CHECK(uint32_t(c.ops[3].loc.line) == 6);  // located at the top-level call
}

TEST_CASE("controlled rotations keep their sign when the angle is reduced mod 2 pi") {
    // crz(-pi/2) = controlled Rz(-pi/2) = controlled (-Rz(3pi/2)): a Z on the control makes up the sign.
    ir::Circuit c = load_body("qreg q[2];\ncrz(-pi/2) q[0],q[1];\n");
    ir::Circuit ref = load_body(std::string("qreg q[2];\n") + "u1(-pi/4) q[1];\ncx q[0],q[1];\nu1(pi/4) q[1];\ncx q[0],q[1];\n");
    CHECK(test::distance_up_to_phase(test::dense_unitary(c), test::dense_unitary(ref)) < 1e-9);
}

TEST_CASE("every header gate equals the header's own body built from U and CX") {
    // Reference bodies: Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429 (from memory, see
    // tests/support/qelib1_reference.h). Parameters include angles past 2*pi and 4*pi and negative
    // ones, where a controlled rotation's sign depends on the unreduced angle.
    struct Case {
        const char* gate;
        int params;
        int qubits;
    };
    const Case cases[] = {{"u3", 3, 1}, {"u2", 2, 1}, {"u1", 1, 1}, {"cx", 0, 2},  {"id", 0, 1},   {"u", 3, 1},
                          {"p", 1, 1},  {"x", 0, 1},  {"y", 0, 1},  {"z", 0, 1},   {"h", 0, 1},    {"s", 0, 1},
                          {"sdg", 0, 1}, {"t", 0, 1}, {"tdg", 0, 1}, {"sx", 0, 1}, {"sxdg", 0, 1}, {"rx", 1, 1},
                          {"ry", 1, 1}, {"rz", 1, 1}, {"cz", 0, 2},  {"cy", 0, 2}, {"swap", 0, 2}, {"ch", 0, 2},
                          {"ccx", 0, 3}, {"cswap", 0, 3}, {"crz", 1, 2}, {"cu1", 1, 2}, {"cp", 1, 2}, {"cu3", 3, 2},
                          {"crx", 1, 2}, {"cry", 1, 2}, {"csx", 0, 2}, {"cu", 4, 2}, {"rxx", 1, 2}, {"rzz", 1, 2}};
    const std::vector<std::vector<std::string>> param_sets = {
        {"0.3", "-1.1", "2.5", "0.7"},
        {"3*pi/2", "-pi/2", "5*pi/4", "pi"},
        {"-7*pi/3", "9*pi/2", "-0.4", "13.1"},
        {"5*pi", "-3*pi", "2*pi", "-2*pi"},
        {"-pi/2", "7*pi/2", "-5*pi/4", "3*pi"},  // first angle in an odd turn (exact)
        {"-0.5", "9.5", "3*pi", "-pi/3"},        // first angle in an odd turn (inexact)
        {"9.5", "-0.5", "-pi/3", "0"},
    };
    int checked = 0;
    for (const Case& cs : cases) {
        for (const auto& ps : param_sets) {
            std::string args, qubits;
            for (int i = 0; i < cs.params; ++i) args += (i ? "," : "") + ps[size_t(i)];
            // Wires in a mixed order so control/target roles are not all "low wire first".
            const int order[3] = {2, 0, 1};
            for (int i = 0; i < cs.qubits; ++i) qubits += fmt::format("{}q[{}]", i ? "," : "", order[i]);
            std::string call = fmt::format("{}{} {};\n", cs.gate, cs.params ? "(" + args + ")" : "", qubits);
            std::string prog = std::string(kHead) + test::kQelib1Reference + "qreg q[3];\n";
            ir::Circuit mine = load(prog + call);
            ir::Circuit ref = load(prog + "ref_" + call);
            double d = test::distance_up_to_phase(test::dense_unitary(mine), test::dense_unitary(ref));
            INFO(call);
            CHECK(d < 1e-9);
            ++checked;
        }
    }
    CHECK(checked == 36 * 7);
}

TEST_CASE("c3x and c4x are multi-controlled X") {
    ir::Circuit c = load_body("qreg q[5];\nc3x q[0],q[1],q[2],q[3];\nc4x q[4],q[3],q[2],q[1],q[0];\n");
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[0].controls.size() == 3);
    CHECK(c.ops[0].target == 3);
    CHECK(c.ops[1].controls.size() == 4);
    CHECK(c.ops[1].target == 0);
}

TEST_CASE("register-wide broadcasting") {
    ir::Circuit c = load_body("qreg a[3];\nqreg b[3];\nh a;\ncx a,b;\ncx a[1],b;\n"
                              "creg m[3];\nmeasure b -> m;\nreset a;\nbarrier a, b[2];\n");
    // h a (3) + cx a,b (3) + cx a[1],b (3) + measure b (3) + reset a (3) + barrier (1)
    REQUIRE(c.ops.size() == 16);
    CHECK(c.ops[0].kind == OpKind::H);
    CHECK(c.ops[2].target == 2);
    CHECK(c.ops[4].target == 4);
    CHECK(c.ops[4].controls == ir::LitVec{Lit::pos(1)});
    CHECK(c.ops[6].controls == ir::LitVec{Lit::pos(1)});
    CHECK(c.ops[6].target == 3);
    CHECK(c.ops[9].kind == OpKind::Measure);
    CHECK(c.ops[9].target == 3);
    CHECK(c.ops[9].cbit() == 0);
    CHECK(c.ops[11].cbit() == 2);
    CHECK(c.ops[12].kind == OpKind::Reset);
    CHECK(c.ops[15].kind == OpKind::Barrier);
    CHECK(c.ops[15].controls.size() == 4);
}

TEST_CASE("if conditions every op the statement produces") {
    ir::Circuit c = load_body("qreg q[2];\ncreg c[2];\ncreg flag[1];\nmeasure q[0] -> flag[0];\n"
                              "if(flag==1) cx q[0],q[1];\nif(c==2) h q;\nif(c==3) measure q[1] -> c[1];\n");
    REQUIRE(c.ops.size() == 5);
    CHECK_FALSE(c.ops[0].is_conditioned());
    CHECK(c.ops[1].cond_reg() == 1);
    CHECK(c.ops[1].cond_value() == 1);
    CHECK(c.ops[2].cond_reg() == 0);
    CHECK(c.ops[2].cond_value() == 2);
    CHECK(c.ops[3].cond_value() == 2);
    CHECK(c.ops[4].kind == OpKind::Measure);
    CHECK(c.ops[4].cond_value() == 3);
}

TEST_CASE("comments, CRLF line ends, a byte order mark and the builtins without the header") {
    ir::Circuit c = load("\xEF\xBB\xBFOPENQASM 2.0;\r\n// a comment\r\nqreg q[2]; /* block\r\n comment */\r\n"
                         "U(pi,0,pi) q[0];\r\nCX q[0],q[1];\r\n");
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[0].kind == OpKind::U);
    CHECK(c.ops[1].kind == OpKind::X);
    CHECK(uint32_t(c.ops[1].loc.line) == 6);
}

TEST_CASE("an included file is read from the including file's folder") {
    namespace fs = std::filesystem;
    fs::path dir = fs::temp_directory_path() / fmt::format("whittle_qasm_inc_{}", ::getpid());
    fs::create_directories(dir);
    std::ofstream(dir / "yard.inc") << "gate lift a, b { cx a, b; h b; }\n";
    std::ofstream(dir / "main.qasm") << kHead << "include \"yard.inc\";\nqreg q[2];\nlift q[1], q[0];\n";
    std::ofstream(dir / "loop.inc") << "include \"loop.inc\";\n";
    std::ofstream(dir / "cycle.qasm") << kHead << "include \"loop.inc\";\n";
    frontend::SourceManager sm;
    ir::Circuit c = frontend::load_file((dir / "main.qasm").string(), sm);
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[0].target == 0);
    CHECK(c.files.size() == 2);
    frontend::SourceManager sm2;
    CHECK_THROWS_WITH_AS(frontend::load_file((dir / "cycle.qasm").string(), sm2), doctest::Contains("include cycle"),
                         UserError);
    fs::remove_all(dir);
}

TEST_CASE("more source files than a location can name is a located error, not a wrapped file index") {
    // SourceLoc keeps a 16-bit file index (ir/source_loc.h); the main file is index 0.
    namespace fs = std::filesystem;
    fs::path dir = fs::temp_directory_path() / fmt::format("whittle_qasm_many_inc_{}", ::getpid());
    fs::create_directories(dir);
    std::ofstream(dir / "empty.inc") << "// nothing\n";
    {
        std::ofstream main(dir / "main.qasm");
        main << "OPENQASM 2.0;\n";
        for (uint32_t i = 0; i < ir::kMaxSourceFiles; ++i) main << "include \"empty.inc\";\n";
    }
    frontend::SourceManager sm;
    try {
        frontend::load_file((dir / "main.qasm").string(), sm);
        FAIL("no error");
    } catch (const UserError& e) {
        CHECK(std::string(e.what()).find("more than 65536 source files") != std::string::npos);
        CHECK(uint32_t(e.loc().line) == 1 + ir::kMaxSourceFiles);  // the include that would be file 65536
    }
    fs::remove_all(dir);
}

TEST_CASE("bad inputs give located errors") {
    // Each case: the input, then "line:col: part of the message".
    const std::pair<std::string, std::string> cases[] = {
        {"qreg q[2];\n", "1:1: expected 'OPENQASM 2.0;'"},
        {"OPENQASM 3.0;\n", "1:10: only OpenQASM 2.0"},
        {std::string(kHead) + "qreg q[2];\nh q[2];\n", "4:5: index 2 is out of range for register 'q' of size 2"},
        {std::string(kHead) + "qreg q[2];\nfoo q[0];\n", "4:1: unknown gate 'foo'"},
        {"OPENQASM 2.0;\nqreg q[2];\nh q[0];\n", "3:1: unknown gate 'h': it is in the standard header"},
        {std::string(kHead) + "qreg q[2];\ncx q[0],q[0];\n", "4:9: qubit q[0] is used twice"},
        {std::string(kHead) + "qreg q[2];\nh q[0]\nx q[1];\n", "5:1: expected ';' after the gate"},
        {std::string(kHead) + "qreg q[2];\nrz(pi/0) q[0];\n", "4:6: division by zero"},
        {std::string(kHead) + "qreg q[2];\nrz(theta) q[0];\n", "4:4: unknown name 'theta'"},
        {std::string(kHead) + "qreg q[2];\nrz(pi,pi) q[0];\n", "4:1: gate 'rz' takes 1 parameter but 2 are given"},
        {std::string(kHead) + "qreg q[2];\ncx q[0];\n", "4:1: gate 'cx' acts on 2 qubits but 1 is given"},
        {std::string(kHead) + "qreg a[2];\nqreg b[3];\ncx a,b;\n", "5:6: registers 'a' (size 2) and 'b' (size 3)"},
        {std::string(kHead) + "opaque magic a;\nqreg q[1];\nmagic q[0];\n", "5:1: gate 'magic' is opaque"},
        {std::string(kHead) + "qreg q[1];\ncreg c[1];\nif(q==1) x q[0];\n", "5:4: 'q' is a quantum register"},
        {std::string(kHead) + "qreg q[1];\ncreg c[2];\nmeasure q -> c;\n", "5:14: register 'q' has 1 qubits but 'c' has 2"},
        {std::string(kHead) + "qreg q[1];\nqreg q[2];\n", "4:6: register 'q' is already declared"},
        {std::string(kHead) + "gate g a { h b; }\n", "3:14: 'b' is not a qubit argument of gate 'g'"},
        {std::string(kHead) + "gate h a { x a; }\n", "3:6: gate 'h' is already defined"},
        {std::string(kHead) + "qreg q[1];\nx q[0]; \x01\n", "4:9: unexpected byte 0x01"},
        {std::string(kHead) + "qreg q[0];\n", "3:8: register 'q' must have at least one element"},
        {std::string(kHead) + "qreg q[1];\nrz(ln(0)) q[0];\n", "4:4: ln of a number that is not positive"},
        {std::string(kHead) + "include \"nowhere.inc\";\n", "3:9: cannot find the included file"},
        {std::string(kHead) + "qreg q[1];\ncreg c[1];\nif(c==1) barrier q;\n", "5:10: 'barrier' cannot be conditioned"},
        {std::string(kHead) + "gate g a {\n h a;\n", "3:6: gate 'g' is not closed"},
        {std::string(kHead) + "qreg q[1];\nrz((pi q[0];\n", "4:8: expected ')' to close the '(' at 4:4"},
        {std::string(kHead) + "qreg q[1];\n/* never closed\n", "4:1: comment is not closed"},
        {std::string(kHead) + "qreg q[99999999999999999999];\n", "3:8: integer 99999999999999999999 is too large"},
        {std::string(kHead) + "qreg q[1];\nrz(2*1e309) q[0];\n", "4:6: number 1e309 is too large"},
        {std::string(kHead) + "qreg q[1];\nrz(exp(1000)) q[0];\n", "4:4: expression value is not a finite number"},
    };
    for (const auto& [text, expected] : cases) {
        std::string got = error_of(text);
        INFO("input:\n" << text);
        CHECK(got.find(expected) == 0);
        if (got.find(expected) != 0) MESSAGE("got: " << got);
    }
}

TEST_CASE("limits: nesting, op count, qubit count") {
    std::string deep = std::string(kHead) + "qreg q[1];\nrz(" + std::string(2000, '(') + "pi" + std::string(2000, ')') + ") q[0];\n";
    CHECK(error_of(deep).find("expression nested deeper than") != std::string::npos);
    std::string minus = std::string(kHead) + "qreg q[1];\nrz(" + std::string(5000, '-') + "pi) q[0];\n";
    CHECK(error_of(minus).find("expression nested deeper than") != std::string::npos);

    // Each gate calls the previous one twice: 2^40 ops if expanded, stopped by the op limit.
    std::string blowup = std::string(kHead) + "gate g0 a { x a; }\n";
    for (int i = 1; i <= 40; ++i) blowup += fmt::format("gate g{} a {{ g{} a; g{} a; }}\n", i, i - 1, i - 1);
    blowup += "qreg q[1];\ng40 q[0];\n";
    frontend::LoadOptions small;
    small.limits.max_ops = 10000;
    small.limits.max_recursion = 64;
    CHECK(error_of(blowup, small).find("expands to more than 10000 operations") != std::string::npos);
    frontend::LoadOptions shallow;
    shallow.limits.max_recursion = 8;
    CHECK(error_of(blowup, shallow).find("nested deeper than 8 levels") != std::string::npos);

    frontend::LoadOptions few;
    few.limits.max_qubits = 10;
    CHECK(error_of(std::string(kHead) + "qreg a[6];\nqreg b[6];\n", few).find("more than 10 qubits") != std::string::npos);
}

TEST_CASE("junk never crashes the importer") {
    // Random token soup and random bytes: either a circuit that passes ir::verify or a UserError.
    const char* pieces[] = {"OPENQASM 2.0;", "include \"qelib1.inc\";", "qreg q[3];", "creg c[2];", "h", "cx", "q",
                            "q[0]", "q[5]", ",", ";", "(", ")", "pi", "/", "-", "2", "->", "c", "c[1]", "measure",
                            "if(c==1)", "gate g(a) x { rz(a) x; }", "g(", "{", "}", "barrier", "u3(", "1e309", "^",
                            "\n", "\"", "opaque o a;", "o q[0];", "reset", "==", "ccx q[0],q[1],q[2];"};
    std::mt19937 rng(20250101);
    int errors = 0, ok = 0;
    for (int iter = 0; iter < 3000; ++iter) {
        std::string text = iter % 2 ? "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\ncreg c[2];\n" : "";
        int n = int(rng() % 30);
        for (int i = 0; i < n; ++i) {
            if (rng() % 10 == 0) text += char(rng() % 256);
            else text += std::string(pieces[rng() % std::size(pieces)]) + " ";
        }
        frontend::SourceManager sm;
        try {
            ir::Circuit c = frontend::load_text(text, "junk.qasm", frontend::InputFormat::Qasm2, sm);
            ir::verify(c);
            ++ok;
        } catch (const UserError& e) {
            CHECK(e.loc().known());
            ++errors;
        }
    }
    CHECK(errors > 1000);
    CHECK(ok > 0);
}

// A 2.0 program may define gates that only later header versions have (the 2.0 header of
// arXiv:1707.03429 declares u3 u2 u1 cx id x y z h s sdg t tdg rx ry rz cz cy ch ccx crz cu1 cu3,
// and this table's swap and cswap; cu, sx, rxx came later): its definition is the gate. The program
// is written in the style of the 2.0 paper's examples; the check is against the same program with
// each call replaced by its body by hand (both read by whittle, compared by the dense simulator).
TEST_CASE("a program's own cu, sx and rxx shadow the later headers' gates") {
    const std::string defs =
        "// controlled-U(theta,phi,lambda): the 2.0 header has cu3 only, so the program defines its own\n"
        "gate cu(theta,phi,lambda) c,t {\n"
        "  u1((lambda+phi)/2) c;\n  u1((lambda-phi)/2) t;\n  cx c,t;\n"
        "  u3(-theta/2,0,-(phi+lambda)/2) t;\n  cx c,t;\n  u3(theta/2,phi,0) t;\n}\n"
        "gate sx a { sdg a; h a; sdg a; }\n"
        "gate rxx(theta) a,b { h a; h b; cx a,b; u1(theta) b; cx a,b; h a; h b; }\n";
    const std::string calls = "qreg q[2];\ncu(pi/2,pi/4,pi) q[0],q[1];\nsx q[1];\nrxx(pi/3) q[0],q[1];\n";
    const std::string inlined =
        "qreg q[2];\n"
        "u1((pi+pi/4)/2) q[0];\nu1((pi-pi/4)/2) q[1];\ncx q[0],q[1];\nu3(-(pi/2)/2,0,-(pi/4+pi)/2) q[1];\n"
        "cx q[0],q[1];\nu3((pi/2)/2,pi/4,0) q[1];\n"
        "sdg q[1];\nh q[1];\nsdg q[1];\n"
        "h q[0];\nh q[1];\ncx q[0],q[1];\nu1(pi/3) q[1];\ncx q[0],q[1];\nh q[0];\nh q[1];\n";
    ir::Circuit ref = load(std::string(kHead) + inlined);
    // After the include, and before it (the include must not clash with the program's cu).
    ir::Circuit after = load(std::string(kHead) + defs + calls);
    CHECK(test::distance_up_to_phase(test::dense_unitary(after), test::dense_unitary(ref)) < 1e-9);
    // A definition before the include (from the builtins only) is kept too: the call is one CX.
    ir::Circuit before = load("OPENQASM 2.0;\ngate cu(t) a,b { CX a,b; }\ninclude \"qelib1.inc\";\nqreg q[2];\ncu(0.5) q[0],q[1];\n");
    REQUIRE(before.ops.size() == 1);
    CHECK(before.ops[0].kind == OpKind::X);
    CHECK(before.ops[0].controls.size() == 1);
    // The program's sx is S^dag H S^dag = e^{-i pi/4} SX, so the call is the definition, not a clash.
    CHECK(error_of(std::string(kHead) + "gate sx a { sdg a; h a; sdg a; }\nqreg q[1];\nsx q[0];\n") == "no error");
}

TEST_CASE("a gate of the 2.0 header itself cannot be redefined") {
    CHECK(error_of(std::string(kHead) + "gate cz a,b { h b; cx a,b; h b; }\n") == "3:6: gate 'cz' is already defined");
    CHECK(error_of("OPENQASM 2.0;\ngate cu3(t,p,l) a,b { CX a,b; }\ninclude \"qelib1.inc\";\n") ==
          "3:9: qelib1.inc defines 'cu3', which is already defined at 2:6");
    CHECK(error_of(std::string(kHead) + "gate cu(t) a,b { cx a,b; }\ngate cu(t) a,b { cx a,b; }\n") ==
          "4:6: gate 'cu' is already defined");
}
