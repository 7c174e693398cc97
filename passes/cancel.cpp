// cancel: both-way sweeps of the backward rewriter with the inverse-pair and merge rule, kickbacks allowed.
#include "passes/cancel.h"

#include "passes/combine_rules.h"
#include "passes/sweep.h"

namespace whittle::passes {

PassResult cancel(ir::Circuit& c, const PassOptions& opts) {
    PassResult result;
    RewriteLimits limits;
    limits.kickback = true;
    limits.measured_erase = opts.allow_measurement;
    sweep_both_ways(c, kCancelRule, result, 4, limits);
    return result;
}

}  // namespace whittle::passes
