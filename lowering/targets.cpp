// Target names and gate membership.
#include "lowering/targets.h"

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::lowering {
namespace {

using ir::OpKind;

bool is_phase_word_gate(const ir::Op& op) {
    // S, Sdg, T, Tdg, Z: one positive literal, angle in {pi/4, pi/2, pi, -pi/2, -pi/4}.
    if (op.kind != OpKind::Phase || op.controls.size() != 1 || !op.controls[0].positive()) return false;
    const int e = op.angle.eighths();
    return e == 1 || e == 2 || e == 4 || e == 6 || e == 7;
}

bool positive(const ir::Op& op) {
    for (ir::Lit l : op.controls)
        if (!l.positive()) return false;
    return true;
}

}  // namespace

OneQubitBasis one_qubit_basis(Target t) {
    switch (t) {
    case Target::CliffordT:
    case Target::Nct: return OneQubitBasis::CliffordT;
    case Target::CxRzSx: return OneQubitBasis::ZSX;
    case Target::CzRxRz:
    case Target::ISwapRzRx: return OneQubitBasis::ZXZ;
    case Target::XxR: return OneQubitBasis::RRz;
    case Target::UCx: return OneQubitBasis::U3;
    }
    return OneQubitBasis::U3;
}

Entangler entangler(Target t) {
    switch (t) {
    case Target::CzRxRz: return Entangler::CZ;
    case Target::ISwapRzRx: return Entangler::ISwap;
    case Target::XxR: return Entangler::XX;
    case Target::CliffordT:
    case Target::CxRzSx:
    case Target::UCx:
    case Target::Nct: return Entangler::CX;
    }
    return Entangler::CX;
}

bool in_target(const ir::Op& op, Target t) {
    const size_t nc = op.controls.size();
    switch (op.kind) {
    case OpKind::Barrier: return true;
    case OpKind::Measure:
    case OpKind::Reset: return t != Target::Nct;
    default: break;
    }
    const bool cnot = op.kind == OpKind::X && nc == 1 && positive(op);
    const bool x = op.kind == OpKind::X && nc == 0;
    const bool uncontrolled = nc == 0;
    switch (t) {
    case Target::CliffordT:
        return x || cnot || (uncontrolled && (op.kind == OpKind::H || op.kind == OpKind::Y)) || is_phase_word_gate(op);
    case Target::Nct: return op.kind == OpKind::X && nc <= 2 && positive(op) && !op.is_conditioned();
    case Target::CxRzSx: return x || cnot || (uncontrolled && (op.kind == OpKind::RZ || op.kind == OpKind::SX));
    case Target::CzRxRz:
        return (op.kind == OpKind::Phase && nc == 2 && positive(op) && op.angle == ir::Angle::pi_times(1)) ||
               (uncontrolled && (op.kind == OpKind::RX || op.kind == OpKind::RZ));
    case Target::ISwapRzRx:
        return op.kind == OpKind::ISwap || (uncontrolled && (op.kind == OpKind::RX || op.kind == OpKind::RZ));
    case Target::XxR: return op.kind == OpKind::XX || op.kind == OpKind::R || (uncontrolled && op.kind == OpKind::RZ);
    case Target::UCx: return cnot || (uncontrolled && op.kind == OpKind::U);
    }
    return false;
}

}  // namespace whittle::lowering
