// ZX diagram back to a circuit: wire paths give H gates and phases, the edges across wires CZs, placed greedily in time.
#include "zx/to_circuit.h"

#include <unordered_set>

namespace whittle::zx {
namespace {

uint64_t pair_key(Vertex a, Vertex b) { return a < b ? (uint64_t(a) << 32) | b : (uint64_t(b) << 32) | a; }

}  // namespace

std::optional<ir::Circuit> graph_to_circuit(const Graph& g, const ir::Circuit& shape) {
    const uint32_t n = uint32_t(g.inputs.size());
    if (shape.num_qubits() != n || g.outputs.size() != n) return std::nullopt;
    constexpr uint32_t kOff = 0xffffffffu;
    std::vector<uint32_t> wire_of(g.id_bound(), kOff), index_of(g.id_bound(), kOff);
    std::vector<std::vector<Vertex>> path(n);
    // Each wire's path: from the input, the one neighbour created on the wire that is not behind.
    for (uint32_t w = 0; w < n; ++w) {
        const Vertex in = g.inputs[w], out = g.outputs[w];
        if (in == kNoVertex || out == kNoVertex || !g.alive(in) || !g.alive(out) || g.degree(in) != 1) return std::nullopt;
        Vertex prev = in, cur = g.neighbors(in)[0];
        while (cur != out) {
            if (g.is_boundary(cur) || g.qubit(cur) != w || wire_of[cur] != kOff) return std::nullopt;
            wire_of[cur] = w;
            index_of[cur] = uint32_t(path[w].size());
            path[w].push_back(cur);
            Vertex next = kNoVertex;
            for (Vertex x : g.neighbors(cur)) {
                if (x == prev || (g.qubit(x) != w && x != out)) continue;
                if (next != kNoVertex) return std::nullopt;  // two ways on along one wire
                next = x;
            }
            if (next == kNoVertex) return std::nullopt;
            prev = cur;
            cur = next;
        }
    }
    // Every spider on a path, every other edge a Hadamard edge across two wires.
    std::vector<uint32_t> cz_left(g.id_bound(), 0);
    for (Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.is_boundary(v)) continue;
        if (wire_of[v] == kOff) return std::nullopt;
        const uint32_t w = wire_of[v], i = index_of[v];
        for (Vertex x : g.neighbors(v)) {
            const bool along = (i > 0 && x == path[w][i - 1]) || (i + 1 < path[w].size() && x == path[w][i + 1]) ||
                               (i == 0 && x == g.inputs[w]) || (i + 1 == path[w].size() && x == g.outputs[w]);
            if (along) continue;
            if (g.is_boundary(x) || wire_of[x] == w || g.edge_kind(v, x) != EdgeKind::Hadamard) return std::nullopt;
            ++cz_left[v];
        }
    }
    ir::Circuit c = shape.empty_copy();
    auto hadamard_if = [&](uint32_t w, Vertex a, Vertex b) {
        if (g.edge_kind(a, b) == EdgeKind::Hadamard) c.ops.push_back(ir::Op::one(ir::OpKind::H, w));
    };
    std::vector<uint32_t> pos(n, 0);
    std::vector<uint8_t> phased(g.id_bound(), 0);
    std::unordered_set<uint64_t> placed;
    for (uint32_t w = 0; w < n; ++w) {
        if (path[w].empty()) {
            hadamard_if(w, g.inputs[w], g.outputs[w]);
            continue;
        }
        hadamard_if(w, g.inputs[w], path[w][0]);
    }
    for (bool progress = true; progress;) {
        progress = false;
        for (uint32_t w = 0; w < n; ++w) {
            while (pos[w] < path[w].size()) {
                const Vertex s = path[w][pos[w]];
                if (!phased[s]) {
                    phased[s] = 1;
                    if (!g.phase(s).identical(ir::Angle()))
                        c.ops.push_back(ir::Op::phase(g.phase(s), {ir::Lit::pos(w)}));
                }
                for (Vertex x : g.neighbors(s)) {
                    if (g.is_boundary(x) || wire_of[x] == w) continue;
                    const uint32_t wx = wire_of[x];
                    if (pos[wx] >= path[wx].size() || path[wx][pos[wx]] != x || !placed.insert(pair_key(s, x)).second)
                        continue;
                    c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1), {ir::Lit::pos(std::min(w, wx)),
                                                                            ir::Lit::pos(std::max(w, wx))}));
                    --cz_left[s];
                    --cz_left[x];
                    progress = true;
                }
                if (cz_left[s] != 0) break;
                const Vertex next = pos[w] + 1 < path[w].size() ? path[w][pos[w] + 1] : g.outputs[w];
                hadamard_if(w, s, next);
                ++pos[w];
                progress = true;
            }
        }
    }
    for (uint32_t w = 0; w < n; ++w)
        if (pos[w] < path[w].size()) return std::nullopt;  // CZs that no time order places
    return c;
}

}  // namespace whittle::zx
