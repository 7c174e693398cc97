// Integer number theory for the norm equation: primality, factoring with a work limit, square roots mod p.
#pragma once

#include <optional>
#include <utility>
#include <vector>

#include "synthesis/ring_zomega.h"

namespace whittle::lowering {

/// Miller-Rabin with fixed bases (deterministic below 3.3e24, probabilistic above).
bool is_probable_prime(const BigInt& n);

/// A square root of a modulo an odd prime p (Tonelli-Shanks), or nothing when a is a non-residue.
std::optional<BigInt> sqrt_mod_prime(const BigInt& a, const BigInt& p);

/// The prime factorization of n >= 1 as (prime, exponent) pairs in increasing order, found by trial
/// division and Pollard-Brent rho; nothing when rho needs more than `rho_steps` iterations in total.
std::optional<std::vector<std::pair<BigInt, int>>> factor_integer(const BigInt& n, long rho_steps);

}  // namespace whittle::lowering
