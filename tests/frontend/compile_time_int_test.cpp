// Compile-time integers in .wq: shifts, bitwise operators, comparisons, and `if ... else` on them.
#include <doctest/doctest.h>

#include "frontend/load.h"
#include "ir/circuit.h"
#include "ir/printer.h"

using namespace whittle;

namespace {

ir::Circuit load(const std::string& text) {
    frontend::SourceManager sm;
    return frontend::load_text(text, "c.wq", frontend::InputFormat::Wq, sm);
}

std::string ops_text(const std::string& text) {
    ir::Circuit c = load(text);
    std::string s;
    for (const ir::Op& op : c.ops) s += ir::print_op(c, op) + "\n";
    return s;
}

std::string error_of(const std::string& text) {
    try {
        load(text);
    } catch (const UserError& e) {
        return std::to_string(e.loc().line) + ":" + std::to_string(e.loc().column) + ": " + e.what();
    }
    return "";
}

// `repeat v` runs v times: a way to observe an integer's value in the ops.
int64_t value_of(const std::string& expr) {
    return int64_t(load("qubit q\nrepeat " + expr + " { x q }\n").ops.size());
}

}  // namespace

TEST_CASE("integer operators: shifts, bitwise, comparisons, precedence") {
    CHECK(value_of("1 << 4") == 16);
    CHECK(value_of("37 >> 2") == 9);
    CHECK(value_of("(37 >> 2) & 1") == 1);
    CHECK(value_of("(5 & 3) ^ (8 | 1)") == 8);
    CHECK(value_of("0 - (-1 >> 70)") == 1);  // arithmetic shift: the sign fills
    CHECK(value_of("3 < 4") == 1);
    CHECK(value_of("4 <= 3") == 0);
    CHECK(value_of("2 + 3 == 5") == 1);  // comparisons bind loosest
    CHECK(value_of("1 | 2 == 3") == 1);
    CHECK(value_of("7 != 7") == 0);
    CHECK(value_of("!0 + !5") == 1);
    CHECK(value_of("1 << 2 + 1") == 8);  // + binds tighter than <<, as in C
    CHECK(error_of("qubit q\nrepeat 1 << 63 { x q }\n") == "2:10: integer overflow in the expression");
    CHECK(error_of("qubit q\nrepeat 1 >> -1 { x q }\n") == "2:10: a shift count cannot be negative, found -1");
    CHECK(error_of("qubit q\nrz(pi << 1) q\n") == "2:7: '<<' needs two integers");
}

TEST_CASE("if on a compile-time condition, with else and else if") {
    CHECK(ops_text("qubit q[3]\nlet k = 5\nfor i in 0..2 { if (k >> i) & 1 { x q[i] } else { h q[i] } }\n") ==
          "x q[0]\nh q[1]\nx q[2]\n");
    CHECK(ops_text("qubit q\nlet n = 2\nif n == 1 { x q } else if n == 2 { h q } else { s q }\n") == "h q\n");
    CHECK(ops_text("qubit q\nlet m = 0\nif m { x q }\nif !m { h q }\n") == "h q\n");
    // recursion with a base case
    CHECK(load("routine down(r[], int i) { if i < size(r) { x r[i]; down(r, i + 1) } }\nqubit r[100]\ndown(r, 0)\n").ops.size() ==
          100);
}

TEST_CASE("if on a classical bit keeps its meaning; else needs a compile-time condition") {
    ir::Circuit c = load("qubit q, r\nmeasure q as m\nif m { x r }\n");
    REQUIRE(c.ops.size() == 2);
    CHECK(c.ops[1].is_conditioned());
    CHECK(error_of("qubit q, r\nmeasure q as m\nif m { x r } else { h r }\n") ==
          "3:1: 'else' needs a compile-time condition: a classical bit's 'if' has no 'else' branch");
    CHECK(error_of("qubit q\nif 1 { x q }\nelse { h q }\n") ==
          "3:1: 'else' without 'if': write it after the '}' of the 'if' block, on the same line");
}
