// Pass split-work-lives: a clean work wire back at |0> mid-circuit starts a new wire.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Where a clean work wire is provably back at |0> between two of its ops (its value on every basis
/// input, tracked as a Boolean polynomial while only X-type and diagonal ops touch it, is 0), the
/// ops after that point move to a fresh clean wire; only wires whose value after their last op is
/// provably 0 too are split, so the pass relies on no promise of the program. A routine's work wires that the front end
/// handed from one call to the next, and a constant register loaded and unloaded around each of
/// several uses, become one wire per life, which share-work-wires can then pack around the other
/// lives (run before lowering, while the ops are still classical on those wires). Registers with a
/// measured or reset wire stay as they are. Each new wire is a register of its own, named `work`,
/// `work_1`, `work_2`, ... (skipping names in use).
PassResult split_work_lives(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
