// Kickback identity (Nielsen & Chuang ch. 4; practice) and cancel's use of it: the identity on the
// project's checker and the independent dense reference, hand-written cancellations, random circuits.
#include <doctest/doctest.h>

#include <fmt/format.h>

#include "ir/printer.h"
#include "passes/cancel.h"
#include "passes/commutation.h"
#include "verify/equivalence.h"
#include "passes/kickback.h"
#include "pass_check.h"
#include "support/dense_unitary.h"

using namespace whittle;
using namespace whittle::test;
using passes::Verdict;

namespace {

Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }
Op ccx(Lit a, Lit b, uint32_t t) { return Op::x(t, {a, b}); }
Op cz(uint32_t a, uint32_t b) { return Op::phase(Angle::pi_times(1), {Lit::pos(a), Lit::pos(b)}); }

Circuit with(uint32_t n, std::vector<Op> ops) {
    Circuit c = wires(n);
    c.ops = std::move(ops);
    return c;
}

/// Both sides of the identity on the project's checker and on the dense reference (phase included).
void check_same(const Circuit& a, const Circuit& b) {
    INFO("left:\n" << ir::print_wq(a) << "right:\n" << ir::print_wq(b));
    CHECK(passes::check_equivalence(a, b).verdict == Verdict::Equivalent);
    CHECK(distance_exact(dense_unitary(a), dense_unitary(b)) < 1e-12);
}

/// kickback_move(earlier, mover) gives E with  earlier ; mover  =  mover ; earlier ; E.
Op check_kick(uint32_t n, const Op& earlier, const Op& mover) {
    Op extra;
    REQUIRE(passes::kickback_move(earlier, mover, extra));
    check_same(with(n, {earlier, mover}), with(n, {mover, earlier, extra}));
    // E commutes with both, so it may sit anywhere next to them.
    check_same(with(n, {earlier, mover}), with(n, {extra, mover, earlier}));
    return extra;
}

void check_no_kick(const Op& earlier, const Op& mover) {
    Op extra;
    CHECK_FALSE(passes::kickback_move(earlier, mover, extra));
}

Circuit run_cancel(Circuit c, bool expect_change = true) {
    Circuit before = c;
    passes::PassResult r = passes::cancel(c, {});
    CHECK(r.changed == expect_change);
    verify(c);
    check_same(before, c);
    return c;
}

int64_t stat(const passes::PassResult& r, const std::string& name) {
    int64_t n = 0;
    for (const auto& [k, v] : r.stats)
        if (k == name) n += v;
    return n;
}

}  // namespace

TEST_CASE("the kickback identity, both orders: CX(a,t) then CX(t,s) is CX(t,s) CX(a,t) CX(a,s)") {
    // Textbook: moving a CNOT past a CNOT whose control is its target leaves a CNOT from its own
    // control (Nielsen & Chuang ch. 4; practice).
    Op e = check_kick(3, cx(0, 1), cx(1, 2));
    CHECK(e.kind == OpKind::X);
    CHECK(e.target == 2);
    CHECK(passes::same_literals(e.controls, {Lit::pos(0)}));
    e = check_kick(3, cx(1, 2), cx(0, 1));
    CHECK(passes::same_literals(e.controls, {Lit::pos(0)}));
}

TEST_CASE("kickback with Toffolis, negative and shared controls, and the involutions Y, H, Swap, CZ") {
    // A Toffoli on t across a CNOT controlled by t leaves a Toffoli from A's controls.
    Op e = check_kick(4, ccx(Lit::pos(0), Lit::pos(1), 2), cx(2, 3));
    CHECK(passes::same_literals(e.controls, {Lit::pos(0), Lit::pos(1)}));
    // A negative control on t: the extra op is the same (the control reads t ^ C either way).
    e = check_kick(4, ccx(Lit::pos(0), Lit::neg(1), 2), Op::x(3, {Lit::neg(2), Lit::pos(0)}));
    CHECK(passes::same_literals(e.controls, {Lit::pos(0), Lit::neg(1)}));  // the shared control a appears once
    check_kick(3, cx(0, 1), Op::one(OpKind::Y, 2, {}, {Lit::pos(1)}));
    check_kick(3, cx(0, 1), Op::one(OpKind::H, 2, {}, {Lit::neg(1)}));
    check_kick(4, cx(0, 1), Op::swap(2, 3, {Lit::pos(1)}));
    e = check_kick(3, cx(0, 1), cz(1, 2));  // a Phase of pi: CZ(t, s) leaves CZ(a, s)
    CHECK(e.kind == OpKind::Phase);
    CHECK(passes::same_literals(e.controls, {Lit::pos(0), Lit::pos(2)}));
    check_kick(4, Op::phase(Angle::pi_times(1), {Lit::pos(1), Lit::pos(3), Lit::pos(2)}), ccx(Lit::pos(0), Lit::pos(3), 1));
}

TEST_CASE("not a kickback pair: no controls on A, a phase other than pi, A controlled by B's target, orthogonal") {
    check_no_kick(Op::x(0), cx(0, 1));  // an uncontrolled X flips the polarity instead (commutation.h)
    check_no_kick(cx(0, 1), Op::phase(Angle::pi_times(1, 2), {Lit::pos(1), Lit::pos(2)}));
    check_no_kick(cx(2, 1), cx(1, 2));  // each target is the other's control
    check_no_kick(cx(0, 1), Op::x(2, {Lit::pos(1), Lit::neg(0)}));  // D & C is never true
    check_no_kick(cx(0, 1), Op::one(OpKind::RX, 1, Angle::pi_times(1, 3)));
    Op extra;
    Op fence = cx(0, 1);
    fence.set_condition(0, 0);
    CHECK_FALSE(passes::kickback_move(fence, cx(1, 2), extra));
}

TEST_CASE("cancel: CX(a,b) CX(b,c) CX(a,b) = CX(b,c) CX(a,c) (three CNOTs become two)") {
    Circuit c = run_cancel(with(3, {cx(0, 1), cx(1, 2), cx(0, 1)}));
    REQUIRE(c.ops.size() == 2);
    // Also across ops that commute with the moving CNOT, and with the outer pair on a Toffoli.
    c = run_cancel(with(5, {ccx(Lit::pos(0), Lit::pos(1), 2), Op::one(OpKind::H, 4), cx(2, 3),
                            Op::phase(Angle::pi_times(1, 4), {Lit::pos(0)}), ccx(Lit::pos(0), Lit::pos(1), 2)}));
    REQUIRE(c.ops.size() == 4);  // H, CX(t,s), T, and the kicked Toffoli; the outer Toffolis are gone
    CHECK(passes::estimated_t_cost(c.ops[0]) + passes::estimated_t_cost(c.ops[1]) + passes::estimated_t_cost(c.ops[2]) +
              passes::estimated_t_cost(c.ops[3]) ==
          7);
}

TEST_CASE("cancel: B A B with B controlled by A's target leaves A and the kicked B") {
    // CZ(t,c) CX(a,t) CZ(t,c) = CX(a,t) CZ(a,c).
    Circuit c = run_cancel(with(3, {cz(1, 2), cx(0, 1), cz(1, 2)}));
    REQUIRE(c.ops.size() == 2);
    // The mirrored order is found by the right-to-left sweep.
    c = run_cancel(with(3, {cx(1, 2), cx(0, 1), cx(1, 2)}));
    REQUIRE(c.ops.size() == 2);
}

TEST_CASE("cancel refuses a kickback that would raise the estimated T-cost or cancels nothing") {
    // CX(a,t) CCX(t,d; c) CX(a,t): the kicked op CCX(a,d; c) costs 7 T where the vanishing CNOTs cost 0.
    Circuit c = with(4, {cx(0, 1), ccx(Lit::pos(1), Lit::pos(3), 2), cx(0, 1)});
    run_cancel(c, false);
    // CX(t,s) CCX(a,b; t) CX(t,s): kicking would add a Toffoli for two CNOTs.
    c = with(4, {cx(2, 3), ccx(Lit::pos(0), Lit::pos(1), 2), cx(2, 3)});
    run_cancel(c, false);
    // A kickback move with nothing to cancel behind it is not made.
    c = with(4, {ccx(Lit::pos(0), Lit::pos(1), 2), cx(2, 3), cx(0, 3)});
    run_cancel(c, false);
}

TEST_CASE("with measurement allowed, a pair into a clean wire is priced as a temporary AND and a measured erase") {
    // CCX(a,b; w) CX(w; o) CCX(a,b; w) with w clean: without measurement the pair is priced 14 T and
    // the kicked CCX(a,b; o) 7 T, so it is made; with measurement the pair may cost 4 T (Gidney 2018,
    // arXiv:1709.06648), so it is not.
    Circuit c = wires(3);
    c.add_register("w", 1, Role::Clean, true);
    c.ops = {ccx(Lit::pos(0), Lit::pos(1), 3), cx(3, 2), ccx(Lit::pos(0), Lit::pos(1), 3)};
    Circuit kicked = c;
    passes::cancel(kicked, {});
    CHECK(kicked.ops.size() == 2);
    check_same(c, kicked);
    passes::PassOptions measured;
    measured.allow_measurement = true;
    Circuit kept = c;
    CHECK_FALSE(passes::cancel(kept, measured).changed);
    CHECK(kept.ops.size() == 3);
}

TEST_CASE("kickback cancellations on random circuits: op count never rises, checker and dense reference agree") {
    std::mt19937_64 rng(20261202);
    int64_t kicks = 0;
    for (int round = 0; round < 300; ++round) {
        // A = X(t; C), B controlled by t, A again, with random ops around and between them.
        const uint32_t n = 4 + uint32_t(rng() % 3);
        RandomSpec spec;
        spec.min_qubits = spec.max_qubits = n;
        spec.min_ops = 2;
        spec.max_ops = 8;
        spec.classical_only = round % 2 == 0;
        Circuit c = random_circuit(rng, spec);
        std::vector<uint32_t> ws(n);
        for (uint32_t i = 0; i < n; ++i) ws[i] = i;
        std::shuffle(ws.begin(), ws.end(), rng);
        const auto lit = [&](uint32_t w) { return Lit::make(w, rng() % 4 != 0); };
        Op a = Op::x(ws[0], {lit(ws[1])});
        if (rng() % 2) a.controls.push_back(lit(ws[2]));
        Op b = rng() % 3 == 0 ? Op::phase(Angle::pi_times(1), {lit(ws[0]), lit(ws[3])}) : Op::x(ws[3], {lit(ws[0])});
        const size_t at = rng() % (c.ops.size() + 1);
        std::vector<Op> mid = {a, b};
        if (rng() % 2) mid.push_back(random_circuit(rng, spec).ops.front());
        mid.push_back(rng() % 2 ? a : b);
        c.ops.insert(c.ops.begin() + std::ptrdiff_t(at), mid.begin(), mid.end());

        Circuit after = c;
        const passes::PassResult r = passes::cancel(after, {});
        verify(after);
        kicks += stat(r, "kickbacks");
        CHECK(after.ops.size() <= c.ops.size());
        INFO(fmt::format("round {}\nbefore:\n{}after:\n{}", round, ir::print_wq(c), ir::print_wq(after)));
        CHECK(passes::check_equivalence(c, after).verdict == Verdict::Equivalent);
        CHECK(distance_exact(dense_unitary(c), dense_unitary(after)) < 1e-9);
    }
    MESSAGE(fmt::format("{} kickbacks made", kicks));
    CHECK(kicks > 50);
}

TEST_CASE("kickback_cost agrees with kickback_move and estimated_t_cost of the op it builds, on random op pairs") {
    // Random pairs of X / Y / H / Swap / Phase ops with up to 4 controls of either polarity on 6
    // wires, many sharing wires; the shape-only answer must equal building the op and pricing it.
    std::mt19937_64 rng(77);
    const OpKind kinds[] = {OpKind::X, OpKind::X, OpKind::Y, OpKind::H, OpKind::Swap, OpKind::Phase, OpKind::RZ};
    auto random_op = [&] {
        std::vector<uint32_t> ws = {0, 1, 2, 3, 4, 5};
        std::shuffle(ws.begin(), ws.end(), rng);
        const OpKind k = kinds[rng() % std::size(kinds)];
        const size_t controls = rng() % 5;
        ir::LitVec lits;
        size_t next = 0;
        Op op;
        if (k == OpKind::Phase) {
            for (size_t i = 0; i <= controls; ++i) lits.push_back(Lit::make(ws[next++], rng() % 3 != 0));
            op = Op::phase(rng() % 2 ? Angle::pi_times(1) : Angle::pi_times(1, 4), lits);
        } else if (k == OpKind::Swap) {
            const uint32_t a = ws[next++], b = ws[next++];
            for (size_t i = 0; i < std::min<size_t>(controls, 4); ++i) lits.push_back(Lit::make(ws[next++], rng() % 3 != 0));
            op = Op::swap(a, b, lits);
        } else {
            const uint32_t t = ws[next++];
            for (size_t i = 0; i < controls; ++i) lits.push_back(Lit::make(ws[next++], rng() % 3 != 0));
            op = k == OpKind::X ? Op::x(t, lits) : Op::one(k, t, {}, lits);
        }
        std::sort(op.controls.begin(), op.controls.end());
        return op;
    };
    int kicks = 0;
    for (int i = 0; i < 20000; ++i) {
        const Op a = random_op(), b = random_op();
        Op extra;
        const bool moved = passes::kickback_move(a, b, extra);
        uint64_t cost = 12345;
        const bool priced = passes::kickback_cost(a, b, cost);
        INFO(fmt::format("pair {}", i));
        REQUIRE(moved == priced);
        if (moved) {
            ++kicks;
            CHECK(cost == passes::estimated_t_cost(extra));
        }
    }
    MESSAGE(fmt::format("{} of 20000 random pairs admit a kickback", kicks));
    CHECK(kicks > 500);
}
