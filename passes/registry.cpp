// The pass registry: add a pass by adding its header and one line here.
#include "passes/registry.h"

#include <deque>

#include <fmt/format.h>

#include "ir/error.h"

#include "passes/cancel.h"
#include "passes/drop_idle_wires.h"
#include "passes/fold_phases.h"
#include "passes/fold_rotations.h"
#include "passes/fuse_1q.h"
#include "passes/gate_cancel.h"
#include "passes/lower_controls.h"
#include "passes/lower_toffoli.h"
#include "passes/merge_controls.h"
#include "passes/normalize.h"
#include "passes/pair_uncompute.h"
#include "passes/plan_ancillas.h"
#include "passes/reduce_t.h"
#include "passes/zx_merge.h"
#include "passes/resynth_2q.h"
#include "passes/resynth_3q.h"
#include "passes/rewrite_search.h"
#include "passes/share_work_wires.h"
#include "passes/split_work_lives.h"
#include "passes/to_target.h"

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
        {"pair-uncompute", "tag undeclared compute/uncompute pairs of Toffolis and MCX", Stage::HighLevel,
         pair_uncompute},
        {"plan-ancillas", "report the clean and borrowable wires free at each multi-controlled op", Stage::HighLevel,
         plan_ancillas},
        {"split-work-lives", "a clean work wire back at |0> between two of its ops continues on a fresh wire",
         Stage::HighLevel, split_work_lives},
        // Lowering steps.
        {"lower-controls", "multi-controlled ops to Toffolis: clean-wire ladders, borrowed-wire ladders, no-work-wire forms",
         Stage::Lowering, lower_controls},
        {"lower-toffoli", "Toffoli/CCZ to Clifford+T (7-T, T-depth-3, relative-phase, temporary AND)",
         Stage::Lowering, lower_toffoli},
        {"to-target", "rewrite into the gates of --target", Stage::Lowering, to_target},
        // Low-level passes.
        {"gate-cancel", "CNOT, H and one-qubit inverse pairs across commuting gates (kinds kept)", Stage::LowLevel,
         gate_cancel},
        {"fold-rotations", "rotation merging over parities on the lowered circuit, across H with path variables",
         Stage::LowLevel, fold_rotations},
        {"reduce-t", "T-count reduction beyond folding: TODD on Hadamard-free regions, parity-network resynthesis",
         Stage::LowLevel, reduce_t},
        {"zx-merge", "phase merges found by ZX simplification written back into the circuit, CNOTs unchanged",
         Stage::LowLevel, zx_merge},
        {"fuse-1q", "fuse one-qubit runs and resynthesize them by Euler angles in the target's axes",
         Stage::LowLevel, fuse_1q},
        {"resynth-2q", "resynthesize two-qubit blocks by KAK with the fewest entangling gates", Stage::LowLevel,
         resynth_2q},
        {"resynth-3q", "resynthesize three-qubit blocks numerically with fewer entangling gates (counted budget)",
         Stage::LowLevel, resynth_3q},
        {"rewrite-search", "apply the target's identity library (rules/library) by a cost-guided search on the dependency graph",
         Stage::LowLevel, rewrite_search},
        {"share-work-wires", "clean work wires whose lives do not overlap share one output wire", Stage::LowLevel,
         share_work_wires},
        {"drop-idle-wires", "remove the ancilla and borrow wires no op touches", Stage::LowLevel, drop_idle_wires},
    };
    return passes;
}

namespace {

/// Passes added by register_pass; a deque so pointers from find_pass stay valid.
std::deque<PassInfo>& registered_passes() {
    static std::deque<PassInfo> passes;
    return passes;
}

}  // namespace

const PassInfo* find_pass(std::string_view name) {
    for (const PassInfo& p : all_passes())
        if (name == p.name) return &p;
    for (const PassInfo& p : registered_passes())
        if (name == p.name) return &p;
    return nullptr;
}

void register_pass(const PassInfo& pass) {
    if (find_pass(pass.name)) throw UserError(fmt::format("a pass named '{}' exists already", pass.name));
    registered_passes().push_back(pass);
}

}  // namespace whittle::passes
