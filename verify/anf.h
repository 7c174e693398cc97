// Boolean polynomials in algebraic normal form (XOR of AND-monomials) for the equivalence engines.
#pragma once

#include <cstdint>
#include <stdexcept>
#include <vector>


namespace whittle::passes {

/// A variable id: an input wire or a path variable of a path sum.
using Var = uint32_t;
/// A product of distinct variables, sorted ascending; empty = the constant 1.
using Monomial = std::vector<Var>;

/// Thrown when a product or substitution would exceed Anf::kMaxTerms (the caller falls back).
struct AnfOverflow : std::runtime_error {
    AnfOverflow() : std::runtime_error("boolean polynomial over the size cap") {}
};

/// The union of two monomials (their product, since x*x = x).
Monomial monomial_union(const Monomial& a, const Monomial& b);
bool monomial_contains(const Monomial& m, Var v);

/// A Boolean polynomial over GF(2): a sorted set of monomials. Value semantics.
class Anf {
public:
    /// Largest number of monomials a result may have before AnfOverflow.
    static constexpr size_t kMaxTerms = size_t(1) << 15;

    Anf() = default;  // 0
    static Anf one();
    static Anf var(Var v);

    bool is_zero() const { return terms_.empty(); }
    bool is_one() const { return terms_.size() == 1 && terms_[0].empty(); }
    size_t size() const { return terms_.size(); }
    const std::vector<Monomial>& terms() const { return terms_; }

    Anf& operator^=(const Anf& o);
    Anf operator^(const Anf& o) const;
    /// The product (AND). Throws AnfOverflow over the cap.
    Anf operator&(const Anf& o) const;
    /// 1 xor this (the negation).
    Anf negated() const;
    friend bool operator==(const Anf& a, const Anf& b) { return a.terms_ == b.terms_; }
    friend bool operator!=(const Anf& a, const Anf& b) { return !(a == b); }

    bool contains_var(Var v) const;
    /// True when v occurs in exactly the monomials {v} (f = v xor rest, v not in rest).
    bool is_linear_in(Var v) const;
    /// Evaluates with `value(v)` giving each variable's bit.
    template <class F>
    bool eval(F&& value) const {
        bool r = false;
        for (const Monomial& m : terms_) {
            bool t = true;
            for (Var v : m) t = t && value(v);
            r ^= t;
        }
        return r;
    }
    /// This polynomial with variable v replaced by r. Throws AnfOverflow over the cap.
    Anf substitute(Var v, const Anf& r) const;
    /// A monomial of the polynomial none of whose proper sub-monomials is in it: setting its
    /// variables to 1 and all others to 0 makes the polynomial 1. Only for non-zero polynomials.
    const Monomial& minimal_monomial() const;

    /// Builds from monomials that may repeat (pairs cancel) and be unsorted.
    static Anf from_terms(std::vector<Monomial> terms);

private:
    std::vector<Monomial> terms_;
};

}  // namespace whittle::passes
