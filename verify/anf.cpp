// Boolean polynomials in algebraic normal form: XOR-add, AND-multiply with a size cap, substitution.
#include "verify/anf.h"

#include <algorithm>

#include "ir/error.h"

namespace whittle::passes {

Monomial monomial_union(const Monomial& a, const Monomial& b) {
    Monomial r;
    r.reserve(a.size() + b.size());
    std::set_union(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(r));
    return r;
}

bool monomial_contains(const Monomial& m, Var v) { return std::binary_search(m.begin(), m.end(), v); }

Anf Anf::one() {
    Anf a;
    a.terms_.emplace_back();
    return a;
}

Anf Anf::var(Var v) {
    Anf a;
    a.terms_.push_back(Monomial{v});
    return a;
}

Anf Anf::from_terms(std::vector<Monomial> terms) {
    std::sort(terms.begin(), terms.end());
    Anf a;
    a.terms_.reserve(terms.size());
    for (size_t i = 0; i < terms.size();) {
        size_t j = i;
        while (j < terms.size() && terms[j] == terms[i]) ++j;
        if ((j - i) & 1) a.terms_.push_back(std::move(terms[i]));
        i = j;
    }
    if (a.terms_.size() > kMaxTerms) throw AnfOverflow();
    return a;
}

Anf& Anf::operator^=(const Anf& o) {
    std::vector<Monomial> r;
    r.reserve(terms_.size() + o.terms_.size());
    std::set_symmetric_difference(terms_.begin(), terms_.end(), o.terms_.begin(), o.terms_.end(),
                                  std::back_inserter(r));
    if (r.size() > kMaxTerms) throw AnfOverflow();
    terms_ = std::move(r);
    return *this;
}

Anf Anf::operator^(const Anf& o) const {
    Anf r = *this;
    r ^= o;
    return r;
}

Anf Anf::operator&(const Anf& o) const {
    if (is_zero() || o.is_zero()) return {};
    if (is_one()) return o;
    if (o.is_one()) return *this;
    if (terms_.size() * o.terms_.size() > 16 * kMaxTerms) throw AnfOverflow();
    std::vector<Monomial> r;
    r.reserve(terms_.size() * o.terms_.size());
    for (const Monomial& a : terms_)
        for (const Monomial& b : o.terms_) r.push_back(monomial_union(a, b));
    return from_terms(std::move(r));
}

Anf Anf::negated() const { return *this ^ one(); }

bool Anf::contains_var(Var v) const {
    for (const Monomial& m : terms_)
        if (monomial_contains(m, v)) return true;
    return false;
}

bool Anf::is_linear_in(Var v) const {
    bool alone = false;
    for (const Monomial& m : terms_) {
        if (!monomial_contains(m, v)) continue;
        if (m.size() != 1) return false;
        alone = true;
    }
    return alone;
}

Anf Anf::substitute(Var v, const Anf& r) const {
    Anf without, with;  // this = without ^ v*with
    for (const Monomial& m : terms_) {
        if (!monomial_contains(m, v)) {
            without.terms_.push_back(m);
            continue;
        }
        Monomial rest;
        for (Var u : m)
            if (u != v) rest.push_back(u);
        with.terms_.push_back(std::move(rest));
    }
    if (with.is_zero()) return *this;
    with = from_terms(std::move(with.terms_));
    return without ^ (with & r);
}

const Monomial& Anf::minimal_monomial() const {
    WHITTLE_ASSERT(!terms_.empty() && "minimal_monomial of the zero polynomial");
    const Monomial* best = &terms_[0];
    for (const Monomial& m : terms_)
        if (m.size() < best->size()) best = &m;
    return *best;  // a smallest monomial has no proper sub-monomial in the set
}

}  // namespace whittle::passes
