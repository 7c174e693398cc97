// The norm equation t^dagger t = xi over Z[omega] for xi in Z[sqrt2] (Ross & Selinger 2016, arXiv:1403.2975).
#pragma once

#include <optional>

#include "synthesis/ring_zomega.h"

namespace whittle::lowering {

/// A t in Z[omega] with conj(t) * t == xi, or nothing when there is none or when factoring the
/// integer norm xi * xi.bullet() takes more than `rho_steps` Pollard-rho iterations (the caller
/// then moves on to its next candidate, as the paper does). Solvable needs xi >= 0 and xi.bullet() >= 0.
std::optional<ZOmega> solve_norm_equation(const ZSqrt2& xi, long rho_steps = 20000);

}  // namespace whittle::lowering
