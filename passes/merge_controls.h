// merge-controls: the same op under C&x and C&!x becomes the op under C, and the split that cancels.
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// For X-type and phase ops that meet across commuting ops (as in cancel): op(C & x) with
/// op(C & !x) becomes op(C); X(t; C) with X(t; C & x) becomes X(t; C & !x), and Phase(a; C) with
/// Phase(-a; C & x) becomes Phase(a; C & !x) (the converse split, used only when it removes an
/// op and C is not empty). Sweeps in both directions until nothing changes. Leaves the circuit untouched when nothing merges.
PassResult merge_controls(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
