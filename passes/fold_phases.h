// fold-phases: phase folding over Boolean polynomials on the high-level circuit, AND terms included.
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// Merges phase terms (multi-controlled phases on products of literals, parity phases, RZ) whose
/// Boolean polynomials over the inputs and path variables are equal into their first occurrence,
/// and expands AND terms into parity terms where that lowers the non-Clifford cost (see
/// phase_folding.h for the method: Amy, Maslov, Mosca 2014, arXiv:1303.2042, generalized to AND
/// terms). Leaves the circuit untouched when no two terms merge.
PassResult fold_phases(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
