// Toffoli/CCZ forms and lower-toffoli: exactness, the published T/CNOT counts, pair checks, measured erase.
#include <doctest/doctest.h>

#include "support/equivalence_helpers.h"
#include "lowering/toffoli_forms.h"
#include "passes/lower_controls.h"
#include "passes/lower_toffoli.h"
#include "passes/pair_uncompute.h"
#include "passes/pipeline.h"

using namespace whittle;
using namespace whittle::testing;

namespace {

using Form = void (*)(lowering::OpSink&, uint32_t, uint32_t, uint32_t);

ir::Circuit form_circuit(Form f) {
    ir::Circuit c = wires(3);
    lowering::OpSink s(c.ops, c.global_phase);
    f(s, 0, 1, 2);
    return c;
}

ir::Circuit toffoli() {
    ir::Circuit c = wires(3);
    c.ops.push_back(ir::Op::x(2, positive_lits(0, 2)));
    return c;
}

ir::Circuit ccz() {
    ir::Circuit c = wires(3);
    c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1), positive_lits(0, 3)));
    return c;
}

double dist(const ir::Circuit& a, const ir::Circuit& b) {
    return ir::distance_up_to_phase(ir::circuit_unitary(a), ir::circuit_unitary(b));
}

passes::PassOptions options(bool measure = false, passes::Metric m = passes::Metric::TCount) {
    passes::PassOptions o;
    o.allow_measurement = measure;
    o.optimize_for = m;
    o.target = ir::parse_optional_target("clifford+t");
    return o;
}

}  // namespace

TEST_CASE("Toffoli: 7 T (Gosset et al. 2014, arXiv:1308.4134) and 6 CNOT (Shende & Markov 2009, arXiv:0803.2316)") {
    ir::Circuit f = form_circuit(lowering::toffoli_7t);
    CHECK(dist(f, toffoli()) < 1e-12);
    ir::Resources r = ir::count_resources(f);
    CHECK(r.t_count == 7);
    CHECK(r.cnot_count == 6);
    ir::Circuit z = form_circuit(lowering::ccz_7t);
    CHECK(dist(z, ccz()) < 1e-12);
    CHECK(ir::count_resources(z).t_count == 7);
}

TEST_CASE("T-depth 3 Toffoli (Amy, Maslov, Mosca, Roetteler 2013, arXiv:1206.0758)") {
    ir::Circuit f = form_circuit(lowering::toffoli_tdepth3);
    CHECK(dist(f, toffoli()) < 1e-12);
    ir::Resources r = ir::count_resources(f);
    CHECK(r.t_count == 7);
    CHECK(r.t_depth == 3);
    CHECK(dist(form_circuit(lowering::ccz_tdepth3), ccz()) < 1e-12);
    ir::Circuit seven = form_circuit(lowering::toffoli_7t);
    CHECK(ir::count_resources(seven).t_depth > 3);
}

TEST_CASE("relative-phase Toffoli: 4 T, 3 CNOT (Maslov 2016, arXiv:1508.03273, memory) = Toffoli times a diagonal") {
    ir::Circuit f = wires(3);
    lowering::OpSink s(f.ops, f.global_phase);
    lowering::toffoli_relative_phase(s, 0, 1, 2, false);
    ir::Resources r = ir::count_resources(f);
    CHECK(r.t_count == 4);
    CHECK(r.cnot_count == 3);
    // U * Toffoli is diagonal (a pure relative phase) and not the identity.
    const Eigen::MatrixXcd d = ir::circuit_unitary(f) * ir::circuit_unitary(toffoli());
    double off = 0;
    for (int i = 0; i < 8; ++i)
        for (int j = 0; j < 8; ++j)
            if (i != j) off += std::abs(d(i, j));
    CHECK(off < 1e-12);
    CHECK(dist(f, toffoli()) > 0.1);
    // The pair U ... U^dagger around a middle that uses the wires as controls is exact.
    ir::Circuit pair = wires(4), ref = wires(4);
    lowering::OpSink ps(pair.ops, pair.global_phase);
    lowering::toffoli_relative_phase(ps, 0, 1, 2, false);
    ps.push(ir::Op::one(ir::OpKind::H, 3, {}, {ir::Lit::pos(2)}));
    lowering::toffoli_relative_phase(ps, 0, 1, 2, true);
    ref.ops = {ir::Op::x(2, positive_lits(0, 2)), ir::Op::one(ir::OpKind::H, 3, {}, {ir::Lit::pos(2)}),
               ir::Op::x(2, positive_lits(0, 2))};
    CHECK(dist(pair, ref) < 1e-12);
}

TEST_CASE("temporary AND: 4 T, exact on a |0> target (Gidney 2018, arXiv:1709.06648)") {
    ir::Circuit f = wires(2, 1);
    lowering::OpSink s(f.ops, f.global_phase);
    lowering::temporary_and(s, 0, 1, 2);
    CHECK(ir::count_resources(f).t_count == 4);
    ir::Circuit ref = wires(2, 1);
    ref.ops.push_back(ir::Op::x(2, positive_lits(0, 2)));
    CHECK(distance_on_clean_inputs(ref, f) < 1e-12);
}

TEST_CASE("lower-toffoli: compute/uncompute pairs get relative-phase Toffolis only when the middle allows it") {
    // w = a & b; middle uses w as a control only; uncompute.
    auto build = [](bool break_middle) {
        ir::Circuit c = wires(3, 1);
        ir::Op comp = ir::Op::x(3, {ir::Lit::pos(0), ir::Lit::neg(1)});
        comp.pair = 1;
        comp.half = ir::PairHalf::Compute;
        ir::Op unc = comp;
        unc.half = ir::PairHalf::Uncompute;
        c.next_pair_id = 2;
        c.ops = {ir::Op::one(ir::OpKind::H, 0), comp, ir::Op::one(ir::OpKind::RY, 2, ir::Angle::radians(0.4), {ir::Lit::pos(3)}),
                 ir::Op::phase(ir::Angle::pi_times(1, 4), {ir::Lit::pos(0)})};
        if (break_middle) c.ops.push_back(ir::Op::one(ir::OpKind::H, 1));  // writes a control
        c.ops.push_back(unc);
        return c;
    };
    for (bool broken : {false, true}) {
        ir::Circuit c = build(broken), ref = c;
        passes::PassResult r = passes::lower_toffoli(c, options());
        bool relative = false;
        for (auto& [k, v] : r.stats) relative = relative || (k == "toffoli-relative-phase" && v == 2);
        CHECK(relative == !broken);
        CHECK(distance_on_clean_inputs(ref, c) < 1e-10);
    }
}

TEST_CASE("measured erase: every measurement branch gives the reference state (Gidney 2018; Jones 2013)") {
    ir::Circuit c = wires(3, 1);
    ir::Op comp = ir::Op::x(3, {ir::Lit::neg(0), ir::Lit::pos(1)});
    comp.pair = c.new_pair_id();
    comp.half = ir::PairHalf::Compute;
    ir::Op unc = comp;
    unc.half = ir::PairHalf::Uncompute;
    c.ops = {comp, ir::Op::x(2, {ir::Lit::pos(3)}), ir::Op::phase(ir::Angle::pi_times(1, 2), {ir::Lit::pos(3), ir::Lit::pos(2)}), unc};
    ir::Circuit ref = c;
    passes::PassResult r = passes::lower_toffoli(c, options(true));
    ir::Resources res = ir::count_resources(c);
    CHECK(res.measurements == 1);
    CHECK(res.t_count == 4);
    CHECK(worst_branch_distance(ref, c, 40, 7) < 1e-10);
}

TEST_CASE("pair-uncompute tags undeclared pairs and leaves disturbed ones") {
    ir::Circuit c = wires(4, 1);
    c.ops = {ir::Op::x(4, positive_lits(0, 2)), ir::Op::x(3, {ir::Lit::pos(4), ir::Lit::pos(2)}),
             ir::Op::x(4, positive_lits(0, 2)),  // pair 1
             ir::Op::x(4, positive_lits(1, 2)), ir::Op::one(ir::OpKind::H, 4), ir::Op::x(4, positive_lits(1, 2))};
    passes::PassResult r = passes::pair_uncompute(c, {});
    CHECK(r.changed);
    CHECK(c.ops[0].pair != 0);
    CHECK(c.ops[0].pair == c.ops[2].pair);
    CHECK(c.ops[0].half == ir::PairHalf::Compute);
    CHECK(c.ops[2].half == ir::PairHalf::Uncompute);
    CHECK(c.ops[3].pair == 0);
    CHECK(c.ops[5].pair == 0);
    ir::Circuit none = wires(3);
    none.ops = {ir::Op::x(2, positive_lits(0, 2))};
    CHECK_FALSE(passes::pair_uncompute(none, {}).changed);
}

TEST_CASE("n-control Toffoli over a clean V-chain in clifford+t: 8n-9 T with relative phases, 4n-1 with measurement") {
    // 8n-9: the phase-folding value of CHECKS.md (Amy, Maslov, Mosca 2014, memory, high) reached by
    // relative-phase pairs; 4(n-2)+7 = 4n-1 derived from Gidney 2018's 4-T AND and 0-T erase.
    for (uint32_t n = 3; n <= 10; ++n) {
        for (bool measure : {false, true}) {
            ir::Circuit c = wires(n + 1, n - 2);
            c.ops.push_back(ir::Op::x(n, positive_lits(0, n)));
            ir::Circuit ref = c;
            passes::PassOptions o = options(measure);
            passes::run_passes(c, passes::pipeline_for(o), o);
            ir::Resources r = ir::count_resources(c);
            CHECK(r.t_count == (measure ? 4 * n - 1 : 8 * n - 9));
            if (n <= 5 && !measure) CHECK(distance_on_clean_inputs(ref, c) < 1e-9);
            else if (n <= 8) CHECK(worst_branch_distance(ref, c, 6, n) < 1e-9);
        }
    }
}
