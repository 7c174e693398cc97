// Graph-like ZX simplification (Duncan, Kissinger, Perdrix, van de Wetering 2020, arXiv:1902.03178).
#pragma once

#include <chrono>
#include <cstddef>

#include "zx/graph.h"

namespace whittle::zx {

/// How often each rule fired.
struct SimplifyStats {
    size_t fusions = 0, identities = 0, local_complements = 0, pivots = 0, boundary_pivots = 0,
           gadget_pivots = 0, gadget_fusions = 0;
    size_t total() const {
        return fusions + identities + local_complements + pivots + boundary_pivots + gadget_pivots + gadget_fusions;
    }
};

/// Every rule keeps the diagram's map up to a non-zero scalar. A rule that finds a match applies it
/// at once and goes on scanning; each returns how many times it fired. Phases count as Clifford
/// (a multiple of pi/2) or Pauli (of pi) only when exact.

/// Spider fusion: Z spiders joined by a plain edge become one, phases added.
size_t fuse_spiders(Graph& g, SimplifyStats& st);
/// Identity removal: a phase-free Z spider of degree 2 goes; its two edges become one (H H =
/// plain), and two Z spiders then joined by a plain edge fuse.
size_t remove_identities(Graph& g, SimplifyStats& st);
/// Local complementation: an interior Z spider with phase +-pi/2 goes; its neighbourhood is
/// complemented and each neighbour's phase decreases by that phase.
size_t local_complement(Graph& g, SimplifyStats& st);
/// Pivoting: two adjacent interior Z spiders with phases j*pi and k*pi go; the edges between the
/// three parts of their neighbourhood (u's only, v's only, both) are complemented, u's part gains
/// k*pi, v's j*pi, the common part (j+k+1)*pi.
size_t pivot_interior(Graph& g, SimplifyStats& st);
/// Pivoting against the boundary: an interior Pauli spider u next to a Pauli spider v on the
/// boundary; each boundary edge of v gets a phase-free spider of its own, which makes v interior,
/// then u and v pivot.
size_t pivot_boundary(Graph& g, SimplifyStats& st);
/// Phase-gadget formation: an interior Pauli spider u next to an interior non-Clifford spider v
/// (neither part of a gadget); v's phase moves into a new gadget on v and u and v pivot, which
/// leaves the phase on a gadget over what they touched.
size_t pivot_gadget(Graph& g, SimplifyStats& st);
/// Phase-gadget fusion: gadgets on the same set of spiders become one, phases added. Normalizes
/// gadget hubs to phase 0 first (a hub's pi moves into its leaf as a sign).
size_t fuse_gadgets(Graph& g, SimplifyStats& st);

/// Fusion, identity removal, local complementation and interior pivots until none applies.
/// Returns false when `deadline` passed.
bool reduce_clifford_interior(Graph& g, SimplifyStats& st, std::chrono::steady_clock::time_point deadline);
/// The whole procedure: interior Clifford rules, boundary pivots, gadget fusion and gadget pivots,
/// in rounds until a round changes nothing. Returns false when `deadline` passed (the diagram is
/// then partly simplified, still equal to the input up to a scalar).
bool reduce_to_fixpoint(Graph& g, SimplifyStats& st,
                 std::chrono::steady_clock::time_point deadline = std::chrono::steady_clock::time_point::max());

}  // namespace whittle::zx
