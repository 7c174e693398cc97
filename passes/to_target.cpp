// to-target: dispatch per target; ops already in the target stay as they are.
#include "passes/to_target.h"

#include "ir/error.h"
#include "ir/op_prefix_release.h"
#include "ir/resources.h"
#include "lowering/target_lowering.h"
#include "lowering/targets.h"

namespace whittle::passes {

PassResult to_target(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (!opts.target) return r;
    const lowering::Target t = *opts.target;
    bool all_in = true;
    for (const ir::Op& op : c.ops) all_in = all_in && lowering::in_target(op, t);
    if (all_in) return r;
    // What an estimate made before synthesis counts: the layers of arbitrary rotations (not
    // multiples of pi/4) on the circuit as it enters the Clifford+T synthesis.
    if (t == lowering::Target::CliffordT) {
        const ir::Resources before = ir::count_resources(c);
        if (before.non_clifford_rotations) r.count("rotation-layers", int64_t(before.rotation_depth));
    }
    std::vector<ir::Op> out;
    out.reserve(c.ops.size() + c.ops.size() / 4);
    ir::Angle phase = c.global_phase;
    lowering::OpSink s(out, phase);
    lowering::RotationBudget budget;
    budget.epsilon = opts.epsilon;
    // The input's ops are moved out as they are read and its pages handed back behind the reading
    // position, so the input and the output are not held whole at once.
    ir::OpPrefixReleaser release(c.ops);
    for (size_t i = 0; i < c.ops.size(); release.consumed(++i)) {
        if (lowering::in_target(c.ops[i], t)) {
            out.push_back(std::move(c.ops[i]));
            continue;
        }
        const ir::Op op = std::move(c.ops[i]);
        r.count("ops-rewritten");
        switch (t) {
        case lowering::Target::CliffordT: lowering::to_clifford_t(op, s, c, budget); break;
        case lowering::Target::Nct: lowering::to_nct(op, s, c); break;
        default: lowering::to_rotation_target(op, s, c, t); break;
        }
    }
    for (const ir::Op& op : out)
        WHITTLE_ASSERT(lowering::in_target(op, t) && "to-target left a gate outside the target");
    if (budget.approximated) {
        r.count("rotations-approximated", budget.approximated);
        r.error_bound += budget.error_bound;
    }
    c.ops = std::move(out);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
