// The combine rules of the backward rewriter: inverse pairs and merges (cancel) and control merging.
#pragma once

#include "ir/circuit.h"
#include "passes/backward_rewriter.h"

namespace whittle::passes {

/// Inverse pairs vanish (X, Y, H, Swap with equal controls; SX against SXdg); phases on the same
/// product or parity add; rotations about one axis on the same target and controls add (a stored
/// angle sum past 2*pi adds pi to the global phase when uncontrolled; controlled, it is left alone
/// since R(a + 2*pi) = -R(a) would need an extra phase on the controls). Ops keep their kinds.
Combined cancel_rule(ir::Op& earlier, const ir::Op& mover, ir::Angle& global, std::vector<uint32_t>& added_wires,
                     PassResult& result);

/// The same X-type or phase op under C&x and under C&!x is that op under C; X(t; C) and X(t; C&x)
/// make X(t; C&!x); Phase(a; C) and Phase(-a; C&x) make Phase(a; C&!x) (the split that cancels; only for non-empty C, since
/// X(t) X(t; x) = X(t; !x) would trade two ops for a negative control that lowers to three).
Combined merge_controls_rule(ir::Op& earlier, const ir::Op& mover, ir::Angle& global,
                             std::vector<uint32_t>& added_wires, PassResult& result);

/// cancel_rule with its pre-filter (a pair can combine only when it has one kind, or is SX and SXdg,
/// and the same wires).
extern const CombineRule kCancelRule;

/// merge_controls_rule with its pre-filter (one kind, X or Phase, and wire sets that are equal or
/// differ by one wire).
extern const CombineRule kMergeControlsRule;

/// Adds rotation angle `b` to `a` (both stored in [0, 2*pi)); true when the true sum reached 2*pi,
/// i.e. R(a) R(b) = -R(a + b) with the stored, reduced sum.
bool add_rotation_angle(ir::Angle& a, const ir::Angle& b);

}  // namespace whittle::passes
