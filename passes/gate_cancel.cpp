// gate-cancel: both-way sweeps of the backward rewriter with the cancel rule and a wide window.
#include "passes/gate_cancel.h"

#include "passes/combine_rules.h"
#include "passes/sweep.h"

namespace whittle::passes {

PassResult gate_cancel(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    RewriteLimits limits;
    limits.window = 256;
    sweep_both_ways(c, kCancelRule, result, 6, limits);
    return result;
}

}  // namespace whittle::passes
