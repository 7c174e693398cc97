// zx-merge: phase merges found by ZX simplification, written back into the circuit (phase teleportation).
#pragma once

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// Phase teleportation (Kissinger, van de Wetering 2020, arXiv:1903.10477): the circuit becomes a
/// ZX diagram whose one-wire non-Clifford phases (Phase on one literal, one-wire Parity, RZ) are
/// tracked; full graph-like simplification (zx/simplify.h) fuses them into groups, and the
/// simplified diagram depends on each group only through its signed sum. That sum is written into
/// the group's first op and the others are removed, so the circuit keeps its CNOT and H structure
/// and only loses phases. A group is rewritten only when its T-count does not rise and it loses an
/// op (so T never rises and CNOTs never change). Exact global phase is kept. Ops the diagram cannot
/// hold (measurements, conditions, controlled H ...) cut their wires: no phase merges across them.
/// Leaves the circuit untouched when no group improves.
PassResult zx_merge(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
