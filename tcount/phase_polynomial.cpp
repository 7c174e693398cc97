// Building a region's phase polynomial from its ops, and the exact comparisons of phase functions mod 8.
#include "tcount/phase_polynomial.h"

#include <bit>

#include "ir/error.h"

namespace whittle::tcount {

using ir::Angle;
using ir::Op;
using ir::OpKind;

std::vector<uint64_t> RegionPolynomial::odd_parities() const {
    std::vector<uint64_t> out;
    for (const auto& [p, c] : z8)
        if (c & 1) out.push_back(p);
    return out;
}

std::vector<Z8Term> RegionPolynomial::z8_terms() const {
    std::vector<Z8Term> out;
    out.reserve(z8.size());
    for (const auto& [p, c] : z8) out.push_back({p, c});
    return out;
}

bool is_region_op(const Op& op) {
    if (op.is_conditioned()) return false;
    switch (op.kind) {
    case OpKind::X: return op.controls.size() <= 1;
    case OpKind::Swap: return op.controls.empty();
    case OpKind::Parity: return !op.controls.empty();
    case OpKind::Phase: {
        // One literal, any angle; CZ. (CS and CCZ would be read fine, but they are not T gates
        // yet: to-target lowers them, and the T-counts compared here are of the ops as they are.)
        const size_t k = op.controls.size();
        if (k == 1) return true;
        return k == 2 && op.angle.eighths() % 4 == 0;
    }
    case OpKind::H:
    case OpKind::Y:
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ:
    case OpKind::U:
    case OpKind::ISwap:
    case OpKind::XX:
    case OpKind::R:
    case OpKind::Measure:
    case OpKind::Reset:
    case OpKind::Barrier: return false;
    }
    return false;
}

RegionBuilder::RegionBuilder(uint32_t width) : state_(width) {
    WHITTLE_ASSERT(width <= 64 && "a region has at most 64 wires");
    p_.width = width;
    for (uint32_t i = 0; i < width; ++i) state_[i].mask = uint64_t(1) << i;
}

void RegionBuilder::add_z8(Affine f, int coef) {
    coef = ((coef % 8) + 8) % 8;
    if (coef == 0) return;
    if (f.flip) {
        // c * (1 ^ p) = c - c * p.
        p_.global_phase += Angle::pi_times(coef, 4);
        coef = (8 - coef) % 8;
    }
    if (f.mask == 0) return;
    int& c = p_.z8[f.mask];
    c = (c + coef) % 8;
    if (c == 0) p_.z8.erase(f.mask);
}

void RegionBuilder::add_term(Affine f, const Angle& a) {
    const int e = a.eighths();
    if (e >= 0) {
        add_z8(f, e);
        return;
    }
    Angle t = a;
    if (f.flip) {
        p_.global_phase += t;
        t = -t;
    }
    if (f.mask == 0) return;
    auto it = p_.other.find(f.mask);
    if (it == p_.other.end()) {
        p_.other.emplace(f.mask, t);
        return;
    }
    it->second += t;
    // A sum of finer angles can land on a multiple of pi/4: it joins the Z8 part.
    const int e2 = it->second.eighths();
    if (e2 >= 0) {
        p_.other.erase(it);
        add_z8({f.mask, false}, e2);
    }
}

void RegionBuilder::apply(const Op& op, uint32_t t) {
    auto lit_affine = [&](const LitVar& l) {
        Affine f = state_[l.var];
        f.flip ^= !l.positive;
        return f;
    };
    switch (op.kind) {
    case OpKind::X:
        if (lits_.empty()) {
            state_[t].flip ^= true;
            return;
        }
        {
            const Affine c = lit_affine(lits_[0]);
            state_[t].mask ^= c.mask;
            state_[t].flip ^= c.flip;
        }
        return;
    case OpKind::Parity: {
        Affine f;
        for (const LitVar& l : lits_) {
            const Affine g = lit_affine(l);
            f.mask ^= g.mask;
            f.flip ^= g.flip;
        }
        add_term(f, op.angle);
        return;
    }
    case OpKind::Phase: {
        const size_t k = lits_.size();
        if (k == 1) {
            add_term(lit_affine(lits_[0]), op.angle);
            return;
        }
        // AND(l_1..l_k) = 2^{1-k} * sum over non-empty S of (-1)^{|S|-1} XOR(l_S), an identity of
        // integer-valued functions, so angle * AND splits into parity terms of angle / 2^{k-1}.
        const int e = op.angle.eighths();
        WHITTLE_ASSERT(e >= 0 && e % (1 << (k - 1)) == 0 && "a region phase on k literals is a multiple of 2^{k-1} pi/4");
        const int per = e >> (k - 1);
        for (uint32_t s = 1; s < (1u << k); ++s) {
            Affine f;
            for (size_t i = 0; i < k; ++i)
                if (s >> i & 1) {
                    const Affine g = lit_affine(lits_[i]);
                    f.mask ^= g.mask;
                    f.flip ^= g.flip;
                }
            add_z8(f, std::popcount(s) % 2 == 1 ? per : -per);
        }
        return;
    }
    default: break;
    }
    WHITTLE_ASSERT(false && "RegionBuilder: not a region op");
}

RegionPolynomial RegionBuilder::finish() {
    p_.out_parity.resize(state_.size());
    p_.out_flip.resize(state_.size());
    for (size_t i = 0; i < state_.size(); ++i) {
        p_.out_parity[i] = state_[i].mask;
        p_.out_flip[i] = state_[i].flip;
    }
    return std::move(p_);
}

int eval_z8(const std::vector<Z8Term>& terms, uint64_t x) {
    int v = 0;
    for (const Z8Term& t : terms) v += t.coef * (std::popcount(t.parity & x) & 1);
    return v & 7;
}

namespace {

/// h = f - g, merged by parity.
std::vector<Z8Term> difference(const std::vector<Z8Term>& f, const std::vector<Z8Term>& g) {
    std::map<uint64_t, int> m;
    for (const Z8Term& t : f) m[t.parity] += t.coef;
    for (const Z8Term& t : g) m[t.parity] -= t.coef;
    std::vector<Z8Term> h;
    for (const auto& [p, c] : m)
        if (((c % 8) + 8) % 8 != 0) h.push_back({p, ((c % 8) + 8) % 8});
    return h;
}

/// The multilinear form of sum c_p (p . x) mod 8. With (p . x) read as an integer,
/// x_1 ^ ... ^ x_k = sum x_i - 2 sum x_i x_j + 4 sum x_i x_j x_l - 8 ... (exact over the integers), so
/// mod 8 the function is sum_i lin_i x_i + sum_{i<j} pair_ij x_i x_j + 4 sum_{i<j<l} cubic_ijl x_i x_j x_l
/// with lin_i = sum of c over the terms holding i, pair_ij = -2 * that over the terms holding i and
/// j, and cubic_ijl = the parity of the odd c over the terms holding all three. A function Z_2^n ->
/// Z_8 has exactly one multilinear form, so two sums of parities are the same function exactly
/// when these agree.
struct Expansion {
    uint32_t n;
    std::vector<int> lin;          ///< mod 8
    std::vector<int> pair;         ///< [i * n + j], i < j, mod 8
    std::vector<uint64_t> cubic;   ///< [i * n + j], i < j: bit l set when cubic_ijl is 1 (l != i, j)
};

Expansion expand(uint32_t n, const std::vector<Z8Term>& terms) {
    Expansion e{n, std::vector<int>(n, 0), std::vector<int>(size_t(n) * n, 0), std::vector<uint64_t>(size_t(n) * n, 0)};
    for (const Z8Term& t : terms) {
        for (uint64_t a = t.parity; a; a &= a - 1) {
            const uint32_t i = uint32_t(std::countr_zero(a));
            e.lin[i] += t.coef;
            for (uint64_t b = a & (a - 1); b; b &= b - 1) {
                const size_t k = size_t(i) * n + uint32_t(std::countr_zero(b));
                e.pair[k] -= 2 * t.coef;
                if (t.coef & 1) e.cubic[k] ^= t.parity;
            }
        }
    }
    for (int& v : e.lin) v = ((v % 8) + 8) % 8;
    for (int& v : e.pair) v = ((v % 8) + 8) % 8;
    for (uint32_t i = 0; i < n; ++i)
        for (uint32_t j = i + 1; j < n; ++j) e.cubic[size_t(i) * n + j] &= ~((uint64_t(1) << i) | (uint64_t(1) << j));
    return e;
}

bool no_cubic(const Expansion& e) {
    for (uint64_t m : e.cubic)
        if (m) return false;
    return true;
}

}  // namespace

std::optional<EvenQuadratic> even_difference(uint32_t n, const std::vector<Z8Term>& f, const std::vector<Z8Term>& g) {
    const Expansion e = expand(n, difference(f, g));
    if (!no_cubic(e)) return std::nullopt;
    EvenQuadratic q;
    q.lin = e.lin;
    for (uint32_t i = 0; i < n; ++i) {
        if (q.lin[i] & 1) return std::nullopt;
        for (uint32_t j = i + 1; j < n; ++j) {
            const int c = e.pair[size_t(i) * n + j];
            if (c == 4) q.cz.emplace_back(i, j);
            else if (c != 0) return std::nullopt;
        }
    }
    return q;
}

bool same_z8_function(uint32_t n, const std::vector<Z8Term>& f, const std::vector<Z8Term>& g) {
    const Expansion e = expand(n, difference(f, g));
    if (!no_cubic(e)) return false;
    for (int v : e.lin)
        if (v) return false;
    for (int v : e.pair)
        if (v) return false;
    return true;
}

}  // namespace whittle::tcount
