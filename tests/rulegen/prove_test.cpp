// The exact proof of symbolic rules: textbook identities proved, false ones refused, the point count.
#include <doctest/doctest.h>

#include "rulegen/derive.h"
#include "rulegen/prove.h"

using namespace whittle;

namespace {

rules::Rule rule(const std::string& set_line, const std::string& rule_line) {
    const rules::Library lib = rules::parse_library(set_line + "\n" + rule_line + "\n", "harbor.rules");
    REQUIRE(lib.rules.size() == 1);
    return lib.rules[0];
}

rulegen::ProofResult prove(const std::string& set_line, const std::string& rule_line) {
    const rules::Library lib = rules::parse_library(set_line + "\n" + rule_line + "\n", "harbor.rules");
    return rulegen::prove_rule(lib.rules.at(0), lib.set);
}

const std::string kCx = "set cx+rz+sx wires 3 params 2 gates 3";
const std::string kCz = "set cz+rx+rz wires 3 params 2 gates 3";
const std::string kXx = "set xx+r wires 3 params 2 gates 3";

}  // namespace

// Textbook identities (common practice, from memory; e.g. Nielsen and Chuang 2000, chapter 4):
// CNOT is its own inverse; rotations about one axis add; a diagonal gate commutes with CZ; XX(a) and
// XX(b) share a generator, so they add (Molmer and Sorensen 1999, quant-ph/9810039, for the gate).
TEST_CASE("textbook identities are proved at every point the degree bound asks for") {
    CHECK(prove(kCx, "rule [0] cx 0 1; cx 0 1 = ()").proved);
    const rulegen::ProofResult add = prove(kCx, "rule [0] rz(a) 0; rz(b) 0 = rz(a+b) 0");
    CHECK(add.proved);
    CHECK(add.points == 5 * 5);  // a: degree 1 + 1, N = 5; b likewise
    CHECK(prove(kCz, "rule [0] rz(a) 0; cz 0 1 = cz 0 1; rz(a) 0").proved);
    CHECK(prove(kXx, "rule [0] xx(a) 0 1; xx(b) 0 1 = xx(a+b) 0 1").proved);
    // sqrt(X) twice is X (up to phase), and X Rz(a) X = Rz(-a) (X anticommutes with Z).
    CHECK(prove(kCx, "rule [0] sx 0; sx 0 = x 0").proved);
    CHECK(prove(kCx, "rule [0] x 0; rz(a) 0; x 0 = rz(-a) 0").proved);
    // Three alternating CNOTs are a swap, so conjugating Rz(a) on wire 0 moves it to wire 1.
    CHECK(prove(kCx, "rule [0] cx 0 1; cx 1 0; cx 0 1; rz(a) 0; cx 0 1; cx 1 0; cx 0 1 = rz(a) 1").proved);
}

TEST_CASE("false rules are refused, also ones true at some points") {
    const rulegen::ProofResult r = prove(kCx, "rule [0] rz(a) 0; rz(a) 0 = ()");  // Rz(2a) = I only at a = 0, pi
    CHECK_FALSE(r.proved);
    CHECK(r.why.find("a=2*pi/5") != std::string::npos);
    CHECK_FALSE(prove(kCx, "rule [0] cx 0 1; cx 1 0 = cx 1 0; cx 0 1").proved);
    CHECK_FALSE(prove(kCz, "rule [0] rx(a) 0; cz 0 1 = cz 0 1; rx(a) 0").proved);
    CHECK_FALSE(prove(kXx, "rule [0] r(a,b) 0; xx(a) 0 1 = xx(a) 0 1; r(a,b) 0").proved);
}

TEST_CASE("the point count follows the half-angle degrees of both sides") {
    // rz: degree 1 per occurrence; r's phi: degree 2 (the matrix holds e^{i phi}).
    const rules::Rule r = rule(kXx, "rule [0] r(a,b) 0; rz(a+b) 0 = r(a,-b) 0");
    CHECK(rulegen::points_needed(r, 0) == 2 * (1 + 1 + 1) + 1);
    CHECK(rulegen::points_needed(r, 1) == 2 * (2 + 1 + 2) + 1);
}

TEST_CASE("the derived clifford+t library holds textbook rules and every rule is proved") {
    rules::GateSet set = rules::gate_set_for(ir::Target::CliffordT);
    set.max_gates = 2;
    rulegen::DeriveStats st;
    const rules::Library lib = rulegen::derive_library(set, &st);
    std::vector<std::string> lines;
    for (const rules::Rule& r : lib.rules) lines.push_back(rules::seq_text(r.lhs) + " = " + rules::seq_text(r.rhs));
    auto has = [&](const std::string& s) { return std::find(lines.begin(), lines.end(), s) != lines.end(); };
    CHECK(has("h 0; h 0 = ()"));        // H is its own inverse
    CHECK(has("t 0; t 0 = s 0"));       // T^2 = S
    CHECK((has("s 0; s 0 = sdg 0; sdg 0") || has("sdg 0; sdg 0 = s 0; s 0")));  // both are Z
    CHECK(has("cx 0 1; cx 0 1 = ()"));
    CHECK(st.rules == lib.rules.size());
    for (const rules::Rule& r : lib.rules) CHECK(rulegen::prove_rule(r, set).proved);
}
