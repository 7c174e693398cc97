// Both-direction sweeps of the backward rewriter.
#include "passes/sweep.h"

#include <algorithm>

namespace whittle::passes {

void sweep_both_ways(ir::Circuit& c, const CombineRule& rule, PassResult& result, int max_rounds,
                     RewriteLimits limits) {
    for (int round = 0; round < max_rounds; ++round) {
        bool any = rewrite_backwards(c, rule, result, limits);
        std::reverse(c.ops.begin(), c.ops.end());
        any = rewrite_backwards(c, rule, result, limits) || any;
        std::reverse(c.ops.begin(), c.ops.end());
        if (!any) return;
        result.changed = true;
    }
}

}  // namespace whittle::passes
