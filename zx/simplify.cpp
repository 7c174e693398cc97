// Graph-like ZX simplification, implemented from Duncan, Kissinger, Perdrix, van de Wetering 2020,
// "Graph-theoretic simplification of quantum circuits with the ZX-calculus", arXiv:1902.03178:
// spider fusion and identity removal (Section 4), local complementation and pivoting (Lemmas 5.2
// and 5.3 there), pivoting against the boundary and phase-gadget formation (Section 5 and
// Section 7's extension to non-Clifford phases), and phase-gadget fusion (Kissinger, van de
// Wetering 2020, arXiv:1903.10477, Section 3).
#include "zx/simplify.h"

#include <algorithm>
#include <map>

#include "ir/error.h"

namespace whittle::zx {
namespace {

const ir::Angle kPi = ir::Angle::pi_times(1);

// A spider holding tracked phases (Graph::tracked) is an unknown: never zero, Pauli or Clifford.
bool zero(const Graph& g, Vertex v) { return !g.tracked(v) && g.phase(v).is_exact() && g.phase(v).is_zero(); }
bool pauli(const Graph& g, Vertex v) { return !g.tracked(v) && g.phase(v).is_multiple_of_pi_over(1); }
bool clifford(const Graph& g, Vertex v) { return !g.tracked(v) && g.phase(v).is_multiple_of_pi_over(2); }

/// A Z spider whose every neighbour is a Z spider behind a Hadamard edge (interior and graph-like
/// around it): the condition of local complementation and pivoting.
bool interior(const Graph& g, Vertex v) { return g.interior(v); }

bool has_leaf(const Graph& g, Vertex v) {
    for (Vertex w : g.neighbors(v))
        if (g.degree(w) == 1) return true;
    return false;
}

/// Merges Z spider w into Z spider u (not adjacent): phases add, w's edges move to u; parallel
/// edges between Z spiders resolve by the Hopf law (two Hadamard edges cancel), two plain edges are
/// one, and a plain edge beside a Hadamard edge becomes the plain edge and a pi (the Hadamard
/// self-loop the later fusion would leave).
void merge_into(Graph& g, Vertex u, Vertex w) {
    WHITTLE_ASSERT(!g.connected(u, w) && u != w && "merge_into: the joining edge is removed first");
    g.add_to_phase(u, g.phase(w));
    g.move_sources(w, u);
    const std::vector<Vertex> nb = g.neighbors(w);
    for (Vertex x : nb) {
        const EdgeKind k = g.edge_kind(w, x);
        g.remove_edge(w, x);
        if (g.is_boundary(x) || !g.connected(u, x)) {
            g.add_edge(u, x, k);
            continue;
        }
        const EdgeKind k0 = g.edge_kind(u, x);
        if (k0 == EdgeKind::Hadamard && k == EdgeKind::Hadamard) {
            g.remove_edge(u, x);
            continue;
        }
        if (k0 == EdgeKind::Plain && k == EdgeKind::Plain) continue;
        if (k0 == EdgeKind::Hadamard) {
            g.remove_edge(u, x);
            g.add_edge(u, x, EdgeKind::Plain);
        }
        g.add_to_phase(x, kPi);
    }
    g.remove_vertex(w);
}

/// Scratch marks over vertex ids, cleared after each use.
class Marks {
public:
    uint8_t& operator[](Vertex v) {
        if (v >= m_.size()) m_.resize(size_t(v) + 1 + m_.size() / 2, 0);
        return m_[v];
    }

private:
    std::vector<uint8_t> m_;
};

/// The pivot of Lemma 5.3 on the Hadamard edge u-v, both interior with Pauli phases.
void pivot(Graph& g, Vertex u, Vertex v, Marks& mark) {
    const ir::Angle pu = g.phase(u), pv = g.phase(v);
    std::vector<Vertex> all;
    for (Vertex x : g.neighbors(u))
        if (x != v) {
            mark[x] |= 1;
            all.push_back(x);
        }
    for (Vertex x : g.neighbors(v))
        if (x != u) {
            if (!mark[x]) all.push_back(x);
            mark[x] |= 2;
        }
    g.remove_vertex(u);
    g.remove_vertex(v);
    std::vector<Vertex> part[4];
    for (Vertex x : all) part[mark[x]].push_back(x);
    for (Vertex x : all) mark[x] = 0;
    const std::vector<Vertex>&a = part[1], &b = part[2], &c = part[3];
    for (Vertex x : a)
        for (Vertex y : b) g.toggle_hadamard(x, y);
    for (Vertex x : a)
        for (Vertex y : c) g.toggle_hadamard(x, y);
    for (Vertex x : b)
        for (Vertex y : c) g.toggle_hadamard(x, y);
    for (Vertex x : a) g.add_to_phase(x, pv);
    for (Vertex x : b) g.add_to_phase(x, pu);
    const ir::Angle both = pu + pv + kPi;
    for (Vertex x : c) g.add_to_phase(x, both);
}

}  // namespace

size_t fuse_spiders(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    for (Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.is_boundary(v) || g.plain_degree(v) == 0) continue;
        for (bool again = true; again;) {
            again = false;
            for (Vertex w : g.neighbors(v))
                if (!g.is_boundary(w) && g.edge_kind(v, w) == EdgeKind::Plain) {
                    g.remove_edge(v, w);
                    merge_into(g, v, w);
                    ++n;
                    again = true;
                    break;
                }
        }
    }
    st.fusions += n;
    return n;
}

size_t remove_identities(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    for (Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.is_boundary(v) || g.degree(v) != 2 || !zero(g, v)) continue;
        const Vertex a = g.neighbors(v)[0], b = g.neighbors(v)[1];
        const EdgeKind k = compose(g.edge_kind(v, a), g.edge_kind(v, b));
        g.remove_vertex(v);
        ++n;
        if (g.is_boundary(a) || g.is_boundary(b)) {
            g.add_edge(a, b, k);
            continue;
        }
        if (k == EdgeKind::Hadamard) {
            g.toggle_hadamard(a, b);
            continue;
        }
        if (g.connected(a, b)) {
            // fusing a and b along the new plain edge: an old Hadamard edge becomes a self-loop (pi)
            if (g.edge_kind(a, b) == EdgeKind::Hadamard) g.add_to_phase(a, kPi);
            g.remove_edge(a, b);
        }
        merge_into(g, a, b);
        ++st.fusions;
    }
    st.identities += n;
    return n;
}

size_t local_complement(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    for (Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.is_boundary(v)) continue;
        const ir::Angle a = g.phase(v);
        if (!clifford(g, v) || pauli(g, v) || !interior(g, v)) continue;
        const std::vector<Vertex> nb = g.neighbors(v);
        g.remove_vertex(v);
        for (size_t i = 0; i < nb.size(); ++i)
            for (size_t j = i + 1; j < nb.size(); ++j) g.toggle_hadamard(nb[i], nb[j]);
        for (Vertex x : nb) g.add_to_phase(x, -a);
        ++n;
    }
    st.local_complements += n;
    return n;
}

size_t pivot_interior(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    Marks mark;
    for (Vertex u = 0; u < g.id_bound(); ++u) {
        if (!g.alive(u) || g.is_boundary(u) || !pauli(g, u) || !interior(g, u)) continue;
        for (Vertex v : g.neighbors(u))
            if (pauli(g, v) && interior(g, v)) {
                pivot(g, u, v, mark);
                ++n;
                break;
            }
    }
    st.pivots += n;
    return n;
}

size_t pivot_boundary(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    Marks mark;
    for (Vertex u = 0; u < g.id_bound(); ++u) {
        if (!g.alive(u) || g.is_boundary(u) || !pauli(g, u) || !interior(g, u)) continue;
        Vertex v = kNoVertex;
        for (Vertex x : g.neighbors(u)) {
            if (!pauli(g, x) || !g.touches_boundary(x)) continue;
            bool ok = true;
            for (Vertex y : g.neighbors(x))
                ok = ok && (g.is_boundary(y) || g.edge_kind(x, y) == EdgeKind::Hadamard);
            if (ok) {
                v = x;
                break;
            }
        }
        if (v == kNoVertex) continue;
        const std::vector<Vertex> nb = g.neighbors(v);
        for (Vertex b : nb) {
            if (!g.is_boundary(b)) continue;
            // v -k- b  =  v -H- w -(k after H)- b with w a phase-free spider of degree 2
            const EdgeKind k = g.edge_kind(v, b);
            g.remove_edge(v, b);
            const Vertex w = g.add_vertex(VertexKind::Z, {}, g.qubit(b));
            g.add_edge(v, w, EdgeKind::Hadamard);
            g.add_edge(w, b, compose(k, EdgeKind::Hadamard));
        }
        pivot(g, u, v, mark);
        ++n;
    }
    st.boundary_pivots += n;
    return n;
}

size_t pivot_gadget(Graph& g, SimplifyStats& st) {
    size_t n = 0;
    Marks mark;
    for (Vertex u = 0; u < g.id_bound(); ++u) {
        if (!g.alive(u) || g.is_boundary(u) || g.degree(u) < 2 || !pauli(g, u) || !interior(g, u) || has_leaf(g, u))
            continue;
        Vertex v = kNoVertex;
        for (Vertex x : g.neighbors(u))
            if (!clifford(g, x) && g.degree(x) >= 2 && interior(g, x) && !has_leaf(g, x)) {
                v = x;
                break;
            }
        if (v == kNoVertex) continue;
        // v(a) = v(0) -H- hub(0) -H- leaf(a): unfuse the phase, then pivot u with the now Pauli v
        const ir::Angle a = g.phase(v);
        g.set_phase(v, {});
        const Vertex hub = g.add_vertex(VertexKind::Z, {}, g.qubit(v));
        const Vertex leaf = g.add_vertex(VertexKind::Z, a, g.qubit(v));
        g.move_sources(v, leaf);
        g.add_edge(v, hub, EdgeKind::Hadamard);
        g.add_edge(hub, leaf, EdgeKind::Hadamard);
        pivot(g, u, v, mark);
        if (!zero(g, hub)) {  // the hub got u's pi: push it through the leaf as a sign
            g.set_phase(hub, {});
            g.negate_phase(leaf);
        }
        ++n;
    }
    st.gadget_pivots += n;
    return n;
}

namespace {

/// The leaf of a phase gadget on `hub`: its one neighbour of degree 1, when it has exactly one and
/// the hub is interior with a Pauli phase; kNoVertex otherwise.
Vertex gadget_leaf(const Graph& g, Vertex hub) {
    if (g.is_boundary(hub) || !pauli(g, hub) || g.degree(hub) < 3 || !interior(g, hub)) return kNoVertex;
    Vertex leaf = kNoVertex;
    for (Vertex x : g.neighbors(hub))
        if (g.degree(x) == 1) {
            if (leaf != kNoVertex) return kNoVertex;
            leaf = x;
        }
    return leaf;
}

std::vector<Vertex> gadget_key(const Graph& g, Vertex hub, Vertex leaf) {
    std::vector<Vertex> k;
    for (Vertex x : g.neighbors(hub))
        if (x != leaf) k.push_back(x);
    std::sort(k.begin(), k.end());
    return k;
}

}  // namespace

size_t fuse_gadgets(Graph& g, SimplifyStats& st) {
    std::map<std::vector<Vertex>, std::vector<Vertex>> groups;  // key -> hubs
    for (Vertex h = 0; h < g.id_bound(); ++h) {
        if (!g.alive(h)) continue;
        const Vertex leaf = gadget_leaf(g, h);
        if (leaf == kNoVertex) continue;
        if (!zero(g, h)) {  // hub(pi) -H- leaf(a) = hub(0) -H- leaf(-a) (pi-copy)
            g.set_phase(h, {});
            g.negate_phase(leaf);
        }
        groups[gadget_key(g, h, leaf)].push_back(h);
    }
    size_t n = 0;
    for (auto& [key, hubs] : groups) {
        if (hubs.size() < 2) continue;
        const Vertex h0 = hubs[0], l0 = gadget_leaf(g, h0);
        if (l0 == kNoVertex || gadget_key(g, h0, l0) != key) continue;  // changed by an earlier fusion
        for (size_t i = 1; i < hubs.size(); ++i) {
            const Vertex h = hubs[i];
            if (!g.alive(h)) continue;
            const Vertex l = gadget_leaf(g, h);
            if (l == kNoVertex || !zero(g, h) || gadget_key(g, h, l) != key) continue;
            g.add_to_phase(l0, g.phase(l));
            g.move_sources(l, l0);
            g.remove_vertex(l);
            g.remove_vertex(h);
            ++n;
        }
    }
    st.gadget_fusions += n;
    return n;
}

bool reduce_clifford_interior(Graph& g, SimplifyStats& st, std::chrono::steady_clock::time_point deadline) {
    for (;;) {
        if (std::chrono::steady_clock::now() > deadline) return false;
        size_t n = fuse_spiders(g, st);
        n += remove_identities(g, st);
        n += local_complement(g, st);
        n += pivot_interior(g, st);
        if (n == 0) return true;
    }
}

bool reduce_to_fixpoint(Graph& g, SimplifyStats& st, std::chrono::steady_clock::time_point deadline) {
    if (!reduce_clifford_interior(g, st, deadline)) return false;
    pivot_gadget(g, st);
    for (;;) {
        do {
            if (!reduce_clifford_interior(g, st, deadline)) return false;
        } while (pivot_boundary(g, st) != 0);
        const size_t fused = fuse_gadgets(g, st);
        if (!reduce_clifford_interior(g, st, deadline)) return false;
        const size_t formed = pivot_gadget(g, st);
        if (fused + formed == 0) return true;
        if (std::chrono::steady_clock::now() > deadline) return false;
    }
}

}  // namespace whittle::zx
