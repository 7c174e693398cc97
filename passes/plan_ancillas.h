// Pass plan-ancillas: reports, per multi-controlled op, how many clean and borrowable wires are free there.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Counts, for every op with three or more wires of controls and targets, the clean wires provably
/// at |0> there (lowering::CleanWireTracker) and the wires it could borrow (any wire it does not
/// touch), and notes one line per op. Never changes the circuit; lower-controls recomputes the same
/// plan from the same tracker as it lowers.
PassResult plan_ancillas(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
