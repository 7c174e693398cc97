// Exact sparse simulation in Z[w]/sqrt2^k: one basis input through a pi/4-phase circuit, no rounding.
#include "verify/exact_basis.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <numeric>

#include "ir/error.h"

namespace whittle::passes {
namespace {

constexpr int64_t kCoefficientLimit = int64_t(1) << 60;

/// The angle in units of pi/4 (0..7), or -1 when it is not a multiple of pi/4.
int quarter_units(const ir::Angle& a) {
    if (!a.is_exact()) return -1;
    const __int128 num = __int128(a.num()) * 4;
    if (num % a.den() != 0) return -1;
    return int(((num / a.den()) % 8 + 8) % 8);
}

bool divisible_by_sqrt2(const __int128* a) { return ((a[0] - a[2]) & 1) == 0 && ((a[1] - a[3]) & 1) == 0; }

/// x / sqrt2 = x * sqrt2 / 2 with sqrt2 = w - w^3.
template <class T>
void divide_by_sqrt2(T* a) {
    const T b0 = a[1] - a[3], b1 = a[0] + a[2], b2 = a[1] + a[3], b3 = a[2] - a[0];
    a[0] = b0 / 2, a[1] = b1 / 2, a[2] = b2 / 2, a[3] = b3 / 2;
}

ExactValue reduced(ExactValue v) {
    if (!(v.a[0] | v.a[1] | v.a[2] | v.a[3])) return ExactValue{};
    while (divisible_by_sqrt2(v.a)) {
        divide_by_sqrt2(v.a);
        --v.k;
    }
    return v;
}

}  // namespace

ExactBasisState::ExactBasisState(uint32_t num_wires, const std::vector<uint8_t>& input_bits)
    : words_(std::max<uint32_t>(1, (num_wires + 63) / 64)), keys_(words_, 0), amps_(1) {
    amps_[0].a[0] = 1;
    for (uint32_t w = 0; w < num_wires; ++w)
        if (input_bits[w]) keys_[w >> 6] |= uint64_t(1) << (w & 63);
}

bool ExactBasisState::supports(const ir::Op& op) {
    if (op.is_conditioned()) return false;
    switch (op.kind) {
    case ir::OpKind::X:
    case ir::OpKind::Swap:
    case ir::OpKind::Y:
    case ir::OpKind::Barrier: return true;
    case ir::OpKind::Phase:
    case ir::OpKind::Parity: return quarter_units(op.angle) >= 0;
    case ir::OpKind::RZ:
        return op.controls.empty() ? quarter_units(op.angle) >= 0 : quarter_units(op.angle.divided_by(2)) >= 0;
    case ir::OpKind::ISwap:
    case ir::OpKind::H:
    case ir::OpKind::SX:
    case ir::OpKind::SXdg: return op.controls.empty();
    case ir::OpKind::RX:
    case ir::OpKind::RY:
    case ir::OpKind::U:
    case ir::OpKind::R:
    case ir::OpKind::XX:
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: return false;
    }
    return false;
}

bool ExactBasisState::supports(const ir::Circuit& c) {
    return std::all_of(c.ops.begin(), c.ops.end(), [](const ir::Op& op) { return supports(op); });
}

bool ExactBasisState::holds(size_t t, const ir::Op& op) const {
    for (ir::Lit l : op.controls)
        if (bit(t, l.wire()) != l.positive()) return false;
    return true;
}

void ExactBasisState::multiply(size_t t, int units) {
    int64_t* a = amps_[t].a;
    for (int u = 0; u < (units & 7); ++u) {  // w (a0 + a1 w + a2 w^2 + a3 w^3) = -a3 + a0 w + a1 w^2 + a2 w^3
        const int64_t top = a[3];
        a[3] = a[2], a[2] = a[1], a[1] = a[0], a[0] = -top;
    }
}

void ExactBasisState::hadamard(uint32_t wire) {
    // H|x> = (|0> + (-1)^x |1>) / sqrt2
    const size_t n = amps_.size();
    const uint64_t mask = uint64_t(1) << (wire & 63);
    const uint32_t word = wire >> 6;
    keys_.resize(2 * n * words_);
    amps_.resize(2 * n);
    for (size_t t = 0; t < n; ++t) {
        std::memcpy(key(n + t), key(t), words_ * sizeof(uint64_t));
        const bool one = key(t)[word] & mask;
        key(t)[word] &= ~mask;
        key(n + t)[word] |= mask;
        amps_[n + t] = amps_[t];
        if (one)
            for (int64_t& x : amps_[n + t].a) x = -x;
    }
    ++k_;
    merge();
}

void ExactBasisState::merge() {
    std::vector<uint32_t> order(amps_.size());
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), [&](uint32_t x, uint32_t y) {
        return std::lexicographical_compare(key(x), key(x) + words_, key(y), key(y) + words_);
    });
    std::vector<uint64_t> keys;
    std::vector<ZOmega> amps;
    keys.reserve(keys_.size());
    amps.reserve(amps_.size());
    for (size_t i = 0; i < order.size();) {
        ZOmega sum = amps_[order[i]];
        size_t j = i + 1;
        for (; j < order.size() && std::equal(key(order[i]), key(order[i]) + words_, key(order[j])); ++j)
            for (int q = 0; q < 4; ++q) {
                sum.a[q] += amps_[order[j]].a[q];
                overflow_ = overflow_ || std::abs(sum.a[q]) >= kCoefficientLimit;
            }
        if (!sum.is_zero()) {
            keys.insert(keys.end(), key(order[i]), key(order[i]) + words_);
            amps.push_back(sum);
        }
        i = j;
    }
    keys_ = std::move(keys);
    amps_ = std::move(amps);
    // Take out common factors of sqrt2 so that coefficients stay small while the state is simple.
    for (;;) {
        bool all = !amps_.empty();
        for (const ZOmega& z : amps_) {
            all = all && ((z.a[0] - z.a[2]) & 1) == 0 && ((z.a[1] - z.a[3]) & 1) == 0;
            if (!all) break;
        }
        if (!all) break;
        for (ZOmega& z : amps_) divide_by_sqrt2(z.a);
        --k_;
    }
}

bool ExactBasisState::apply(const ir::Op& op, size_t max_terms) {
    WHITTLE_ASSERT(supports(op) && "ExactBasisState::apply on an unsupported op");
    const size_t n = amps_.size();
    auto flip = [&](size_t t, uint32_t w) { key(t)[w >> 6] ^= uint64_t(1) << (w & 63); };
    switch (op.kind) {
    case ir::OpKind::Barrier: return true;
    case ir::OpKind::X:
        for (size_t t = 0; t < n; ++t)
            if (holds(t, op)) flip(t, op.target);
        return true;
    case ir::OpKind::Swap:
        for (size_t t = 0; t < n; ++t)
            if (holds(t, op) && bit(t, op.target) != bit(t, op.target2)) flip(t, op.target), flip(t, op.target2);
        return true;
    case ir::OpKind::Y:  // Y|0> = i|1>, Y|1> = -i|0>
        for (size_t t = 0; t < n; ++t)
            if (holds(t, op)) {
                multiply(t, bit(t, op.target) ? 6 : 2);
                flip(t, op.target);
            }
        return true;
    case ir::OpKind::Phase: {
        const int u = quarter_units(op.angle);
        for (size_t t = 0; t < n; ++t)
            if (holds(t, op)) multiply(t, u);
        return true;
    }
    case ir::OpKind::Parity: {
        const int u = quarter_units(op.angle);
        for (size_t t = 0; t < n; ++t) {
            bool p = false;
            for (ir::Lit l : op.controls) p ^= bit(t, l.wire());
            if (p) multiply(t, u);
        }
        return true;
    }
    case ir::OpKind::RZ: {
        // exp(-i a/2 Z) = e^{-i a/2} diag(1, e^{i a}); uncontrolled, the first factor is global
        if (op.controls.empty()) {
            const int u = quarter_units(op.angle);
            for (size_t t = 0; t < n; ++t)
                if (bit(t, op.target)) multiply(t, u);
            return true;
        }
        const int h = quarter_units(op.angle.divided_by(2));
        for (size_t t = 0; t < n; ++t)
            if (holds(t, op)) multiply(t, bit(t, op.target) ? h : 8 - h);
        return true;
    }
    case ir::OpKind::ISwap:  // iSWAP = SWAP CZ (S (x) S)
        for (size_t t = 0; t < n; ++t) {
            const bool x = bit(t, op.target), y = bit(t, op.target2);
            multiply(t, 2 * (int(x) + int(y)) + (x && y ? 4 : 0));
            if (x != y) flip(t, op.target), flip(t, op.target2);
        }
        return true;
    case ir::OpKind::H: hadamard(op.target); break;
    case ir::OpKind::SX:  // sqrt(X) = H S H exactly
    case ir::OpKind::SXdg:
        hadamard(op.target);
        for (size_t t = 0; t < amps_.size(); ++t)
            if (bit(t, op.target)) multiply(t, op.kind == ir::OpKind::SX ? 2 : 6);
        hadamard(op.target);
        break;
    case ir::OpKind::RX:
    case ir::OpKind::RY:
    case ir::OpKind::U:
    case ir::OpKind::R:
    case ir::OpKind::XX:
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: WHITTLE_ASSERT(false && "unreachable: unsupported op in an exact basis run");
    }
    return amps_.size() <= max_terms && !overflow_;
}

bool ExactBasisState::run(const ir::Circuit& c, size_t max_terms) {
    for (const ir::Op& op : c.ops)
        if (!apply(op, max_terms)) return false;
    merge();  // sorted by basis state
    return !overflow_;
}

ExactValue ExactBasisState::value(size_t term) const {
    ExactValue v;
    for (int q = 0; q < 4; ++q) v.a[q] = amps_[term].a[q];
    v.k = k_;
    return reduced(v);
}

std::complex<double> ExactBasisState::complex_value(size_t term) const {
    const double r = std::sqrt(0.5);
    const std::complex<double> w(r, r);
    std::complex<double> z = 0, p = 1;
    for (int q = 0; q < 4; ++q, p *= w) z += double(amps_[term].a[q]) * p;
    return z * std::pow(r, k_);
}

bool ExactBasisState::same_basis_states(const ExactBasisState& other) const {
    return words_ == other.words_ && keys_ == other.keys_;
}

double ExactBasisState::distance_up_to_phase(const ExactBasisState& other) const {
    double na = 0, nb = 0;
    for (size_t t = 0; t < size(); ++t) na += std::norm(complex_value(t));
    for (size_t t = 0; t < other.size(); ++t) nb += std::norm(other.complex_value(t));
    if (na == 0 || nb == 0 || words_ != other.words_) return 2;
    // Both term lists are sorted by basis state: walk them together for the overlap.
    std::complex<double> overlap = 0;
    size_t i = 0, j = 0;
    while (i < size() && j < other.size()) {
        const bool equal = std::equal(key(i), key(i) + words_, other.key(j));
        const bool less = std::lexicographical_compare(key(i), key(i) + words_, other.key(j), other.key(j) + words_);
        if (equal) {
            overlap += std::conj(complex_value(i)) * other.complex_value(j);
            ++i, ++j;
        } else if (less) {
            ++i;
        } else {
            ++j;
        }
    }
    const double fidelity = std::min(1.0, std::abs(overlap) / std::sqrt(na * nb));
    return std::sqrt(std::max(0.0, 2 - 2 * fidelity));
}

ExactValue ExactBasisState::product(const ExactValue& x, const ExactValue& y) {
    ExactValue p;
    for (int i = 0; i < 4; ++i)
        for (int j = 0; j < 4; ++j) {
            const __int128 t = x.a[i] * y.a[j];
            if (i + j < 4) p.a[i + j] += t;
            else p.a[i + j - 4] -= t;  // w^4 = -1
        }
    p.k = x.k + y.k;
    return reduced(p);
}

}  // namespace whittle::passes
