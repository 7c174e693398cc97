// fold-phases: the phase-folding engine with AND-term expansion.
#include "passes/fold_phases.h"

#include "passes/phase_folding.h"

namespace whittle::passes {

PassResult fold_phases(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    FoldSettings s;
    s.expand_products = true;
    // An expansion can make parities that expose further merges and expansions: repeat a few rounds.
    for (int round = 0; round < 4 && fold_phase_terms(c, s, result); ++round) result.changed = true;
    return result;
}

}  // namespace whittle::passes
