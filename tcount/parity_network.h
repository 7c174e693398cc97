// CNOT + phase circuit synthesis for a phase polynomial and a linear output map (Gray-code parity networks).
#pragma once

#include <cstdint>
#include <vector>

#include "ir/angle.h"

namespace whittle::tcount {

/// One gate of a synthesized region, on region wire indices.
struct NetOp {
    enum class Kind : uint8_t { Cnot, Phase, Not };
    Kind kind = Kind::Cnot;
    uint32_t a = 0;  ///< Cnot: control; Phase, Not: the wire
    uint32_t b = 0;  ///< Cnot: target
    ir::Angle angle; ///< Phase: diag(1, e^{i angle}), or diag(e^{i angle}, 1) when `complement`
    bool complement = false;
};

/// A phase e^{i angle (parity . x)} to place (e^{i angle (1 ^ parity . x)} when `complement`).
struct PhaseToPlace {
    uint64_t parity = 0;
    ir::Angle angle;
    bool complement = false;
};

/// Wires 0..n-1 start holding x_0..x_{n-1}. Returns CNOT, phase and NOT gates that apply every
/// term's phase (each where some wire holds its parity) and leave wire i holding
/// (out_parity[i] . x) ^ out_flip[i]. out_parity must be invertible. The phases are placed by the
/// Gray-code parity network of Amy, Azimzadeh, Mosca 2018 (arXiv:1712.01859, "GraySynth"; from
/// memory of the method): split the parities on the row that separates them most evenly, reduce
/// each part's common rows into one target wire by CNOTs, so that neighbouring parities differ by
/// few CNOTs. The remaining linear map is then synthesized by Gauss-Jordan elimination.
std::vector<NetOp> synthesize_parity_network(uint32_t n, const std::vector<PhaseToPlace>& terms,
                                             const std::vector<uint64_t>& out_parity,
                                             const std::vector<uint8_t>& out_flip);

/// CNOTs taking wires that hold `from` (rows = wire values as parities of x) to `to`; both invertible.
std::vector<NetOp> synthesize_linear(uint32_t n, std::vector<uint64_t> from, const std::vector<uint64_t>& to);

}  // namespace whittle::tcount
