// Multilinear phase polynomials: exact coefficients mod 2*pi, indicator expansion, substitution.
#include "verify/phase_poly.h"

#include <numeric>

namespace whittle::passes {

int64_t angle_period(const ir::Angle& a) {
    if (a.num() == 0) return 1;
    const int64_t two_den = 2 * a.den();
    return two_den / std::gcd(a.num(), two_den);
}

std::vector<std::pair<Monomial, int64_t>> indicator_terms(const Anf& f, int64_t modulus) {
    std::map<Monomial, int64_t> acc;
    auto bump = [&](const Monomial& m, int64_t by) {
        int64_t& c = acc[m];
        c = ((c + by) % modulus + modulus) % modulus;
        if (c == 0) acc.erase(m);
    };
    for (const Monomial& m : f.terms()) {
        std::vector<std::pair<Monomial, int64_t>> old(acc.begin(), acc.end());
        bump(m, 1);
        for (const auto& [t, c] : old) bump(monomial_union(t, m), (-2 * c) % modulus);
        if (acc.size() > Anf::kMaxTerms) throw AnfOverflow();
    }
    return {acc.begin(), acc.end()};
}

void PhasePoly::add(const Monomial& m, const ir::Angle& c) {
    if (c.is_zero()) return;
    if (!c.is_exact()) exact_ = false;
    auto it = terms_.find(m);
    if (it == terms_.end()) {
        terms_.emplace(m, c);
        return;
    }
    it->second += c;
    if (!it->second.is_exact()) exact_ = false;
    if (it->second.is_zero()) terms_.erase(it);
}

void PhasePoly::add_indicator(const ir::Angle& c, const Anf& f) {
    if (c.is_zero() || f.is_zero()) return;
    if (!c.is_exact()) {
        exact_ = false;
        for (const auto& [m, k] : indicator_terms(f, int64_t(1) << 40)) add(m, c * k);
        return;
    }
    for (const auto& [m, k] : indicator_terms(f, angle_period(c))) add(m, c * k);
}

void PhasePoly::substitute(Var v, const Anf& r) {
    std::vector<std::pair<Monomial, ir::Angle>> moved;
    for (auto it = terms_.begin(); it != terms_.end();) {
        if (!monomial_contains(it->first, v)) {
            ++it;
            continue;
        }
        Monomial rest;
        for (Var u : it->first)
            if (u != v) rest.push_back(u);
        moved.emplace_back(std::move(rest), it->second);
        it = terms_.erase(it);
    }
    std::map<int64_t, std::vector<std::pair<Monomial, int64_t>>> cache;
    for (const auto& [rest, c] : moved) {
        const int64_t period = c.is_exact() ? angle_period(c) : int64_t(1) << 40;
        auto found = cache.find(period);
        if (found == cache.end()) found = cache.emplace(period, indicator_terms(r, period)).first;
        for (const auto& [t, k] : found->second) add(monomial_union(t, rest), c * k);
        if (terms_.size() > Anf::kMaxTerms) throw AnfOverflow();
    }
}

void PhasePoly::subtract(const PhasePoly& o) {
    for (const auto& [m, c] : o.terms_) add(m, -c);
    if (!o.exact_) exact_ = false;
}

bool PhasePoly::is_constant() const {
    for (const auto& [m, c] : terms_)
        if (!m.empty()) return false;
    return true;
}

bool PhasePoly::contains_var(Var v) const {
    for (const auto& [m, c] : terms_)
        if (monomial_contains(m, v)) return true;
    return false;
}

}  // namespace whittle::passes
