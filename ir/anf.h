// Boolean polynomials in algebraic normal form (XOR of AND-monomials over numbered variables).
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <vector>


namespace whittle::ir {

/// A product of distinct variables, sorted; the empty monomial is the constant 1.
using Monomial = std::vector<uint32_t>;

/// A Boolean function as the XOR of distinct monomials, kept sorted so equal functions are equal
/// values (the ANF of a Boolean function is unique).
class Anf {
public:
    Anf() = default;  // the constant 0
    static Anf zero() { return {}; }
    static Anf one();
    static Anf var(uint32_t v);

    bool is_zero() const { return terms_.empty(); }
    size_t size() const { return terms_.size(); }
    const std::vector<Monomial>& terms() const { return terms_; }
    /// True when the constant monomial 1 is present.
    bool has_constant() const { return !terms_.empty() && terms_.front().empty(); }
    /// Total degree (0 for constants).
    size_t degree() const;

    /// XOR (sum in GF(2)).
    Anf operator^(const Anf& o) const;
    Anf& operator^=(const Anf& o) { return *this = *this ^ o; }
    /// XOR with the constant 1 (negation).
    Anf negated() const { return *this ^ one(); }
    /// AND (product), or nothing when the result would have more than `max_terms` monomials
    /// (the callers' size cap that keeps their passes linear).
    std::optional<Anf> times(const Anf& o, size_t max_terms) const;

    size_t hash() const;
    friend bool operator==(const Anf& a, const Anf& b) { return a.terms_ == b.terms_; }
    friend bool operator!=(const Anf& a, const Anf& b) { return !(a == b); }

    /// Value at an assignment (bit v of `assignment` = variable v; variables must be < 64).
    bool eval(uint64_t assignment) const;

private:
    std::vector<Monomial> terms_;
};

struct AnfHash {
    size_t operator()(const Anf& a) const { return a.hash(); }
};

}  // namespace whittle::ir
