// Oracles: ESOP-minimized `t ^= EXPR` / `phase(pi) EXPR` against direct evaluation, and Grover diffusion.
#include "stdlib_harness.h"

#include <complex>
#include <functional>

#include "frontend/boolean_expr.h"
#include "frontend/esop_minimize.h"
#include "ir/statevector.h"

using namespace stdlib_test;

namespace {

// A random Boolean expression over wires x[0..k-1], as .wq text and as an evaluator (independent
// of the compiler: C++ operators on the input bits).
struct RandomExpr {
    std::string text;
    std::function<bool(uint64_t)> eval;
    std::function<uint32_t(whittle::frontend::BoolExpr&)> build;  // the same tree as the elaborator's input
};
using whittle::frontend::BoolExpr;
using whittle::frontend::BoolNode;

RandomExpr random_expr(std::mt19937_64& rng, unsigned k, int depth) {
    if (depth == 0 || rng() % 4 == 0) {
        unsigned v = unsigned(rng() % k);
        bool neg = rng() % 3 == 0;
        return {std::string(neg ? "!" : "") + "x[" + std::to_string(v) + "]",
                [v, neg](uint64_t x) { return bool((x >> v) & 1) != neg; },
                [v, neg](BoolExpr& e) {
                    uint32_t n = e.var(v);
                    return neg ? e.op(BoolNode::Not, n) : n;
                }};
    }
    RandomExpr a = random_expr(rng, k, depth - 1), b = random_expr(rng, k, depth - 1);
    auto build = [a, b](BoolNode::Kind kind) {
        return [a, b, kind](BoolExpr& e) {
            uint32_t l = a.build(e), r = b.build(e);
            return e.op(kind, l, r);
        };
    };
    switch (rng() % 3) {
    case 0: return {"(" + a.text + " & " + b.text + ")", [a, b](uint64_t x) { return a.eval(x) && b.eval(x); }, build(BoolNode::And)};
    case 1: return {"(" + a.text + " ^ " + b.text + ")", [a, b](uint64_t x) { return a.eval(x) != b.eval(x); }, build(BoolNode::Xor)};
    default: return {"(" + a.text + " | " + b.text + ")", [a, b](uint64_t x) { return a.eval(x) || b.eval(x); }, build(BoolNode::Or)};
    }
}

bool cubes_value(const std::vector<whittle::ir::LitVec>& cubes, uint64_t x) {
    bool v = false;
    for (const auto& cube : cubes) {
        bool term = true;
        for (auto l : cube) term = term && (bool((x >> l.wire()) & 1) == l.positive());
        v ^= term;
    }
    return v;
}

uint64_t toffoli_cost(const std::vector<whittle::ir::LitVec>& cubes) {
    uint64_t sum = 0;
    for (const auto& cube : cubes) sum += cube.size() >= 2 ? 2 * cube.size() - 3 : 0;
    return sum;
}

}  // namespace

TEST_CASE("oracles: minimized and unminimized ESOP expansions agree on every input") {
    std::mt19937_64 rng(3);
    for (int trial = 0; trial < 200; ++trial) {
        unsigned k = 2 + unsigned(rng() % 7);
        RandomExpr re = random_expr(rng, k, 4);
        std::string program = "qubit x[" + std::to_string(k) + "], t\nt ^= " + re.text + "\n";
        INFO(program);
        whittle::ir::Circuit c = load(program);
        std::vector<Values> inputs = all_inputs({{"x", k}, {"t", 1}});
        std::vector<Values> outputs = run(c, inputs);
        for (size_t i = 0; i < inputs.size(); ++i) {
            uint64_t x = uint64_t(inputs[i].at("x"));
            REQUIRE(outputs[i].at("t") == (inputs[i].at("t") ^ u128(re.eval(x))));
        }
        // the unminimized exact expansion (the elaborator's ESOP of the same tree, wires 0..k-1 =
        // x[0..k-1]) against the minimized one: both equal the expression on every input
        BoolExpr e;
        e.root = re.build(e);
        std::vector<whittle::ir::LitVec> exact = whittle::frontend::esop(e, 1u << 20, {});
        std::vector<whittle::ir::LitVec> minimized = whittle::frontend::minimize_esop(exact);
        CHECK(toffoli_cost(minimized) <= toffoli_cost(exact));
        for (uint64_t x = 0; x < (uint64_t(1) << k); ++x) {
            REQUIRE(cubes_value(exact, x) == re.eval(x));
            REQUIRE(cubes_value(minimized, x) == re.eval(x));
        }
        // the circuit emits the minimized cubes (one op each, x[i] is wire i)
        std::vector<whittle::ir::LitVec> emitted;
        for (const auto& op : c.ops) emitted.push_back(op.controls);
        CHECK(toffoli_cost(emitted) <= toffoli_cost(exact));
    }
}

TEST_CASE("oracles: the minimizer shrinks the expansion of the berth comparator's expression") {
    // d > 10 for a 4-bit d: d3 & d2 | d3 & d1 & d0. The exact ESOP of the OR is three cubes
    // (a | b = a ^ b ^ a&b); the function is not a single cube, so two cubes is the minimum.
    whittle::ir::Circuit c = load("qubit d[4], f\nf ^= d[3] & d[2] | d[3] & d[1] & d[0]\n");
    CHECK(c.ops.size() == 2);
    std::vector<Values> inputs = all_inputs({{"d", 4}, {"f", 1}});
    std::vector<Values> outputs = run(c, inputs);
    for (size_t i = 0; i < inputs.size(); ++i)
        CHECK(outputs[i].at("f") == (inputs[i].at("f") ^ u128(inputs[i].at("d") > 10)));
}

TEST_CASE("oracles: phase(pi) EXPR is e^{i pi f(x)} on every basis state") {
    std::mt19937_64 rng(9);
    for (int trial = 0; trial < 40; ++trial) {
        unsigned k = 2 + unsigned(rng() % 5);
        RandomExpr re = random_expr(rng, k, 3);
        std::string program = "qubit x[" + std::to_string(k) + "]\nphase(pi) " + re.text + "\n";
        INFO(program);
        whittle::ir::Circuit c = load(program);
        for (uint64_t x = 0; x < (uint64_t(1) << k); ++x) {
            whittle::ir::StateVector sv(c.num_qubits());
            sv.amplitudes().setZero();
            sv.amplitudes()[Eigen::Index(x)] = 1.0;
            sv.run(c);
            std::complex<double> want = re.eval(x) ? -1.0 : 1.0;
            REQUIRE(std::abs(sv.amplitudes()[Eigen::Index(x)] - want) < 1e-9);
        }
    }
}

TEST_CASE("oracles: diffuse(r) is 2|s><s| - I, and its controlled version") {
    // Grover 1996 (quant-ph/9605043): the inversion about the mean D = 2|s><s| - I, |s> uniform;
    // the matrix is built here with Eigen, independently of the compiler.
    for (unsigned n : {1u, 2u, 3u, 4u}) {
        CAPTURE(n);
        whittle::ir::Circuit c = load("use \"arith\"\nqubit r[" + std::to_string(n) + "]\ndiffuse(r)\n");
        Eigen::Index dim = Eigen::Index(1) << n;
        Eigen::MatrixXcd d = Eigen::MatrixXcd::Constant(dim, dim, 2.0 / double(dim)) - Eigen::MatrixXcd::Identity(dim, dim);
        Eigen::MatrixXcd u = whittle::ir::circuit_unitary(c);
        CHECK((u - d).norm() < 1e-9);  // exactly, global phase included

        whittle::ir::Circuit cc = load("use \"arith\"\nqubit r[" + std::to_string(n) + "], ctl\nwhen ctl { diffuse(r) }\n");
        Eigen::MatrixXcd cd = Eigen::MatrixXcd::Identity(2 * dim, 2 * dim);
        cd.bottomRightCorner(dim, dim) = d;  // ctl is the highest wire
        CHECK((whittle::ir::circuit_unitary(cc) - cd).norm() < 1e-9);
    }
}
