// The contracts the backward rewriter relies on to decide steps from its wire lists: every combine
// rule's pre-filter is exact, a vanishing pair has the mover's shape, and the kickback shape checks
// never reject a kickback that kickback_move makes. Checked on every op pair of random circuits.
#include <doctest/doctest.h>

#include <random>

#include "ir/printer.h"
#include "passes/combine_rules.h"
#include "passes/commutation.h"
#include "passes/kickback.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

namespace {

passes::OpShape shape(const Op& op) { return {op.kind, uint32_t(op.wires().size())}; }

uint32_t shared_wires(const Op& a, const Op& b) {
    uint32_t n = 0;
    for (uint32_t w : b.wires())
        if (passes::wire_role(a, w) != passes::WireRole::None) ++n;
    return n;
}

/// Every ordered pair (earlier, mover) of the circuit's non-fence ops, as the rewriter would meet them.
template <class F>
void for_each_pair(const Circuit& c, F&& f) {
    for (size_t i = 0; i < c.ops.size(); ++i)
        for (size_t j = 0; j < c.ops.size(); ++j)
            if (i != j && !passes::is_fence(c.ops[i]) && !passes::is_fence(c.ops[j]) &&
                shared_wires(c.ops[i], c.ops[j]) > 0)
                f(c.ops[i], c.ops[j]);
}

/// Returns whether the rule combined the pair (so the test can see it met enough combinations).
bool check_rule(const passes::CombineRule& rule, const Op& earlier, const Op& mover) {
    Op e = earlier;
    Angle global;
    std::vector<uint32_t> added;
    passes::PassResult result;
    const passes::Combined how = rule.combine(e, mover, global, added, result);
    if (how == passes::Combined::No) return false;
    INFO("earlier: " << ir::op_kind_name(earlier.kind) << " on " << earlier.wires().size() << " wires, mover: "
                     << ir::op_kind_name(mover.kind) << " on " << mover.wires().size() << " wires");
    CHECK(rule.may_combine(shape(earlier), shape(mover), shared_wires(earlier, mover)));
    if (how != passes::Combined::Vanished) return true;
    const bool sx_pair = (earlier.kind == OpKind::SX && mover.kind == OpKind::SXdg) ||
                         (earlier.kind == OpKind::SXdg && mover.kind == OpKind::SX);
    CHECK((earlier.kind == mover.kind || sx_pair));
    CHECK(earlier.controls.size() == mover.controls.size());
    const bool same_targets = (earlier.target == mover.target && earlier.target2 == mover.target2) ||
                              (earlier.kind == OpKind::Swap && earlier.target == mover.target2 &&
                               earlier.target2 == mover.target);
    CHECK(same_targets);
    return true;
}

/// The rewriter's shape checks for a kickback with `x` (an X with controls) whose target is a
/// control of `other`: they hold, and the bound is at most the extra op's estimate.
bool shapes_admit(const Op& x, const Op& other, const Op& extra) {
    return passes::wire_role(other, x.target) == passes::WireRole::Z &&
           passes::kickback_kinds(x.kind, uint32_t(x.wires().size()), other.kind) && passes::is_involution(other) &&
           passes::kickback_t_cost_bound(other.kind, uint32_t(other.controls.size()), uint32_t(x.controls.size())) <=
               passes::estimated_t_cost(extra);
}

/// When kickback_move makes a kickback, the checks admit it in one of the two orientations.
bool check_kick(const Op& earlier, const Op& mover) {
    Op extra;
    if (!passes::kickback_move(earlier, mover, extra)) return false;
    CHECK((shapes_admit(earlier, mover, extra) || shapes_admit(mover, earlier, extra)));
    return true;
}

}  // namespace

TEST_CASE("combine rules: the pre-filters are exact and vanishing pairs have the mover's shape") {
    std::mt19937_64 rng(20261202);
    RandomSpec spec;
    spec.max_qubits = 5;
    spec.max_ops = 24;
    spec.echo = 0.5;
    int cancels = 0, merges = 0;
    for (int round = 0; round < 400; ++round) {
        const Circuit c = random_circuit(rng, spec);
        for_each_pair(c, [&](const Op& e, const Op& m) {
            cancels += check_rule(passes::kCancelRule, e, m);
            merges += check_rule(passes::kMergeControlsRule, e, m);
        });
    }
    CHECK(cancels > 1000);
    CHECK(merges > 100);
}

TEST_CASE("kickback: the shape checks and the cost bound admit every kickback kickback_move makes") {
    std::mt19937_64 rng(7);
    RandomSpec spec;
    spec.max_qubits = 5;
    spec.max_ops = 24;
    int kicks = 0;
    for (int round = 0; round < 400; ++round) {
        const Circuit c = random_circuit(rng, spec);
        for_each_pair(c, [&](const Op& e, const Op& m) { kicks += check_kick(e, m); });
    }
    CHECK(kicks > 100);
    // Hand-written: X(t; a & b) meets X(d; t & c). E = X(d; a & b & c), estimated at 2*3 - 3 = 3
    // Toffolis of 7 T (kickback.h), and the bound from the shapes alone is max(2 - 1, 2) = 2
    // controls, one Toffoli: 7 T <= 21 T.
    const Op x = Op::x(3, {Lit::pos(0), Lit::pos(1)});
    const Op other = Op::x(4, {Lit::pos(2), Lit::pos(3)});
    Op extra;
    REQUIRE(passes::kickback_move(x, other, extra));
    CHECK(passes::estimated_t_cost(extra) == 21);
    CHECK(passes::kickback_t_cost_bound(OpKind::X, 2, 2) == 7);
    CHECK(shapes_admit(x, other, extra));
}
