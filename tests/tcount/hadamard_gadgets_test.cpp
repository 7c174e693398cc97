// Hadamard gadgets: every gadgetized circuit proved equal to its input (measurement branches) by the
// exact checker, the correction shown necessary, budgets kept, and the engine's T-count on the result.
#include <doctest/doctest.h>

#include <random>

#include "ir/resources.h"
#include "passes/pass_check.h"
#include "passes/pipeline.h"
#include "support/families.h"
#include "support/tcount_helpers.h"
#include "tcount/engine.h"
#include "tcount/hadamard_frames.h"
#include "tcount/hadamard_gadgets.h"
#include "verify/equivalence.h"

using namespace whittle;
using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

using test::cx;
using test::h;
using test::ph;
using test::t_of;

ir::Circuit lowered(const ir::Circuit& in) { return test::lowered_before_reduce_t(in, 3); }



size_t count_kind(const ir::Circuit& c, OpKind k) {
    size_t n = 0;
    for (const Op& op : c.ops) n += op.kind == k;
    return n;
}

passes::Verdict verdict(const ir::Circuit& a, const ir::Circuit& b) {
    passes::EquivOptions o;
    const passes::EquivResult r = passes::check_equivalence(a, b, o);
    INFO(r.engine << ": " << r.confidence << " " << r.counterexample);
    return r.verdict;
}

ir::Circuit gadgetized(ir::Circuit c, uint32_t wires, tcount::GadgetStats* stats = nullptr, uint32_t width = 64) {
    tcount::GadgetSettings s;
    s.max_wires = wires;
    s.max_width = width;
    tcount::GadgetStats st;
    tcount::insert_hadamard_gadgets(c, s, stats ? *stats : st);
    ir::verify(c);
    return c;
}


/// T(a); CX(a, b); H(b); CX(b, a); T(a); CX(b, a); T(a) on a = wire 0, b = wire 1: the first and the
/// last T act on the same parity x_a, but an H on b lies between them (written for this test).
ir::Circuit across_h() {
    ir::Circuit c = test::wires(2);
    c.ops = {ph(0, 1), cx(0, 1), h(1), cx(1, 0), ph(0, 1), cx(1, 0), ph(0, 1)};
    return c;
}

}  // namespace

TEST_CASE("one inner H becomes a gadget: a fresh wire, its measurement, the same circuit in every branch") {
    const ir::Circuit c = across_h();
    tcount::GadgetStats st;
    const ir::Circuit g = gadgetized(c, 4, &st);
    CHECK(st.gadgets == 1);
    CHECK(st.wires == 1);
    CHECK(g.num_qubits() == 3);
    CHECK(g.qubits[2].role == ir::Role::Clean);
    CHECK(count_kind(g, OpKind::Measure) == 1);
    CHECK(t_of(g) == t_of(c));
    // The data wires hold no H any more; the two H are the gadget wire's |+> and its X-basis reading.
    for (const Op& op : g.ops)
        if (op.kind == OpKind::H) CHECK(op.target == 2);
    CHECK(verdict(c, g) == passes::Verdict::Equivalent);
}

TEST_CASE("the correction is needed: without any one of its conditioned ops the checker refuses") {
    // The derivation's D X_q D^dagger: here a T on the new variable and one on x_a + y follow the H,
    // so the correction has S-class phases and an X; leaving out any of them must be seen.
    const ir::Circuit c = across_h();
    const ir::Circuit g = gadgetized(c, 4);
    int fixes = 0;
    for (size_t i = 0; i < g.ops.size(); ++i) {
        const Op& op = g.ops[i];
        if (!op.is_conditioned() || op.target == 2) continue;  // the wire's own reset is not the correction
        ++fixes;
        ir::Circuit wrong = g;
        wrong.ops.erase(wrong.ops.begin() + std::ptrdiff_t(i));
        INFO("without op " << i);
        CHECK(verdict(c, wrong) == passes::Verdict::NotEquivalent);
    }
    CHECK(fixes >= 2);
    // A gadget with no correction at all (the H replaced by a bare X-basis reading) is wrong too.
    ir::Circuit bare = g;
    std::erase_if(bare.ops, [](const Op& op) { return op.is_conditioned() && op.target != 2; });
    CHECK(verdict(c, bare) == passes::Verdict::NotEquivalent);
}

TEST_CASE("the engine on the gadgetized circuit: the T gates across the H merge, 3 T -> 1") {
    // Integer arithmetic: the phase is pi/4 (x_a + (x_a ^ y) + x_a) = pi/2 x_a + pi/4 (x_a ^ y), one
    // T. Without gadgets the H on b splits the circuit into two regions and the engine keeps 3.
    const ir::Circuit c = across_h();
    ir::Circuit plain = c;
    tcount::EngineStats st;
    tcount::reduce_t_count(plain, {}, st);
    CHECK(t_of(plain) == 3);
    ir::Circuit g = gadgetized(c, 4);
    tcount::reduce_t_count(g, {}, st);
    ir::verify(g);
    CHECK(t_of(g) == 1);
    CHECK(verdict(c, g) == passes::Verdict::Equivalent);
}

TEST_CASE("the budget: never more fresh wires than allowed, stretches reuse them, the width cap holds") {
    // Three inner H on wire 1, each between T gates on parities with wire 0.
    ir::Circuit c = test::wires(2);
    for (int k = 0; k < 4; ++k) {
        c.ops.push_back(cx(0, 1));
        c.ops.push_back(ph(1, 1));
        c.ops.push_back(cx(0, 1));
        if (k < 3) c.ops.push_back(h(1));
    }
    tcount::GadgetStats one;
    const ir::Circuit g1 = gadgetized(c, 1, &one);
    CHECK(one.wires == 1);
    CHECK(g1.num_qubits() == 3);
    // The second gadget does not fit: its stretch ends there, that H stays as the stretch's last
    // gate on wire 1, and the next stretch has the third H as its gadget, on the same fresh wire.
    CHECK(one.gadgets == 2);
    CHECK(one.stretches == 2);
    CHECK(verdict(c, g1) == passes::Verdict::Equivalent);
    tcount::GadgetStats three;
    const ir::Circuit g3 = gadgetized(c, 8, &three);
    CHECK(three.wires == 3);
    CHECK(three.stretches == 1);
    CHECK(verdict(c, g3) == passes::Verdict::Equivalent);
    tcount::GadgetStats narrow;
    const ir::Circuit g4 = gadgetized(c, 8, &narrow, 3);  // 2 wires + at most 1 gadget per stretch
    CHECK(narrow.wires == 1);
    CHECK(verdict(c, g4) == passes::Verdict::Equivalent);
    tcount::GadgetStats none;
    ir::Circuit untouched = c;
    CHECK_FALSE(tcount::insert_hadamard_gadgets(untouched, {}, none));  // max_wires 0
    CHECK(untouched.num_qubits() == 2);
}

TEST_CASE("measurements, conditions and finer rotations end a stretch and keep their places") {
    // Harbor Logistics: the berth wire (1) is read in the middle and the crane wire (2) corrected on
    // it; a pi/8 rotation on wire 0 ends the next stretch.
    ir::Circuit c = test::wires(3);
    c.add_creg("m", 1, true);
    Op fix = Op::x(2);
    fix.set_condition(0, 1);
    c.ops = {ph(0, 1), cx(0, 1), h(1), cx(1, 0), ph(0, 1), cx(1, 0), ph(1, 3), h(1), Op::measure(1, 0), fix,
             cx(0, 2), h(2), ph(2, 1), h(2), cx(2, 0), ph(0, 7), Op::phase(Angle::pi_times(1, 8), {Lit::pos(0)}),
             h(0), ph(0, 1), h(0)};
    tcount::GadgetStats st;
    const ir::Circuit g = gadgetized(c, 4, &st);
    CHECK(st.gadgets >= 2);
    CHECK(verdict(c, g) == passes::Verdict::Equivalent);
    // The program's own measurement keeps its place before its conditioned op.
    size_t measure_at = 0, fix_at = 0;
    for (size_t i = 0; i < g.ops.size(); ++i) {
        if (g.ops[i].kind == OpKind::Measure && g.ops[i].cbit() == 0 && g.ops[i].target == 1) measure_at = i;
        if (g.ops[i].is_conditioned() && g.ops[i].cond_reg() == 0) fix_at = i;
    }
    CHECK(measure_at < fix_at);
}

TEST_CASE("lowered Toffoli networks (H on targets and on controls, negative controls): exact, T kept, then reduced") {
    std::vector<test::FamilyCircuit> fams = {test::mcx_barenco(3), test::mcx_barenco(4), test::vbe_adder(2),
                                             test::cuccaro_adder(2)};
    // A Toffoli chain with negative controls and a target later used as a control.
    ir::Circuit neg = test::wires(4);
    neg.ops = {Op::x(2, {Lit::pos(0), Lit::neg(1)}), Op::x(3, {Lit::neg(2), Lit::pos(0)}), Op::x(2, {Lit::pos(1), Lit::pos(3)}),
               Op::x(0, {Lit::neg(2), Lit::neg(3)})};
    test::FamilyCircuit negf;
    negf.name = "negative-controls";
    negf.circuit = neg;
    fams.push_back(negf);
    for (const test::FamilyCircuit& f : fams) {
        INFO(f.name);
        ir::Circuit in = lowered(f.circuit);
        tcount::exchange_hadamard_frames(in);
        tcount::GadgetStats st;
        const ir::Circuit g = gadgetized(in, 24, &st);
        MESSAGE(f.name << ": " << st.gadgets << " gadgets on " << st.wires << " wires");
        CHECK(st.gadgets > 0);
        CHECK(t_of(g) == t_of(in));
        CHECK(verdict(in, g) == passes::Verdict::Equivalent);
        ir::Circuit r = g;
        tcount::EngineSettings es;
        es.exchange_frames = false;
        tcount::EngineStats est;
        tcount::reduce_t_count(r, es, est);
        ir::verify(r);
        CHECK(t_of(r) <= t_of(g));
        CHECK(verdict(in, r) == passes::Verdict::Equivalent);
    }
}

TEST_CASE("random Clifford+T circuits: gadgetized and reduced, equal to the input in every branch") {
    std::mt19937_64 rng(1903);
    test::RandomSpec spec;
    spec.clifford_t_only = true;
    spec.min_qubits = 2;
    spec.max_qubits = 5;
    spec.max_ops = 50;
    int with_gadgets = 0;
    for (int i = 0; i < 120; ++i) {
        const ir::Circuit c = test::random_circuit(rng, spec);
        tcount::GadgetStats st;
        const ir::Circuit g = gadgetized(c, 1 + uint32_t(i % 6), &st);
        INFO("circuit " << i);
        if (st.gadgets == 0) continue;
        ++with_gadgets;
        CHECK(st.wires <= 1 + uint32_t(i % 6));
        CHECK(t_of(g) == t_of(c));
        CHECK(verdict(c, g) == passes::Verdict::Equivalent);
        ir::Circuit r = g;
        tcount::EngineStats est;
        tcount::reduce_t_count(r, {}, est);
        ir::verify(r);
        CHECK(verdict(c, r) == passes::Verdict::Equivalent);
    }
    CHECK(with_gadgets > 60);
}
