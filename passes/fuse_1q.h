// Pass fuse-1q: each maximal run of one-qubit gates becomes one unitary resynthesized in the target's axes.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Fuses every run of one-qubit gates on a wire (unconditioned, not interrupted by a multi-wire op,
/// measurement or barrier on that wire) and resynthesizes it by the Euler form of opts.target
/// (synthesis/euler.h) when that is cheaper. clifford+t runs stay exact: the fused form is used only
/// when all its angles are multiples of pi/4, else adjacent phases merge and H/X pairs cancel.
/// Without a target the pass does nothing.
PassResult fuse_1q(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
