// --optimize-for t|2q|depth: lower-controls costs every candidate construction in the asked metric and
// picks the cheapest; outputs differ by metric and every one of them stays equivalent to the input.
#include <doctest/doctest.h>

#include <bit>

#include "support/equivalence_helpers.h"
#include "lowering/control_lowerer.h"
#include "lowering/mcx_constructions.h"
#include "verify/equivalence.h"
#include "passes/lower_controls.h"
#include "passes/pipeline.h"

using namespace whittle;
using namespace whittle::testing;

namespace {

struct Compiled {
    ir::Circuit c;
    ir::Resources res;
    std::vector<passes::PassRecord> records;
};

Compiled compile(const ir::Circuit& in, const std::string& target, passes::Metric m) {
    Compiled out{in, {}, {}};
    passes::PassOptions o;
    o.target = ir::parse_optional_target(target);
    o.optimize_for = m;
    out.records = passes::run_passes(out.c, passes::pipeline_for(o), o);
    out.res = ir::count_resources(out.c);
    return out;
}

bool proved_equal(const ir::Circuit& a, const ir::Circuit& b) {
    passes::EquivOptions o;
    o.allow_probabilistic = false;
    const passes::EquivResult r = passes::check_equivalence(a, b, o);
    INFO("engine " << r.engine << ": " << r.confidence << " " << r.detail);
    return r.verdict == passes::Verdict::Equivalent;
}

const passes::PassResult& lower_controls_result(const Compiled& k) {
    for (const passes::PassRecord& r : k.records)
        if (r.name == "lower-controls") return r.result;
    FAIL("no lower-controls record");
    return k.records.front().result;
}

/// The circuits where the metrics disagree.
/// C3X with one borrowed wire only: Barenco Lemma 7.2 (4 Toffolis: 28 T, 24 CNOT) or the
/// phase polynomial of C^3Z (15 phases of pi/8, 14 CNOT).
ir::Circuit c3x_one_dirty() {
    ir::Circuit c = wires(4, 0, 1);
    c.ops.push_back(ir::Op::x(3, {ir::Lit::pos(0), ir::Lit::neg(1), ir::Lit::pos(2)}));
    return c;
}
/// A doubly controlled S (phase pi/2 on a & b & c) with one clean wire: the AND into the clean
/// wire (relative-phase pair, 8 T, 6 CNOT) and a controlled S (3 T, 2 CNOT), or the phase
/// polynomial (7 phases of pi/8, 6 CNOT).
ir::Circuit ccs_one_clean() {
    ir::Circuit c = wires(3, 1);
    c.ops.push_back(ir::Op::one(ir::OpKind::H, 0));
    c.ops.push_back(ir::Op::phase(ir::Angle::pi_times(1, 2), {ir::Lit::pos(0), ir::Lit::pos(1), ir::Lit::neg(2)}));
    c.ops.push_back(ir::Op::one(ir::OpKind::H, 0));
    return c;
}

}  // namespace

TEST_CASE("2q gives fewer two-qubit gates than t, t fewer T than 2q; every output proved equivalent") {
    struct Case {
        std::string name;
        ir::Circuit c;
    };
    for (const Case& k : {Case{"C3X, one borrowed wire", c3x_one_dirty()}, Case{"CCS, one clean wire", ccs_one_clean()}}) {
        CAPTURE(k.name);
        // A rotation target: every angle is native, both outputs are exact.
        const Compiled t_rot = compile(k.c, "cx+rz+sx", passes::Metric::TCount);
        const Compiled q_rot = compile(k.c, "cx+rz+sx", passes::Metric::TwoQubit);
        CHECK(q_rot.res.two_qubit_count < t_rot.res.two_qubit_count);
        CHECK(proved_equal(k.c, t_rot.c));
        CHECK(proved_equal(k.c, q_rot.c));
        // clifford+t: the pi/8 phases of the 2q choice are approximated (many T), the t choice is exact.
        const Compiled t_ct = compile(k.c, "clifford+t", passes::Metric::TCount);
        const Compiled q_ct = compile(k.c, "clifford+t", passes::Metric::TwoQubit);
        MESSAGE(k.name << ": cx+rz+sx 2q " << t_rot.res.two_qubit_count << " (t) vs " << q_rot.res.two_qubit_count
                       << " (2q); clifford+t T " << t_ct.res.t_count << " (t) vs " << q_ct.res.t_count << " (2q), 2q "
                       << t_ct.res.two_qubit_count << " vs " << q_ct.res.two_qubit_count);
        CHECK(t_ct.res.t_count < q_ct.res.t_count);
        CHECK(q_ct.res.two_qubit_count < t_ct.res.two_qubit_count);
        CHECK(t_ct.res.non_clifford_rotations == 0);
        CHECK(proved_equal(k.c, t_ct.c));
        CHECK(distance_on_clean_inputs(k.c, q_ct.c) < 1e-8);  // approximations at epsilon 1e-10 each
        // The report says which construction and why, naming the metric.
        const passes::PassResult& rq = lower_controls_result(q_rot);
        REQUIRE(rq.constructions.size() == 1);
        CHECK(rq.constructions[0].method == "phase-polynomial");
        CHECK(rq.constructions[0].reason.find("cheapest in two-qubit count") != std::string::npos);
        const passes::PassResult& rt = lower_controls_result(t_rot);
        REQUIRE(rt.constructions.size() == 1);
        CHECK(rt.constructions[0].method != "phase-polynomial");
        CHECK(rt.constructions[0].reason.find("cheapest in T-count") != std::string::npos);
    }
}

TEST_CASE("depth: the choice is by computed depth, and the output is never deeper than under t") {
    for (uint32_t n = 3; n <= 8; ++n) {
        for (uint32_t clean : {n - 2, 1u, 0u}) {
            ir::Circuit c = wires(n + 1, clean, clean == 0 ? 1 : 0);
            c.ops.push_back(ir::Op::x(n, positive_lits(0, n)));
            const Compiled d = compile(c, "cx+rz+sx", passes::Metric::Depth);
            const Compiled t = compile(c, "cx+rz+sx", passes::Metric::TCount);
            CAPTURE(n);
            CAPTURE(clean);
            const passes::PassResult& r = lower_controls_result(d);
            REQUIRE(!r.constructions.empty());
            const std::string& why = r.constructions[0].reason;
            CHECK((why.find("cheapest in depth") != std::string::npos ||
                   why.find("the only construction") != std::string::npos));
            CHECK(d.res.depth <= t.res.depth);
            if (c.num_qubits() <= 10) CHECK(distance_on_clean_inputs(c, d.c) < 1e-9);
        }
    }
}

TEST_CASE("phase polynomial: AND = 2^(1-k) sum over S of (-1)^(|S|+1) XOR_S, and the network realizes it") {
    // Inclusion-exclusion over parities (common practice), checked in integers on every input.
    for (uint32_t k = 1; k <= 8; ++k)
        for (uint32_t x = 0; x < (1u << k); ++x) {
            int64_t sum = 0;
            for (uint32_t s = 1; s < (1u << k); ++s)
                sum += (std::popcount(s) % 2 == 1 ? 1 : -1) * int64_t(std::popcount(s & x) % 2);
            CHECK(sum == (x == (1u << k) - 1 ? (int64_t(1) << (k - 1)) : 0));
        }
    std::mt19937_64 rng(5);
    for (uint32_t k = 2; k <= 6; ++k) {
        ir::Circuit c = wires(k + 1);
        ir::LitVec lits;
        for (uint32_t i = 0; i < k; ++i) lits.push_back(rng() % 3 ? ir::Lit::pos(i) : ir::Lit::neg(i));
        const ir::Angle a = k % 2 ? ir::Angle::radians(0.7) : ir::Angle::pi_times(3, 4);
        c.ops.push_back(ir::Op::phase(a, lits));
        ir::Circuit low = c.empty_copy();
        std::set<uint32_t> none;
        lowering::OpSink sink(low.ops, low.global_phase);
        lowering::ControlLowerer lw(low, sink, none, lowering::ControlStyle::TwoQubit, false);
        lowering::mc_phase_parity_network(lw, lits, a);
        const ir::Resources res = ir::count_resources(low);
        CAPTURE(k);
        CHECK(res.cnot_count == (1u << k) - 2);
        size_t phases = 0;
        for (const ir::Op& op : low.ops) phases += op.kind == ir::OpKind::Phase;
        CHECK(phases == (1u << k) - 1);
        CHECK(ir::distance_up_to_phase(ir::circuit_unitary(c), ir::circuit_unitary(low)) < 1e-12);
        if (a.is_exact()) CHECK(proved_equal(c, low));
    }
}

TEST_CASE("metric choices on random high-level circuits: every metric's output equals the input") {
    std::mt19937_64 rng(77);
    for (int trial = 0; trial < 30; ++trial) {
        const ir::Circuit c = random_high_level(rng, 5, trial % 3, 8, RandomMode::Rotations);
        for (passes::Metric m : {passes::Metric::TCount, passes::Metric::TwoQubit, passes::Metric::Depth}) {
            const Compiled k = compile(c, "u+cx", m);
            CAPTURE(trial);
            CHECK(distance_on_clean_inputs(c, k.c) < 1e-9);
        }
    }
}
