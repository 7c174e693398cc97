// Two-qubit KAK (Cartan) decomposition: magic basis, Weyl-chamber coordinates, local equivalence.
#pragma once

#include "ir/gate_matrix.h"

namespace whittle::lowering {

/// Coordinates (x, y, z) with U = (A1 x A2) exp(i(x XX + y YY + z ZZ)) (B1 x B2) up to phase, each
/// reduced into (-pi/4, pi/4] (shifts by pi/2 are local). Any representative of the Weyl orbit;
/// counts of zero and +-pi/4 coordinates do not depend on which.
struct WeylCoords {
    double x = 0, y = 0, z = 0;
};
WeylCoords weyl_coordinates(const ir::Mat4& u);

/// exp(i(x XX + y YY + z ZZ)); basis index 2*bit(first) + bit(second).
ir::Mat4 canonical_gate(double x, double y, double z);

/// Minimal CNOT count (0..3) from the coordinates: 0 all zero; 1 one at +-pi/4 and two zero; 2 at
/// least one zero; else 3 (Vatan & Williams 2004, quant-ph/0308006: 3 always suffice).
int min_cnot_count(const ir::Mat4& u, double tol = 1e-9);

/// Minimal CNOT count by the Shende-Bullock-Markov criteria on gamma(U) = U (Y x Y) U^T (Y x Y),
/// U in SU(4) (quant-ph/0308045; criteria from memory): gamma = +-I -> 0; tr gamma = 0 and
/// gamma^2 = -I -> 1; tr gamma real -> 2; else 3. Independent of the coordinates above.
int sbm_cnot_count(const ir::Mat4& u, double tol = 1e-9);

/// u = e^{i phase} (after_a x after_b) c (before_a x before_b) for two locally equivalent gates.
struct LocalMatch {
    ir::Mat2 before_a, before_b, after_a, after_b;
    double phase = 0;
    double error = 0;  ///< operator-norm-like residual (Frobenius / 2)
};
/// WHITTLE_ASSERTs that u and c are locally equivalent (same magic-basis spectrum).
LocalMatch match_locals(const ir::Mat4& u, const ir::Mat4& c);

/// Splits a 4x4 matrix equal to A x B (up to rounding) into A and B with det B = 1.
void split_tensor(const ir::Mat4& l, ir::Mat2& a, ir::Mat2& b);

/// A x B as a 4x4 matrix (A on the first wire).
ir::Mat4 kron(const ir::Mat2& a, const ir::Mat2& b);

}  // namespace whittle::lowering
