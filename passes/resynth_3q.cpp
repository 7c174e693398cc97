// resynth-3q: one scan cuts blocks of at most three wires (one open block per wire, a two-qubit
// gate joins or widens its wires' block, else closes them); each closed three-wire block is
// offered to the numerical block synthesis (Davis et al. 2020, arXiv:2003.04462; Smith et al.
// 2021, arXiv:2106.11246) with one entangler fewer as its deepest try. Budgets are counted
// optimizer steps, so the output does not depend on the machine.
#include "passes/resynth_3q.h"
#include "passes/op_replacements.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>

#include "lowering/targets.h"
#include "synthesis/block_synthesis.h"

namespace whittle::passes {
namespace {

using ir::Op;
using ir::OpKind;

bool is_unitary_gate(const Op& op) {
    return !op.is_conditioned() && op.kind != OpKind::Measure && op.kind != OpKind::Reset && op.kind != OpKind::Barrier;
}

struct Block {
    std::vector<uint32_t> wires;
    std::vector<size_t> ops;
    size_t two_qubit = 0;
    bool closed = false;
};

/// Steps of the optimizer per unit of effort: per block and for the whole pass.
constexpr uint64_t kBlockSteps = 4000;
constexpr uint64_t kPassSteps = 400000;

/// A cached synthesis: the ops on placeholder wires 0, 1, 2 (block wire i -> placeholder i).
struct Cached {
    bool found = false;
    std::vector<Op> ops;
    int entanglers = 0;
};

/// The cache key: the unitary with its phase lined up on its largest entry, rounded to 1e-9.
std::vector<int64_t> unitary_key(const Eigen::MatrixXcd& u) {
    Eigen::Index r = 0, col = 0;
    u.cwiseAbs().maxCoeff(&r, &col);
    const ir::Complex ph = std::conj(u(r, col)) / std::abs(u(r, col));
    std::vector<int64_t> key;
    key.reserve(size_t(2 * u.size()));
    for (Eigen::Index j = 0; j < u.cols(); ++j)
        for (Eigen::Index i = 0; i < u.rows(); ++i) {
            const ir::Complex z = ph * u(i, j);
            key.push_back(std::llround(z.real() * 1e9));
            key.push_back(std::llround(z.imag() * 1e9));
        }
    return key;
}

void remap(std::vector<Op>& ops, const std::vector<uint32_t>& from, const std::vector<uint32_t>& to) {
    auto map = [&](uint32_t w) {
        for (size_t i = 0; i < from.size(); ++i)
            if (from[i] == w) return to[i];
        return w;
    };
    for (Op& op : ops) {
        if (op.target != ir::kNoWire) op.target = map(op.target);
        if (op.target2 != ir::kNoWire) op.target2 = map(op.target2);
        for (ir::Lit& l : op.controls) l = ir::Lit::make(map(l.wire()), l.positive());
    }
}

}  // namespace

PassResult resynth_3q(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (!opts.target) return r;
    // The pipeline adds the pass only when resynth_effort > 0; named in --passes it runs at least one unit.
    const uint64_t effort = std::max<uint32_t>(1, opts.resynth_effort);
    const lowering::Target target = *opts.target;
    if (target == lowering::Target::CliffordT || target == lowering::Target::Nct) return r;
    const ir::Entangler ent = lowering::entangler(target);
    const lowering::OneQubitBasis basis = lowering::one_qubit_basis(target);
    const double bound = 1e-8;
    const size_t n = c.ops.size();
    std::vector<Block> blocks;
    std::vector<int64_t> open(c.num_qubits(), -1);
    std::vector<std::vector<size_t>> pending(c.num_qubits());
    OpReplacements edits(n);
    ir::Angle phase = c.global_phase;
    std::map<std::vector<int64_t>, Cached> cache;
    uint64_t steps = 0;
    const uint64_t pass_budget = kPassSteps * effort;
    const std::vector<uint32_t> placeholders = {0, 1, 2};
    bool budget_note = false;
    bool any = false;

    auto try_block = [&](Block& bl) {
        std::vector<Op> old;
        old.reserve(bl.ops.size());
        for (size_t i : bl.ops) old.push_back(c.ops[i]);
        const Eigen::MatrixXcd u = lowering::block_product(old, bl.wires);
        const std::vector<int64_t> key = unitary_key(u);
        auto it = cache.find(key);
        if (it == cache.end()) {
            if (steps >= pass_budget) {
                budget_note = true;
                return;
            }
            lowering::BlockSynthesisOptions so;
            so.max_distance = bound;
            so.max_entanglers = int(bl.two_qubit) - 1;
            // Top-down from the block's own entanglers (a bottom-up search rarely reaches a long block's depth).
            for (size_t i : bl.ops) {
                std::vector<uint32_t> ws = c.ops[i].wires();
                if (ws.size() != 2) continue;
                auto index = [&](uint32_t w) { return int(std::find(bl.wires.begin(), bl.wires.end(), w) - bl.wires.begin()); };
                so.from_places.emplace_back(index(ws[0]), index(ws[1]));
            }
            so.restarts = 2;
            so.budget = std::min<uint64_t>(kBlockSteps * effort, pass_budget - steps);
            const lowering::BlockSynthesis s = lowering::synthesize_block(u, placeholders, ent, basis, so);
            steps += s.iterations;
            r.count("blocks-searched");
            r.count("optimizer-steps", int64_t(s.iterations));
            Cached entry{s.found, s.ops, s.entanglers};
            it = cache.emplace(key, std::move(entry)).first;
        } else {
            r.count("cache-hits");
        }
        const Cached& hit = it->second;
        if (!hit.found || size_t(hit.entanglers) >= bl.two_qubit) return;
        std::vector<Op> ops = hit.ops;
        remap(ops, placeholders, bl.wires);
        // The distance of this block's own unitary (a cached circuit may come from a nearby one).
        const Eigen::MatrixXcd v = lowering::block_product(ops, bl.wires);
        const ir::Complex t = (v.adjoint() * u).trace();
        const ir::Angle ph = lowering::snap_angle(std::arg(t));
        const double dist = (std::polar(1.0, ph.to_radians()) * v - u).norm();
        if (!(dist <= bound)) return;
        for (size_t i : bl.ops) edits.drop(i);
        for (Op& op : ops) op.loc = c.ops[bl.ops.back()].loc;
        r.count("blocks-resynthesized");
        r.count("two-qubit-gates-removed", int64_t(bl.two_qubit) - hit.entanglers);
        r.error_bound += dist;
        edits.insert_after(bl.ops.back(), std::move(ops));
        phase += ph;
        any = true;
    };
    auto close = [&](int64_t id) {
        if (id < 0) return;
        Block& bl = blocks[size_t(id)];
        if (bl.closed) return;
        bl.closed = true;
        for (uint32_t w : bl.wires) open[w] = -1;
        if (bl.wires.size() == 3 && bl.two_qubit >= 3) try_block(bl);
    };
    auto add_wire = [&](Block& bl, uint32_t w) {
        bl.wires.push_back(w);
        // Pending one-qubit ops on w come first; they commute with the block's ops on other wires.
        for (size_t k : pending[w]) bl.ops.push_back(k);
        pending[w].clear();
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
                Block& bl = blocks[size_t(open[p])];
                bl.ops.push_back(i);
                ++bl.two_qubit;
                continue;
            }
            // Widen an open block of two wires by the other wire, closing that wire's own block;
            // of two candidates, the block with more two-qubit gates is kept open.
            std::optional<int64_t> grow;
            for (uint32_t w : {p, q}) {
                const int64_t id = open[w];
                if (id < 0 || blocks[size_t(id)].wires.size() >= 3) continue;
                if (!grow || blocks[size_t(id)].two_qubit > blocks[size_t(*grow)].two_qubit) grow = id;
            }
            if (grow) {
                const int64_t id = *grow;
                const uint32_t other = open[p] == id ? q : p;
                close(open[other]);
                Block& bl = blocks[size_t(id)];
                add_wire(bl, other);
                open[other] = id;
                bl.ops.push_back(i);
                ++bl.two_qubit;
                continue;
            }
            close(open[p]);
            close(open[q]);
            Block bl;
            blocks.push_back(bl);
            const int64_t id = int64_t(blocks.size() - 1);
            add_wire(blocks.back(), p);
            add_wire(blocks.back(), q);
            blocks.back().ops.push_back(i);
            blocks.back().two_qubit = 1;
            open[p] = open[q] = id;
            continue;
        }
        for (uint32_t w : wires) {
            close(open[w]);
            pending[w].clear();
        }
    }
    for (uint32_t w = 0; w < c.num_qubits(); ++w) close(open[w]);
    if (budget_note)
        r.notes.push_back("the optimizer-step budget ran out; later blocks were not searched (raise --resynth-effort)");
    if (!any) return r;
    edits.apply(c);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
