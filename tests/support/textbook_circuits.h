// Published circuits rebuilt from their papers for tests: the 7-T Toffoli and the ripple-carry adder.
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::testing {

inline ir::Op cx(uint32_t c, uint32_t t) { return ir::Op::x(t, {ir::Lit::pos(c)}); }
inline ir::Op ccx(uint32_t a, uint32_t b, uint32_t t) { return ir::Op::x(t, {ir::Lit::pos(a), ir::Lit::pos(b)}); }
inline ir::Op h(uint32_t w) { return ir::Op::one(ir::OpKind::H, w); }
inline ir::Op t_gate(uint32_t w, bool dagger = false) {
    return ir::Op::phase(ir::Angle::pi_times(dagger ? -1 : 1, 4), {ir::Lit::pos(w)});
}
inline ir::Op s_gate(uint32_t w, bool dagger = false) {
    return ir::Op::phase(ir::Angle::pi_times(dagger ? -1 : 1, 2), {ir::Lit::pos(w)});
}
inline ir::Op z_gate(uint32_t w) { return ir::Op::phase(ir::Angle::pi_times(1), {ir::Lit::pos(w)}); }
inline ir::Op cz(uint32_t a, uint32_t b) {
    return ir::Op::phase(ir::Angle::pi_times(1), {ir::Lit::pos(a), ir::Lit::pos(b)});
}

/// Index of the T gate on the first control inside seven_t_toffoli's 15 ops.
constexpr size_t kToffoliTOnFirstControl = 12;
/// Index of a T gate on the target inside seven_t_toffoli's 15 ops.
constexpr size_t kToffoliTOnTarget = 9;

/// Toffoli(a, b -> c) as 7 T, 6 CNOT, 2 H (Nielsen & Chuang Fig. 4.9; T-count 7 optimal: Gosset,
/// Kliuchnikov, Mosca, Russo 2014, arXiv:1308.4134). `flip` (an index < 15) turns that T into T-dagger.
inline void seven_t_toffoli(std::vector<ir::Op>& out, uint32_t a, uint32_t b, uint32_t c, int flip = -1) {
    std::vector<ir::Op> g = {h(c),         cx(b, c),  t_gate(c, true), cx(a, c), t_gate(c),       cx(b, c),
                             t_gate(c, true), cx(a, c), t_gate(b),     t_gate(c), h(c),           cx(a, b),
                             t_gate(a),    t_gate(b, true), cx(a, b)};
    if (flip >= 0) g[size_t(flip)].angle = -g[size_t(flip)].angle;
    out.insert(out.end(), g.begin(), g.end());
}

/// The ripple-carry adder of Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184), simple form
/// from memory: MAJ(c, b, a) = CNOT(a->b), CNOT(a->c), Toffoli(c, b -> a); UMA(c, b, a) =
/// Toffoli(c, b -> a), CNOT(a->c), CNOT(c->b). Registers: cin (ancilla), a[n], b[n], z. Computes
/// b := a + b mod 2^n and z ^= the carry out; 2n Toffolis. With `clifford_t` every Toffoli is the
/// 7-T circuit; `flip_first` flips the T on the first control of the first Toffoli.
inline ir::Circuit cuccaro_adder(uint32_t n, bool clifford_t, bool flip_first = false) {
    ir::Circuit c;
    const uint32_t cin = c.add_register("cin", 1, ir::Role::Clean, true);
    const uint32_t a = c.add_register("a", n, ir::Role::Data);
    const uint32_t b = c.add_register("b", n, ir::Role::Data);
    const uint32_t z = c.add_register("z", 1, ir::Role::Data, true);
    bool first = true;
    auto toffoli = [&](uint32_t x, uint32_t y, uint32_t t) {
        if (clifford_t) seven_t_toffoli(c.ops, x, y, t, first && flip_first ? int(kToffoliTOnFirstControl) : -1);
        else c.ops.push_back(ccx(x, y, t));
        first = false;
    };
    auto maj = [&](uint32_t x, uint32_t y, uint32_t t) {
        c.ops.push_back(cx(t, y));
        c.ops.push_back(cx(t, x));
        toffoli(x, y, t);
    };
    auto uma = [&](uint32_t x, uint32_t y, uint32_t t) {
        toffoli(x, y, t);
        c.ops.push_back(cx(t, x));
        c.ops.push_back(cx(x, y));
    };
    auto carry_in = [&](uint32_t i) { return i == 0 ? cin : a + i - 1; };
    for (uint32_t i = 0; i < n; ++i) maj(carry_in(i), b + i, a + i);
    c.ops.push_back(cx(a + n - 1, z));
    for (uint32_t i = n; i-- > 0;) uma(carry_in(i), b + i, a + i);
    return c;
}

}  // namespace whittle::testing
