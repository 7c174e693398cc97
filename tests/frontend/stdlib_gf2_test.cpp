// The library's Karatsuba GF(2^n) multiplier (gf2_mul_karatsuba) against carry-less multiplication
// mod poly by integer arithmetic: the elaborated circuit and its -O2 Clifford+T compile, its Toffoli
// count against the Karatsuba recurrence.
#include "stdlib_harness.h"

#include "ir/resources.h"
#include "passes/pipeline.h"
#include "verify/exact_basis.h"

using namespace stdlib_test;

namespace {

// Carry-less product of a and b reduced mod poly (degree n): polynomial arithmetic over GF(2), bit by
// bit (the textbook definition of GF(2)[x] / (poly)).
u128 gf2_mulmod(u128 a, u128 b, u128 poly, unsigned n) {
    u128 prod = 0;
    for (unsigned i = 0; i < n; ++i)
        if ((a >> i) & 1) prod ^= b << i;
    for (unsigned d = 2 * n - 2; d >= n && d < 128; --d)
        if ((prod >> d) & 1) prod ^= poly << (d - n);
    return prod & mask(n);
}

// Irreducible polynomials of degree 2..10 with bit n set (common practice: x^2+x+1, x^3+x+1,
// x^4+x+1, x^5+x^2+1, x^6+x+1, x^7+x+1, x^8+x^4+x^3+x+1, x^9+x^4+1, x^10+x^3+1; irreducibility is
// also checked below by trial division).
const uint64_t kPoly[] = {0, 0, 7, 11, 19, 37, 67, 131, 0x11B, 0x211, 0x409};

unsigned degree(uint64_t p) { return p ? 63u - unsigned(__builtin_clzll(p)) : 0u; }
uint64_t poly_mod(uint64_t a, uint64_t m) {
    while (a && degree(a) >= degree(m)) a ^= m << (degree(a) - degree(m));
    return a;
}
bool irreducible(uint64_t p) {
    for (uint64_t d = 2; degree(d) * 2 <= degree(p); ++d)
        if (poly_mod(p, d) == 0) return false;
    return true;
}

/// The Karatsuba Toffoli count: K(1) = 1, K(n) = 2K(ceil(n/2)) + K(floor(n/2)) (van Hoof 2019,
/// arXiv:1910.02849, the count of its Karatsuba multiplier; from memory).
uint64_t karatsuba_count(unsigned n) { return n == 1 ? 1 : 2 * karatsuba_count((n + 1) / 2) + karatsuba_count(n / 2); }

std::string program(unsigned n, uint64_t poly) {
    const std::string w = std::to_string(n);
    return "use \"arith\"\nqubit a[" + w + "], b[" + w + "], c[" + w + "]\ngf2_mul_karatsuba(a, b, c, " + std::to_string(poly) + ")\n";
}

Expect mulmod_of(unsigned n, uint64_t poly) {
    return [n, poly](const Values& in) {
        Values out = in;
        out["c"] = in.at("c") ^ gf2_mulmod(in.at("a"), in.at("b"), poly, n);
        return out;
    };
}

}  // namespace

TEST_CASE("gf2: the test's polynomials are irreducible and its reference multiplies") {
    for (unsigned n = 2; n <= 10; ++n) CHECK(irreducible(kPoly[n]));
    CHECK(!irreducible(0x11));                                  // x^4 + 1 = (x + 1)^4
    CHECK(gf2_mulmod(0b10, 0b1000, 19, 4) == 0b0011);           // x * x^3 = x^4 = x + 1 mod x^4+x+1
    CHECK(gf2_mulmod(0x57, 0x83, 0x11B, 8) == 0xC1);            // {57} x {83} = {c1}: FIPS-197 (2001), Sec. 4.2 (from memory)
    const uint64_t want[] = {0, 1, 3, 7, 9, 17, 21, 25, 27, 43, 51};  // the recurrence worked out by hand for n = 1..10
    for (unsigned n = 1; n <= 10; ++n) CHECK(karatsuba_count(n) == want[n]);
}

TEST_CASE("stdlib: gf2_mul_karatsuba gives c + a*b mod poly (every input for n <= 5, also under when)") {
    // check_routine: every input when the registers hold at most 16 bits (n <= 5), else 256 random ones.
    for (unsigned n = 1; n <= 10; ++n) {
        const uint64_t poly = n == 1 ? 3 : kPoly[n];
        CAPTURE(n);
        check_routine({{"a", n}, {"b", n}, {"c", n}}, "gf2_mul_karatsuba(a, b, c, " + std::to_string(poly) + ")",
                      mulmod_of(n, poly));
    }
    // bit n of poly may be left out, as in gf2_mul; n = 16 and 32 on random inputs
    check_routine({{"a", 4}, {"b", 4}, {"c", 4}}, "gf2_mul_karatsuba(a, b, c, 3)", mulmod_of(4, 19));
    check_routine({{"a", 16}, {"b", 16}, {"c", 16}}, "gf2_mul_karatsuba(a, b, c, 65579)", mulmod_of(16, 0x1002B));
    check_routine({{"a", 32}, {"b", 32}, {"c", 32}}, "gf2_mul_karatsuba(a, b, c, 141)",
                  mulmod_of(32, (uint64_t(1) << 32) | 0x8D));
    // a reducible poly where 1 + x^2 is not invertible (x^4 + 1): the routine falls back to gf2_mul
    check_routine({{"a", 4}, {"b", 4}, {"c", 4}}, "gf2_mul_karatsuba(a, b, c, 17)", mulmod_of(4, 17));
}

TEST_CASE("stdlib: gf2_mul_karatsuba has the Karatsuba Toffoli count, no larger gates, n work wires") {
    for (unsigned n = 1; n <= 10; ++n) {
        CAPTURE(n);
        const whittle::ir::Circuit c = load(program(n, n == 1 ? 3 : kPoly[n]));
        uint64_t toffoli = 0, other_controlled = 0;
        for (const auto& op : c.ops) {
            if (op.kind == whittle::ir::OpKind::X && op.controls.size() == 2) ++toffoli;
            else if (op.kind != whittle::ir::OpKind::X || op.controls.size() > 2) ++other_controlled;
        }
        CHECK(toffoli == karatsuba_count(n));
        CHECK(other_controlled == 0);
        unsigned work = 0;
        for (const auto& q : c.qubits) work += q.role == whittle::ir::Role::Clean;
        CHECK(work == (n == 1 ? 0 : n));
        if (n >= 4) CHECK(toffoli < n * n);
    }
}

TEST_CASE("stdlib: gf2_mul_karatsuba compiled to clifford+t at -O2 is right on every input (n <= 5) and on samples") {
    // Each basis input runs through the compiled circuit exactly (Z[w] amplitudes): the output must be
    // the one basis state with c ^= a*b mod poly, a and b unchanged, every other wire back at 0.
    std::mt19937_64 rng(11);
    for (unsigned n = 2; n <= 8; ++n) {
        CAPTURE(n);
        whittle::ir::Circuit c = load(program(n, kPoly[n]));
        whittle::passes::PassOptions o;
        o.target = whittle::ir::parse_optional_target("clifford+t");
        o.level = 2;
        whittle::passes::run_passes(c, whittle::passes::pipeline_for(o), o);
        REQUIRE(whittle::passes::ExactBasisState::supports(c));
        const int ra = c.find_register("a"), rb = c.find_register("b"), rc = c.find_register("c");
        REQUIRE((ra >= 0 && rb >= 0 && rc >= 0));
        const uint32_t fa = c.registers[size_t(ra)].first, fb = c.registers[size_t(rb)].first, fc = c.registers[size_t(rc)].first;
        const uint64_t inputs = n <= 5 ? uint64_t(1) << (3 * n) : 300;
        uint64_t wrong = 0;
        for (uint64_t k = 0; k < inputs; ++k) {
            const uint64_t x = n <= 5 ? k : rng() & ((uint64_t(1) << (3 * n)) - 1);
            const uint64_t a = x & mask(n), b = (x >> n) & mask(n), c0 = (x >> (2 * n)) & mask(n);
            std::vector<uint8_t> bits(c.num_qubits(), 0);
            for (unsigned i = 0; i < n; ++i) {
                bits[fa + i] = (a >> i) & 1;
                bits[fb + i] = (b >> i) & 1;
                bits[fc + i] = (c0 >> i) & 1;
            }
            whittle::passes::ExactBasisState s(c.num_qubits(), bits);
            REQUIRE(s.run(c, 1 << 12));
            const uint64_t want = c0 ^ uint64_t(gf2_mulmod(a, b, kPoly[n], n));
            bool ok = s.size() == 1;
            for (uint32_t w = 0; ok && w < c.num_qubits(); ++w) {
                bool expect = false;
                if (w >= fa && w < fa + n) expect = (a >> (w - fa)) & 1;
                else if (w >= fb && w < fb + n) expect = (b >> (w - fb)) & 1;
                else if (w >= fc && w < fc + n) expect = (want >> (w - fc)) & 1;
                ok = s.bit(0, w) == expect;
            }
            wrong += !ok;
        }
        CHECK(wrong == 0);
        MESSAGE("n=" << n << ": " << inputs << " inputs, T " << whittle::ir::count_resources(c).t_count << " at -O2");
    }
}
