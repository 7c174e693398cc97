// Commutation rules shared by cancel, merge-controls and gate-cancel.
#include "passes/commutation.h"

#include <algorithm>

namespace whittle::passes {

using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

WireRole target_role(OpKind k) {
    switch (k) {
    case OpKind::X:
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::RX: return WireRole::X;
    case OpKind::Y:
    case OpKind::RY: return WireRole::Y;
    case OpKind::H: return WireRole::H;
    case OpKind::RZ:
    case OpKind::Phase:
    case OpKind::Parity: return WireRole::Z;
    case OpKind::U:
    case OpKind::Swap:
    case OpKind::ISwap:
    case OpKind::XX:
    case OpKind::R:
    case OpKind::Measure:
    case OpKind::Reset:
    case OpKind::Barrier: return WireRole::Other;
    }
    return WireRole::Other;
}

/// Calls f on every wire of op, in the order of Op::wires.
template <class F>
void for_each_wire(const Op& op, F&& f) {
    if (op.target != ir::kNoWire) f(op.target);
    if (op.target2 != ir::kNoWire) f(op.target2);
    for (Lit l : op.controls) f(l.wire());
}

bool is_uncontrolled_x(const Op& op) {
    return op.kind == OpKind::X && op.controls.empty() && !op.is_conditioned();
}

/// Ops whose controls (or Phase literals) are projectors: identity unless every literal holds.
bool literals_are_projectors(const Op& op) {
    return op.kind != OpKind::Parity && op.kind != OpKind::Barrier;
}

bool orthogonal(const Op& a, const Op& b) {
    if (!literals_are_projectors(a) || !literals_are_projectors(b)) return false;
    for (Lit la : a.controls)
        for (Lit lb : b.controls)
            if (la == lb.flipped()) return true;
    return false;
}

}  // namespace

WireRole wire_role(const Op& op, uint32_t wire) {
    if (op.target == wire) return target_role(op.kind);
    if (op.target2 == wire) return target_role(op.kind);
    for (Lit l : op.controls)
        if (l.wire() == wire) return op.kind == OpKind::Barrier ? WireRole::Other : WireRole::Z;
    return WireRole::None;
}

bool is_fence(const Op& op) {
    return op.is_conditioned() || op.kind == OpKind::Measure || op.kind == OpKind::Reset ||
           op.kind == OpKind::Barrier;
}

bool has_projector_literal(const Op& op, Lit lit) {
    if (!literals_are_projectors(op)) return false;
    return std::find(op.controls.begin(), op.controls.end(), lit) != op.controls.end();
}

bool same_literals(const ir::LitVec& a, const ir::LitVec& b) {
    if (a.size() != b.size()) return false;
    if (std::equal(a.begin(), a.end(), b.begin())) return true;
    ir::LitVec sa = a, sb = b;
    std::sort(sa.begin(), sa.end());
    std::sort(sb.begin(), sb.end());
    return std::equal(sa.begin(), sa.end(), sb.begin());
}

namespace {

/// move_before's cases that leave the mover as it is (everything but an uncontrolled X earlier).
bool commutes_as_is(const Op& earlier, const Op& mover) {
    bool roles_agree = true;
    for_each_wire(mover, [&](uint32_t w) {
        if (!roles_agree) return;
        const WireRole a = wire_role(earlier, w);
        if (a == WireRole::None) return;
        const WireRole b = wire_role(mover, w);
        if (a != b || a == WireRole::Other) roles_agree = false;
    });
    return roles_agree || orthogonal(earlier, mover);
}

}  // namespace

bool move_before_not(uint32_t w, Op& mover, ir::Angle& global) {
    if (mover.target == w || mover.target2 == w) {
        if (wire_role(mover, w) == WireRole::X) return true;
        if (mover.kind == OpKind::RZ && mover.controls.empty()) {
            if (!mover.angle.is_zero()) global += ir::Angle::pi_times(1);
            mover.angle = -mover.angle;
            return true;
        }
        return false;
    }
    if (mover.kind == OpKind::Parity) {
        global += mover.angle;
        mover.angle = -mover.angle;
        return true;
    }
    if (mover.kind == OpKind::Barrier) return false;
    for (Lit& l : mover.controls)
        if (l.wire() == w) {
            l = l.flipped();
            return true;
        }
    return false;
}

bool rewrites_mover(const Op& earlier) { return is_uncontrolled_x(earlier); }

bool commutes_unchanged(const Op& earlier, const Op& mover) {
    if (is_fence(earlier) || is_fence(mover)) return false;
    return commutes_as_is(earlier, mover);
}

bool move_before(const Op& earlier, Op& mover, ir::Angle& global) {
    if (is_fence(earlier) || is_fence(mover)) return false;
    if (!is_uncontrolled_x(earlier)) return commutes_as_is(earlier, mover);
    // The mover's wires are walked in place (no list is built: this runs once per step of every walk).
    bool shares = false;
    for_each_wire(mover, [&](uint32_t w) { shares = shares || wire_role(earlier, w) != WireRole::None; });
    if (!shares) return true;
    return move_before_not(earlier.target, mover, global);  // it changes nothing when it returns false
}

}  // namespace whittle::passes
