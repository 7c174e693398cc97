// The ZX equivalence engine alone and in the dispatcher: it proves textbook and published equalities,
// agrees with the dense reference whenever it decides, and never calls a planted bug equivalent.
#include <doctest/doctest.h>

#include <chrono>
#include <random>

#include <fmt/format.h>

#include "ir/printer.h"
#include "support/dense_unitary.h"
#include "support/random_circuit.h"
#include "support/textbook_circuits.h"
#include "verify/equiv_engines.h"
#include "verify/equivalence.h"
#include "zx/from_circuit.h"

using namespace whittle;
using namespace whittle::testing;
using ir::Circuit;
using ir::Op;
using passes::Verdict;

namespace {

Circuit wires(uint32_t n, uint32_t clean = 0) {
    Circuit c;
    c.add_register("q", n, ir::Role::Data);
    if (clean) c.add_register("w", clean, ir::Role::Clean);
    return c;
}

Circuit with_ops(Circuit c, std::vector<Op> ops) {
    c.ops = std::move(ops);
    return c;
}

passes::equiv::EngineResult run_zx(const Circuit& a, const Circuit& b, double seconds = 10) {
    const passes::equiv::Aligned al = passes::equiv::align(a, b);
    passes::EquivOptions opts;
    opts.time_budget_seconds = seconds;
    return passes::equiv::check_zx(al, opts, passes::equiv::Deadline(seconds), seconds);
}

bool zx_says_equivalent(const Circuit& a, const Circuit& b) {
    const auto r = run_zx(a, b);
    return r && r->verdict == Verdict::Equivalent;
}

using test::dense_equivalent;

}  // namespace

TEST_CASE("zx engine: textbook identities reduce to bare wires") {
    // Toffoli = the 7-T circuit (Nielsen & Chuang Fig. 4.9).
    Circuit seven = wires(3);
    seven_t_toffoli(seven.ops, 0, 1, 2);
    CHECK(zx_says_equivalent(with_ops(wires(3), {ccx(0, 1, 2)}), seven));
    // Three CNOTs, alternating direction, are a SWAP (Nielsen & Chuang ch. 1, practice).
    const Circuit three = with_ops(wires(2), {cx(0, 1), cx(1, 0), cx(0, 1)});
    CHECK(zx_says_equivalent(three, with_ops(wires(2), {Op::swap(0, 1)})));
    // H = S SX S up to a global phase (an Euler decomposition; checked densely here too).
    const Circuit euler = with_ops(wires(1), {s_gate(0), Op::one(ir::OpKind::SX, 0), s_gate(0)});
    const Circuit hadamard = with_ops(wires(1), {h(0)});
    REQUIRE(dense_equivalent(hadamard, euler));
    CHECK(zx_says_equivalent(hadamard, euler));
    // CZ is symmetric and H CNOT H turns CNOT into CZ (Nielsen & Chuang ch. 4).
    CHECK(zx_says_equivalent(with_ops(wires(2), {h(1), cx(0, 1), h(1)}), with_ops(wires(2), {cz(1, 0)})));
    // Two T gates on a parity fuse into one S on it (phase-gadget fusion, Kissinger, van de Wetering
    // 2020, arXiv:1903.10477): CX T CX CX T CX = CX S CX.
    CHECK(zx_says_equivalent(with_ops(wires(2), {cx(0, 1), t_gate(1), cx(0, 1), cx(0, 1), t_gate(1), cx(0, 1)}),
                             with_ops(wires(2), {cx(0, 1), s_gate(1), cx(0, 1)})));
}

TEST_CASE("zx engine: clean wires start and end at |0>") {
    // A CNOT controlled by a clean wire does nothing on the inputs that count.
    const Circuit ctrl_clean = with_ops(wires(1, 1), {cx(1, 0)});
    REQUIRE(dense_equivalent(ctrl_clean, wires(1, 1)));
    CHECK(zx_says_equivalent(ctrl_clean, wires(1, 1)));
    // Writing into the clean wire changes its output: never "equivalent".
    const Circuit dirty = with_ops(wires(1, 1), {cx(0, 1)});
    REQUIRE(!dense_equivalent(dirty, wires(1, 1)));
    const auto r = run_zx(dirty, wires(1, 1));
    REQUIRE(r);
    CHECK(r->verdict == Verdict::Inconclusive);
    // X on the clean wire alone: |1> is not |0>.
    CHECK(!zx_says_equivalent(with_ops(wires(1, 1), {Op::x(1)}), wires(1, 1)));
    // A parity computed into the clean wire, a T on it, uncomputed: the T on the parity itself.
    const Circuit via_clean = with_ops(wires(2, 1), {cx(0, 2), cx(1, 2), t_gate(2), cx(1, 2), cx(0, 2)});
    const Circuit direct = with_ops(wires(2, 1), {cx(0, 1), t_gate(1), cx(0, 1)});
    REQUIRE(dense_equivalent(via_clean, direct));
    CHECK(zx_says_equivalent(via_clean, direct));
}

TEST_CASE("zx engine: measurements, conditions and inexact angles are outside its class") {
    Circuit m = wires(1);
    m.add_creg("r", 1, true);
    m.ops.push_back(Op::measure(0, 0));
    CHECK(!run_zx(m, m));
    const Circuit inexact = with_ops(wires(1), {Op::one(ir::OpKind::RZ, 0, ir::Angle::radians(0.3))});
    CHECK(!run_zx(inexact, inexact));
}

TEST_CASE("zx engine agrees with the dense reference on random circuits") {
    std::mt19937_64 rng(2208);
    test::RandomCircuitOptions o;
    o.max_registers = 3;
    o.max_register_size = 3;
    o.max_ops = 16;
    o.max_controls = 2;
    o.measurement = false;
    o.inexact_angles = false;
    int decided = 0, equal = 0;
    for (int round = 0; round < 300; ++round) {
        Circuit a = test::random_circuit(rng, o);
        std::vector<Op> kept;
        std::vector<zx::Step> steps;
        for (const Op& op : a.ops)
            if (!zx::lower_op(op, 0, steps)) kept.push_back(op);
        a.ops = kept;
        // b: a with an op and its inverse inserted (equal), an op dropped, or two neighbours
        // exchanged (equal when they commute)
        Circuit b = a;
        const int choice = int(rng() % 3);
        if (choice == 0 && !a.ops.empty()) {
            const Op& op = a.ops[rng() % a.ops.size()];
            std::vector<Op> ins = {op};
            ir::append_inverse(op, ins);
            b.ops.insert(b.ops.begin() + std::ptrdiff_t(rng() % (b.ops.size() + 1)), ins.begin(), ins.end());
        } else if (choice == 1 && !b.ops.empty()) {
            b.ops.erase(b.ops.begin() + std::ptrdiff_t(rng() % b.ops.size()));
        } else if (b.ops.size() >= 2) {
            const size_t i = rng() % (b.ops.size() - 1);
            std::swap(b.ops[i], b.ops[i + 1]);
        }
        const bool truth = dense_equivalent(a, b);
        equal += truth;
        const auto r = run_zx(a, b);
        REQUIRE(r);
        CHECK(r->verdict != Verdict::NotEquivalent);
        if (r->verdict != Verdict::Equivalent) continue;
        ++decided;
        INFO(fmt::format("round {}: a:\n{}b:\n{}", round, ir::print_wq(a), ir::print_wq(b)));
        CHECK(truth);
    }
    MESSAGE(fmt::format("300 pairs, {} equal by the dense reference, {} proved by zx", equal, decided));
    CHECK(decided >= equal * 3 / 4);
}

// The adder of equiv_planted_test.cpp: Cuccaro, Draper, Kutin, Moulton 2004 (quant-ph/0410184) with
// each Toffoli as Nielsen & Chuang Fig. 4.9, 62 wires. Each planted bug changes the map (see there).
TEST_CASE("zx engine alone: no planted single-gate bug in a 62-wire adder is called equivalent") {
    const Circuit good = cuccaro_adder(30, true), spec = cuccaro_adder(30, false);
    const auto start = std::chrono::steady_clock::now();
    const auto same = run_zx(spec, good);
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    REQUIRE(same);
    CHECK(same->verdict == Verdict::Equivalent);
    MESSAGE("62-wire adder against its Toffoli form: " << s << " s");
    std::mt19937_64 rng(2024);
    int trials = 0;
    for (int bug = 0; bug < 4; ++bug)
        for (int trial = 0; trial < 6; ++trial) {
            Circuit bad = good;
            std::vector<size_t> sites;
            for (size_t i = 0; i < bad.ops.size(); ++i) {
                const Op& op = bad.ops[i];
                const bool cnot = op.kind == ir::OpKind::X && op.controls.size() == 1;
                if ((bug == 0 && op.kind == ir::OpKind::Phase && op.angle == ir::Angle::pi_times(1, 4)) ||
                    ((bug == 1 || bug == 2) && cnot) || (bug == 3 && op.kind == ir::OpKind::H))
                    sites.push_back(i);
            }
            REQUIRE(!sites.empty());
            const size_t i = sites[rng() % sites.size()];
            Op& op = bad.ops[i];
            if (bug == 0) op.angle = -op.angle;
            if (bug == 1 || bug == 3) bad.ops.erase(bad.ops.begin() + std::ptrdiff_t(i));
            if (bug == 2) op = Op::x(op.controls[0].wire(), {ir::Lit::pos(op.target)});
            CAPTURE(bug);
            CAPTURE(i);
            for (const Circuit* ref : {&good, &spec}) {
                const auto r = run_zx(*ref, bad);
                REQUIRE(r);
                CHECK(r->verdict == Verdict::Inconclusive);
            }
            ++trials;
        }
    CHECK(trials == 24);
}

TEST_CASE("the dispatcher decides a wide Clifford+T adder with the zx engine") {
    const Circuit spec = cuccaro_adder(29, false), ct = cuccaro_adder(29, true);  // 60 wires
    const passes::EquivResult r = passes::check_equivalence(spec, ct);
    CHECK(r.verdict == Verdict::Equivalent);
    CHECK(r.engine == "zx");
    CHECK(r.confidence.rfind("exact", 0) == 0);
    // A planted bug still goes to the engines that find witnesses.
    const passes::EquivResult bad = passes::check_equivalence(spec, cuccaro_adder(29, true, true));
    CHECK(bad.verdict == Verdict::NotEquivalent);
}
