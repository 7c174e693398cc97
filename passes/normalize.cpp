// normalize: canonical forms for ops (sorted literals, diagonal gates as phases, no zero angles).
#include "passes/normalize.h"

#include <algorithm>

namespace whittle::passes {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

struct Normalizer {
    std::vector<Op> out;
    Angle global;
    PassResult& result;

    void emit_phase(const Op& like, Angle a, ir::LitVec lits) {
        if (a.is_zero()) return;
        std::sort(lits.begin(), lits.end());
        if (lits.size() == 1 && !lits[0].positive()) {
            global += a;
            a = -a;
            lits[0] = lits[0].flipped();
        }
        Op p = like;
        p.kind = OpKind::Phase;
        p.target = p.target2 = ir::kNoWire;
        p.angle = a;
        p.set_phi(Angle());
        p.set_lambda(Angle());
        p.controls = std::move(lits);
        out.push_back(std::move(p));
    }

    void add(const Op& op) {
        if (op.is_conditioned()) {  // conditioned ops keep their shape: the condition reads bits
            Op o = op;
            if (o.kind != OpKind::Barrier) std::sort(o.controls.begin(), o.controls.end());
            out.push_back(std::move(o));
            return;
        }
        switch (op.kind) {
        case OpKind::Phase: emit_phase(op, op.angle, op.controls); return;
        case OpKind::Parity: {
            if (op.angle.is_zero()) return;
            if (op.controls.size() == 1) {
                emit_phase(op, op.angle, op.controls);
                return;
            }
            Op o = op;
            std::sort(o.controls.begin(), o.controls.end());
            out.push_back(std::move(o));
            return;
        }
        case OpKind::RZ: {
            if (op.angle.is_zero()) return;
            ir::LitVec with_target = op.controls;
            with_target.push_back(Lit::pos(op.target));
            if (op.controls.empty()) global += -op.angle.divided_by(2);
            else emit_phase(op, -op.angle.divided_by(2), op.controls);
            emit_phase(op, op.angle, with_target);
            return;
        }
        case OpKind::U: {
            if (!op.angle.is_zero()) break;
            ir::LitVec with_target = op.controls;
            with_target.push_back(Lit::pos(op.target));
            emit_phase(op, op.phi() + op.lambda(), with_target);
            return;
        }
        case OpKind::RX:
        case OpKind::RY:
        case OpKind::XX:
            if (op.angle.is_zero()) return;
            break;
        case OpKind::Swap: {
            Op o = op;
            if (o.target > o.target2) std::swap(o.target, o.target2);
            std::sort(o.controls.begin(), o.controls.end());
            out.push_back(std::move(o));
            return;
        }
        case OpKind::X:
        case OpKind::H:
        case OpKind::Y:
        case OpKind::SX:
        case OpKind::SXdg:
        case OpKind::ISwap:
        case OpKind::R:
        case OpKind::Measure:
        case OpKind::Reset:
        case OpKind::Barrier: break;
        }
        Op o = op;
        if (o.kind != OpKind::Barrier) std::sort(o.controls.begin(), o.controls.end());
        out.push_back(std::move(o));
    }
};

bool same_op(const Op& a, const Op& b) {
    return a.kind == b.kind && a.target == b.target && a.target2 == b.target2 && a.angle == b.angle &&
           a.phi() == b.phi() && a.lambda() == b.lambda() &&
           std::equal(a.controls.begin(), a.controls.end(), b.controls.begin(), b.controls.end());
}

}  // namespace

PassResult normalize(ir::Circuit& c, const PassOptions&) {
    PassResult result;
    Normalizer n{ir::take_spare_ops(c.ops.size() + c.ops.size() / 8), {}, result};
    n.out.reserve(c.ops.size());
    for (const Op& op : c.ops) n.add(op);
    bool changed = n.out.size() != c.ops.size() || !n.global.is_zero();
    for (size_t i = 0; !changed && i < n.out.size(); ++i) changed = !same_op(n.out[i], c.ops[i]);
    if (!changed) return result;
    const int64_t delta = int64_t(c.ops.size()) - int64_t(n.out.size());
    if (delta > 0) result.count("ops-dropped", delta);
    if (delta < 0) result.count("ops-split", -delta);
    c.replace_ops(std::move(n.out));
    c.global_phase += n.global;
    result.changed = true;
    return result;
}

}  // namespace whittle::passes
