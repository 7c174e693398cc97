// fold-phases: phase folding identities (Amy, Maslov, Mosca 2014, arXiv:1303.2042) and random circuits.
#include <doctest/doctest.h>

#include "ir/printer.h"
#include "passes/fold_phases.h"
#include "passes/normalize.h"
#include "passes/phase_folding.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Op t(uint32_t w, int eighths = 1) { return Op::phase(Angle::pi_times(eighths, 4), {Lit::pos(w)}); }
Op cx(uint32_t c, uint32_t t) { return Op::x(t, {Lit::pos(c)}); }

Circuit run(Circuit c, bool expect_change = true) {
    Circuit before = c;
    passes::PassResult r = passes::fold_phases(c, {});
    CHECK(r.changed == expect_change);
    verify(c);
    CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-9);
    return c;
}

/// Non-Clifford terms: phases and parities whose angle is not a multiple of pi/2, weighted as their
/// parity expansion (a k-literal product costs 2^k - 1 when angle/2^{k-1} is not a multiple of pi/2).
int64_t non_clifford_terms(const Circuit& c) {
    int64_t n = 0;
    for (const Op& op : c.ops) {
        if (op.kind == OpKind::Parity && !op.angle.is_multiple_of_pi_over(2)) ++n;
        if (op.kind == OpKind::Phase) {
            const size_t k = op.controls.size();
            if (!op.angle.divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(2)) n += (int64_t(1) << k) - 1;
        }
    }
    return n;
}

}  // namespace

TEST_CASE("terms on equal parities merge across CNOTs where cancel cannot reach (AMM 2014 sec. 4 idea)") {
    // T b; CX(a,b): b = a^b; T b; CX(b,a): a = b; T a  -> the first and last T act on x_b: S at the first.
    Circuit c = wires(2);
    c.ops = {t(1), cx(0, 1), t(1), cx(1, 0), t(0)};
    c = run(c);
    REQUIRE(c.ops.size() == 4);
    CHECK(c.ops[0].angle == Angle::pi_times(1, 2));
    CHECK(count_resources(c).t_count == 1);
}

TEST_CASE("an X makes the negated polynomial: T a; X a; T a = e^{i pi/4} X a (up to placement)") {
    Circuit c = wires(1);
    c.ops = {t(0), Op::x(0), t(0)};
    c = run(c);
    CHECK(count_resources(c).t_count == 0);
}

TEST_CASE("a Hadamard introduces a path variable: T H T does not merge") {
    Circuit c = wires(1);
    c.ops = {t(0), Op::one(OpKind::H, 0), t(0)};
    run(c, false);
}

TEST_CASE("AND terms: CS = e^{i pi/2 ab} expands into T a, T b, T-dagger on a^b and cancels its inverse parities") {
    // The phase-polynomial identity ab = (a + b - (a ^ b)) / 2 (standard; AMM 2014).
    Circuit c = wires(2);
    c.ops = {Op::phase(Angle::pi_times(1, 2), {Lit::pos(0), Lit::pos(1)}), t(0, -1), t(1, -1),
             Op::parity(Angle::pi_times(1, 4), {0, 1})};
    c = run(c);
    CHECK(c.ops.empty());
}

TEST_CASE("two CCZs sharing two controls: the shared parities become Clifford (14 -> 8 non-Clifford terms)") {
    Circuit c = wires(4);
    c.ops = {Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1), Lit::pos(2)}),
             Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1), Lit::pos(3)})};
    CHECK(non_clifford_terms(c) == 14);
    c = run(c);
    CHECK(non_clifford_terms(c) == 8);
}

TEST_CASE("products on equal polynomials merge without expansion: CCZ . Toffoli-free middle . CCZ vanishes") {
    Circuit c = wires(4);
    Op ccz = Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1), Lit::pos(2)});
    c.ops = {ccz, cx(0, 3), Op::one(OpKind::H, 3), cx(2, 1), cx(2, 1), ccz};
    c = run(c);
    for (const Op& op : c.ops) CHECK(op.kind != OpKind::Phase);
}

TEST_CASE("negative literals: Phase(t; a & !b) and Phase(t; a & b) are folded as polynomials (a b ^ a and a b)") {
    Circuit c = wires(2);
    c.ops = {Op::phase(Angle::pi_times(1, 4), {Lit::pos(0), Lit::neg(1)}), Op::x(1),
             Op::phase(Angle::pi_times(-1, 4), {Lit::pos(0), Lit::pos(1)})};
    c = run(c);  // after X b the second term is a & !b_in: the same polynomial, opposite angle
    CHECK(c.ops.size() == 1);
}

/// fold_phase_terms with a given polynomial size cap; checks the state vector as `run` does.
bool fold_with_cap(Circuit& c, size_t max_terms) {
    Circuit before = c;
    passes::FoldSettings s;
    s.max_terms = max_terms;
    passes::PassResult r;
    const bool changed = passes::fold_phase_terms(c, s, r);
    verify(c);
    CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-9);
    return changed;
}

TEST_CASE("the size cap: a wire value over max_terms monomials becomes a fresh variable, and its terms stop merging") {
    // T q2; q2 ^= q0; q2 ^= q1 (x0 ^ x1 ^ x2: 3 monomials); q2 ^= q1; q2 ^= q0; T-dagger q2. Uncapped the
    // value is back to x2 and the two terms cancel; under a cap of 2 the value was replaced by a fresh
    // variable on the way, so the second term is on another polynomial and nothing merges.
    Circuit c = wires(3);
    c.ops = {t(2), cx(0, 2), cx(1, 2), cx(1, 2), cx(0, 2), t(2, -1)};
    Circuit capped = c;
    CHECK_FALSE(fold_with_cap(capped, 2));
    CHECK(capped.ops.size() == c.ops.size());
    CHECK(fold_with_cap(c, 64));
    CHECK(count_resources(c).t_count == 0);
}

TEST_CASE("the size cap on products: a product over max_terms monomials is not a term") {
    // (x0 ^ x2)(x1 ^ x3) has 4 monomials: under a cap of 2 the two CS on it are not terms; uncapped they
    // merge into one CZ.
    Circuit c = wires(4);
    const Op cs = Op::phase(Angle::pi_times(1, 2), {Lit::pos(0), Lit::pos(1)});
    c.ops = {cx(2, 0), cx(3, 1), cs, Op::one(OpKind::H, 2), cs};
    Circuit capped = c;
    CHECK_FALSE(fold_with_cap(capped, 2));
    CHECK(fold_with_cap(c, 64));
    REQUIRE(c.ops.size() == 4);
    CHECK(c.ops[2].angle == Angle::pi_times(1));
}

TEST_CASE("fold-phases on random circuits (state vector, global phase included)") {
    CHECK(check_pass_on_random(passes::fold_phases, 300, 51) > 50);
}

TEST_CASE("fold-phases on longer random circuits: many terms, their keys interned in several batches") {
    std::mt19937_64 rng(54);
    RandomSpec spec;
    spec.min_ops = 150;
    spec.max_ops = 300;
    for (int i = 0; i < 40; ++i) {
        Circuit c = random_circuit(rng, spec);
        passes::normalize(c, {});
        Circuit before = c;
        passes::fold_phases(c, {});
        verify(c);
        CHECK((circuit_unitary(before) - circuit_unitary(c)).norm() < 1e-9);
    }
}

TEST_CASE("fold-phases never raises the non-Clifford term count; random Clifford+T never get more T; idempotent") {
    std::mt19937_64 rng(52);
    RandomSpec ct;
    ct.clifford_t_only = true;
    for (int i = 0; i < 300; ++i) {
        Circuit c = random_circuit(rng, i % 2 ? ct : RandomSpec{});
        passes::normalize(c, {});
        const int64_t before = non_clifford_terms(c);
        const uint64_t t_before = count_resources(c).t_count;
        passes::fold_phases(c, {});
        CHECK(non_clifford_terms(c) <= before);
        if (i % 2) CHECK(count_resources(c).t_count <= t_before);
        Circuit again = c;
        CHECK_FALSE(passes::fold_phases(again, {}).changed);
    }
}

TEST_CASE("the engine stops its rounds early only when another round would change nothing") {
    // Reference: rounds run one at a time, each reading the circuit again, until one changes nothing
    // (at most 4, as fold-phases). The engine's prediction of the next round must give the same circuit.
    std::mt19937_64 rng(53);
    int several_rounds = 0;
    for (int i = 0; i < 400; ++i) {
        Circuit c = random_circuit(rng);
        passes::normalize(c, {});
        Circuit reference = c;
        passes::FoldSettings one;
        one.expand_products = true;
        int rounds = 0;
        for (passes::PassResult r; rounds < 4 && passes::fold_phase_terms(reference, one, r);) ++rounds;
        several_rounds += rounds >= 2;
        passes::fold_phases(c, {});
        CHECK(print_wq(c) == print_wq(reference));
        CHECK(c.global_phase == reference.global_phase);
    }
    CHECK(several_rounds > 0);
}

TEST_CASE("the census of term keys (taken on large circuits) changes nothing: the same ops with and without it") {
    // Two readings of the engine: every key interned, or lone keys (proved by the census) left out.
    // Small random circuits give small mark bitmaps, so unequal keys that share a mark occur too.
    std::mt19937_64 rng(55);
    RandomSpec spec;
    spec.min_ops = 20;
    spec.max_ops = 200;
    int merged = 0;
    for (int i = 0; i < 300; ++i) {
        Circuit c = random_circuit(rng, spec);
        passes::normalize(c, {});
        for (const bool expand : {false, true}) {
            passes::FoldSettings with, without;
            with.expand_products = without.expand_products = expand;
            with.rounds = without.rounds = expand ? 4 : 1;
            with.census_from_ops = 0;
            without.census_from_ops = SIZE_MAX;
            Circuit a = c, b = c;
            passes::PassResult ra, rb;
            const bool changed = passes::fold_phase_terms(a, with, ra);
            CHECK(changed == passes::fold_phase_terms(b, without, rb));
            CHECK(print_wq(a) == print_wq(b));
            CHECK(a.global_phase.identical(b.global_phase));
            CHECK(ra.stats == rb.stats);
            merged += changed;
        }
    }
    CHECK(merged > 50);
}

TEST_CASE("two phases on one 70-literal product merge") {
    // e^{ia P} e^{ib P} = e^{i(a+b) P} for one Boolean product P (phase polynomial identity; Amy,
    // Maslov, Mosca 2014, arXiv:1303.2042). Too wide for a dense check: the merged angle is compared.
    Circuit c = wires(70);
    ir::LitVec all;
    for (uint32_t w = 0; w < 70; ++w) all.push_back(Lit::pos(w));
    c.ops = {Op::phase(Angle::pi_times(1, 4), all), Op::phase(Angle::pi_times(1, 8), all)};
    passes::PassResult r = passes::fold_phases(c, {});
    CHECK(r.changed);
    verify(c);
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].controls.size() == 70);
    CHECK(c.ops[0].angle == Angle::pi_times(3, 8));
}
