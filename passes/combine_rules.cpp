// Combine rules: inverse pairs, phase and rotation merges, control merging and splitting.
#include "passes/combine_rules.h"

#include <algorithm>
#include <cmath>

#include "passes/commutation.h"

namespace whittle::passes {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

constexpr double kTwoPi = 6.283185307179586476925286766559;

bool same_targets(const Op& a, const Op& b) {
    if (a.target == b.target && a.target2 == b.target2) return true;
    return a.kind == OpKind::Swap && a.target == b.target2 && a.target2 == b.target;
}

/// When `a` and `b` have the same wires and differ in the polarity of exactly one literal, its index in `a`.
int single_polarity_difference(const ir::LitVec& a, const ir::LitVec& b) {
    if (a.size() != b.size()) return -1;
    int diff = -1;
    for (size_t i = 0; i < a.size(); ++i) {
        auto it = std::find_if(b.begin(), b.end(), [&](Lit l) { return l.wire() == a[i].wire(); });
        if (it == b.end()) return -1;
        if (*it == a[i]) continue;
        if (diff >= 0) return -1;
        diff = int(i);
    }
    return diff;
}

/// When `big` is `small` plus exactly one literal, that literal.
bool one_extra_literal(const ir::LitVec& small, const ir::LitVec& big, Lit& extra) {
    if (big.size() != small.size() + 1) return false;
    int found = 0;
    for (Lit l : big) {
        if (std::find(small.begin(), small.end(), l) != small.end()) continue;
        extra = l;
        ++found;
    }
    return found == 1;
}

}  // namespace

bool add_rotation_angle(Angle& a, const Angle& b) {
    bool wrapped;
    if (a.is_exact() && b.is_exact()) {
        const __int128 lhs = __int128(a.num()) * b.den() + __int128(b.num()) * a.den();
        wrapped = lhs >= __int128(2) * a.den() * b.den();
    } else {
        wrapped = a.to_radians() + b.to_radians() >= kTwoPi - 1e-12;
    }
    a = a + b;
    return wrapped;
}

Combined cancel_rule(Op& e, const Op& m, Angle& global, std::vector<uint32_t>&, PassResult& result) {
    const bool sx_pair = (e.kind == OpKind::SX && m.kind == OpKind::SXdg) ||
                         (e.kind == OpKind::SXdg && m.kind == OpKind::SX);
    if (e.kind != m.kind && !sx_pair) return Combined::No;
    if (!same_targets(e, m) || !same_literals(e.controls, m.controls)) return Combined::No;
    if (sx_pair) {
        result.count("inverse-pairs");
        return Combined::Vanished;
    }
    switch (e.kind) {
    case OpKind::X:
    case OpKind::Y:
    case OpKind::H:
    case OpKind::Swap:
        result.count("inverse-pairs");
        return Combined::Vanished;
    case OpKind::Phase:
    case OpKind::Parity:
        e.angle += m.angle;
        if (e.angle.is_zero()) {
            result.count("phases-cancelled");
            return Combined::Vanished;
        }
        result.count("phases-merged");
        return Combined::Absorbed;
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ: {
        Angle sum = e.angle;
        const bool wrapped = add_rotation_angle(sum, m.angle);
        if (wrapped && !e.controls.empty()) return Combined::No;
        if (wrapped) global += Angle::pi_times(1);
        e.angle = sum;
        if (sum.is_zero()) {
            result.count("rotations-cancelled");
            return Combined::Vanished;
        }
        result.count("rotations-merged");
        return Combined::Absorbed;
    }
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::U:
    case OpKind::ISwap:
    case OpKind::XX:
    case OpKind::R:
    case OpKind::Measure:
    case OpKind::Reset:
    case OpKind::Barrier: return Combined::No;
    }
    return Combined::No;
}

Combined merge_controls_rule(Op& e, const Op& m, Angle& global, std::vector<uint32_t>& added_wires,
                             PassResult& result) {
    if (e.kind != m.kind || (e.kind != OpKind::X && e.kind != OpKind::Phase)) return Combined::No;
    if (e.target != m.target) return Combined::No;
    const bool x = e.kind == OpKind::X;
    // Merge: op(C & l) and op(C & !l) -> op(C). A Phase needs at least one literal left.
    int d = single_polarity_difference(e.controls, m.controls);
    if (d >= 0 && !x && e.angle == m.angle && e.controls.size() == 1) {
        global += e.angle;  // e^{it x} e^{it (1-x)} = e^{it}
        result.count("controls-merged");
        return Combined::Vanished;
    }
    if (d >= 0 && (x || e.angle == m.angle)) {
        e.controls.erase(e.controls.begin() + d);
        result.count("controls-merged");
        return Combined::Absorbed;
    }
    // Split that cancels: op(C) with op(C & l) (either order) -> op(C & !l). Not for an empty C:
    // X(t) X(t; l) = X(t; !l) trades two ops for a negative control, which lowers to three.
    Lit extra;
    if (std::min(e.controls.size(), m.controls.size()) == 0) return Combined::No;
    if (one_extra_literal(e.controls, m.controls, extra)) {
        if (!x && !(e.angle + m.angle).is_zero()) return Combined::No;
        e.controls.push_back(extra.flipped());
        std::sort(e.controls.begin(), e.controls.end());
        added_wires.push_back(extra.wire());
        result.count("controls-split");
        return Combined::Absorbed;
    }
    if (one_extra_literal(m.controls, e.controls, extra)) {
        if (!x && !(e.angle + m.angle).is_zero()) return Combined::No;
        // e = op(C & l), m = op(C) (phase: m's angle is -e's): the result is e's op under C & !l,
        // with the angle of the unconditioned one.
        for (Lit& l : e.controls)
            if (l == extra) l = extra.flipped();
        if (!x) e.angle = m.angle;
        std::sort(e.controls.begin(), e.controls.end());
        result.count("controls-split");
        return Combined::Absorbed;
    }
    return Combined::No;
}

namespace {

bool cancel_may_combine(OpShape e, OpShape m, uint32_t shared) {
    const bool sx_pair = (e.kind == OpKind::SX && m.kind == OpKind::SXdg) ||
                         (e.kind == OpKind::SXdg && m.kind == OpKind::SX);
    // same_targets and same_literals: the same wire set.
    return (e.kind == m.kind || sx_pair) && e.wires == m.wires && shared == m.wires;
}

bool merge_controls_may_combine(OpShape e, OpShape m, uint32_t shared) {
    if (e.kind != m.kind || (e.kind != OpKind::X && e.kind != OpKind::Phase)) return false;
    // A merge needs one wire set; a split needs one set to be the other plus one wire.
    if (e.wires == m.wires) return shared == m.wires;
    return (e.wires == m.wires + 1 || m.wires == e.wires + 1) && shared == std::min(e.wires, m.wires);
}

}  // namespace

const CombineRule kCancelRule{cancel_rule, cancel_may_combine};
const CombineRule kMergeControlsRule{merge_controls_rule, merge_controls_may_combine};

}  // namespace whittle::passes
