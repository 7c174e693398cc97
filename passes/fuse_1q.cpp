// fuse-1q: per-wire runs collected in one scan; replacements placed at each run's last op.
#include "passes/fuse_1q.h"
#include "passes/op_replacements.h"

#include <algorithm>

#include "ir/resources.h"
#include "synthesis/euler.h"
#include "lowering/targets.h"

namespace whittle::passes {
namespace {

using ir::Op;
using ir::OpKind;

bool is_one_qubit(const Op& op) {
    if (op.is_conditioned()) return false;
    switch (op.kind) {
    case OpKind::Phase:
    case OpKind::Parity:  // a phase on !w is diag(e^{ia}, 1): only positive literals are diag(1, e^{ia})
        return op.controls.size() == 1 && op.controls[0].positive();
    case OpKind::X:
    case OpKind::H:
    case OpKind::Y:
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ:
    case OpKind::U:
    case OpKind::R: return op.controls.empty();
    default: return false;
    }
}

uint32_t wire_of(const Op& op) { return op.target != ir::kNoWire ? op.target : op.controls[0].wire(); }

bool is_t_like(const Op& op) {
    const int e = op.angle.eighths();
    return op.kind == OpKind::Phase && e >= 0 && (e % 2) == 1;
}

/// (T-like count, op count): what a replacement must beat.
std::pair<size_t, size_t> cost(const std::vector<Op>& ops) {
    size_t t = 0;
    for (const Op& op : ops) t += is_t_like(op);
    return {t, ops.size()};
}

/// Exact clifford+t peephole: merge adjacent phases, cancel H H and X X.
std::vector<Op> simplify_clifford_t(const std::vector<Op>& run, uint32_t w) {
    std::vector<Op> stack;
    for (const Op& op : run) {
        if (!stack.empty()) {
            Op& top = stack.back();
            if (op.kind == OpKind::Phase && top.kind == OpKind::Phase) {
                top.angle += op.angle;
                if (top.angle.is_zero()) stack.pop_back();
                continue;
            }
            if ((op.kind == OpKind::H || op.kind == OpKind::X) && top.kind == op.kind) {
                stack.pop_back();
                continue;
            }
        }
        stack.push_back(op);
    }
    std::vector<Op> out;
    for (const Op& op : stack) {
        if (op.kind == OpKind::Phase) lowering::append_phase_word(op.angle.eighths(), w, out);
        else out.push_back(op);
    }
    return out;
}

}  // namespace

PassResult fuse_1q(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (!opts.target) return r;
    const lowering::Target target = *opts.target;
    const size_t n = c.ops.size();
    std::vector<std::vector<size_t>> run(c.num_qubits());
    OpReplacements edits(n);
    ir::Angle phase = c.global_phase;
    auto flush = [&](uint32_t w) {
        std::vector<size_t>& idx = run[w];
        if (idx.size() < 2) {
            idx.clear();
            return;
        }
        std::vector<Op> old;
        for (size_t i : idx) old.push_back(c.ops[i]);
        std::vector<Op> fresh;
        ir::Angle gp;
        bool ok = false;
        if (target == lowering::Target::Nct) {
            // Only runs of plain X gates reduce to the parity of their count.
            ok = std::all_of(old.begin(), old.end(), [](const Op& op) { return op.kind == OpKind::X; });
            if (ok && old.size() % 2) fresh.push_back(Op::x(w));
        } else {
            ok = lowering::synthesize_1q(lowering::one_qubit_product(old), w, lowering::one_qubit_basis(target), fresh,
                                         gp);
            if (target == lowering::Target::CliffordT) {
                std::vector<Op> simple = simplify_clifford_t(old, w);
                if (!ok || cost(simple) < cost(fresh)) {
                    fresh = std::move(simple);
                    gp = ir::Angle();
                    ok = true;
                }
            }
        }
        if (ok && cost(fresh) < cost(old)) {
            for (size_t i : idx) edits.drop(i);
            for (Op& op : fresh) op.loc = c.ops[idx.back()].loc;
            r.count("runs-fused");
            r.count("gates-removed", int64_t(old.size()) - int64_t(fresh.size()));
            edits.insert_after(idx.back(), std::move(fresh));
            phase += gp;
        }
        idx.clear();
    };
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < n; ++i) {
        const Op& op = c.ops[i];
        if (is_one_qubit(op)) {
            run[wire_of(op)].push_back(i);
            continue;
        }
        wires.clear();
        op.wires(wires);
        for (uint32_t w : wires) flush(w);
    }
    for (uint32_t w = 0; w < c.num_qubits(); ++w) flush(w);
    if (r.stats.empty()) return r;
    edits.apply(c);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
