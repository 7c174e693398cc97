// normalize: canonical forms checked against the state-vector simulator (global phase included).
#include <doctest/doctest.h>

#include "passes/normalize.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Circuit one(Op op, uint32_t n = 3) {
    Circuit c = wires(n);
    c.ops.push_back(std::move(op));
    return c;
}

double dist(const Circuit& a, const Circuit& b) {
    // Full unitaries, global phase included.
    return (circuit_unitary(a) - circuit_unitary(b)).norm();
}

}  // namespace

TEST_CASE("RZ(t) = e^{-it/2} Phase(t) (Nielsen & Chuang ch. 4 definitions; practice)") {
    Circuit c = one(Op::one(OpKind::RZ, 1, Angle::pi_times(1, 3)));
    Circuit before = c;
    passes::PassResult r = passes::normalize(c, {});
    CHECK(r.changed);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].kind == OpKind::Phase);
    CHECK(c.ops[0].angle == Angle::pi_times(1, 3));
    CHECK(c.global_phase == Angle::pi_times(-1, 6));
    CHECK(dist(before, c) < 1e-12);
}

TEST_CASE("controlled RZ becomes two phases on products") {
    Circuit c = one(Op::one(OpKind::RZ, 2, Angle::pi_times(3, 4), {Lit::neg(0), Lit::pos(1)}));
    Circuit before = c;
    passes::normalize(c, {});
    CHECK(c.ops.size() == 2);
    for (const Op& op : c.ops) CHECK(op.kind == OpKind::Phase);
    CHECK(dist(before, c) < 1e-12);
}

TEST_CASE("Phase on a negative literal is a positive one with a global phase") {
    Circuit c = one(Op::phase(Angle::pi_times(1, 4), {Lit::neg(0)}));
    Circuit before = c;
    passes::normalize(c, {});
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].controls[0] == Lit::pos(0));
    CHECK(c.ops[0].angle == Angle::pi_times(-1, 4));
    CHECK(c.global_phase == Angle::pi_times(1, 4));
    CHECK(dist(before, c) < 1e-12);
}

TEST_CASE("sorted literals, one-wire parity, U(0,p,l), zero angles dropped") {
    Circuit c = wires(3);
    c.ops = {Op::x(0, {Lit::pos(2), Lit::neg(1)}), Op::parity(Angle::pi_times(1, 2), {1}),
             Op::u(2, Angle(), Angle::pi_times(1, 4), Angle::pi_times(1, 8)), Op::one(OpKind::RX, 0, Angle()),
             Op::phase(Angle(), {Lit::pos(0), Lit::pos(1)}), Op::swap(2, 0)};
    Circuit before = c;
    passes::normalize(c, {});
    REQUIRE(c.ops.size() == 4);
    CHECK(c.ops[0].controls[0] == Lit::neg(1));
    CHECK(c.ops[1].kind == OpKind::Phase);
    CHECK(c.ops[2].kind == OpKind::Phase);
    CHECK(c.ops[2].angle == Angle::pi_times(3, 8));
    CHECK(c.ops[3].target == 0);
    CHECK(dist(before, c) < 1e-12);
}

TEST_CASE("normalize leaves a canonical circuit untouched and is idempotent") {
    Circuit c = wires(3);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)}), Op::phase(Angle::pi_times(1, 4), {Lit::pos(0)}),
             Op::one(OpKind::H, 1)};
    Circuit before = c;
    CHECK_FALSE(passes::normalize(c, {}).changed);
    CHECK(c.ops.size() == before.ops.size());
    std::mt19937_64 rng(7);
    for (int i = 0; i < 100; ++i) {
        Circuit r = random_circuit(rng);
        passes::normalize(r, {});
        CHECK_FALSE(passes::normalize(r, {}).changed);
    }
}

TEST_CASE("normalize on random circuits keeps the state (state vector, global phase included)") {
    int changed = check_pass_on_random(passes::normalize, 300, 11);
    CHECK(changed > 100);
}
