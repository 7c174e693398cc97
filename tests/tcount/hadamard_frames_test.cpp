// The frame exchange of CNOT stretches between Hadamards: textbook identities, the GF(2^n) multipliers, random circuits.
#include <doctest/doctest.h>

#include <random>

#include "ir/resources.h"
#include "passes/pipeline.h"
#include "support/dense_unitary.h"
#include "support/families.h"
#include "support/tcount_helpers.h"
#include "passes/pass_check.h"
#include "tcount/hadamard_frames.h"
#include "verify/equivalence.h"

using namespace whittle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

using test::cx;
using test::h;
using test::same_matrix;

ir::Circuit lowered(const ir::Circuit& in) { return test::lowered_before_reduce_t(in, 2); }

Op t(uint32_t w) { return Op::phase(ir::Angle::pi_times(1, 4), {Lit::pos(w)}); }

size_t count_h(const ir::Circuit& c) {
    size_t n = 0;
    for (const Op& op : c.ops) n += op.kind == OpKind::H;
    return n;
}



}  // namespace

TEST_CASE("(H x H) CNOT(a, b) (H x H) = CNOT(b, a): the H pairs around a CNOT between T gates go") {
    // Textbook identity (Nielsen & Chuang ch. 4; practice).
    ir::Circuit c = test::wires(2);
    c.ops = {t(0), t(1), h(0), h(1), cx(0, 1), h(0), h(1), t(0), t(1)};
    const ir::Circuit before = c;
    CHECK(tcount::exchange_hadamard_frames(c) == 4);
    CHECK(count_h(c) == 0);
    CHECK(same_matrix(before, c));
    bool reversed = false;
    for (const Op& op : c.ops) reversed |= op.kind == OpKind::X && op.target == 0 && op.controls[0].wire() == 1;
    CHECK(reversed);
}

TEST_CASE("X and Z change places inside an exchanged stretch; a stretch with a T stays") {
    ir::Circuit c = test::wires(2);
    c.ops = {t(0), h(0), h(1), cx(0, 1), Op::x(0), Op::phase(ir::Angle::pi_times(1), {Lit::pos(1)}), h(0), h(1), t(1)};
    const ir::Circuit before = c;
    CHECK(tcount::exchange_hadamard_frames(c) == 4);
    CHECK(same_matrix(before, c));
    ir::Circuit keep = test::wires(2);
    keep.ops = {h(0), h(1), cx(0, 1), t(1), h(0), h(1)};
    const ir::Circuit keep_before = keep;
    CHECK(tcount::exchange_hadamard_frames(keep) == 0);
    CHECK(keep.ops.size() == keep_before.ops.size());
}

TEST_CASE("a stretch that reaches the circuit's start moves its H there; nothing changes when that gains nothing") {
    // CNOT(0,1) then H on both: flipping would only move the two Hs to the start.
    ir::Circuit c = test::wires(2);
    c.ops = {cx(0, 1), h(0), h(1), t(0)};
    CHECK(tcount::exchange_hadamard_frames(c) == 0);
    CHECK(c.ops.size() == 4);
}

TEST_CASE("lowered GF(2^n) multipliers: the product wires keep one H at each end, the rest goes") {
    // After lowering, each product wire is in the H frame during its Toffolis and takes the
    // reduction CNOTs in between; all those stretches change frame.
    for (auto [n, p] : {std::pair<uint32_t, uint32_t>{4, 0x13}, {5, 0x25}, {6, 0x43}}) {
        ir::Circuit c = lowered(test::gf2_multiplier(n, p).circuit);
        const ir::Circuit before = c;
        CHECK(tcount::exchange_hadamard_frames(c) > 0);
        INFO("n=" << n);
        // No H between two non-H ops on one wire: every remaining H is first or last on its wire.
        std::vector<int> first(c.num_qubits(), -1), last(c.num_qubits(), -1);
        for (size_t i = 0; i < c.ops.size(); ++i)
            for (uint32_t w : c.ops[i].wires()) {
                if (first[w] < 0) first[w] = int(i);
                last[w] = int(i);
            }
        for (size_t i = 0; i < c.ops.size(); ++i)
            if (c.ops[i].kind == OpKind::H) CHECK((first[c.ops[i].target] == int(i) || last[c.ops[i].target] == int(i)));
        CHECK(passes::check_equivalence(before, c).verdict == passes::Verdict::Equivalent);
    }
}

TEST_CASE("random Clifford+T circuits: the exchange keeps the matrix, global phase included") {
    std::mt19937_64 rng(31);
    test::RandomSpec spec;
    spec.clifford_t_only = true;
    spec.max_qubits = 6;
    spec.max_ops = 80;
    int changed = 0;
    for (int i = 0; i < 400; ++i) {
        ir::Circuit c = test::random_circuit(rng, spec);
        // More H pairs around CNOTs than the uniform draw gives.
        if (i % 2 == 0)
            for (size_t k = 0; k + 1 < c.ops.size(); k += 7)
                if (c.ops[k].kind == OpKind::X && c.ops[k].controls.size() == 1) {
                    const uint32_t a = c.ops[k].controls[0].wire(), b = c.ops[k].target;
                    c.ops.insert(c.ops.begin() + std::ptrdiff_t(k + 1), {h(a), h(b)});
                    c.ops.insert(c.ops.begin() + std::ptrdiff_t(k), {h(a), h(b)});
                    k += 4;
                }
        const ir::Circuit before = c;
        const size_t removed = tcount::exchange_hadamard_frames(c);
        changed += removed > 0;
        CHECK(count_h(before) == count_h(c) + removed);
        INFO("circuit " << i);
        CHECK(same_matrix(before, c));
    }
    CHECK(changed > 50);
}
