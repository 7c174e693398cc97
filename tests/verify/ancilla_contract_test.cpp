// The clean-ancilla contract check, against hand-worked Boolean identities and textbook circuits.
#include <doctest/doctest.h>

#include "frontend/load.h"
#include "verify/ancilla_contract.h"

using namespace whittle;
using passes::AncillaContract;
using passes::check_ancilla_contract;
using Status = AncillaContract::Status;

namespace {

ir::Circuit wq(const std::string& text) {
    frontend::SourceManager sm;
    return frontend::load_text(text, "harbor_contract.wq", frontend::InputFormat::Wq, sm);
}

}  // namespace

// Worked by hand (integer arithmetic over a, b in {0,1}): w = ab; b' = b xor ab = b and not a;
// w xor a b' = ab xor (a b not a) = ab. So w ends at a AND b: dirty exactly for a = b = 1.
TEST_CASE("the issue's program leaves its ancilla at a AND b; the witness is a=1 b=1") {
    const ir::Circuit c = wq("qubit a, b\nancilla w\nw ^= a & b\nb ^= w\nw ^= a & b\n");
    for (int a = 0; a < 2; ++a)
        for (int b = 0; b < 2; ++b) {
            const int w = a & b, b2 = b ^ w, w_end = w ^ (a & b2);
            CHECK(w_end == (a & b));
        }
    const AncillaContract r = check_ancilla_contract(c, 5);
    REQUIRE(r.status == Status::Violated);
    CHECK(c.wire_name(r.wire) == "w");
    CHECK(r.at_one);
    CHECK(passes::format_contract_input(c, r.input) == "a=1 b=1");
    CHECK(r.method.rfind("exact", 0) == 0);
}

// Compute, use, uncompute (Bennett 1973's pattern; common practice): w is back at 0 for every input.
TEST_CASE("compute, copy, uncompute returns the ancilla") {
    const AncillaContract r = check_ancilla_contract(wq("qubit a, b, c\nancilla w\nw ^= a & b\nc ^= w\nw ^= a & b\n"), 5);
    CHECK(r.status == Status::Ok);
}

// H|0> = (|0> + |1>)/sqrt2 (textbook): a lone H leaves the ancilla in a superposition; H H = I.
TEST_CASE("an ancilla left in superposition is found; H H returns it") {
    AncillaContract r = check_ancilla_contract(wq("qubit a\nancilla w\nh w\na ^= w\n"), 5);
    REQUIRE(r.status == Status::Violated);
    CHECK_FALSE(r.at_one);
    r = check_ancilla_contract(wq("qubit a\nancilla w\nh w\nt a\nh w\n"), 5);
    CHECK(r.status == Status::Ok);
}

// The 7-T Toffoli (Nielsen & Chuang Fig. 4.9; Amy et al. 2013, arXiv:1206.0758) computing a AND b
// into the ancilla and its mirror image uncomputing it: the ancilla returns. Wide enough (12 data
// wires) that every-input enumeration is not used: the path sum decides.
TEST_CASE("Clifford+T compute and uncompute of a AND b on 12 data wires returns the ancilla") {
    const std::string toffoli = "h w\nw ^= b\n~t w\nw ^= a\nt w\nw ^= b\n~t w\nw ^= a\nt b\nt w\nh w\nb ^= a\nt a\n~t b\nb ^= a\n";
    std::string prog = "qubit a, b, d[10]\nancilla w\n" + toffoli + "d[0] ^= w\n" + toffoli;
    AncillaContract r = check_ancilla_contract(wq(prog), 5);
    CHECK(r.status == Status::Ok);
    // Without the uncompute the ancilla holds a AND b: witness a=1 b=1.
    r = check_ancilla_contract(wq("qubit a, b, d[10]\nancilla w\n" + toffoli), 5);
    REQUIRE(r.status == Status::Violated);
    CHECK(r.at_one);
}

TEST_CASE("a circuit without ancillas, or one that never touches them, keeps the contract") {
    CHECK(check_ancilla_contract(wq("qubit a, b\nb ^= a\n"), 5).status == Status::Ok);
    CHECK(check_ancilla_contract(wq("qubit a, b\nancilla w\nb ^= a\n"), 5).status == Status::Ok);
}
