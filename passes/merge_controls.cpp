// merge-controls: both-way sweeps of the backward rewriter with the control merge/split rule.
#include "passes/merge_controls.h"

#include "passes/combine_rules.h"
#include "passes/sweep.h"

namespace whittle::passes {

PassResult merge_controls(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    sweep_both_ways(c, kMergeControlsRule, result);
    return result;
}

}  // namespace whittle::passes
