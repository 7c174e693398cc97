// cancel: both-way sweeps of the backward rewriter with the inverse-pair and merge rule.
#include "passes/cancel.h"

#include "passes/combine_rules.h"
#include "passes/sweep.h"

namespace whittle::passes {

PassResult cancel(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    sweep_both_ways(c, cancel_rule, result);
    return result;
}

}  // namespace whittle::passes
