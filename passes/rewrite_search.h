// Pass rewrite-search: the target's identity library (rules/library) applied by a cost-guided search.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Matches the rules of the target's library (docs/rules.md) on the circuit's dependency graph: a
/// rule side matches ops that need not be adjacent when every op between them commutes with the
/// later matched ops (passes/commutation.h), so the match can be gathered into one block. The
/// search descends greedily by rules that lower the cost (the metric, then two-qubit gates, then
/// gates), then runs rounds that each start from the best circuit so far, apply a few rewrites
/// that keep or raise the cost, and descend again (iterated local search); it keeps the best.
/// Budget: `PassOptions::rewrite_effort` (0 = off) scales the rounds (32 per unit), the rewrites
/// (4000 per unit) and the match attempts (150000 per unit), with a time cap of 1 s per unit that a
/// normal run does not reach (a note says when it did); the random choices use a fixed seed, so the
/// result is deterministic. The circuit is replaced only when
/// the result is strictly cheaper and not worse in the chosen metric (ir::count_resources). Rules
/// hold up to global phase; each rewrite adds the phase between its two sides (from their
/// unitaries, snapped to an exact angle where close) to `Circuit::global_phase`.
PassResult rewrite_search(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
