// Exact-where-possible arithmetic for OpenQASM 2.0 parameter expressions.
#include "frontend/qasm2/value.h"

#include <cmath>
#include <limits>

namespace whittle::frontend::qasm2 {
namespace {

constexpr double kPi = 3.14159265358979323846264338327950288;

__int128 gcd128(__int128 a, __int128 b) {
    if (a < 0) a = -a;
    if (b < 0) b = -b;
    while (b != 0) {
        __int128 t = a % b;
        a = b;
        b = t;
    }
    return a;
}

}  // namespace

std::optional<Value> Value::make(Kind k, __int128 num, __int128 den) {
    if (den == 0) return std::nullopt;
    if (den < 0) {
        num = -num;
        den = -den;
    }
    __int128 g = gcd128(num, den);
    if (g > 1) {
        num /= g;
        den /= g;
    }
    constexpr __int128 lim = std::numeric_limits<int64_t>::max();
    if (num > lim || num < -lim || den > lim) return std::nullopt;
    Value v;
    v.kind_ = num == 0 ? Kind::Rational : k;
    v.num_ = int64_t(num);
    v.den_ = num == 0 ? 1 : int64_t(den);
    return v;
}

Value Value::rational(int64_t num, int64_t den) {
    if (auto v = make(Kind::Rational, num, den)) return *v;
    return real(double(num) / double(den));
}

Value Value::pi_times(int64_t num, int64_t den) {
    if (auto v = make(Kind::PiRational, num, den)) return *v;
    return real(double(num) / double(den) * kPi);
}

Value Value::real(double d) {
    Value v;
    v.kind_ = Kind::Real;
    v.real_ = d;
    return v;
}

Value Value::parse_literal(const std::string& text) {
    // digits [. digits] [e [+-] digits]: exact as (mantissa digits) * 10^(exp - fraction digits).
    __int128 mant = 0;
    int scale = 0;
    bool overflow = false;
    size_t i = 0;
    bool frac = false;
    for (; i < text.size(); ++i) {
        char c = text[i];
        if (c == '.') {
            frac = true;
            continue;
        }
        if (c == 'e' || c == 'E') break;
        if (mant > (__int128(1) << 100)) {
            overflow = true;
            break;
        }
        mant = mant * 10 + (c - '0');
        if (frac) --scale;
    }
    if (!overflow && i < text.size()) {
        long e = std::strtol(text.c_str() + i + 1, nullptr, 10);
        if (e > 40 || e < -40) overflow = true;
        else scale += int(e);
    }
    if (!overflow && scale >= -36 && scale <= 36) {
        __int128 num = mant, den = 1;
        for (int k = 0; k < scale && !overflow; ++k) {
            num *= 10;
            if (num > (__int128(1) << 120)) overflow = true;
        }
        for (int k = 0; k < -scale; ++k) den *= 10;
        if (!overflow)
            if (auto v = make(Kind::Rational, num, den)) return *v;
    }
    return real(std::strtod(text.c_str(), nullptr));
}

bool Value::is_zero() const { return kind_ == Kind::Real ? real_ == 0.0 : num_ == 0; }

double Value::to_double() const {
    switch (kind_) {
    case Kind::Rational: return double(num_) / double(den_);
    case Kind::PiRational: return double(num_) / double(den_) * kPi;
    case Kind::Real: return real_;
    }
    return 0.0;
}

bool Value::is_finite() const { return kind_ != Kind::Real || std::isfinite(real_); }

ir::Angle Value::to_angle() const {
    if (kind_ == Kind::PiRational) return ir::Angle::pi_times(num_, den_);
    if (is_zero()) return ir::Angle();
    return ir::Angle::radians(to_double());
}

Value operator+(const Value& a, const Value& b) {
    if (a.is_zero()) return b;
    if (b.is_zero()) return a;
    if (a.kind_ == b.kind_ && a.kind_ != Value::Kind::Real) {
        __int128 num = __int128(a.num_) * b.den_ + __int128(b.num_) * a.den_;
        if (auto v = Value::make(a.kind_, num, __int128(a.den_) * b.den_)) return *v;
    }
    return Value::real(a.to_double() + b.to_double());
}

Value Value::operator-() const {
    if (kind_ == Kind::Real) return real(-real_);
    Value v = *this;
    v.num_ = -num_;  // |num_| <= INT64_MAX by construction, so this cannot overflow
    return v;
}

Value operator-(const Value& a, const Value& b) { return a + (-b); }

Value operator*(const Value& a, const Value& b) {
    using K = Value::Kind;
    if (a.is_zero() || b.is_zero()) return Value();
    if (a.kind_ != K::Real && b.kind_ != K::Real && !(a.kind_ == K::PiRational && b.kind_ == K::PiRational)) {
        K k = (a.kind_ == K::PiRational || b.kind_ == K::PiRational) ? K::PiRational : K::Rational;
        if (auto v = Value::make(k, __int128(a.num_) * b.num_, __int128(a.den_) * b.den_)) return *v;
    }
    return Value::real(a.to_double() * b.to_double());
}

Value operator/(const Value& a, const Value& b) {
    using K = Value::Kind;
    if (a.kind_ != K::Real && b.kind_ != K::Real && !(a.kind_ == K::Rational && b.kind_ == K::PiRational)) {
        // rational/rational and pi/rational keep their kind; pi/pi is a plain rational.
        K k = a.kind_ == K::PiRational && b.kind_ == K::Rational ? K::PiRational : K::Rational;
        if (auto v = Value::make(k, __int128(a.num_) * b.den_, __int128(a.den_) * b.num_)) return *v;
    }
    return Value::real(a.to_double() / b.to_double());
}

Value Value::pow(const Value& e) const {
    if (kind_ == Kind::Rational && e.kind_ == Kind::Rational && e.den_ == 1 && e.num_ >= -64 && e.num_ <= 64 &&
        !(is_zero() && e.num_ < 0)) {
        __int128 num = 1, den = 1;
        bool ok = true;
        int64_t n = e.num_ < 0 ? -e.num_ : e.num_;
        constexpr __int128 lim = std::numeric_limits<int64_t>::max();
        for (int64_t k = 0; k < n && ok; ++k) {
            num *= num_;
            den *= den_;
            ok = num <= lim && num >= -lim && den <= lim;
        }
        if (ok) {
            if (e.num_ < 0) std::swap(num, den);
            if (auto v = make(Kind::Rational, num, den)) return *v;
        }
    }
    if (kind_ == Kind::PiRational && e.kind_ == Kind::Rational && e.num_ == 1 && e.den_ == 1) return *this;
    return real(std::pow(to_double(), e.to_double()));
}

}  // namespace whittle::frontend::qasm2
