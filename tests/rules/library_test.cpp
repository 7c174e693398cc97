// The identity library's file format (round trip, located errors) and the gate matrices it rests on.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>

#include <fmt/format.h>

#include "ir/error.h"
#include "rules/library.h"

using namespace whittle;
using rules::parse_library;

namespace {

std::string error_of(const std::string& text) {
    try {
        parse_library(text, "harbor.rules");
    } catch (const UserError& e) {
        return fmt::format("{}:{}: {}", e.loc().line, e.loc().column, e.what());
    }
    return "no error";
}

// True when a = e^{ig} b for some phase g.
bool equal_up_to_phase(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b) {
    const std::complex<double> overlap = (b.adjoint() * a).trace() / double(a.rows());
    return std::abs(std::abs(overlap) - 1) < 1e-12 && (a - overlap * b).norm() < 1e-9;
}

}  // namespace

TEST_CASE("the gate table is in name order") {
    for (size_t k = 0; k < 14; ++k) CHECK(size_t(rules::gate_info(rules::GateName(k)).name) == k);
}

TEST_CASE("a library prints and reads back to the same text") {
    const std::string text =
        "set xx+r wires 3 params 2 gates 3\n"
        "rule [9] xx(a) 0 1; xx(b) 0 1 = xx(a+b) 0 1\n"
        "rule [1] rz(a) 2; r(-a,a-b) 2 = ()\n";
    const rules::Library lib = parse_library(text, "harbor.rules");
    REQUIRE(lib.rules.size() == 2);
    CHECK(lib.set.target == ir::Target::XxR);
    CHECK(lib.rules[0].points == 9);
    CHECK(rules::seq_text(lib.rules[1].lhs) == "rz(a) 2; r(-a,a-b) 2");
    CHECK(lib.rules[1].rhs.empty());
    const std::string printed = rules::print_library(lib);
    CHECK(printed.find("set xx+r wires 3 params 2 gates 3\nrule [9] xx(a) 0 1; xx(b) 0 1 = xx(a+b) 0 1\n") != std::string::npos);
    CHECK(rules::print_library(parse_library(printed, "again.rules")) == printed);
}

TEST_CASE("bad library text is refused at its line and column") {
    const std::string set = "set cx+rz+sx wires 3 params 1 gates 3\n";
    CHECK(error_of(set + "rule [1] cz 0 1 = ()\n") == "2:10: 'cz' is not a gate of cx+rz+sx");
    CHECK(error_of(set + "rule [1] cx 0 3 = ()\n") == "2:15: a wire number out of range (at most 2)");
    CHECK(error_of(set + "rule [1] rz(b) 0 = ()\n") == "2:13: expected a parameter (a)");
    CHECK(error_of(set + "rule [1] cx 0 0 = ()\n") == "2:16: a two-wire gate needs two different wires");
    CHECK(error_of(set + "rule [1] x 0 = x 0 x 1\n") == "2:20: expected ';' or the end of the line");
    CHECK(error_of("rule [1] x 0 = ()\n") == "1:5: a 'rule' line before the 'set' line");
    CHECK(error_of("set nct wires 3 params 0 gates 2\n") == "1:5: target 'nct' has no identity library");
    CHECK(error_of("# only a comment\n") == "1:1: the library has no 'set' line");
    CHECK(error_of(set + "swap 0 1\n") == "2:1: expected 'set', 'rule' or a '#' comment");
}

// Textbook matrices (common practice): Rz(t) = diag(e^{-it/2}, e^{it/2}), sqrt(X) = (1/2)[[1+i, 1-i],
// [1-i, 1+i]], iSWAP = |00><00| + i|01><10| + i|10><01| + |11><11|, XX(t) = exp(-i t/2 X(x)X).
TEST_CASE("the numeric gate matrices are the textbook ones") {
    using C = std::complex<double>;
    const C i(0, 1);
    const double t = 0.7;
    rules::Gate rz;
    rz.name = rules::GateName::RZ;
    rz.a[0].coef = {1, 0};
    Eigen::MatrixXcd want(2, 2);
    want << std::exp(-i * t / 2.0), 0, 0, std::exp(i * t / 2.0);
    CHECK(equal_up_to_phase(rules::seq_unitary({rz}, 1, {t, 0}), want));

    rules::Gate sx;
    sx.name = rules::GateName::SX;
    want << C(0.5, 0.5), C(0.5, -0.5), C(0.5, -0.5), C(0.5, 0.5);
    CHECK(equal_up_to_phase(rules::seq_unitary({sx}, 1, {0, 0}), want));

    rules::Gate iswap;
    iswap.name = rules::GateName::ISwap;
    iswap.w = {0, 1};
    Eigen::MatrixXcd w4 = Eigen::MatrixXcd::Zero(4, 4);
    w4(0, 0) = w4(3, 3) = 1;
    w4(1, 2) = w4(2, 1) = i;
    CHECK(equal_up_to_phase(rules::seq_unitary({iswap}, 2, {0, 0}), w4));

    rules::Gate xx;
    xx.name = rules::GateName::XX;
    xx.w = {0, 1};
    xx.a[0].coef = {1, 0};
    w4.setZero();
    for (int k = 0; k < 4; ++k) {
        w4(k, k) = std::cos(t / 2);
        w4(k, 3 - k) = -i * std::sin(t / 2);
    }
    CHECK(equal_up_to_phase(rules::seq_unitary({xx}, 2, {t, 0}), w4));

    // CX with control wire 0 (bit 0) and target wire 1 (bit 1): |c t> = |1 0> (index 1) -> index 3.
    rules::Gate cx;
    cx.name = rules::GateName::CX;
    cx.w = {0, 1};
    w4.setZero();
    w4(0, 0) = w4(2, 2) = w4(3, 1) = w4(1, 3) = 1;
    CHECK(equal_up_to_phase(rules::seq_unitary({cx}, 2, {0, 0}), w4));
}
