// ZX graphs: vertex and edge bookkeeping (O(1) edge lookup, add and remove).
#include "zx/graph.h"

#include <algorithm>
#include <bit>

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

Graph::EdgeRec* Graph::EdgeTable::find(uint64_t key) {
    if (size_ == 0) return nullptr;
    for (size_t i = home(key);; i = (i + 1) & mask_) {
        if (keys_[i] == key) return &recs_[i];
        if (keys_[i] == 0) return nullptr;
    }
}

void Graph::EdgeTable::grow() {
    std::vector<uint64_t> old_keys = std::move(keys_);
    std::vector<EdgeRec> old_recs = std::move(recs_);
    const size_t cap = old_keys.empty() ? 64 : old_keys.size() * 2;
    keys_.assign(cap, 0);
    recs_.assign(cap, EdgeRec{});
    mask_ = cap - 1;
    shift_ = 64 - unsigned(std::countr_zero(cap));
    for (size_t i = 0; i < old_keys.size(); ++i) {
        if (old_keys[i] == 0) continue;
        size_t j = home(old_keys[i]);
        while (keys_[j] != 0) j = (j + 1) & mask_;
        keys_[j] = old_keys[i];
        recs_[j] = old_recs[i];
    }
}

void Graph::EdgeTable::insert(uint64_t key, const EdgeRec& rec) {
    if (2 * (size_ + 1) > keys_.size()) grow();
    size_t i = home(key);
    while (keys_[i] != 0) {
        WHITTLE_ASSERT(keys_[i] != key && "zx::Graph: the edge exists already");
        i = (i + 1) & mask_;
    }
    keys_[i] = key;
    recs_[i] = rec;
    ++size_;
}

void Graph::EdgeTable::erase(uint64_t key) {
    size_t i = home(key);
    while (keys_[i] != key) {
        WHITTLE_ASSERT(keys_[i] != 0 && "zx::Graph: erasing a missing edge");
        i = (i + 1) & mask_;
    }
    // Backward shift: move later entries of the probe run into the hole when their home allows.
    for (size_t j = (i + 1) & mask_; keys_[j] != 0; j = (j + 1) & mask_) {
        const size_t h = home(keys_[j]);
        const bool movable = i <= j ? (h <= i || h > j) : (h <= i && h > j);
        if (!movable) continue;
        keys_[i] = keys_[j];
        recs_[i] = recs_[j];
        i = j;
    }
    keys_[i] = 0;
    --size_;
}

EdgeKind Graph::edge_kind(Vertex u, Vertex v) const {
    const EdgeRec* r = edges_.find(key(u, v));
    WHITTLE_ASSERT(r && "zx::Graph::edge_kind of a missing edge");
    return r->kind;
}

void Graph::set_pos(Vertex a, Vertex b, uint32_t pos) {
    EdgeRec* r = edges_.find(key(a, b));
    (a < b ? r->pos_lo : r->pos_hi) = pos;
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
    edges_.insert(key(u, v), EdgeRec{k, uint32_t(adj_[lo].size()), uint32_t(adj_[hi].size())});
    adj_[lo].push_back(hi);
    adj_[hi].push_back(lo);
    count(u, v, k, 1);
}

void Graph::remove_edge(Vertex u, Vertex v) {
    const EdgeRec* it = edges_.find(key(u, v));
    WHITTLE_ASSERT(it && "zx::Graph::remove_edge of a missing edge");
    const Vertex lo = std::min(u, v), hi = std::max(u, v);
    const uint32_t pos_lo = it->pos_lo, pos_hi = it->pos_hi;
    count(u, v, it->kind, -1);
    edges_.erase(key(u, v));
    erase_from(lo, pos_lo);
    erase_from(hi, pos_hi);
}

void Graph::toggle_hadamard(Vertex u, Vertex v) {
    WHITTLE_ASSERT(kind_[u] == VertexKind::Z && kind_[v] == VertexKind::Z && "toggle_hadamard joins Z spiders");
    const EdgeRec* it = edges_.find(key(u, v));
    if (!it) return add_edge(u, v, EdgeKind::Hadamard);
    WHITTLE_ASSERT(it->kind == EdgeKind::Hadamard && "toggle_hadamard over a plain edge");
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
