// Boolean polynomial arithmetic: sorted monomial lists, XOR by merge, AND by pairwise union.
#include "ir/anf.h"

#include <algorithm>

namespace whittle::ir {

namespace {

bool mono_less(const Monomial& a, const Monomial& b) {
    if (a.size() != b.size()) return a.size() < b.size();
    return std::lexicographical_compare(a.begin(), a.end(), b.begin(), b.end());
}

Monomial mono_union(const Monomial& a, const Monomial& b) {
    Monomial m;
    m.reserve(a.size() + b.size());
    std::set_union(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(m));
    return m;
}

}  // namespace

Anf Anf::one() {
    Anf a;
    a.terms_.emplace_back();
    return a;
}

Anf Anf::var(uint32_t v) {
    Anf a;
    a.terms_.push_back(Monomial{v});
    return a;
}

size_t Anf::degree() const {
    size_t d = 0;
    for (const Monomial& m : terms_) d = std::max(d, m.size());
    return d;
}

Anf Anf::operator^(const Anf& o) const {
    Anf r;
    r.terms_.reserve(terms_.size() + o.terms_.size());
    size_t i = 0, j = 0;
    while (i < terms_.size() || j < o.terms_.size()) {
        if (j == o.terms_.size() || (i < terms_.size() && mono_less(terms_[i], o.terms_[j]))) {
            r.terms_.push_back(terms_[i++]);
        } else if (i == terms_.size() || mono_less(o.terms_[j], terms_[i])) {
            r.terms_.push_back(o.terms_[j++]);
        } else {
            ++i;  // equal monomials cancel
            ++j;
        }
    }
    return r;
}

std::optional<Anf> Anf::times(const Anf& o, size_t max_terms) const {
    if (terms_.size() * o.terms_.size() > max_terms * max_terms) return std::nullopt;
    std::vector<Monomial> all;
    all.reserve(terms_.size() * o.terms_.size());
    for (const Monomial& a : terms_)
        for (const Monomial& b : o.terms_) all.push_back(mono_union(a, b));
    std::sort(all.begin(), all.end(), mono_less);
    Anf r;
    for (size_t i = 0; i < all.size();) {
        size_t j = i;
        while (j < all.size() && all[j] == all[i]) ++j;
        if ((j - i) % 2 == 1) r.terms_.push_back(all[i]);
        i = j;
    }
    if (r.terms_.size() > max_terms) return std::nullopt;
    return r;
}

size_t Anf::hash() const {
    size_t h = 0x9e3779b97f4a7c15ull ^ terms_.size();
    for (const Monomial& m : terms_) {
        size_t hm = m.size() * 0x100000001b3ull;
        for (uint32_t v : m) hm = (hm ^ v) * 0x100000001b3ull;
        h = (h ^ hm) * 0xff51afd7ed558ccdull;
    }
    return h;
}

bool Anf::eval(uint64_t assignment) const {
    bool v = false;
    for (const Monomial& m : terms_) {
        bool p = true;
        for (uint32_t x : m) p = p && ((assignment >> x) & 1);
        v ^= p;
    }
    return v;
}

}  // namespace whittle::ir
