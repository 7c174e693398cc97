// Tests of the ESOP minimizer: equality on every input, exact optimality by brute force, known size bounds.
#include <doctest/doctest.h>

#include <algorithm>
#include <map>
#include <random>

#include "frontend/esop_minimize.h"

using whittle::frontend::Cube;
using whittle::frontend::cube_cost;
using whittle::frontend::EsopCost;
using whittle::frontend::minimize_esop;

namespace {

uint64_t cost_of(const std::vector<Cube>& cubes, EsopCost cost) {
    uint64_t sum = 0;
    for (const Cube& c : cubes) sum += cube_cost(c, cost);
    return sum;
}

// Independent evaluation: the ESOP's value, literal by literal, on one assignment.
bool value(const std::vector<Cube>& cubes, uint64_t assignment) {
    bool v = false;
    for (const Cube& c : cubes) {
        bool term = true;
        for (unsigned var = 0; var < 64; ++var) {
            if (!(c.care >> var & 1)) continue;
            bool x = assignment >> var & 1;
            bool positive = c.polarity >> var & 1;
            term = term && (positive ? x : !x);
        }
        v ^= term;
    }
    return v;
}

// The cube over variables 0..k-1 with code digits (base 3: 0 absent, 1 positive, 2 negated).
Cube cube_from_code(unsigned code, unsigned k) {
    Cube c;
    for (unsigned v = 0; v < k; ++v, code /= 3) {
        unsigned d = code % 3;
        if (d == 0) continue;
        c.care |= uint64_t(1) << v;
        if (d == 1) c.polarity |= uint64_t(1) << v;
    }
    return c;
}

uint32_t table_of(const std::vector<Cube>& cubes, unsigned k) {
    uint32_t tt = 0;
    for (uint32_t x = 0; x < (1u << k); ++x)
        if (value(cubes, x)) tt |= 1u << x;
    return tt;
}

// Minterm expansion: one full cube per true input (the unminimized input an expander might give).
std::vector<Cube> minterms(uint64_t (*f)(uint64_t), unsigned k, const std::vector<unsigned>& vars) {
    std::vector<Cube> out;
    for (uint64_t x = 0; x < (uint64_t(1) << k); ++x) {
        if (!f(x)) continue;
        Cube c;
        for (unsigned i = 0; i < k; ++i) {
            c.care |= uint64_t(1) << vars[i];
            if (x >> i & 1) c.polarity |= uint64_t(1) << vars[i];
        }
        out.push_back(c);
    }
    return out;
}

}  // namespace

TEST_CASE("esop: every 3-variable function gets the least-cost ESOP found by brute force") {
    // Brute force: every set of at most 5 of the 27 cubes over 3 variables.
    for (EsopCost cost : {EsopCost::Toffolis, EsopCost::Cubes}) {
        std::vector<uint64_t> best(256, UINT64_MAX);
        std::vector<Cube> all;
        for (unsigned code = 0; code < 27; ++code) all.push_back(cube_from_code(code, 3));
        std::vector<uint32_t> tables;
        for (const Cube& c : all) tables.push_back(table_of({c}, 3));
        best[0] = 0;
        // depth-first over increasing index sequences
        std::vector<unsigned> stack;
        auto visit = [&](auto&& self, unsigned start, uint32_t tt, uint64_t c, unsigned depth) -> void {
            if (depth == 5) return;
            for (unsigned i = start; i < 27; ++i) {
                uint32_t t = tt ^ tables[i];
                uint64_t nc = c + cube_cost(all[i], cost);
                best[t] = std::min(best[t], nc);
                self(self, i + 1, t, nc, depth + 1);
            }
        };
        visit(visit, 0, 0, 0, 0);
        for (uint32_t tt = 0; tt < 256; ++tt) {
            std::vector<Cube> input;  // the minterm expansion
            for (uint32_t x = 0; x < 8; ++x)
                if (tt >> x & 1) input.push_back(Cube{7, x});
            std::vector<Cube> out = minimize_esop(input, cost);
            CHECK(table_of(out, 3) == tt);
            CHECK(out.size() <= 5);  // so the brute force above covered the optimum
            CHECK(cost_of(out, cost) == best[tt]);
        }
    }
}

TEST_CASE("esop: sizes of minimum ESOPs of all 4-variable functions") {
    // Distribution of the minimum number of products over the 2^16 functions of 4 variables:
    // 1, 81, 2268, 21744, 37530, 3888, 24 functions need 0..6 products; none needs more.
    // Source: tables of minimum ESOP sizes in the ESOP-minimization literature (Koda & Sasao's
    // upper-bound work, 1990s) -- from memory, not re-read; the counts sum to 2^16 = 65536 and the
    // 81 one-product functions are the 3^4 cubes, which supports the recollection.
    std::map<size_t, uint32_t> histogram;
    for (uint32_t tt = 0; tt < 65536; ++tt) {
        std::vector<Cube> input;
        for (uint32_t x = 0; x < 16; ++x)
            if (tt >> x & 1) input.push_back(Cube{15, x});
        std::vector<Cube> out = minimize_esop(input, EsopCost::Cubes);
        REQUIRE(table_of(out, 4) == tt);
        ++histogram[out.size()];
    }
    std::map<size_t, uint32_t> expected = {{0, 1}, {1, 81}, {2, 2268}, {3, 21744}, {4, 37530}, {5, 3888}, {6, 24}};
    CHECK(histogram == expected);
}

TEST_CASE("esop: random expressions over 5 to 12 variables agree on every input and never cost more") {
    std::mt19937_64 rng(20261201);
    for (int trial = 0; trial < 120; ++trial) {
        unsigned k = 5 + unsigned(rng() % 8);
        // spread the variables over 0..63 so the minimizer cannot assume a compact numbering
        std::vector<unsigned> vars;
        while (vars.size() < k) {
            unsigned v = unsigned(rng() % 64);
            if (std::find(vars.begin(), vars.end(), v) == vars.end()) vars.push_back(v);
        }
        std::vector<Cube> input;
        size_t m = 1 + rng() % 40;
        for (size_t i = 0; i < m; ++i) {
            Cube c;
            for (unsigned v : vars) {
                unsigned d = unsigned(rng() % 3);
                if (d == 0) continue;
                c.care |= uint64_t(1) << v;
                if (d == 1) c.polarity |= uint64_t(1) << v;
            }
            input.push_back(c);
        }
        for (EsopCost cost : {EsopCost::Toffolis, EsopCost::Cubes}) {
            std::vector<Cube> out = minimize_esop(input, cost);
            CHECK(cost_of(out, cost) <= cost_of(input, cost));
            for (const Cube& c : out) CHECK((c.polarity & ~c.care) == 0);
            for (uint64_t x = 0; x < (uint64_t(1) << k); ++x) {
                uint64_t assignment = 0;
                for (unsigned i = 0; i < k; ++i)
                    if (x >> i & 1) assignment |= uint64_t(1) << vars[i];
                REQUIRE(value(out, assignment) == value(input, assignment));
            }
        }
    }
}

TEST_CASE("esop: textbook functions from their minterm expansions") {
    // Parity of 6 variables: 32 minterms; its only ESOP of 6 products is the xor of the literals
    // (the positive-polarity Reed-Muller form), practice.
    auto parity6 = [](uint64_t x) -> uint64_t { return __builtin_popcountll(x) & 1; };
    std::vector<unsigned> vars6 = {3, 9, 10, 20, 41, 63};
    std::vector<Cube> out = minimize_esop(minterms(parity6, 6, vars6));
    CHECK(out.size() == 6);
    for (const Cube& c : out) CHECK(c.literals() == 1);

    // AND of 7 variables given as one minterm stays one cube; its complement (127 minterms) is 1 ^ AND.
    auto and7 = [](uint64_t x) -> uint64_t { return x == 127; };
    auto nand7 = [](uint64_t x) -> uint64_t { return x != 127; };
    std::vector<unsigned> vars7 = {0, 1, 2, 3, 4, 5, 6};
    CHECK(minimize_esop(minterms(and7, 7, vars7)).size() == 1);
    std::vector<Cube> nand = minimize_esop(minterms(nand7, 7, vars7));
    CHECK(nand.size() == 2);

    // Majority of 5 (16 minterms): the result is smaller and equal on every input.
    auto maj5 = [](uint64_t x) -> uint64_t { return __builtin_popcountll(x) >= 3; };
    std::vector<unsigned> vars5 = {0, 1, 2, 3, 4};
    std::vector<Cube> in = minterms(maj5, 5, vars5);
    std::vector<Cube> maj = minimize_esop(in);
    CHECK(maj.size() < in.size());
    for (uint64_t x = 0; x < 32; ++x) CHECK(value(maj, x) == bool(maj5(x)));
}

TEST_CASE("esop: constants and cancellation") {
    using Esop = std::vector<Cube>;
    CHECK(minimize_esop(Esop{}).empty());
    CHECK(minimize_esop(Esop{Cube{}, Cube{}}).empty());  // 1 ^ 1 = 0
    CHECK(minimize_esop(Esop{Cube::literal(5, true), Cube::literal(5, false)}) == Esop{Cube{}});  // x ^ !x = 1
    // a ^ a&b = a&!b: one cube of two literals
    std::vector<Cube> r = minimize_esop(Esop{Cube::literal(0, true), Cube{3, 3}});
    REQUIRE(r.size() == 1);
    CHECK(r[0] == Cube{3, 1});
}
