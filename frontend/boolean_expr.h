// Boolean expressions over wires and their exact expansions: ESOP (for `t ^= f`) and the
// multilinear real form (for `phase(theta) f`).
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::frontend {

struct BoolNode {
    enum Kind : uint8_t { Const, Var, Not, And, Xor, Or };
    Kind kind = Const;
    bool value = false;   ///< Const
    uint32_t wire = 0;    ///< Var
    uint32_t a = 0, b = 0;  ///< operands (node indices; operands come before their parent)
    ir::SourceLoc loc;
};

/// A resolved Boolean expression: nodes over wire indices, root last-built.
struct BoolExpr {
    std::vector<BoolNode> nodes;
    uint32_t root = 0;

    void clear() { nodes.clear(); root = 0; }
    uint32_t add(BoolNode n) {
        nodes.push_back(n);
        return uint32_t(nodes.size() - 1);
    }
    uint32_t constant(bool v, ir::SourceLoc loc = {});
    uint32_t var(uint32_t wire, ir::SourceLoc loc = {});
    uint32_t op(BoolNode::Kind k, uint32_t a, uint32_t b = 0, ir::SourceLoc loc = {});
    /// Evaluates on one assignment (bit w of `input` is wire w); for tests and checks.
    bool eval(const std::vector<bool>& input) const;
};

/// Appends `lit` to a product of literals: false when the product becomes 0 (x & !x); repeats drop.
bool and_literal(ir::LitVec& product, ir::Lit lit);

/// When the expression is a conjunction of literals and constants (`a & !b & 1`), puts the literals in
/// written order (repeats dropped) into `product` and returns true; `is_zero` tells whether it is 0.
bool as_conjunction(const BoolExpr& e, ir::LitVec& product, bool& is_zero);

/// When the expression is an exclusive-or of literals and constants (`a ^ !b ^ c`), puts the wires
/// (pairs cancelled, first occurrence order) into `wires` and the constant part into `constant`.
bool as_parity(const BoolExpr& e, std::vector<uint32_t>& wires, bool& constant);

/// An exact exclusive-or of products of literals equal to `e` on every input. Cubes are sorted by
/// wire; the empty cube is the constant 1. Throws UserError at `loc` past `max_terms` cubes.
std::vector<ir::LitVec> esop(const BoolExpr& e, uint32_t max_terms, ir::SourceLoc loc);

/// The multilinear form f(x) = sum_S c_S prod_{i in S} x_i (integer coefficients, monomials sorted,
/// zero terms dropped; the empty monomial is the constant term). Throws UserError past `max_terms`.
struct Monomial {
    std::vector<uint32_t> wires;
    int64_t coeff = 0;
};
std::vector<Monomial> multilinear(const BoolExpr& e, uint32_t max_terms, ir::SourceLoc loc);

}  // namespace whittle::frontend
