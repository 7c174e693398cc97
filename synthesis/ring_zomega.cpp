// Arithmetic in Z[sqrt2] and Z[omega]: products, conjugations, exact and Euclidean division, gcd.
#include "synthesis/ring_zomega.h"

#include <cmath>

#include "ir/error.h"

namespace whittle::lowering {

BigInt floor_div(const BigInt& n, const BigInt& d) {
    WHITTLE_ASSERT(d != 0 && "division by zero");
    BigInt q = n / d;
    BigInt r = n - q * d;
    if (r != 0 && ((r < 0) != (d < 0))) q -= 1;
    return q;
}

BigInt round_div(const BigInt& n, const BigInt& d) {
    if (d < 0) return round_div(-n, -d);
    return floor_div(2 * n + d, 2 * d);
}

// ---------------------------------------------------------------------------------------- Z[sqrt2]

ZSqrt2 ZSqrt2::lambda_pow(int n) {
    ZSqrt2 base = n >= 0 ? ZSqrt2{1, 1} : ZSqrt2{-1, 1};
    ZSqrt2 result = 1;
    for (int i = 0; i < std::abs(n); ++i) result = result * base;
    return result;
}

bool ZSqrt2::is_unit() const {
    BigInt n = norm();
    return n == 1 || n == -1;
}

int ZSqrt2::sign() const {
    int sa = a.sign(), sb = b.sign();
    if (sb == 0) return sa;
    if (sa == 0 || sa == sb) return sb;
    // Opposite signs: the term with the larger square wins (a^2 = 2 b^2 is impossible unless both vanish).
    BigInt a2 = a * a, b2 = 2 * b * b;
    return a2 > b2 ? sa : sb;
}

long double ZSqrt2::to_long_double() const {
    return a.convert_to<long double>() + b.convert_to<long double>() * std::sqrt(2.0L);
}

std::string ZSqrt2::to_string() const { return a.str() + (b < 0 ? "-" : "+") + abs(b).str() + "*sqrt2"; }

ZSqrt2 ZSqrt2::divided_by_sqrt2() const {
    WHITTLE_ASSERT(divisible_by_sqrt2() && "not divisible by sqrt2");
    return {b, a / 2};
}

std::optional<ZSqrt2> ZSqrt2::exact_div(const ZSqrt2& y) const {
    WHITTLE_ASSERT(!y.is_zero() && "division by zero");
    BigInt n = y.norm();
    ZSqrt2 num = *this * y.bullet();
    if (num.a % n != 0 || num.b % n != 0) return std::nullopt;
    return ZSqrt2{num.a / n, num.b / n};
}

void divmod(const ZSqrt2& x, const ZSqrt2& y, ZSqrt2& q, ZSqrt2& r) {
    WHITTLE_ASSERT(!y.is_zero() && "division by zero");
    BigInt n = y.norm();
    ZSqrt2 num = x * y.bullet();
    q = ZSqrt2{round_div(num.a, n), round_div(num.b, n)};
    r = x - q * y;
}

ZSqrt2 gcd(ZSqrt2 x, ZSqrt2 y) {
    // Rounding leaves |N(r)| <= |N(y)|/2, so the norms shrink geometrically.
    while (!y.is_zero()) {
        ZSqrt2 q, r;
        divmod(x, y, q, r);
        x = std::move(y);
        y = std::move(r);
    }
    return x;
}

int sqrt2_valuation(ZSqrt2 x) {
    WHITTLE_ASSERT(!x.is_zero() && "valuation of zero");
    int v = 0;
    while (x.divisible_by_sqrt2()) {
        x = x.divided_by_sqrt2();
        ++v;
    }
    return v;
}

// ----------------------------------------------------------------------------------------- Z[omega]

ZOmega ZOmega::omega_pow(int n) { return ZOmega(1).times_omega_pow(n); }

ZOmega ZOmega::from_parts(const ZSqrt2& x, const ZSqrt2& y) {
    // x + i y = x.a + x.b (omega - omega^3) + omega^2 (y.a + y.b (omega - omega^3)), with omega^5 = -omega.
    return {x.a, x.b + y.b, y.a, y.b - x.b};
}

ZSqrt2 ZOmega::norm_sqrt2() const {
    return {c[0] * c[0] + c[1] * c[1] + c[2] * c[2] + c[3] * c[3],
            c[0] * c[1] - c[0] * c[3] + c[1] * c[2] + c[2] * c[3]};
}

ZOmega ZOmega::times_omega_pow(int n) const {
    n = ((n % 8) + 8) % 8;
    ZOmega x = *this;
    for (int i = 0; i < n; ++i) x = ZOmega{-x.c[3], x.c[0], x.c[1], x.c[2]};
    return x;
}

ZOmega ZOmega::times_sqrt2() const {
    // x (omega - omega^3), expanded with omega^4 = -1.
    return {c[1] - c[3], c[0] + c[2], c[1] + c[3], c[2] - c[0]};
}

ZOmega ZOmega::divided_by_sqrt2() const {
    WHITTLE_ASSERT(divisible_by_sqrt2() && "not divisible by sqrt2");
    ZOmega t = times_sqrt2();
    return {t.c[0] / 2, t.c[1] / 2, t.c[2] / 2, t.c[3] / 2};
}

std::optional<ZOmega> ZOmega::from_sqrt2_parts(const ZSqrt2& x, const ZSqrt2& y) {
    BigInt s = x.a + y.a;
    if (s % 2 != 0) return std::nullopt;
    return ZOmega{x.b, s / 2, y.b, (y.a - x.a) / 2};
}

ZOmega operator*(const ZOmega& x, const ZOmega& y) {
    BigInt r[4];
    for (int i = 0; i < 4; ++i) {
        if (x.c[i] == 0) continue;
        for (int j = 0; j < 4; ++j) {
            int e = i + j;
            if (e < 4)
                r[e] += x.c[i] * y.c[j];
            else
                r[e - 4] -= x.c[i] * y.c[j];
        }
    }
    return {r[0], r[1], r[2], r[3]};
}

namespace {

// y' with y * y' = N(y), a positive integer.
ZOmega norm_cofactor(const ZOmega& y) { return y.conj() * ZOmega::from_zsqrt2(y.norm_sqrt2().bullet()); }

}  // namespace

std::optional<ZOmega> ZOmega::exact_div(const ZOmega& y) const {
    WHITTLE_ASSERT(!y.is_zero() && "division by zero");
    BigInt n = y.norm();
    ZOmega num = *this * norm_cofactor(y);
    for (const auto& ci : num.c)
        if (ci % n != 0) return std::nullopt;
    return ZOmega{num.c[0] / n, num.c[1] / n, num.c[2] / n, num.c[3] / n};
}

std::complex<long double> ZOmega::to_complex() const {
    const long double h = std::sqrt(0.5L);
    long double c0 = c[0].convert_to<long double>(), c1 = c[1].convert_to<long double>();
    long double c2 = c[2].convert_to<long double>(), c3 = c[3].convert_to<long double>();
    return {c0 + h * (c1 - c3), c2 + h * (c1 + c3)};
}

std::string ZOmega::to_string() const {
    return "[" + c[0].str() + "," + c[1].str() + "," + c[2].str() + "," + c[3].str() + "]";
}

void divmod(const ZOmega& x, const ZOmega& y, ZOmega& q, ZOmega& r) {
    WHITTLE_ASSERT(!y.is_zero() && "division by zero");
    BigInt n = y.norm();
    ZOmega num = x * norm_cofactor(y);
    q = ZOmega{round_div(num.c[0], n), round_div(num.c[1], n), round_div(num.c[2], n), round_div(num.c[3], n)};
    r = x - q * y;
    if (r.norm() < n) return;
    // A rounding tie: try the other corners of the unit box around x/y and keep the smallest remainder.
    BigInt lo[4];
    for (int i = 0; i < 4; ++i) lo[i] = floor_div(num.c[i], n);
    BigInt best = r.norm();
    for (int mask = 0; mask < 16; ++mask) {
        ZOmega cq{lo[0] + (mask & 1), lo[1] + ((mask >> 1) & 1), lo[2] + ((mask >> 2) & 1), lo[3] + ((mask >> 3) & 1)};
        ZOmega cr = x - cq * y;
        BigInt cn = cr.norm();
        if (cn < best) {
            best = cn;
            q = cq;
            r = cr;
        }
    }
}

std::optional<ZOmega> gcd(ZOmega x, ZOmega y) {
    for (int step = 0; step < 10000; ++step) {
        if (y.is_zero()) return x;
        ZOmega q, r;
        divmod(x, y, q, r);
        if (r.norm() >= y.norm()) return std::nullopt;
        x = std::move(y);
        y = std::move(r);
    }
    return std::nullopt;
}

}  // namespace whittle::lowering
