// rewrite-search: a three-wire CNOT identity across a commuting rotation, and random circuits on
// every rotation target checked by state vectors, global phase included (never more two-qubit gates, same answer twice).
#include <doctest/doctest.h>

#include "lowering/targets.h"
#include "passes/rewrite_search.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }

passes::PassOptions options(ir::Target t, uint32_t effort = 1) {
    passes::PassOptions o;
    o.target = t;
    o.level = 3;
    o.optimize_for = ir::Metric::TwoQubit;
    o.rewrite_effort = effort;
    return o;
}

// A random circuit of the target's gates on 4 wires, with short CNOT/entangler ladders so that
// rules find something.
Circuit random_target_circuit(ir::Target t, std::mt19937_64& rng, int gates) {
    Circuit c = wires(4);
    std::uniform_int_distribution<uint32_t> wire(0, 3);
    std::uniform_int_distribution<int> kind(0, 5), eighth(1, 15);
    for (int i = 0; i < gates; ++i) {
        const uint32_t a = wire(rng);
        uint32_t b = wire(rng);
        while (b == a) b = wire(rng);
        const Angle ang = Angle::pi_times(eighth(rng), 8);
        switch (kind(rng)) {
        case 0:
        case 1:
        case 2:
            if (t == ir::Target::CxRzSx) c.ops.push_back(cx(a, b));
            if (t == ir::Target::CzRxRz) c.ops.push_back(Op::phase(Angle::pi_times(1), {Lit::pos(std::min(a, b)), Lit::pos(std::max(a, b))}));
            if (t == ir::Target::ISwapRzRx) c.ops.push_back(Op::two(OpKind::ISwap, a, b));
            if (t == ir::Target::XxR) c.ops.push_back(Op::two(OpKind::XX, a, b, ang));
            break;
        case 3: c.ops.push_back(Op::one(OpKind::RZ, a, ang)); break;
        case 4:
            if (t == ir::Target::CxRzSx) c.ops.push_back(Op::one(OpKind::SX, a));
            else if (t == ir::Target::XxR) {
                Op r = Op::one(OpKind::R, a, ang);
                r.set_phi(Angle::pi_times(eighth(rng), 4));
                c.ops.push_back(r);
            } else c.ops.push_back(Op::one(OpKind::RX, a, ang));
            break;
        default:
            if (t == ir::Target::CxRzSx) c.ops.push_back(Op::x(a));
            else c.ops.push_back(Op::one(t == ir::Target::XxR ? OpKind::RZ : OpKind::RX, a, ang));
        }
    }
    return c;
}

}  // namespace

// CNOT(0->1) CNOT(1->2) CNOT(0->1) = CNOT(0->2) CNOT(1->2) (common practice: conjugating CNOT(1->2)
// by CNOT(0->1) adds wire 0 to the parity written into wire 2); Rz on wire 0 commutes with CNOTs
// controlled by wire 0 and with ones not on it.
TEST_CASE("a three-wire CNOT rule applies across a commuting rotation") {
    Circuit c = wires(3);
    c.ops = {cx(0, 1), Op::one(OpKind::RZ, 0, Angle::pi_times(1, 3)), cx(1, 2), cx(0, 1)};
    const Circuit before = c;
    const passes::PassResult r = passes::rewrite_search(c, options(ir::Target::CxRzSx));
    CHECK(r.changed);
    CHECK(count_resources(c).cnot_count == 2);
    std::mt19937_64 rng(3);
    CHECK(state_distance(before, c, rng, 4) < 1e-9);
}

TEST_CASE("effort 0 leaves the circuit alone; no target, nothing to do") {
    Circuit c = wires(3);
    c.ops = {cx(0, 1), cx(1, 2), cx(0, 1)};
    CHECK_FALSE(passes::rewrite_search(c, options(ir::Target::CxRzSx, 0)).changed);
    CHECK(c.ops.size() == 3);
    CHECK_FALSE(passes::rewrite_search(c, {}).changed);
}

TEST_CASE("random circuits on every rotation target: equivalent, never more two-qubit gates, deterministic") {
    std::mt19937_64 rng(2026);
    int changed = 0;
    for (ir::Target t : {ir::Target::CxRzSx, ir::Target::CzRxRz, ir::Target::ISwapRzRx, ir::Target::XxR}) {
        for (int k = 0; k < 12; ++k) {
            const Circuit in = random_target_circuit(t, rng, 30);
            Circuit a = in, b = in;
            const bool ch = passes::rewrite_search(a, options(t)).changed;
            passes::rewrite_search(b, options(t));
            changed += ch;
            CHECK(state_distance(in, a, rng, 3) < 1e-8);
            CHECK(count_resources(a).two_qubit_count <= count_resources(in).two_qubit_count);
            REQUIRE(a.ops.size() == b.ops.size());
            for (size_t i = 0; i < a.ops.size(); ++i) {
                CHECK(a.ops[i].kind == b.ops[i].kind);
                CHECK(a.ops[i].target == b.ops[i].target);
                CHECK(a.ops[i].target2 == b.ops[i].target2);
                CHECK(a.ops[i].angle.identical(b.ops[i].angle));
            }
            for (const Op& op : a.ops) CHECK(lowering::in_target(op, t));
        }
    }
    CHECK(changed > 0);
}
