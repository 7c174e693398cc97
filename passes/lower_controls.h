// Pass lower-controls: multi-controlled ops to Toffolis, CNOTs, CZ/CCZ and one-qubit gates.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Lowers every op with more controls than a Toffoli (MCX, multi-controlled phases, controlled
/// one-qubit gates, controlled swaps, parities) by the construction the free wires allow at that op
/// (lowering::ControlLowerer: V-chain, Barenco dirty chains, the one-wire split, the ancilla-free
/// recursion, ABC). With opts.extra_ancillas > 0 adds up to that many clean wires (register `work`)
/// when some op would use them. Notes name the construction per op; stats count them.
PassResult lower_controls(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
