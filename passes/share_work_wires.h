// Pass share-work-wires: clean work wires whose lives do not overlap share one output wire.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Gives clean work wires (`ancilla` registers and the compiler's own clean wires) with disjoint
/// lives one output wire, so the output holds as many work wires as are ever live at once. A wire
/// lives from its first op to its last; it is back at |0> after its last op (the ancilla contract,
/// which the checker proves on the whole program), so a later wire may start there. Every op stays
/// as it was, only its work wires are renamed: T and two-qubit counts never change. Two lives are
/// disjoint when one ends before the other starts in the op list; with `--optimize-for depth` also
/// in a layer schedule of the circuit, so that depth never grows either (otherwise it may).
/// Registers with a measured or reset wire keep their own wires. The shared wires form one
/// register: named as the one register it replaces when the others are `work` registers cut from it
/// by split-work-lives and it keeps its size, else `work` (or `work_2`, ... if taken); unused work
/// wires go, as in drop-idle-wires.
PassResult share_work_wires(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
