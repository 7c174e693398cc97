// Hadamard gadgets: inner H gates replaced by a measured fresh wire, so a Clifford+T stretch is one phase polynomial.
#pragma once

#include <cstddef>
#include <cstdint>

#include "ir/circuit.h"

namespace whittle::tcount {

struct GadgetSettings {
    uint32_t max_wires = 0;   ///< fresh clean wires at most (every stretch reuses them: each ends at |0>)
    uint32_t max_width = 64;  ///< wires per stretch, its own and its gadgets' (at most 64: a region's width)
};

struct GadgetStats {
    size_t gadgets = 0;            ///< H gates replaced by a gadget
    size_t stretches = 0;          ///< stretches holding at least one gadget
    size_t hadamards_dropped = 0;  ///< H gates of even runs on one wire inside a stretch (H H = 1)
    uint32_t wires = 0;            ///< fresh wires added (register `gadget`)
};

/// Cuts the circuit into stretches of H gates and Hadamard-free region ops whose angles are
/// multiples of pi/4 (anything else ends a stretch). In a stretch, the H gates on a wire before its
/// first other op and after its last stay (moved to the stretch's ends); every other H on wire q,
/// while fresh wires and width allow, becomes a gadget on a fresh wire a prepared in |+> at the
/// stretch's start: CZ(q, a) then SWAP(q, a), after which q holds the new path variable and a the
/// value q had. At the stretch's end each a is measured in the X basis in gadget order; outcome m
/// leaves the circuit with X^m on q after that H (textbook teleportation reasoning), and the
/// correction applied on outcome 1 is D X_q D^dagger, D the rest of the stretch: with D|v> =
/// e^{i pi/4 f(v)} |M v + b>, it is the phase -2 c_p pi/4 on each parity p of f holding q (S-class:
/// Clifford), read on the current wires through M^{-1}, then X on the wires whose value holds q.
/// It never touches an earlier gadget's wire (D does not), so each wire is measured before the
/// corrections that follow and returned to |0> by a conditioned X. The stretch's middle is then
/// CNOT, CZ, SWAP and phases only: one Hadamard-free region on n + h wires for reduce_t_count.
/// Leaves the circuit untouched (false) when no H is replaced; no T gate is added.
bool insert_hadamard_gadgets(ir::Circuit& c, const GadgetSettings& settings, GadgetStats& stats);

}  // namespace whittle::tcount
