// State-vector simulation: each op is applied in place by iterating over the affected index pairs.
#include "ir/statevector.h"

#include <cmath>

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::ir {
namespace {

/// Bitmasks for a literal set: index satisfies all controls when (idx & care) == want.
void control_masks(const LitVec& controls, uint64_t& care, uint64_t& want) {
    care = want = 0;
    for (Lit l : controls) {
        care |= uint64_t(1) << l.wire();
        if (l.positive()) want |= uint64_t(1) << l.wire();
    }
}

}  // namespace

StateVector::StateVector(uint32_t num_qubits) : n_(num_qubits) {
    if (num_qubits > kMaxQubits)
        throw UserError(fmt::format("state-vector simulation of {} qubits is over the limit of {}", num_qubits, kMaxQubits));
    amp_ = Eigen::VectorXcd::Zero(Eigen::Index(1) << num_qubits);
    amp_(0) = 1;
}

void StateVector::randomize(std::mt19937_64& rng) {
    std::normal_distribution<double> g;
    for (Eigen::Index i = 0; i < amp_.size(); ++i) amp_(i) = Complex(g(rng), g(rng));
    amp_.normalize();
}

bool condition_holds(const Op& op, const Circuit& c, const std::vector<uint8_t>& cbits) {
    if (op.cond_reg() < 0) return true;
    const ClassicalRegister& r = c.cregs.at(size_t(op.cond_reg()));
    uint64_t v = 0;
    for (uint32_t b = 0; b < r.size && b < 64; ++b)
        if (cbits.at(r.first + b)) v |= uint64_t(1) << b;
    return v == op.cond_value();
}

void StateVector::apply(const Op& op, const Circuit& c, std::vector<uint8_t>& cbits, std::mt19937_64& rng) {
    if (!condition_holds(op, c, cbits)) return;
    const uint64_t dim = uint64_t(amp_.size());
    uint64_t care, want;
    control_masks(op.controls, care, want);
    switch (op.kind) {
    case OpKind::Barrier: return;
    case OpKind::Phase: {
        const Complex f = std::polar(1.0, op.angle.to_radians());
        for (uint64_t i = 0; i < dim; ++i)
            if ((i & care) == want) amp_(Eigen::Index(i)) *= f;
        return;
    }
    case OpKind::Parity: {
        const Complex f = std::polar(1.0, op.angle.to_radians());
        for (uint64_t i = 0; i < dim; ++i)
            if (__builtin_popcountll(i & care) & 1) amp_(Eigen::Index(i)) *= f;
        return;
    }
    case OpKind::Swap:
    case OpKind::ISwap:
    case OpKind::XX: {
        const Mat4 m = two_qubit_matrix(op.kind == OpKind::Swap ? Op::swap(op.target, op.target2) : op);
        const uint64_t ba = uint64_t(1) << op.target, bb = uint64_t(1) << op.target2;
        for (uint64_t i = 0; i < dim; ++i) {
            if ((i & (ba | bb)) || (i & care) != want) continue;
            const Eigen::Index idx[4] = {Eigen::Index(i), Eigen::Index(i | bb), Eigen::Index(i | ba),
                                         Eigen::Index(i | ba | bb)};
            Eigen::Vector4cd v(amp_(idx[0]), amp_(idx[1]), amp_(idx[2]), amp_(idx[3]));
            v = m * v;
            for (int k = 0; k < 4; ++k) amp_(idx[k]) = v(k);
        }
        return;
    }
    case OpKind::Measure:
    case OpKind::Reset: {
        const uint64_t bt = uint64_t(1) << op.target;
        double p1 = 0;
        for (uint64_t i = 0; i < dim; ++i)
            if (i & bt) p1 += std::norm(amp_(Eigen::Index(i)));
        std::uniform_real_distribution<double> u(0.0, 1.0);
        const bool one = u(rng) < p1;
        const double keep = std::sqrt(one ? p1 : 1 - p1);
        for (uint64_t i = 0; i < dim; ++i) {
            const bool bit = (i & bt) != 0;
            if (bit != one) amp_(Eigen::Index(i)) = 0;
            else if (keep > 0) amp_(Eigen::Index(i)) /= keep;
        }
        if (op.kind == OpKind::Measure) {
            cbits.at(size_t(op.cbit())) = one ? 1 : 0;
        } else if (one) {
            for (uint64_t i = 0; i < dim; ++i)
                if (i & bt) std::swap(amp_(Eigen::Index(i)), amp_(Eigen::Index(i ^ bt)));
        }
        return;
    }
    case OpKind::X:
    case OpKind::H:
    case OpKind::Y:
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ:
    case OpKind::U:
    case OpKind::R: {
        const Mat2 m = one_qubit_matrix(op);
        const uint64_t bt = uint64_t(1) << op.target;
        for (uint64_t i = 0; i < dim; ++i) {
            if ((i & bt) || (i & care) != want) continue;
            const Complex a0 = amp_(Eigen::Index(i)), a1 = amp_(Eigen::Index(i | bt));
            amp_(Eigen::Index(i)) = m(0, 0) * a0 + m(0, 1) * a1;
            amp_(Eigen::Index(i | bt)) = m(1, 0) * a0 + m(1, 1) * a1;
        }
        return;
    }
    }
}

void StateVector::run(const Circuit& c, std::vector<uint8_t>& cbits, std::mt19937_64& rng) {
    if (cbits.size() < c.num_cbits) cbits.resize(c.num_cbits, 0);
    for (const Op& op : c.ops) apply(op, c, cbits, rng);
    if (!c.global_phase.is_zero()) amp_ *= std::polar(1.0, c.global_phase.to_radians());
}

void StateVector::run(const Circuit& c) {
    std::vector<uint8_t> cbits(c.num_cbits, 0);
    std::mt19937_64 rng(1);
    run(c, cbits, rng);
}

Eigen::MatrixXcd circuit_unitary(const Circuit& c) {
    const uint32_t n = c.num_qubits();
    if (n > 12) throw UserError(fmt::format("full unitary of {} qubits is over the limit of 12", n));
    for (const Op& op : c.ops)
        if (op.kind == OpKind::Measure || op.kind == OpKind::Reset || op.is_conditioned())
            throw UserError("the unitary of a circuit with measurement is not defined");
    const Eigen::Index dim = Eigen::Index(1) << n;
    Eigen::MatrixXcd u(dim, dim);
    for (Eigen::Index j = 0; j < dim; ++j) {
        StateVector s(n);
        s.amplitudes().setZero();
        s.amplitudes()(j) = 1;
        s.run(c);
        u.col(j) = s.amplitudes();
    }
    return u;
}

double distance_up_to_phase(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b) {
    if (a.rows() != b.rows() || a.cols() != b.cols()) return 1e300;
    const Complex inner = (b.adjoint() * a).trace();
    const Complex phase = std::abs(inner) > 1e-300 ? inner / std::abs(inner) : Complex(1, 0);
    return (a - phase * b).norm() / std::sqrt(double(a.rows()));
}

}  // namespace whittle::ir
