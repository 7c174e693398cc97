// Published benchmark families built from their constructions as plain Toffolis (no pair hints).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::test {

/// A family member: the circuit and, for checking it against integer arithmetic, where its parts live.
struct FamilyCircuit {
    std::string name;
    ir::Circuit circuit;
    std::vector<uint32_t> controls, ancillas;  ///< MCX families
    uint32_t target = 0;
    std::vector<uint32_t> a, b, c;             ///< GF(2^n): inputs a, b and the output bits c[0..n-1]
    uint32_t modulus = 0;                      ///< GF(2^n): the polynomial, bit k = coefficient of x^k
};

inline ir::Op toffoli(uint32_t x, uint32_t y, uint32_t t) { return ir::Op::x(t, {ir::Lit::pos(x), ir::Lit::pos(y)}); }

/// n-control X over a clean V-chain: n - 2 work wires, 2n - 3 Toffolis (practice): compute the
/// chain of partial ANDs, one Toffoli into the target, uncompute the chain.
inline FamilyCircuit mcx_vchain(uint32_t n) {
    FamilyCircuit f;
    f.name = "mcx-clean-ladder-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    const uint32_t q = c.add_register("q", 2 * n - 1, ir::Role::Data);  // all data, as OpenQASM gives it
    for (uint32_t i = 0; i < n; ++i) f.controls.push_back(q + i);
    for (uint32_t i = 0; i + 2 < n; ++i) f.ancillas.push_back(q + n + i);
    f.target = q + 2 * n - 2;
    std::vector<ir::Op> chain;
    chain.push_back(toffoli(f.controls[0], f.controls[1], f.ancillas[0]));
    for (uint32_t i = 1; i + 2 < n; ++i) chain.push_back(toffoli(f.controls[i + 1], f.ancillas[i - 1], f.ancillas[i]));
    for (const ir::Op& o : chain) c.ops.push_back(o);
    c.ops.push_back(toffoli(f.controls[n - 1], f.ancillas[n - 3], f.target));
    for (auto it = chain.rbegin(); it != chain.rend(); ++it) c.ops.push_back(*it);
    return f;
}

/// n-control X with n - 2 dirty (borrowed) wires, 4(n - 2) Toffolis: Barenco et al. 1995,
/// quant-ph/9503016, Lemma 7.2 (construction from memory; checked on every input below).
inline FamilyCircuit mcx_barenco(uint32_t n) {
    FamilyCircuit f;
    f.name = "mcx-barenco-" + std::to_string(n);
    ir::Circuit& c = f.circuit;
    const uint32_t q = c.add_register("q", 2 * n - 1, ir::Role::Data);
    for (uint32_t i = 0; i < n; ++i) f.controls.push_back(q + i);
    for (uint32_t i = 0; i + 2 < n; ++i) f.ancillas.push_back(q + n + i);
    f.target = q + 2 * n - 2;
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

/// GF(2^n) multiplier c = a * b mod p(x), schoolbook with Horner's rule: for k = 2n-2 down to 0,
/// c := x * c mod p (a wire relabelling plus CNOTs from the old top bit), then c_0 ^= a_i b_j for
/// every i + j = k: n^2 Toffolis and CNOTs for the reduction. `modulus` has bit k for x^k.
inline FamilyCircuit gf2_multiplier(uint32_t n, uint32_t modulus) {
    FamilyCircuit f;
    f.name = "gf2-mult-" + std::to_string(n);
    f.modulus = modulus;
    ir::Circuit& c = f.circuit;
    const uint32_t ra = c.add_register("a", n, ir::Role::Data);
    const uint32_t rb = c.add_register("b", n, ir::Role::Data);
    const uint32_t rc = c.add_register("c", n, ir::Role::Data);
    for (uint32_t i = 0; i < n; ++i) {
        f.a.push_back(ra + i);
        f.b.push_back(rb + i);
    }
    std::vector<uint32_t> cw(n);  // cw[m] = wire holding the coefficient of x^m
    for (uint32_t m = 0; m < n; ++m) cw[m] = rc + m;
    for (int k = int(2 * n - 2); k >= 0; --k) {
        if (k != int(2 * n - 2)) {
            // multiply by x: c'_m = c_{m-1} ^ p_m c_{n-1}, c'_0 = c_{n-1} (p_0 = 1).
            const uint32_t top = cw[n - 1];
            for (uint32_t m = n - 1; m >= 1; --m) cw[m] = cw[m - 1];
            cw[0] = top;
            for (uint32_t m = 1; m < n; ++m)
                if (modulus >> m & 1) c.ops.push_back(ir::Op::x(cw[m], {ir::Lit::pos(top)}));
        }
        for (uint32_t i = 0; i < n; ++i) {
            const int j = k - int(i);
            if (j >= 0 && j < int(n)) c.ops.push_back(toffoli(f.a[i], f.b[uint32_t(j)], cw[0]));
        }
    }
    f.c = cw;
    return f;
}

/// The product in GF(2)[x] reduced mod `modulus` (integer check of the multiplier).
inline uint32_t gf2_mul_mod(uint32_t a, uint32_t b, uint32_t n, uint32_t modulus) {
    uint64_t prod = 0;
    for (uint32_t i = 0; i < n; ++i)
        if (a >> i & 1) prod ^= uint64_t(b) << i;
    for (int k = int(2 * n - 2); k >= int(n); --k)
        if (prod >> k & 1) prod ^= uint64_t(modulus) << (k - int(n));
    return uint32_t(prod);
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
