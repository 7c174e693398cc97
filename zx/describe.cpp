// A ZX diagram as text: one line per boundary and per spider.
#include "zx/describe.h"

#include <algorithm>

#include <fmt/format.h>

namespace whittle::zx {

std::string describe(const Graph& g, const ir::Circuit& shape) {
    std::vector<std::string> label(g.id_bound());
    std::vector<std::string> boundary_name(g.id_bound());
    uint32_t next = 0;
    for (Vertex v = 0; v < g.id_bound(); ++v)
        if (g.alive(v) && !g.is_boundary(v)) label[v] = fmt::format("s{}", ++next);
    for (uint32_t w = 0; w < g.inputs.size(); ++w) {
        const std::string name = w < shape.num_qubits() ? shape.wire_name(w) : fmt::format("wire {}", w);
        if (g.inputs[w] != kNoVertex && g.alive(g.inputs[w])) label[g.inputs[w]] = "in " + name;
        if (g.outputs[w] != kNoVertex && g.alive(g.outputs[w])) label[g.outputs[w]] = "out " + name;
    }
    for (Vertex v = 0; v < g.id_bound(); ++v)
        if (g.alive(v) && g.is_boundary(v) && label[v].empty()) label[v] = fmt::format("cut {}", g.qubit(v));
    auto edge = [&](Vertex a, Vertex b) {
        return fmt::format("{} {}", g.edge_kind(a, b) == EdgeKind::Plain ? "=" : "~", label[b]);
    };
    std::string out = fmt::format("{} spiders, {} edges; \"=\" plain edge, \"~\" Hadamard edge\n", next, g.num_edges());
    out += "wires\n";
    for (uint32_t w = 0; w < g.inputs.size(); ++w) {
        for (Vertex b : {g.inputs[w], g.outputs[w]}) {
            if (b == kNoVertex || !g.alive(b)) continue;
            if (b == g.outputs[w] && g.degree(b) == 1 && g.is_boundary(g.neighbors(b)[0])) continue;  // listed with it
            out += fmt::format("  {:<16}", label[b]);
            for (Vertex x : g.neighbors(b)) out += " " + edge(b, x);
            out += "\n";
        }
        if (g.inputs[w] == kNoVertex) out += fmt::format("  {:<16} starts at |0>\n", "in " + shape.wire_name(w));
    }
    out += "spiders\n";
    for (Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.is_boundary(v)) continue;
        std::vector<Vertex> nb = g.neighbors(v);
        std::sort(nb.begin(), nb.end());
        const bool leaf = nb.size() == 1 && !g.is_boundary(nb[0]) && g.edge_kind(v, nb[0]) == EdgeKind::Hadamard &&
                          g.phase(nb[0]).is_multiple_of_pi_over(1) && g.degree(nb[0]) >= 3;
        out += fmt::format("  {:<6} {:<10}", label[v], g.phase(v).to_string());
        for (Vertex x : nb) out += " " + edge(v, x);
        if (leaf) out += "   (phase gadget)";
        if (nb.empty()) out += " (a number)";
        out += "\n";
    }
    return out;
}

}  // namespace whittle::zx
