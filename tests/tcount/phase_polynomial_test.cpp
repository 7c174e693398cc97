// Region phase polynomials against the circuits' matrices, and the exact even difference of two phase functions.
#include <doctest/doctest.h>

#include <bit>
#include <cmath>
#include <complex>
#include <random>

#include "support/dense_unitary.h"
#include "tcount/phase_polynomial.h"
#include "tcount/todd.h"

using namespace whittle;
using namespace whittle::tcount;
using ir::Angle;
using ir::Lit;
using ir::Op;

namespace {

ir::Circuit wires(uint32_t n) {
    ir::Circuit c;
    c.add_register("q", n, ir::Role::Data);
    return c;
}

/// A random circuit of ops RegionBuilder reads: CNOT and X (either control polarity), swaps,
/// phases by k*pi/4 and pi/8 on one literal, CZ and CS on two, CCZ on three, parities.
ir::Circuit random_region_circuit(std::mt19937_64& rng, uint32_t n, int ops) {
    ir::Circuit c = wires(n);
    auto w = [&] { return uint32_t(rng() % n); };
    auto lit = [&](uint32_t x) { return Lit::make(x, rng() % 4 != 0); };
    auto distinct = [&](uint32_t k) {
        std::vector<uint32_t> all(n);
        for (uint32_t i = 0; i < n; ++i) all[i] = i;
        std::shuffle(all.begin(), all.end(), rng);
        all.resize(k);
        std::sort(all.begin(), all.end());
        return all;
    };
    for (int i = 0; i < ops; ++i) {
        switch (rng() % 9) {
        case 0:
        case 1: {
            auto ab = distinct(2);
            if (rng() & 1) std::swap(ab[0], ab[1]);
            c.ops.push_back(Op::x(ab[1], {lit(ab[0])}));
            break;
        }
        case 2: c.ops.push_back(Op::x(w())); break;
        case 3: {
            auto ab = distinct(2);
            c.ops.push_back(Op::swap(ab[0], ab[1]));
            break;
        }
        case 4: c.ops.push_back(Op::phase(Angle::pi_times(int64_t(rng() % 8), 4), {lit(w())})); break;
        case 5: c.ops.push_back(Op::phase(Angle::pi_times(int64_t(1 + 2 * (rng() % 4)), 8), {lit(w())})); break;
        case 6: {
            auto ab = distinct(2);
            c.ops.push_back(Op::phase(Angle::pi_times(int64_t(rng() % 4), 2), {lit(ab[0]), lit(ab[1])}));
            break;
        }
        case 7:
            if (n >= 3) {
                auto abc = distinct(3);
                c.ops.push_back(Op::phase(Angle::pi_times(1), {lit(abc[0]), lit(abc[1]), lit(abc[2])}));
            }
            break;
        default: c.ops.push_back(Op::parity(Angle::pi_times(int64_t(1 + rng() % 7), 4), distinct(1 + uint32_t(rng() % n)))); break;
        }
    }
    return c;
}

RegionPolynomial polynomial_of(const ir::Circuit& c) {
    RegionBuilder b(c.num_qubits());
    for (const Op& op : c.ops) b.add(op, [](uint32_t x) { return x; });
    return b.finish();
}

}  // namespace

TEST_CASE("CCZ reads as the textbook seven parities: 4xyz = x + y + z - (x^y) - (x^z) - (y^z) + (x^y^z)") {
    // The standard phase-polynomial expansion (Amy, Maslov, Mosca 2014, arXiv:1303.2042; practice).
    ir::Circuit c = wires(3);
    c.ops.push_back(Op::phase(Angle::pi_times(1), {Lit::pos(0), Lit::pos(1), Lit::pos(2)}));
    const RegionPolynomial p = polynomial_of(c);
    CHECK(p.z8.size() == 7);
    for (const auto& [parity, coef] : p.z8) CHECK(coef == (std::popcount(parity) % 2 == 1 ? 1 : 7));
    CHECK(p.odd_parities().size() == 7);
    CHECK(p.global_phase.is_zero());
}

TEST_CASE("the polynomial of random region circuits is their matrix (independent dense simulation)") {
    // Column x of the matrix must be e^{i (global + pi/4 sum c_p (p.x) + sum t_q (q.x))} at L x + b.
    std::mt19937_64 rng(11);
    for (int round = 0; round < 200; ++round) {
        const uint32_t n = 2 + uint32_t(rng() % 4);
        const ir::Circuit c = random_region_circuit(rng, n, 1 + int(rng() % 25));
        const RegionPolynomial p = polynomial_of(c);
        const test::Mat u = test::dense_unitary(c);
        const std::vector<Z8Term> z8 = p.z8_terms();
        for (uint64_t x = 0; x < (uint64_t(1) << n); ++x) {
            uint64_t y = 0;
            for (uint32_t i = 0; i < n; ++i) y |= uint64_t((std::popcount(p.out_parity[i] & x) & 1) ^ p.out_flip[i]) << i;
            double phase = p.global_phase.to_radians() + M_PI / 4 * eval_z8(z8, x);
            for (const auto& [q, a] : p.other) phase += a.to_radians() * (std::popcount(q & x) & 1);
            const std::complex<double> expect = std::polar(1.0, phase);
            INFO("round " << round << " x=" << x);
            CHECK(std::abs(u(Eigen::Index(y), Eigen::Index(x)) - expect) < 1e-9);
        }
    }
}

TEST_CASE("even_difference: exact on every point, for phase functions with one signature tensor") {
    // TODD's output has the input's signature tensor; the difference must be an even quadratic form
    // 2 sum l_i x_i + 4 sum x_i x_j, checked here at every point by integer arithmetic.
    std::mt19937_64 rng(12);
    int nonzero = 0;
    for (int round = 0; round < 80; ++round) {
        const uint32_t n = 3 + uint32_t(rng() % 6);
        std::vector<uint64_t> cols;
        for (size_t j = 0; j < 8 + rng() % 30; ++j) cols.push_back(1 + rng() % ((uint64_t(1) << n) - 1));
        make_proper(cols);
        std::vector<Z8Term> f;
        for (uint64_t c : cols) f.push_back({c, int(1 + 2 * (rng() % 4))});  // odd coefficients: T, T^3, ...
        for (int k = 0; k < 4; ++k) f.push_back({1 + rng() % ((uint64_t(1) << n) - 1), int(2 * (rng() % 4))});
        const ToddResult r = todd_reduce(cols, n);
        std::vector<Z8Term> g;
        for (uint64_t c : r.columns) g.push_back({c, 1});
        const auto d = even_difference(n, f, g);
        REQUIRE(d.has_value());
        std::vector<uint64_t> pair(n, 0);
        for (const auto& [i, j] : d->cz) pair[i] |= uint64_t(1) << j;
        for (uint64_t x = 0; x < (uint64_t(1) << n); ++x) {
            int q = 0;
            for (uint32_t i = 0; i < n; ++i)
                if (x >> i & 1) q += d->lin[i] + 4 * std::popcount(pair[i] & x);
            CHECK(((eval_z8(f, x) - eval_z8(g, x) - q) % 8 + 8) % 8 == 0);
        }
        nonzero += !d->cz.empty();
    }
    CHECK(nonzero > 10);  // the quadratic part is usually there: it must be emitted, not assumed zero
}

TEST_CASE("even_difference refuses a difference with a cubic or an odd part") {
    // T on x0 ^ x1 ^ x2 against nothing: odd at e_0. CCZ's seven terms against nothing: the cubic
    // 4 x0 x1 x2 is seen at the weight-3 point only.
    CHECK_FALSE(even_difference(3, {{7, 1}}, {}).has_value());
    std::vector<Z8Term> ccz;
    for (uint64_t p = 1; p < 8; ++p) ccz.push_back({p, std::popcount(p) % 2 == 1 ? 1 : 7});
    CHECK_FALSE(even_difference(3, ccz, {}).has_value());
    CHECK_FALSE(same_z8_function(3, ccz, {}));
    // S on x0 ^ x1 against S on x0, S on x1 and CZ (2 (x0 ^ x1) = 2 x0 + 2 x1 - 4 x0 x1): a CZ apart.
    const auto d = even_difference(2, {{3, 2}}, {{1, 2}, {2, 2}});
    REQUIRE(d.has_value());
    CHECK(d->lin == std::vector<int>{0, 0});
    CHECK(d->cz.size() == 1);
}

TEST_CASE("same_z8_function agrees with evaluation at every point") {
    std::mt19937_64 rng(13);
    int same = 0;
    for (int round = 0; round < 300; ++round) {
        const uint32_t n = 2 + uint32_t(rng() % 5);
        auto random_terms = [&] {
            std::vector<Z8Term> t;
            for (size_t k = 0; k < 1 + rng() % 6; ++k) t.push_back({1 + rng() % ((uint64_t(1) << n) - 1), int(rng() % 8)});
            return t;
        };
        std::vector<Z8Term> f = random_terms(), g = random_terms();
        if (round % 3 == 0) {  // the same function written another way: 15 parities of 4 variables sum to 0
            g = f;
            if (n >= 4)
                for (uint64_t p = 1; p < 16; ++p) g.push_back({p, 1});
        }
        bool everywhere = true;
        for (uint64_t x = 0; x < (uint64_t(1) << n); ++x) everywhere &= eval_z8(f, x) == eval_z8(g, x);
        CHECK(same_z8_function(n, f, g) == everywhere);
        same += everywhere;
    }
    CHECK(same >= 100);
}
