// Exact angle arithmetic: sums of exact multiples of pi stay exact and reduce mod 2*pi.
#include <doctest/doctest.h>

#include "ir/angle.h"

using whittle::ir::Angle;

TEST_CASE("exact angles add exactly and reduce mod 2 pi") {
    CHECK(Angle::pi_times(1, 4) + Angle::pi_times(1, 4) == Angle::pi_times(1, 2));
    CHECK((Angle::pi_times(1) + Angle::pi_times(1)).is_zero());
    CHECK(Angle::pi_times(-1, 4) == Angle::pi_times(7, 4));
    CHECK(Angle::pi_times(3, 4).eighths() == 3);
    CHECK(Angle::pi_times(1, 8).eighths() == -1);
    CHECK(Angle::pi_times(1, 3).is_exact());
    CHECK((Angle::pi_times(1, 3) * 6).is_zero());
    CHECK(Angle::pi_times(1, 2).divided_by(2) == Angle::pi_times(1, 4));
}

TEST_CASE("angle text") {
    CHECK(Angle::pi_times(1).to_string() == "pi");
    CHECK(Angle::pi_times(-1, 8).to_string() == "-pi/8");
    CHECK(Angle::pi_times(3, 4).to_string() == "3*pi/4");
    CHECK(Angle().to_string() == "0");
    CHECK(Angle::radians(0.25).to_string() == "0.25");
}

TEST_CASE("inexact angles") {
    Angle a = Angle::radians(0.1) + Angle::pi_times(1, 4);
    CHECK_FALSE(a.is_exact());
    CHECK(a.to_radians() == doctest::Approx(0.1 + 3.14159265358979 / 4));
    CHECK(Angle::radians(6.283185307179586).is_zero());
}
