// resynth-2q: block collection with one open block per wire; replacements at each block's last op.
#include "passes/resynth_2q.h"
#include "passes/op_replacements.h"

#include "lowering/targets.h"
#include "synthesis/two_qubit_synthesis.h"

namespace whittle::passes {
namespace {

using ir::Op;
using ir::OpKind;

bool is_unitary_gate(const Op& op) {
    return !op.is_conditioned() && op.kind != OpKind::Measure && op.kind != OpKind::Reset && op.kind != OpKind::Barrier;
}

struct Block {
    uint32_t a, b;
    std::vector<size_t> ops;
    size_t two_qubit = 0;
};

}  // namespace

PassResult resynth_2q(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (!opts.target) return r;
    const lowering::Target target = *opts.target;
    if (target == lowering::Target::CliffordT || target == lowering::Target::Nct) return r;
    const size_t n = c.ops.size();
    std::vector<Block> blocks;
    std::vector<int64_t> open(c.num_qubits(), -1);
    std::vector<std::vector<size_t>> pending(c.num_qubits());
    OpReplacements edits(n);
    ir::Angle phase = c.global_phase;
    auto close = [&](int64_t id) {
        if (id < 0) return;
        Block& bl = blocks[size_t(id)];
        open[bl.a] = open[bl.b] = -1;
        if (bl.two_qubit == 0) return;
        std::vector<Op> old;
        for (size_t i : bl.ops) old.push_back(c.ops[i]);
        const ir::Mat4 u = lowering::two_qubit_product(old, bl.a, bl.b);
        if (size_t(lowering::entangler_count(u, lowering::entangler(target))) > bl.two_qubit) return;
        lowering::TwoQubitSynthesis syn =
            lowering::synthesize_2q(u, bl.a, bl.b, lowering::entangler(target), lowering::one_qubit_basis(target));
        const bool better = size_t(syn.entanglers) < bl.two_qubit ||
                            (size_t(syn.entanglers) == bl.two_qubit && syn.ops.size() < old.size());
        if (!better || syn.error > 1e-9) return;
        for (size_t i : bl.ops) edits.drop(i);
        for (Op& op : syn.ops) op.loc = c.ops[bl.ops.back()].loc;
        r.count("blocks-resynthesized");
        r.count("two-qubit-gates-removed", int64_t(bl.two_qubit) - syn.entanglers);
        edits.insert_after(bl.ops.back(), std::move(syn.ops));
        phase += syn.phase;
    };
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < n; ++i) {
        const Op& op = c.ops[i];
        wires.clear();
        op.wires(wires);
        if (is_unitary_gate(op) && wires.size() == 1) {
            const uint32_t w = wires[0];
            if (open[w] >= 0) blocks[size_t(open[w])].ops.push_back(i);
            else pending[w].push_back(i);
            continue;
        }
        if (is_unitary_gate(op) && wires.size() == 2) {
            const uint32_t p = wires[0], q = wires[1];
            if (open[p] >= 0 && open[p] == open[q]) {
                blocks[size_t(open[p])].ops.push_back(i);
                ++blocks[size_t(open[p])].two_qubit;
                continue;
            }
            close(open[p]);
            close(open[q]);
            Block bl{p, q, {}, 1};
            // Pending one-qubit ops on p and q come first; they commute with everything in between.
            for (size_t k : pending[p]) bl.ops.push_back(k);
            for (size_t k : pending[q]) bl.ops.push_back(k);
            pending[p].clear();
            pending[q].clear();
            bl.ops.push_back(i);
            open[p] = open[q] = int64_t(blocks.size());
            blocks.push_back(std::move(bl));
            continue;
        }
        for (uint32_t w : wires) {
            close(open[w]);
            pending[w].clear();
        }
    }
    for (uint32_t w = 0; w < c.num_qubits(); ++w) close(open[w]);
    if (r.stats.empty()) return r;
    edits.apply(c);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
