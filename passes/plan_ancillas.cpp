// plan-ancillas: the free-wire picture the lowering will see, as stats and notes.
#include "passes/plan_ancillas.h"

#include <fmt/format.h>

#include "lowering/ancilla_plan.h"
#include "lowering/target_lowering.h"

namespace whittle::passes {

PassResult plan_ancillas(ir::Circuit& c, const PassOptions&) {
    PassResult r;
    lowering::CleanWireTracker tracker(c);
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        const bool multi = op.controls.size() >= 2 && op.kind != ir::OpKind::Parity && op.kind != ir::OpKind::Barrier &&
                           !(op.kind == ir::OpKind::Phase && op.controls.size() <= 3);
        if (multi || (op.kind == ir::OpKind::X && op.controls.size() >= 3)) {
            wires.clear();
            op.wires(wires);
            size_t clean = tracker.zero_wires().size();
            for (uint32_t w : wires)
                if (tracker.is_zero(w)) --clean;
            const size_t borrowable = c.num_qubits() - wires.size();
            r.count("multi-controlled-ops");
            r.count("with-clean-wires", clean > 0);
            r.count("with-borrowable-wires", borrowable > 0);
            r.count("with-no-free-wire", borrowable == 0);
            r.notes.push_back(fmt::format("op {} {}: {} clean wires at |0>, {} borrowable", i,
                                          lowering::describe_op(c, op), clean, borrowable));
        }
        tracker.step(i);
    }
    return r;
}

}  // namespace whittle::passes
