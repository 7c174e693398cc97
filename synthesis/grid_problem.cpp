// Grid problems: 1D interval solutions in Z[sqrt2], skew reduction of ellipse pairs, 2D enumeration.
#include "synthesis/grid_problem.h"

#include <algorithm>

#include "ir/error.h"

namespace whittle::lowering {

namespace {

const Real& sqrt2_real() {
    static const Real r = boost::multiprecision::sqrt(Real(2));
    return r;
}

const Real& log_lambda() {
    static const Real r = boost::multiprecision::log(1 + sqrt2_real());
    return r;
}

Real lambda_real_pow(int n) { return boost::multiprecision::pow(1 + sqrt2_real(), n); }

}  // namespace

Real to_real(const BigInt& n) { return static_cast<Real>(n); }
Real to_real(const ZSqrt2& x) { return to_real(x.a) + to_real(x.b) * sqrt2_real(); }
BigInt floor_to_int(const Real& r) { return static_cast<BigInt>(boost::multiprecision::floor(r)); }
BigInt ceil_to_int(const Real& r) { return static_cast<BigInt>(boost::multiprecision::ceil(r)); }

std::vector<ZSqrt2> solve_grid_1d(const Real& x0, const Real& x1, const Real& y0, const Real& y1) {
    std::vector<ZSqrt2> out;
    if (x1 < x0 || y1 < y0) return out;
    // Scale by lambda^n (bullet: (-1/lambda)^n) so that both intervals get the same width.
    int n = 0;
    Real dx = x1 - x0, dy = y1 - y0;
    if (dx > 0 && dy > 0) n = static_cast<int>(boost::multiprecision::round(log(dy / dx) / (2 * log_lambda())));
    Real s = lambda_real_pow(n), sb = lambda_real_pow(-n);
    Real X0 = x0 * s, X1 = x1 * s, Y0 = y0 * sb, Y1 = y1 * sb;
    if (n % 2 != 0) {
        std::swap(Y0, Y1);
        Y0 = -Y0;
        Y1 = -Y1;
    }
    // x = a + b sqrt2 and x.bullet() = a - b sqrt2, so 2 b sqrt2 = x - x.bullet().
    const Real& r2 = sqrt2_real();
    BigInt b_lo = ceil_to_int((X0 - Y1) / (2 * r2)), b_hi = floor_to_int((X1 - Y0) / (2 * r2));
    ZSqrt2 unscale = ZSqrt2::lambda_pow(-n);
    for (BigInt b = b_lo; b <= b_hi; ++b) {
        Real bs = to_real(b) * r2;
        Real lo = std::max(X0 - bs, Y0 + bs), hi = std::min(X1 - bs, Y1 + bs);
        for (BigInt a = ceil_to_int(lo), a_hi = floor_to_int(hi); a <= a_hi; ++a)
            out.push_back(ZSqrt2(a, b) * unscale);
    }
    return out;
}

bool Ellipse::contains(const Real& x, const Real& y, const Real& slack) const {
    Real dx = x - center[0], dy = y - center[1];
    return m[0][0] * dx * dx + 2 * m[0][1] * dx * dy + m[1][1] * dy * dy <= 1 + slack;
}

// ------------------------------------------------------------------------------------ grid operators

GridOperator GridOperator::identity() {
    GridOperator g;
    g.m[0][0] = ZSqrt2::sqrt2();
    g.m[1][1] = ZSqrt2::sqrt2();
    return g;
}

GridOperator GridOperator::operator*(const GridOperator& o) const {
    GridOperator r;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) {
            ZSqrt2 s = m[i][0] * o.m[0][j] + m[i][1] * o.m[1][j];
            WHITTLE_ASSERT(s.divisible_by_sqrt2() && "a product of grid operators is a grid operator");
            r.m[i][j] = s.divided_by_sqrt2();
        }
    return r;
}

GridOperator GridOperator::bullet() const {
    // (m / sqrt2).bullet() = m.bullet() / (-sqrt2).
    GridOperator r;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) r.m[i][j] = -m[i][j].bullet();
    return r;
}

ZOmega GridOperator::apply(const ZOmega& u) const {
    // With X = sqrt2 Re u and Y = sqrt2 Im u in Z[sqrt2]: sqrt2 (G u) = m (X, Y) / sqrt2.
    ZSqrt2 x = u.re_sqrt2(), y = u.im_sqrt2();
    ZSqrt2 nx = m[0][0] * x + m[0][1] * y, ny = m[1][0] * x + m[1][1] * y;
    WHITTLE_ASSERT(nx.divisible_by_sqrt2() && ny.divisible_by_sqrt2() && "grid operators keep Z[omega]");
    auto r = ZOmega::from_sqrt2_parts(nx.divided_by_sqrt2(), ny.divided_by_sqrt2());
    WHITTLE_ASSERT(r.has_value() && "grid operators keep Z[omega]");
    return *r;
}

void GridOperator::to_real(Real out[2][2]) const {
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) out[i][j] = lowering::to_real(m[i][j]) / sqrt2_real();
}

namespace {

struct Sym {  // a symmetric 2x2 matrix [[a, b], [b, d]]
    Real a, b, d;
};

// g^T s g for a real 2x2 g, normalized to determinant 1.
Sym congruence(const Sym& s, const Real g[2][2]) {
    Real p00 = s.a * g[0][0] + s.b * g[1][0], p01 = s.a * g[0][1] + s.b * g[1][1];
    Real p10 = s.b * g[0][0] + s.d * g[1][0], p11 = s.b * g[0][1] + s.d * g[1][1];
    Sym r{g[0][0] * p00 + g[1][0] * p10, g[0][0] * p01 + g[1][0] * p11, g[0][1] * p01 + g[1][1] * p11};
    Real det = sqrt(r.a * r.d - r.b * r.b);
    r.a /= det;
    r.b /= det;
    r.d /= det;
    return r;
}

// The exponent z in s = [[e lambda^-z, b], [b, e lambda^z]].
Real lambda_exponent(const Sym& s) { return log(s.d / s.a) / (2 * log_lambda()); }

GridOperator make_op(ZSqrt2 a, ZSqrt2 b, ZSqrt2 c, ZSqrt2 d) {
    GridOperator g;
    g.m[0][0] = std::move(a);
    g.m[0][1] = std::move(b);
    g.m[1][0] = std::move(c);
    g.m[1][1] = std::move(d);
    return g;
}

// The operators of the skew reduction (Ross & Selinger 2016, appendix on the step lemma; recalled
// from memory), each given as sqrt2 times its matrix.
GridOperator op_r() { return make_op(1, -1, 1, 1); }                              // rotation by pi/4
GridOperator op_k() { return make_op(ZSqrt2(1, -1), -1, ZSqrt2(1, 1), 1); }      // [[-1/l, -1], [l, 1]]
GridOperator op_a(const BigInt& n) { return make_op({0, 1}, {0, -2 * n}, 0, {0, 1}); }  // [[1, -2n], [0, 1]]
GridOperator op_b(const BigInt& n) { return make_op({0, 1}, 2 * n, 0, {0, 1}); }        // [[1, n sqrt2], [0, 1]]
GridOperator op_x() { return make_op(0, {0, 1}, {0, 1}, 0); }
GridOperator op_z() { return make_op({0, 1}, 0, 0, {0, -1}); }
GridOperator op_shift(int k) { return make_op(ZSqrt2::lambda_pow(k) * ZSqrt2::sqrt2(), 0, 0, {0, 1}); }

struct State {
    Sym d, delta;
    Real skew() const { return d.b * d.b + delta.b * delta.b; }
};

State act(const State& s, const GridOperator& g) {
    Real gr[2][2], gb[2][2];
    g.to_real(gr);
    g.bullet().to_real(gb);
    return {congruence(s.d, gr), congruence(s.delta, gb)};
}

Sym normalized(const Real m[2][2]) {
    Real det = sqrt(m[0][0] * m[1][1] - m[0][1] * m[1][0]);
    return {m[0][0] / det, m[0][1] / det, m[1][1] / det};
}

}  // namespace

// The paper picks the operator by a case analysis on (z, zeta, b, beta); here every operator of its
// list, with the paper's exponents and their neighbours, in all X/Z orientations, is tried and the one
// that lowers the skew most is kept. Correctness of the enumeration does not depend on the choice.
GridOperator reduce_skew(const Ellipse& a, const Ellipse& b) {
    WHITTLE_ASSERT(a.m[0][0] > 0 && a.m[0][0] * a.m[1][1] > a.m[0][1] * a.m[0][1] && "ellipse matrix must be positive definite");
    WHITTLE_ASSERT(b.m[0][0] > 0 && b.m[0][0] * b.m[1][1] > b.m[0][1] * b.m[0][1] && "ellipse matrix must be positive definite");
    State s{normalized(a.m), normalized(b.m)};
    GridOperator g = GridOperator::identity();
    const GridOperator x = op_x(), z = op_z();
    for (int iter = 0; iter < 2000; ++iter) {
        Real skew = s.skew();
        if (!(skew >= 1)) break;  // upright enough (or not a number: the caller's ellipse was degenerate)
        // Shift so that the bias zeta - z lies in (-1, 1]: diag(lambda^k, 1) moves it by 2k, keeps the skew.
        Real bias = lambda_exponent(s.delta) - lambda_exponent(s.d);
        if (abs(bias) > 1) {
            int k = static_cast<int>(boost::multiprecision::floor((1 - bias) / 2));
            GridOperator sh = op_shift(k);
            s = act(s, sh);
            g = g * sh;
        }
        Real zd = lambda_exponent(s.d), zb = lambda_exponent(s.delta);
        std::vector<GridOperator> base{op_r(), op_k(), op_k().bullet()};
        for (const Real& e : {std::min(zd, zb), std::min(-zd, -zb)}) {
            Real p = exp(e * log_lambda());
            BigInt ca = std::max(BigInt(1), floor_to_int(p / 2)), cb = std::max(BigInt(1), floor_to_int(p / sqrt2_real()));
            for (const BigInt& n : {ca, BigInt(ca + 1), BigInt(1)}) {
                base.push_back(op_a(n));
                base.push_back(op_a(-n));
            }
            for (const BigInt& n : {cb, BigInt(cb + 1), BigInt(1)}) {
                base.push_back(op_b(n));
                base.push_back(op_b(-n));
            }
        }
        // Each base operator also in the orientations given by conjugating with X and Z.
        GridOperator best_op = GridOperator::identity();
        State best = s;
        Real best_skew = skew;
        for (const GridOperator& op : base)
            for (int variant = 0; variant < 4; ++variant) {
                GridOperator c = op;
                if (variant & 1) c = x * c * x;
                if (variant & 2) c = z * c * z;
                State t = act(s, c);
                Real ts = t.skew();
                if (ts < best_skew) {
                    best_skew = ts;
                    best = t;
                    best_op = c;
                }
            }
        if (best_skew > Real(0.99) * skew) break;  // no operator helps any more
        s = best;
        g = g * best_op;
    }
    return g;
}

// ------------------------------------------------------------------------------------ enumeration

namespace {

// The ellipse e seen through the grid operator: {v : g v in e}.
Ellipse pull_back(const Ellipse& e, const GridOperator& g) {
    Real gr[2][2];
    g.to_real(gr);
    Ellipse r;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) {
            Real s = 0;
            for (int k = 0; k < 2; ++k)
                for (int l = 0; l < 2; ++l) s += gr[k][i] * e.m[k][l] * gr[l][j];
            r.m[i][j] = s;
        }
    Real det = gr[0][0] * gr[1][1] - gr[0][1] * gr[1][0];
    r.center[0] = (gr[1][1] * e.center[0] - gr[0][1] * e.center[1]) / det;
    r.center[1] = (-gr[1][0] * e.center[0] + gr[0][0] * e.center[1]) / det;
    return r;
}

void half_widths(const Ellipse& e, Real out[2]) {
    Real det = e.m[0][0] * e.m[1][1] - e.m[0][1] * e.m[1][0];
    out[0] = sqrt(e.m[1][1] / det);
    out[1] = sqrt(e.m[0][0] / det);
}

}  // namespace

GridEnumerator::GridEnumerator(const Ellipse& a, const Ellipse& b) : op_(reduce_skew(a, b)) {
    a_ = pull_back(a, op_);
    b_ = pull_back(b, op_.bullet());
    half_widths(a_, a_half_);
    half_widths(b_, b_half_);
}

double GridEnumerator::work(int k) const {
    const Real scale2 = boost::multiprecision::pow(Real(2), k);  // (sqrt2^k)^2: both widths scale by sqrt2^k
    Real w = 0;
    for (int axis = 0; axis < 2; ++axis) w += 2 * (4 * a_half_[axis] * b_half_[axis] * scale2 + 1);
    return w.convert_to<double>();
}

std::vector<ZOmega> GridEnumerator::solutions(int k) const {
    // Level k: v = G^-1 u with v in sqrt2^k a_ and v.bullet() in (-sqrt2)^k b_.
    const Real scale = boost::multiprecision::pow(sqrt2_real(), k);
    const Real scale_b = k % 2 == 0 ? scale : Real(-scale);
    const Real h = 1 / sqrt2_real();
    Real ac[2] = {a_.center[0] * scale, a_.center[1] * scale};
    Real bc[2] = {b_.center[0] * scale_b, b_.center[1] * scale_b};
    Real aw[2] = {a_half_[0] * scale, a_half_[1] * scale};
    Real bw[2] = {b_half_[0] * scale, b_half_[1] * scale};
    const Real slack("1e-40");

    std::vector<ZOmega> out;
    for (int coset = 0; coset < 2; ++coset) {
        // Coset 1 is Z[sqrt2][i] + omega: both coordinates shifted by 1/sqrt2 (bullet: by -1/sqrt2).
        Real off = coset ? h : Real(0);
        std::vector<ZSqrt2> xs[2];
        for (int axis = 0; axis < 2; ++axis)
            xs[axis] = solve_grid_1d(ac[axis] - aw[axis] - off, ac[axis] + aw[axis] - off, bc[axis] - bw[axis] + off,
                                     bc[axis] + bw[axis] + off);
        for (const ZSqrt2& x : xs[0]) {
            Real xr = to_real(x) + off, xb = to_real(x.bullet()) - off;
            for (const ZSqrt2& y : xs[1]) {
                Real yr = to_real(y) + off, yb = to_real(y.bullet()) - off;
                // Membership of v in sqrt2^k a_: (v - c)^T (m / scale^2) (v - c) <= 1.
                if (!a_.contains(xr / scale, yr / scale, slack)) continue;
                if (!b_.contains(xb / scale_b, yb / scale_b, slack)) continue;
                ZOmega v = ZOmega::from_parts(x, y);
                if (coset) v = v + ZOmega(0, 1, 0, 0);
                out.push_back(op_.apply(v));
            }
        }
    }
    return out;
}

}  // namespace whittle::lowering
