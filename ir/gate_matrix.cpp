// Gate matrices (Nielsen & Chuang ch. 4 conventions; u3 as in OpenQASM 2.0, arXiv:1707.03429).
#include "ir/gate_matrix.h"

#include <cmath>

#include "ir/error.h"

namespace whittle::ir {

Mat2 one_qubit_matrix(const Op& op) {
    const Complex i(0, 1);
    const double a = op.angle.to_radians();
    Mat2 m;
    switch (op.kind) {
    case OpKind::X: m << 0, 1, 1, 0; return m;
    case OpKind::Y: m << 0, -i, i, 0; return m;
    case OpKind::H: {
        const double r = 1.0 / std::sqrt(2.0);
        m << r, r, r, -r;
        return m;
    }
    case OpKind::SX: m << Complex(0.5, 0.5), Complex(0.5, -0.5), Complex(0.5, -0.5), Complex(0.5, 0.5); return m;
    case OpKind::SXdg: m << Complex(0.5, -0.5), Complex(0.5, 0.5), Complex(0.5, 0.5), Complex(0.5, -0.5); return m;
    case OpKind::RX: m << std::cos(a / 2), -i * std::sin(a / 2), -i * std::sin(a / 2), std::cos(a / 2); return m;
    case OpKind::RY: m << std::cos(a / 2), -std::sin(a / 2), std::sin(a / 2), std::cos(a / 2); return m;
    case OpKind::RZ: m << std::exp(-i * (a / 2)), 0, 0, std::exp(i * (a / 2)); return m;
    case OpKind::Phase:
    case OpKind::Parity: m << 1, 0, 0, std::exp(i * a); return m;
    case OpKind::U: {
        const double phi = op.phi().to_radians(), lam = op.lambda().to_radians();
        m << std::cos(a / 2), -std::exp(i * lam) * std::sin(a / 2), std::exp(i * phi) * std::sin(a / 2),
            std::exp(i * (phi + lam)) * std::cos(a / 2);
        return m;
    }
    case OpKind::R: {
        const double phi = op.phi().to_radians();
        m << std::cos(a / 2), -i * std::exp(-i * phi) * std::sin(a / 2), -i * std::exp(i * phi) * std::sin(a / 2),
            std::cos(a / 2);
        return m;
    }
    case OpKind::Swap:
    case OpKind::ISwap:
    case OpKind::XX:
    case OpKind::Measure:
    case OpKind::Reset:
    case OpKind::Barrier: break;
    }
    throw InternalError("internal error: one_qubit_matrix: not a one-qubit gate");
}

Mat4 two_qubit_matrix(const Op& op) {
    const Complex i(0, 1);
    Mat4 m = Mat4::Zero();
    switch (op.kind) {
    case OpKind::Swap:
        m(0, 0) = m(3, 3) = 1;
        m(1, 2) = m(2, 1) = 1;
        return m;
    case OpKind::ISwap:
        m(0, 0) = m(3, 3) = 1;
        m(1, 2) = m(2, 1) = i;
        return m;
    case OpKind::XX: {
        const double a = op.angle.to_radians();
        const Complex c = std::cos(a / 2), s = -i * std::sin(a / 2);
        m(0, 0) = m(1, 1) = m(2, 2) = m(3, 3) = c;
        m(0, 3) = m(3, 0) = m(1, 2) = m(2, 1) = s;
        return m;
    }
    default: break;
    }
    throw InternalError("internal error: two_qubit_matrix: not a two-qubit native gate");
}

}  // namespace whittle::ir
