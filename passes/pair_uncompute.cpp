// pair-uncompute: one left-to-right scan with a candidate per target wire.
#include "passes/pair_uncompute.h"

#include <limits>

namespace whittle::passes {
namespace {

constexpr size_t kNone = std::numeric_limits<size_t>::max();

bool writes(const ir::Op& op, uint32_t w) {
    if (op.kind == ir::OpKind::Barrier) return false;
    if (op.target == w) return !op.is_diagonal();
    return op.target2 == w;
}

bool candidate_kind(const ir::Op& op) {
    return op.kind == ir::OpKind::X && op.controls.size() >= 2 && !op.is_conditioned() && op.pair == 0;
}

}  // namespace

PassResult pair_uncompute(ir::Circuit& c, const PassOptions&) {
    PassResult r;
    const uint32_t n = c.num_qubits();
    std::vector<size_t> open(n, kNone);        // candidate compute op targeting the wire
    std::vector<size_t> last_write(n, kNone);  // last op that wrote the wire
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        ir::Op& op = c.ops[i];
        if (candidate_kind(op) && open[op.target] != kNone) {
            ir::Op& first = c.ops[open[op.target]];
            bool same = first.controls.size() == op.controls.size();
            for (size_t k = 0; same && k < op.controls.size(); ++k) {
                // Same literal set (order-insensitive; controls are few).
                bool found = false;
                for (ir::Lit l : first.controls) found = found || l == op.controls[k];
                same = found;
            }
            for (size_t k = 0; same && k < op.controls.size(); ++k) {
                const size_t lw = last_write[op.controls[k].wire()];
                same = lw == kNone || lw < open[op.target];
            }
            if (same) {
                const uint32_t id = c.new_pair_id();
                first.pair = op.pair = id;
                first.half = ir::PairHalf::Compute;
                op.half = ir::PairHalf::Uncompute;
                r.changed = true;
                r.count("pairs-found");
                open[op.target] = kNone;
                last_write[op.target] = i;
                continue;
            }
        }
        wires.clear();
        op.wires(wires);
        for (uint32_t w : wires) {
            if (!writes(op, w)) continue;
            last_write[w] = i;
            open[w] = kNone;
        }
        if (candidate_kind(op)) open[op.target] = i;
    }
    return r;
}

}  // namespace whittle::passes
