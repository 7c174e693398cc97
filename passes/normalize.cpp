// normalize: canonical forms for ops (sorted literals, diagonal gates as phases, no zero angles).
#include "passes/normalize.h"

#include <algorithm>
#include <iterator>

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
    Normalizer n{{}, {}, result};
    const size_t size_before = c.ops.size();
    // In place while the written prefix stays behind the read position (an op becomes at most one op
    // in the common case), so the first pass of a big circuit needs no second op vector.
    bool changed = false;
    size_t write = 0, read = 0;
    for (; read < c.ops.size(); ++read) {
        n.out.clear();
        n.add(c.ops[read]);
        if (write + n.out.size() > read + 1) break;
        if (n.out.size() != 1 || !same_op(n.out[0], c.ops[read])) changed = true;
        for (Op& o : n.out) c.ops[write++] = std::move(o);
    }
    if (read < c.ops.size()) {
        // An op grew past the read position: finish into a fresh list.
        std::vector<Op> grown = std::move(n.out);
        n.out = std::vector<Op>();
        n.out.reserve(c.ops.size() + c.ops.size() / 8 + grown.size());
        std::move(c.ops.begin(), c.ops.begin() + std::ptrdiff_t(write), std::back_inserter(n.out));
        std::move(grown.begin(), grown.end(), std::back_inserter(n.out));
        for (++read; read < c.ops.size(); ++read) n.add(c.ops[read]);
        c.ops = std::move(n.out);
        changed = true;
    } else {
        c.ops.resize(write);
    }
    changed = changed || !n.global.is_zero();
    if (!changed) return result;
    const int64_t delta = int64_t(size_before) - int64_t(c.ops.size());
    if (delta > 0) result.count("ops-dropped", delta);
    if (delta < 0) result.count("ops-split", -delta);
    c.global_phase += n.global;
    result.changed = true;
    return result;
}

}  // namespace whittle::passes
