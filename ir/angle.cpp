// Exact and inexact angle arithmetic.
#include "ir/angle.h"

#include <cmath>
#include <numeric>

#include <fmt/format.h>

namespace whittle::ir {
namespace {

constexpr double kTwoPi = 6.283185307179586476925286766559;
constexpr int64_t kMaxDen = int64_t(1) << 40;

double reduce_radians(double r) {
    double m = std::fmod(r, kTwoPi);
    if (m < 0) m += kTwoPi;
    if (m >= kTwoPi) m -= kTwoPi;
    return m;
}

}  // namespace

Angle Angle::pi_times(int64_t num, int64_t den) {
    if (den < 0) {
        num = -num;
        den = -den;
    }
    if (den == 0) return radians(0.0);
    int64_t g = std::gcd(num < 0 ? -num : num, den);
    if (g > 1) {
        num /= g;
        den /= g;
    }
    if (den > kMaxDen) return radians(double(num) / double(den) * (kTwoPi / 2));
    int64_t period = 2 * den;
    num %= period;
    if (num < 0) num += period;
    Angle a;
    a.num_ = num;
    a.den_ = den;
    return a;
}

Angle Angle::radians(double r) {
    Angle a;
    a.den_ = 0;
    a.set_rad(std::isfinite(r) ? reduce_radians(r) : 0.0);
    return a;
}

double Angle::to_radians() const {
    if (!is_exact()) return rad();
    return double(num_) / double(den_) * (kTwoPi / 2);
}

bool Angle::is_zero() const {
    if (is_exact()) return num_ == 0;
    return rad() < 1e-12 || kTwoPi - rad() < 1e-12;
}

bool Angle::is_multiple_of_pi_over(int64_t d) const {
    if (!is_exact() || d <= 0) return false;
    return d % den_ == 0;
}

int Angle::eighths() const {
    if (!is_multiple_of_pi_over(4)) return -1;
    return int(num_ * (4 / den_));
}

Angle Angle::operator-() const {
    if (is_exact()) return pi_times(-num_, den_);
    return radians(-rad());
}

Angle Angle::operator+(const Angle& o) const {
    if (is_exact() && o.is_exact()) {
        int64_t g = std::gcd(den_, o.den_);
        int64_t l = den_ / g * o.den_;
        if (l <= kMaxDen) return pi_times(num_ * (l / den_) + o.num_ * (l / o.den_), l);
    }
    return radians(to_radians() + o.to_radians());
}

Angle Angle::operator*(int64_t k) const {
    if (is_exact()) {
        // num_ < 2*den_ <= 2^41; reduce k first so the product stays in range.
        int64_t kk = k % (2 * den_);
        return pi_times(num_ * kk, den_);
    }
    return radians(rad() * double(k));
}

Angle Angle::divided_by(int64_t k) const {
    if (k == 0) return radians(0.0);
    if (is_exact() && den_ * (k < 0 ? -k : k) <= kMaxDen) return pi_times(num_, den_ * k);
    return radians(to_radians() / double(k));
}

bool Angle::operator==(const Angle& o) const {
    if (is_exact() && o.is_exact()) return num_ == o.num_ && den_ == o.den_;
    double d = std::fabs(to_radians() - o.to_radians());
    return d < 1e-12 || std::fabs(d - kTwoPi) < 1e-12;
}

std::string Angle::to_string() const {
    if (!is_exact()) {
        double r = rad() > kTwoPi / 2 ? rad() - kTwoPi : rad();
        std::string s = fmt::format("{:.17g}", r);
        if (s.find_first_of(".e") == std::string::npos) s += ".0";
        return s;
    }
    int64_t n = num_;
    if (n > den_) n -= 2 * den_;  // print in (-pi, pi]
    if (n == 0) return "0";
    std::string sign = n < 0 ? "-" : "";
    int64_t a = n < 0 ? -n : n;
    std::string head = a == 1 ? "pi" : fmt::format("{}*pi", a);
    if (den_ == 1) return sign + head;
    return fmt::format("{}{}/{}", sign, head, den_);
}

}  // namespace whittle::ir
