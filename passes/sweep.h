// Both-direction sweeps of the backward rewriter until a fixpoint (shared by cancel, merge-controls, gate-cancel).
#pragma once

#include "passes/backward_rewriter.h"

namespace whittle::passes {

/// Runs rewrite_backwards on the ops, then on the ops read right to left (valid because every
/// commutation and combine rule is an identity that also holds with both sides reversed), and
/// repeats while something changed, at most `max_rounds` rounds. Sets result.changed.
void sweep_both_ways(ir::Circuit& c, const CombineRule& rule, PassResult& result, int max_rounds = 4,
                     RewriteLimits limits = {});

}  // namespace whittle::passes
