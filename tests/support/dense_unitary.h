// Test support: the full 2^n x 2^n matrix of a small circuit, built from each op's textbook definition.
//
// An independent reading of the IR's op semantics (ir/circuit.h), written for tests only: it shares
// no code with the compiler. Wire w is bit w of the basis-state index. Matrices used (Nielsen &
// Chuang ch. 4, common practice; U as OpenQASM's u3, Cross et al. 2017, arXiv:1707.03429):
//   H = [[1,1],[1,-1]]/sqrt2, Y = [[0,-i],[i,0]], SX = [[1+i,1-i],[1-i,1+i]]/2, SXdg = SX^dagger,
//   RX(t) = [[c,-is],[-is,c]], RY(t) = [[c,-s],[s,c]], RZ(t) = diag(e^{-it/2}, e^{it/2}) (c,s of t/2),
//   U(t,p,l) = [[c, -e^{il} s], [e^{ip} s, e^{i(p+l)} c]], R(t,p) = [[c, -i e^{-ip} s], [-i e^{ip} s, c]],
//   Phase: e^{i t} on states where every literal holds; Parity: e^{i t} where the wires' xor is 1;
//   iSWAP: |01> -> i|10>, |10> -> i|01>; XX(t) = cos(t/2) I - i sin(t/2) X(x)X.
// Controls apply to X/H/Y/SX/SXdg/RX/RY/RZ/U/Swap with their polarity. Angles are used as stored.
#pragma once

#include <cmath>
#include <complex>
#include <stdexcept>
#include <vector>

#include <Eigen/Dense>

#include "ir/circuit.h"

namespace whittle::test {

using Cplx = std::complex<double>;
using Mat = Eigen::MatrixXcd;
using Mat2 = Eigen::Matrix2cd;

inline Mat2 reference_one_qubit_matrix(const ir::Op& op) {
    const Cplx i(0, 1);
    const double t = op.angle.to_radians();
    const double c = std::cos(t / 2), s = std::sin(t / 2);
    Mat2 m;
    switch (op.kind) {
    case ir::OpKind::X: m << 0, 1, 1, 0; return m;
    case ir::OpKind::Y: m << 0, -i, i, 0; return m;
    case ir::OpKind::H: m << 1, 1, 1, -1; return m / std::sqrt(2.0);
    case ir::OpKind::SX: m << Cplx(1, 1), Cplx(1, -1), Cplx(1, -1), Cplx(1, 1); return m / 2.0;
    case ir::OpKind::SXdg: m << Cplx(1, -1), Cplx(1, 1), Cplx(1, 1), Cplx(1, -1); return m / 2.0;
    case ir::OpKind::RX: m << c, -i * s, -i * s, c; return m;
    case ir::OpKind::RY: m << c, -s, s, c; return m;
    case ir::OpKind::RZ: m << std::exp(-i * (t / 2)), 0, 0, std::exp(i * (t / 2)); return m;
    case ir::OpKind::U: {
        const double p = op.phi().to_radians(), l = op.lambda().to_radians();
        m << c, -std::exp(i * l) * s, std::exp(i * p) * s, std::exp(i * (p + l)) * c;
        return m;
    }
    case ir::OpKind::R: {
        const double p = op.phi().to_radians();
        m << c, -i * std::exp(-i * p) * s, -i * std::exp(i * p) * s, c;
        return m;
    }
    default: throw std::logic_error("dense_unitary: not a one-qubit op");
    }
}

/// Applies one op to a state vector in place.
inline void apply_op(const ir::Op& op, Eigen::VectorXcd& v) {
    if (op.is_conditioned()) throw std::logic_error("dense_unitary: classically conditioned op");
    const Cplx i(0, 1);
    const size_t dim = size_t(v.size());
    auto bit = [](size_t idx, uint32_t w) { return (idx >> w) & 1u; };
    auto lits_hold = [&](size_t idx) {
        for (ir::Lit l : op.controls)
            if (bit(idx, l.wire()) != (l.positive() ? 1u : 0u)) return false;
        return true;
    };
    switch (op.kind) {
    case ir::OpKind::Barrier: return;
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: throw std::logic_error("dense_unitary: measurement or reset");
    case ir::OpKind::Phase: {
        const Cplx ph = std::exp(i * op.angle.to_radians());
        for (size_t k = 0; k < dim; ++k)
            if (lits_hold(k)) v[Eigen::Index(k)] *= ph;
        return;
    }
    case ir::OpKind::Parity: {
        const Cplx ph = std::exp(i * op.angle.to_radians());
        for (size_t k = 0; k < dim; ++k) {
            unsigned p = 0;
            for (ir::Lit l : op.controls) p ^= bit(k, l.wire());
            if (p) v[Eigen::Index(k)] *= ph;
        }
        return;
    }
    case ir::OpKind::Swap:
    case ir::OpKind::ISwap: {
        const size_t a = size_t(1) << op.target, b = size_t(1) << op.target2;
        const Cplx f = op.kind == ir::OpKind::ISwap ? i : Cplx(1);
        for (size_t k = 0; k < dim; ++k) {
            if (!(k & a) || (k & b) || !lits_hold(k)) continue;
            const size_t j = k ^ a ^ b;
            std::swap(v[Eigen::Index(k)], v[Eigen::Index(j)]);
            v[Eigen::Index(k)] *= f;
            v[Eigen::Index(j)] *= f;
        }
        return;
    }
    case ir::OpKind::XX: {
        const double t = op.angle.to_radians();
        const Cplx c = std::cos(t / 2), s = -i * std::sin(t / 2);
        const size_t flip = (size_t(1) << op.target) | (size_t(1) << op.target2);
        Eigen::VectorXcd w = v;
        for (size_t k = 0; k < dim; ++k) w[Eigen::Index(k)] = c * v[Eigen::Index(k)] + s * v[Eigen::Index(k ^ flip)];
        v = w;
        return;
    }
    default: {
        const Mat2 m = reference_one_qubit_matrix(op);
        const size_t tb = size_t(1) << op.target;
        for (size_t k = 0; k < dim; ++k) {
            if ((k & tb) || !lits_hold(k)) continue;
            const Cplx a0 = v[Eigen::Index(k)], a1 = v[Eigen::Index(k | tb)];
            v[Eigen::Index(k)] = m(0, 0) * a0 + m(0, 1) * a1;
            v[Eigen::Index(k | tb)] = m(1, 0) * a0 + m(1, 1) * a1;
        }
        return;
    }
    }
}

/// The circuit's unitary, including Circuit::global_phase. For up to ~10 qubits.
inline Mat dense_unitary(const ir::Circuit& c) {
    const size_t dim = size_t(1) << c.num_qubits();
    const Eigen::Index n = Eigen::Index(dim);
    Mat u(n, n);
    const Cplx gp = std::exp(Cplx(0, 1) * c.global_phase.to_radians());
    for (size_t col = 0; col < dim; ++col) {
        Eigen::VectorXcd v = Eigen::VectorXcd::Zero(Eigen::Index(dim));
        v[Eigen::Index(col)] = 1;
        for (const ir::Op& op : c.ops) apply_op(op, v);
        u.col(Eigen::Index(col)) = gp * v;
    }
    return u;
}

/// max |a - e^{i phi} b| over entries, for the phi that lines up the largest entry of b.
inline double distance_up_to_phase(const Mat& a, const Mat& b) {
    if (a.rows() != b.rows() || a.cols() != b.cols()) return 1e9;
    Eigen::Index r = 0, cidx = 0;
    b.cwiseAbs().maxCoeff(&r, &cidx);
    if (std::abs(b(r, cidx)) < 1e-12) return (a - b).cwiseAbs().maxCoeff();
    Cplx ratio = a(r, cidx) / b(r, cidx);
    if (std::abs(ratio) < 1e-12) return 1e9;
    ratio /= std::abs(ratio);
    return (a - ratio * b).cwiseAbs().maxCoeff();
}

/// max |a - b| (exact equality, phase included).
inline double distance_exact(const Mat& a, const Mat& b) {
    if (a.rows() != b.rows() || a.cols() != b.cols()) return 1e9;
    return (a - b).cwiseAbs().maxCoeff();
}


/// The truth from this independent reference: the columns of the inputs with every clean wire of `a`
/// at |0> agree up to one global phase (what the equivalence checker must decide).
inline bool dense_equivalent(const ir::Circuit& a, const ir::Circuit& b) {
    const Eigen::MatrixXcd ua = dense_unitary(a), ub = dense_unitary(b);
    std::vector<Eigen::Index> cols;
    for (Eigen::Index j = 0; j < ua.cols(); ++j) {
        bool clean_zero = true;
        for (uint32_t w = 0; w < a.num_qubits(); ++w)
            if (a.qubits[w].role == ir::Role::Clean && ((j >> w) & 1)) clean_zero = false;
        if (clean_zero) cols.push_back(j);
    }
    Eigen::MatrixXcd ra(ua.rows(), Eigen::Index(cols.size())), rb(ub.rows(), Eigen::Index(cols.size()));
    for (size_t k = 0; k < cols.size(); ++k) {
        ra.col(Eigen::Index(k)) = ua.col(cols[k]);
        rb.col(Eigen::Index(k)) = ub.col(cols[k]);
    }
    return distance_up_to_phase(ra, rb) < 1e-9;
}

}  // namespace whittle::test
