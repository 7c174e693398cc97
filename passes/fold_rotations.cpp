// fold-rotations: the phase-folding engine without AND expansion, for lowered circuits.
#include "passes/fold_rotations.h"

#include "passes/phase_folding.h"

namespace whittle::passes {

PassResult fold_rotations(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    FoldSettings s;
    s.expand_products = false;
    result.changed = fold_phase_terms(c, s, result);
    return result;
}

}  // namespace whittle::passes
