// Exclusive-sum-of-products minimization of Boolean expressions before they become multi-controlled ops.
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::frontend {

/// One product term of an exclusive sum of products: the AND of literals over variables 0..63.
/// Variable v is in the term when bit v of `care` is set; positively when bit v of `polarity` is
/// also set, negated otherwise. `polarity` has no bit outside `care`. care == 0 is the constant 1.
/// An ESOP is a std::vector<Cube>, meaning the exclusive-or of its cubes (empty vector: constant 0).
struct Cube {
    uint64_t care = 0;
    uint64_t polarity = 0;

    static Cube literal(unsigned var, bool positive) {
        uint64_t bit = uint64_t(1) << var;
        return Cube{bit, positive ? bit : 0};
    }
    /// The AND of two cubes; `contradiction` is set when they hold opposite literals (the product is 0).
    Cube conjoin(const Cube& o, bool& contradiction) const {
        contradiction = ((care & o.care) & (polarity ^ o.polarity)) != 0;
        return Cube{care | o.care, polarity | o.polarity};
    }
    /// Value of the cube on the assignment whose bit v is variable v.
    bool eval(uint64_t assignment) const { return ((assignment ^ polarity) & care) == 0; }
    unsigned literals() const { return unsigned(__builtin_popcountll(care)); }
    friend bool operator==(const Cube&, const Cube&) = default;
};

/// What the minimizer makes small.
enum class EsopCost {
    /// The Toffolis a cube's multi-controlled op lowers to (k >= 2 literals: 2k-3, the clean V-chain),
    /// then the number of cubes, then the number of literals. The default.
    Toffolis,
    /// The number of cubes, then the number of literals.
    Cubes,
};

/// Cost of one cube under `cost` (positive for every cube, additive over an ESOP).
uint64_t cube_cost(const Cube& c, EsopCost cost = EsopCost::Toffolis);

/// Returns an ESOP equal to the exclusive-or of `cubes` on every input, no more costly than the
/// input. Method: equal cubes pair off; a function of at most 4 variables gets an exact
/// minimum-cost ESOP (shortest paths over all 2^16 truth tables, one edge per cube, computed once).
/// Beyond 4 variables it is a heuristic: from the input and from the cheapest fixed-polarity
/// Reed-Muller form (all polarities up to 10 variables; up to 16 variables the all-positive and
/// all-negative ones), distance-1 merges (x.C ^ !x.C = C, x.C ^ C = !x.C) and distance-2 exorlink
/// reshapes (x_a y_a C ^ x_b y_b C = x3 y_a C ^ x_b y3 C, kept when the merges after them lower the
/// cost), the rewriting rules of the EXORCISM family of minimizers (Song & Perkowski 1996;
/// Mishchenko & Perkowski 2001; from memory). The cheapest result wins.
std::vector<Cube> minimize_esop(std::vector<Cube> cubes, EsopCost cost = EsopCost::Toffolis);

/// The same on products of control literals over wires (the elaborator's exact ESOP): wires become
/// variables 0..63 in order of first appearance. Over more than 64 distinct wires the cubes come
/// back unchanged. Literals in each returned cube are sorted by wire.
std::vector<ir::LitVec> minimize_esop(const std::vector<ir::LitVec>& cubes);

}  // namespace whittle::frontend
