// The library's multipliers, modular and GF(2^n) arithmetic against integer / polynomial arithmetic.
#include "stdlib_harness.h"

using namespace stdlib_test;

namespace {

// Carry-less product of a and b reduced mod poly (degree n): polynomial arithmetic over GF(2),
// computed bit by bit here (textbook definition of GF(2)[x] / (poly)).
u128 gf2_mulmod(u128 a, u128 b, u128 poly, unsigned n) {
    u128 prod = 0;  // up to degree 2n-2 <= 126
    for (unsigned i = 0; i < n; ++i)
        if ((a >> i) & 1) prod ^= b << i;
    for (unsigned d = 2 * n - 2; d >= n && d < 128; --d)
        if ((prod >> d) & 1) prod ^= poly << (d - n);
    return prod & mask(n);
}

/// b = (a + b) mod N for a, b < N, other inputs unchanged: mod_add's definition, by integer arithmetic.
Expect mod_add_of(int64_t N) {
    return [N](const Values& in) {
        Values out = in;
        const u128 a = in.at("a"), b = in.at("b");
        if (a < u128(N) && b < u128(N)) out["b"] = (a + b) % u128(N);
        return out;
    };
}

}  // namespace

TEST_CASE("stdlib: mul gives p + a*b mod 2^len(p)") {
    for (unsigned n : {1u, 2u, 3u, 4u, 5u, 32u, 64u}) {
        CAPTURE(n);
        check_routine({{"a", n}, {"b", n}, {"p", n}}, "mul(a, b, p)", [n](const Values& in) {
            Values out = in;
            out["p"] = (in.at("p") + in.at("a") * in.at("b")) & mask(n);
            return out;
        });
    }
    // unequal widths: a 3-bit times 4-bit product into 6 bits, and into 2 bits (truncated)
    for (unsigned m : {2u, 6u, 7u})
        check_routine({{"a", 3}, {"b", 4}, {"p", m}}, "mul(a, b, p)", [m](const Values& in) {
            Values out = in;
            out["p"] = (in.at("p") + in.at("a") * in.at("b")) & mask(m);
            return out;
        });
}

TEST_CASE("stdlib: square gives p + a*a mod 2^len(p)") {
    for (unsigned n : {1u, 2u, 3u, 4u, 5u, 32u})
        for (unsigned m : {n, 2 * n, n + 1}) {
            if (m > 64) continue;
            CAPTURE(n);
            CAPTURE(m);
            check_routine({{"a", n}, {"p", m}}, "square(a, p)", [m](const Values& in) {
                Values out = in;
                out["p"] = (in.at("p") + in.at("a") * in.at("a")) & mask(m);
                return out;
            });
        }
}

TEST_CASE("stdlib: mod_mul_const gives (out + x*k) mod N for out < N and leaves out >= N alone") {
    for (unsigned n : {1u, 2u, 3u, 4u})
        for (int64_t N = 1; N <= (int64_t(1) << n); ++N)
            for (int64_t k : {int64_t(0), int64_t(1), N - 1, 2 * N + 1, int64_t(5)}) {
                if (k < 0) continue;
                CAPTURE(n);
                CAPTURE(N);
                CAPTURE(k);
                check_routine({{"x", 3}, {"out", n}},
                              "mod_mul_const(x, out, " + std::to_string(k) + ", " + std::to_string(N) + ")",
                              [N, k](const Values& in) {
                                  Values out = in;
                                  const u128 o = in.at("out");
                                  if (o < u128(N)) out["out"] = (o + in.at("x") * u128(k)) % u128(N);
                                  return out;
                              });
            }
    std::mt19937_64 rng(11);
    for (unsigned n : {8u, 32u}) {
        const int64_t N = int64_t(rng() & uint64_t(mask(n))) | 1;
        const int64_t k = int64_t(rng() % uint64_t(N));
        CAPTURE(n);
        check_routine({{"x", 6}, {"out", n}}, "mod_mul_const(x, out, " + std::to_string(k) + ", " + std::to_string(N) + ")",
                      [N, k](const Values& in) {
                          Values out = in;
                          const u128 o = in.at("out");
                          if (o < u128(N)) out["out"] = (o + in.at("x") * u128(k)) % u128(N);
                          return out;
                      });
    }
}

TEST_CASE("stdlib: mod_add gives (a + b) mod N for a, b < N and leaves other inputs alone") {
    for (unsigned n : {1u, 2u, 3u, 4u})
        for (int64_t N = 1; N <= (int64_t(1) << n); ++N) {
            CAPTURE(n);
            CAPTURE(N);
            check_routine({{"a", n}, {"b", n}}, "mod_add(a, b, " + std::to_string(N) + ")", mod_add_of(N));
        }
    std::mt19937_64 rng(17);
    for (unsigned n : {8u, 32u}) {
        const int64_t N = int64_t(rng() & uint64_t(mask(n))) | 1;
        CAPTURE(n);
        CAPTURE(N);
        // random inputs are mostly valid only when N is near 2^n; both kinds occur either way
        check_routine({{"a", n}, {"b", n}}, "mod_add(a, b, " + std::to_string(N) + ")", mod_add_of(N));
    }
}

TEST_CASE("stdlib: mod_add_const gives (b + k) mod N for b < N and leaves b >= N alone") {
    for (unsigned n : {1u, 2u, 3u, 4u})
        for (int64_t N = 1; N <= (int64_t(1) << n); ++N)
            for (int64_t k = 0; k < N + 1; ++k) {
                CAPTURE(n);
                CAPTURE(N);
                CAPTURE(k);
                check_routine({{"b", n}}, "mod_add_const(b, " + std::to_string(k) + ", " + std::to_string(N) + ")",
                              [N, k](const Values& in) {
                                  Values out = in;
                                  u128 b = in.at("b");
                                  if (b < u128(N)) out["b"] = (b + u128(k)) % u128(N);
                                  return out;
                              });
            }
    std::mt19937_64 rng(5);
    for (unsigned n : {5u, 6u, 32u, 62u})
        for (int trial = 0; trial < 3; ++trial) {
            int64_t N = int64_t(rng() & uint64_t(mask(n))) | 1;
            int64_t k = int64_t(rng() % uint64_t(N));
            CAPTURE(n);
            CAPTURE(N);
            CAPTURE(k);
            check_routine({{"b", n}}, "mod_add_const(b, " + std::to_string(k) + ", " + std::to_string(N) + ")",
                          [N, k](const Values& in) {
                              Values out = in;
                              u128 b = in.at("b");
                              if (b < u128(N)) out["b"] = (b + u128(k)) % u128(N);
                              return out;
                          });
        }
}

TEST_CASE("stdlib: gf2_mul gives c + a*b in GF(2)[x] mod poly") {
    // Polynomials: x^2+x+1, x^3+x+1, x^4+x+1 (19), x^5+x^2+1, x^6+x+1 (irreducible, practice), and
    // for 32 / 64 bits x^32+x^7+x^3+x^2+1 and x^64+x^4+x^3+x+1 (bit n left implicit; the routine's
    // result is the product mod poly whether or not poly is irreducible).
    const std::vector<std::pair<unsigned, uint64_t>> cases = {
        {2, 7}, {3, 11}, {4, 19}, {5, 37}, {6, 67}, {32, (uint64_t(1) << 32) | 0x8d}, {64, 0x1b}};
    for (auto [n, poly] : cases) {
        CAPTURE(n);
        u128 full = n == 64 ? (u128(1) << 64) | poly : u128(poly);
        check_routine({{"a", n}, {"b", n}, {"c", n}}, "gf2_mul(a, b, c, " + std::to_string(int64_t(poly)) + ")",
                      [n, full](const Values& in) {
                          Values out = in;
                          out["c"] = in.at("c") ^ gf2_mulmod(in.at("a"), in.at("b"), full, n);
                          return out;
                      });
    }
}

TEST_CASE("stdlib: gf2_mul is n^2 Toffolis") {
    // the GF(2^n) multiplier family of CHECKS.md: n^2 Toffolis (112 T for n = 4 before optimization)
    for (unsigned n : {3u, 4u, 5u}) {
        const uint64_t poly[] = {0, 0, 0, 11, 19, 37};
        whittle::ir::Circuit c = load("use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) + "], c[" +
                                      std::to_string(n) + "]\ngf2_mul(a, b, c, " + std::to_string(poly[n]) + ")\n");
        unsigned toffoli = 0;
        for (const auto& op : c.ops) toffoli += op.kind == whittle::ir::OpKind::X && op.controls.size() == 2;
        CHECK(toffoli == n * n);
    }
}
