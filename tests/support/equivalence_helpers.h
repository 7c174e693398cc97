// Test helpers for the lowering tests: equivalence on clean-wire inputs, per-branch checks, random circuits.
#pragma once

#include <random>
#include <utility>
#include <vector>

#include "ir/circuit.h"
#include "ir/resources.h"
#include "ir/statevector.h"

namespace whittle::testing {

/// `b` on the wire table of `a`: each wire of b's registers goes to the wire of the register of
/// that name and index in `a`; b's wires that `a` lacks (registers the compiler added) come after
/// a's, as clean wires. `a`'s wires that `b` lacks (dropped by drop-idle-wires) stay idle. When the
/// tables already agree, `b` is returned as it is.
inline ir::Circuit on_wires_of(const ir::Circuit& a, const ir::Circuit& b) {
    bool same = a.num_qubits() == b.num_qubits() && a.registers.size() == b.registers.size();
    for (size_t r = 0; same && r < a.registers.size(); ++r)
        same = a.registers[r].name == b.registers[r].name && a.registers[r].size == b.registers[r].size;
    if (same) return b;
    ir::Circuit out = a.empty_copy();
    out.cregs = b.cregs;
    out.num_cbits = b.num_cbits;
    out.global_phase = b.global_phase;
    std::vector<uint32_t> to(b.num_qubits());
    for (const ir::Register& rb : b.registers) {
        const int ra = a.find_register(rb.name);
        if (ra >= 0 && a.registers[size_t(ra)].size >= rb.size) {
            for (uint32_t i = 0; i < rb.size; ++i) to[rb.first + i] = a.registers[size_t(ra)].first + i;
        } else {
            const uint32_t first = out.add_register(rb.name + "_extra", rb.size, ir::Role::Clean);
            for (uint32_t i = 0; i < rb.size; ++i) to[rb.first + i] = first + i;
        }
    }
    for (ir::Op op : b.ops) {
        ir::LitVec lits;
        for (ir::Lit l : op.controls) lits.push_back(ir::Lit::make(to[l.wire()], l.positive()));
        op.controls = std::move(lits);
        if (op.target != ir::kNoWire) op.target = to[op.target];
        if (op.target2 != ir::kNoWire) op.target2 = to[op.target2];
        out.ops.push_back(std::move(op));
    }
    return out;
}

/// `a` with the clean registers that on_wires_of(a, b) appends for `b` (idle in `a`), and that
/// circuit: both on the same wires (work wires the compiler added or pooled, say by
/// share-work-wires, are |0> on the inputs compared and must come back to |0>).
inline std::pair<ir::Circuit, ir::Circuit> on_common_wires(const ir::Circuit& a, const ir::Circuit& b_in) {
    std::pair<ir::Circuit, ir::Circuit> out{a, on_wires_of(a, b_in)};
    for (size_t r = a.registers.size(); r < out.second.registers.size(); ++r)
        out.first.add_register(out.second.registers[r].name, out.second.registers[r].size, ir::Role::Clean);
    return out;
}

/// Distance up to global phase between the unitaries of a and b (same wires) restricted to the
/// inputs where every Clean-role wire of `a` is |0>; outputs must agree in full (so clean wires
/// must come back to |0>).
inline double distance_on_clean_inputs(const ir::Circuit& a_in, const ir::Circuit& b_in) {
    const auto [a, b] = on_common_wires(a_in, b_in);
    if (b.num_qubits() != a.num_qubits() || a.num_qubits() > 14) return 1e300;  // not this helper's case
    const Eigen::MatrixXcd ua = ir::circuit_unitary(a), ub = ir::circuit_unitary(b);
    uint64_t clean_mask = 0;
    for (uint32_t w = 0; w < a.num_qubits(); ++w)
        if (a.qubits[w].role == ir::Role::Clean) clean_mask |= uint64_t(1) << w;
    std::vector<Eigen::Index> cols;
    for (Eigen::Index j = 0; j < ua.cols(); ++j)
        if ((uint64_t(j) & clean_mask) == 0) cols.push_back(j);
    Eigen::MatrixXcd sa(ua.rows(), Eigen::Index(cols.size())), sb(ub.rows(), Eigen::Index(cols.size()));
    for (size_t k = 0; k < cols.size(); ++k) {
        sa.col(Eigen::Index(k)) = ua.col(cols[k]);
        sb.col(Eigen::Index(k)) = ub.col(cols[k]);
    }
    return ir::distance_up_to_phase(sa, sb);
}

/// Runs `ref` (no measurement) and `lowered` (may measure) from the same random states with clean
/// wires at |0>, many times; returns the largest distance up to phase of the final states over all
/// runs (every measurement branch must give the reference state).
inline double worst_branch_distance(const ir::Circuit& ref_in, const ir::Circuit& lowered_in, int runs, uint64_t seed) {
    const auto [ref, lowered] = on_common_wires(ref_in, lowered_in);
    if (lowered.num_qubits() != ref.num_qubits()) return 1e300;
    double worst = 0;
    std::mt19937_64 rng(seed);
    for (int r = 0; r < runs; ++r) {
        ir::StateVector s(ref.num_qubits());
        s.randomize(rng);
        for (Eigen::Index i = 0; i < s.amplitudes().size(); ++i)
            for (uint32_t w = 0; w < ref.num_qubits(); ++w)
                if (ref.qubits[w].role == ir::Role::Clean && (uint64_t(i) >> w & 1)) s.amplitudes()(i) = 0;
        s.amplitudes().normalize();
        ir::StateVector t = s;
        std::vector<uint8_t> bits_a(ref.num_cbits, 0), bits_b(lowered.num_cbits, 0);
        std::mt19937_64 ra(rng()), rb(rng());
        s.run(ref, bits_a, ra);
        t.run(lowered, bits_b, rb);
        worst = std::max(worst, ir::distance_up_to_phase(s.amplitudes(), t.amplitudes()) *
                                    std::sqrt(double(s.amplitudes().size())));
    }
    return worst;
}

inline ir::Circuit wires(uint32_t data, uint32_t clean = 0, uint32_t dirty = 0) {
    ir::Circuit c;
    c.add_register("q", data, ir::Role::Data);
    if (clean) c.add_register("a", clean, ir::Role::Clean);
    if (dirty) c.add_register("d", dirty, ir::Role::Dirty);
    return c;
}

inline ir::LitVec positive_lits(uint32_t first, uint32_t count) {
    ir::LitVec l;
    for (uint32_t i = 0; i < count; ++i) l.push_back(ir::Lit::pos(first + i));
    return l;
}

/// What random_high_level draws from.
enum class RandomMode { Rotations, CliffordT, Classical };

/// A random high-level circuit over `data` data wires and `clean` clean wires (the clean wires are
/// only used as controls or targets of X-type ops that the circuit later undoes, so they end at
/// |0>): MCX with mixed polarities, multi-controlled phases, controlled one-qubit gates,
/// controlled swaps, parities and native two-qubit gates. CliffordT mode keeps every angle that
/// the lowering halves at pi (MC-Z) or pi/2 (CS) and rotations at multiples of pi/4; Classical
/// mode draws X-type ops only.
inline ir::Circuit random_high_level(std::mt19937_64& rng, uint32_t data, uint32_t clean, size_t ops, RandomMode mode) {
    ir::Circuit c = wires(data, clean);
    std::uniform_int_distribution<uint32_t> wire(0, data - 1), eighth(1, 7);
    std::uniform_real_distribution<double> real(-3.1, 3.1);
    const bool exact = mode != RandomMode::Rotations;
    auto angle = [&] { return exact ? ir::Angle::pi_times(eighth(rng), 4) : ir::Angle::radians(real(rng)); };
    auto distinct = [&](size_t n) {
        std::vector<uint32_t> w;
        while (w.size() < n) {
            uint32_t x = wire(rng);
            if (std::find(w.begin(), w.end(), x) == w.end()) w.push_back(x);
        }
        return w;
    };
    auto lits = [&](const std::vector<uint32_t>& w, size_t from) {
        ir::LitVec l;
        for (size_t i = from; i < w.size(); ++i) l.push_back(ir::Lit::make(w[i], rng() % 3 != 0));
        return l;
    };
    const ir::OpKind one_kinds[] = {ir::OpKind::H, ir::OpKind::Y, ir::OpKind::SX, ir::OpKind::RX,
                                    ir::OpKind::RY, ir::OpKind::RZ, ir::OpKind::U};
    const uint32_t kinds = mode == RandomMode::Classical ? 3 : 13;
    for (size_t i = 0; i < ops; ++i) {
        const uint32_t k = uint32_t(rng() % kinds);
        const size_t nc = std::min<size_t>(data - 1, 1 + rng() % 4);
        std::vector<uint32_t> w = distinct(nc + 1);
        switch (k) {
        case 0: c.ops.push_back(ir::Op::x(w[0], lits(w, 1))); break;
        case 1:
            if (w.size() >= 3) c.ops.push_back(ir::Op::swap(w[0], w[1], lits(w, 2)));
            else c.ops.push_back(ir::Op::swap(w[0], w[1]));
            break;
        case 2:
            if (clean) {
                // Compute into a clean wire, use it, uncompute.
                const uint32_t a = data + uint32_t(rng() % clean);
                ir::Op comp = ir::Op::x(a, w.size() > 1 ? lits(w, 1) : ir::LitVec{});
                c.ops.push_back(comp);
                c.ops.push_back(ir::Op::x(w[0], {ir::Lit::pos(a)}));
                c.ops.push_back(comp);
            } else {
                c.ops.push_back(ir::Op::x(w[0]));
            }
            break;
        case 3: c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1), lits(w, 0))); break;
        case 4:
            if (exact) c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1, 2), lits(distinct(2), 0)));
            else c.ops.push_back(ir::Op::phase(angle(), lits(w, 0)));
            break;
        case 5: {
            const ir::OpKind kk = exact ? (rng() & 1 ? ir::OpKind::H : ir::OpKind::Y) : one_kinds[rng() % 7];
            ir::Op op = ir::Op::one(kk, w[0], angle(), lits(w, 1));
            if (op.kind == ir::OpKind::U) {
                op.set_phi(angle());
                op.set_lambda(angle());
            }
            c.ops.push_back(op);
            break;
        }
        case 6: c.ops.push_back(ir::Op::parity(angle(), w)); break;
        case 7: {
            ir::Op op = ir::Op::one(one_kinds[rng() % 7], w[0], angle());
            if (op.kind == ir::OpKind::U) {
                op.set_phi(angle());
                op.set_lambda(angle());
            }
            c.ops.push_back(op);
            break;
        }
        case 8: c.ops.push_back(ir::Op::phase(angle(), {ir::Lit::make(w[0], rng() & 1)})); break;
        case 9: c.ops.push_back(ir::Op::one(ir::OpKind::R, w[0], angle())); c.ops.back().set_phi(angle()); break;
        case 10: c.ops.push_back(ir::Op::swap(w[0], w[1])); break;
        case 11: c.ops.push_back(ir::Op::two(ir::OpKind::ISwap, w[0], w[1])); break;
        default: c.ops.push_back(ir::Op::two(ir::OpKind::XX, w[0], w[1], angle())); break;
        }
    }
    return c;
}

}  // namespace whittle::testing
