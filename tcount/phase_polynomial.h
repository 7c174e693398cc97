// The phase polynomial of a Hadamard-free region (CNOT, X, swaps, diagonal phases) and its exact comparisons.
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <utility>
#include <vector>

#include "ir/circuit.h"

namespace whittle::tcount {

/// A parity (bit i = region variable x_i) with an integer coefficient in units of pi/4, mod 8.
struct Z8Term {
    uint64_t parity = 0;
    int coef = 0;  ///< in [0, 8)
    friend bool operator==(const Z8Term&, const Z8Term&) = default;
};

/// What a region of CNOT, X, swaps and diagonal phases does to its inputs x_0 .. x_{n-1} (the
/// region's wires on entry, at most 64): the unitary maps |x> to
/// e^{i (global_phase + pi/4 * sum c_p (p . x) + sum t_q (q . x))} |L x + b>, where (p . x) is a
/// parity read as the integer 0 or 1 (sum-over-paths reading, Amy, Maslov, Mosca 2014,
/// arXiv:1303.2042). Terms whose angle is a multiple of pi/4 are kept in `z8`; the others (exact
/// finer angles or radians) in `other`, one entry per parity.
struct RegionPolynomial {
    uint32_t width = 0;
    std::map<uint64_t, int> z8;                  ///< parity -> coefficient in (0, 8)
    std::map<uint64_t, ir::Angle> other;         ///< parity -> angle that is no multiple of pi/4
    std::vector<uint64_t> out_parity;            ///< wire i ends holding (out_parity[i] . x) ^ out_flip[i]
    std::vector<uint8_t> out_flip;
    ir::Angle global_phase;

    /// The odd-coefficient parities, one T gate each (sorted by parity).
    std::vector<uint64_t> odd_parities() const;
    std::vector<Z8Term> z8_terms() const;
};

/// Ops a region may hold: unconditioned X with at most one control, uncontrolled Swap, Parity,
/// Phase on one literal, CZ. Anything else (H above all) ends the region on its wires.
/// (RegionBuilder also reads CS and CCZ, Phase on 2 or 3 literals by multiples of pi/2 or pi.)
bool is_region_op(const ir::Op& op);

/// Builds a RegionPolynomial op by op. `var_of(wire)` is the region variable of a wire, assigned
/// by the caller before the op is added.
class RegionBuilder {
public:
    explicit RegionBuilder(uint32_t width);
    /// Adds one region op (is_region_op); `var` maps each of its wires to a region variable.
    template <class VarOf>
    void add(const ir::Op& op, VarOf var) {
        lits_.clear();
        if (op.kind == ir::OpKind::Swap) {
            std::swap(state_[var(op.target)], state_[var(op.target2)]);
            return;
        }
        for (ir::Lit l : op.controls) lits_.push_back({var(l.wire()), l.positive()});
        const uint32_t t = op.target != ir::kNoWire ? var(op.target) : 0;
        apply(op, t);
    }
    /// The finished polynomial (the builder may not be used afterwards).
    RegionPolynomial finish();

private:
    struct Affine {
        uint64_t mask = 0;
        bool flip = false;
    };
    struct LitVar {
        uint32_t var;
        bool positive;
    };
    void apply(const ir::Op& op, uint32_t target_var);
    void add_term(Affine f, const ir::Angle& a);
    void add_z8(Affine f, int coef);
    RegionPolynomial p_;
    std::vector<Affine> state_;
    std::vector<LitVar> lits_;
};

/// Value of sum c_p (p . x) mod 8 at x (bit i = x_i).
int eval_z8(const std::vector<Z8Term>& terms, uint64_t x);

/// The Clifford part two phase functions differ by: d(x) = lin . x * 2 + 4 * sum_{i<j} x_i x_j [pair]
/// (coefficients in units of pi/4).
struct EvenQuadratic {
    std::vector<int> lin;                            ///< in {0, 2, 4, 6}, per variable
    std::vector<std::pair<uint32_t, uint32_t>> cz;   ///< pairs i < j with coefficient 4
};

/// d = f - g mod 8 when it is an even quadratic form; nullopt otherwise. Exact: read from the
/// multilinear form of d mod 8 (a parity read as an integer is x ^ y ^ ... = sum x - 2 sum xy +
/// 4 sum xyz - 8 ..., so every sum of parities is a polynomial of degree at most 3 mod 8, and a
/// function Z_2^n -> Z_8 has exactly one multilinear form): no cubic part, even linear part, pair
/// coefficients 0 or 4. Cost: sum over the terms of their weight squared, plus n^2.
std::optional<EvenQuadratic> even_difference(uint32_t width, const std::vector<Z8Term>& f, const std::vector<Z8Term>& g);

/// True when the two sums of parities are the same function mod 8 (same multilinear form).
bool same_z8_function(uint32_t width, const std::vector<Z8Term>& f, const std::vector<Z8Term>& g);

}  // namespace whittle::tcount
