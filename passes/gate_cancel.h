// gate-cancel: low-level cancellation of CNOT, H and one-qubit gate pairs across commuting gates.
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// For lowered circuits: CNOT pairs, H pairs and inverse one-qubit pairs (S S-dagger, T T-dagger,
/// X X, SX SX-dagger) vanish across the gates they commute with; phases and rotations about one
/// axis merge, keeping their kinds (an RZ stays an RZ), so the circuit stays in the target's gate
/// set. Same rules as cancel (commutation.h, combine_rules.h) with a wider window, since lowered
/// circuits are several times longer. One-qubit fusion by Euler synthesis is fuse-1q's job.
/// Leaves the circuit untouched when nothing cancels.
PassResult gate_cancel(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
