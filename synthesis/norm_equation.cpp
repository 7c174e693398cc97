// Solving conj(t) t = xi: factor N(xi), split each prime of Z[sqrt2] in Z[omega] by a gcd, fix the unit.
#include "synthesis/norm_equation.h"

#include <cmath>

#include "ir/error.h"
#include "synthesis/integer_factoring.h"

namespace whittle::lowering {

namespace {

// Number of times d divides x (x != 0); x is divided in place.
int divide_out(ZSqrt2& x, const ZSqrt2& d) {
    int e = 0;
    while (auto q = x.exact_div(d)) {
        x = std::move(*q);
        ++e;
    }
    return e;
}

ZOmega power(ZOmega base, int e) {
    ZOmega r = 1;
    for (int i = 0; i < e; ++i) r = r * base;
    return r;
}

// A prime of Z[omega] dividing the Z[sqrt2] prime `pi` (over the rational prime p), found as gcd(pi, u + i) with
// u^2 = -1 (mod p) (p = 1 mod 4), or gcd(pi, u + sqrt2 i) with u^2 = -2 (mod p) (p = 3 mod 8).
std::optional<ZOmega> split_in_zomega(const ZSqrt2& pi, const BigInt& p) {
    bool minus_one = p % 4 == 1;
    auto u = sqrt_mod_prime(minus_one ? BigInt(-1) : BigInt(-2), p);
    if (!u) return std::nullopt;
    // u + i, or u + sqrt2 i with sqrt2 i = omega + omega^3
    auto g = gcd(ZOmega::from_zsqrt2(pi), minus_one ? ZOmega(*u, 0, 1, 0) : ZOmega(*u, 1, 0, 1));
    if (!g) return std::nullopt;
    // conj(g) g must be pi times a unit: the same integer norm up to sign.
    if (abs(g->norm_sqrt2().norm()) != abs(pi.norm())) return std::nullopt;
    return g;
}

}  // namespace

std::optional<ZOmega> solve_norm_equation(const ZSqrt2& xi, long rho_steps) {
    if (xi.is_zero()) return ZOmega(0);
    if (xi.sign() < 0 || xi.bullet().sign() < 0) return std::nullopt;
    auto factors = factor_integer(xi.norm(), rho_steps);
    if (!factors) return std::nullopt;

    ZSqrt2 rest = xi;
    ZOmega t = 1;
    for (const auto& [p, exponent] : *factors) {
        if (p == 2) {
            // sqrt2 = conj(delta) delta / lambda with delta = 1 + omega.
            int v = sqrt2_valuation(rest);
            for (int i = 0; i < v; ++i) rest = rest.divided_by_sqrt2();
            t = t * power(ZOmega(1, 1, 0, 0), v);
            continue;
        }
        int mod8 = static_cast<int>(p % 8);
        if (mod8 == 3 || mod8 == 5) {
            // p stays prime in Z[sqrt2] and splits as conj(tau) tau in Z[omega].
            int e = divide_out(rest, ZSqrt2(p));
            if (e == 0) continue;
            auto tau = split_in_zomega(ZSqrt2(p), p);
            if (!tau) return std::nullopt;
            t = t * power(*tau, e);
            continue;
        }
        // p = +-1 mod 8 splits in Z[sqrt2] as pi * pi.bullet() with pi = gcd(p, x + sqrt2), x^2 = 2 (mod p).
        auto x = sqrt_mod_prime(BigInt(2), p);
        if (!x) return std::nullopt;
        ZSqrt2 pi = gcd(ZSqrt2(p), ZSqrt2(*x, 1));
        if (pi.norm() != p && pi.norm() != -p) return std::nullopt;
        ZSqrt2 pi_b = pi.bullet();
        int e1 = divide_out(rest, pi), e2 = divide_out(rest, pi_b);
        if (mod8 == 7) {
            // pi stays prime in Z[omega] and is real: only even powers are norms.
            if (e1 % 2 != 0 || e2 % 2 != 0) return std::nullopt;
            t = t * power(ZOmega::from_zsqrt2(pi), e1 / 2) * power(ZOmega::from_zsqrt2(pi_b), e2 / 2);
            continue;
        }
        if (e1 + e2 == 0) continue;
        auto tau = split_in_zomega(pi, p);
        if (!tau) return std::nullopt;
        t = t * power(*tau, e1) * power(tau->bullet(), e2);
    }
    if (!rest.is_unit()) return std::nullopt;  // a factor the factorization missed: never expected

    // xi = w * conj(t) t with w a unit; both sides are totally positive, so w = lambda^(2m).
    auto w = xi.exact_div(t.norm_sqrt2());
    if (!w || !w->is_unit()) return std::nullopt;
    // Take the logarithm of whichever of w, w.bullet() = lambda^(-2m) is >= 1 (no cancellation).
    const long double log_lambda = std::log(1 + std::sqrt(2.0L));
    bool big = ZSqrt2(1) <= *w;
    long double lw = std::log((big ? *w : w->bullet()).to_long_double()) / log_lambda;
    int m = static_cast<int>(std::lround(lw / 2)) * (big ? 1 : -1);
    if (ZSqrt2::lambda_pow(2 * m) != *w) return std::nullopt;
    t = t * ZOmega::from_zsqrt2(ZSqrt2::lambda_pow(m));
    WHITTLE_ASSERT(t.norm_sqrt2() == xi && "norm equation solution must check");
    return t;
}

}  // namespace whittle::lowering
