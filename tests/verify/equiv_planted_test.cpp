// Planted single-gate bugs in a 62-wire Clifford+T adder: each must be found, with a witness, in < 10 s.
#include <doctest/doctest.h>

#include <chrono>
#include <random>

#include "verify/equivalence.h"
#include "support/textbook_circuits.h"

using namespace whittle;
using namespace whittle::testing;
using passes::Verdict;

namespace {

enum class Bug { TtoTdg, DropCnot, FlipCnot, DropH };

/// Indices of the ops a bug of this kind can hit.
std::vector<size_t> sites(const ir::Circuit& c, Bug bug) {
    std::vector<size_t> out;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        const bool cnot = op.kind == ir::OpKind::X && op.controls.size() == 1 && op.controls[0].positive();
        switch (bug) {
        case Bug::TtoTdg:
            if (op.kind == ir::OpKind::Phase && op.controls.size() == 1 && op.angle == ir::Angle::pi_times(1, 4))
                out.push_back(i);
            break;
        case Bug::DropCnot:
        case Bug::FlipCnot:
            if (cnot) out.push_back(i);
            break;
        case Bug::DropH:
            if (op.kind == ir::OpKind::H) out.push_back(i);
            break;
        }
    }
    return out;
}

ir::Circuit planted(ir::Circuit c, Bug bug, size_t i) {
    ir::Op& op = c.ops[i];
    switch (bug) {
    case Bug::TtoTdg: op.angle = -op.angle; break;
    case Bug::DropCnot:
    case Bug::DropH: c.ops.erase(c.ops.begin() + std::ptrdiff_t(i)); break;
    case Bug::FlipCnot: {
        const uint32_t control = op.controls[0].wire();
        op = ir::Op::x(control, {ir::Lit::pos(op.target)});
        break;
    }
    }
    return c;
}

}  // namespace

// The adder is Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184) with each Toffoli as the
// 7-T circuit of Nielsen & Chuang Fig. 4.9: 30-bit operands, 62 wires, 60 Toffolis (900 + 124 ops).
// A T turned into T-dagger, a dropped CNOT, a CNOT turned around or a dropped H all change the map
// here (each breaks one Toffoli's identity), so "not equivalent" is the only right answer.
TEST_CASE("every planted single-gate bug in a 62-wire Clifford+T adder is found in under 10 s") {
    const ir::Circuit good = cuccaro_adder(30, true);
    REQUIRE(good.num_qubits() == 62);
    std::mt19937_64 rng(2024);
    int found = 0;
    double worst = 0;
    for (Bug bug : {Bug::TtoTdg, Bug::DropCnot, Bug::FlipCnot, Bug::DropH}) {
        const std::vector<size_t> where = sites(good, bug);
        REQUIRE(!where.empty());
        for (int trial = 0; trial < 5; ++trial) {
            const size_t i = where[rng() % where.size()];
            CAPTURE(int(bug));
            CAPTURE(i);
            const auto start = std::chrono::steady_clock::now();
            const passes::EquivResult r = passes::check_equivalence(good, planted(good, bug, i));
            const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
            worst = std::max(worst, s);
            CAPTURE(r.detail);
            CHECK(r.verdict == Verdict::NotEquivalent);
            CHECK(r.confidence.rfind("exact", 0) == 0);
            CHECK(s < 10);
            found += r.verdict == Verdict::NotEquivalent;
        }
    }
    MESSAGE("planted bugs found: " << found << " of 20, slowest " << worst << " s");
}
