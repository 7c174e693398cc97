// fold-rotations: rotation merging over parities on the lowered circuit (CNOT + phase regions, across H).
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// On a lowered circuit: every wire's value is a parity (a polynomial, when the target keeps
/// Toffolis) of inputs and path variables introduced at H and the other one-qubit gates; phase
/// gates and z-rotations on equal parities merge into the first one, keeping its kind, so the
/// output stays in the target's gate set (Nam, Ross, Su, Childs, Maslov 2018, arXiv:1710.07345,
/// rotation merging; engine in phase_folding.h). No AND expansion. Leaves the circuit untouched
/// when nothing merges.
PassResult fold_rotations(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
