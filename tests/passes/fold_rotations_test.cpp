// fold-rotations and gate-cancel on lowered circuits: textbook identities, 7-T Toffoli pairs, random Clifford+T.
#include <doctest/doctest.h>

#include "passes/fold_rotations.h"
#include "passes/gate_cancel.h"
#include "pass_check.h"
#include "support/families.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Op h(uint32_t w) { return Op::one(OpKind::H, w); }
Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }
Op t(uint32_t w, int e = 1) { return Op::phase(Angle::pi_times(e, 4), {Lit::pos(w)}); }

void check_same(const Circuit& a, const Circuit& b) { CHECK((circuit_unitary(a) - circuit_unitary(b)).norm() < 1e-9); }

}  // namespace

TEST_CASE("RZ keeps its kind when merged: RZ(a) CX RZ(b) on the same parity") {
    Circuit c = wires(2);
    c.ops = {Op::one(OpKind::RZ, 1, Angle::pi_times(1, 8)), cx(0, 1), cx(0, 1), Op::one(OpKind::RZ, 1, Angle::pi_times(1, 8))};
    Circuit before = c;
    CHECK(passes::fold_rotations(c, {}).changed);
    check_same(before, c);
    int rz = 0;
    for (const Op& op : c.ops) rz += op.kind == OpKind::RZ;
    CHECK(rz == 1);
    for (const Op& op : c.ops) CHECK(op.kind != OpKind::Phase);
}

TEST_CASE("a Toffoli and its copy in the 7-T form (N&C Fig. 4.9): the control terms fold, 14 T -> 8 T") {
    Circuit c = wires(3);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)}), Op::x(2, {Lit::pos(0), Lit::pos(1)})};
    Circuit low = toffolis_to_clifford_t(c);
    CHECK(count_resources(low).t_count == 14);
    Circuit folded = low;
    passes::fold_rotations(folded, {});
    check_same(low, folded);
    CHECK(count_resources(folded).t_count == 8);
}

TEST_CASE("gate-cancel: H H across nothing, CNOT pairs across a commuting CNOT, T T-dagger across a CNOT control") {
    Circuit c = wires(3);
    c.ops = {h(2), h(2), cx(0, 1), cx(0, 2), cx(0, 1), t(0), cx(0, 2), t(0, -1)};
    Circuit before = c;
    CHECK(passes::gate_cancel(c, {}).changed);
    check_same(before, c);
    CHECK(c.ops.empty());
    Circuit nothing = wires(2);
    nothing.ops = {h(0), cx(0, 1), t(1), h(1)};
    CHECK_FALSE(passes::gate_cancel(nothing, {}).changed);
}

TEST_CASE("fold-rotations and gate-cancel on random circuits (state vector, global phase included)") {
    CHECK(check_pass_on_random(passes::fold_rotations, 300, 61) > 50);
    CHECK(check_pass_on_random(passes::gate_cancel, 300, 62) > 100);
}

TEST_CASE("random Clifford+T circuits never get more T gates from fold-rotations or gate-cancel") {
    std::mt19937_64 rng(63);
    RandomSpec ct;
    ct.clifford_t_only = true;
    ct.max_qubits = 10;
    ct.max_ops = 120;
    int reduced = 0;
    for (int i = 0; i < 300; ++i) {
        Circuit c = random_circuit(rng, ct);
        const uint64_t t0 = count_resources(c).t_count;
        Circuit d = c;
        passes::gate_cancel(d, {});
        passes::fold_rotations(d, {});
        passes::gate_cancel(d, {});
        const uint64_t t1 = count_resources(d).t_count;
        CHECK(t1 <= t0);
        if (t1 < t0) ++reduced;
        if (i < 60) CHECK(state_distance(c, d, rng, 1) < 1e-9);
    }
    CHECK(reduced > 100);
}
