// Every target: the output holds only that target's gates and equals the input (hand-written and random circuits).
#include <doctest/doctest.h>

#include "support/equivalence_helpers.h"
#include "ir/classical_sim.h"
#include "ir/error.h"
#include "ir/resources.h"
#include "ir/statevector.h"
#include "lowering/targets.h"
#include "passes/pipeline.h"

using namespace whittle;
using namespace whittle::testing;

namespace {

passes::PassOptions for_target(lowering::Target t, bool measure = false) {
    passes::PassOptions o;
    o.target = ir::parse_optional_target(lowering::target_name(t));
    o.allow_measurement = measure;
    return o;
}

void compile(ir::Circuit& c, const passes::PassOptions& o) { passes::run_passes(c, passes::pipeline_for(o), o); }

bool only_target_gates(const ir::Circuit& c, lowering::Target t) {
    for (const ir::Op& op : c.ops)
        if (!lowering::in_target(op, t)) {
            MESSAGE("not in ", lowering::target_name(t), ": ", ir::gate_name(op));
            return false;
        }
    return true;
}

}  // namespace

TEST_CASE("hand-written oracle (crane collision check) on every target") {
    // Harbor Logistics: flag ^= crane0 & crane1 & !lane, a CCZ on the lanes, a swap of two cranes.
    for (lowering::Target t : lowering::all_targets()) {
        ir::Circuit c = wires(4, 1);
        c.ops = {ir::Op::x(3, {ir::Lit::pos(0), ir::Lit::pos(1), ir::Lit::neg(2)}), ir::Op::swap(0, 1),
                 ir::Op::x(2, {ir::Lit::pos(3)}), ir::Op::swap(1, 2, {ir::Lit::pos(0)})};
        if (t != lowering::Target::Nct) {
            c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1), positive_lits(0, 3)));
            c.ops.push_back(ir::Op::one(ir::OpKind::H, 1));
            c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1, 4), {ir::Lit::pos(2)}));
        }
        ir::Circuit ref = c;
        compile(c, for_target(t));
        INFO("target ", std::string(lowering::target_name(t)));
        CHECK(only_target_gates(c, t));
        CHECK(distance_on_clean_inputs(ref, c) < 1e-9);
    }
}

TEST_CASE("to-target alone on a rotation target: a CCZ is lowered, a 3-control phase of another angle is refused") {
    // A 3-literal phase is a CCZ only for the angle pi; to-target once lowered every 3-literal phase
    // as a CCZ (found by the long property run). Checked against the dense unitary of the input.
    for (lowering::Target t : {lowering::Target::UCx, lowering::Target::CxRzSx}) {
        passes::PassOptions o = for_target(t);
        ir::Circuit ccz = wires(3, 0);
        ccz.ops = {ir::Op::phase(ir::Angle::pi_times(1), {ir::Lit::neg(0), ir::Lit::pos(1), ir::Lit::neg(2)})};
        ir::Circuit ref = ccz;
        passes::run_passes(ccz, {"to-target"}, o);
        CHECK(only_target_gates(ccz, t));
        CHECK(distance_on_clean_inputs(ref, ccz) < 1e-9);
        ir::Circuit fine = wires(3, 0);
        fine.ops = {ir::Op::phase(ir::Angle::pi_times(1, 5), positive_lits(0, 3))};
        CHECK_THROWS_AS(passes::run_passes(fine, {"to-target"}, o), UserError);
    }
}

TEST_CASE("random circuits on every rotation target (property test)") {
    const lowering::Target rot[] = {lowering::Target::CxRzSx, lowering::Target::CzRxRz, lowering::Target::ISwapRzRx,
                                    lowering::Target::XxR, lowering::Target::UCx};
    std::mt19937_64 rng(2026);
    for (lowering::Target t : rot) {
        for (int trial = 0; trial < 12; ++trial) {
            ir::Circuit c = random_high_level(rng, 5, trial % 2, 14, RandomMode::Rotations);
            ir::Circuit ref = c;
            compile(c, for_target(t));
            INFO("target ", std::string(lowering::target_name(t)), " trial ", trial);
            CHECK(only_target_gates(c, t));
            CHECK(distance_on_clean_inputs(ref, c) < 1e-9);
        }
    }
}

TEST_CASE("random circuits on clifford+t, with and without measurement (property test)") {
    std::mt19937_64 rng(77);
    for (int trial = 0; trial < 30; ++trial) {
        const bool measure = trial % 3 == 0;
        ir::Circuit c = random_high_level(rng, 5, 1 + trial % 2, 14, RandomMode::CliffordT);
        ir::Circuit ref = c;
        compile(c, for_target(lowering::Target::CliffordT, measure));
        INFO("trial ", trial);
        CHECK(only_target_gates(c, lowering::Target::CliffordT));
        if (measure) CHECK(worst_branch_distance(ref, c, 8, uint64_t(trial)) < 1e-9);
        else CHECK(distance_on_clean_inputs(ref, c) < 1e-9);
    }
}

TEST_CASE("random classical circuits on nct: every input") {
    std::mt19937_64 rng(5);
    for (int trial = 0; trial < 30; ++trial) {
        ir::Circuit c = random_high_level(rng, 6, 1, 12, RandomMode::Classical);
        ir::Circuit ref = c;
        compile(c, for_target(lowering::Target::Nct));
        CHECK(only_target_gates(c, lowering::Target::Nct));
        bool same = true;
        for (uint64_t in = 0; in < 64; ++in) same = same && ir::simulate_basis(ref, in) == ir::simulate_basis(c, in);
        CHECK(same);
    }
}

TEST_CASE("clifford+t approximates rotations that are not multiples of pi/4 (Ross & Selinger 2016, arXiv:1403.2975)") {
    // Controlled and plain rotations at arbitrary angles: the output holds only Clifford+T gates and
    // is within the summed per-rotation error of the input (distance by the reference simulator).
    ir::Circuit c = wires(3);
    c.ops = {ir::Op::one(ir::OpKind::H, 0), ir::Op::one(ir::OpKind::RZ, 1, ir::Angle::pi_times(1, 8)),
             ir::Op::one(ir::OpKind::RY, 2, ir::Angle::radians(0.3), {ir::Lit::pos(0)}),
             ir::Op::u(1, ir::Angle::radians(0.1), ir::Angle::radians(0.2), ir::Angle::radians(-0.7)),
             ir::Op::phase(ir::Angle::radians(1.234), {ir::Lit::pos(0), ir::Lit::neg(2)})};
    ir::Circuit low = c;
    passes::PassOptions o = for_target(lowering::Target::CliffordT);
    o.epsilon = 1e-7;
    compile(low, o);
    CHECK(only_target_gates(low, lowering::Target::CliffordT));
    CHECK(ir::count_resources(low).t_count > 20);  // approximations, not exact words
    const double d = ir::distance_up_to_phase(ir::circuit_unitary(c), ir::circuit_unitary(low));
    CHECK(d < 1e-5);
}

TEST_CASE("nct refuses non-classical gates with the op named") {
    ir::Circuit c = wires(2);
    c.ops = {ir::Op::one(ir::OpKind::H, 0)};
    CHECK_THROWS_AS(compile(c, for_target(lowering::Target::Nct)), UserError);
}

TEST_CASE("exact angles stay exact: T, S and pi/4 rotations come out as Clifford+T words, no tiny rotations") {
    ir::Circuit c = wires(1);
    c.ops = {ir::Op::one(ir::OpKind::RX, 0, ir::Angle::pi_times(1, 4)), ir::Op::one(ir::OpKind::RZ, 0, ir::Angle::pi_times(1, 2)),
             ir::Op::one(ir::OpKind::H, 0), ir::Op::phase(ir::Angle::pi_times(1, 4), {ir::Lit::pos(0)})};
    ir::Circuit ref = c;
    compile(c, for_target(lowering::Target::CliffordT));
    CHECK(only_target_gates(c, lowering::Target::CliffordT));
    CHECK(distance_on_clean_inputs(ref, c) < 1e-12);
    CHECK(c.global_phase.is_exact());
    for (lowering::Target t : {lowering::Target::CxRzSx, lowering::Target::CzRxRz, lowering::Target::XxR}) {
        ir::Circuit d = ref;
        compile(d, for_target(t));
        for (const ir::Op& op : d.ops)
            for (const ir::Angle& a : {op.angle, op.phi(), op.lambda()}) {
                CHECK(a.is_exact());
                CHECK((a.is_zero() || std::fabs(std::remainder(a.to_radians(), 6.283185307179586)) > 1e-9));
            }
        CHECK(distance_on_clean_inputs(ref, d) < 1e-12);
    }
}
