// The rotation targets (cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, u+cx): Euler one-qubit gates, KAK two-qubit gates.
#include <fmt/format.h>

#include "ir/error.h"
#include "synthesis/euler.h"
#include "lowering/target_lowering.h"
#include "lowering/toffoli_forms.h"
#include "synthesis/two_qubit_synthesis.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

void one_qubit(const Op& op, const ir::Mat2& m, OpSink& s, Target t) {
    std::vector<Op> ops;
    Angle gp;
    const bool ok = synthesize_1q(m, op.target, one_qubit_basis(t), ops, gp);
    WHITTLE_ASSERT(ok && "rotation bases take every one-qubit unitary");
    for (Op& o : ops) s.push(o);
    s.add_global_phase(gp);
}

/// Exact rewrites where the target has a direct form, so exact angles stay exact.
bool direct_one_qubit(const Op& op, OpSink& s, Target t) {
    const OneQubitBasis basis = one_qubit_basis(t);
    const uint32_t w = op.target;
    const bool has_rz = basis != OneQubitBasis::U3;
    if (has_rz && op.kind == OpKind::Phase) {
        // diag(1, e^{ia}) = e^{ia/2} Rz(a).
        s.one(OpKind::RZ, w, op.angle);
        s.add_global_phase(op.angle.divided_by(2));
        return true;
    }
    if (basis == OneQubitBasis::ZXZ && op.kind == OpKind::RX) {
        s.push(Op::one(OpKind::RX, w, op.angle));
        return true;
    }
    if (basis == OneQubitBasis::RRz && op.kind == OpKind::RX) {
        s.push(Op::one(OpKind::R, w, op.angle));  // R(theta, 0) = Rx(theta)
        return true;
    }
    if (basis == OneQubitBasis::RRz && op.kind == OpKind::RY) {
        Op r = Op::one(OpKind::R, w, op.angle);
        r.set_phi(Angle::pi_times(1, 2));  // R(theta, pi/2) = Ry(theta)
        s.push(r);
        return true;
    }
    if (basis == OneQubitBasis::ZSX && op.kind == OpKind::SXdg) {
        // SXdg = Z SX Z = Rz(pi) SX Rz(pi) up to (-i)(-i) = -1.
        s.one(OpKind::RZ, w, Angle::pi_times(1));
        s.push(Op::one(OpKind::SX, w));
        s.one(OpKind::RZ, w, Angle::pi_times(1));
        s.add_global_phase(Angle::pi_times(1));
        return true;
    }
    return false;
}

}  // namespace

void to_rotation_target(const Op& op, OpSink& s, const ir::Circuit& c, Target t) {
    s.inherit(op);
    const size_t nc = op.controls.size();
    switch (op.kind) {
    case OpKind::Barrier:
    case OpKind::Measure:
    case OpKind::Reset: s.push(op); return;
    default: break;
    }
    const bool one_wire = (op.kind != OpKind::Phase && op.kind != OpKind::Parity && op.kind != OpKind::Swap &&
                           op.kind != OpKind::ISwap && op.kind != OpKind::XX && nc == 0) ||
                          ((op.kind == OpKind::Phase || op.kind == OpKind::Parity) && nc == 1);
    if (one_wire) {
        Op norm = op;
        if (op.kind == OpKind::Phase || op.kind == OpKind::Parity) {
            // A phase on one literal: e^{ia(1-x)} = e^{ia} e^{-iax} when negative.
            norm = Op::phase(op.angle, {Lit::pos(op.controls[0].wire())});
            if (!op.controls[0].positive()) {
                norm.angle = -op.angle;
                s.add_global_phase(op.angle);
            }
            norm.target = op.controls[0].wire();
        }
        if (direct_one_qubit(norm, s, t)) return;
        Op m = norm;
        m.controls.clear();
        one_qubit(norm, ir::one_qubit_matrix(m), s, t);
        return;
    }
    // A Toffoli or a CCZ that reached the target without lower-toffoli: its Clifford+T form (negative
    // controls flipped around it), each gate of which is then rewritten for the target.
    const bool toffoli = op.kind == OpKind::X && nc == 2;
    const bool ccz = op.kind == OpKind::Phase && nc == 3 && op.angle == Angle::pi_times(1);  // other angles need lower-controls
    if (toffoli || ccz) {
        std::vector<Op> tmp;
        Angle gp;
        OpSink inner(tmp, gp);
        inner.inherit(op);
        for (Lit l : op.controls)
            if (!l.positive()) inner.x(l.wire());
        if (toffoli) toffoli_7t(inner, op.controls[0].wire(), op.controls[1].wire(), op.target);
        else ccz_7t(inner, op.controls[0].wire(), op.controls[1].wire(), op.controls[2].wire());
        for (Lit l : op.controls)
            if (!l.positive()) inner.x(l.wire());
        for (const Op& o : tmp) to_rotation_target(o, s, c, t);
        s.add_global_phase(gp);
        return;
    }
    std::vector<uint32_t> wires = op.wires();
    if (wires.size() != 2)
        throw UserError(fmt::format("{} still has controls: run lower-controls before to-target", describe_op(c, op, false)),
                        op.loc);
    const uint32_t a = wires[0], b = wires[1];
    Op plain = op;
    plain.set_condition(-1, 0);
    const ir::Mat4 u = two_qubit_product({plain}, a, b);
    TwoQubitSynthesis syn = synthesize_2q(u, a, b, entangler(t), one_qubit_basis(t));
    WHITTLE_ASSERT(syn.error < 1e-9 && "two-qubit synthesis missed its accuracy");
    for (Op& o : syn.ops) s.push(o);
    s.add_global_phase(syn.phase);
}

}  // namespace whittle::lowering
