// cancel: commutation-aware cancellation of inverse pairs and merging of phases and rotations.
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// Moves each op back across the ops it commutes with (commutation.h: diagonal ops with each other
/// and with controls, X-type ops whose targets are not the other's controls, disjoint wires, an X
/// flipping the polarity of a control it is moved across) and combines it with the first op it can
/// (combine_rules.h: inverse pairs vanish, phases on one product add, rotations about one axis add).
/// An op may also cross one op it does not commute with by the kickback identity (kickback.h:
/// X(t; C) across an involution controlled on t leaves a copy of it controlled on C), only when
/// the walk then ends in an inverse pair vanishing (3 ops become 2, e.g. CX(a,b) CX(b,c) CX(a,b) =
/// CX(b,c) CX(a,c)) and the estimated T-cost of the extra op is at most that of the vanished pair
/// (with opts.allow_measurement, a pair into a clean wire is priced as a temporary AND plus a
/// measured erase).
/// Sweeps left to right and right to left (every rule is an identity that also holds read
/// backwards) until nothing changes, at most a few rounds; each sweep is O(n * window). Nested
/// compute/uncompute halves whose middle became empty cancel from the inside out. Leaves the
/// circuit untouched when nothing combines.
PassResult cancel(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
