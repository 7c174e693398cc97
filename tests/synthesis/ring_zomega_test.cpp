// Z[sqrt2] and Z[omega] arithmetic checked against complex floating point and textbook identities.
#include <doctest/doctest.h>

#include <random>

#include "synthesis/ring_zomega.h"

using namespace whittle::lowering;

namespace {

ZSqrt2 random_zsqrt2(std::mt19937_64& rng, int bound) {
    std::uniform_int_distribution<int> d(-bound, bound);
    return {d(rng), d(rng)};
}

ZOmega random_zomega(std::mt19937_64& rng, int bound) {
    std::uniform_int_distribution<int> d(-bound, bound);
    return {d(rng), d(rng), d(rng), d(rng)};
}

bool near(std::complex<long double> a, std::complex<long double> b) { return std::abs(a - b) < 1e-9L * (1 + std::abs(b)); }

}  // namespace

TEST_CASE("Z[sqrt2]: the fundamental unit and exact signs") {
    // lambda = 1 + sqrt2 has norm -1 and generates the units up to sign (textbook, practice).
    CHECK(ZSqrt2::lambda().norm() == -1);
    CHECK(ZSqrt2::lambda_pow(5) * ZSqrt2::lambda_pow(-5) == ZSqrt2(1));
    CHECK(ZSqrt2::lambda_pow(-1) == ZSqrt2(-1, 1));
    CHECK(ZSqrt2(3, -2).sign() == 1);    // 3 - 2.828...
    CHECK(ZSqrt2(-3, 2).sign() == -1);
    CHECK(ZSqrt2(1, -1).sign() == -1);
    CHECK(ZSqrt2(-7, 5).sign() == 1);    // -7 + 7.07...
    CHECK(ZSqrt2(2, 3) < ZSqrt2(7, 0));  // 6.24 < 7
    CHECK(sqrt2_valuation(ZSqrt2(2)) == 2);
    CHECK(sqrt2_valuation(ZSqrt2(2, 1)) == 1);  // 2 + sqrt2 = sqrt2 (sqrt2 + 1)
    CHECK(sqrt2_valuation(ZSqrt2(3, 1)) == 0);
}

TEST_CASE("Z[sqrt2]: products, bullet and norm agree with real arithmetic") {
    std::mt19937_64 rng(11);
    for (int i = 0; i < 200; ++i) {
        ZSqrt2 x = random_zsqrt2(rng, 1000), y = random_zsqrt2(rng, 1000);
        CHECK((x * y).to_long_double() == doctest::Approx(x.to_long_double() * y.to_long_double()).epsilon(1e-9));
        CHECK((x * y).bullet() == x.bullet() * y.bullet());
        CHECK((x * y).norm() == x.norm() * y.norm());
        if (y.is_zero()) continue;
        ZSqrt2 q, r;
        divmod(x, y, q, r);
        CHECK(q * y + r == x);
        CHECK(abs(r.norm()) < abs(y.norm()));
        CHECK((x * y).exact_div(y) == x);
    }
}

TEST_CASE("Z[sqrt2]: gcd on known factorizations") {
    // 7 = (3 + sqrt2)(3 - sqrt2): the split prime 7 = 7 mod 8 (textbook).
    ZSqrt2 g = gcd(ZSqrt2(7), ZSqrt2(3, 1));
    CHECK(abs(g.norm()) == 7);
    CHECK(ZSqrt2(3, 1).exact_div(g).has_value());
    CHECK(gcd(ZSqrt2(3), ZSqrt2(5)).is_unit());  // 3 and 5 are inert and distinct
    std::mt19937_64 rng(5);
    for (int i = 0; i < 100; ++i) {
        ZSqrt2 a = random_zsqrt2(rng, 50), b = random_zsqrt2(rng, 50), c = random_zsqrt2(rng, 50);
        if (a.is_zero() || b.is_zero() || c.is_zero()) continue;
        ZSqrt2 h = gcd(a * c, b * c);
        CHECK((a * c).exact_div(h).has_value());
        CHECK((b * c).exact_div(h).has_value());
        CHECK(h.exact_div(c).has_value());  // c divides the gcd
    }
}

TEST_CASE("Z[omega]: products and conjugations agree with complex arithmetic") {
    std::mt19937_64 rng(7);
    const std::complex<long double> omega(std::sqrt(0.5L), std::sqrt(0.5L));
    CHECK(near(ZOmega::omega_pow(1).to_complex(), omega));
    CHECK(ZOmega::omega_pow(8) == ZOmega(1));
    CHECK(ZOmega::omega_pow(4) == ZOmega(-1));
    CHECK(ZOmega::from_zsqrt2(ZSqrt2::sqrt2()) * ZOmega::from_zsqrt2(ZSqrt2::sqrt2()) == ZOmega(2));
    for (int i = 0; i < 200; ++i) {
        ZOmega x = random_zomega(rng, 100), y = random_zomega(rng, 100);
        CHECK(near((x * y).to_complex(), x.to_complex() * y.to_complex()));
        CHECK(near(x.conj().to_complex(), std::conj(x.to_complex())));
        CHECK((x * y).bullet() == x.bullet() * y.bullet());
        CHECK((x * y).conj() == x.conj() * y.conj());
        CHECK(x.norm_sqrt2().to_long_double() == doctest::Approx(std::norm(x.to_complex())).epsilon(1e-9));
        CHECK((x * y).norm() == x.norm() * y.norm());
        CHECK(ZOmega::from_sqrt2_parts(x.re_sqrt2(), x.im_sqrt2()) == x);
        CHECK(x.times_sqrt2().divided_by_sqrt2() == x);
        ZSqrt2 re = random_zsqrt2(rng, 100), im = random_zsqrt2(rng, 100);
        CHECK(near(ZOmega::from_parts(re, im).to_complex(), {re.to_long_double(), im.to_long_double()}));
        if (y.is_zero()) continue;
        ZOmega q, r;
        divmod(x, y, q, r);
        CHECK(q * y + r == x);
        CHECK(r.norm() < y.norm());
    }
}

TEST_CASE("Z[omega]: gcd finds the Gaussian factors") {
    // 5 = (2 + i)(2 - i) (textbook); 2 + i is prime in Z[omega] since 5 = 5 mod 8 is inert in Z[sqrt2].
    auto g = gcd(ZOmega(5), ZOmega(2, 0, 1, 0));
    REQUIRE(g.has_value());
    CHECK(g->norm() == 25);
    CHECK(ZOmega(2, 0, 1, 0).exact_div(*g).has_value());
    std::mt19937_64 rng(3);
    for (int i = 0; i < 60; ++i) {
        ZOmega a = random_zomega(rng, 20), b = random_zomega(rng, 20), c = random_zomega(rng, 20);
        if (a.is_zero() || b.is_zero() || c.is_zero()) continue;
        auto h = gcd(a * c, b * c);
        REQUIRE(h.has_value());
        CHECK((a * c).exact_div(*h).has_value());
        CHECK((b * c).exact_div(*h).has_value());
        CHECK(h->exact_div(c).has_value());
    }
}
