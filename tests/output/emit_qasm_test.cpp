// OpenQASM 2.0 / 3.0 export: round trips import(emit_qasm2(c)) == c (dense unitaries, up to global
// phase) on hand-written and random circuits, the text of each construct, refusals, names.
#include <doctest/doctest.h>

#include <random>

#include <fmt/format.h>

#include "frontend/load.h"
#include "ir/statevector.h"
#include "output/emit_qasm.h"
#include "support/dense_unitary.h"

using namespace whittle;
using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

ir::Circuit reimport(const std::string& text) {
    frontend::SourceManager sm;
    ir::Circuit c = frontend::load_text(text, "out.qasm", frontend::InputFormat::Qasm2, sm);
    ir::verify(c);
    return c;
}

/// Registers a[2], flag (scalar), b[2]: wires 0 1 | 2 | 3 4.
ir::Circuit yard() {
    ir::Circuit c;
    c.add_register("a", 2, ir::Role::Data);
    c.add_register("flag", 1, ir::Role::Data, true);
    c.add_register("b", 2, ir::Role::Clean);
    return c;
}

/// Distance up to global phase between c and import(emit_qasm2(c)), by two engines: the project's
/// simulator (ir::circuit_unitary) and the independent dense builder of tests/support; the larger.
double round_trip_distance(const ir::Circuit& c) {
    std::string text = lowering::emit_qasm2(c);
    ir::Circuit back = reimport(text);
    INFO(text);
    REQUIRE(back.num_qubits() == c.num_qubits());
    double mine = test::distance_up_to_phase(test::dense_unitary(back), test::dense_unitary(c));
    double project = ir::distance_up_to_phase(ir::circuit_unitary(back), ir::circuit_unitary(c));
    return std::max(mine, project);
}

bool contains(const std::string& hay, const std::string& needle) { return hay.find(needle) != std::string::npos; }

size_t count(const std::string& hay, const std::string& needle) {
    size_t n = 0;
    for (size_t p = hay.find(needle); p != std::string::npos; p = hay.find(needle, p + 1)) ++n;
    return n;
}

Angle random_angle(std::mt19937& rng) {
    if (rng() % 2) return Angle::pi_times(int64_t(rng() % 32) - 16, int64_t(1) << (rng() % 4));
    return Angle::radians(std::uniform_real_distribution<double>(-7, 7)(rng));
}

/// A random op from the part of the IR that OpenQASM 2.0 can express, on n wires.
Op random_op(std::mt19937& rng, uint32_t n) {
    std::vector<uint32_t> wires(n);
    for (uint32_t i = 0; i < n; ++i) wires[i] = i;
    std::shuffle(wires.begin(), wires.end(), rng);
    auto lits = [&](size_t from, size_t k) {
        ir::LitVec v;
        for (size_t i = 0; i < k; ++i) v.push_back(Lit::make(wires[from + i], rng() % 3 != 0));
        return v;
    };
    const OpKind kinds[] = {OpKind::X,  OpKind::Phase, OpKind::Parity, OpKind::H,  OpKind::Y,     OpKind::SX,
                            OpKind::SXdg, OpKind::RX,  OpKind::RY,     OpKind::RZ, OpKind::U,     OpKind::Swap,
                            OpKind::ISwap, OpKind::XX, OpKind::R,      OpKind::Barrier};
    OpKind k = kinds[rng() % std::size(kinds)];
    switch (k) {
    case OpKind::X: return Op::x(wires[0], lits(1, rng() % 3));
    case OpKind::Phase: return Op::phase(random_angle(rng), lits(0, 1 + rng() % 3));
    case OpKind::Parity: return Op::parity(random_angle(rng), {wires.begin(), wires.begin() + 1 + rng() % 4});
    case OpKind::Swap: return Op::swap(wires[0], wires[1], lits(2, rng() % 2));
    case OpKind::ISwap:
    case OpKind::XX: return Op::two(k, wires[0], wires[1], random_angle(rng));
    case OpKind::R: {
        Op op = Op::one(OpKind::R, wires[0], random_angle(rng));
        op.set_phi(random_angle(rng));
        return op;
    }
    case OpKind::U: {
        Op op = Op::u(wires[0], random_angle(rng), random_angle(rng), random_angle(rng));
        op.controls = lits(1, rng() % 2);
        return op;
    }
    case OpKind::Barrier: {
        Op op;
        op.kind = OpKind::Barrier;
        op.controls = {Lit::pos(wires[0]), Lit::pos(wires[1])};
        return op;
    }
    default: return Op::one(k, wires[0], random_angle(rng), lits(1, rng() % 2));
    }
}

}  // namespace

TEST_CASE("round trip on random circuits of every op kind 2.0 can express") {
    std::mt19937 rng(4242);
    int done = 0;
    for (int iter = 0; iter < 300; ++iter) {
        ir::Circuit c = yard();
        c.global_phase = random_angle(rng);
        for (int i = 0; i < 14; ++i) c.ops.push_back(random_op(rng, c.num_qubits()));
        ir::verify(c);
        double d = round_trip_distance(c);
        CHECK(d < 1e-9);
        ++done;
    }
    CHECK(done == 300);
}

TEST_CASE("round trip with measurements and feed-forward, by simulation of each branch") {
    // Same random input state and the same random draws for c and its round trip: every measured
    // outcome agrees and the final states agree up to global phase.
    std::mt19937 rng(777);
    int compared = 0;
    for (int iter = 0; iter < 100; ++iter) {
        ir::Circuit c = yard();
        c.add_creg("m", 1, true);
        c.add_creg("out", 2);
        for (int i = 0; i < 16; ++i) {
            uint32_t r = rng() % 8;
            if (r == 0) {
                c.ops.push_back(Op::measure(rng() % c.num_qubits(), int32_t(rng() % 3)));
                continue;
            }
            Op op = random_op(rng, c.num_qubits());
            if (r == 1 && op.kind != OpKind::Barrier) {
                const int32_t reg = int32_t(rng() % 2);
                op.set_condition(reg, rng() % (reg == 0 ? 2 : 4));
            }
            c.ops.push_back(op);
        }
        ir::Circuit back = reimport(lowering::emit_qasm2(c));
        std::mt19937_64 r1{uint64_t(iter)}, r2{uint64_t(iter)};
        ir::StateVector s1(c.num_qubits()), s2(back.num_qubits());
        s1.randomize(r1);
        s2.randomize(r2);
        std::vector<uint8_t> b1, b2;
        s1.run(c, b1, r1);
        s2.run(back, b2, r2);
        CHECK(b1 == b2);
        Eigen::MatrixXcd a = s1.amplitudes(), b = s2.amplitudes();
        CHECK(ir::distance_up_to_phase(a, b) < 1e-9);
        ++compared;
    }
    CHECK(compared == 100);
}

TEST_CASE("controlled rotations past pi keep their sign in the round trip") {
    // Rz(7pi/4) under a control differs from Rz(-pi/4) under a control by a Z on the control.
    for (OpKind k : {OpKind::RX, OpKind::RY, OpKind::RZ}) {
        ir::Circuit c = yard();
        c.ops.push_back(Op::one(k, 0, Angle::pi_times(7, 4), {Lit::pos(1)}));
        c.ops.push_back(Op::one(k, 3, Angle::radians(5.5), {Lit::neg(2)}));
        CHECK(round_trip_distance(c) < 1e-9);
    }
    ir::Circuit u = yard();
    Op op = Op::u(4, Angle::pi_times(5, 3), Angle::pi_times(7, 4), Angle::radians(6.0));
    op.controls = {Lit::pos(0)};
    u.ops.push_back(op);
    CHECK(round_trip_distance(u) < 1e-9);
}

TEST_CASE("negative controls are X conjugations") {
    ir::Circuit c = yard();
    c.ops.push_back(Op::x(1, {Lit::neg(0)}));
    std::string text = lowering::emit_qasm2(c);
    CHECK(contains(text, "x a[0];\ncx a[0],a[1];\nx a[0];\n"));
    CHECK(round_trip_distance(c) < 1e-9);
}

TEST_CASE("gate forms in OpenQASM 2.0") {
    ir::Circuit c = yard();
    c.ops.push_back(Op::x(2, {Lit::pos(0), Lit::pos(1)}));
    c.ops.push_back(Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(3)}));
    c.ops.push_back(Op::phase(Angle::pi_times(3, 4), {Lit::pos(4)}));
    c.ops.push_back(Op::phase(Angle::radians(0.1), {Lit::pos(4)}));
    c.ops.push_back(Op::one(OpKind::H, 0, {}, {Lit::pos(3)}));
    c.ops.push_back(Op::one(OpKind::RZ, 0, Angle::pi_times(1, 4), {Lit::pos(1)}));
    c.ops.push_back(Op::swap(0, 1, {Lit::pos(2)}));
    c.ops.push_back(Op::u(1, Angle::pi_times(1, 2), Angle(), Angle::pi_times(1)));
    c.ops.push_back(Op::parity(Angle::pi_times(1, 8), {0, 2, 4}));
    std::string t = lowering::emit_qasm2(c);
    CHECK(contains(t, "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"));
    CHECK(contains(t, "qreg a[2];\nqreg flag[1];\nqreg b[2];\n"));
    CHECK(contains(t, "ccx a[0],a[1],flag[0];\n"));
    CHECK(contains(t, "cz a[0],b[0];\n"));  // CZ under its own name in both headers
    CHECK(contains(t, "u1(3*pi/4) b[1];\n"));
    CHECK(contains(t, "u1(0.10000000000000001) b[1];\n"));
    CHECK(contains(t, "ch b[0],a[0];\n"));
    CHECK(contains(t, "crz(pi/4) a[1],a[0];\n"));
    CHECK(contains(t, "cswap flag[0],a[0],a[1];\n"));
    CHECK(contains(t, "u3(pi/2,0,pi) a[1];\n"));
    CHECK(contains(t, "cx a[0],b[1];\ncx flag[0],b[1];\nu1(pi/8) b[1];\ncx flag[0],b[1];\ncx a[0],b[1];\n"));
    CHECK_FALSE(contains(t, "gate "));  // no definitions when none is used
    CHECK(round_trip_distance(c) < 1e-9);
}

TEST_CASE("iswap and r get one definition each, only when used") {
    ir::Circuit c = yard();
    c.ops.push_back(Op::two(OpKind::ISwap, 0, 3));
    c.ops.push_back(Op::two(OpKind::ISwap, 1, 4));
    Op r = Op::one(OpKind::R, 2, Angle::pi_times(1, 3));
    r.set_phi(Angle::pi_times(1, 5));
    c.ops.push_back(r);
    c.ops.push_back(Op::two(OpKind::XX, 0, 1, Angle::pi_times(1, 2)));
    std::string t = lowering::emit_qasm2(c);
    CHECK(count(t, "gate iswap a,b {") == 1);
    CHECK(count(t, "gate r(theta,phi) a {") == 1);
    CHECK(count(t, "gate ") == 2);  // rxx is the header's (later versions), not defined here
    CHECK(contains(t, "iswap a[0],b[0];\n"));
    CHECK(contains(t, "r(pi/3,pi/5) flag[0];\n"));
    CHECK(contains(t, "rxx(pi/2) a[0],a[1];\n"));
    CHECK(round_trip_distance(c) < 1e-9);
}

TEST_CASE("ops without a 2.0 form are refused with a hint to pick a target") {
    auto refused = [](Op op) {
        ir::Circuit c = yard();
        op.loc = ir::SourceLoc{0, 7, 3};
        c.ops.push_back(op);
        try {
            lowering::emit_qasm2(c);
        } catch (const UserError& e) {
            return contains(e.what(), "--target") && e.loc().line == 7 && e.loc().column == 3;
        }
        return false;
    };
    CHECK(refused(Op::x(4, {Lit::pos(0), Lit::pos(1), Lit::neg(2)})));
    CHECK(refused(Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::pos(1), Lit::pos(2), Lit::pos(3)})));
    CHECK(refused(Op::one(OpKind::H, 0, {}, {Lit::pos(1), Lit::pos(2)})));
    CHECK(refused(Op::one(OpKind::RY, 0, Angle::pi_times(1, 4), {Lit::pos(1), Lit::pos(2)})));
    CHECK(refused(Op::swap(0, 1, {Lit::pos(2), Lit::pos(3)})));
    // ... and OpenQASM 3.0 takes them with control modifiers.
    ir::Circuit c = yard();
    c.ops.push_back(Op::x(4, {Lit::pos(0), Lit::pos(1), Lit::pos(2)}));
    CHECK(contains(lowering::emit_qasm3(c), "ctrl(3) @ x a[0], a[1], flag, b[1];\n"));
}

TEST_CASE("three-literal phases have exact 2.0 forms") {
    for (Angle a : {Angle::pi_times(1), Angle::pi_times(1, 4), Angle::radians(2.2)}) {
        ir::Circuit c = yard();
        c.ops.push_back(Op::phase(a, {Lit::pos(0), Lit::neg(2), Lit::pos(4)}));
        CHECK(round_trip_distance(c) < 1e-9);
    }
}

TEST_CASE("measurement, reset, barrier and conditions") {
    ir::Circuit c = yard();
    uint32_t m = c.add_creg("m", 1, true);
    c.add_creg("out", 2);
    c.ops.push_back(Op::measure(2, 0));
    Op x = Op::x(0);
    x.set_condition(int32_t(m), 1);
    c.ops.push_back(x);
    Op cz = Op::phase(Angle::pi_times(1), {Lit::neg(0), Lit::pos(1)});
    cz.set_condition(1, 2);
    c.ops.push_back(cz);
    c.ops.push_back(Op::measure(4, 2));
    c.ops.push_back(Op::reset(4));
    Op bar;
    bar.kind = OpKind::Barrier;
    bar.controls = {Lit::pos(0), Lit::pos(3)};
    c.ops.push_back(bar);
    Op cond_bar = bar;
    cond_bar.set_condition(0, 1);
    c.ops.push_back(cond_bar);
    std::string t2 = lowering::emit_qasm2(c);
    CHECK(count(t2, "barrier a[0],b[0];\n") == 2);  // a conditioned barrier is written plainly
    CHECK(contains(t2, "creg m[1];\ncreg out[2];\n"));
    CHECK(contains(t2, "measure flag[0] -> m[0];\n"));
    CHECK(contains(t2, "if(m==1) x a[0];\n"));
    CHECK(contains(t2, "if(out==2) x a[0];\nif(out==2) cz a[0],a[1];\nif(out==2) x a[0];\n"));
    CHECK(contains(t2, "measure b[1] -> out[1];\nreset b[1];\nbarrier a[0],b[0];\n"));
    ir::Circuit back = reimport(t2);
    REQUIRE(back.ops.size() == 9);
    CHECK(back.ops[1].cond_reg() == 0);
    CHECK(back.ops[1].cond_value() == 1);
    CHECK(back.ops[3].cond_value() == 2);
    CHECK(back.ops[5].cbit() == 2);

    std::string t3 = lowering::emit_qasm3(c);
    CHECK(contains(t3, "OPENQASM 3.0;\ninclude \"stdgates.inc\";\n"));
    CHECK(contains(t3, "qubit[2] a;\nqubit flag;\nqubit[2] b;\nbit m;\nbit[2] out;\n"));
    CHECK(contains(t3, "m = measure flag;\n"));
    CHECK(contains(t3, "if (m == 1) { x a[0]; }\n"));
    CHECK(contains(t3, "out[1] = measure b[1];\n"));
    CHECK(contains(t3, "barrier a[0], b[0];\n"));
}

TEST_CASE("register names are kept unless OpenQASM cannot take them") {
    ir::Circuit c;
    c.add_register("crane", 2, ir::Role::Data);
    c.add_register("U", 1, ir::Role::Data);
    c.add_register("measure", 1, ir::Role::Data);
    c.add_creg("crane", 1);
    c.ops.push_back(Op::x(2, {Lit::pos(3)}));
    c.ops.push_back(Op::measure(0, 0));
    std::string t = lowering::emit_qasm2(c);
    CHECK(contains(t, "qreg crane[2];\n"));
    CHECK(contains(t, "qreg q_U[1];\n"));
    CHECK(contains(t, "// whittle: qreg q_U source U role qubit\n"));
    CHECK(contains(t, "// whittle: qreg q_measure source measure role qubit\n"));
    CHECK(contains(t, "// register 'crane' is written as 'crane_2'\n"));
    CHECK(contains(t, "qreg q_measure[1];\n"));
    CHECK(contains(t, "creg crane_2[1];\n"));
    CHECK(contains(t, "cx q_measure[0],q_U[0];\n"));
    ir::Circuit back = reimport(t);
    CHECK(back.registers[0].name == "crane");
    // The reader takes the source names back from the annotations.
    CHECK(back.registers[1].name == "U");
    CHECK(back.registers[2].name == "measure");
}

TEST_CASE("a register a gate's name would take is renamed with an annotation; roles survive the round trip") {
    ir::Circuit c;
    c.add_register("z", 2, ir::Role::Data);
    c.add_register("input", 1, ir::Role::Data);  // an OpenQASM 3.0 keyword, a plain name in 2.0
    c.add_register("carry", 1, ir::Role::Clean);
    c.add_register("spare", 1, ir::Role::Dirty);
    c.ops.push_back(Op::x(3, {Lit::pos(0), Lit::pos(1)}));
    const std::string t = lowering::emit_qasm2(c);
    CHECK(contains(t, "qreg q_z[2];\n"));
    CHECK(contains(t, "// whittle: qreg q_z source z role qubit\n"));
    CHECK(contains(t, "qreg input[1];\n"));
    CHECK(contains(t, "// whittle: qreg carry source carry role ancilla\n"));
    CHECK(contains(t, "// whittle: qreg spare source spare role borrow\n"));
    CHECK(contains(lowering::emit_qasm3(c), "qubit[1] q_input;\n"));
    const ir::Circuit back = reimport(t);
    REQUIRE(back.registers.size() == 4);
    CHECK(back.registers[0].name == "z");
    CHECK(back.registers[2].role == ir::Role::Clean);
    CHECK(back.qubits[3].role == ir::Role::Clean);
    CHECK(back.registers[3].role == ir::Role::Dirty);
}

TEST_CASE("OpenQASM 3.0 forms") {
    ir::Circuit c = yard();
    c.global_phase = Angle::pi_times(1, 4);
    c.ops.push_back(Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::pos(1), Lit::pos(2)}));
    c.ops.push_back(Op::one(OpKind::SXdg, 3));
    c.ops.push_back(Op::one(OpKind::RZ, 0, Angle::pi_times(7, 4), {Lit::pos(1)}));
    c.ops.push_back(Op::one(OpKind::H, 0, {}, {Lit::pos(1), Lit::pos(2)}));
    c.ops.push_back(Op::two(OpKind::XX, 0, 1, Angle::pi_times(1, 2)));
    c.ops.push_back(Op::two(OpKind::XX, 3, 4, Angle::pi_times(1, 3)));
    Op u = Op::u(4, Angle::pi_times(1, 2), Angle::pi_times(1, 3), Angle());
    u.controls = {Lit::pos(0)};
    c.ops.push_back(u);
    c.ops.push_back(Op::u(4, Angle::pi_times(1, 2), Angle::pi_times(1, 3), Angle()));
    std::string t = lowering::emit_qasm3(c);
    CHECK(contains(t, "gphase(pi/4);\n"));
    CHECK(contains(t, "ctrl(2) @ p(pi/4) a[0], a[1], flag;\n"));
    CHECK(contains(t, "inv @ sx b[0];\n"));
    CHECK(contains(t, "crz(7*pi/4) a[1], a[0];\n"));  // the stored angle, exact under a control
    CHECK(contains(t, "ctrl(2) @ h a[1], flag, a[0];\n"));
    CHECK(count(t, "gate rxx(theta) a, b {") == 1);
    CHECK(contains(t, "rxx(pi/3) b[0], b[1];\n"));
    CHECK(contains(t, "cu(pi/2, pi/3, 0, 0) a[0], b[1];\n"));
    CHECK(contains(t, "U(pi/2, pi/3, 0) b[1];\n"));
}
