// Published benchmark families built from their constructions as plain Toffolis (no pair hints).
#pragma once

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "ir/circuit.h"
#include "ir/error.h"

namespace whittle::test {

/// A family member: the circuit and, for checking it against integer arithmetic, where its parts live.
struct FamilyCircuit {
    std::string name;
    ir::Circuit circuit;
    std::vector<uint32_t> controls, ancillas;  ///< MCX families
    uint32_t target = 0;
    std::vector<uint32_t> a, b, c;             ///< GF(2^n): inputs a, b and the output bits c[0..n-1]
    uint32_t modulus = 0;                      ///< GF(2^n): the polynomial, bit k = coefficient of x^k
    std::vector<uint32_t> sum;                 ///< adders: the bits of the sum, low first (carry out last)
    uint32_t carry_in = ir::kNoWire;           ///< Cuccaro: the carry-in wire c0
    /// The registers the construction starts at |0> and returns to |0> (`ancilla`) or borrows in any
    /// state and restores (`borrow`): what `whittle compile --role NAME=ROLE` declares for an
    /// OpenQASM file, which has no declaration of its own. The circuit itself keeps every wire data.
    std::vector<std::pair<std::string, ir::Role>> roles;
};

inline ir::Op toffoli(uint32_t x, uint32_t y, uint32_t t) { return ir::Op::x(t, {ir::Lit::pos(x), ir::Lit::pos(y)}); }
inline ir::Op cnot(uint32_t x, uint32_t t) { return ir::Op::x(t, {ir::Lit::pos(x)}); }

/// The wires first, first + 1, ..., first + size - 1 (a register's, low index first).
inline std::vector<uint32_t> register_wires(uint32_t first, uint32_t size) {
    std::vector<uint32_t> w;
    for (uint32_t i = 0; i < size; ++i) w.push_back(first + i);
    return w;
}

/// n-control X over a clean V-chain: n - 2 work wires, 2n - 3 Toffolis (practice): compute the
/// chain of partial ANDs, one Toffoli into the target, uncompute the chain. Wires: controls x[n],
/// work wires w[n-2] (clean), target t.
inline FamilyCircuit mcx_vchain(uint32_t n) {
    FamilyCircuit f;
    f.name = "mcx-clean-ladder-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    f.controls = register_wires(c.add_register("x", n, ir::Role::Data), n);  // all data, as OpenQASM gives it
    f.ancillas = register_wires(c.add_register("w", n - 2, ir::Role::Data), n - 2);
    f.target = c.add_register("t", 1, ir::Role::Data);
    f.roles = {{"w", ir::Role::Clean}};
    std::vector<ir::Op> chain;
    chain.push_back(toffoli(f.controls[0], f.controls[1], f.ancillas[0]));
    for (uint32_t i = 1; i + 2 < n; ++i) chain.push_back(toffoli(f.controls[i + 1], f.ancillas[i - 1], f.ancillas[i]));
    for (const ir::Op& o : chain) c.ops.push_back(o);
    c.ops.push_back(toffoli(f.controls[n - 1], f.ancillas[n - 3], f.target));
    for (auto it = chain.rbegin(); it != chain.rend(); ++it) c.ops.push_back(*it);
    return f;
}

/// n-control X with n - 2 dirty (borrowed) wires, 4(n - 2) Toffolis: Barenco et al. 1995,
/// quant-ph/9503016, Lemma 7.2 (construction from memory; checked on every input below). Wires as
/// in mcx_vchain, the work wires w[n-2] borrowed.
inline FamilyCircuit mcx_barenco(uint32_t n) {
    FamilyCircuit f;
    f.name = "mcx-barenco-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    f.controls = register_wires(c.add_register("x", n, ir::Role::Data), n);
    f.ancillas = register_wires(c.add_register("w", n - 2, ir::Role::Data), n - 2);
    f.target = c.add_register("t", 1, ir::Role::Data);
    f.roles = {{"w", ir::Role::Dirty}};
    const auto& x = f.controls;
    const auto& a = f.ancillas;
    auto down_up = [&]() {  // a[n-3] ^= x[2..n-2] & ... toggled through the chain, then restored order
        for (uint32_t i = n - 3; i >= 1; --i) c.ops.push_back(toffoli(x[i + 1], a[i - 1], a[i]));
        c.ops.push_back(toffoli(x[0], x[1], a[0]));
        for (uint32_t i = 1; i + 2 < n; ++i) c.ops.push_back(toffoli(x[i + 1], a[i - 1], a[i]));
    };
    c.ops.push_back(toffoli(x[n - 1], a[n - 3], f.target));
    down_up();
    c.ops.push_back(toffoli(x[n - 1], a[n - 3], f.target));
    down_up();
    return f;
}

/// GF(2^n) multiplier c = a * b mod p(x) for c starting at 0, after Maslov, Mathew, Cheung, Pradhan
/// 2009 (arXiv:0710.1093), as the issue describes it: the high half (c[k] ^= a_i b_j for every
/// i + j = n + k, k = 0..n-2), then c := x^n * c mod p in place with CNOTs (n steps of "times x":
/// a relabelling of the wires plus a CNOT from the old top wire into each tap of p; the first
/// step's top wire c[n-1] is still 0, so its CNOTs are left out), then the low half (c[k] ^= a_i
/// b_j for every i + j = k). n^2 Toffolis; (n - 1) * (taps of p - 2) CNOTs. `modulus` has bit k for
/// x^k (bit n and bit 0 set). The wire holding the coefficient of x^k at the end is c[k].
inline FamilyCircuit gf2_multiplier(uint32_t n, uint32_t modulus) {
    FamilyCircuit f;
    f.name = "gf2-mult-" + std::to_string(n);
    f.modulus = modulus;
    ir::Circuit& c = f.circuit;
    f.a = register_wires(c.add_register("a", n, ir::Role::Data), n);
    f.b = register_wires(c.add_register("b", n, ir::Role::Data), n);
    f.c = register_wires(c.add_register("c", n, ir::Role::Data), n);
    std::vector<uint32_t> pos = f.c;  // pos[m] = the wire holding the coefficient of x^m
    auto products = [&](uint32_t degree, uint32_t wire) {
        for (uint32_t i = 0; i < n; ++i)
            if (degree >= i && degree - i < n) c.ops.push_back(toffoli(f.a[i], f.b[degree - i], wire));
    };
    for (uint32_t k = 0; k + 1 < n; ++k) products(n + k, pos[k]);
    for (uint32_t step = 0; step < n; ++step) {
        const uint32_t top = pos[n - 1];
        for (uint32_t m = n - 1; m >= 1; --m) pos[m] = pos[m - 1];
        pos[0] = top;
        if (step == 0) continue;  // the top wire holds 0 here
        for (uint32_t m = 1; m < n; ++m)
            if (modulus >> m & 1) c.ops.push_back(cnot(top, pos[m]));
    }
    for (uint32_t k = 0; k < n; ++k) products(k, pos[k]);
    WHITTLE_ASSERT(pos == f.c && "n rotations bring the labels back");
    return f;
}

/// The product in GF(2)[x] reduced mod `modulus` (integer check of the multiplier), n <= 32.
inline uint32_t gf2_mul_mod(uint32_t a, uint32_t b, uint32_t n, uint64_t modulus) {
    uint64_t prod = 0;
    for (uint32_t i = 0; i < n; ++i)
        if (a >> i & 1) prod ^= uint64_t(b) << i;
    for (int k = int(2 * n - 2); k >= int(n); --k)
        if (prod >> k & 1) prod ^= modulus << (k - int(n));
    return uint32_t(prod);
}

/// The plain adder of Vedral, Barenco, Ekert 1996 (quant-ph/9511018, Fig. 2): b := a + b with
/// a[n], b[n+1] (b[n] the carry out) and the carries c[n] (clean). CARRY(c_i, a_i, b_i, c_{i+1}) =
/// Toffoli(a_i, b_i; c_{i+1}), CNOT(a_i; b_i), Toffoli(c_i, b_i; c_{i+1}); SUM(c_i, a_i, b_i) =
/// CNOT(a_i; b_i), CNOT(c_i; b_i). The carries ripple up (c_n is b[n]); the top bit gets CNOT(a; b)
/// and SUM; below it each carry is undone (the inverse CARRY) and its SUM written. 4n - 2 Toffolis.
inline FamilyCircuit vbe_adder(uint32_t n) {
    FamilyCircuit f;
    f.name = "vbe-adder-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    f.a = register_wires(c.add_register("a", n, ir::Role::Data), n);
    f.b = register_wires(c.add_register("b", n + 1, ir::Role::Data), n + 1);
    f.c = register_wires(c.add_register("c", n, ir::Role::Data), n);
    f.sum = f.b;
    f.roles = {{"c", ir::Role::Clean}};
    auto carry_to = [&](uint32_t i) { return i + 1 < n ? f.c[i + 1] : f.b[n]; };
    auto carry = [&](uint32_t i) {
        c.ops.push_back(toffoli(f.a[i], f.b[i], carry_to(i)));
        c.ops.push_back(cnot(f.a[i], f.b[i]));
        c.ops.push_back(toffoli(f.c[i], f.b[i], carry_to(i)));
    };
    auto uncarry = [&](uint32_t i) {
        c.ops.push_back(toffoli(f.c[i], f.b[i], carry_to(i)));
        c.ops.push_back(cnot(f.a[i], f.b[i]));
        c.ops.push_back(toffoli(f.a[i], f.b[i], carry_to(i)));
    };
    auto sum = [&](uint32_t i) {
        c.ops.push_back(cnot(f.a[i], f.b[i]));
        c.ops.push_back(cnot(f.c[i], f.b[i]));
    };
    for (uint32_t i = 0; i < n; ++i) carry(i);
    c.ops.push_back(cnot(f.a[n - 1], f.b[n - 1]));
    sum(n - 1);
    for (uint32_t i = n - 1; i-- > 0;) {
        uncarry(i);
        sum(i);
    }
    return f;
}

/// The ripple-carry adder of Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184) in its 2n - 1
/// Toffoli form: b := a + b + c0, z ^= the carry out, over the registers cin (c0, the carry in; the
/// paper's one ancilla), a[n], b[n] and cout (z). MAJ(x, y, w) = CNOT(w; y), CNOT(w; x), Toffoli(x, y; w) leaves the carry in w;
/// UMA(x, y, w) = Toffoli(x, y; w), CNOT(w; x), CNOT(x; y) undoes it and writes the sum bit. The
/// top bit's MAJ and UMA are merged: its carry goes straight into z, so that bit needs one Toffoli
/// instead of two. 2n - 1 Toffolis and 4n + 1 CNOTs (the paper's depth-reduced drawing, with its
/// NOTs, is a different arrangement of the same gates' count of Toffolis; it is not rebuilt here).
inline FamilyCircuit cuccaro_adder(uint32_t n) {
    FamilyCircuit f;
    f.name = "cuccaro-adder-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    f.carry_in = c.add_register("cin", 1, ir::Role::Data);
    f.a = register_wires(c.add_register("a", n, ir::Role::Data), n);
    f.b = register_wires(c.add_register("b", n, ir::Role::Data), n);
    const uint32_t z = c.add_register("cout", 1, ir::Role::Data);
    f.sum = f.b;
    f.sum.push_back(z);
    f.roles = {{"cin", ir::Role::Clean}};
    auto maj = [&](uint32_t x, uint32_t y, uint32_t w) {
        c.ops.push_back(cnot(w, y));
        c.ops.push_back(cnot(w, x));
        c.ops.push_back(toffoli(x, y, w));
    };
    auto uma = [&](uint32_t x, uint32_t y, uint32_t w) {
        c.ops.push_back(toffoli(x, y, w));
        c.ops.push_back(cnot(w, x));
        c.ops.push_back(cnot(x, y));
    };
    auto carry_wire = [&](uint32_t i) { return i == 0 ? f.carry_in : f.a[i - 1]; };  // holds c_i after MAJ i-1
    for (uint32_t i = 0; i + 1 < n; ++i) maj(carry_wire(i), f.b[i], f.a[i]);
    // Top bit: x = c_{n-1} ^ a, y = b ^ a, z ^= a ^ x y = the carry out; then back to c_{n-1}, and
    // b ^= c_{n-1} gives the sum bit a ^ b ^ c_{n-1}.
    const uint32_t top = f.a[n - 1], cw = carry_wire(n - 1), bt = f.b[n - 1];
    c.ops.push_back(cnot(top, bt));
    c.ops.push_back(cnot(top, cw));
    c.ops.push_back(cnot(top, z));
    c.ops.push_back(toffoli(cw, bt, z));
    c.ops.push_back(cnot(top, cw));
    c.ops.push_back(cnot(cw, bt));
    for (uint32_t i = n - 1; i-- > 0;) uma(carry_wire(i), f.b[i], f.a[i]);
    return f;
}

/// floor(log2(n)) for n >= 1, and the number of ones in n's binary form.
inline uint32_t floor_log2(uint32_t n) { return 31 - uint32_t(__builtin_clz(n)); }
inline uint32_t ones(uint32_t n) { return uint32_t(__builtin_popcount(n)); }

/// The out-of-place carry-lookahead adder of Draper, Kutin, Rains, Svore 2004 (quant-ph/0406142,
/// Section 3): s := a + b (n + 1 bits) over a[n], b[n], s[n+1] (register `sum`, starts at 0) and
/// n - w(n) - floor(log n) clean wires for the propagate tree (register `prop`). Steps: s[i+1] ^= a_i b_i (generate); b_i ^=
/// a_i for i >= 1 (propagate); the P rounds (propagates of blocks of 2^t bits into the clean
/// wires), G rounds and C rounds (carries of the blocks, then of every bit, in s); the P rounds
/// undone; s_i ^= b_i (and s_0 ^= a_0 ^ b_0); b restored. 5n - 3w(n) - 3 floor(log n) - 1 Toffolis.
inline FamilyCircuit cla_adder(uint32_t n) {
    WHITTLE_ASSERT(n >= 2 && "the lookahead tree needs two bits");
    FamilyCircuit f;
    f.name = "cla-adder-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    const uint32_t logn = floor_log2(n);
    f.a = register_wires(c.add_register("a", n, ir::Role::Data), n);
    f.b = register_wires(c.add_register("b", n, ir::Role::Data), n);
    f.sum = register_wires(c.add_register("sum", n + 1, ir::Role::Data), n + 1);
    const uint32_t work = n - ones(n) - logn;
    if (work > 0) {
        f.ancillas = register_wires(c.add_register("prop", work, ir::Role::Data), work);
        f.roles = {{"prop", ir::Role::Clean}};
    }
    // P[t][m] = the propagate of bits [2^t m, 2^t (m + 1)): b_m for t = 0, a clean wire for t >= 1.
    std::vector<std::vector<uint32_t>> P(logn);
    P[0] = f.b;
    uint32_t next = 0;
    for (uint32_t t = 1; t < logn; ++t) {
        P[t].assign(n >> t, ir::kNoWire);
        for (uint32_t m = 1; m < (n >> t); ++m) P[t][m] = f.ancillas[next++];
    }
    WHITTLE_ASSERT(next == work && "the P rounds use every clean wire once");
    const std::vector<uint32_t>& G = f.sum;  // G[i] = s[i]: the generate, then the carry into bit i
    std::vector<ir::Op> p_rounds;
    for (uint32_t t = 1; t < logn; ++t)
        for (uint32_t m = 1; m < (n >> t); ++m) p_rounds.push_back(toffoli(P[t - 1][2 * m], P[t - 1][2 * m + 1], P[t][m]));
    for (uint32_t i = 0; i < n; ++i) c.ops.push_back(toffoli(f.a[i], f.b[i], G[i + 1]));
    for (uint32_t i = 1; i < n; ++i) c.ops.push_back(cnot(f.a[i], f.b[i]));
    for (const ir::Op& o : p_rounds) c.ops.push_back(o);
    for (uint32_t t = 1; t <= logn; ++t)  // G rounds
        for (uint32_t m = 0; m < (n >> t); ++m)
            c.ops.push_back(toffoli(G[(m << t) + (1u << (t - 1))], P[t - 1][2 * m + 1], G[(m << t) + (1u << t)]));
    for (uint32_t t = 2 * n / 3 >= 1 ? floor_log2(2 * n / 3) : 0; t >= 1; --t)  // C rounds
        for (uint32_t m = 1; m <= (n - (1u << (t - 1))) >> t; ++m)
            c.ops.push_back(toffoli(G[m << t], P[t - 1][2 * m], G[(m << t) + (1u << (t - 1))]));
    for (auto it = p_rounds.rbegin(); it != p_rounds.rend(); ++it) c.ops.push_back(*it);
    for (uint32_t i = 1; i < n; ++i) c.ops.push_back(cnot(f.b[i], G[i]));
    c.ops.push_back(cnot(f.a[0], G[0]));
    c.ops.push_back(cnot(f.b[0], G[0]));
    for (uint32_t i = 1; i < n; ++i) c.ops.push_back(cnot(f.a[i], f.b[i]));
    return f;
}

/// The 7-T Toffoli (Nielsen & Chuang Fig. 4.9) for every X with two positive controls: what a
/// toolchain that decomposes first hands to the low-level passes. Other ops are copied.
inline ir::Circuit toffolis_to_clifford_t(const ir::Circuit& in) {
    using namespace whittle::ir;
    Circuit out = in;
    out.ops.clear();
    auto h = [](uint32_t w) { return Op::one(OpKind::H, w); };
    auto t = [](uint32_t w, bool dg) { return Op::phase(Angle::pi_times(dg ? -1 : 1, 4), {Lit::pos(w)}); };
    auto cx = [](uint32_t a, uint32_t b) { return Op::x(b, {Lit::pos(a)}); };
    for (const Op& op : in.ops) {
        if (op.kind != OpKind::X || op.controls.size() != 2 || !op.controls[0].positive() ||
            !op.controls[1].positive() || op.is_conditioned()) {
            out.ops.push_back(op);
            continue;
        }
        const uint32_t a = op.controls[0].wire(), b = op.controls[1].wire(), c = op.target;
        for (Op o : {h(c), cx(b, c), t(c, true), cx(a, c), t(c, false), cx(b, c), t(c, true), cx(a, c),
                     t(b, false), t(c, false), h(c), cx(a, b), t(a, false), t(b, true), cx(a, b)})
            out.ops.push_back(o);
    }
    return out;
}

}  // namespace whittle::test
