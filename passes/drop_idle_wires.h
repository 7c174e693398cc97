// Pass drop-idle-wires: work wires no op touches leave the output.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Removes the `ancilla` and `borrow` wires that no op touches (a barrier alone does not count as
/// a use): a register whose wires are all idle goes away, and a register keeps its wires up to the
/// last one used (the wires after it go; an idle wire before a used one stays, so every remaining
/// wire keeps its register and index). Data wires always stay. Wire indices of the ops are renumbered.
PassResult drop_idle_wires(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
