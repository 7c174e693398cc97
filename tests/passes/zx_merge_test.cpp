// zx-merge: phase teleportation keeps the circuit's exact unitary, its CNOTs and H gates, and lowers T.
#include <doctest/doctest.h>

#include <random>

#include <fmt/format.h>

#include "ir/printer.h"
#include "ir/resources.h"
#include "passes/zx_merge.h"
#include "support/dense_unitary.h"
#include "support/textbook_circuits.h"

using namespace whittle;
using namespace whittle::testing;
using ir::Circuit;
using ir::Op;

namespace {

Circuit wires(uint32_t n) {
    Circuit c;
    c.add_register("q", n, ir::Role::Data);
    return c;
}

/// Exact equality, global phase included (Circuit::global_phase is part of the unitary).
bool same_unitary(const Circuit& a, const Circuit& b) {
    return (test::dense_unitary(a) - test::dense_unitary(b)).norm() < 1e-9;
}

size_t count_kind(const Circuit& c, ir::OpKind k, size_t controls) {
    size_t n = 0;
    for (const Op& op : c.ops) n += op.kind == k && op.controls.size() == controls;
    return n;
}

Op t_on(uint32_t w, int eighths) { return Op::phase(ir::Angle::pi_times(eighths, 4), {ir::Lit::pos(w)}); }

}  // namespace

TEST_CASE("two T on one parity separated by H H merge into an S (phase-gadget fusion, arXiv:1903.10477)") {
    // CX T CX on q0 xor q1, then H H on q0 (the identity, but a wall for gate-level folding without
    // path variables), then T on the same parity again: e^{i pi/4 p} e^{i pi/4 p} = e^{i pi/2 p}.
    Circuit c = wires(2);
    c.ops = {cx(0, 1), t_gate(1), cx(0, 1), h(0), h(0), cx(0, 1), t_gate(1), cx(0, 1)};
    const Circuit before = c;
    const passes::PassResult r = passes::zx_merge(c, {});
    CHECK(r.changed);
    CHECK(ir::count_t_and_cnot(c).t_count == 0);
    CHECK(ir::count_t_and_cnot(c).cnot_count == 4);
    CHECK(count_kind(c, ir::OpKind::H, 0) == 2);
    CHECK(c.ops.size() == before.ops.size() - 1);
    CHECK(same_unitary(before, c));
}

TEST_CASE("a T and a T-dagger on complementary values cancel, and the global phase is kept") {
    // T on q, X, T on q, X: e^{i pi/4 q} e^{i pi/4 (1 - q)} = e^{i pi/4} (practice: X Z(a) X = e^{ia} Z(-a)).
    Circuit c = wires(1);
    c.ops = {t_on(0, 1), Op::x(0), t_on(0, 1), Op::x(0)};
    const Circuit before = c;
    CHECK(passes::zx_merge(c, {}).changed);
    CHECK(ir::count_t_and_cnot(c).t_count == 0);
    CHECK(same_unitary(before, c));
    CHECK(c.global_phase == ir::Angle::pi_times(1, 4));
}

TEST_CASE("RZ merges keep their scalar exactly") {
    Circuit c = wires(2);
    c.ops = {Op::one(ir::OpKind::RZ, 1, ir::Angle::pi_times(1, 4)), cx(0, 1), h(0), h(0), cx(0, 1),
             Op::one(ir::OpKind::RZ, 1, ir::Angle::pi_times(3, 4))};
    const Circuit before = c;
    CHECK(passes::zx_merge(c, {}).changed);
    CHECK(ir::count_t_and_cnot(c).t_count == 0);
    CHECK(same_unitary(before, c));
}

TEST_CASE("nothing to merge: the circuit is left as it was") {
    Circuit c = wires(2);
    c.ops = {t_gate(0), h(0), t_gate(0), cx(0, 1), t_gate(1)};
    const Circuit before = c;
    CHECK(!passes::zx_merge(c, {}).changed);
    CHECK(ir::print_wq(c) == ir::print_wq(before));
}

TEST_CASE("an op the diagram cannot hold cuts its wires: no merge across it") {
    // A controlled H between two T on its target: T (CH) T is not S (CH).
    Circuit c = wires(2);
    c.ops = {t_gate(1), Op::one(ir::OpKind::H, 1, {}, {ir::Lit::pos(0)}), t_gate(1), t_gate(0), t_gate(0)};
    const Circuit before = c;
    CHECK(passes::zx_merge(c, {}).changed);  // the two T on q0 still merge
    CHECK(ir::count_t_and_cnot(c).t_count == 2);
    CHECK(same_unitary(before, c));
}

TEST_CASE("random Clifford+T circuits: same unitary with global phase, same CNOTs and H, no more T") {
    std::mt19937_64 rng(1903);
    int changed = 0;
    for (int round = 0; round < 300; ++round) {
        const uint32_t n = 2 + uint32_t(rng() % 3);
        Circuit c = wires(n);
        const int len = 8 + int(rng() % 30);
        for (int k = 0; k < len; ++k) {
            const uint32_t a = uint32_t(rng() % n), b = (a + 1 + uint32_t(rng() % (n - 1))) % n;
            switch (rng() % 9) {
            case 0: c.ops.push_back(h(a)); break;
            case 1:
            case 2: c.ops.push_back(cx(a, b)); break;
            case 3: c.ops.push_back(Op::x(a)); break;
            case 4: c.ops.push_back(Op::phase(ir::Angle::pi_times(int64_t(rng() % 8), 4), {ir::Lit::neg(a)})); break;
            case 5: c.ops.push_back(Op::one(ir::OpKind::RZ, a, ir::Angle::pi_times(int64_t(rng() % 16), 8))); break;
            case 6: c.ops.push_back(cz(a, b)); break;
            default: c.ops.push_back(t_on(a, int(rng() % 8))); break;
            }
        }
        const Circuit before = c;
        const passes::PassResult r = passes::zx_merge(c, {});
        changed += r.changed;
        INFO(fmt::format("round {}:\n{}after:\n{}", round, ir::print_wq(before), ir::print_wq(c)));
        CHECK(same_unitary(before, c));
        CHECK(ir::count_t_and_cnot(c).cnot_count == ir::count_t_and_cnot(before).cnot_count);
        CHECK(ir::count_t_and_cnot(c).t_count <= ir::count_t_and_cnot(before).t_count);
        CHECK(count_kind(c, ir::OpKind::H, 0) == count_kind(before, ir::OpKind::H, 0));
    }
    CHECK(changed >= 100);
}

TEST_CASE("a circuit longer than one diagram is merged in windows: same unitary, no more T") {
    // 20000 random Clifford+T ops on 3 wires: above the one-diagram size (16384 ops), so the pass
    // works in windows of 1024 ops (20 of them); each window's merges must keep the exact unitary.
    std::mt19937_64 rng(1024);
    Circuit c = wires(3);
    for (int k = 0; k < 20000; ++k) {
        const uint32_t a = uint32_t(rng() % 3), b = (a + 1 + uint32_t(rng() % 2)) % 3;
        switch (rng() % 6) {
        case 0: c.ops.push_back(h(a)); break;
        case 1:
        case 2: c.ops.push_back(cx(a, b)); break;
        default: c.ops.push_back(t_on(a, int(rng() % 8))); break;
        }
    }
    const Circuit before = c;
    const passes::PassResult r = passes::zx_merge(c, {});
    int64_t windows = 0;
    for (const auto& [name, v] : r.stats)
        if (name == "windows") windows = v;
    CHECK(windows == 20);
    CHECK(r.changed);
    CHECK(same_unitary(before, c));
    CHECK(ir::count_t_and_cnot(c).t_count < ir::count_t_and_cnot(before).t_count);
    CHECK(ir::count_t_and_cnot(c).cnot_count == ir::count_t_and_cnot(before).cnot_count);
}
