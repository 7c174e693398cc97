// Angle: an exact rational multiple of pi where the source was exact, a double (radians) otherwise.
#pragma once

#include <bit>
#include <cstdint>
#include <string>

namespace whittle::ir {

/// An angle kept exact as (num/den)*pi reduced to [0, 2*pi) whenever it came from exact input;
/// inexact angles carry radians. Exact + exact stays exact (pi/4 + pi/4 is exactly pi/2).
class Angle {
public:
    Angle() = default;  // exactly 0
    /// (num/den)*pi, reduced modulo 2*pi. den must be non-zero.
    static Angle pi_times(int64_t num, int64_t den = 1);
    /// An inexact angle in radians (reduced into [0, 2*pi)).
    static Angle radians(double r);

    bool is_exact() const { return den_ != 0; }
    /// Numerator and denominator of the exact form (num in [0, 2*den)); only for exact angles
    /// (an inexact angle reads as 0 / 0).
    int64_t num() const { return is_exact() ? num_ : 0; }
    int64_t den() const { return den_; }
    double to_radians() const;

    /// True for exactly 0 mod 2*pi, or an inexact angle within 1e-12 of it.
    bool is_zero() const;
    /// True when the angle is an exact multiple of pi/d (d > 0).
    bool is_multiple_of_pi_over(int64_t d) const;
    /// For an exact multiple of pi/4: the integer k in [0, 8) with angle = k*pi/4; else -1.
    int eighths() const;

    Angle operator-() const;
    Angle operator+(const Angle& o) const;
    Angle operator-(const Angle& o) const { return *this + (-o); }
    Angle operator*(int64_t k) const;
    /// Divides by a positive integer (exact stays exact).
    Angle divided_by(int64_t k) const;
    Angle& operator+=(const Angle& o) { return *this = *this + o; }

    /// Exact angles compare exactly; inexact ones within 1e-12 (mod 2*pi).
    bool operator==(const Angle& o) const;
    bool operator!=(const Angle& o) const { return !(*this == o); }
    /// Same representation, bit for bit (operator== lets inexact angles differ by 1e-12).
    bool identical(const Angle& o) const { return num_ == o.num_ && den_ == o.den_; }

    /// Text form that the .wq parser reads back to the same angle: "0", "pi", "3*pi/4", "-pi/8",
    /// or a decimal with 17 significant digits for inexact angles. Exact angles print in (-pi, pi].
    std::string to_string() const;

private:
    // 16 bytes (an ir::Op holds one inline): an inexact angle keeps its radians' bits in num_'s place.
    double rad() const { return std::bit_cast<double>(num_); }
    void set_rad(double r) { num_ = std::bit_cast<int64_t>(r); }

    int64_t num_ = 0;  // exact: the numerator; inexact: the bits of the radians
    int64_t den_ = 1;  // 0 marks an inexact angle
};

}  // namespace whittle::ir
