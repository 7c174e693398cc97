// One-qubit synthesis: Euler angles (ZYZ, ZXZ) and resynthesis of a 2x2 unitary into a target's axes.
#pragma once

#include <vector>

#include "ir/circuit.h"
#include "ir/gate_matrix.h"

namespace whittle::lowering {

/// U = e^{i*phase} R1(a) R2(b) R1(c) (R1/R2 = Z/Y for ZYZ, Z/X for ZXZ; Nielsen & Chuang Thm 4.1).
/// Angles within 1e-12 of k*pi/d (d <= 64) come back exact; rotations that vanish come back 0.
struct EulerAngles {
    ir::Angle phase, a, b, c;
};
EulerAngles euler_zyz(const ir::Mat2& u);
EulerAngles euler_zxz(const ir::Mat2& u);

/// The exact angle k*pi/d (d <= 64) within 1e-12 of `radians`, else an inexact angle.
ir::Angle snap_angle(double radians);

/// (sx*x + sy*y)/2 computed from the representatives the gate matrices use (exact angles in
/// [0, 2*pi)), not from the sum reduced mod 2*pi first: halving after reduction can be off by pi.
ir::Angle half_of_sum(const ir::Angle& x, int sx, const ir::Angle& y, int sy);

/// The one-qubit gate vocabularies of the targets.
enum class OneQubitBasis : uint8_t {
    CliffordT,  ///< H, S, Sdg, T, Tdg, X, Y, Z (exact multiples of pi/4 only)
    ZSX,        ///< Rz, sqrt(X), X (cx+rz+sx)
    ZXZ,        ///< Rz, Rx (cz+rx+rz, iswap+rz+rx)
    RRz,        ///< R(theta, phi), Rz (xx+r)
    U3,         ///< U(theta, phi, lambda) (u+cx)
};

/// Appends gates of `basis` on wire `w` equal to `u` times a global phase, which is added to
/// `global_phase`. Returns false and appends nothing when `u` has no exact form in the basis
/// (CliffordT and Euler angles that are not multiples of pi/4).
bool synthesize_1q(const ir::Mat2& u, uint32_t w, OneQubitBasis basis, std::vector<ir::Op>& out,
                   ir::Angle& global_phase);

/// The product (later ops on the left) of one-qubit ops, all on the same wire, unconditioned.
ir::Mat2 one_qubit_product(const std::vector<ir::Op>& ops);

/// Appends the Clifford+T word for the phase e^{i*k*pi/4 * x} on wire w (T, S, Z, S T, Z T, Sdg, Tdg).
void append_phase_word(int eighths, uint32_t w, std::vector<ir::Op>& out);

}  // namespace whittle::lowering
