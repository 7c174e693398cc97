// Miller-Rabin, Pollard-Brent rho with a step budget, Tonelli-Shanks square roots modulo a prime.
#include "synthesis/integer_factoring.h"

#include <algorithm>
#include <map>

#include "ir/error.h"

namespace whittle::lowering {

namespace {

using boost::multiprecision::powm;

const std::vector<unsigned>& small_primes() {
    static const std::vector<unsigned> primes = [] {
        std::vector<unsigned> ps;
        for (unsigned n = 2; n < 2000; ++n)
            if (std::none_of(ps.begin(), ps.end(), [n](unsigned p) { return n % p == 0; })) ps.push_back(n);
        return ps;
    }();
    return primes;
}

// One Pollard-Brent run with increment c; a non-trivial factor of the odd composite n, if found.
std::optional<BigInt> brent(const BigInt& n, unsigned c, long& steps) {
    BigInt y = 2, x, ys, q = 1, g = 1;
    const long m = 64;
    for (long r = 1; g == 1; r *= 2) {
        x = y;
        for (long i = 0; i < r; ++i) y = (y * y + c) % n;
        for (long k = 0; k < r && g == 1; k += m) {
            ys = y;
            for (long i = 0; i < std::min(m, r - k); ++i) {
                y = (y * y + c) % n;
                q = (q * abs(x - y)) % n;
            }
            steps -= std::min(m, r - k);
            g = gcd(q, n);
            if (steps < 0 && g == 1) return std::nullopt;
        }
    }
    if (g == n) {  // the batch overshot: step back one at a time
        do {
            ys = (ys * ys + c) % n;
            g = gcd(abs(x - ys), n);
        } while (g == 1);
    }
    if (g == n) return std::nullopt;
    return g;
}

bool split_into(const BigInt& n, std::map<BigInt, int>& out, long& steps) {
    if (n == 1) return true;
    if (is_probable_prime(n)) {
        out[n] += 1;
        return true;
    }
    for (unsigned c = 1; c < 20; ++c) {
        if (steps < 0) return false;
        auto d = brent(n, c, steps);
        if (!d) continue;
        return split_into(*d, out, steps) && split_into(n / *d, out, steps);
    }
    return false;
}

}  // namespace

bool is_probable_prime(const BigInt& n) {
    if (n < 2) return false;
    for (unsigned p : {2u, 3u, 5u, 7u, 11u, 13u, 17u, 19u, 23u, 29u, 31u, 37u, 41u}) {
        if (n == p) return true;
        if (n % p == 0) return false;
    }
    const BigInt n_minus_1 = n - 1;
    BigInt d = n_minus_1;
    int s = 0;
    while (d % 2 == 0) {
        d /= 2;
        ++s;
    }
    for (unsigned a : {2u, 3u, 5u, 7u, 11u, 13u, 17u, 19u, 23u, 29u, 31u, 37u, 41u, 43u, 47u, 53u}) {
        if (n <= a) break;  // small n: the bases below n already decided
        BigInt x = powm(BigInt(a), d, n);
        if (x == 1 || x == n_minus_1) continue;
        bool composite = true;
        for (int r = 1; r < s && composite; ++r) {
            x = (x * x) % n;
            if (x == n_minus_1) composite = false;
        }
        if (composite) return false;
    }
    return true;
}

std::optional<BigInt> sqrt_mod_prime(const BigInt& a_in, const BigInt& p) {
    BigInt a = ((a_in % p) + p) % p;
    if (a == 0) return BigInt(0);
    if (p == 2) return a;
    if (powm(a, (p - 1) / 2, p) != 1) return std::nullopt;
    if (p % 4 == 3) return powm(a, (p + 1) / 4, p);
    // Tonelli-Shanks: p - 1 = q 2^s with q odd, z a non-residue.
    BigInt q = p - 1;
    int s = 0;
    while (q % 2 == 0) {
        q /= 2;
        ++s;
    }
    BigInt z = 2;
    while (powm(z, (p - 1) / 2, p) != p - 1) z += 1;
    BigInt c = powm(z, q, p), x = powm(a, (q + 1) / 2, p), t = powm(a, q, p);
    int m = s;
    while (t != 1) {
        int i = 0;
        BigInt t2 = t;
        while (t2 != 1) {
            t2 = (t2 * t2) % p;
            ++i;
        }
        WHITTLE_ASSERT(i < m && "Tonelli-Shanks needs a prime modulus");
        BigInt b = c;
        for (int j = 0; j < m - i - 1; ++j) b = (b * b) % p;
        x = (x * b) % p;
        c = (b * b) % p;
        t = (t * c) % p;
        m = i;
    }
    return x;
}

std::optional<std::vector<std::pair<BigInt, int>>> factor_integer(const BigInt& n_in, long rho_steps) {
    WHITTLE_ASSERT(n_in >= 1 && "factor a positive integer");
    BigInt n = n_in;
    std::map<BigInt, int> found;
    for (unsigned p : small_primes()) {
        if (BigInt(p) * p > n) break;
        while (n % p == 0) {
            n /= p;
            found[BigInt(p)] += 1;
        }
    }
    if (!split_into(n, found, rho_steps)) return std::nullopt;
    return std::vector<std::pair<BigInt, int>>(found.begin(), found.end());
}

}  // namespace whittle::lowering
