// Ross-Selinger z-rotation synthesis: candidates u from the grid problem of the epsilon-region in order
// of denominator exponent, t from the norm equation, then exact synthesis of [[u, -t*], [t, u*]].
#include "synthesis/rotation_synthesis.h"

#include <algorithm>
#include <bit>
#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <future>
#include <map>
#include <mutex>
#include <numbers>
#include <string>

#include <fmt/format.h>

#include "ir/error.h"
#include "synthesis/grid_problem.h"
#include "synthesis/norm_equation.h"

namespace whittle::lowering {

namespace {

using G = CliffordTGate;

double round_up(const Real& r) {
    double d = r.convert_to<double>();
    if (Real(d) < r) d = std::nextafter(d, INFINITY);
    return d;
}

// The ellipse around the epsilon-region {u : |u| <= 1, Re(u conj(z)) >= 1 - eps^2/2}: the segment lies in
// the rectangle [1 - eps^2/2, 1] x [-w, w] (along z, across z), and the ellipse through its corners with
// axes sqrt2 times the half-sides contains the rectangle.
Ellipse epsilon_region_ellipse(const Real& cz, const Real& sz, const Real& eps) {
    const Real r2 = sqrt(Real(2));
    Real half_w = eps * sqrt(1 - eps * eps / 4);  // sqrt(1 - (1 - eps^2/2)^2) without cancellation
    Real along = r2 * eps * eps / 4, across = r2 * half_w;
    Real ia = 1 / (along * along), ic = 1 / (across * across);
    Ellipse e;
    e.m[0][0] = cz * cz * ia + sz * sz * ic;
    e.m[0][1] = e.m[1][0] = cz * sz * (ia - ic);
    e.m[1][1] = sz * sz * ia + cz * cz * ic;
    Real r = 1 - eps * eps / 4;
    e.center[0] = r * cz;
    e.center[1] = r * sz;
    return e;
}

Ellipse unit_disk() {
    Ellipse e;
    e.m[0][0] = e.m[1][1] = 1;
    e.m[0][1] = e.m[1][0] = 0;
    e.center[0] = e.center[1] = 0;
    return e;
}

struct Candidate {
    ZOmega u;
    ZSqrt2 abs2;  // conj(u) u
    Real closeness;  // Re(u conj(z)) / sqrt2^k: 1 - error^2 / 2
};

}  // namespace

std::vector<CliffordTGate> exact_rz(int eighths) {
    switch (((eighths % 8) + 8) % 8) {
    case 0: return {};
    case 1: return {G::T};
    case 2: return {G::S};
    case 3: return {G::T, G::S};
    case 4: return {G::Z};
    case 5: return {G::T, G::Z};
    case 6: return {G::Sdg};
    default: return {G::Tdg};
    }
}

std::optional<int> exact_eighths(double theta) {
    if (!std::isfinite(theta)) return std::nullopt;
    const double q = theta / (std::numbers::pi / 4);
    const double k = std::round(q);
    if (std::abs(theta - k * (std::numbers::pi / 4)) > 1e-14 * (1 + std::abs(theta))) return std::nullopt;
    return static_cast<int>(std::fmod(std::fmod(k, 8.0) + 8.0, 8.0));
}

namespace {

/// Most one-dimensional grid points one level may enumerate (a few MiB and well under a second);
/// generic angles need a few hundred at the level where their solutions appear.
constexpr double kMaxGridWork = double(1 << 20);

/// Thrown (and caught below) when the grid problem of an angle is too unbalanced to enumerate.
struct GridTooUnbalanced {};

RzApproximation synthesize_direct(double theta, double epsilon, long rho_steps_per_candidate);

/// Rz(theta) = Rz(theta - c) Rz(c) with both halves synthesized within epsilon/2 (operator norms add
/// under products of unitaries), for a c such that neither half lies near a multiple of pi/4. For
/// angles whose own grid problem is too unbalanced; costs about twice the T gates.
RzApproximation synthesize_split(double theta, double epsilon, long rho_steps_per_candidate) {
    const double quarter = std::numbers::pi / 4;
    auto distance = [&](double a) { return std::abs(a - quarter * std::round(a / quarter)); };
    for (double c : {1.0, 0.7, 1.3, 0.45}) {  // generic angles, far from multiples of pi/4
        if (distance(theta - c) < 1e-3) continue;
        try {
            RzApproximation a = synthesize_direct(theta - c, epsilon / 2, rho_steps_per_candidate);
            RzApproximation b = synthesize_direct(c, epsilon / 2, rho_steps_per_candidate);
            RzApproximation r;
            r.gates = std::move(a.gates);
            r.gates.insert(r.gates.end(), b.gates.begin(), b.gates.end());
            r.t_count = a.t_count + b.t_count;
            r.global_phase_eighths = (a.global_phase_eighths + b.global_phase_eighths) % 8;
            r.error_bound = std::min(a.error_bound + b.error_bound, epsilon);
            return r;
        } catch (const GridTooUnbalanced&) {
            continue;
        }
    }
    throw UserError(fmt::format("cannot approximate rz({}) within {} in Clifford+T with bounded work", theta, epsilon));
}

}  // namespace

RzApproximation synthesize_rz(double theta, double epsilon, long rho_steps_per_candidate) {
    try {
        return synthesize_direct(theta, epsilon, rho_steps_per_candidate);
    } catch (const GridTooUnbalanced&) {
        return synthesize_split(theta, epsilon, rho_steps_per_candidate);
    }
}

namespace {

RzApproximation synthesize_direct(double theta, double epsilon, long rho_steps_per_candidate) {
    if (!(epsilon > 0 && epsilon < 1))
        throw UserError("rotation epsilon must lie strictly between 0 and 1, got " + std::to_string(epsilon));
    if (!std::isfinite(theta)) throw UserError("rotation angle must be a finite number");

    // Rz has period 4 pi, so reducing modulo 4 pi changes nothing (not even the phase).
    const Real pi = boost::math::constants::pi<Real>();
    Real th = Real(theta);
    th -= 4 * pi * boost::multiprecision::round(th / (4 * pi));
    const Real eps = Real(epsilon);

    // A multiple of pi/4 (or an angle within epsilon of one) is exact up to a global phase:
    // ||Rz(a) - e^{i phi} Rz(b)|| is at least 2 |sin((a - b)/4)|, reached at phi = 0.
    Real kq = boost::multiprecision::round(th / (pi / 4));
    Real nearest_error = 2 * abs(sin((th - kq * pi / 4) / 4));
    // exact_eighths alone would also take a distinct angle a few 1e-15 from a multiple (3e-15 is not
    // 0 to within rounding): only a double within a few ulps of the multiple counts as rounding.
    const double k_double = std::round(theta / (std::numbers::pi / 4));
    const bool rounded_multiple =
        exact_eighths(theta) &&
        std::abs(theta - k_double * (std::numbers::pi / 4)) <= 4 * (std::nextafter(std::max(std::abs(theta), 1.0), INFINITY) - std::max(std::abs(theta), 1.0));
    if (rounded_multiple || nearest_error <= eps) {
        RzApproximation r;
        r.gates = exact_rz(kq.convert_to<int>());
        r.t_count = t_count(r.gates);
        r.error_bound = round_up(nearest_error);
        return r;
    }

    const Real cz = cos(th / 2), sz = -sin(th / 2);  // z = e^{-i theta/2}, the top-left entry of Rz(theta)
    GridEnumerator grid(epsilon_region_ellipse(cz, sz, eps), unit_disk());
    const Real min_closeness = 1 - eps * eps / 2;
    const Real r2 = sqrt(Real(2));
    const int max_k = static_cast<int>(4 * std::log2(1 / epsilon)) + 60;
    for (int k = 0; k <= max_k; ++k) {
        // An epsilon-region pointing within a few epsilon of a multiple of pi/4 gives an upright but
        // unbalanced pair: one axis has no point until a level where the other has ~1/epsilon of
        // them. Such an angle is split instead (the work of a level would otherwise double per k).
        if (grid.work(k) > kMaxGridWork) throw GridTooUnbalanced{};
        const ZSqrt2 two_k(BigInt(1) << k);
        const Real scale = boost::multiprecision::pow(r2, k);
        std::vector<Candidate> cands;
        for (ZOmega& u : grid.solutions(k)) {
            if (k > 0 && u.divisible_by_sqrt2()) continue;  // already a candidate at level k - 1
            ZSqrt2 abs2 = u.norm_sqrt2();
            if (!(abs2 <= two_k) || !(abs2.bullet() <= two_k)) continue;  // |u| <= 1 and |u.bullet()| <= 1, exactly
            Real closeness = (to_real(u.re_sqrt2()) * cz + to_real(u.im_sqrt2()) * sz) / (r2 * scale);
            if (closeness < min_closeness) continue;
            cands.push_back({std::move(u), std::move(abs2), std::move(closeness)});
        }
        // Within a level, sde(|u|^2) is 2k - 1 when |u|^2 sqrt2^(2k) is divisible by sqrt2, else 2k: try
        // the smaller T-count first, then the smaller error.
        std::sort(cands.begin(), cands.end(), [](const Candidate& a, const Candidate& b) {
            bool da = a.abs2.divisible_by_sqrt2(), db = b.abs2.divisible_by_sqrt2();
            if (da != db) return da;
            return a.closeness > b.closeness;
        });
        for (const Candidate& c : cands) {
            auto t = solve_norm_equation(two_k - c.abs2, rho_steps_per_candidate);
            if (!t) continue;
            // t and omega^m t solve the same norm equation; the unitaries differ by conjugation with
            // T^m, which keeps the error but not always the T-count. Clifford conjugations (even m) keep
            // the T-count too, so m = 0 and m = 1 cover all eight.
            ExactSynthesis s;
            for (int m = 0; m < 2; ++m) {
                ZOmega tm = t->times_omega_pow(m);
                DOmegaMatrix u;
                u.m[0][0] = c.u;
                u.m[0][1] = -tm.conj();
                u.m[1][0] = tm;
                u.m[1][1] = c.u.conj();
                u.k = k;
                ExactSynthesis sm = synthesize_exact(u);
                if (m == 0 || sm.t_count < s.t_count) s = std::move(sm);
            }
            RzApproximation r;
            r.gates = std::move(s.gates);
            r.t_count = s.t_count;
            r.global_phase_eighths = s.global_phase_eighths;
            Real err2 = 2 - 2 * c.closeness;
            r.error_bound = std::min(round_up(sqrt(err2 > 0 ? err2 : Real(0))), epsilon);
            return r;
        }
    }
    WHITTLE_ASSERT(false && "the grid problem has solutions at every large enough level");
    return {};
}

}  // namespace

RzApproximation approximate_rz(double theta, double epsilon) {
    using Key = std::pair<uint64_t, uint64_t>;
    static std::mutex mutex;
    static std::map<Key, std::shared_future<RzApproximation>> cache;
    const Key key{std::bit_cast<uint64_t>(theta), std::bit_cast<uint64_t>(epsilon)};
    std::promise<RzApproximation> promise;
    std::shared_future<RzApproximation> result;
    bool mine = false;
    {
        std::lock_guard<std::mutex> lock(mutex);
        auto it = cache.find(key);
        if (it != cache.end()) {
            result = it->second;
        } else {
            result = promise.get_future().share();
            cache.emplace(key, result);
            mine = true;
        }
    }
    if (mine) {
        // The first caller computes; later callers of the same pair wait on the shared future.
        try {
            promise.set_value(synthesize_rz(theta, epsilon));
        } catch (...) {
            promise.set_exception(std::current_exception());
        }
    }
    return result.get();
}

}  // namespace whittle::lowering
