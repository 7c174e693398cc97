// Grid problems over Z[sqrt2] and Z[omega] (Ross & Selinger 2016, arXiv:1403.2975): one-dimensional
// intervals, grid operators, the skew reduction that makes an ellipse pair upright, and enumeration.
#pragma once

#include <boost/multiprecision/cpp_bin_float.hpp>
#include <vector>

#include "synthesis/ring_zomega.h"

namespace whittle::lowering {

/// Real numbers for the geometry: about 80 decimal digits, enough for ellipses of width 1e-30
/// (epsilon = 1e-15 squared) with room for the cancellations of the skew reduction.
using Real = boost::multiprecision::number<boost::multiprecision::cpp_bin_float<80>, boost::multiprecision::et_off>;

Real to_real(const BigInt& n);
Real to_real(const ZSqrt2& x);
BigInt floor_to_int(const Real& r);
BigInt ceil_to_int(const Real& r);

/// Every x in Z[sqrt2] with x0 <= x <= x1 and y0 <= x.bullet() <= y1, in no particular order.
/// The work is proportional to 1 + (x1 - x0)(y1 - y0) (the widths are balanced first by a power of lambda).
std::vector<ZSqrt2> solve_grid_1d(const Real& x0, const Real& x1, const Real& y0, const Real& y1);

/// The ellipse {p : (p - center)^T m (p - center) <= 1}, m symmetric positive definite.
struct Ellipse {
    Real m[2][2];
    Real center[2];
    bool contains(const Real& x, const Real& y, const Real& slack = 0) const;
};

/// A grid operator: the real matrix m / sqrt2 with m over Z[sqrt2], mapping Z[omega] (as points of
/// the plane) onto itself. Its bullet acts on the sqrt2-conjugates: (G u).bullet() = G.bullet() u.bullet().
struct GridOperator {
    ZSqrt2 m[2][2];

    static GridOperator identity();
    GridOperator operator*(const GridOperator& o) const;
    GridOperator bullet() const;
    /// G u for u in Z[omega].
    ZOmega apply(const ZOmega& u) const;
    /// The real 2x2 matrix.
    void to_real(Real out[2][2]) const;
};

/// A grid operator G for which the ellipses G^-1(a) and G.bullet()^-1(b) have small skew (their
/// bounding boxes are a bounded factor larger than the ellipses), found by the skew reduction.
GridOperator reduce_skew(const Ellipse& a, const Ellipse& b);

/// Solutions of the scaled two-dimensional grid problems for one ellipse pair: for each k, every u in
/// Z[omega] with u / sqrt2^k in `a` and u.bullet() / (-sqrt2)^k in `b` (up to rounding at the boundary;
/// callers re-check their exact region). Set up once, queried per k.
class GridEnumerator {
public:
    GridEnumerator(const Ellipse& a, const Ellipse& b);
    std::vector<ZOmega> solutions(int k) const;
    /// The size of the one-dimensional problems solutions(k) solves (interval width products summed
    /// over both axes and cosets): its time and memory grow with this. An ellipse pair that is
    /// upright but badly balanced (an epsilon-region whose direction lies within a few epsilon of a
    /// multiple of pi/4) makes one axis huge while the other has no solution yet.
    double work(int k) const;
    const GridOperator& grid_operator() const { return op_; }

private:
    GridOperator op_;
    Ellipse a_, b_;    // the ellipses after the grid operator: G^-1(a) and G.bullet()^-1(b)
    Real a_half_[2], b_half_[2];  // half-widths of their bounding boxes
};

}  // namespace whittle::lowering
