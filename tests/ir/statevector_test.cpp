// The reference simulator against textbook identities (Nielsen & Chuang ch. 4; common practice).
#include <doctest/doctest.h>

#include "ir/classical_sim.h"
#include "ir/statevector.h"

using namespace whittle::ir;

namespace {

Circuit wires(uint32_t n) {
    Circuit c;
    c.add_register("q", n, Role::Data);
    return c;
}

Op t(uint32_t w, bool dagger = false) { return Op::phase(Angle::pi_times(dagger ? -1 : 1, 4), {Lit::pos(w)}); }
Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }

}  // namespace

TEST_CASE("H X H = Z (Nielsen & Chuang ch. 4, practice)") {
    Circuit a = wires(1), b = wires(1);
    a.ops = {Op::one(OpKind::H, 0), Op::x(0), Op::one(OpKind::H, 0)};
    b.ops = {Op::phase(Angle::pi_times(1), {Lit::pos(0)})};
    CHECK(distance_up_to_phase(circuit_unitary(a), circuit_unitary(b)) < 1e-12);
}

TEST_CASE("CNOT twice is the identity; SWAP is three CNOTs (practice)") {
    Circuit a = wires(2), id = wires(2), s = wires(2);
    a.ops = {cx(0, 1), cx(0, 1)};
    CHECK(distance_up_to_phase(circuit_unitary(a), circuit_unitary(id)) < 1e-12);
    a.ops = {cx(0, 1), cx(1, 0), cx(0, 1)};
    s.ops = {Op::swap(0, 1)};
    CHECK(distance_up_to_phase(circuit_unitary(a), circuit_unitary(s)) < 1e-12);
}

TEST_CASE("Toffoli equals its 7-T circuit (Nielsen & Chuang Fig. 4.9); one T flipped breaks it") {
    Circuit tof = wires(3), ct = wires(3);
    tof.ops = {Op::x(2, {Lit::pos(0), Lit::pos(1)})};
    auto h = [](uint32_t w) { return Op::one(OpKind::H, w); };
    ct.ops = {h(2),     cx(1, 2), t(2, true), cx(0, 2), t(2),     cx(1, 2), t(2, true), cx(0, 2),
              t(1),     t(2),     h(2),       cx(0, 1), t(0),     t(1, true), cx(0, 1)};
    CHECK(distance_up_to_phase(circuit_unitary(tof), circuit_unitary(ct)) < 1e-12);
    Circuit broken = ct;
    broken.ops[9] = t(2, true);
    CHECK(distance_up_to_phase(circuit_unitary(tof), circuit_unitary(broken)) > 0.1);
}

TEST_CASE("bit-parallel simulation of a Toffoli and negative controls") {
    Circuit c = wires(3);
    c.ops = {Op::x(2, {Lit::pos(0), Lit::neg(1)})};
    for (uint64_t in = 0; in < 8; ++in) {
        uint64_t expect = in ^ ((((in & 1) && !(in & 2)) ? 1 : 0) << 2);
        CHECK(simulate_basis(c, in) == expect);
    }
}

TEST_CASE("measure and feed-forward: measured erase of a clean AND (Gidney 2018, arXiv:1709.06648)") {
    // w = a & b computed by a Toffoli; erase: H w, measure w, if 1 then CZ(a, b). w returns to |0>
    // and the data state is untouched on every branch.
    Circuit c = wires(3);
    c.add_creg("m", 1, true);
    c.ops = {Op::one(OpKind::H, 0), Op::one(OpKind::H, 1), Op::x(2, {Lit::pos(0), Lit::pos(1)}),
             Op::one(OpKind::H, 2), Op::measure(2, 0)};
    Op fix = Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1)});
    fix.set_condition(0, 1);
    c.ops.push_back(fix);
    Op fixw = Op::x(2);
    fixw.set_condition(0, 1);
    c.ops.push_back(fixw);
    for (uint64_t seed = 0; seed < 8; ++seed) {
        std::mt19937_64 rng(seed);
        std::vector<uint8_t> bits(1, 0);
        StateVector s(3);
        s.run(c, bits, rng);
        for (int i = 0; i < 4; ++i) CHECK(std::abs(s.amplitudes()(i) - Complex(0.5, 0)) < 1e-12);
    }
}
