// Exact synthesis of one-qubit unitaries over D[omega] = Z[1/sqrt2, i] into H, S, T and Paulis
// (Kliuchnikov, Maslov, Mosca 2013, arXiv:1206.5236).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "synthesis/ring_zomega.h"

namespace whittle::lowering {

/// The one-qubit Clifford+T gates the synthesis emits.
enum class CliffordTGate : uint8_t { H, S, Sdg, T, Tdg, X, Y, Z };

/// Lowercase gate name: h, s, sdg, t, tdg, x, y, z.
const char* clifford_t_gate_name(CliffordTGate g);
/// Number of T and T-dagger gates in a sequence.
int t_count(const std::vector<CliffordTGate>& gates);

/// The 2x2 matrix M / sqrt2^k with M over Z[omega]; reduce() makes k the smallest denominator exponent.
struct DOmegaMatrix {
    ZOmega m[2][2];
    int k = 0;

    static DOmegaMatrix identity();
    static DOmegaMatrix of_gate(CliffordTGate g);
    DOmegaMatrix operator*(const DOmegaMatrix& o) const;
    /// The matrix times omega^n (a global phase of n*pi/4).
    DOmegaMatrix times_omega_pow(int n) const;
    /// Divides M by sqrt2 while every entry allows it (k may stay > 0 only when needed).
    void reduce();
    /// M^dagger M == 2^k I, checked exactly.
    bool is_unitary() const;
    /// Equality of the represented matrices (k normalized on both sides).
    bool operator==(const DOmegaMatrix& o) const;
    std::string to_string() const;
};

/// The matrix of a gate sequence in circuit order (gates[0] acts first), times omega^phase_eighths.
DOmegaMatrix matrix_of(const std::vector<CliffordTGate>& gates, int phase_eighths = 0);

struct ExactSynthesis {
    std::vector<CliffordTGate> gates;  ///< circuit order: gates[0] acts first
    int global_phase_eighths = 0;      ///< unitary = omega^global_phase_eighths * product of gates
    int t_count = 0;
};

/// A Clifford+T circuit for a unitary with entries in D[omega], T-count minimal for it: the KMM
/// reduction of sde(|u00|^2) by H T^j steps down to sde < 4, then a table of all unitaries of
/// T-count <= 6 (Matsumoto-Amano normal forms). The phase is exact.
ExactSynthesis synthesize_exact(const DOmegaMatrix& unitary);

}  // namespace whittle::lowering
