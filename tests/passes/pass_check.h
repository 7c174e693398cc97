// Test support for the passes: random circuits built to contain cancellations, and exact equivalence checks.
#pragma once

#include <cmath>
#include <random>
#include <vector>

#include <doctest/doctest.h>

#include "ir/circuit.h"
#include "ir/classical_sim.h"
#include "ir/resources.h"
#include "ir/statevector.h"
#include "passes/pass.h"

namespace whittle::test {

using namespace whittle::ir;

inline Circuit wires(uint32_t n) {
    Circuit c;
    c.add_register("q", n, Role::Data);
    return c;
}

/// Largest difference between the two circuits' images of `states` random states, global phase
/// included (the passes keep Circuit::global_phase exact, so the check is stricter than "up to phase").
inline double state_distance(const Circuit& a, const Circuit& b, std::mt19937_64& rng, int states = 2) {
    double worst = 0;
    for (int k = 0; k < states; ++k) {
        StateVector sa(a.num_qubits());
        sa.randomize(rng);
        StateVector sb = sa;
        sa.run(a);
        sb.run(b);
        worst = std::max(worst, (sa.amplitudes() - sb.amplitudes()).norm());
    }
    return worst;
}

/// As state_distance, up to one global phase per state (for the lowering, which may drop it).
inline double state_distance_up_to_phase(const Circuit& a, const Circuit& b, std::mt19937_64& rng, int states = 2) {
    double worst = 0;
    for (int k = 0; k < states; ++k) {
        StateVector sa(a.num_qubits());
        sa.randomize(rng);
        StateVector sb = sa;
        sa.run(a);
        sb.run(b);
        const std::complex<double> ip = sb.amplitudes().dot(sa.amplitudes());
        const std::complex<double> ph = std::abs(ip) > 1e-300 ? ip / std::abs(ip) : 1.0;
        worst = std::max(worst, (sa.amplitudes() - ph * sb.amplitudes()).norm());
    }
    return worst;
}

/// Equal permutations on every basis input (X-type circuits; the independent bit-parallel simulator).
inline bool same_permutation(const Circuit& a, const Circuit& b) {
    const uint32_t n = a.num_qubits();
    const uint64_t inputs = uint64_t(1) << n;
    for (uint64_t base = 0; base < inputs; base += 64) {
        std::vector<uint64_t> wa(n), wb;
        for (uint32_t w = 0; w < n; ++w)
            for (uint64_t j = 0; j < 64 && base + j < inputs; ++j)
                if (((base + j) >> w) & 1) wa[w] |= uint64_t(1) << j;
        wb = wa;
        simulate_bits(a, wa);
        simulate_bits(b, wb);
        if (wa != wb) return false;
    }
    return true;
}

struct RandomSpec {
    uint32_t min_qubits = 2, max_qubits = 8;
    uint32_t min_ops = 5, max_ops = 60;
    bool classical_only = false;  ///< only X-type ops
    bool clifford_t_only = false; ///< H, CNOT, X, phases by multiples of pi/4 on one wire
    double echo = 0.35;           ///< chance of re-emitting a recent op (inverse, copy or polarity twin)
};

/// A random circuit whose ops often meet their inverses, copies and polarity twins across
/// commuting ops, so the passes have work to do.
inline Circuit random_circuit(std::mt19937_64& rng, const RandomSpec& spec = {}) {
    auto pick = [&](uint32_t lo, uint32_t hi) { return std::uniform_int_distribution<uint32_t>(lo, hi)(rng); };
    auto coin = [&](double p) { return std::bernoulli_distribution(p)(rng); };
    const uint32_t n = pick(spec.min_qubits, spec.max_qubits);
    Circuit c = wires(n);
    const uint32_t count = pick(spec.min_ops, spec.max_ops);
    auto distinct = [&](uint32_t k) {
        std::vector<uint32_t> all(n);
        for (uint32_t i = 0; i < n; ++i) all[i] = i;
        std::shuffle(all.begin(), all.end(), rng);
        all.resize(std::min(k, n));
        return all;
    };
    auto angle = [&]() {
        if (coin(0.1)) return Angle::radians(std::uniform_real_distribution<double>(-4, 4)(rng));
        return Angle::pi_times(int64_t(pick(1, 15)), coin(0.7) ? 4 : 8);
    };
    auto lits = [&](const std::vector<uint32_t>& ws, size_t from) {
        LitVec l;
        for (size_t i = from; i < ws.size(); ++i) l.push_back(Lit::make(ws[i], coin(0.75)));
        return l;
    };
    while (c.ops.size() < count) {
        if (!c.ops.empty() && coin(spec.echo)) {
            const Op& recent = c.ops[c.ops.size() - 1 - pick(0, std::min<uint32_t>(5, uint32_t(c.ops.size()) - 1))];
            Op e = recent;
            const uint32_t how = pick(0, 2);
            if (how == 0) {
                std::vector<Op> inv;
                append_inverse(recent, inv);
                for (Op& o : inv) c.ops.push_back(o);
                continue;
            }
            if (how == 1 && !e.controls.empty() && e.kind != OpKind::Parity && e.kind != OpKind::Barrier) {
                Lit& l = e.controls[pick(0, uint32_t(e.controls.size()) - 1)];
                l = l.flipped();
            }
            c.ops.push_back(e);
            continue;
        }
        uint32_t kind = spec.classical_only ? 0 : pick(0, spec.clifford_t_only ? 3 : 11);
        if (spec.clifford_t_only) {
            if (kind == 0) c.ops.push_back(Op::x(pick(0, n - 1)));
            else if (kind == 1) c.ops.push_back(Op::one(OpKind::H, pick(0, n - 1)));
            else if (kind == 2 && n >= 2) {
                auto ws = distinct(2);
                c.ops.push_back(Op::x(ws[0], {Lit::pos(ws[1])}));
            } else c.ops.push_back(Op::phase(Angle::pi_times(int64_t(pick(1, 7)), 4), {Lit::pos(pick(0, n - 1))}));
            continue;
        }
        auto ws = distinct(pick(1, std::min<uint32_t>(4, n)));
        switch (kind) {
        case 0:
        case 1: c.ops.push_back(Op::x(ws[0], lits(ws, 1))); break;
        case 2:
        case 3: c.ops.push_back(Op::phase(angle(), lits(ws, 0))); break;
        case 4: c.ops.push_back(Op::parity(angle(), ws)); break;
        case 5: c.ops.push_back(Op::one(OpKind::H, ws[0], {}, coin(0.8) ? LitVec{} : lits(ws, 1))); break;
        case 6: c.ops.push_back(Op::one(coin(0.5) ? OpKind::RX : OpKind::RY, ws[0], angle(), coin(0.7) ? LitVec{} : lits(ws, 1))); break;
        case 7: c.ops.push_back(Op::one(OpKind::RZ, ws[0], angle(), coin(0.6) ? LitVec{} : lits(ws, 1))); break;
        case 8: c.ops.push_back(Op::one(coin(0.5) ? OpKind::Y : (coin(0.5) ? OpKind::SX : OpKind::SXdg), ws[0])); break;
        case 9:
            if (ws.size() >= 2) c.ops.push_back(Op::swap(ws[0], ws[1], lits(ws, 2)));
            break;
        case 10: c.ops.push_back(Op::u(ws[0], coin(0.3) ? Angle() : angle(), angle(), angle())); break;
        default: c.ops.push_back(Op::x(ws[0])); break;
        }
    }
    return c;
}

/// Runs `pass` on random circuits and checks each result against the input (state vectors,
/// global phase included; all basis inputs too for X-type circuits). Returns how many circuits changed.
template <class Pass>
int check_pass_on_random(Pass pass, int circuits, uint64_t seed, const RandomSpec& spec = {}) {
    std::mt19937_64 rng(seed);
    int changed = 0;
    passes::PassOptions opts;
    for (int i = 0; i < circuits; ++i) {
        Circuit before = random_circuit(rng, spec);
        Circuit after = before;
        passes::PassResult r = pass(after, opts);
        verify(after);
        if (r.changed) ++changed;
        else CHECK(after.ops.size() == before.ops.size());
        const double d = state_distance(before, after, rng);
        INFO("circuit " << i << " with " << before.ops.size() << " ops on " << before.num_qubits() << " wires");
        CHECK(d < 1e-9);
        if (is_classical(before)) CHECK(same_permutation(before, after));
    }
    return changed;
}

}  // namespace whittle::test
