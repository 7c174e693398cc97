// ZX rewrite rules against the matrices of the diagrams they rewrite (tests/support/zx_dense.h).
#include <doctest/doctest.h>

#include <random>

#include <fmt/format.h>

#include "support/zx_dense.h"
#include "zx/simplify.h"

using namespace whittle;
using namespace whittle::zx;
using test::proportional;
using test::zx_matrix;

namespace {

ir::Angle eighths(int k) { return ir::Angle::pi_times(k, 4); }

/// A random graph-like diagram: `wires` inputs and outputs, each on a spider of its own (plain or
/// Hadamard boundary edge), `extra` interior spiders, random Hadamard edges between spiders, phases
/// drawn from `phases` (multiples of pi/4).
Graph random_diagram(std::mt19937_64& rng, uint32_t wires, uint32_t extra, const std::vector<int>& phases,
                     double density) {
    Graph g;
    auto pick_phase = [&] { return eighths(phases[rng() % phases.size()]); };
    std::vector<Vertex> spiders;
    g.inputs.resize(wires);
    g.outputs.resize(wires);
    for (uint32_t w = 0; w < wires; ++w) {
        g.inputs[w] = g.add_vertex(VertexKind::Boundary, {}, w);
        g.outputs[w] = g.add_vertex(VertexKind::Boundary, {}, w);
    }
    for (uint32_t w = 0; w < 2 * wires; ++w) {
        const Vertex s = g.add_vertex(VertexKind::Z, pick_phase(), w / 2);
        const Vertex b = w % 2 ? g.outputs[w / 2] : g.inputs[w / 2];
        g.add_edge(b, s, rng() % 2 ? EdgeKind::Plain : EdgeKind::Hadamard);
        spiders.push_back(s);
    }
    for (uint32_t k = 0; k < extra; ++k) spiders.push_back(g.add_vertex(VertexKind::Z, pick_phase(), 0));
    for (size_t i = 0; i < spiders.size(); ++i)
        for (size_t j = i + 1; j < spiders.size(); ++j)
            if (std::bernoulli_distribution(density)(rng)) g.add_edge(spiders[i], spiders[j], EdgeKind::Hadamard);
    return g;
}

using Rule = size_t (*)(Graph&, SimplifyStats&);

/// Applies `rule` to random diagrams; each application must keep the matrix up to a non-zero
/// scalar. Returns how many diagrams the rule changed.
int check_rule(Rule rule, const std::vector<int>& phases, uint64_t seed, int rounds = 150) {
    std::mt19937_64 rng(seed);
    int fired = 0;
    for (int round = 0; round < rounds; ++round) {
        const uint32_t wires = 1 + uint32_t(rng() % 2), extra = 2 + uint32_t(rng() % 5);
        Graph g = random_diagram(rng, wires, extra, phases, 0.45);
        const Eigen::MatrixXcd before = zx_matrix(g);
        if (before.norm() < 1e-9) continue;  // a zero diagram says nothing
        SimplifyStats st;
        if (rule(g, st) == 0) continue;
        ++fired;
        CAPTURE(round);
        CHECK(proportional(zx_matrix(g), before));
    }
    return fired;
}

}  // namespace

TEST_CASE("spider fusion: Z(a) -- Z(b) = Z(a+b) (the spider rule, Coecke & Duncan 2011, arXiv:0906.4725)") {
    Graph g;
    g.inputs = {g.add_vertex(VertexKind::Boundary)};
    g.outputs = {g.add_vertex(VertexKind::Boundary)};
    const Vertex a = g.add_vertex(VertexKind::Z, eighths(1)), b = g.add_vertex(VertexKind::Z, eighths(2));
    g.add_edge(g.inputs[0], a, EdgeKind::Plain);
    g.add_edge(a, b, EdgeKind::Plain);
    g.add_edge(b, g.outputs[0], EdgeKind::Plain);
    const Eigen::MatrixXcd before = zx_matrix(g);
    // T then S is diag(1, e^{3i pi/4}) (Nielsen & Chuang ch. 4): the fused spider's phase.
    CHECK(std::abs(before(1, 1) - std::exp(std::complex<double>(0, 3 * M_PI / 4))) < 1e-12);
    SimplifyStats st;
    CHECK(fuse_spiders(g, st) == 1);
    CHECK(g.num_vertices() == 3);
    CHECK(proportional(zx_matrix(g), before));
    CHECK(g.phase(a) == eighths(3));
}

TEST_CASE("identity removal: -H- Z(0) -H- is a plain wire (H H = I)") {
    Graph g;
    g.inputs = {g.add_vertex(VertexKind::Boundary)};
    g.outputs = {g.add_vertex(VertexKind::Boundary)};
    const Vertex v = g.add_vertex(VertexKind::Z);
    g.add_edge(g.inputs[0], v, EdgeKind::Hadamard);
    g.add_edge(v, g.outputs[0], EdgeKind::Hadamard);
    SimplifyStats st;
    CHECK(remove_identities(g, st) == 1);
    CHECK(g.num_vertices() == 2);
    CHECK(g.edge_kind(g.inputs[0], g.outputs[0]) == EdgeKind::Plain);
    CHECK(proportional(zx_matrix(g), Eigen::MatrixXcd::Identity(2, 2)));
}

TEST_CASE("Hopf law: two Hadamard edges between Z spiders cancel (CZ CZ = I)") {
    Graph g;
    const Vertex a = g.add_vertex(VertexKind::Z), b = g.add_vertex(VertexKind::Z);
    g.toggle_hadamard(a, b);
    CHECK(g.connected(a, b));
    g.toggle_hadamard(a, b);
    CHECK(!g.connected(a, b));
    CHECK(g.num_edges() == 0);
}

TEST_CASE("local complementation keeps the map (Duncan et al. 2020, arXiv:1902.03178, Lemma 5.2)") {
    // Phases +-pi/2 on the spider removed; anything on the rest.
    CHECK(check_rule(local_complement, {2, 6, 0, 1, 4}, 11) >= 30);
}

TEST_CASE("pivoting keeps the map (Duncan et al. 2020, arXiv:1902.03178, Lemma 5.3)") {
    CHECK(check_rule(pivot_interior, {0, 4, 1, 2}, 12) >= 30);
}

TEST_CASE("pivoting against the boundary keeps the map (Duncan et al. 2020, arXiv:1902.03178, Section 5)") {
    CHECK(check_rule(pivot_boundary, {0, 4, 0, 4, 1, 3}, 13) >= 30);
}

TEST_CASE("phase-gadget formation keeps the map (Duncan et al. 2020, arXiv:1902.03178, Section 7)") {
    CHECK(check_rule(pivot_gadget, {0, 4, 1, 3, 5}, 14) >= 30);
}

TEST_CASE("identity removal and fusion keep the map on random diagrams") {
    CHECK(check_rule(remove_identities, {0, 0, 0, 1, 4}, 15) >= 30);
}

TEST_CASE("phase gadgets on one set of spiders fuse (Kissinger, van de Wetering 2020, arXiv:1903.10477)") {
    // Two gadgets e^{i pi/4 (a xor b)} and e^{i pi/4 (a xor b)} on spiders a, b: one gadget of pi/2.
    Graph g;
    g.inputs = {g.add_vertex(VertexKind::Boundary, {}, 0), g.add_vertex(VertexKind::Boundary, {}, 1)};
    g.outputs = {g.add_vertex(VertexKind::Boundary, {}, 0), g.add_vertex(VertexKind::Boundary, {}, 1)};
    const Vertex a = g.add_vertex(VertexKind::Z), b = g.add_vertex(VertexKind::Z);
    g.add_edge(g.inputs[0], a, EdgeKind::Plain);
    g.add_edge(a, g.outputs[0], EdgeKind::Plain);
    g.add_edge(g.inputs[1], b, EdgeKind::Plain);
    g.add_edge(b, g.outputs[1], EdgeKind::Plain);
    std::vector<Vertex> leaves;
    for (int k = 0; k < 2; ++k) {
        const Vertex hub = g.add_vertex(VertexKind::Z, k == 1 ? eighths(4) : ir::Angle());  // one hub carries pi
        const Vertex leaf = g.add_vertex(VertexKind::Z, eighths(1));
        g.add_edge(hub, a, EdgeKind::Hadamard);
        g.add_edge(hub, b, EdgeKind::Hadamard);
        g.add_edge(hub, leaf, EdgeKind::Hadamard);
        leaves.push_back(leaf);
    }
    const Eigen::MatrixXcd before = zx_matrix(g);
    // The hub with pi makes the second gadget e^{-i pi/4 (a xor b)}: the two cancel to the identity
    // up to a scalar (diag(1, e^{i pi/4}, e^{i pi/4}, 1) times its inverse).
    CHECK(proportional(before, Eigen::MatrixXcd::Identity(4, 4)));
    SimplifyStats st;
    CHECK(fuse_gadgets(g, st) == 1);
    CHECK(proportional(zx_matrix(g), before));
    CHECK(g.num_vertices() == 8);
    CHECK(reduce_to_fixpoint(g, st));
    CHECK(g.num_vertices() == 4);  // bare wires
    CHECK(g.neighbors(g.outputs[0])[0] == g.inputs[0]);
    CHECK(g.neighbors(g.outputs[1])[0] == g.inputs[1]);
}

TEST_CASE("gadget fusion keeps the map on random diagrams with gadgets") {
    std::mt19937_64 rng(16);
    int fired = 0;
    for (int round = 0; round < 200; ++round) {
        Graph g = random_diagram(rng, 2, 1, {0, 1, 2, 4}, 0.4);
        std::vector<Vertex> spiders;
        for (Vertex v = 0; v < g.id_bound(); ++v)
            if (!g.is_boundary(v)) spiders.push_back(v);
        // gadgets on random subsets, some sharing one
        for (int k = 0; k < 3; ++k) {
            const uint64_t mask = k == 2 ? 0b0101 : 0b0101 | (rng() % 16);
            const Vertex hub = g.add_vertex(VertexKind::Z, eighths(int(rng() % 2) * 4));
            const Vertex leaf = g.add_vertex(VertexKind::Z, eighths(int(rng() % 8)));
            g.add_edge(hub, leaf, EdgeKind::Hadamard);
            for (size_t i = 0; i < spiders.size() && i < 6; ++i)
                if (mask >> i & 1) g.add_edge(hub, spiders[i], EdgeKind::Hadamard);
        }
        const Eigen::MatrixXcd before = zx_matrix(g);
        if (before.norm() < 1e-9) continue;
        SimplifyStats st;
        if (fuse_gadgets(g, st) == 0) continue;
        ++fired;
        CAPTURE(round);
        CHECK(proportional(zx_matrix(g), before));
    }
    CHECK(fired >= 30);
}

TEST_CASE("full reduction keeps the map on random diagrams") {
    std::mt19937_64 rng(17);
    int reduced = 0;
    for (int round = 0; round < 200; ++round) {
        Graph g = random_diagram(rng, 2, 1 + uint32_t(rng() % 6), {0, 1, 2, 3, 4, 5, 6, 7}, 0.4);
        const Eigen::MatrixXcd before = zx_matrix(g);
        if (before.norm() < 1e-9) continue;
        const size_t n = g.num_vertices();
        SimplifyStats st;
        CHECK(reduce_to_fixpoint(g, st));
        reduced += g.num_vertices() < n;
        CAPTURE(round);
        CHECK(proportional(zx_matrix(g), before));
    }
    CHECK(reduced >= 100);
}
