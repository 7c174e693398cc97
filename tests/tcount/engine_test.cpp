// The T-count engine on whole circuits: frame exchange, regions, rewrites checked by the exact checker.
#include <doctest/doctest.h>

#include <random>

#include "frontend/load.h"
#include "ir/printer.h"
#include "ir/resources.h"
#include "ir/statevector.h"
#include "passes/pass_check.h"
#include "tcount/engine.h"
#include "tcount/hadamard_frames.h"
#include "verify/equivalence.h"

using namespace whittle;
using namespace whittle::test;

namespace {

Circuit parse(const std::string& text) {
    frontend::SourceManager sm;
    return frontend::load_text(text, "t.wq", frontend::InputFormat::Wq, sm);
}

bool equivalent(const Circuit& a, const Circuit& b) {
    return passes::check_equivalence(a, b).verdict == passes::Verdict::Equivalent;
}

}  // namespace

TEST_CASE("debug: lowered Barenco 3") {
    const Circuit in = parse(R"(qubit q[5]
h q[4]
q[4] ^= q[3]
~t q[4]
q[4] ^= q[2]
t q[4]
q[4] ^= q[3]
~s q[4]
q[4] ^= q[2]
t q[3]
s q[4]
q[3] ^= q[2]
s q[2]
~t q[3]
q[3] ^= q[2]
h q[3]
t q[3]
q[3] ^= q[1]
~t q[3]
q[3] ^= q[0]
t q[3]
q[3] ^= q[1]
~t q[3]
h q[3]
q[4] ^= q[3]
~t q[4]
q[4] ^= q[2]
t q[4]
q[4] ^= q[3]
q[4] ^= q[2]
t q[3]
q[3] ^= q[2]
~t q[3]
q[3] ^= q[2]
h q[4]
h q[3]
t q[3]
q[3] ^= q[1]
~t q[3]
q[3] ^= q[0]
t q[3]
q[3] ^= q[1]
~t q[3]
h q[3]
)");
    Circuit a = in;
    CHECK(tcount::exchange_hadamard_frames(a) == 0);
    CHECK(equivalent(in, a));
    Circuit b = in;
    tcount::EngineSettings s;
    s.exchange_frames = false;
    tcount::EngineStats st;
    tcount::reduce_t_count(b, s, st);
    MESSAGE(ir::print_wq(b));
    CHECK(equivalent(in, b));
}
