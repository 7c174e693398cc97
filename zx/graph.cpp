// ZX graphs: vertex and edge bookkeeping (O(1) edge lookup, add and remove).
#include "zx/graph.h"

#include <algorithm>

#include "ir/error.h"

namespace whittle::zx {

Vertex Graph::add_vertex(VertexKind kind, ir::Angle phase, uint32_t qubit) {
    const Vertex v = Vertex(alive_.size());
    WHITTLE_ASSERT(v != kNoVertex && "zx::Graph: vertex ids exhausted");
    kind_.push_back(kind);
    phase_.push_back(phase);
    qubit_.push_back(qubit);
    alive_.push_back(1);
    adj_.emplace_back();
    boundary_nbrs_.push_back(0);
    plain_nbrs_.push_back(0);
    sources_.emplace_back();
    ++live_count_;
    return v;
}

void Graph::remove_vertex(Vertex v) {
    WHITTLE_ASSERT(alive(v) && "zx::Graph::remove_vertex on a removed vertex");
    while (!adj_[v].empty()) remove_edge(v, adj_[v].back());
    adj_[v].shrink_to_fit();
    WHITTLE_ASSERT(sources_[v].empty() && "zx::Graph: a rule removed a spider holding tracked phases");
    alive_[v] = 0;
    --live_count_;
}

EdgeKind Graph::edge_kind(Vertex u, Vertex v) const {
    const auto it = edges_.find(key(u, v));
    WHITTLE_ASSERT(it != edges_.end() && "zx::Graph::edge_kind of a missing edge");
    return it->second.kind;
}

void Graph::set_pos(Vertex a, Vertex b, uint32_t pos) {
    EdgeRec& r = edges_.find(key(a, b))->second;
    (a < b ? r.pos_lo : r.pos_hi) = pos;
}

void Graph::erase_from(Vertex a, uint32_t pos) {
    std::vector<Vertex>& list = adj_[a];
    const Vertex moved = list.back();
    list[pos] = moved;
    list.pop_back();
    if (pos < list.size()) set_pos(a, moved, pos);
}

void Graph::add_edge(Vertex u, Vertex v, EdgeKind k) {
    WHITTLE_ASSERT(u != v && alive(u) && alive(v) && "zx::Graph::add_edge between live, distinct vertices");
    const Vertex lo = std::min(u, v), hi = std::max(u, v);
    const auto [it, inserted] = edges_.emplace(key(u, v), EdgeRec{k, uint32_t(adj_[lo].size()), uint32_t(adj_[hi].size())});
    WHITTLE_ASSERT(inserted && "zx::Graph::add_edge: the edge exists already");
    (void)it;
    adj_[lo].push_back(hi);
    adj_[hi].push_back(lo);
    count(u, v, k, 1);
}

void Graph::remove_edge(Vertex u, Vertex v) {
    const auto it = edges_.find(key(u, v));
    WHITTLE_ASSERT(it != edges_.end() && "zx::Graph::remove_edge of a missing edge");
    const Vertex lo = std::min(u, v), hi = std::max(u, v);
    const uint32_t pos_lo = it->second.pos_lo, pos_hi = it->second.pos_hi;
    count(u, v, it->second.kind, -1);
    edges_.erase(it);
    erase_from(lo, pos_lo);
    erase_from(hi, pos_hi);
}

void Graph::toggle_hadamard(Vertex u, Vertex v) {
    WHITTLE_ASSERT(kind_[u] == VertexKind::Z && kind_[v] == VertexKind::Z && "toggle_hadamard joins Z spiders");
    const auto it = edges_.find(key(u, v));
    if (it == edges_.end()) return add_edge(u, v, EdgeKind::Hadamard);
    WHITTLE_ASSERT(it->second.kind == EdgeKind::Hadamard && "toggle_hadamard over a plain edge");
    remove_edge(u, v);
}

void Graph::add_source(Vertex v, uint32_t s) {
    if (s >= sign_.size()) sign_.resize(size_t(s) + 1, 1);
    sign_[s] = 1;
    sources_[v].push_back(s);
}

void Graph::move_sources(Vertex from, Vertex to) {
    if (sources_[from].empty()) return;
    std::vector<uint32_t>& a = sources_[to];
    std::vector<uint32_t>& b = sources_[from];
    if (a.size() < b.size()) a.swap(b);
    a.insert(a.end(), b.begin(), b.end());
    b.clear();
    b.shrink_to_fit();
}

void Graph::negate_phase(Vertex v) {
    phase_[v] = -phase_[v];
    for (uint32_t s : sources_[v]) sign_[s] = int8_t(-sign_[s]);
}

void Graph::count(Vertex u, Vertex v, EdgeKind k, int by) {
    if (kind_[v] == VertexKind::Boundary) boundary_nbrs_[u] += uint32_t(by);
    if (kind_[u] == VertexKind::Boundary) boundary_nbrs_[v] += uint32_t(by);
    if (k == EdgeKind::Plain) {
        plain_nbrs_[u] += uint32_t(by);
        plain_nbrs_[v] += uint32_t(by);
    }
}

}  // namespace whittle::zx
