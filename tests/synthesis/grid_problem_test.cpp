// Grid problems checked against brute-force enumeration; the skew reduction checked for uprightness.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <set>

#include "synthesis/grid_problem.h"

using namespace whittle::lowering;

namespace {

std::set<std::pair<long, long>> as_set(const std::vector<ZSqrt2>& xs) {
    std::set<std::pair<long, long>> s;
    for (auto& x : xs) s.insert({x.a.convert_to<long>(), x.b.convert_to<long>()});
    return s;
}

// Brute force over a window of (a, b), checked in long double.
std::set<std::pair<long, long>> brute_1d(long double x0, long double x1, long double y0, long double y1) {
    const long double r2 = std::sqrt(2.0L);
    std::set<std::pair<long, long>> s;
    long a_lo = std::floor((x0 + y0) / 2) - 1, a_hi = std::ceil((x1 + y1) / 2) + 1;
    long b_lo = std::floor((x0 - y1) / (2 * r2)) - 1, b_hi = std::ceil((x1 - y0) / (2 * r2)) + 1;
    for (long a = a_lo; a <= a_hi; ++a)
        for (long b = b_lo; b <= b_hi; ++b) {
            long double x = a + b * r2, xb = a - b * r2;
            if (x >= x0 && x <= x1 && xb >= y0 && xb <= y1) s.insert({a, b});
        }
    return s;
}

std::set<std::string> as_strings(const std::vector<ZOmega>& us) {
    std::set<std::string> s;
    for (auto& u : us) s.insert(u.to_string());
    return s;
}

Ellipse make_ellipse(double cx, double cy, double r1_in, double r2_in, double angle) {
    // Semi-axis r1 along the direction `angle`, r2 across it (in high precision: thin ellipses cancel).
    Real c = cos(Real(angle)), s = sin(Real(angle)), r1 = r1_in, r2 = r2_in;
    Ellipse e;
    e.m[0][0] = c * c / (r1 * r1) + s * s / (r2 * r2);
    e.m[0][1] = e.m[1][0] = c * s / (r1 * r1) - c * s / (r2 * r2);
    e.m[1][1] = s * s / (r1 * r1) + c * c / (r2 * r2);
    e.center[0] = Real(cx);
    e.center[1] = Real(cy);
    return e;
}

bool inside(const Ellipse& e, std::complex<long double> p) {
    long double dx = p.real() - e.center[0].convert_to<long double>(), dy = p.imag() - e.center[1].convert_to<long double>();
    return e.m[0][0].convert_to<long double>() * dx * dx + 2 * e.m[0][1].convert_to<long double>() * dx * dy +
               e.m[1][1].convert_to<long double>() * dy * dy <=
           1;
}

}  // namespace

TEST_CASE("1D grid problems match brute force") {
    std::mt19937_64 rng(8);
    std::uniform_real_distribution<double> pos(-20, 20), width(0, 6);
    for (int i = 0; i < 300; ++i) {
        double x0 = pos(rng), y0 = pos(rng), dx = width(rng), dy = width(rng);
        if (i % 3 == 0) dx /= 200, dy *= 40;  // strongly unbalanced widths exercise the lambda scaling
        auto got = solve_grid_1d(Real(x0), Real(x0 + dx), Real(y0), Real(y0 + dy));
        CHECK(as_set(got) == brute_1d(x0, x0 + dx, y0, y0 + dy));
        CHECK(got.size() == as_set(got).size());  // no duplicates
    }
}

TEST_CASE("2D grid enumeration matches brute force over Z[omega]") {
    std::mt19937_64 rng(12);
    std::uniform_real_distribution<double> u01(0, 1);
    Ellipse disk = make_ellipse(0, 0, 1, 1, 0);
    for (int trial = 0; trial < 4; ++trial) {
        Ellipse a = make_ellipse(u01(rng) - 0.5, u01(rng) - 0.5, 0.2 + 0.5 * u01(rng), 0.03 + 0.1 * u01(rng), 6 * u01(rng));
        GridEnumerator en(a, disk);
        for (int k = 0; k <= 4; ++k) {
            const long double s = std::pow(std::sqrt(2.0L), k), sb = (k % 2 ? -s : s);
            std::vector<ZOmega> brute;
            const int bound = static_cast<int>(2 * s) + 2;
            for (int c0 = -bound; c0 <= bound; ++c0)
                for (int c1 = -bound; c1 <= bound; ++c1)
                    for (int c2 = -bound; c2 <= bound; ++c2)
                        for (int c3 = -bound; c3 <= bound; ++c3) {
                            ZOmega v{c0, c1, c2, c3};
                            if (inside(a, v.to_complex() / s) && inside(disk, v.bullet().to_complex() / sb))
                                brute.push_back(v);
                        }
            CHECK(as_strings(en.solutions(k)) == as_strings(brute));
        }
    }
}

TEST_CASE("skew reduction makes thin ellipse pairs upright") {
    // Ross & Selinger 2016 (arXiv:1403.2975), from memory: a skew >= 15 can always be lowered, so the
    // reduction ends below 15; then each bounding box is at most a small factor larger than its ellipse.
    std::mt19937_64 rng(21);
    std::uniform_real_distribution<double> angle(0, 6.283185307179586);
    Ellipse disk = make_ellipse(0, 0, 1, 1, 0);
    for (double width : {1e-3, 1e-6, 1e-10, 1e-15}) {
        for (int i = 0; i < 5; ++i) {
            double phi = angle(rng);
            Ellipse a = make_ellipse(std::cos(phi), std::sin(phi), width, width * width, phi + 1.5707963267948966);
            GridOperator g = reduce_skew(a, disk);
            Real gr[2][2], gb[2][2];
            g.to_real(gr);
            g.bullet().to_real(gb);
            auto skew = [](const Ellipse& e, const Real m[2][2]) {
                Real t[2][2];
                for (int p = 0; p < 2; ++p)
                    for (int q = 0; q < 2; ++q) {
                        t[p][q] = 0;
                        for (int r = 0; r < 2; ++r)
                            for (int s = 0; s < 2; ++s) t[p][q] += m[r][p] * e.m[r][s] * m[s][q];
                    }
                Real det = t[0][0] * t[1][1] - t[0][1] * t[1][0];
                return Real(t[0][1] * t[0][1] / det);
            };
            Real total = skew(a, gr) + skew(disk, gb);
            CHECK(total < 15);
            // Determinant of a grid operator is a unit of Z[sqrt2] (+-lambda^n): its integer norm is +-1.
            ZSqrt2 det2 = g.m[0][0] * g.m[1][1] - g.m[0][1] * g.m[1][0];  // = 2 det
            CHECK(det2.divisible_by_sqrt2());
            CHECK(det2.divided_by_sqrt2().divided_by_sqrt2().is_unit());
        }
    }
}
