// cancel: textbook identities (Nielsen & Chuang ch. 4; practice) and random circuits on the simulators.
#include <doctest/doctest.h>

#include "passes/backward_rewriter.h"
#include "passes/cancel.h"
#include "passes/combine_rules.h"
#include "passes/normalize.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Op t(uint32_t w) { return Op::phase(Angle::pi_times(1, 4), {Lit::pos(w)}); }
Op h(uint32_t w) { return Op::one(OpKind::H, w); }
Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }
Op ccx(Lit a, Lit b, uint32_t t) { return Op::x(t, {a, b}); }

Circuit run(Circuit c, bool expect_change = true) {
    Circuit before = c;
    passes::PassResult r = passes::cancel(c, {});
    CHECK(r.changed == expect_change);
    verify(c);
    CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-9);
    return c;
}

}  // namespace

TEST_CASE("T T = S (phases on one wire add)") {
    Circuit c = wires(1);
    c.ops = {t(0), t(0)};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].angle == Angle::pi_times(1, 2));
}

TEST_CASE("H H = I and CNOT CNOT = I across commuting ops") {
    Circuit c = wires(3);
    // CNOT(0->1), a CNOT sharing the control, T on the control, CNOT(0->1): the outer pair cancels.
    c.ops = {h(2), cx(0, 1), cx(0, 2), t(0), cx(0, 1), h(2)};
    c = run(c);
    CHECK(c.ops.size() == 4);
    c.ops = {h(0), h(0)};
    c = run(c);
    CHECK(c.ops.empty());
}

TEST_CASE("X-type ops sharing a target commute; a target that is a control blocks") {
    Circuit c = wires(3);
    c.ops = {cx(0, 2), cx(1, 2), cx(0, 2)};  // same target: commute, outer pair cancels
    c = run(c);
    CHECK(c.ops.size() == 1);
    // Target 1 is a control of the middle op: nothing moves across it by commutation.
    c.ops = {cx(0, 1), Op::one(OpKind::RX, 2, Angle::pi_times(1, 3), {Lit::pos(1)}), cx(0, 1)};
    c = run(c, false);
    CHECK(c.ops.size() == 3);
    // With an involution in the middle the kickback identity applies (kickback_test.cpp):
    // CX(0,1) CX(1,2) CX(0,1) = CX(1,2) CX(0,2).
    c.ops = {cx(0, 1), cx(1, 2), cx(0, 1)};
    c = run(c);
    CHECK(c.ops.size() == 2);
}

TEST_CASE("an X on a control flips the polarity: X_a CX(a,b) X_a = CX(!a,b) (practice)") {
    Circuit c = wires(2);
    c.ops = {Op::x(0), cx(0, 1), Op::x(0), Op::x(1, {Lit::neg(0)})};
    c = run(c);
    CHECK(c.ops.empty());
}

TEST_CASE("an X across a parity phase negates it with a global phase") {
    Circuit c = wires(2);
    c.ops = {Op::parity(Angle::pi_times(1, 4), {0, 1}), Op::x(0), Op::parity(Angle::pi_times(1, 4), {0, 1})};
    c = run(c);
    CHECK(c.ops.size() == 1);  // the two parities cancel after the flip
}

TEST_CASE("CZ twice vanishes across a Toffoli on another target; diagonal ops commute") {
    Circuit c = wires(3);
    Op cz = Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1)});
    c.ops = {cz, ccx(Lit::pos(0), Lit::pos(1), 2), Op::parity(Angle::pi_times(1, 8), {0, 2}), cz};
    c = run(c);  // CZ(0,1) only meets the Toffoli's controls and another diagonal op
    CHECK(c.ops.size() == 2);
    Op cz02 = Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(2)});
    Op cs02 = Op::phase(Angle::pi_times(1, 2), {Lit::pos(0), Lit::pos(2)});
    c.ops = {cs02, ccx(Lit::pos(0), Lit::pos(1), 2), cs02};  // the Toffoli's target is on the CS: blocked
    c = run(c, false);
    CHECK(c.ops.size() == 3);
    // A CZ there is an involution: the kickback leaves CZ(0,1) and the CZ(0,2) pair vanishes.
    c.ops = {cz02, ccx(Lit::pos(0), Lit::pos(1), 2), cz02};
    c = run(c);
    CHECK(c.ops.size() == 2);
}

TEST_CASE("rotations about one axis add: RX(pi/3) RX(pi/6) = RX(pi/2); a wrap past 2pi is a global phase") {
    Circuit c = wires(1);
    c.ops = {Op::one(OpKind::RX, 0, Angle::pi_times(1, 3)), Op::one(OpKind::RX, 0, Angle::pi_times(1, 6))};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].angle == Angle::pi_times(1, 2));
    c.ops = {Op::one(OpKind::RY, 0, Angle::pi_times(3, 2)), Op::one(OpKind::RY, 0, Angle::pi_times(1, 2))};
    c = run(c);
    CHECK(c.ops.empty());
    CHECK(c.global_phase == Angle::pi_times(1));  // RY(3pi/2) RY(pi/2) = RY(2pi) = -I
}

TEST_CASE("nested compute/uncompute halves cancel from the inside out") {
    Circuit c = wires(5);
    const uint32_t p = c.new_pair_id();
    std::vector<Op> compute = {ccx(Lit::pos(0), Lit::pos(1), 3), ccx(Lit::pos(3), Lit::neg(2), 4)};
    for (Op& o : compute) {
        o.pair = p;
        o.half = PairHalf::Compute;
        c.ops.push_back(o);
    }
    for (auto it = compute.rbegin(); it != compute.rend(); ++it) {
        Op o = *it;
        o.half = PairHalf::Uncompute;
        c.ops.push_back(o);
    }
    c = run(c);
    CHECK(c.ops.empty());
}

TEST_CASE("a pair broken by a cancellation loses its pair ids") {
    Circuit c = wires(3);
    const uint32_t p = c.new_pair_id();
    Op a = ccx(Lit::pos(0), Lit::pos(1), 2);
    Op comp = a, unc = a;
    comp.pair = unc.pair = p;
    comp.half = PairHalf::Compute;
    unc.half = PairHalf::Uncompute;
    c.ops = {comp, a, Op::one(OpKind::H, 2), unc};  // comp cancels the plain copy, not its own half
    c = run(c);
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[1].pair == 0);
    CHECK(c.ops[1].half == PairHalf::None);
}

TEST_CASE("cancel leaves a circuit with nothing to cancel untouched") {
    Circuit c = wires(3);
    c.ops = {h(0), cx(0, 1), t(1), cx(1, 2), h(2)};
    Circuit before = c;
    CHECK_FALSE(passes::cancel(c, {}).changed);
    REQUIRE(c.ops.size() == before.ops.size());
}

TEST_CASE("cancel on random circuits (state vector, global phase included; classical simulator for X-type)") {
    CHECK(check_pass_on_random(passes::cancel, 300, 21) > 150);
    RandomSpec classical;
    classical.classical_only = true;
    classical.max_qubits = 10;
    CHECK(check_pass_on_random(passes::cancel, 200, 22, classical) > 80);
}

TEST_CASE("cancel is idempotent and never adds T on random Clifford+T circuits") {
    std::mt19937_64 rng(23);
    RandomSpec spec;
    spec.clifford_t_only = true;
    for (int i = 0; i < 300; ++i) {
        Circuit c = random_circuit(rng, i % 2 ? spec : RandomSpec{});
        const uint64_t t_before = count_resources(c).t_count;
        passes::normalize(c, {});
        passes::cancel(c, {});
        if (i % 2) CHECK(count_resources(c).t_count <= t_before);
        Circuit again = c;
        CHECK_FALSE(passes::cancel(again, {}).changed);
        CHECK(again.ops.size() == c.ops.size());
    }
}

TEST_CASE("the rewriter with a window of 2 (per-wire rings of 16 entries that wrap) on long random circuits") {
    // 400-600 ops on 3-5 wires put far more than 16 entries on every wire, so the rings wrap and
    // insertions (kickbacks, merged wires) meet full rings; the result must stay the same map.
    std::mt19937_64 rng(29);
    RandomSpec spec;
    spec.min_qubits = 3;
    spec.max_qubits = 5;
    spec.min_ops = 400;
    spec.max_ops = 600;
    int changed = 0;
    for (int i = 0; i < 40; ++i) {
        Circuit c = random_circuit(rng, spec);
        passes::normalize(c, {});
        const Circuit before = c;
        passes::PassResult r;
        passes::RewriteBuffers buffers;
        passes::RewriteLimits limits;
        limits.window = 2;
        limits.kickback = i % 2 == 0;
        bool any = false;
        for (int sweep = 0; sweep < 4; ++sweep)
            any = passes::rewrite_backwards(c, passes::kCancelRule, r, buffers, limits, sweep % 2 == 1) || any;
        verify(c);
        if (any) ++changed;
        CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-8);
    }
    CHECK(changed > 30);
}
