// Kickback identity and the T-cost estimate that decides when it pays (see kickback.h).
#include "passes/kickback.h"

#include <algorithm>

#include "passes/commutation.h"

namespace whittle::passes {

using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

/// The kinds is_involution can hold for (a Phase only with angle pi).
bool involution_kind(OpKind k) {
    return k == OpKind::X || k == OpKind::Y || k == OpKind::H || k == OpKind::Swap || k == OpKind::Phase;
}

uint64_t toffoli_chain_t(size_t controls) { return controls < 2 ? 0 : 7 * (2 * uint64_t(controls) - 3); }

/// estimated_t_cost of an op of kind `kind` with `k` controls (`involution`: is_involution holds).
uint64_t t_cost_of(OpKind kind, size_t k, bool involution) {
    switch (kind) {
    case OpKind::X:
    case OpKind::Y: return toffoli_chain_t(k);
    case OpKind::Phase: return involution && k > 0 ? toffoli_chain_t(k - 1) : 0;
    case OpKind::H:
    case OpKind::Swap: return k == 0 ? 0 : toffoli_chain_t(k + 1);
    default: return 0;
    }
}

/// `x` = X(t; C), `other` = B controlled on t (see kickback_move): whether they form a kickback
/// pair whose E is not the identity. On true, `at` is the index of B's control on t and `controls`
/// E's number of controls (B's without the one on t, plus those of C on other wires).
bool kick_shape(const Op& x, const Op& other, size_t& at, size_t& controls) {
    if (x.kind != OpKind::X || x.controls.empty() || !is_involution(other)) return false;
    const uint32_t t = x.target;
    if (other.target == t || other.target2 == t) return false;
    int found_at = -1;
    for (size_t i = 0; i < other.controls.size(); ++i)
        if (other.controls[i].wire() == t) {
            if (found_at >= 0) return false;
            found_at = int(i);
        }
    if (found_at < 0) return false;
    at = size_t(found_at);
    for (Lit c : x.controls)
        if (c.wire() == other.target || c.wire() == other.target2) return false;
    // x's controls are on distinct wires, none of them t, so only B's can already hold a wire.
    controls = other.controls.size() - 1;
    for (Lit c : x.controls) {
        bool shared = false;
        for (size_t i = 0; i < other.controls.size(); ++i) {
            if (i == at || other.controls[i].wire() != c.wire()) continue;
            if (other.controls[i] != c) return false;  // D & C is never true: E is the identity (and A, B were orthogonal)
            shared = true;
            break;
        }
        if (!shared) ++controls;
    }
    return true;
}

/// On success `extra` = E (see kick_shape).
bool kick(const Op& x, const Op& other, Op& extra) {
    size_t at = 0, controls = 0;
    if (!kick_shape(x, other, at, controls)) return false;
    extra = other;
    extra.pair = 0;
    extra.half = ir::PairHalf::None;
    extra.controls.erase(extra.controls.begin() + std::ptrdiff_t(at));
    for (Lit c : x.controls)
        if (std::none_of(extra.controls.begin(), extra.controls.end(), [&](Lit l) { return l.wire() == c.wire(); }))
            extra.controls.push_back(c);
    std::sort(extra.controls.begin(), extra.controls.end());
    return true;
}

}  // namespace

bool kickback_move(const Op& earlier, const Op& mover, Op& extra) {
    if (is_fence(earlier) || is_fence(mover)) return false;
    return kick(earlier, mover, extra) || kick(mover, earlier, extra);
}

bool kickback_cost(const Op& earlier, const Op& mover, uint64_t& extra_t_cost) {
    if (is_fence(earlier) || is_fence(mover)) return false;
    size_t at = 0, k = 0;
    const Op* other = &mover;
    if (!kick_shape(earlier, mover, at, k)) {
        if (!kick_shape(mover, earlier, at, k)) return false;
        other = &earlier;
    }
    extra_t_cost = t_cost_of(other->kind, k, other->kind == OpKind::Phase && is_involution(*other));
    return true;
}

bool is_involution(const Op& op) {
    static const ir::Angle kPi = ir::Angle::pi_times(1);
    if (op.kind == OpKind::Phase) return op.angle == kPi;
    return involution_kind(op.kind);
}

bool kickback_kinds(OpKind x_kind, uint32_t x_wires, OpKind other_kind) {
    return x_kind == OpKind::X && x_wires >= 2 && involution_kind(other_kind);
}

uint64_t kickback_t_cost_bound(OpKind other_kind, uint32_t other_controls, uint32_t x_controls) {
    const size_t k = std::max(other_controls > 0 ? other_controls - 1 : 0, x_controls);
    switch (other_kind) {
    case OpKind::X:
    case OpKind::Y: return toffoli_chain_t(k);
    case OpKind::H:
    case OpKind::Swap: return toffoli_chain_t(k + 1);
    default: return 0;
    }
}

uint64_t estimated_t_cost(const Op& op) {
    return t_cost_of(op.kind, op.controls.size(), op.kind == OpKind::Phase && is_involution(op));
}

uint64_t estimated_measured_pair_t_cost(const Op& x) {
    const size_t k = x.controls.size();
    return k < 2 ? 0 : 4 * (uint64_t(k) - 1);
}

}  // namespace whittle::passes
