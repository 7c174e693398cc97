// Moving Hadamards out of the way of Hadamard-free regions: CNOT stretches between H gates change frame.
#pragma once

#include <cstddef>

#include "ir/circuit.h"

namespace whittle::tcount {

/// A wire's segment is its ops between two plain H gates (or the circuit's ends). When a set of
/// segments holds only CNOTs among themselves, X and Z, conjugating all of them by H leaves the
/// circuit the same: (H x H) CNOT(a, b) (H x H) = CNOT(b, a), H X H = Z, H Z H = X (textbook
/// identities, practice). The H gates on the segments' ends then meet the bounding ones and
/// cancel; at the circuit's ends one H appears instead. Flips the sets where that removes H gates,
/// so that the phase gates on both sides of such a stretch fall into one Hadamard-free region (the
/// lowered GF(2^n) multipliers: each product wire is in the H frame during its Toffolis and takes
/// the reduction CNOTs in between). Returns the number of H gates removed (0: circuit untouched).
size_t exchange_hadamard_frames(ir::Circuit& c);

}  // namespace whittle::tcount
