// The clifford+t target: exact rewrites into H, S, Sdg, T, Tdg, X, Y, Z and CNOT.
#include <fmt/format.h>

#include "ir/error.h"
#include "ir/resources.h"
#include "lowering/euler.h"
#include "lowering/target_lowering.h"
#include "lowering/toffoli_forms.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

[[noreturn]] void not_pi_over_4(const ir::Circuit& c, const Op& op) {
    throw UserError(fmt::format("{} has an angle that is not a multiple of pi/4; clifford+t takes only those "
                                "until rotation synthesis is available (or pick a rotation target)",
                                describe_op(c, op, false)),
                    op.loc);
}

void phase_word(OpSink& s, const ir::Circuit& c, const Op& origin, Angle a, uint32_t w) {
    const int e = a.eighths();
    if (e < 0) not_pi_over_4(c, origin);
    std::vector<Op> word;
    append_phase_word(e, w, word);
    for (Op& op : word) s.push(op);
}

void rz(OpSink& s, const ir::Circuit& c, const Op& origin, Angle a, uint32_t w) {
    // Rz(a) = e^{-ia/2} diag(1, e^{ia}).
    phase_word(s, c, origin, a, w);
    s.add_global_phase(-a.divided_by(2));
}

void cnot(OpSink& s, Lit control, uint32_t t) {
    if (!control.positive()) s.x(control.wire());
    s.cx(Lit::pos(control.wire()), t);
    if (!control.positive()) s.x(control.wire());
}

/// XX(a) = (H x H) CX Rz_b(a) CX (H x H).
void xx(OpSink& s, const ir::Circuit& c, const Op& origin, Angle a, uint32_t p, uint32_t q) {
    s.h(p);
    s.h(q);
    s.cx(Lit::pos(p), q);
    rz(s, c, origin, a, q);
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
        where = fmt::format(" ({}:{}:{})", file, op.loc.line, op.loc.column);
    }
    std::string wires;
    for (uint32_t w : op.wires()) wires += (wires.empty() ? "" : ",") + c.wire_name(w);
    return fmt::format("'{}' on {}{}", ir::gate_name(op), wires, where);
}

void to_clifford_t(const Op& op, OpSink& s, const ir::Circuit& c) {
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
            if (!l.positive()) s.add_global_phase(op.angles[0]);
            phase_word(s, c, op, l.positive() ? op.angles[0] : -op.angles[0], l.wire());
            return;
        }
        if (op.angles[0] != Angle::pi_times(1) || nc > 3) needs_controls_lowered();
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
        phase_word(s, c, op, op.angles[0], last);
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
    case OpKind::RZ: rz(s, c, op, op.angles[0], w); return;
    case OpKind::RX:
        s.h(w);
        rz(s, c, op, op.angles[0], w);
        s.h(w);
        return;
    case OpKind::RY:
        // Ry = S Rx Sdg.
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(w)});
        s.h(w);
        rz(s, c, op, op.angles[0], w);
        s.h(w);
        s.phase(Angle::pi_times(1, 2), {Lit::pos(w)});
        return;
    case OpKind::U:
    case OpKind::R: {
        std::vector<Op> word;
        Angle gp;
        if (!synthesize_1q(ir::one_qubit_matrix(op), w, OneQubitBasis::CliffordT, word, gp)) not_pi_over_4(c, op);
        for (Op& o : word) s.push(o);
        s.add_global_phase(gp);
        return;
    }
    case OpKind::Swap:
        s.cx(Lit::pos(op.target), op.target2);
        s.cx(Lit::pos(op.target2), op.target);
        s.cx(Lit::pos(op.target), op.target2);
        return;
    case OpKind::XX: xx(s, c, op, op.angles[0], op.target, op.target2); return;
    case OpKind::ISwap: {
        // iSWAP = exp(i pi/4 (XX + YY)) = XX(-pi/2) YY(-pi/2); YY(a) = (S x S) XX(a) (Sdg x Sdg).
        const Angle m = Angle::pi_times(-1, 2);
        xx(s, c, op, m, op.target, op.target2);
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(op.target)});
        s.phase(Angle::pi_times(-1, 2), {Lit::pos(op.target2)});
        xx(s, c, op, m, op.target, op.target2);
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
