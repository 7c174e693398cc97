// Generators of large benchmark inputs, as OpenQASM 2.0 or .wq text (deterministic for a seed).
#pragma once

#include <cstdint>
#include <string>

namespace whittle::bench {

/// Random Clifford+T+Toffoli circuit over `qubits` wires with `gates` gates (h s sdg t tdg x cx ccx).
std::string random_clifford_t_qasm(uint32_t qubits, uint64_t gates, uint64_t seed);

/// The same kind of circuit (same gate mix, same random choices for a seed) written in .wq.
std::string random_clifford_t_wq(uint32_t qubits, uint64_t gates, uint64_t seed);

/// Random high-level circuit in .wq: multi-controlled X with mixed polarities, multi-controlled
/// phases, Toffolis, Hadamards, over `qubits` wires with `ops` statements.
std::string random_high_level_wq(uint32_t qubits, uint64_t ops, uint64_t seed);

/// The n-bit ripple-carry adder of Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184) in OpenQASM 2.0.
std::string cuccaro_adder_qasm(uint32_t n);

/// The same adder written in .wq.
std::string cuccaro_adder_wq(uint32_t n);

/// An n-bit schoolbook multiplier p += a*b (n controlled Cuccaro additions, as Toffolis) in OpenQASM 2.0;
/// the controlled adder's Toffolis become 3-control X gates, so it is written in .wq instead.
std::string schoolbook_multiplier_wq(uint32_t n);

}  // namespace whittle::bench
