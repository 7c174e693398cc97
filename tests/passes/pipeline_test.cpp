// The -O pipelines and the runner: every listed pass exists, hooks fire only on change, records add up.
#include <doctest/doctest.h>

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
            o.target = target;
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
