// Pass pair-uncompute: finds undeclared compute/uncompute pairs of Toffolis and MCX and tags them.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// A Toffoli/MCX into wire w, later repeated exactly (same controls) while in between w was used
/// only as a control or in diagonal ops and its controls were not written, is a compute/uncompute
/// pair: both get a fresh pair id (PairHalf::Compute / Uncompute). Ops already in a pair are left
/// alone. Linear time: one open candidate per wire and the index of each wire's last write.
PassResult pair_uncompute(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
