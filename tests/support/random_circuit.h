// Random valid IR circuits for property tests: every op kind, controls of both polarities, pairs,
// ancillas, classical registers and conditions. Header-only; reuse from any test.
#pragma once

#include <algorithm>
#include <random>
#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::test {

struct RandomCircuitOptions {
    uint32_t min_ops = 0, max_ops = 40;
    uint32_t max_registers = 4;
    uint32_t max_register_size = 4;
    uint32_t max_controls = 3;
    bool low_level = true;       ///< ISwap, XX, R, U, SX/SXdg
    bool measurement = true;     ///< Measure, Reset, classical registers and conditions
    bool pairs = true;           ///< compute/uncompute tags
    bool inexact_angles = true;  ///< radians besides exact multiples of pi
    bool barriers = true;
};

inline ir::Angle random_angle(std::mt19937_64& rng, bool inexact) {
    std::uniform_int_distribution<int> pick(0, inexact ? 4 : 3);
    switch (pick(rng)) {
    case 0: return ir::Angle::pi_times(std::uniform_int_distribution<int64_t>(-8, 8)(rng), 4);
    case 1: return ir::Angle::pi_times(std::uniform_int_distribution<int64_t>(-64, 64)(rng), 32);
    case 2: return ir::Angle::pi_times(std::uniform_int_distribution<int64_t>(-9, 9)(rng), 3);
    case 3: return ir::Angle::pi_times(std::uniform_int_distribution<int64_t>(1, 7)(rng), int64_t(1) << 20);
    default: return ir::Angle::radians(std::uniform_real_distribution<double>(-7.0, 7.0)(rng));
    }
}

/// A random circuit that passes ir::verify. Register names are plain identifiers that are no .wq
/// keyword or gate name.
inline ir::Circuit random_circuit(std::mt19937_64& rng, const RandomCircuitOptions& o = {}) {
    using namespace ir;
    Circuit c;
    auto coin = [&](double p) { return std::bernoulli_distribution(p)(rng); };
    auto uniform = [&](uint32_t lo, uint32_t hi) { return std::uniform_int_distribution<uint32_t>(lo, hi)(rng); };
    static const char* names[] = {"a", "b", "flag", "w", "d", "crane", "berth", "load"};
    uint32_t nregs = uniform(1, std::max<uint32_t>(1, std::min<uint32_t>(o.max_registers, 8)));
    for (uint32_t i = 0; i < nregs; ++i) {
        Role role = Role(uniform(0, 2));
        bool scalar = coin(0.3);
        uint32_t size = scalar ? 1 : uniform(1, o.max_register_size);
        c.add_register(names[i], size, role, scalar);
    }
    for (int spare = 0; c.num_qubits() < 5; ++spare) c.add_register("spare" + std::to_string(spare), 2, Role::Data, false);
    if (o.measurement) {
        c.add_creg("m", 1, true);
        c.add_creg("c", uniform(1, 3), false);
        if (coin(0.5)) c.add_creg("alarm", 1, true);
    }
    const uint32_t n = c.num_qubits();
    std::vector<uint32_t> perm(n);
    auto distinct = [&](uint32_t k) {
        for (uint32_t i = 0; i < n; ++i) perm[i] = i;
        std::shuffle(perm.begin(), perm.end(), rng);
        return std::vector<uint32_t>(perm.begin(), perm.begin() + std::min(k, n));
    };
    std::vector<OpKind> kinds = {OpKind::X, OpKind::Phase, OpKind::Parity, OpKind::H, OpKind::Y, OpKind::RX,
                                 OpKind::RY, OpKind::RZ, OpKind::Swap};
    if (o.low_level)
        for (OpKind k : {OpKind::SX, OpKind::SXdg, OpKind::U, OpKind::ISwap, OpKind::XX, OpKind::R}) kinds.push_back(k);
    if (o.measurement) kinds.insert(kinds.end(), {OpKind::Measure, OpKind::Reset});
    if (o.barriers) kinds.push_back(OpKind::Barrier);
    uint32_t count = uniform(o.min_ops, std::max(o.min_ops, o.max_ops));
    // Pair tags: runs of ops share an id; a later run carries the other half.
    uint32_t open_pair = 0;
    for (uint32_t i = 0; i < count; ++i) {
        OpKind k = kinds[uniform(0, uint32_t(kinds.size() - 1))];
        const uint32_t nctl = uniform(0, std::min(o.max_controls, n - 2));
        std::vector<uint32_t> ws = distinct(nctl + 2);
        auto controls = [&](size_t from, size_t count_ctl) {
            LitVec l;
            for (size_t j = from; j < from + count_ctl && j < ws.size(); ++j) l.push_back(Lit::make(ws[j], coin(0.6)));
            return l;
        };
        auto ang = [&]() { return random_angle(rng, o.inexact_angles); };
        Op op;
        switch (k) {
        case OpKind::X: op = Op::x(ws[0], controls(1, nctl)); break;
        case OpKind::Phase: op = Op::phase(ang(), controls(0, nctl + 1)); break;
        case OpKind::Parity: {
            std::vector<uint32_t> pw(ws.begin(), ws.begin() + nctl + 1);
            op = Op::parity(ang(), pw);
            break;
        }
        case OpKind::H:
        case OpKind::Y:
        case OpKind::SX:
        case OpKind::SXdg:
        case OpKind::RX:
        case OpKind::RY:
        case OpKind::RZ: op = Op::one(k, ws[0], ang(), controls(1, nctl)); break;
        case OpKind::U: {
            op = Op::u(ws[0], ang(), ang(), ang());
            op.controls = controls(1, nctl);
            break;
        }
        case OpKind::Swap: op = Op::swap(ws[0], ws[1], controls(2, nctl)); break;
        case OpKind::ISwap: op = Op::two(OpKind::ISwap, ws[0], ws[1]); break;
        case OpKind::XX: op = Op::two(OpKind::XX, ws[0], ws[1], ang()); break;
        case OpKind::R:
            op = Op::one(OpKind::R, ws[0], ang());
            op.set_phi(ang());
            break;
        case OpKind::Measure: op = Op::measure(ws[0], int32_t(uniform(0, c.num_cbits - 1))); break;
        case OpKind::Reset: op = Op::reset(ws[0]); break;
        case OpKind::Barrier: {
            op.kind = OpKind::Barrier;
            for (uint32_t j = 0; j < nctl; ++j) op.controls.push_back(Lit::pos(ws[j]));
            break;
        }
        }
        // Angles the kind does not use stay exactly 0 (the parser leaves them so).
        if (k == OpKind::X || k == OpKind::H || k == OpKind::Y || k == OpKind::SX || k == OpKind::SXdg ||
            k == OpKind::Swap || k == OpKind::ISwap || k == OpKind::Measure || k == OpKind::Reset || k == OpKind::Barrier)
            op.angle = Angle();
        if (o.measurement && coin(0.15)) {
            const int32_t reg = int32_t(uniform(0, uint32_t(c.cregs.size() - 1)));
            const ClassicalRegister& r = c.cregs[size_t(reg)];
            op.set_condition(reg, uniform(0, (1u << r.size) - 1));
        }
        if (o.pairs) {
            if (open_pair == 0 && coin(0.1)) open_pair = c.new_pair_id();
            if (open_pair != 0) {
                op.pair = open_pair;
                op.half = coin(0.5) ? PairHalf::Compute : PairHalf::Uncompute;
                if (coin(0.3)) open_pair = 0;
            }
        }
        c.ops.push_back(op);
    }
    if (coin(0.5)) c.global_phase = random_angle(rng, o.inexact_angles);
    return c;
}

}  // namespace whittle::test
