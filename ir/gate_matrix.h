// The matrices of the IR's one- and two-qubit gate kinds (the reference definitions every engine uses).
#pragma once

#include <complex>

#include <Eigen/Dense>

#include "ir/circuit.h"

namespace whittle::ir {

using Complex = std::complex<double>;
using Mat2 = Eigen::Matrix2cd;
using Mat4 = Eigen::Matrix4cd;

/// The 2x2 matrix the op applies to its target when its controls hold: X, H, Y, SX, SXdg, RX, RY,
/// RZ, U, R, and Phase/Parity on one wire (diag(1, e^{i angle})). InternalError for other kinds.
Mat2 one_qubit_matrix(const Op& op);

/// The 4x4 matrix of a two-qubit native gate (ISwap, XX, uncontrolled Swap) on (target, target2),
/// basis index = 2*bit(target) + bit(target2).
Mat4 two_qubit_matrix(const Op& op);

}  // namespace whittle::ir
