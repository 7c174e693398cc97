// Pass resynth-2q: maximal two-qubit blocks resynthesized by KAK with the target's fewest entanglers.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Gathers maximal blocks of gates acting only on one pair of wires (with the one-qubit gates
/// around them) in one scan, and replaces a block by its KAK synthesis (synthesis/two_qubit_synthesis.h)
/// when that has fewer two-qubit gates, or as many and fewer gates. Runs for the rotation targets
/// (cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, u+cx); clifford+t and nct keep their exact gates.
PassResult resynth_2q(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
