// Path sums (Amy 2018, arXiv:1805.06908): a circuit as a sum over paths with a phase polynomial.
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"
#include "verify/anf.h"
#include "verify/phase_poly.h"

namespace whittle::passes {

/// |x> -> 2^{-h/2} sum_{y in {0,1}^h} e^{i P(x,y)} |f(x,y)>: variables 0..n-1 are the input wires,
/// later ones path variables (one per Hadamard). P has exact angle coefficients (phase_poly.h);
/// each output f_w is a Boolean polynomial. Clean wires start as the constant 0.
class PathSum {
public:
    /// `name_products`: write each multi-controlled X as H, controlled phase pi, H, so that outputs stay
    /// linear and the nonlinear part lives in the phase (keeps miters of Toffoli circuits compact).
    PathSum(uint32_t num_wires, const std::vector<uint8_t>& clean, bool name_products);

    /// True when `op` can be appended: unconditioned, exact angles, and not a controlled
    /// non-diagonal, non-X gate (controlled H, RX, ...), not a measurement or reset.
    static bool supports(const ir::Op& op);
    /// Appends an op (supports(op) must hold). Throws AnfOverflow when a polynomial grows over its cap.
    void apply(const ir::Op& op);
    /// Appends the exact inverse of an op (supports(op) must hold). Not ir::append_inverse for two
    /// kinds: angles are stored mod 2*pi, so a controlled RZ(-a) as stored can differ from RZ(a)^dagger
    /// by a phase on the controls; and iSWAP's inverse is written out here.
    void apply_inverse(const ir::Op& op);
    void add_global_phase(const ir::Angle& a) { phase_.add({}, a); }

    /// Applies the rewrite rules until none applies: [Elim] (a path variable in no output and not in
    /// the phase), [HH] (y only in pi*y*Q terms with Q = z xor R, z a path variable: substitute z := R),
    /// [omega] (y in pi/2*y + pi*y*Q). Among the HH choices, the one with the least estimated growth
    /// goes first. Returns false when `seconds` ran out.
    bool reduce(double seconds);

    uint32_t num_wires() const { return n_; }
    /// Path variables still present.
    uint32_t num_path_vars() const;
    bool is_path_var(Var v) const { return v >= n_; }
    const std::vector<Anf>& outputs() const { return out_; }
    const PhasePoly& phase() const { return phase_; }
    /// The normalization is 2^{sqrt2_power/2} times the sum; 0 for a reduced unitary.
    int sqrt2_power() const { return sqrt2_power_; }

private:
    Var fresh();
    void hadamard(uint32_t wire);
    Anf control_product(const ir::Op& op) const;
    void mcx(uint32_t target, const Anf& on);
    void rz(uint32_t target, const ir::Angle& a, const Anf& on);
    bool apply_rule(bool& progressed);

    uint32_t n_;
    bool name_products_;
    std::vector<Anf> out_;
    PhasePoly phase_;
    std::vector<uint8_t> live_;  ///< per variable id >= n_: still present
    int sqrt2_power_ = 0;
};

}  // namespace whittle::passes
