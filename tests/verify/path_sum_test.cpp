// Path sums and their algebra (ANF, multilinear phase polynomials) against hand-derived identities.
#include <doctest/doctest.h>

#include "verify/anf.h"
#include "verify/path_sum.h"
#include "verify/phase_poly.h"
#include "support/textbook_circuits.h"

using namespace whittle;
using namespace whittle::passes;
using ir::Angle;

TEST_CASE("ANF arithmetic: (a^b)(a^c) = a ^ ab ^ ac ^ bc (Boolean algebra, practice)") {
    const Anf a = Anf::var(0), b = Anf::var(1), c = Anf::var(2);
    const Anf p = (a ^ b) & (a ^ c);
    CHECK(p == Anf::from_terms({{0}, {0, 1}, {0, 2}, {1, 2}}));
    CHECK(((a ^ b) ^ (a ^ b)).is_zero());
    CHECK((a & a) == a);
    CHECK(a.negated().negated() == a);
    CHECK(p.substitute(0, b).is_zero());  // a := b: (b^b)(b^c) = 0
    CHECK(p.substitute(0, Anf::one()) == Anf::from_terms({{}, {1}, {2}, {1, 2}}));  // (1^b)(1^c)
    CHECK((a ^ b ^ Anf::var(7)).is_linear_in(7));
    CHECK_FALSE(p.is_linear_in(0));
    CHECK(p.minimal_monomial().size() == 1);
}

TEST_CASE("0/1 forms of XORs: [a^b] = a + b - 2ab, [a^b^c] adds +4abc (practice)") {
    const Anf a = Anf::var(0), b = Anf::var(1), c = Anf::var(2);
    auto terms = indicator_terms(a ^ b, 1000);
    std::map<Monomial, int64_t> m(terms.begin(), terms.end());
    CHECK(m == std::map<Monomial, int64_t>{{{0}, 1}, {{1}, 1}, {{0, 1}, 998}});
    terms = indicator_terms(a ^ b ^ c, 1000);
    m = std::map<Monomial, int64_t>(terms.begin(), terms.end());
    CHECK(m.at({0, 1, 2}) == 4);
    CHECK(m.at({1, 2}) == 998);
    CHECK(m.size() == 7);
    // Modulo 8 (a pi/4 coefficient): degree-4 terms (-8) vanish.
    terms = indicator_terms(a ^ b ^ c ^ Anf::var(3), 8);
    for (const auto& [mono, k] : terms) CHECK(mono.size() <= 3);
}

TEST_CASE("phase polynomials are unique mod 2pi: CCZ = seven pi/4 parity terms (practice)") {
    const Anf a = Anf::var(0), b = Anf::var(1), c = Anf::var(2);
    PhasePoly p;
    const Angle q = Angle::pi_times(1, 4);
    for (const Anf& f : {a, b, c, a ^ b ^ c}) p.add_indicator(q, f);
    for (const Anf& f : {a ^ b, a ^ c, b ^ c}) p.add_indicator(-q, f);
    REQUIRE(p.terms().size() == 1);
    CHECK(p.terms().begin()->first == Monomial{0, 1, 2});
    CHECK(p.terms().begin()->second == Angle::pi_times(1));
    CHECK(angle_period(Angle::pi_times(1, 4)) == 8);
    CHECK(angle_period(Angle::pi_times(3, 2)) == 4);
}

TEST_CASE("path sums: H H reduces to the identity, H alone does not ([HH] and [Elim] rules, Amy 2018)") {
    PathSum hh(1, {0}, true);
    hh.apply(testing::h(0));
    hh.apply(testing::h(0));
    CHECK(hh.num_path_vars() == 2);
    REQUIRE(hh.reduce(5));
    CHECK(hh.num_path_vars() == 0);
    CHECK(hh.outputs()[0] == Anf::var(0));
    CHECK(hh.phase().is_constant());
    CHECK(hh.sqrt2_power() == 0);

    PathSum one(1, {0}, true);
    one.apply(testing::h(0));
    REQUIRE(one.reduce(5));
    CHECK(one.num_path_vars() == 1);  // the output is the path variable itself
}

TEST_CASE("path sums: S H S H S H is e^{i pi/4} times the identity ([omega] rule; (SH)^3 = e^{i pi/4} I, practice)") {
    PathSum p(1, {0}, true);
    for (int i = 0; i < 3; ++i) {
        p.apply(testing::s_gate(0));
        p.apply(testing::h(0));
    }
    REQUIRE(p.reduce(5));
    CHECK(p.num_path_vars() == 0);
    CHECK(p.outputs()[0] == Anf::var(0));
    CHECK(p.phase().is_constant());
    REQUIRE(p.phase().terms().size() == 1);
    CHECK(p.phase().terms().begin()->second == Angle::pi_times(1, 4));
    CHECK(p.sqrt2_power() == 0);
}

TEST_CASE("path sums: a named Toffoli (H, CCZ, H) in the miter with its X form reduces") {
    PathSum p(3, {0, 0, 0}, true);
    p.apply(testing::ccx(0, 1, 2));  // named: two path variables
    CHECK(p.num_path_vars() == 2);
    p.apply_inverse(testing::ccx(0, 1, 2));
    REQUIRE(p.reduce(5));
    CHECK(p.num_path_vars() == 0);
    for (uint32_t w = 0; w < 3; ++w) CHECK(p.outputs()[w] == Anf::var(w));
    CHECK(p.phase().is_constant());
}
