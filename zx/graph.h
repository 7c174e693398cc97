// ZX diagrams as graphs: Z spiders and boundary vertices joined by plain or Hadamard edges.
#pragma once

#include <cstdint>
#include <vector>

#include "ir/angle.h"

namespace whittle::zx {

using Vertex = uint32_t;
constexpr Vertex kNoVertex = 0xffffffffu;

/// Only Z spiders: an X spider is a Z spider with a Hadamard on every leg, so a diagram in this
/// form (graph-like, Duncan, Kissinger, Perdrix, van de Wetering 2020, arXiv:1902.03178) needs no
/// other colour. A boundary is an input or output of the diagram and has exactly one edge.
enum class VertexKind : uint8_t { Boundary, Z };
enum class EdgeKind : uint8_t { Plain, Hadamard };

/// The edge kind of two edges in a row through a phase-free degree-2 spider (H H = plain).
inline EdgeKind compose(EdgeKind a, EdgeKind b) { return a == b ? EdgeKind::Plain : EdgeKind::Hadamard; }

/// A ZX diagram up to a non-zero scalar (no scalar is tracked: the equivalence engine and the
/// T-count pass only need the map up to one). Vertices are ids that stay valid until removed;
/// neighbour lists are unordered vectors and edges sit in one hash table, so adding, removing and
/// finding an edge is O(1) and the graph holds 10^5-gate circuits in a few tens of MB.
class Graph {
public:
    Vertex add_vertex(VertexKind kind, ir::Angle phase = {}, uint32_t qubit = 0);
    /// Removes the vertex and its edges.
    void remove_vertex(Vertex v);
    bool alive(Vertex v) const { return v < alive_.size() && alive_[v]; }
    /// One past the largest vertex id ever handed out (ids of removed vertices are not reused).
    Vertex id_bound() const { return Vertex(alive_.size()); }
    size_t num_vertices() const { return live_count_; }
    size_t num_edges() const { return edges_.size(); }

    VertexKind kind(Vertex v) const { return kind_[v]; }
    bool is_boundary(Vertex v) const { return kind_[v] == VertexKind::Boundary; }
    const ir::Angle& phase(Vertex v) const { return phase_[v]; }
    void set_phase(Vertex v, const ir::Angle& a) { phase_[v] = a; }
    void add_to_phase(Vertex v, const ir::Angle& a) { phase_[v] += a; }
    /// The wire a vertex was created on (layout and drawing only; the rules ignore it).
    uint32_t qubit(Vertex v) const { return qubit_[v]; }

    const std::vector<Vertex>& neighbors(Vertex v) const { return adj_[v]; }
    size_t degree(Vertex v) const { return adj_[v].size(); }
    bool connected(Vertex u, Vertex v) const { return edges_.find(key(u, v)) != nullptr; }
    /// The kind of the edge u-v; the edge must exist.
    EdgeKind edge_kind(Vertex u, Vertex v) const;
    /// Adds an edge; u != v and no edge u-v may exist.
    void add_edge(Vertex u, Vertex v, EdgeKind k);
    void remove_edge(Vertex u, Vertex v);
    /// Hadamard edge between two Z spiders by the Hopf law: two parallel Hadamard edges between Z
    /// spiders cancel, so this removes the edge when there is one and adds it otherwise.
    void toggle_hadamard(Vertex u, Vertex v);
    /// True when a boundary is among v's neighbours (O(1): counted as edges come and go).
    bool touches_boundary(Vertex v) const { return boundary_nbrs_[v] != 0; }
    /// How many of v's edges are plain (O(1)).
    uint32_t plain_degree(Vertex v) const { return plain_nbrs_[v]; }
    /// True when v is a Z spider whose every edge is a Hadamard edge to a Z spider: interior and
    /// graph-like around it, what local complementation and pivoting need (O(1)).
    bool interior(Vertex v) const {
        return kind_[v] == VertexKind::Z && boundary_nbrs_[v] == 0 && plain_nbrs_[v] == 0;
    }

    /// Phase tracking (phase teleportation, Kissinger, van de Wetering 2020, arXiv:1903.10477): a
    /// spider may hold sources, numbered phases of the circuit the diagram came from. Its phase is
    /// then sum(sign(s) * value of s) over its sources plus a constant, for every value the
    /// sources might take, so the rules treat it as an unknown (never Clifford, never zero) and
    /// only fusion moves sources: spiders fused, their sources join.
    bool tracked(Vertex v) const { return !sources_[v].empty(); }
    const std::vector<uint32_t>& sources(Vertex v) const { return sources_[v]; }
    /// Puts source `s` (with sign +1) into spider v.
    void add_source(Vertex v, uint32_t s);
    /// Moves every source of `from` to `to` (the caller adds the phases).
    void move_sources(Vertex from, Vertex to);
    /// phase(v) := -phase(v), flipping the sign of each of its sources.
    void negate_phase(Vertex v);
    /// +1 or -1: the sign with which source s enters its spider's phase.
    int sign(uint32_t s) const { return s < sign_.size() ? sign_[s] : 1; }

    /// Input and output boundaries by wire (kNoVertex for a wire whose end is a state or effect).
    std::vector<Vertex> inputs, outputs;

private:
    struct EdgeRec {
        EdgeKind kind;
        uint32_t pos_lo, pos_hi;  ///< index of hi in adj_[lo], of lo in adj_[hi]
    };
    /// Edges by key (lo << 32 | hi, never 0 since lo < hi): open addressing with linear probing and
    /// backward-shift deletion, at most half full. The rules spend most of their time finding and
    /// toggling edges, which a node-based map makes a cache miss and an allocation each.
    class EdgeTable {
    public:
        size_t size() const { return size_; }
        EdgeRec* find(uint64_t key);
        const EdgeRec* find(uint64_t key) const { return const_cast<EdgeTable*>(this)->find(key); }
        /// Inserts; the key must be absent.
        void insert(uint64_t key, const EdgeRec& rec);
        /// Removes; the key must be present.
        void erase(uint64_t key);

    private:
        size_t home(uint64_t key) const { return size_t((key * 0x9E3779B97F4A7C15ull) >> shift_); }
        void grow();
        std::vector<uint64_t> keys_;
        std::vector<EdgeRec> recs_;
        size_t size_ = 0, mask_ = 0;
        unsigned shift_ = 64;
    };
    static uint64_t key(Vertex u, Vertex v) {
        return u < v ? (uint64_t(u) << 32) | v : (uint64_t(v) << 32) | u;
    }
    /// Records that `b` sits at `pos` in adj_[a].
    void set_pos(Vertex a, Vertex b, uint32_t pos);
    void erase_from(Vertex a, uint32_t pos);
    /// Keeps boundary_nbrs_ and plain_nbrs_ for an edge u-v of kind k coming (+1) or going (-1).
    void count(Vertex u, Vertex v, EdgeKind k, int by);

    std::vector<VertexKind> kind_;
    std::vector<ir::Angle> phase_;
    std::vector<uint32_t> qubit_;
    std::vector<uint8_t> alive_;
    std::vector<std::vector<Vertex>> adj_;
    std::vector<uint32_t> boundary_nbrs_, plain_nbrs_;  ///< per vertex: boundary neighbours, plain edges
    std::vector<std::vector<uint32_t>> sources_;
    std::vector<int8_t> sign_;
    EdgeTable edges_;
    size_t live_count_ = 0;
};

}  // namespace whittle::zx
