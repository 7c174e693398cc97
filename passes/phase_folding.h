// The phase-folding engine under fold-phases and fold-rotations: phase terms keyed by Boolean polynomials.
#pragma once

#include <cstddef>

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

struct FoldSettings {
    /// Expand AND terms (Phase on k >= 2 literals) into parity terms when the expansion lowers the
    /// cost (see fold_phase_terms). Off at the low level, where no Parity ops may appear.
    bool expand_products = false;
    /// Largest product expanded (2^k - 1 parity terms); at most 8.
    size_t max_expand_literals = 3;
    /// A wire whose polynomial would exceed this many monomials gets a fresh variable instead.
    size_t max_terms = 64;
    /// Rounds at most: an expansion can make parities that expose further merges and expansions.
    /// A round stops the loop when it changes nothing or when the next one provably would not.
    size_t rounds = 1;
    /// From this many ops on, each round first takes a census of the term keys (one more reading of
    /// the circuit, about a third more time) so that the keys only one term has are neither
    /// interned nor stored: at 10^7 ops those tables were hundreds of MB. Below, every key is
    /// interned. Either way the result is the same.
    size_t census_from_ops = size_t(1) << 22;
};

/// Phase folding (Amy, Maslov, Mosca 2014, arXiv:1303.2042; on the lowered circuit the rotation
/// merging of Nam, Ross, Su, Childs, Maslov 2018, arXiv:1710.07345), generalized to AND terms.
/// Every wire's value is a Boolean polynomial (a sorted list of interned monomial ids, sequence_table.h)
/// over the input variables and fresh path variables, which H, every other non-classical op,
/// measurement and conditioned ops introduce
/// (sum-over-paths reading: each diagonal op multiplies each path's amplitude by e^{i t f}, where
/// f is its polynomial, so angles may move between ops whose polynomials are equal). X-type ops
/// update the polynomials (t ^= AND of literals); Phase, Parity and uncontrolled RZ ops are terms
/// e^{i t f}; f = 1 ^ g is read as e^{it} e^{-it g}. Terms on equal polynomials merge into the
/// first occurrence, which keeps its kind (an RZ stays an RZ). Ops carrying a pair id are left
/// alone (their halves must stay inverses).
///
/// With expand_products, an AND term is replaced by its parity terms, by the standard phase-
/// polynomial identity AND(x_1..x_k) = 2^{1-k} * sum over non-empty S of (-1)^{|S|-1} XOR(x_S)
/// (e.g. xy = (x + y - (x ^ y)) / 2), when some of those parities occur in other terms and the
/// whole plan lowers the cost: one per non-Clifford parity term, 2^k - 1 per non-Clifford AND term.
/// Only products whose parity angles t / 2^{k-1} are multiples of pi/4 are expanded (CS, CZ, CCZ
/// and their multiples): finer parities would need rotation synthesis where the product itself
/// lowers exactly through Toffolis.
/// Linear in the circuit size for fixed caps and rounds. Returns false, leaving the circuit
/// untouched, when no two terms merge.
bool fold_phase_terms(ir::Circuit& c, const FoldSettings& settings, PassResult& result);

}  // namespace whittle::passes
