// Phase functions as real multilinear polynomials over 0/1 variables with exact angle coefficients.
#pragma once

#include <cstdint>
#include <map>
#include <utility>
#include <vector>

#include "ir/angle.h"
#include "verify/anf.h"

namespace whittle::passes {

/// The 0/1-valued multilinear form of a Boolean polynomial f, [f] = sum_S (-2)^{|S|-1} prod_{j in S} m_j,
/// with integer coefficients reduced modulo `modulus` (> 0). Built by folding [g xor m] = [g] + m - 2[g]m.
/// Throws AnfOverflow when the result has more than Anf::kMaxTerms terms.
std::vector<std::pair<Monomial, int64_t>> indicator_terms(const Anf& f, int64_t modulus);

/// The least k > 0 with k*a = 0 mod 2*pi, for an exact angle a (the modulus integer multiples need).
int64_t angle_period(const ir::Angle& a);

/// A phase function x -> sum_S c_S prod_{v in S} x_v (mod 2*pi), S a monomial, c_S an Angle.
/// Over {0,1}^n every function into R/2piZ has exactly one such form (the Moebius transform is
/// unimodular), so two phase functions are equal iff their coefficients are equal mod 2*pi.
class PhasePoly {
public:
    using Terms = std::map<Monomial, ir::Angle>;

    void add(const Monomial& m, const ir::Angle& c);
    /// Adds c*[f]. `c` must be exact; inexact coefficients mark the polynomial inexact.
    void add_indicator(const ir::Angle& c, const Anf& f);
    /// Replaces variable v by the 0/1 value [r] everywhere.
    void substitute(Var v, const Anf& r);
    void subtract(const PhasePoly& o);

    const Terms& terms() const { return terms_; }
    bool exact() const { return exact_; }
    /// True when every non-constant coefficient is 0.
    bool is_constant() const;
    bool contains_var(Var v) const;
    /// Evaluates the phase (radians) at an assignment.
    template <class F>
    double eval(F&& value) const {
        double r = 0;
        for (const auto& [m, c] : terms_) {
            bool on = true;
            for (Var v : m) on = on && value(v);
            if (on) r += c.to_radians();
        }
        return r;
    }

private:
    Terms terms_;
    bool exact_ = true;
};

}  // namespace whittle::passes
