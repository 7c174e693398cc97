// The kickback identity: an X on a wire moved across an op controlled by that wire leaves a copy of that op.
#pragma once

#include <cstdint>

#include "ir/circuit.h"

namespace whittle::passes {

/// Kickback (Nielsen & Chuang ch. 4; practice): for A = X(t; C) with C non-empty and B an
/// involution (X, Y, H, Swap with any controls, or a Phase of pi) controlled on a literal of t,
/// with no wire of C a target of B:
///     A ; B = B ; A ; E   and   B ; A = A ; B ; E,   E = B with its literal on t replaced by C,
/// since B's control reads t ^ C after A and U^(D & (t ^ C)) = U^(D & t) U^(D & C) for U^2 = I.
/// E commutes with A and with B, so it can sit right after `earlier`. On true, `extra` is E; the
/// mover is unchanged. False when neither is such an A/B pair (or E would be the identity).
bool kickback_move(const ir::Op& earlier, const ir::Op& mover, ir::Op& extra);

/// kickback_move without building E: true exactly when kickback_move is, and then `extra_t_cost`
/// is estimated_t_cost of the E it would build (a walk prices most kickbacks and keeps few).
bool kickback_cost(const ir::Op& earlier, const ir::Op& mover, uint64_t& extra_t_cost);

/// The ops a kickback can cross: X, Y, H, Swap (any controls) and a Phase of pi.
bool is_involution(const ir::Op& op);

/// A cheap necessary condition for a kickback between an op of kind `x_kind` touching `x_wires`
/// wires whose target is a control of an op of kind `other_kind`: the first must be an X with
/// controls and the second of an involution kind. False means kickback_move is false for every such pair.
bool kickback_kinds(ir::OpKind x_kind, uint32_t x_wires, ir::OpKind other_kind);

/// A lower bound of estimated_t_cost of the op kickback_move adds when X(t; C) with |C| =
/// `x_controls` meets an involution of kind `other_kind` with `other_controls` controls (one on
/// t): that op has `other_kind` and at least max(other_controls - 1, x_controls) controls. A Phase
/// is bounded by 0 (its angle decides whether it is priced at all).
uint64_t kickback_t_cost_bound(ir::OpKind other_kind, uint32_t other_controls, uint32_t x_controls);

/// A monotone estimate of the T-count an op lowers to, for deciding whether a kickback pays: a
/// k-control X (or Y, or a Phase of pi on k + 1 literals) as the 2k - 3 Toffolis of a clean V-chain
/// at 7 T each (CHECKS.md: V-chain, practice; Toffoli 7 T, Gosset et al. 2014, arXiv:1308.4134),
/// H and Swap with k >= 1 controls as X with k + 1, and 0 for every other op (so a pair of those
/// never seems to pay for an extra op).
uint64_t estimated_t_cost(const ir::Op& op);

/// The estimate for an X op with k >= 2 controls into a clean wire and its inverse when measurement
/// is allowed: k - 1 temporary ANDs at 4 T to compute and a measured erase at 0 T (Gidney 2018,
/// arXiv:1709.06648), i.e. 4(k - 1).
uint64_t estimated_measured_pair_t_cost(const ir::Op& x);

}  // namespace whittle::passes
