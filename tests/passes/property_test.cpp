// Property tests on random circuits: the checker's engines agree with an independent dense
// reference, and every registered pass and pipeline preserves equivalence.
#include <doctest/doctest.h>

#include <algorithm>
#include <random>

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/printer.h"
#include "verify/equiv_engines.h"
#include "verify/equivalence.h"
#include "verify/path_sum.h"
#include "passes/pipeline.h"
#include "passes/registry.h"
#include "support/dense_unitary.h"
#include "support/random_circuit.h"

#ifndef WHITTLE_PROPERTY_ROUNDS
#define WHITTLE_PROPERTY_ROUNDS 300  // the long target (label `long`) builds this file with 10^4
#endif

using namespace whittle;
using passes::Verdict;

namespace {

constexpr int kRounds = WHITTLE_PROPERTY_ROUNDS;

/// Which ops a generated circuit keeps, to land in each engine's class.
enum class OpClass { Classical, Diagonal, PathSum, General };

bool keep(const ir::Op& op, OpClass cls) {
    switch (cls) {
    case OpClass::Classical: return op.is_xtype() || op.kind == ir::OpKind::Barrier;
    case OpClass::Diagonal:
        return (op.is_xtype() || op.kind == ir::OpKind::Barrier || op.kind == ir::OpKind::Phase ||
                op.kind == ir::OpKind::Parity || op.kind == ir::OpKind::RZ || op.kind == ir::OpKind::Y) &&
               passes::PathSum::supports(op);
    case OpClass::PathSum: return passes::PathSum::supports(op);
    case OpClass::General: return true;
    }
    return true;
}

ir::Circuit random_in_class(std::mt19937_64& rng, OpClass cls) {
    test::RandomCircuitOptions o;
    o.max_registers = 3;
    o.max_register_size = 3;
    o.max_ops = 24;
    o.measurement = false;
    o.inexact_angles = cls == OpClass::General;
    ir::Circuit c = test::random_circuit(rng, o);
    std::vector<ir::Op> kept;
    for (const ir::Op& op : c.ops)
        if (keep(op, cls)) kept.push_back(op);
    c.ops = std::move(kept);
    return c;
}

/// A variant of `a`: an op and its inverse inserted (equivalent), an op dropped, or an op replaced
/// by one from another random circuit of the same class (usually not equivalent).
ir::Circuit mutate(const ir::Circuit& a, std::mt19937_64& rng, OpClass cls) {
    ir::Circuit b = a;
    const ir::Circuit donor = random_in_class(rng, cls);
    std::vector<ir::Op> pool;
    for (const ir::Op& op : donor.ops) {
        bool fits = true;
        for (uint32_t w : op.wires()) fits = fits && w < a.num_qubits();
        if (fits) pool.push_back(op);
    }
    const int choice = std::uniform_int_distribution<int>(0, 3)(rng);
    auto pos = [&](size_t n) { return std::uniform_int_distribution<size_t>(0, n)(rng); };
    if (choice == 0 && !pool.empty()) {
        const ir::Op& op = pool[pos(pool.size() - 1)];
        std::vector<ir::Op> ins = {op};
        ir::append_inverse(op, ins);
        b.ops.insert(b.ops.begin() + std::ptrdiff_t(pos(b.ops.size())), ins.begin(), ins.end());
    } else if (choice == 1 && !b.ops.empty()) {
        b.ops.erase(b.ops.begin() + std::ptrdiff_t(pos(b.ops.size() - 1)));
    } else if (choice == 2 && !b.ops.empty() && !pool.empty()) {
        b.ops[pos(b.ops.size() - 1)] = pool[pos(pool.size() - 1)];
    } else {
        b.global_phase += ir::Angle::pi_times(1, 3);  // equivalent: global phase only
    }
    return b;
}

using test::dense_equivalent;

/// A random circuit that keeps its wires' promises: `ancilla` wires come back to |0> and `borrow`
/// wires to their input, so a pass may rely on them. Shape: P M P^-1 with P random multi-controlled X
/// into the work wires and M random ops whose targets are data wires (work wires only as controls or
/// inside diagonal phases).
ir::Circuit random_well_formed(std::mt19937_64& rng, const test::RandomCircuitOptions& o) {
    ir::Circuit c = test::random_circuit(rng, o);
    std::vector<uint32_t> work;
    for (uint32_t w = 0; w < c.num_qubits(); ++w)
        if (c.qubits[w].role != ir::Role::Data) work.push_back(w);
    auto is_work = [&](uint32_t w) { return c.qubits[w].role != ir::Role::Data; };
    std::vector<ir::Op> middle;
    for (const ir::Op& op : c.ops) {
        bool ok = !(op.kind == ir::OpKind::Measure || op.kind == ir::OpKind::Reset) || !is_work(op.target);
        if (!op.is_diagonal() && op.kind != ir::OpKind::Barrier) {
            if (op.target != ir::kNoWire && is_work(op.target)) ok = false;
            if (op.target2 != ir::kNoWire && is_work(op.target2)) ok = false;
        }
        if (op.kind == ir::OpKind::RZ && is_work(op.target)) ok = true;  // diagonal
        if (ok) middle.push_back(op);
    }
    std::vector<ir::Op> prep;
    for (int i = 0; !work.empty() && i < 3; ++i) {
        const uint32_t t = work[std::uniform_int_distribution<size_t>(0, work.size() - 1)(rng)];
        ir::LitVec controls;
        for (uint32_t w = 0; w < c.num_qubits() && controls.size() < 2; ++w)
            if (w != t && std::bernoulli_distribution(0.3)(rng)) controls.push_back(ir::Lit::make(w, rng() & 1));
        prep.push_back(ir::Op::x(t, controls));
    }
    c.ops = prep;
    c.ops.insert(c.ops.end(), middle.begin(), middle.end());
    c.ops.insert(c.ops.end(), prep.rbegin(), prep.rend());
    return c;
}

using Engine = passes::equiv::EngineResult (*)(const passes::equiv::Aligned&, const passes::EquivOptions&,
                                                const passes::equiv::Deadline&);

}  // namespace

TEST_CASE("every engine agrees with an independent dense reference on random circuits") {
    const Engine zx = [](const passes::equiv::Aligned& al, const passes::EquivOptions& o,
                         const passes::equiv::Deadline& d) { return passes::equiv::check_zx(al, o, d, 10); };
    const std::pair<const char*, Engine> engines[] = {{"classical", passes::equiv::check_classical},
                                                      {"phase", passes::equiv::check_phase},
                                                      {"path-sum", passes::equiv::check_path_sum},
                                                      {"simulate", passes::equiv::check_simulate},
                                                      {"zx", zx}};
    std::mt19937_64 rng(2026);
    int decided[5] = {0, 0, 0, 0, 0}, equal_pairs = 0, unequal_pairs = 0;
    for (int round = 0; round < kRounds; ++round) {
        const OpClass cls = OpClass(round % 4);
        const ir::Circuit a = random_in_class(rng, cls), b = mutate(a, rng, cls);
        const bool truth = dense_equivalent(a, b);
        (truth ? equal_pairs : unequal_pairs) += 1;
        const passes::equiv::Aligned al = passes::equiv::align(a, b);
        passes::EquivOptions opts;
        for (int e = 0; e < 5; ++e) {
            const passes::equiv::EngineResult r = engines[e].second(al, opts, passes::equiv::Deadline(10));
            if (!r || r->verdict == Verdict::Inconclusive) continue;
            ++decided[e];
            INFO(fmt::format("round {} engine {}: {} ({}); a:\n{}b:\n{}", round, engines[e].first,
                             passes::verdict_name(r->verdict), r->confidence, ir::print_wq(a), ir::print_wq(b)));
            CHECK((r->verdict == Verdict::Equivalent) == truth);
        }
        const passes::EquivResult r = passes::check_equivalence(a, b);
        if (r.verdict != Verdict::Inconclusive) CHECK((r.verdict == Verdict::Equivalent) == truth);
    }
    MESSAGE(fmt::format("{} pairs ({} equivalent, {} not); decided by classical {}, phase {}, path-sum {}, simulate {}, "
                        "zx {}",
                        kRounds, equal_pairs, unequal_pairs, decided[0], decided[1], decided[2], decided[3], decided[4]));
    for (int d : decided) CHECK(d >= kRounds / 8);  // each engine really ran on its class
    CHECK(equal_pairs >= kRounds / 8);
    CHECK(unequal_pairs >= kRounds / 8);
}

TEST_CASE("every registered pass preserves equivalence on random circuits") {
    std::mt19937_64 rng(7);
    const std::vector<std::string> targets = {"", "clifford+t", "nct", "u+cx"};
    for (const passes::PassInfo& pass : passes::all_passes()) {
        int checked = 0, inconclusive = 0, refused = 0;
        for (int round = 0; round < kRounds; ++round) {
            test::RandomCircuitOptions o;
            o.max_registers = 3;
            o.max_register_size = 3;
            o.measurement = round % 5 == 4;
            const ir::Circuit before = random_well_formed(rng, o);
            ir::Circuit after = before;
            passes::PassOptions po;
            po.target = ir::parse_optional_target(targets[size_t(round) % targets.size()]);
            po.allow_measurement = round % 3 == 0;
            try {
                pass.run(after, po);
            } catch (const UserError&) {
                ++refused;  // e.g. a lowering that cannot express an op in this target
                continue;
            }
            ir::verify(after);
            const passes::EquivResult r = passes::check_equivalence(before, after);
            INFO(fmt::format("pass {} round {} target '{}': {} by {} ({}): {}\nbefore:\n{}after:\n{}", pass.name, round,
                             ir::target_label(po.target), passes::verdict_name(r.verdict), r.engine, r.confidence, r.counterexample,
                             ir::print_wq(before), ir::print_wq(after)));
            CHECK(r.verdict != Verdict::NotEquivalent);
            if (r.verdict == Verdict::Inconclusive) ++inconclusive;
            ++checked;
        }
        MESSAGE(fmt::format("pass {}: {} circuits checked, {} inconclusive, {} refused", pass.name, checked,
                            inconclusive, refused));
    }
}

TEST_CASE("every -O pipeline preserves equivalence on random circuits") {
    std::mt19937_64 rng(11);
    const std::vector<std::string> targets = {"", "clifford+t", "nct", "u+cx", "cx+rz+sx"};
    int checked = 0;
    for (int round = 0; round < kRounds / 2; ++round) {
        test::RandomCircuitOptions o;
        o.max_registers = 3;
        o.max_register_size = 3;
        o.measurement = false;
        const ir::Circuit before = random_well_formed(rng, o);
        ir::Circuit after = before;
        passes::PassOptions po;
        po.level = round % 4;
        po.target = ir::parse_optional_target(targets[size_t(round / 4) % targets.size()]);
        try {
            passes::run_passes(after, passes::pipeline_for(po), po);
        } catch (const UserError&) {
            continue;
        }
        const passes::EquivResult r = passes::check_equivalence(before, after);
        INFO(fmt::format("-O{} target '{}': {} by {}: {}\nbefore:\n{}after:\n{}", po.level, ir::target_label(po.target),
                         passes::verdict_name(r.verdict), r.engine, r.counterexample, ir::print_wq(before),
                         ir::print_wq(after)));
        CHECK(r.verdict != Verdict::NotEquivalent);
        ++checked;
    }
    MESSAGE(fmt::format("{} pipeline runs checked", checked));
}

TEST_CASE("cancel's kickback cancellations preserve equivalence on random circuits with conjugated ops") {
    // Random circuits (every op kind, pairs, measurement, conditions) with triples A ; B ; A
    // inserted on data wires: A = X(t; C), B an X or CZ controlled on t (the kickback pattern,
    // Nielsen & Chuang ch. 4; practice), so the kickback rule has work to do among everything else.
    std::mt19937_64 rng(2026);
    int64_t kicks = 0;
    int checked = 0;
    for (int round = 0; round < kRounds; ++round) {
        test::RandomCircuitOptions o;
        o.max_registers = 3;
        o.max_register_size = 3;
        o.measurement = round % 5 == 4;
        ir::Circuit c = random_well_formed(rng, o);
        std::vector<uint32_t> data;
        for (uint32_t w = 0; w < c.num_qubits(); ++w)
            if (c.qubits[w].role == ir::Role::Data) data.push_back(w);
        if (data.size() < 3) continue;
        for (int k = 0; k < 2; ++k) {
            std::shuffle(data.begin(), data.end(), rng);
            const auto lit = [&](uint32_t w) { return ir::Lit::make(w, rng() % 4 != 0); };
            ir::Op a = ir::Op::x(data[0], {lit(data[1])});
            if (data.size() > 3 && rng() % 2) a.controls.push_back(lit(data[3]));
            ir::Op b = rng() % 3 == 0 ? ir::Op::phase(ir::Angle::pi_times(1), {lit(data[0]), lit(data[2])})
                                      : ir::Op::x(data[2], {lit(data[0])});
            const size_t at = rng() % (c.ops.size() + 1);
            const std::vector<ir::Op> triple = rng() % 2 ? std::vector<ir::Op>{a, b, a} : std::vector<ir::Op>{b, a, b};
            c.ops.insert(c.ops.begin() + std::ptrdiff_t(at), triple.begin(), triple.end());
        }
        ir::Circuit after = c;
        const passes::PassResult r = passes::find_pass("cancel")->run(after, {});
        ir::verify(after);
        for (const auto& [name, n] : r.stats)
            if (name == "kickbacks") kicks += n;
        CHECK(after.ops.size() <= c.ops.size());
        const passes::EquivResult e = passes::check_equivalence(c, after);
        INFO(fmt::format("round {}: {} by {}: {}\nbefore:\n{}after:\n{}", round, passes::verdict_name(e.verdict),
                         e.engine, e.counterexample, ir::print_wq(c), ir::print_wq(after)));
        CHECK(e.verdict != Verdict::NotEquivalent);
        if (c.num_qubits() <= 7 && !o.measurement && round < 1000)  // dense: small and few (the long run has 10^4)
            CHECK(test::distance_exact(test::dense_unitary(c), test::dense_unitary(after)) < 1e-9);
        ++checked;
    }
    MESSAGE(fmt::format("{} circuits checked, {} kickbacks made", checked, kicks));
    CHECK(kicks >= checked / 10);
}
