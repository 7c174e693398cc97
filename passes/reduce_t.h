// reduce-t: T-count reduction beyond phase folding on the lowered circuit (TODD on Hadamard-free regions).
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// On a circuit lowered to H / CNOT / phase form (before to-target): the T-count engine of
/// tcount/engine.h. CNOT stretches between Hadamards change frame where that removes H gates;
/// each Hadamard-free region's T terms are reduced by third-order duplicate-then-destroy (Heyfron,
/// Campbell 2018, arXiv:1712.01557), the exact Clifford difference is added back, and the region
/// is resynthesized by a Gray-code parity network (Amy, Azimzadeh, Mosca 2018, arXiv:1712.01859).
/// A region is replaced only when it gets fewer T gates, or as many and fewer CNOTs (with
/// --optimize-for other than t: fewer T only when the CNOTs do not grow). -O2 runs it with smaller
/// regions and effort caps than -O3 and rebuilds only regions whose T-count falls. Leaves the
/// circuit untouched when nothing improves.
PassResult reduce_t(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
