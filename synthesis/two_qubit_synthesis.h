// Two-qubit synthesis with the fewest of a target's entangling gates, on top of the KAK decomposition.
#pragma once

#include <vector>

#include "ir/circuit.h"
#include "synthesis/euler.h"
#include "ir/entangler.h"

namespace whittle::lowering {

using ir::Entangler;

struct TwoQubitSynthesis {
    std::vector<ir::Op> ops;  ///< target gates on (a, b), time order
    ir::Angle phase;          ///< global phase to add
    int entanglers = 0;
    double error = 0;         ///< residual of the local matching
};

/// Gates of (entangler, basis) equal to `u` on wires (a, b) (basis index 2*bit(a) + bit(b)) up to
/// the returned phase. Entangler counts: CNOT/CZ 0..3 (min_cnot_count); XX(theta) one per non-zero
/// Weyl coordinate (0..3); iSWAP 0 (local), 1 (iSWAP class), 2 (a zero coordinate), else 3
/// (SWAP times a three-CZ circuit). Each count is the minimum for the gate's Weyl class.
TwoQubitSynthesis synthesize_2q(const ir::Mat4& u, uint32_t a, uint32_t b, Entangler e, OneQubitBasis basis);

/// The entangler count synthesize_2q would use.
int entangler_count(const ir::Mat4& u, Entangler e);

/// The 4x4 matrix of ops on wires (a, b) only (index 2*bit(a) + bit(b)).
ir::Mat4 two_qubit_product(const std::vector<ir::Op>& ops, uint32_t a, uint32_t b);

}  // namespace whittle::lowering
