// Number theory for the norm equation: primality, factoring, square roots mod p, conj(t) t = xi.
#include <doctest/doctest.h>

#include <random>

#include "synthesis/integer_factoring.h"
#include "synthesis/norm_equation.h"

using namespace whittle::lowering;

TEST_CASE("primality on known primes and composites") {
    // 2^61 - 1 and 2^89 - 1 are Mersenne primes; 2^67 - 1 = 193707721 * 761838257287 (Cole 1903).
    BigInt m61 = (BigInt(1) << 61) - 1, m89 = (BigInt(1) << 89) - 1, m67 = (BigInt(1) << 67) - 1;
    CHECK(is_probable_prime(m61));
    CHECK(is_probable_prime(m89));
    CHECK_FALSE(is_probable_prime(m67));
    CHECK_FALSE(is_probable_prime(BigInt(561)));  // Carmichael number 3 * 11 * 17
    CHECK_FALSE(is_probable_prime(BigInt(3215031751ULL)));  // strong pseudoprime to bases 2, 3, 5, 7
    for (unsigned n = 0; n < 2000; ++n) {
        bool trial = n >= 2;
        for (unsigned d = 2; d * d <= n; ++d)
            if (n % d == 0) trial = false;
        CHECK(is_probable_prime(BigInt(n)) == trial);
    }
}

TEST_CASE("factoring reconstructs the number from primes") {
    BigInt m67 = (BigInt(1) << 67) - 1;
    auto f = factor_integer(m67, 1000000);
    REQUIRE(f.has_value());
    REQUIRE(f->size() == 2);
    CHECK((*f)[0].first == BigInt(193707721));
    CHECK((*f)[1].first == BigInt(761838257287ULL));
    std::mt19937_64 rng(9);
    for (int i = 0; i < 40; ++i) {
        BigInt n = BigInt(rng() % 1000000007ULL + 1) * BigInt(rng() % 1000003 + 1) * 12;
        auto g = factor_integer(n, 1000000);
        REQUIRE(g.has_value());
        BigInt prod = 1;
        for (auto& [p, e] : *g) {
            CHECK(is_probable_prime(p));
            for (int j = 0; j < e; ++j) prod *= p;
        }
        CHECK(prod == n);
    }
    // A product of two 50-bit primes needs ~2^25 rho steps: a small budget must give up.
    BigInt hard = BigInt(1125899906842597ULL) * BigInt(1125899906842679ULL);
    CHECK_FALSE(factor_integer(hard, 2000).has_value());
}

TEST_CASE("square roots modulo primes") {
    for (unsigned p : {3u, 5u, 7u, 13u, 17u, 41u, 97u, 257u, 65537u, 1000000007u}) {
        for (unsigned a = 0; a < 60; ++a) {
            auto r = sqrt_mod_prime(BigInt(a), BigInt(p));
            bool residue = false;
            if (p < 70000)
                for (unsigned x = 0; x < p && !residue; ++x) residue = (BigInt(x) * x - a) % p == 0;
            if (r) CHECK((*r * *r - a) % p == 0);
            if (p < 70000) CHECK(r.has_value() == residue);
        }
    }
}

TEST_CASE("norm equation on known small instances") {
    // Checked by multiplication: conj(t) t must equal xi.
    auto check = [](const ZSqrt2& xi) {
        auto t = solve_norm_equation(xi);
        REQUIRE(t.has_value());
        CHECK(t->norm_sqrt2() == xi);
    };
    check(ZSqrt2(1));
    check(ZSqrt2(2));
    check(ZSqrt2(2, 1));   // 2 + sqrt2 = |1 + omega|^2
    check(ZSqrt2(5));      // 5 = |2 + i|^2
    check(ZSqrt2(3));      // 3 = |1 + sqrt2 i|^2
    check(ZSqrt2(17));     // 17 = |4 + i|^2
    check(ZSqrt2(49));     // 7^2
    check(ZSqrt2(3, 2));   // lambda^2, a totally positive unit
    // 7 = 7 mod 8 splits in Z[sqrt2] into (3 + sqrt2)(3 - sqrt2), each inert in Z[omega] (textbook):
    // an odd power of either is not a norm.
    CHECK_FALSE(solve_norm_equation(ZSqrt2(3, 1)).has_value());
    CHECK_FALSE(solve_norm_equation(ZSqrt2(7)).has_value());
    // Not totally positive: 1 - sqrt2 < 0.
    CHECK_FALSE(solve_norm_equation(ZSqrt2(1, -1)).has_value());
    CHECK_FALSE(solve_norm_equation(ZSqrt2(1, 1)).has_value());  // bullet is 1 - sqrt2 < 0
}

TEST_CASE("norm equation on random norms") {
    std::mt19937_64 rng(4);
    std::uniform_int_distribution<int> d(-300, 300);
    for (int i = 0; i < 200; ++i) {
        ZOmega s{d(rng), d(rng), d(rng), d(rng)};
        if (s.is_zero()) continue;
        ZSqrt2 xi = s.norm_sqrt2();
        auto t = solve_norm_equation(xi, 1000000);
        REQUIRE(t.has_value());
        CHECK(t->norm_sqrt2() == xi);
    }
}
