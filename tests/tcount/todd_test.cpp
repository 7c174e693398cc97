// TODD on column lists: the signature tensor is kept, and known reducible tensors are reduced.
#include <doctest/doctest.h>

#include <bit>
#include <chrono>
#include <random>

#include "tcount/phase_polynomial.h"
#include "tcount/todd.h"

using namespace whittle::tcount;

namespace {

std::vector<Z8Term> as_terms(const std::vector<uint64_t>& cols) {
    std::vector<Z8Term> t;
    for (uint64_t c : cols) t.push_back({c, 1});
    return t;
}

}  // namespace

TEST_CASE("make_proper drops zero columns and equal columns in pairs") {
    std::vector<uint64_t> c = {3, 0, 5, 3, 3, 6, 6};
    make_proper(c);
    CHECK(c == std::vector<uint64_t>{3, 5});
}

TEST_CASE("all 15 non-zero parities of 4 variables: the identity, 15 T -> 0 T") {
    // Integer arithmetic: for x != 0 exactly 8 of the 15 parities are odd, so the sum is 8 = 0 mod 8
    // at every x; the phase is the identity and its signature tensor is zero.
    std::vector<uint64_t> cols;
    for (uint64_t p = 1; p < 16; ++p) cols.push_back(p);
    for (uint64_t x = 0; x < 16; ++x) CHECK(eval_z8(as_terms(cols), x) == 0);
    ToddResult r = todd_reduce(cols, 4);
    CHECK(r.columns.empty());
}

TEST_CASE("random column lists: TODD keeps the signature tensor and never adds columns") {
    std::mt19937_64 rng(5);
    int reduced = 0;
    for (int round = 0; round < 60; ++round) {
        const uint32_t n = 3 + uint32_t(rng() % 6);
        const size_t m = 2 + rng() % 40;
        std::vector<uint64_t> cols;
        for (size_t j = 0; j < m; ++j) cols.push_back(rng() & ((uint64_t(1) << n) - 1));
        std::vector<uint64_t> proper = cols;
        make_proper(proper);
        ToddResult r = todd_reduce(cols, n);
        CHECK(r.columns.size() <= proper.size());
        CHECK(same_signature(proper, r.columns, n));
        CHECK(even_difference(n, as_terms(proper), as_terms(r.columns)).has_value());
        reduced += r.columns.size() < proper.size();
    }
    CHECK(reduced > 10);
}

TEST_CASE("the admissible updates of one step are exactly those that keep the signature tensor (all y, small m)") {
    // Brute force over every y in F_2^m against the span of admissible_updates: the derivation at the
    // top of todd.cpp claims N_z = M^{-1}(V_z) is all of them.
    std::mt19937_64 rng(9);
    for (int round = 0; round < 40; ++round) {
        const uint32_t n = 3 + uint32_t(rng() % 3);
        const size_t m = 4 + rng() % 8;
        std::vector<uint64_t> cols;
        for (size_t j = 0; j < m; ++j) cols.push_back(1 + rng() % ((uint64_t(1) << n) - 1));
        const uint64_t z = 1 + rng() % ((uint64_t(1) << n) - 1);
        std::vector<uint64_t> basis;
        for (const auto& y : admissible_updates(cols, n, z)) {
            uint64_t b = 0;
            for (size_t j = 0; j < m; ++j) b |= uint64_t(y[j]) << j;
            basis.push_back(b);
        }
        std::vector<uint8_t> in_span(size_t(1) << m, 0);
        in_span[0] = 1;
        for (uint64_t b : basis)
            for (uint64_t y = 0; y < (uint64_t(1) << m); ++y)
                if (in_span[y]) in_span[y ^ b] = 1;
        for (uint64_t y = 0; y < (uint64_t(1) << m); ++y) {
            std::vector<uint64_t> next = cols;
            for (size_t j = 0; j < m; ++j)
                if (y >> j & 1) next[j] ^= z;
            if (std::popcount(y) & 1) next.push_back(z);
            INFO("n=" << n << " m=" << m << " y=" << y);
            CHECK(bool(in_span[y]) == same_signature(cols, next, n));
        }
    }
}
