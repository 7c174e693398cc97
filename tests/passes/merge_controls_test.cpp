// merge-controls: op under C&x and C&!x is op under C (Boolean identity x | !x = 1; practice), on the simulators.
#include <doctest/doctest.h>

#include "passes/merge_controls.h"
#include "pass_check.h"
#include "support/dense_unitary.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Circuit run(Circuit c, bool expect_change = true) {
    Circuit before = c;
    passes::PassResult r = passes::merge_controls(c, {});
    CHECK(r.changed == expect_change);
    verify(c);
    CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-9);
    // The independent dense reference (tests/support/dense_unitary.h), global phase included.
    CHECK(distance_exact(dense_unitary(before), dense_unitary(c)) < 1e-12);
    return c;
}

}  // namespace

TEST_CASE("CCX(a,b;t) CCX(a,!b;t) = CX(a;t), across a commuting op") {
    Circuit c = wires(4);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)}), Op::x(3, {Lit::pos(0)}), Op::x(2, {Lit::pos(0), Lit::neg(1)})};
    c = run(c);
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[0].controls.size() == 1);
}

TEST_CASE("controlled phases under b and !b merge; a single literal pair is a global phase") {
    Circuit c = wires(2);
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::pos(1)}),
             Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::neg(1)})};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].controls.size() == 1);
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0)}), Op::phase(Angle::pi_times(1, 4), {Lit::neg(0)})};
    c = run(c);
    CHECK(c.ops.empty());
    CHECK(c.global_phase == Angle::pi_times(1, 4));
}

TEST_CASE("the split that cancels: X(t; a) X(t; a&b) = X(t; a&!b); Phase(p; a) Phase(-p; a&b) = Phase(p; a&!b)") {
    Circuit c = wires(3);
    c.ops = {Op::x(2, {Lit::pos(0)}), Op::x(2, {Lit::pos(0), Lit::pos(1)})};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].controls.size() == 2);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)}), Op::x(2, {Lit::pos(0)})};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0)}), Op::phase(Angle::pi_times(-1, 4), {Lit::pos(0), Lit::pos(1)})};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::pos(1)}), Op::phase(Angle::pi_times(-1, 4), {Lit::pos(0)})};
    c = run(c);
    REQUIRE(c.ops.size() == 1);
    // Different angles that do not cancel: no split.
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0)}), Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::pos(1)})};
    run(c, false);
}

TEST_CASE("a split that would add an op is not made; different targets do not merge") {
    Circuit c = wires(4);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)}), Op::x(3, {Lit::pos(0), Lit::neg(1)})};
    run(c, false);
}

TEST_CASE("merge-controls on random circuits (state vector, global phase included; classical simulator)") {
    CHECK(check_pass_on_random(passes::merge_controls, 300, 31) > 30);
    RandomSpec classical;
    classical.classical_only = true;
    classical.max_qubits = 10;
    CHECK(check_pass_on_random(passes::merge_controls, 200, 32, classical) > 30);
}
