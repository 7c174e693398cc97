// The pass registry: add a pass by adding its header and one line here.
#include "passes/registry.h"

#include "passes/cancel.h"
#include "passes/fold_phases.h"
#include "passes/fold_rotations.h"
#include "passes/gate_cancel.h"
#include "passes/merge_controls.h"
#include "passes/normalize.h"

namespace whittle::passes {

const std::vector<PassInfo>& all_passes() {
    static const std::vector<PassInfo> passes = {
        // High-level passes (on multi-controlled ops and phase polynomials).
        {"normalize", "canonical forms: sorted literals, diagonal gates as phases, zero angles dropped", Stage::HighLevel,
         normalize},
        {"cancel", "commutation-aware cancellation of inverse pairs, merging of phases and rotations", Stage::HighLevel,
         cancel},
        {"merge-controls", "op under C&x and C&!x -> op under C; the control split that cancels", Stage::HighLevel,
         merge_controls},
        {"fold-phases", "phase folding over Boolean polynomials, AND terms expanded where it pays", Stage::HighLevel,
         fold_phases},
        // Lowering steps, then the low-level passes.
        {"gate-cancel", "CNOT, H and one-qubit inverse pairs across commuting gates (kinds kept)", Stage::LowLevel,
         gate_cancel},
        {"fold-rotations", "rotation merging over parities on the lowered circuit, across H with path variables",
         Stage::LowLevel, fold_rotations},
    };
    return passes;
}

const PassInfo* find_pass(std::string_view name) {
    for (const PassInfo& p : all_passes())
        if (name == p.name) return &p;
    return nullptr;
}

}  // namespace whittle::passes
