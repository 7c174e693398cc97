// Exact rings for Clifford+T synthesis: Z[sqrt2], Z[omega] (omega = e^{i pi/4}) and their arithmetic.
#pragma once

#include <boost/multiprecision/cpp_int.hpp>
#include <complex>
#include <optional>
#include <string>

namespace whittle::lowering {

/// Arbitrary-precision integer (expression templates off so `auto` is always a value).
using BigInt = boost::multiprecision::number<boost::multiprecision::cpp_int_backend<>,
                                             boost::multiprecision::et_off>;

/// floor(n / d) for d != 0 (cpp_int division truncates toward zero).
BigInt floor_div(const BigInt& n, const BigInt& d);
/// The integer nearest to n / d (ties go up), d != 0.
BigInt round_div(const BigInt& n, const BigInt& d);

/// a + b*sqrt(2) with integer a, b.
struct ZSqrt2 {
    BigInt a, b;

    ZSqrt2() = default;
    ZSqrt2(BigInt a_, BigInt b_ = 0) : a(std::move(a_)), b(std::move(b_)) {}  // NOLINT: integers embed
    ZSqrt2(int a_) : a(a_), b(0) {}                                              // NOLINT

    static ZSqrt2 sqrt2() { return {0, 1}; }
    /// lambda = 1 + sqrt2, the fundamental unit.
    static ZSqrt2 lambda() { return {1, 1}; }
    /// lambda^n for any integer n (lambda^-1 = sqrt2 - 1).
    static ZSqrt2 lambda_pow(int n);

    /// The sqrt2-conjugate ("bullet"): a - b*sqrt2.
    ZSqrt2 bullet() const { return {a, -b}; }
    /// Integer norm x * x.bullet() = a^2 - 2 b^2.
    BigInt norm() const { return a * a - 2 * b * b; }
    bool is_zero() const { return a == 0 && b == 0; }
    bool is_unit() const;
    /// Sign of the real number a + b*sqrt2 (-1, 0 or 1), decided exactly.
    int sign() const;
    long double to_long_double() const;
    std::string to_string() const;

    bool divisible_by_sqrt2() const { return a % 2 == 0; }
    /// x / sqrt2; requires divisible_by_sqrt2().
    ZSqrt2 divided_by_sqrt2() const;
    /// x / y when y divides x exactly, else nothing.
    std::optional<ZSqrt2> exact_div(const ZSqrt2& y) const;

    friend ZSqrt2 operator+(const ZSqrt2& x, const ZSqrt2& y) { return {x.a + y.a, x.b + y.b}; }
    friend ZSqrt2 operator-(const ZSqrt2& x, const ZSqrt2& y) { return {x.a - y.a, x.b - y.b}; }
    friend ZSqrt2 operator-(const ZSqrt2& x) { return {-x.a, -x.b}; }
    friend ZSqrt2 operator*(const ZSqrt2& x, const ZSqrt2& y) {
        return {x.a * y.a + 2 * x.b * y.b, x.a * y.b + x.b * y.a};
    }
    friend bool operator==(const ZSqrt2& x, const ZSqrt2& y) { return x.a == y.a && x.b == y.b; }
    friend bool operator!=(const ZSqrt2& x, const ZSqrt2& y) { return !(x == y); }
    /// Exact comparison of the real values.
    friend bool operator<(const ZSqrt2& x, const ZSqrt2& y) { return (y - x).sign() > 0; }
    friend bool operator<=(const ZSqrt2& x, const ZSqrt2& y) { return (y - x).sign() >= 0; }
};

/// Euclidean division in Z[sqrt2]: x = q*y + r with |N(r)| < |N(y)|; y != 0.
void divmod(const ZSqrt2& x, const ZSqrt2& y, ZSqrt2& q, ZSqrt2& r);
/// A greatest common divisor in Z[sqrt2] (defined up to a unit).
ZSqrt2 gcd(ZSqrt2 x, ZSqrt2 y);
/// Largest v with sqrt2^v dividing x; x != 0.
int sqrt2_valuation(ZSqrt2 x);

/// c0 + c1*omega + c2*omega^2 + c3*omega^3 with omega = e^{i pi/4} (omega^2 = i, omega^4 = -1).
struct ZOmega {
    BigInt c[4];

    ZOmega() = default;
    ZOmega(BigInt c0, BigInt c1, BigInt c2, BigInt c3) : c{std::move(c0), std::move(c1), std::move(c2), std::move(c3)} {}
    ZOmega(int n) : c{n, 0, 0, 0} {}  // NOLINT: integers embed
    /// The embedding of Z[sqrt2] (sqrt2 = omega - omega^3).
    static ZOmega from_zsqrt2(const ZSqrt2& x) { return {x.a, x.b, 0, -x.b}; }
    /// omega^n for any integer n.
    static ZOmega omega_pow(int n);
    /// x + i*y for x, y in Z[sqrt2].
    static ZOmega from_parts(const ZSqrt2& x, const ZSqrt2& y);

    /// Complex conjugate (omega -> omega^-1 = -omega^3).
    ZOmega conj() const { return {c[0], -c[3], -c[2], -c[1]}; }
    /// The sqrt2-conjugate ("bullet", omega -> -omega).
    ZOmega bullet() const { return {c[0], -c[1], c[2], -c[3]}; }
    /// conj(x) * x, which lies in Z[sqrt2].
    ZSqrt2 norm_sqrt2() const;
    /// The integer norm: norm_sqrt2() times its bullet (>= 0).
    BigInt norm() const { return norm_sqrt2().norm(); }
    /// x * omega^n.
    ZOmega times_omega_pow(int n) const;
    bool is_zero() const { return c[0] == 0 && c[1] == 0 && c[2] == 0 && c[3] == 0; }
    bool divisible_by_sqrt2() const { return (c[0] - c[2]) % 2 == 0 && (c[1] - c[3]) % 2 == 0; }
    /// x / sqrt2; requires divisible_by_sqrt2().
    ZOmega divided_by_sqrt2() const;
    ZOmega times_sqrt2() const;
    /// x / y when y divides x exactly, else nothing.
    std::optional<ZOmega> exact_div(const ZOmega& y) const;
    /// Real part times sqrt2 and imaginary part times sqrt2, both in Z[sqrt2].
    ZSqrt2 re_sqrt2() const { return {c[1] - c[3], c[0]}; }
    ZSqrt2 im_sqrt2() const { return {c[1] + c[3], c[2]}; }
    /// Inverse of (re_sqrt2, im_sqrt2): the element (x + i y)/sqrt2; nothing when not in Z[omega].
    static std::optional<ZOmega> from_sqrt2_parts(const ZSqrt2& x, const ZSqrt2& y);
    std::complex<long double> to_complex() const;
    std::string to_string() const;

    friend ZOmega operator+(const ZOmega& x, const ZOmega& y) {
        return {x.c[0] + y.c[0], x.c[1] + y.c[1], x.c[2] + y.c[2], x.c[3] + y.c[3]};
    }
    friend ZOmega operator-(const ZOmega& x, const ZOmega& y) {
        return {x.c[0] - y.c[0], x.c[1] - y.c[1], x.c[2] - y.c[2], x.c[3] - y.c[3]};
    }
    friend ZOmega operator-(const ZOmega& x) { return {-x.c[0], -x.c[1], -x.c[2], -x.c[3]}; }
    friend ZOmega operator*(const ZOmega& x, const ZOmega& y);
    friend bool operator==(const ZOmega& x, const ZOmega& y) {
        return x.c[0] == y.c[0] && x.c[1] == y.c[1] && x.c[2] == y.c[2] && x.c[3] == y.c[3];
    }
    friend bool operator!=(const ZOmega& x, const ZOmega& y) { return !(x == y); }
};

/// Euclidean division in Z[omega] by rounding x/y coordinate-wise: x = q*y + r, N(r) <= N(y).
void divmod(const ZOmega& x, const ZOmega& y, ZOmega& q, ZOmega& r);
/// A greatest common divisor in Z[omega] (up to a unit), or nothing when the Euclidean
/// iteration does not terminate within its step limit (rounding ties; never seen in practice).
std::optional<ZOmega> gcd(ZOmega x, ZOmega y);

}  // namespace whittle::lowering
