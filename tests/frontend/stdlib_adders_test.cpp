// The library's adders (frontend/stdlib/adders.wq) against integer arithmetic, every input up to 5 bits, random at 32 and 64.
#include "stdlib_harness.h"

using namespace stdlib_test;

namespace {

std::vector<unsigned> widths() {
    std::vector<unsigned> w = kExhaustive;
    w.insert(w.end(), kRandom.begin(), kRandom.end());
    return w;
}

}  // namespace

// Check values: integer arithmetic mod 2^n (the definition of the routines), computed here.
TEST_CASE("stdlib: add and add_and give b + a mod 2^n") {
    for (const char* routine : {"add", "add_and"})
        for (unsigned n : widths()) {
            CAPTURE(routine);
            CAPTURE(n);
            check_routine({{"a", n}, {"b", n}}, std::string(routine) + "(a, b)", [n](const Values& in) {
                Values out = in;
                out["b"] = (in.at("a") + in.at("b")) & mask(n);
                return out;
            });
        }
}

TEST_CASE("stdlib: sub and sub_and give b - a mod 2^n") {
    for (const char* routine : {"sub", "sub_and"})
        for (unsigned n : widths()) {
            CAPTURE(routine);
            CAPTURE(n);
            check_routine({{"a", n}, {"b", n}}, std::string(routine) + "(a, b)", [n](const Values& in) {
                Values out = in;
                out["b"] = (in.at("b") - in.at("a")) & mask(n);
                return out;
            });
        }
}

TEST_CASE("stdlib: add with a wider addend reads its low bits") {
    check_routine({{"a", 6}, {"b", 4}}, "add(a, b)", [](const Values& in) {
        Values out = in;
        out["b"] = (in.at("a") + in.at("b")) & mask(4);
        return out;
    });
}

TEST_CASE("stdlib: add_const gives b + k mod 2^n for every k up to 5 bits and random 32/64-bit k") {
    for (unsigned n : kExhaustive)
        for (int64_t k = -3; k < (int64_t(1) << n) + 3; ++k) {
            CAPTURE(n);
            CAPTURE(k);
            check_routine({{"b", n}}, "add_const(b, " + std::to_string(k) + ")", [n, k](const Values& in) {
                Values out = in;
                out["b"] = (in.at("b") + u128(uint64_t(k))) & mask(n);
                return out;
            });
        }
    std::mt19937_64 rng(7);
    for (unsigned n : kRandom)
        for (int trial = 0; trial < 4; ++trial) {
            // a 64-bit constant above 2^63 - 1 is written as its two's complement (a negative literal)
            int64_t k = int64_t(rng() & uint64_t(mask(n)));
            if (n == 32) k &= 0xffffffff;
            CAPTURE(n);
            CAPTURE(k);
            check_routine({{"b", n}}, "add_const(b, " + std::to_string(k) + ")", [n, k](const Values& in) {
                Values out = in;
                out["b"] = (in.at("b") + u128(uint64_t(k))) & mask(n);
                return out;
            });
        }
}

TEST_CASE("stdlib: gate counts of the adders match the constructions") {
    // Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184): 2n-1 Toffoli, 5n-3 CNOT, 2n-4 NOT for
    // their adder with one ancilla (memory). Without the carry out (mod 2^n) the MAJ/UMA chain of
    // the paper is 2n-2 Toffolis and 4n-2 CNOTs (n-1 MAJ, n-1 UMA, 2 CNOTs on the top bit;
    // derived from the paper's MAJ and UMA blocks), which is what `add` must emit.
    // Gidney 2018 (arXiv:1709.06648): n-1 temporary ANDs, each computed and uncomputed.
    for (unsigned n : {2u, 4u, 8u, 16u, 32u}) {
        CAPTURE(n);
        whittle::ir::Circuit c = load("use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) +
                                      "]\nadd(a, b)\n");
        unsigned toffoli = 0, cnot = 0, other = 0;
        for (const auto& op : c.ops) {
            if (op.kind != whittle::ir::OpKind::X) {
                ++other;
                continue;
            }
            if (op.controls.size() == 2) ++toffoli;
            else if (op.controls.size() == 1) ++cnot;
            else ++other;
        }
        CHECK(toffoli == 2 * n - 2);
        CHECK(cnot == 4 * n - 2);
        CHECK(other == 0);
        CHECK(c.num_qubits() == 2 * n + 1);  // one work wire

        whittle::ir::Circuit g = load("use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) +
                                      "]\nadd_and(a, b)\n");
        unsigned ands = 0, paired = 0;
        for (const auto& op : g.ops)
            if (op.kind == whittle::ir::OpKind::X && op.controls.size() == 2) {
                ++ands;
                if (op.pair != 0) ++paired;
            }
        CHECK(ands == 2 * (n - 1));    // n-1 ANDs, each computed and uncomputed
        CHECK(paired == 2 * (n - 1));  // all of them inside compute/uncompute pairs
        CHECK(g.num_qubits() == 2 * n + (2 * n - 3));  // the ANDs and the carry copies
    }
}
