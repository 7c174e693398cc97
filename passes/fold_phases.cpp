// fold-phases: the phase-folding engine with AND-term expansion.
#include "passes/fold_phases.h"

#include "passes/phase_folding.h"

namespace whittle::passes {

PassResult fold_phases(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    FoldSettings s;
    s.expand_products = true;
    // An expansion can make parities that expose further merges and expansions: a few rounds.
    s.rounds = 4;
    result.changed = fold_phase_terms(c, s, result);
    return result;
}

}  // namespace whittle::passes
