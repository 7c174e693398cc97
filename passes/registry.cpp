// The pass registry: add a pass by adding its header and one line here.
#include "passes/registry.h"

#include "passes/fuse_1q.h"
#include "passes/lower_controls.h"
#include "passes/lower_toffoli.h"
#include "passes/pair_uncompute.h"
#include "passes/plan_ancillas.h"
#include "passes/resynth_2q.h"
#include "passes/to_target.h"

namespace whittle::passes {

const std::vector<PassInfo>& all_passes() {
    static const std::vector<PassInfo> passes = {
        // High-level passes (on multi-controlled ops and phase polynomials) go here,
        // then the lowering steps, then the low-level passes.
        {"pair-uncompute", "tag undeclared compute/uncompute pairs of Toffolis and MCX", Stage::HighLevel,
         pair_uncompute},
        {"plan-ancillas", "report the clean and borrowable wires free at each multi-controlled op", Stage::HighLevel,
         plan_ancillas},
        {"lower-controls", "multi-controlled ops to Toffolis by V-chain, Barenco and ancilla-free constructions",
         Stage::Lowering, lower_controls},
        {"lower-toffoli", "Toffoli/CCZ to Clifford+T (7-T, T-depth-3, relative-phase, temporary AND)",
         Stage::Lowering, lower_toffoli},
        {"to-target", "rewrite into the gates of --target", Stage::Lowering, to_target},
        {"fuse-1q", "fuse one-qubit runs and resynthesize them by Euler angles in the target's axes",
         Stage::LowLevel, fuse_1q},
        {"resynth-2q", "resynthesize two-qubit blocks by KAK with the fewest entangling gates", Stage::LowLevel,
         resynth_2q},
    };
    return passes;
}

const PassInfo* find_pass(std::string_view name) {
    for (const PassInfo& p : all_passes())
        if (name == p.name) return &p;
    return nullptr;
}

}  // namespace whittle::passes
