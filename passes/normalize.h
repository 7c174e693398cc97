// normalize: rewrites every op into whittle's canonical forms (see the function's comment).
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// Canonical forms, so later passes compare ops structurally:
///  - literals of every op sorted by wire; swap wires in increasing order;
///  - diagonal gates are phases: uncontrolled RZ(t) on w = Phase(t) on w with global phase -t/2;
///    RZ(t) under controls C = Phase(-t/2) on C and Phase(t) on C & w; U(0, p, l) = Phase(p + l) on
///    the target (under its controls); a Parity on one wire is a Phase on it;
///  - a Phase on a single negative literal !w becomes Phase(-t) on w with global phase t (a
///    one-wire phase is always on a positive literal); multi-literal products keep their
///    polarities (one op: lowering handles negative controls);
///  - zero angles (Phase, Parity, RX, RY, RZ, U(0, p, -p)) are dropped.
/// Leaves the circuit untouched when it already is canonical.
PassResult normalize(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
