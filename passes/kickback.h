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
