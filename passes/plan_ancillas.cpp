// plan-ancillas: the free-wire picture the lowering will see, as stats and notes.
#include "passes/plan_ancillas.h"

#include <fmt/format.h>

#include "lowering/ancilla_plan.h"
#include "lowering/target_lowering.h"

namespace whittle::passes {

/// Notes listed per op at most (then one line with the rest's count): a note is about 100 bytes
/// kept to the end of the run, and a 10^7-gate input has 10^6 Toffolis.
constexpr size_t kMaxNotes = 200;

PassResult plan_ancillas(ir::Circuit& c, const PassOptions&) {
    PassResult r;
    lowering::CleanWireTracker tracker(c);
    std::vector<uint32_t> wires;
    size_t multi_ops = 0;
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
            if (r.notes.size() < kMaxNotes)
                r.notes.push_back(fmt::format("op {} {}: {} clean wires at |0>, {} borrowable", i,
                                              lowering::describe_op(c, op), clean, borrowable));
            ++multi_ops;
        }
        tracker.step(i);
    }
    if (multi_ops > kMaxNotes) r.notes.push_back(fmt::format("... and {} more ops", multi_ops - kMaxNotes));
    return r;
}

}  // namespace whittle::passes
