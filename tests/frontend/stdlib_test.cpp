// The standard library's arith.wq: `add` computes b + a mod 2^n on every input (checked against
// integer arithmetic by running its X-type ops classically), restores a and its clean carry wire.
#include <doctest/doctest.h>

#include "frontend/load.h"
#include "ir/circuit.h"

using namespace whittle;

namespace {

uint64_t run_classical(const ir::Circuit& c, uint64_t state) {
    for (const ir::Op& op : c.ops) {
        REQUIRE(op.kind == ir::OpKind::X);
        bool fire = true;
        for (ir::Lit l : op.controls) fire = fire && (((state >> l.wire()) & 1) == (l.positive() ? 1u : 0u));
        if (fire) state ^= uint64_t(1) << op.target;
    }
    return state;
}

}  // namespace

TEST_CASE("use \"arith\" finds the standard library; add is b += a mod 2^n on every input") {
    for (uint32_t n : {1u, 2u, 3u, 4u}) {
        frontend::SourceManager sm;
        std::string prog = "use \"arith\"\nqubit a[" + std::to_string(n) + "], b[" + std::to_string(n) + "]\nadd(a, b)\n";
        ir::Circuit c = frontend::load_text(prog, "adder.wq", frontend::InputFormat::Wq, sm);
        // the routine's carry is a fresh clean wire (none for n = 1: b[0] ^= a[0])
        REQUIRE(c.num_qubits() == 2 * n + (n >= 2 ? 1 : 0));
        if (n >= 2) CHECK(c.qubits[2 * n].role == ir::Role::Clean);
        // Cuccaro et al. 2004 (quant-ph/0410184; memory): without the carry out, n-1 MAJ and n-1 UMA
        // blocks (1 Toffoli each) and two CNOTs on the top bit: 2n-2 Toffolis (derived).
        size_t toffolis = 0;
        for (const ir::Op& op : c.ops) toffolis += op.controls.size() == 2;
        CHECK(toffolis == (n >= 2 ? 2 * n - 2 : 0));
        const uint64_t mask = (uint64_t(1) << n) - 1;
        for (uint64_t a = 0; a <= mask; ++a)
            for (uint64_t b = 0; b <= mask; ++b) {
                uint64_t out = run_classical(c, a | (b << n));
                CHECK((out & mask) == a);
                CHECK(((out >> n) & mask) == ((a + b) & mask));
                if (n >= 2) CHECK(((out >> (2 * n)) & 1) == 0);
            }
    }
}
