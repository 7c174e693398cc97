// Circuit to ZX diagram: the diagram's matrix against the circuit's (tests/support/dense_unitary.h).
#include <doctest/doctest.h>

#include <algorithm>
#include <random>

#include "ir/printer.h"
#include "support/dense_unitary.h"
#include "support/random_circuit.h"
#include "support/zx_dense.h"
#include "zx/from_circuit.h"
#include "zx/simplify.h"
#include "zx/to_circuit.h"

using namespace whittle;
using namespace whittle::zx;

namespace {

size_t spiders(const Graph& g) {
    size_t n = 0;
    for (Vertex v = 0; v < g.id_bound(); ++v) n += g.alive(v) && !g.is_boundary(v);
    return n;
}

/// The dense reference numbers wires as bits of the index like zx_matrix does (wire w is bit w).
bool diagram_matches(const ir::Circuit& c, const Graph& g) {
    return test::proportional(test::zx_matrix(g), test::dense_unitary(c));
}

}  // namespace

TEST_CASE("CNOT is H on the target around CZ (Nielsen & Chuang ch. 4): two spiders and a Hadamard edge") {
    ir::Circuit c;
    c.add_register("q", 2, ir::Role::Data);
    c.ops.push_back(ir::Op::x(1, {ir::Lit::pos(0)}));
    Graph g;
    REQUIRE(!circuit_to_graph(c, g));
    CHECK(spiders(g) == 2);
    CHECK(g.num_edges() == 5);
    CHECK(diagram_matches(c, g));
}

TEST_CASE("the diagram of each supported op has the op's matrix up to a scalar") {
    using ir::Lit;
    using ir::Op;
    using ir::OpKind;
    const ir::Angle t = ir::Angle::pi_times(1, 4), odd = ir::Angle::pi_times(3, 7);
    const std::vector<Op> ops = {
        Op::x(0),
        Op::x(1, {Lit::neg(0)}),
        Op::x(2, {Lit::pos(0), Lit::neg(1)}),
        Op::phase(t, {Lit::pos(0)}),
        Op::phase(ir::Angle::pi_times(1), {Lit::pos(0), Lit::pos(2)}),
        Op::phase(odd, {Lit::neg(0), Lit::pos(1), Lit::pos(2)}),
        Op::parity(odd, {0, 1, 2}),
        Op::one(OpKind::H, 1),
        Op::one(OpKind::Y, 2),
        Op::one(OpKind::SX, 0),
        Op::one(OpKind::SXdg, 0),
        Op::one(OpKind::RX, 1, odd),
        Op::one(OpKind::RY, 1, odd),
        Op::one(OpKind::RZ, 1, odd),
        Op::one(OpKind::RZ, 1, odd, {Lit::pos(0), Lit::neg(2)}),
        Op::u(2, odd, t, ir::Angle::pi_times(5, 6)),
        Op::swap(0, 2),
        Op::swap(0, 2, {Lit::pos(1)}),
        Op::two(OpKind::ISwap, 0, 1),
        Op::two(OpKind::XX, 1, 2, odd),
    };
    std::vector<Op> all = ops;
    Op r = Op::one(OpKind::R, 1, odd);
    r.set_phi(ir::Angle::pi_times(2, 5));
    all.push_back(r);
    for (const Op& op : all) {
        ir::Circuit c;
        c.add_register("q", 3, ir::Role::Data);
        c.ops.push_back(op);
        Graph g;
        CAPTURE(ir::print_wq(c));
        REQUIRE(!circuit_to_graph(c, g));
        CHECK(diagram_matches(c, g));
    }
}

TEST_CASE("ops outside the diagram class are refused with the reason") {
    std::vector<Step> steps;
    CHECK(lower_op(ir::Op::measure(0, 0), 0, steps).value() == "a measure");
    CHECK(lower_op(ir::Op::one(ir::OpKind::H, 0, {}, {ir::Lit::pos(1)}), 0, steps).value() == "a controlled h");
    ir::Op conditioned = ir::Op::x(0);
    conditioned.set_condition(0, 1);
    CHECK(lower_op(conditioned, 0, steps).value() == "a classically conditioned op");
}

/// A random op of the diagram's class on three wires, angles from test::random_angle (exact
/// multiples of pi/4, pi/32, pi/3, tiny ones, and radians).
ir::Op random_op(std::mt19937_64& rng) {
    using ir::Lit;
    using ir::Op;
    using ir::OpKind;
    std::vector<uint32_t> w = {0, 1, 2};
    std::shuffle(w.begin(), w.end(), rng);
    const ir::Angle a = test::random_angle(rng, true), b = test::random_angle(rng, true);
    auto lit = [&](uint32_t x) { return Lit::make(x, rng() % 3 != 0); };
    switch (rng() % 12) {
    case 0: return Op::x(w[0], {lit(w[1])});
    case 1: return Op::x(w[0], {lit(w[1]), lit(w[2])});
    case 2: return Op::phase(a, {lit(w[0]), lit(w[1])});
    case 3: return Op::phase(a, {lit(w[0])});
    case 4: return Op::parity(a, {w[0], w[1]});
    case 5: return Op::one(OpKind::H, w[0]);
    case 6: return Op::one(OpKind::RZ, w[0], a, {lit(w[1])});
    case 7: return Op::one(rng() % 2 ? OpKind::RX : OpKind::RY, w[0], a);
    case 8: return Op::u(w[0], a, b, test::random_angle(rng, true));
    case 9: return Op::swap(w[0], w[1], rng() % 2 ? ir::LitVec{lit(w[2])} : ir::LitVec{});
    case 10: return Op::two(rng() % 2 ? OpKind::ISwap : OpKind::XX, w[0], w[1], a);
    default: return Op::one(rng() % 2 ? OpKind::SX : OpKind::Y, w[0]);
    }
}

TEST_CASE("random circuits: the diagram and its full reduction keep the circuit's matrix") {
    std::mt19937_64 rng(2207);
    int checked = 0;
    for (int round = 0; round < 300; ++round) {
        ir::Circuit c;
        c.add_register("q", 3, ir::Role::Data);
        const int len = 1 + int(rng() % 5);
        for (int k = 0; k < len; ++k) c.ops.push_back(random_op(rng));
        Graph g;
        CAPTURE(ir::print_wq(c));
        REQUIRE(!circuit_to_graph(c, g));
        if (spiders(g) > 14) continue;
        CHECK(diagram_matches(c, g));
        SimplifyStats st;
        CHECK(reduce_to_fixpoint(g, st));
        CHECK(diagram_matches(c, g));
        ++checked;
    }
    CHECK(checked >= 150);
}

TEST_CASE("circuit-shaped diagrams come back as circuits with the same matrix") {
    std::mt19937_64 rng(2003);
    using ir::Lit;
    using ir::Op;
    using ir::OpKind;
    int back = 0;
    for (int round = 0; round < 200; ++round) {
        ir::Circuit c;
        c.add_register("q", 3, ir::Role::Data);
        const int len = 1 + int(rng() % 12);
        for (int k = 0; k < len; ++k) {
            std::vector<uint32_t> w = {0, 1, 2};
            std::shuffle(w.begin(), w.end(), rng);
            const ir::Angle a = test::random_angle(rng, true);
            switch (rng() % 7) {
            case 0: c.ops.push_back(Op::x(w[0], {Lit::pos(w[1])})); break;
            case 1: c.ops.push_back(Op::one(OpKind::H, w[0])); break;
            case 2: c.ops.push_back(Op::phase(a, {Lit::pos(w[0])})); break;
            case 3: c.ops.push_back(Op::phase(ir::Angle::pi_times(1), {Lit::pos(w[0]), Lit::pos(w[1])})); break;
            case 4: c.ops.push_back(Op::one(OpKind::RX, w[0], a)); break;
            case 5: c.ops.push_back(Op::x(w[0])); break;
            default: c.ops.push_back(Op::one(OpKind::SX, w[0])); break;
            }
        }
        Graph g;
        REQUIRE(!circuit_to_graph(c, g));
        const std::optional<ir::Circuit> out = graph_to_circuit(g, c);
        CAPTURE(ir::print_wq(c));
        REQUIRE(out);
        CHECK(test::distance_up_to_phase(test::dense_unitary(*out), test::dense_unitary(c)) < 1e-9);
        ++back;
    }
    CHECK(back == 200);
}

TEST_CASE("a diagram with a phase gadget is not circuit-shaped") {
    ir::Circuit c;
    c.add_register("q", 2, ir::Role::Data);
    c.ops.push_back(ir::Op::parity(ir::Angle::pi_times(1, 4), {0, 1}));
    Graph g;
    REQUIRE(!circuit_to_graph(c, g));
    CHECK(!graph_to_circuit(g, c));
}
