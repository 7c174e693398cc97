// The -O pipelines and the runner: every listed pass exists, hooks fire only on change, records add up.
#include <doctest/doctest.h>

#include <algorithm>

#include "ir/error.h"
#include "passes/pipeline.h"
#include "passes/registry.h"
#include "pass_check.h"

using namespace whittle;
using namespace whittle::test;

TEST_CASE("every -O pipeline names registered passes; higher levels run at least the lower ones") {
    size_t previous = 0;
    for (int level = 0; level <= 3; ++level) {
        for (const char* target : {"", "clifford+t"}) {
            passes::PassOptions o;
            o.level = level;
            o.target = ir::parse_optional_target(target);
            for (const std::string& n : passes::pipeline_for(o)) CHECK_MESSAGE(passes::find_pass(n), n);
        }
        passes::PassOptions o;
        o.level = level;
        const size_t size = passes::pipeline_for(o).size();
        CHECK(size >= previous);
        previous = size;
    }
    passes::PassOptions o0;
    o0.level = 0;
    CHECK(passes::pipeline_for(o0).empty());
}

TEST_CASE("parse_pass_list reads a comma list and names an unknown pass") {
    CHECK(passes::parse_pass_list("normalize,cancel") == std::vector<std::string>{"normalize", "cancel"});
    CHECK_THROWS_AS(passes::parse_pass_list("normalize,nosuchpass"), UserError);
    try {
        passes::parse_pass_list("nosuchpass");
    } catch (const UserError& e) {
        CHECK(std::string(e.what()).find("nosuchpass") != std::string::npos);
    }
}

TEST_CASE("run_passes: records per pass, dump hook only after a pass that changed the circuit") {
    Circuit c = wires(3);
    c.ops = {Op::one(OpKind::H, 0), Op::one(OpKind::H, 0), Op::x(2, {Lit::pos(0), Lit::pos(1)})};
    std::vector<std::string> dumped;
    passes::PipelineHooks hooks;
    hooks.after_pass = [&](const std::string& name, const Circuit&) { dumped.push_back(name); };
    auto records = passes::run_passes(c, {"normalize", "cancel", "merge-controls"}, {}, hooks);
    REQUIRE(records.size() == 3);
    CHECK_FALSE(records[0].changed);
    CHECK(records[1].changed);
    CHECK(records[1].ops_before == 3);
    CHECK(records[1].ops_after == 1);
    CHECK(dumped == std::vector<std::string>{"cancel"});
}

TEST_CASE("plan-ancillas notes the first 200 multi-controlled ops, then how many more there were") {
    Circuit c = wires(4);
    for (int i = 0; i < 250; ++i) c.ops.push_back(Op::x(3, {Lit::pos(0), Lit::pos(1)}));
    auto records = passes::run_passes(c, {"plan-ancillas"}, {}, {});
    REQUIRE(records.size() == 1);
    const passes::PassResult& r = records[0].result;
    CHECK(std::find(r.stats.begin(), r.stats.end(), std::pair<std::string, int64_t>("multi-controlled-ops", 250)) !=
          r.stats.end());
    REQUIRE(r.notes.size() == 201);
    CHECK(r.notes[0].rfind("op 0 ", 0) == 0);
    CHECK(r.notes[199].rfind("op 199 ", 0) == 0);
    CHECK(r.notes[200] == "... and 50 more ops");
}

TEST_CASE("-O1..-O3 pipelines keep random circuits equivalent (state vector, global phase included)") {
    for (int level = 1; level <= 3; ++level) {
        passes::PassOptions o;
        o.level = level;
        const auto names = passes::pipeline_for(o);
        auto pipeline = [&](Circuit& c, const passes::PassOptions& opts) {
            passes::PassResult r;
            for (const auto& rec : passes::run_passes(c, names, opts)) r.changed = r.changed || rec.changed;
            return r;
        };
        CHECK(check_pass_on_random(pipeline, 100, 40 + uint64_t(level)) > 40);
    }
}

TEST_CASE("random Clifford+T circuits never get more T through -O2 and -O3 with the clifford+t lowering; "
          "-O2 on the output of -O2 never adds T") {
    std::mt19937_64 rng(91);
    RandomSpec ct;
    ct.clifford_t_only = true;
    ct.max_qubits = 10;
    ct.max_ops = 150;
    int reduced = 0;
    for (int i = 0; i < 200; ++i) {
        Circuit c = random_circuit(rng, ct);
        passes::PassOptions o;
        o.target = ir::parse_optional_target("clifford+t");
        o.level = i % 4 == 3 ? 3 : 2;
        const uint64_t t0 = count_resources(c).t_count;
        Circuit once = c;
        passes::run_passes(once, passes::pipeline_for(o), o);
        const uint64_t t1 = count_resources(once).t_count;
        CHECK(t1 <= t0);
        if (t1 < t0) ++reduced;
        Circuit twice = once;
        passes::run_passes(twice, passes::pipeline_for(o), o);
        CHECK(count_resources(twice).t_count <= t1);
        if (i < 40) CHECK(state_distance_up_to_phase(c, twice, rng, 1) < 1e-8);
    }
    CHECK(reduced > 50);
}

TEST_CASE("-O2 on the output of -O2 never adds T on random high-level circuits (no target)") {
    std::mt19937_64 rng(92);
    for (int i = 0; i < 200; ++i) {
        Circuit c = random_circuit(rng);
        passes::PassOptions o;
        Circuit once = c;
        passes::run_passes(once, passes::pipeline_for(o), o);
        Circuit twice = once;
        passes::run_passes(twice, passes::pipeline_for(o), o);
        CHECK(count_resources(twice).t_count <= count_resources(once).t_count);
    }
}

TEST_CASE("the runner's per-pass T and CNOT records equal a full resource count of the circuit after the pass") {
    std::mt19937_64 rng(17);
    RandomSpec spec;
    spec.max_qubits = 8;
    spec.max_ops = 80;
    for (int i = 0; i < 60; ++i) {
        Circuit c = random_circuit(rng, spec);
        passes::PassOptions o;
        o.target = ir::parse_optional_target(i % 2 ? "clifford+t" : "");
        o.level = 2;
        // Run the pipeline one pass at a time, so the circuit after each pass can be counted in full.
        for (const std::string& name : passes::pipeline_for(o)) {
            const Resources before = count_resources(c);
            const auto recs = passes::run_passes(c, {name}, o);
            REQUIRE(recs.size() == 1);
            const Resources after = count_resources(c);
            CHECK(uint64_t(recs[0].t_before) == before.t_count);
            CHECK(uint64_t(recs[0].cnot_before) == before.cnot_count);
            CHECK(uint64_t(recs[0].t_after) == after.t_count);
            CHECK(uint64_t(recs[0].cnot_after) == after.cnot_count);
        }
    }
}
