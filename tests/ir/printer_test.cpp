// The .wq printer: printed text re-parses to the identical IR (hand-written programs, every sample,
// and random circuits of every op kind), and printing is stable.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

#include "frontend/load.h"
#include "ir/printer.h"
#include "support/ir_equal.h"
#include "support/random_circuit.h"

using namespace whittle;

namespace {

ir::Circuit parse(const std::string& text, const std::string& name = "printed.wq") {
    frontend::SourceManager sm;
    try {
        return frontend::load_text(text, name, frontend::InputFormat::Wq, sm);
    } catch (const UserError& e) {
        FAIL_CHECK(frontend::format_error(e, sm) << "\n--- text ---\n" << text);
        throw;
    }
}

/// print -> parse gives the same IR, and printing that gives the same text.
void check_round_trip(const ir::Circuit& c) {
    std::string text = ir::print_wq(c);
    ir::Circuit back = parse(text);
    std::string diff = test::ir_difference(c, back);
    CHECK_MESSAGE(diff.empty(), diff << "\n--- printed ---\n" << text);
    CHECK(ir::print_wq(back) == text);
    CHECK_NOTHROW(ir::verify(back));
}

}  // namespace

TEST_CASE("hand-written programs print and re-parse to the same IR") {
    const char* programs[] = {
        "qubit a[3], flag\nh a[0]; x a[1]; s flag; t flag; ~t flag; ~s a[2]; z a[0]\n",
        "qubit a[4], b[4], flag\nancilla w[2]\nborrow d\n"
        "flag ^= a[0] & !a[1] & a[2]\nflag ^= (a[0] & a[1]) ^ b[0]\nb[1] ^= a[0] | !a[3]\n",
        "qubit a[3], b\nphase(pi) a[0] & a[1] & a[2]\nphase(pi/4) a[0] ^ a[1] ^ b\nphase(-pi/8) a[0] & !b\n"
        "phase(0.3) a[0] | a[1]\nphase(pi/3) a[2] ^ 0\n",
        "qubit a[2], b[2]\nwhen a[0] & !a[1] { h b[0]; rz(pi/8) b[1]; b[0] <-> b[1]; y b[0]; sx b[1]; ~sx b[0] }\n",
        "qubit a[3]\nancilla w\ncompute { w ^= a[0] & a[1] } then { phase(pi) w & a[2] }\n",
        "qubit q[2]\nmeasure q[0] as m\nif m { x q[1] }\nif !m { z q[1] }\nreset q[0]\nbarrier q\n",
        "qubit q[2]\nbit c[3]\nmeasure q[0] as c[2]\nif c == 5 { h q[1] }\n",
        "qubit q[2]\niswap q[0], q[1]\nxx(pi/2) q[1], q[0]\nr(pi/2, pi/4) q[0]\nu(0.1, 0.2, -pi/2) q[1]\n",
        "qubit q\nphase(pi/4) 1\nphase(1.25) q\n",
        "routine maj(x, y, z) { y ^= z; x ^= z; z ^= x & y }\nqubit a, b, c\nmaj(a, b, c); ~maj(a, b, c)\n",
        "",
    };
    for (const char* p : programs) {
        CAPTURE(p);
        check_round_trip(parse(p, "hand.wq"));
    }
}

TEST_CASE("the printed form is readable .wq") {
    ir::Circuit c = parse("qubit a[2], flag\nancilla w\nflag ^= a[0] & !a[1]\nt flag\nwhen w { h a[0] }\n"
                          "compute { w ^= a[0] } then { z w }\n");
    CHECK(ir::print_wq(c) ==
          "qubit a[2], flag\n"
          "ancilla w\n"
          "flag ^= a[0] & !a[1]\n"
          "t flag\n"
          "when w { h a[0] }\n"
          "@compute(1) w ^= a[0]\n"
          "z w\n"
          "@uncompute(1) w ^= a[0]\n");
}

TEST_CASE("pair tags group runs of ops into blocks") {
    ir::Circuit c = parse("qubit a[3]\nancilla w[2]\n"
                          "compute { w[0] ^= a[0] & a[1]; w[1] ^= w[0] & a[2] } then { z w[1] }\n");
    std::string text = ir::print_wq(c);
    CHECK(text.find("@compute(1) {\n    w[0] ^= a[0] & a[1]\n    w[1] ^= w[0] & a[2]\n}\n") != std::string::npos);
    check_round_trip(c);
}

TEST_CASE("every sample program round-trips through the printer") {
    namespace fs = std::filesystem;
    fs::path dir = fs::path(WHITTLE_SOURCE_DIR) / "samples";
    int n = 0;
    if (fs::is_directory(dir))
        for (const auto& entry : fs::directory_iterator(dir)) {
            if (entry.path().extension() != ".wq") continue;
            std::ifstream in(entry.path());
            std::stringstream ss;
            ss << in.rdbuf();
            CAPTURE(entry.path().string());
            frontend::SourceManager sm;
            ir::Circuit c = frontend::load_text(ss.str(), entry.path().string(), frontend::InputFormat::Wq, sm);
            check_round_trip(c);
            ++n;
        }
    MESSAGE(n << " samples");
}

TEST_CASE("200 random circuits round-trip exactly") {
    std::mt19937_64 rng(20240611);
    for (int i = 0; i < 200; ++i) {
        test::RandomCircuitOptions o;
        o.max_ops = 60;
        ir::Circuit c = test::random_circuit(rng, o);
        REQUIRE_NOTHROW(ir::verify(c));
        CAPTURE(i);
        check_round_trip(c);
    }
}

TEST_CASE("inexact angles keep every bit through the printed 17 digits") {
    std::mt19937_64 rng(7);
    ir::Circuit c;
    c.add_register("q", 1, ir::Role::Data, true);
    for (int i = 0; i < 300; ++i)
        c.ops.push_back(ir::Op::one(ir::OpKind::RZ, 0, ir::Angle::radians(std::uniform_real_distribution<double>(-20, 20)(rng))));
    ir::Circuit back = parse(ir::print_wq(c));
    REQUIRE(back.ops.size() == c.ops.size());
    for (size_t i = 0; i < c.ops.size(); ++i) CHECK(back.ops[i].angle.to_radians() == c.ops[i].angle.to_radians());
}

TEST_CASE("registers named like keywords, gates or pi round-trip from OpenQASM through .wq") {
    // OpenQASM 2.0 identifiers (Cross et al. 2017, arXiv:1707.03429) may be words that .wq reserves.
    const std::string qasm = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg when[2];\nqreg phase[1];\nqreg h[1];\nqreg pi[1];\nqreg repeat[1];\nqreg x[1];\n"
                             "creg then[1];\ncreg as[2];\n"
                             "h when[0];\ncx when[0],phase[0];\nccx when[1],h[0],pi[0];\nt pi[0];\nswap repeat[0],x[0];\n"
                             "cu1(pi/8) x[0],h[0];\nmeasure when[0] -> then[0];\nif(then==1) x pi[0];\n"
                             "measure h[0] -> as[1];\nif(as==2) h repeat[0];\n";
    frontend::SourceManager sm;
    const ir::Circuit c = frontend::load_text(qasm, "harbor_keywords.qasm", frontend::InputFormat::Qasm2, sm);
    const std::string text = ir::print_wq(c);
    CHECK(text.find("`when`[2]") != std::string::npos);
    CHECK(text.find("`pi`[0]") != std::string::npos);
    check_round_trip(c);
    // The quotes only lift the keyword meaning: a quoted name is the same name as a plain one.
    const ir::Circuit plain = parse("qubit `t`, u\nh `t`\nu ^= t\n");
    CHECK(plain.registers[0].name == "t");
    CHECK(plain.ops.size() == 2);
}

TEST_CASE("a quoted keyword is a name, an unquoted one keeps its meaning") {
    const ir::Circuit c = parse("qubit `when`[2], `phase`\nwhen `when`[0] { h `phase` }\nphase(pi) `when`[1] & `phase`\n");
    REQUIRE(c.registers.size() == 2);
    CHECK(c.registers[0].name == "when");
    CHECK(c.registers[1].name == "phase");
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[0].kind == ir::OpKind::H);
    CHECK(c.ops[0].controls.size() == 1);
    CHECK(c.ops[1].kind == ir::OpKind::Phase);
    check_round_trip(c);
}
