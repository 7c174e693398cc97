// Exact synthesis round trips: products of H, S, T re-synthesized and re-multiplied, compared exactly.
#include <doctest/doctest.h>

#include <random>

#include "synthesis/exact_synthesis.h"

using namespace whittle::lowering;
using G = CliffordTGate;

namespace {

using C = std::complex<long double>;
struct M2 {
    C a, b, c, d;
};

// Gate matrices written out independently of DOmegaMatrix (Nielsen & Chuang ch. 4 conventions).
M2 gate_matrix(G g) {
    const long double h = std::sqrt(0.5L);
    const C i(0, 1), w(h, h);
    switch (g) {
    case G::H: return {h, h, h, -h};
    case G::S: return {1, 0, 0, i};
    case G::Sdg: return {1, 0, 0, -i};
    case G::T: return {1, 0, 0, w};
    case G::Tdg: return {1, 0, 0, std::conj(w)};
    case G::X: return {0, 1, 1, 0};
    case G::Y: return {0, -i, i, 0};
    case G::Z: return {1, 0, 0, -1};
    }
    return {};
}

M2 mul(const M2& x, const M2& y) {
    return {x.a * y.a + x.b * y.c, x.a * y.b + x.b * y.d, x.c * y.a + x.d * y.c, x.c * y.b + x.d * y.d};
}

M2 float_product(const std::vector<G>& gates) {
    M2 u{1, 0, 0, 1};
    for (G g : gates) u = mul(gate_matrix(g), u);
    return u;
}

std::vector<G> random_word(std::mt19937_64& rng, int length) {
    const G pool[] = {G::H, G::S, G::T, G::H, G::T};
    std::uniform_int_distribution<int> d(0, 4);
    std::vector<G> w;
    for (int i = 0; i < length; ++i) w.push_back(pool[d(rng)]);
    return w;
}

}  // namespace

TEST_CASE("matrix_of agrees with an independent floating-point product") {
    std::mt19937_64 rng(1);
    for (int n = 0; n < 50; ++n) {
        auto w = random_word(rng, 40);
        DOmegaMatrix u = matrix_of(w);
        CHECK(u.is_unitary());
        M2 f = float_product(w);
        const long double s = std::pow(std::sqrt(0.5L), u.k);
        CHECK(std::abs(u.m[0][0].to_complex() * s - f.a) < 1e-12L);
        CHECK(std::abs(u.m[0][1].to_complex() * s - f.b) < 1e-12L);
        CHECK(std::abs(u.m[1][0].to_complex() * s - f.c) < 1e-12L);
        CHECK(std::abs(u.m[1][1].to_complex() * s - f.d) < 1e-12L);
    }
}

TEST_CASE("exact synthesis round-trips random products of H, S, T") {
    std::mt19937_64 rng(2);
    for (int n = 0; n < 300; ++n) {
        auto w = random_word(rng, 1 + n % 150);
        DOmegaMatrix u = matrix_of(w);
        ExactSynthesis s = synthesize_exact(u);
        CHECK(matrix_of(s.gates, s.global_phase_eighths) == u);
        CHECK(s.t_count == t_count(s.gates));
        CHECK(s.t_count <= t_count(w));  // the input word is itself a witness
    }
}

TEST_CASE("exact synthesis is T-optimal on Matsumoto-Amano normal forms") {
    // Matsumoto & Amano 2008 (arXiv:0806.3834), recalled from memory: a word (T|e)(HT|SHT)^n C has
    // minimal T-count among all words for its unitary, so the synthesis must return exactly that count.
    std::mt19937_64 rng(3);
    const std::vector<G> cliffords[] = {{}, {G::H}, {G::S}, {G::H, G::S}, {G::S, G::H}, {G::X}, {G::H, G::S, G::H}};
    for (int n = 0; n < 200; ++n) {
        int syllables = n % 70;
        std::vector<G> w = cliffords[n % 7];
        for (int i = 0; i < syllables; ++i) {
            w.insert(w.end(), {G::T, G::H});
            if (rng() % 2) w.push_back(G::S);
        }
        bool lead_t = rng() % 2;
        if (lead_t) w.push_back(G::T);
        ExactSynthesis s = synthesize_exact(matrix_of(w, 3));
        CHECK(matrix_of(s.gates, s.global_phase_eighths) == matrix_of(w, 3));
        CHECK(s.t_count == syllables + (lead_t ? 1 : 0));
    }
}

TEST_CASE("exact synthesis of small cases") {
    CHECK(synthesize_exact(DOmegaMatrix::identity()).gates.empty());
    ExactSynthesis t = synthesize_exact(matrix_of({G::T, G::T}));  // T^2 = S
    CHECK(t.t_count == 0);
    CHECK(matrix_of(t.gates, t.global_phase_eighths) == matrix_of({G::S}));
    ExactSynthesis ph = synthesize_exact(DOmegaMatrix::identity().times_omega_pow(5));
    CHECK(ph.gates.empty());
    CHECK(ph.global_phase_eighths == 5);
}
