// Both-direction sweeps of the backward rewriter.
#include "passes/sweep.h"

namespace whittle::passes {

void sweep_both_ways(ir::Circuit& c, const CombineRule& rule, PassResult& result, int max_rounds,
                     RewriteLimits limits) {
    RewriteBuffers buffers;
    for (int round = 0; round < max_rounds; ++round) {
        bool any = rewrite_backwards(c, rule, result, buffers, limits);
        any = rewrite_backwards(c, rule, result, buffers, limits, /*right_to_left=*/true) || any;
        if (!any) return;
        result.changed = true;
    }
}

}  // namespace whittle::passes
