// Values of OpenQASM 2.0 parameter expressions: a rational, a rational multiple of pi, or a double.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "ir/angle.h"

namespace whittle::frontend::qasm2 {

/// Keeps `pi/4`, `-pi/8`, `3*pi/4`, `pi/2+pi/4` and `0.5*pi` exact; anything else (sin, exp, pi*pi,
/// a rational too big for 64 bits) becomes a double. Arithmetic never throws: the caller checks
/// for division by zero and domain errors with the helpers below.
class Value {
public:
    enum class Kind : uint8_t { Rational, PiRational, Real };

    Value() = default;  // exactly 0
    static Value rational(int64_t num, int64_t den = 1);
    static Value pi_times(int64_t num, int64_t den = 1);
    static Value real(double d);
    /// A decimal literal ("0.25", "1e-3", "12"): exact when its digits fit, else a double.
    static Value parse_literal(const std::string& text);

    Kind kind() const { return kind_; }
    /// Numerator and denominator (den > 0) of a Rational or PiRational value.
    int64_t num() const { return num_; }
    int64_t den() const { return den_; }
    bool is_zero() const;
    double to_double() const;
    /// The angle this value denotes in radians: exact for multiples of pi and for 0.
    ir::Angle to_angle() const;
    bool is_finite() const;

    friend Value operator+(const Value& a, const Value& b);
    friend Value operator-(const Value& a, const Value& b);
    friend Value operator*(const Value& a, const Value& b);
    /// b must not be zero (the caller reports division by zero).
    friend Value operator/(const Value& a, const Value& b);
    Value operator-() const;
    Value pow(const Value& e) const;

private:
    static std::optional<Value> make(Kind k, __int128 num, __int128 den);
    Kind kind_ = Kind::Rational;
    int64_t num_ = 0;
    int64_t den_ = 1;
    double real_ = 0.0;
};

}  // namespace whittle::frontend::qasm2
