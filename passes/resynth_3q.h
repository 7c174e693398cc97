// Pass resynth-3q: three-qubit blocks resynthesized numerically with fewer entanglers (synthesis/block_synthesis.h).
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Cuts the lowered circuit greedily along the op order into blocks of gates on at most three
/// wires; for each three-wire block with at least three two-qubit gates, computes its unitary and
/// searches (lowering::synthesize_block, counted budget) for a circuit in the target's gates with
/// strictly fewer two-qubit gates within distance 1e-8 (Frobenius, up to phase); a found circuit
/// replaces the block and its distance is added to PassResult::error_bound. Results are cached by
/// block unitary. Runs for the rotation targets; PassOptions::resynth_effort scales the budget
/// (0 counts as 1 here; the -O3 pipeline adds the pass only when it is above 0).
PassResult resynth_3q(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
