// Reference semantics for X-type circuits: bit-parallel simulation, 64 basis inputs per machine word.
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::ir {

/// True when every op is X-type (X/CNOT/Toffoli/MCX, swaps, controlled swaps, barriers).
bool is_classical(const Circuit& c);

/// Runs the X-type circuit on 64 inputs at once: `wires[w]` holds bit w of 64 basis states (bit j
/// of the word = input j). InternalError on a non-X-type op.
void simulate_bits(const Circuit& c, std::vector<uint64_t>& wires);

/// The output basis state of an X-type circuit of up to 64 wires for one input (bit w = wire w).
uint64_t simulate_basis(const Circuit& c, uint64_t input);

}  // namespace whittle::ir
