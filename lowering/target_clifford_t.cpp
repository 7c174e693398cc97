// The clifford+t target: exact rewrites into H, S, Sdg, T, Tdg, X, Y, Z and CNOT.
#include <fmt/format.h>

#include "ir/error.h"
#include "ir/resources.h"
#include "synthesis/euler.h"
#include "synthesis/rotation_synthesis.h"
#include "lowering/target_lowering.h"
#include "lowering/toffoli_forms.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

/// diag(1, e^{ia}) on w: exact words for multiples of pi/4, else the Ross-Selinger approximation of
/// Rz(a) (Ross & Selinger 2016, arXiv:1403.2975) within the budget's epsilon, since
/// diag(1, e^{ia}) = e^{ia/2} Rz(a). The approximation U satisfies ||omega^g U - Rz(a)|| <= bound.
void phase_word(OpSink& s, RotationBudget& budget, Angle a, uint32_t w) {
    const int e = a.eighths();
    std::vector<Op> word;
    if (e >= 0) {
        append_phase_word(e, w, word);
        for (Op& op : word) s.push(op);
        return;
    }
    const RzApproximation approx = approximate_rz(a.to_radians(), budget.epsilon);
    for (CliffordTGate g : approx.gates) {
        switch (g) {
        case CliffordTGate::H: s.h(w); break;
        case CliffordTGate::S: s.phase(Angle::pi_times(1, 2), {Lit::pos(w)}); break;
        case CliffordTGate::Sdg: s.phase(Angle::pi_times(-1, 2), {Lit::pos(w)}); break;
        case CliffordTGate::T: s.phase(Angle::pi_times(1, 4), {Lit::pos(w)}); break;
        case CliffordTGate::Tdg: s.phase(Angle::pi_times(-1, 4), {Lit::pos(w)}); break;
        case CliffordTGate::X: s.x(w); break;
        case CliffordTGate::Y: s.one(OpKind::Y, w); break;
        case CliffordTGate::Z: s.phase(Angle::pi_times(1), {Lit::pos(w)}); break;
        }
    }
    s.add_global_phase(a.divided_by(2) + Angle::pi_times(approx.global_phase_eighths, 4));
    budget.error_bound += approx.error_bound;
    ++budget.approximated;
}

void rz(OpSink& s, RotationBudget& budget, Angle a, uint32_t w) {
    // Rz(a) = e^{-ia/2} diag(1, e^{ia}).
    phase_word(s, budget, a, w);
    s.add_global_phase(-a.divided_by(2));
}

void cnot(OpSink& s, Lit control, uint32_t t) {
    if (!control.positive()) s.x(control.wire());
    s.cx(Lit::pos(control.wire()), t);
    if (!control.positive()) s.x(control.wire());
}

/// XX(a) = (H x H) CX Rz_b(a) CX (H x H).
void xx(OpSink& s, RotationBudget& budget, Angle a, uint32_t p, uint32_t q) {
    s.h(p);
    s.h(q);
    s.cx(Lit::pos(p), q);
    rz(s, budget, a, q);
    s.cx(Lit::pos(p), q);
    s.h(p);
    s.h(q);
}

void flip_negative(OpSink& s, const ir::LitVec& lits) {
    for (Lit l : lits)
        if (!l.positive()) s.x(l.wire());
}

ir::LitVec positive_of(const ir::LitVec& lits) {
    ir::LitVec out;
    for (Lit l : lits) out.push_back(Lit::pos(l.wire()));
    return out;
}

}  // namespace

std::string describe_op(const ir::Circuit& c, const Op& op, bool with_location) {
    std::string where;
    if (with_location && op.loc.known()) {
        const std::string file = op.loc.file < c.files.size() ? c.files[op.loc.file] : std::string("<input>");
        where = fmt::format(" ({}:{}:{})", file, uint32_t(op.loc.line), uint32_t(op.loc.column));
    }
    std::string wires;
    for (uint32_t w : op.wires()) {  // appended: `"," + name` drew GCC 12's -Wrestrict false positive at -O3
        if (!wires.empty()) wires += ',';
        wires += c.wire_name(w);
    }
    return fmt::format("'{}' on {}{}", ir::gate_name(op), wires, where);
}

void to_clifford_t(const Op& op, OpSink& s, const ir::Circuit& c, RotationBudget& budget) {
    s.inherit(op);
    const size_t nc = op.controls.size();
    auto needs_controls_lowered = [&] {
        throw UserError(fmt::format("{} still has controls: run lower-controls before to-target", describe_op(c, op, false)),
                        op.loc);
    };
    switch (op.kind) {
    case OpKind::Barrier:
    case OpKind::Measure:
    case OpKind::Reset: s.push(op); return;
    case OpKind::X:
        if (nc == 0) s.x(op.target);
        else if (nc == 1) cnot(s, op.controls[0], op.target);
        else if (nc == 2) {
            flip_negative(s, op.controls);
            toffoli_7t(s, op.controls[0].wire(), op.controls[1].wire(), op.target);
            flip_negative(s, op.controls);
        } else needs_controls_lowered();
        return;
    case OpKind::Phase: {
        if (nc == 1) {
            // e^{ia(1-x)} = e^{ia} e^{-iax} for a negative literal.
            const Lit l = op.controls[0];
            if (!l.positive()) s.add_global_phase(op.angle);
            phase_word(s, budget, l.positive() ? op.angle : -op.angle, l.wire());
            return;
        }
        if (op.angle != Angle::pi_times(1) || nc > 3) needs_controls_lowered();
        flip_negative(s, op.controls);
        if (nc == 2) {
            s.h(op.controls[1].wire());
            s.cx(Lit::pos(op.controls[0].wire()), op.controls[1].wire());
            s.h(op.controls[1].wire());
        } else {
            ccz_7t(s, op.controls[0].wire(), op.controls[1].wire(), op.controls[2].wire());
        }
        flip_negative(s, op.controls);
        return;
    }
    case OpKind::Parity: {
        const uint32_t last = op.controls.back().wire();
        for (size_t i = 0; i + 1 < nc; ++i) s.cx(Lit::pos(op.controls[i].wire()), last);
        phase_word(s, budget, op.angle, last);
        for (size_t i = nc - 1; i-- > 0;) s.cx(Lit::pos(op.controls[i].wire()), last);
        return;
    }
    default: break;
    }
    if (nc != 0) needs_controls_lowered();
    const uint32_t w = op.target;
    switch (op.kind) {
    case OpKind::H:
    case OpKind::Y: s.push(op); return;
    case OpKind::SX:
    case OpKind::SXdg:
        // SX = H S H exactly; SXdg = H Sdg H.
        s.h(w);
        s.phase(Angle::pi_times(op.kind == OpKind::SX ? 1 : -1, 2), {Lit::pos(w)});
        s.h(w);
        return;
    case OpKind::RZ: rz(s, budget, op.angle, w); return;
    case OpKind::RX:
        s.h(w);
        rz(s, budget, op.angle, w);
        s.h(w);
        return;
    case OpKind::RY:
        // Ry = S Rx Sdg.
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(w)});
        s.h(w);
        rz(s, budget, op.angle, w);
        s.h(w);
        s.phase(Angle::pi_times(1, 2), {Lit::pos(w)});
        return;
    case OpKind::U:
    case OpKind::R: {
        std::vector<Op> word;
        Angle gp;
        if (synthesize_1q(ir::one_qubit_matrix(op), w, OneQubitBasis::CliffordT, word, gp)) {
            for (Op& o : word) s.push(o);
            s.add_global_phase(gp);
            return;
        }
        // Arbitrary angles: U(theta, phi, lambda) = e^{i(phi+lambda)/2} Rz(phi) Ry(theta) Rz(lambda)
        // and R(theta, phi) = Rz(phi) Rx(theta) Rz(-phi), each Rz approximated.
        const Angle theta = op.angle, phi = op.phi();
        const Angle first = op.kind == OpKind::U ? op.lambda() : -phi;
        rz(s, budget, first, w);
        if (op.kind == OpKind::U) s.phase(Angle::pi_times(-1, 2), {Lit::pos(w)});  // Ry = S Rx Sdg
        s.h(w);
        rz(s, budget, theta, w);
        s.h(w);
        if (op.kind == OpKind::U) s.phase(Angle::pi_times(1, 2), {Lit::pos(w)});
        rz(s, budget, phi, w);
        if (op.kind == OpKind::U) s.add_global_phase((phi + op.lambda()).divided_by(2));
        return;
    }
    case OpKind::Swap:
        s.cx(Lit::pos(op.target), op.target2);
        s.cx(Lit::pos(op.target2), op.target);
        s.cx(Lit::pos(op.target), op.target2);
        return;
    case OpKind::XX: xx(s, budget, op.angle, op.target, op.target2); return;
    case OpKind::ISwap: {
        // iSWAP = exp(i pi/4 (XX + YY)) = XX(-pi/2) YY(-pi/2); YY(a) = (S x S) XX(a) (Sdg x Sdg).
        const Angle m = Angle::pi_times(-1, 2);
        xx(s, budget, m, op.target, op.target2);
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(op.target)});
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(op.target2)});
        xx(s, budget, m, op.target, op.target2);
        s.phase(Angle::pi_times(1, 2), {Lit::pos(op.target)});
        s.phase(Angle::pi_times(1, 2), {Lit::pos(op.target2)});
        return;
    }
    default: break;
    }
    throw UserError(fmt::format("{} has no clifford+t form", describe_op(c, op, false)), op.loc);
}

void to_nct(const Op& op, OpSink& s, const ir::Circuit& c) {
    s.inherit(op);
    const bool classical = !op.is_conditioned() &&
                           (op.kind == OpKind::Barrier || (op.kind == OpKind::X && op.controls.size() <= 2) ||
                            (op.kind == OpKind::Swap && op.controls.empty()));
    if (!classical)
        throw UserError(fmt::format("{} is not a NOT, CNOT or Toffoli: the nct target takes only classical "
                                    "reversible gates",
                                    describe_op(c, op, false)),
                        op.loc);
    if (op.kind == OpKind::Barrier) {
        s.push(op);
        return;
    }
    if (op.kind == OpKind::Swap) {
        s.cx(Lit::pos(op.target), op.target2);
        s.cx(Lit::pos(op.target2), op.target);
        s.cx(Lit::pos(op.target), op.target2);
        return;
    }
    flip_negative(s, op.controls);
    s.x(op.target, positive_of(op.controls));
    flip_negative(s, op.controls);
}

}  // namespace whittle::lowering
