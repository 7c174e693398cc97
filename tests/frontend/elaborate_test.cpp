// Elaboration of .wq programs into the IR: every construct, its exact ops, and its errors.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>

#include "frontend/load.h"
#include "ir/circuit.h"
#include "ir/printer.h"

using namespace whittle;
using ir::Lit;
using ir::OpKind;

namespace {

ir::Circuit load(const std::string& text, frontend::LoadOptions opts = {}, const std::string& name = "e.wq") {
    frontend::SourceManager sm;
    return frontend::load_text(text, name, frontend::InputFormat::Wq, sm, opts);
}

std::string error_of(const std::string& text, frontend::LoadOptions opts = {}, const std::string& name = "e.wq") {
    frontend::SourceManager sm;
    try {
        frontend::load_text(text, name, frontend::InputFormat::Wq, sm, opts);
    } catch (const UserError& e) {
        return std::to_string(e.loc().line) + ":" + std::to_string(e.loc().column) + ": " + e.what();
    }
    return "";
}

std::string ops_text(const ir::Circuit& c) {
    std::string s;
    for (const ir::Op& op : c.ops) s += ir::print_op(c, op) + "\n";
    return s;
}

}  // namespace

TEST_CASE("declarations: roles, sizes from expressions, scalars") {
    ir::Circuit c = load("let n = 3\nqubit a[n + 1], flag\nancilla w[n - 1]\nborrow d\n");
    REQUIRE(c.registers.size() == 4);
    CHECK(c.registers[0].size == 4);
    CHECK(c.registers[1].scalar);
    CHECK(c.registers[2].role == ir::Role::Clean);
    CHECK(c.registers[2].size == 2);
    CHECK(c.registers[3].role == ir::Role::Dirty);
    CHECK(c.num_qubits() == 8);
    CHECK(c.qubits[5].role == ir::Role::Clean);
}

TEST_CASE("one-qubit gates and their inverses") {
    ir::Circuit c = load("qubit q\nz q; s q; t q; ~t q; ~s q; sx q; ~sx q; y q; ~rx(pi/3) q\n");
    REQUIRE(c.ops.size() == 9);
    CHECK(c.ops[0].kind == OpKind::Phase);
    CHECK(c.ops[0].angle == ir::Angle::pi_times(1));
    CHECK(c.ops[1].angle == ir::Angle::pi_times(1, 2));
    CHECK(c.ops[2].angle == ir::Angle::pi_times(1, 4));
    CHECK(c.ops[3].angle == ir::Angle::pi_times(-1, 4));
    CHECK(c.ops[4].angle == ir::Angle::pi_times(-1, 2));
    CHECK(c.ops[5].kind == OpKind::SX);
    CHECK(c.ops[6].kind == OpKind::SXdg);
    CHECK(c.ops[7].kind == OpKind::Y);
    CHECK(c.ops[8].kind == OpKind::RX);
    CHECK(c.ops[8].angle == ir::Angle::pi_times(-1, 3));
}

TEST_CASE("angles: exact multiples of pi stay exact, decimals are radians") {
    ir::Circuit c = load("let k = 3\nqubit q\nrz(pi/4 + pi/4) q\nrz(k*pi/8) q\nrz(0.25) q\nrz(pi*0.5) q\nrz(2*pi/3 - pi/3) q\n");
    CHECK(c.ops[0].angle.is_exact());
    CHECK(c.ops[0].angle == ir::Angle::pi_times(1, 2));
    CHECK(c.ops[1].angle == ir::Angle::pi_times(3, 8));
    CHECK_FALSE(c.ops[2].angle.is_exact());
    CHECK(c.ops[2].angle.to_radians() == doctest::Approx(0.25));
    CHECK_FALSE(c.ops[3].angle.is_exact());
    CHECK(c.ops[4].angle == ir::Angle::pi_times(1, 3));
    CHECK(c.ops[4].angle.is_exact());
}

TEST_CASE("angle functions: exact at the textbook values, the C library's values elsewhere") {
    // Exact values: the unit-circle table (sin pi/6 = 1/2, cos pi/3 = 1/2, tan pi/4 = 1), practice.
    ir::Circuit c = load("qubit q\nry(2*asin(1/2)) q\nry(acos(-1/2)) q\nrz(atan(1)) q\nrz(asin(1)) q\n"
                         "rz(acos(1)) q\nrz(pi*sqrt(9/4)) q\nrz(pi*exp(0) + log(1)) q\n");
    CHECK(c.ops[0].angle == ir::Angle::pi_times(1, 3));
    CHECK(c.ops[1].angle == ir::Angle::pi_times(2, 3));
    CHECK(c.ops[2].angle == ir::Angle::pi_times(1, 4));
    CHECK(c.ops[3].angle == ir::Angle::pi_times(1, 2));
    REQUIRE(c.ops.size() == 7);
    CHECK(c.ops[4].angle == ir::Angle());
    CHECK(c.ops[5].angle == ir::Angle::pi_times(3, 2));
    CHECK(c.ops[6].angle == ir::Angle::pi_times(1, 1));
    for (size_t i = 0; i < c.ops.size(); ++i) CHECK(c.ops[i].angle.is_exact());
    // Amplitude loading: ry(2 asin(sqrt(p))) puts amplitude sqrt(p) on |1>; values from the C library.
    ir::Circuit d = load("qubit q\nry(2*asin(sqrt(0.3))) q\nrz(atan(2)) q\nrz(log(2)) q\nrz(exp(1)) q\nrz(acos(0.1)) q\n");
    CHECK_FALSE(d.ops[0].angle.is_exact());
    CHECK(d.ops[0].angle.to_radians() == doctest::Approx(2 * std::asin(std::sqrt(0.3))));
    CHECK(d.ops[1].angle.to_radians() == doctest::Approx(std::atan(2.0)));
    CHECK(d.ops[2].angle.to_radians() == doctest::Approx(std::log(2.0)));
    CHECK(d.ops[3].angle.to_radians() == doctest::Approx(std::exp(1.0)));
    CHECK(d.ops[4].angle.to_radians() == doctest::Approx(std::acos(0.1)));
    CHECK(error_of("qubit q\nrz(asin(2)) q\n") == "2:4: asin takes a number in [-1, 1], found 2");
    CHECK(error_of("qubit q\nrz(sqrt(-1)) q\n") == "2:4: sqrt of a negative number (-1)");
    CHECK(error_of("qubit q\nrz(log(0)) q\n") == "2:4: log of a number that is not positive (0)");
    CHECK(error_of("qubit q\nrz(cos(0)) q\n").find("unknown function 'cos'") != std::string::npos);
}

TEST_CASE("when: controls accumulate through nesting with their polarity") {
    ir::Circuit c = load("qubit a, b, c, t, u\nwhen a { when !b { h t; x t; t ^= c; t <-> u; z t; phase(pi/2) c & !u } }\n");
    CHECK(ops_text(c) ==
          "when a & !b { h t }\n"
          "t ^= a & !b\n"
          "t ^= a & !b & c\n"
          "when a & !b { t <-> u }\n"
          "phase(pi) a & !b & t\n"
          "phase(pi/2) a & !b & c & !u\n");
}

TEST_CASE("when needs a conjunction, and its controls cannot be targets") {
    CHECK(error_of("qubit a, b, t\nwhen a | b { x t }\n").find("2:8: the condition of 'when' must be a conjunction") == 0);
    CHECK(error_of("qubit a, t\nwhen a { x a }\n") ==
          "2:10: 'a' is a control of the enclosing 'when' and cannot also be a target");
    CHECK(error_of("qubit a, t\nwhen a { measure t as m }\n") ==
          "2:10: 'measure' cannot be quantum-controlled: it is inside 'when'");
}

TEST_CASE("when around a parity phase expands exactly") {
    ir::Circuit c = load("qubit a, b, k\nwhen k { phase(pi/2) a ^ b }\n");
    // k(a ^ b) = ka + kb - 2kab
    CHECK(ops_text(c) == "phase(pi) a & b & k\nphase(pi/2) a & k\nphase(pi/2) b & k\n");
}

TEST_CASE("for loops include both bounds; repeat runs k times; empty ranges run zero times") {
    ir::Circuit c = load("qubit a[4], b[4], f\nfor i in 0..3 { b[i] ^= a[i] }\nrepeat 3 { t f }\nfor i in 2..1 { x f }\n");
    CHECK(c.ops.size() == 7);
    CHECK(c.ops[3].target == 7);
}

TEST_CASE("routines: qubit, register, int and angle parameters; calls and inverse calls") {
    ir::Circuit c = load(R"(
routine ladder(r[], int k, angle th) {
    for i in 0..size(r)-2 { r[i+1] ^= r[i] }
    rz(th * k) r[0]
}
routine maj(x, y, z) { y ^= z; x ^= z; z ^= x & y }
qubit a[3], p, q, s
ladder(a, 2, pi/8)
maj(p, q, s)
~maj(p, q, s)
)");
    CHECK(ops_text(c) ==
          "a[1] ^= a[0]\na[2] ^= a[1]\nrz(pi/4) a[0]\n"
          "q ^= s\np ^= s\ns ^= p & q\n"
          "s ^= p & q\np ^= s\nq ^= s\n");
}

TEST_CASE("register slices r[i..j] as register arguments: both bounds included, nested slices, located errors") {
    ir::Circuit c = load(R"(
routine ladder(r[]) { for i in 0..size(r)-2 { r[i+1] ^= r[i] } }
routine halves(r[]) { ladder(r[0..1]); ladder(r[size(r)-2..size(r)-1]) }
qubit a[5]
let k = 1
ladder(a[k..k+2])
halves(a[1..4])
ladder(a[4..4])
)");
    CHECK(ops_text(c) == "a[2] ^= a[1]\na[3] ^= a[2]\na[2] ^= a[1]\na[4] ^= a[3]\n");
    CHECK(error_of("routine f(r[]) { x r[0] }\nqubit a[4]\nf(a[1..4])\n") ==
          "3:8: slice bound 4 is out of range for 'a' (wires 0..3)");
    CHECK(error_of("routine f(r[]) { x r[0] }\nqubit a[4]\nf(a[0-1..2])\n") ==
          "3:6: slice bound -1 is out of range for 'a' (wires 0..3)");
    CHECK(error_of("routine f(r[]) { x r[0] }\nqubit a[4]\nf(a[3..1])\n") ==
          "3:3: slice a[3..1] is reversed: the first index must not exceed the last");
    CHECK(error_of("routine f(r[], s[]) { x r[0] }\nqubit a[4]\nf(a[0..2], a[2..3])\n").find("'a[2]' is passed twice to 'f'") !=
          std::string::npos);
    CHECK(error_of("qubit a[4]\nx a[0..1]\n") ==
          "2:3: a slice a[i..j] is a register argument of a routine call; here a wire or a number is expected");
    CHECK(error_of("routine f(q) { x q }\nqubit a[4]\nf(a[0..1])\n").find("a slice a[i..j] is a register argument") !=
          std::string::npos);
    CHECK(error_of("routine f(r[]) { x r[0] }\nqubit s\nf(s[0..0])\n") ==
          "3:3: 's' is not a register of wires, so it has no slice s[i..j]");
    CHECK(error_of("qubit a[0..3]\n") == "1:7: a declaration takes a size, name[n], not a slice name[i..j]");
}

TEST_CASE("when around a call controls every op of the routine") {
    ir::Circuit c = load("routine f(x, y) { h x; y ^= x }\nqubit k, a, b\nwhen !k { f(a, b) }\n");
    CHECK(ops_text(c) == "when !k { h a }\nb ^= !k & a\n");
}

TEST_CASE("routine locals: borrow wires are fresh per call; an ancilla is reused once its call has returned") {
    ir::Circuit c = load("routine f(x) { ancilla w; borrow d[2]; w ^= x; d[1] ^= w; w ^= x }\nqubit a\nf(a); f(a)\n");
    // a, f's w and d of the first call, d of the second call (w comes back at |0> and is taken again)
    REQUIRE(c.registers.size() == 4);
    CHECK(c.registers[1].role == ir::Role::Clean);
    CHECK(c.registers[2].role == ir::Role::Dirty);
    CHECK(c.registers[2].size == 2);
    CHECK(c.registers[3].role == ir::Role::Dirty);
    CHECK(c.num_qubits() == 6);
    CHECK(c.ops[0].target == c.ops[3].target);  // both calls compute into the same work wire
}

TEST_CASE("ancilla reuse: nested calls get distinct wires, shapes must match, top-level ancillas are never pooled") {
    // g's ancilla is live while h runs inside it, so h's must differ; after g returns both are free.
    ir::Circuit c = load("routine inner(x) { ancilla u; u ^= x; u ^= x }\n"
                         "routine g(x) { ancilla v; v ^= x; inner(x); v ^= x }\n"
                         "routine k(x) { ancilla r[2]; r[0] ^= x; r[0] ^= x }\n"
                         "qubit a\nancilla top\ng(a); g(a); inner(a); k(a); k(a)\n");
    // a, top, g's v, inner's u, k's r[2]: the second g, the lone inner and the second k take returned wires
    CHECK(c.registers.size() == 5);
    CHECK(c.num_qubits() == 6);
    CHECK(c.ops[0].target != c.ops[1].target);  // v and u, live together
}

TEST_CASE("compute/then: A, B, inverse(A), both copies of A tagged with one fresh pair") {
    ir::Circuit c = load("qubit a, b, k\nancilla w\ncompute { w ^= a & b; s w } then { phase(pi) w & k }\n"
                         "compute { w ^= a } then { z w }\n");
    REQUIRE(c.ops.size() == 8);
    CHECK(ops_text(c) ==
          "@compute(1) w ^= a & b\n@compute(1) s w\nphase(pi) w & k\n@uncompute(1) ~s w\n@uncompute(1) w ^= a & b\n"
          "@compute(2) w ^= a\nz w\n@uncompute(2) w ^= a\n");
}

TEST_CASE("inverse calls negate the global phase they add") {
    ir::Circuit c = load("routine g(x) { phase(pi/4) 1; h x }\nqubit q\n~g(q)\n");
    CHECK(c.global_phase == ir::Angle::pi_times(-1, 4));
}

TEST_CASE("measure and if: scalar bits, conditions, negated conditions, bit registers") {
    ir::Circuit c = load("qubit q[2]\nbit c[2]\nmeasure q[0] as m\nmeasure q[1] as c[1]\nif m { x q[1] }\nif !m { h q[0] }\n"
                         "if c == 2 { z q[0] }\n");
    REQUIRE(c.cregs.size() == 2);
    CHECK(c.cregs[1].name == "m");
    CHECK(c.ops[0].cbit() == 2);
    CHECK(c.ops[1].cbit() == 1);
    CHECK(c.ops[2].cond_reg() == 1);
    CHECK(c.ops[2].cond_value() == 1);
    CHECK(c.ops[3].cond_value() == 0);
    CHECK(c.ops[4].cond_reg() == 0);
    CHECK(c.ops[4].cond_value() == 2);
}

TEST_CASE("use: the including folder, then -I folders, then the standard library; cycles refused") {
    namespace fs = std::filesystem;
    fs::path dir = fs::temp_directory_path() / "whittle_use_test";
    fs::create_directories(dir / "inc");
    std::ofstream(dir / "inc" / "arith.wq") << "routine inc2(x, y) { y ^= x }\n";
    std::ofstream(dir / "a.wq") << "use \"b.wq\"\n";
    std::ofstream(dir / "b.wq") << "use \"a.wq\"\n";
    frontend::LoadOptions opts;
    opts.include_dirs.push_back((dir / "inc").string());
    ir::Circuit c = load("use \"arith\"\nuse \"arith.wq\"\nqubit p, q\ninc2(p, q)\n", opts, (dir / "main.wq").string());
    CHECK(c.ops.size() == 1);
    CHECK(c.files.size() == 2);
    CHECK(uint32_t(c.ops[0].loc.file) == 1);
    CHECK(uint32_t(c.ops[0].loc.line) == 1);  // the op comes from the routine body in arith.wq
    frontend::SourceManager sm;
    try {
        frontend::load_file((dir / "a.wq").string(), sm);
        FAIL("an include cycle was accepted");
    } catch (const UserError& e) {
        CHECK(std::string(e.what()) == "include cycle: a.wq -> b.wq -> a.wq");
        CHECK(sm.name(e.loc().file).find("b.wq") != std::string::npos);
    }
    CHECK(error_of("use \"nowhere\"\n").find("cannot find 'nowhere' for 'use'") != std::string::npos);
    fs::remove_all(dir);
}

TEST_CASE("name, range and wire errors") {
    CHECK(error_of("qubit a[2]\nh a[2]\n") == "2:5: index 2 is out of range for 'a' (wires 0..1)");
    CHECK(error_of("qubit a[2]\nh b\n") == "2:3: unknown wire 'b'");
    CHECK(error_of("qubit a[2], t\nt ^= a\n") == "2:6: 'a' is a register of 2 wires: pick one with a[i]");
    CHECK(error_of("qubit a, t\nt ^= a & t\n") ==
          "2:10: the target 't' appears in its own expression: 't ^= f' needs f not to read t");
    CHECK(error_of("qubit a\na <-> a\n") == "2:7: 'a' is swapped with itself");
    CHECK(error_of("routine f(x, y) { y ^= x }\nqubit a\nf(a, a)\n").find("'a' is passed twice to 'f'") != std::string::npos);
    CHECK(error_of("qubit a\nqubit a\n") == "2:7: 'a' is already defined");
    CHECK(error_of("qubit q\nrz(pi/0) q\n") == "2:6: division by zero");
    CHECK(error_of("qubit q\nrz(q) q\n") == "2:4: expected a number, but 'q' is a wire or register");
    CHECK(error_of("qubit a[1.5]\n") == "1:9: a register size must be an integer, found an angle");
    CHECK(error_of("qubit q\nfoo(q)\n").find("unknown routine 'foo'") != std::string::npos);
}

TEST_CASE("limits have their own messages") {
    frontend::LoadOptions o;
    o.limits.max_loop_trips = 100;
    CHECK(error_of("qubit q\nfor i in 0..100 { x q }\n", o) == "2:1: the loop runs 101 times, over the limit of 100 iterations");
    CHECK(error_of("routine f(x) { f(x) }\nqubit q\nf(q)\n").find("routine calls nested deeper than the limit of 256") !=
          std::string::npos);
    o = {};
    o.limits.max_qubits = 10;
    CHECK(error_of("qubit a[8], b[3]\n", o) == "1:13: the program declares more than 10 qubits (the qubit limit)");
    o = {};
    o.limits.max_ops = 50;
    CHECK(error_of("qubit a[60]\nh a\n", o) == "2:1: the program elaborates to more than 50 ops (the op limit)");
    CHECK(error_of("qubit q\nrepeat 1000 { repeat 1000 { repeat 1000 { } } }\n", o).find("the op limit") != std::string::npos);
    o = {};
    o.limits.max_expansion_terms = 64;
    std::string big = "qubit a[10], b[10], t\nt ^= (a[0] | b[0])";
    for (int i = 1; i < 10; ++i) big += " & (a[" + std::to_string(i) + "] | b[" + std::to_string(i) + "])";
    CHECK(error_of(big + "\n", o).find("more than 64 terms (the expansion limit)") != std::string::npos);
}

TEST_CASE("source locations travel with ops and file names index Circuit::files") {
    ir::Circuit c = load("qubit a, b\n\n  b ^= a\n");
    REQUIRE(c.ops.size() == 1);
    CHECK(uint32_t(c.ops[0].loc.line) == 3);
    CHECK(uint32_t(c.ops[0].loc.column) == 3);
    CHECK(c.files.at(c.ops[0].loc.file) == "e.wq");
}
