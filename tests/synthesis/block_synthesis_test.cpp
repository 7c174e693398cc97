// Block synthesis of three-qubit unitaries: entangler counts against published lower bounds, every
// result checked against its target with the tests' own dense matrices (tests/support/dense_unitary.h).
#include <doctest/doctest.h>

#include <random>

#include "ir/printer.h"
#include "support/dense_unitary.h"
#include "synthesis/block_synthesis.h"

using namespace whittle;

namespace {

/// The Toffoli gate with controls on wires 2 and 1 and target wire 0 (wire w = bit w): it swaps
/// |110> and |111> (textbook definition, common practice).
Eigen::MatrixXcd toffoli() {
    Eigen::MatrixXcd m = Eigen::MatrixXcd::Identity(8, 8);
    m(6, 6) = m(7, 7) = 0;
    m(6, 7) = m(7, 6) = 1;
    return m;
}

/// A Haar-like random unitary: Q of the QR decomposition of a complex Gaussian matrix (common practice).
Eigen::MatrixXcd random_unitary(int n, uint64_t seed) {
    std::mt19937_64 rng(seed);
    std::normal_distribution<double> g;
    Eigen::MatrixXcd a(n, n);
    for (int i = 0; i < n; ++i)
        for (int j = 0; j < n; ++j) a(i, j) = std::complex<double>(g(rng), g(rng));
    Eigen::HouseholderQR<Eigen::MatrixXcd> qr(a);
    return qr.householderQ();
}

/// The synthesized circuit on wires 2, 1, 0 as a three-wire circuit with its phase.
ir::Circuit as_circuit(const lowering::BlockSynthesis& s) {
    ir::Circuit c;
    c.add_register("q", 3, ir::Role::Data);
    c.ops = s.ops;
    c.global_phase = s.phase;
    return c;
}

/// ||a - b||_F after lining up the global phase from tr(b^dagger a) (the tests' own computation).
double frobenius_up_to_phase(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b) {
    const std::complex<double> t = (b.adjoint() * a).trace();
    return (a - (t / std::abs(t)) * b).norm();
}

size_t count_entanglers(const std::vector<ir::Op>& ops) {
    size_t n = 0;
    for (const ir::Op& op : ops) n += op.wires().size() == 2;
    return n;
}

const std::vector<uint32_t> kWires = {2, 1, 0};

void check_result(const lowering::BlockSynthesis& s, const Eigen::MatrixXcd& u, double bound) {
    REQUIRE(s.found);
    const Eigen::MatrixXcd v = test::dense_unitary(as_circuit(s));
    // The reported distance bounds the true one (both include the returned phase).
    CHECK((v - u).norm() <= bound);
    CHECK((v - u).norm() <= s.distance + 1e-12);
    CHECK(frobenius_up_to_phase(v, u) <= bound);
    CHECK(count_entanglers(s.ops) == size_t(s.entanglers));
}

}  // namespace

TEST_CASE("block synthesis: Toffoli in 6 CNOT and in 6 CZ") {
    // Lower bound 6 two-qubit CNOTs for the Toffoli gate: Shende, Markov 2009, arXiv:0803.2316.
    for (ir::Entangler e : {ir::Entangler::CX, ir::Entangler::CZ}) {
        lowering::BlockSynthesisOptions o;
        o.max_entanglers = 8;
        const auto s = lowering::synthesize_block(toffoli(), kWires, e,
                                                  e == ir::Entangler::CX ? lowering::OneQubitBasis::ZSX
                                                                         : lowering::OneQubitBasis::ZXZ,
                                                  o);
        check_result(s, toffoli(), 1e-8);
        CHECK(s.entanglers == 6);
        MESSAGE("toffoli ", int(e), ": ", s.entanglers, " entanglers, ", s.iterations, " steps, ", s.instantiations,
                " instantiations, snapped ", s.snapped, "/", s.angles);
    }
}

TEST_CASE("block synthesis: Toffoli in 5 XX of free angle") {
    // Lower bound 5 two-qubit gates for the Toffoli gate: Yu, Duan, Ying 2013, arXiv:1301.3372.
    lowering::BlockSynthesisOptions o;
    o.max_entanglers = 6;
    const auto s = lowering::synthesize_block(toffoli(), kWires, ir::Entangler::XX, lowering::OneQubitBasis::RRz, o);
    check_result(s, toffoli(), 1e-8);
    CHECK(s.entanglers == 5);
    MESSAGE("toffoli xx: ", s.entanglers, " entanglers, ", s.iterations, " steps, snapped ", s.snapped, "/", s.angles);
}

TEST_CASE("block synthesis: Toffoli with iSWAP (count reported)") {
    lowering::BlockSynthesisOptions o;
    o.max_entanglers = 9;
    const auto s = lowering::synthesize_block(toffoli(), kWires, ir::Entangler::ISwap, lowering::OneQubitBasis::ZXZ, o);
    check_result(s, toffoli(), 1e-8);
    MESSAGE("toffoli iswap: ", s.entanglers, " entanglers, ", s.iterations, " steps");
}

TEST_CASE("block synthesis: a two-qubit unitary needs at most 3 CNOTs") {
    // Three CNOTs realize every two-qubit unitary (Vatan, Williams 2004, quant-ph/0308006).
    const Eigen::MatrixXcd u = random_unitary(4, 7);
    const auto s = lowering::synthesize_block(u, {1, 0}, ir::Entangler::CX, lowering::OneQubitBasis::ZSX, {});
    REQUIRE(s.found);
    CHECK(s.entanglers == 3);
    ir::Circuit c;
    c.add_register("q", 2, ir::Role::Data);
    c.ops = s.ops;
    c.global_phase = s.phase;
    CHECK((test::dense_unitary(c) - u).norm() <= 1e-8);
}

TEST_CASE("block synthesis: the same input gives the same circuit") {
    lowering::BlockSynthesisOptions o;
    o.max_entanglers = 8;
    const auto a = lowering::synthesize_block(toffoli(), kWires, ir::Entangler::CX, lowering::OneQubitBasis::ZSX, o);
    const auto b = lowering::synthesize_block(toffoli(), kWires, ir::Entangler::CX, lowering::OneQubitBasis::ZSX, o);
    REQUIRE(a.ops.size() == b.ops.size());
    CHECK(a.iterations == b.iterations);
    for (size_t i = 0; i < a.ops.size(); ++i) CHECK(ir::print_op(as_circuit(a), a.ops[i]) == ir::print_op(as_circuit(b), b.ops[i]));
}

TEST_CASE("block synthesis: a counted budget ends the search") {
    lowering::BlockSynthesisOptions o;
    o.budget = 50;
    const auto s = lowering::synthesize_block(toffoli(), kWires, ir::Entangler::CX, lowering::OneQubitBasis::ZSX, o);
    CHECK_FALSE(s.found);
    CHECK(s.iterations <= 50);
}

TEST_CASE("block synthesis: random three-qubit unitaries in at most 14 CNOTs") {
    // Lower bound ceil((4^3 - 3*3 - 1)/4) = 14 CNOTs for almost every three-qubit unitary:
    // Shende, Markov, Bullock 2004, quant-ph/0308033.
    for (uint64_t seed : {11u, 12u}) {
        const Eigen::MatrixXcd u = random_unitary(8, seed);
        lowering::BlockSynthesisOptions o;
        o.beam = 1;  // generic placement lists all reach a generic unitary; the first good one suffices
        o.restarts = 2;
        o.snap = false;
        const auto s = lowering::synthesize_block(u, kWires, ir::Entangler::CX, lowering::OneQubitBasis::ZSX, o);
        check_result(s, u, 1e-8);
        CHECK(s.entanglers <= 14);
        MESSAGE("random seed ", seed, ": ", s.entanglers, " CNOTs, ", s.iterations, " steps");
    }
}
