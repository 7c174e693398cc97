// Clifford+T approximation of z-rotations: the Ross-Selinger grid-problem algorithm (Ross & Selinger
// 2016, arXiv:1403.2975) followed by exact synthesis, with a thread-safe cache.
#pragma once

#include <optional>
#include <vector>

#include "synthesis/exact_synthesis.h"

namespace whittle::lowering {

/// A Clifford+T circuit U = omega^global_phase_eighths * (gates[n-1] ... gates[0]) close to Rz(theta).
struct RzApproximation {
    std::vector<CliffordTGate> gates;  ///< circuit order: gates[0] acts first
    /// An upper bound on min over phi of ||e^{i phi} U - Rz(theta)|| (operator norm); <= epsilon.
    /// For approximated angles the bound already holds with phi = 0.
    double error_bound = 0;
    int t_count = 0;
    int global_phase_eighths = 0;  ///< in [0, 8): the exact phase omega^g of U relative to the gates
};

/// The gates of Rz(eighths * pi/4) up to global phase (diag(1, omega^eighths)): at most one T.
std::vector<CliffordTGate> exact_rz(int eighths);

/// k when theta is k*pi/4 to within rounding of a double (|theta - k pi/4| <= 1e-14 (1 + |theta|)).
std::optional<int> exact_eighths(double theta);

/// An epsilon-approximation of Rz(theta) with (near-)minimal T-count, 0 < epsilon < 1. Angles that
/// are multiples of pi/4, or within epsilon of one, get the exact Clifford+T form instead. Equal
/// (theta, epsilon) pairs are synthesized once per process; safe to call from several threads.
/// Throws whittle::UserError for epsilon outside (0, 1) or a non-finite theta.
RzApproximation approximate_rz(double theta, double epsilon);

/// Pollard-rho iterations spent on factoring one candidate's norm before moving on to the next
/// candidate (the paper skips candidates that are hard to factor).
inline constexpr long kDefaultRhoStepsPerCandidate = 2000;

/// The same without the cache (for benchmarks and tests); `rho_steps_per_candidate` trades time for
/// the chance of keeping a candidate whose norm is hard to factor (so, rarely, a lower T-count).
RzApproximation synthesize_rz(double theta, double epsilon, long rho_steps_per_candidate = kDefaultRhoStepsPerCandidate);

}  // namespace whittle::lowering
