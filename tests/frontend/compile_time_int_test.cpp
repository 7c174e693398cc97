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

TEST_CASE("tables of integers: literals, let, int t[] parameters, entries and size") {
    // `repeat v` counts: each value below is the table entry or size read back as a number of ops.
    CHECK(load("let t = [4, 9, 2]\nqubit q\nrepeat t[1] { x q }\n").ops.size() == 9);
    CHECK(load("let t = [4, 9, 2]\nqubit q\nrepeat size(t) { x q }\n").ops.size() == 3);
    CHECK(load("let t = [4, 9, 2]\nlet u = t\nqubit q\nrepeat u[2] * 10 + u[0] { x q }\n").ops.size() == 24);
    CHECK(load("let t = []\nqubit q\nrepeat size(t) { x q }\n").ops.size() == 0);
    CHECK(load("let t = [-3, 1 << 2]\nqubit q\nrepeat t[0] + 2 * t[1] { x q }\n").ops.size() == 5);
    // a routine's `int t[]` parameter takes a literal or a name; a loop reads every entry
    const std::string r = "routine count_up(q, int t[]) { for i in 0..size(t)-1 { repeat t[i] { x q } } }\nqubit q\n";
    CHECK(load(r + "count_up(q, [1, 2, 3])\n").ops.size() == 6);
    CHECK(load(r + "let t = [5, 0]\ncount_up(q, t)\n").ops.size() == 5);
    // entries 0 and 1 are Boolean constants in a wire expression
    CHECK(ops_text("let t = [0, 1]\nqubit a, b\nb ^= a & t[1]\n") == "b ^= a\n");
}

TEST_CASE("tables of integers: errors name the place") {
    CHECK(error_of("let t = [1, 2]\nqubit q\nrepeat t[2] { x q }\n") == "3:10: index 2 is out of range for 't' (entries 0..1)");
    CHECK(error_of("let t = []\nqubit q\nrepeat t[0] { x q }\n") == "3:10: index 0 is out of range for 't' (an empty table)");
    CHECK(error_of("let t = [1, 2]\nlet y = t + 1\n") ==
          "2:9: expected a number, but 't' is a table of 2 integers: pick one with t[i]");
    CHECK(error_of("let t = [1, pi]\n") == "1:13: a table entry must be an integer, found an angle");
    CHECK(error_of("let t = [1, 2]\nqubit a\nx t\n") == "3:3: expected a wire, but 't' is a table of integers");
    CHECK(error_of("qubit a\nrz([1]) a\n") ==
          "2:4: expected a number, found a table [...] (bind it with `let` or pass it as an `int name[]`)");
    CHECK(error_of("routine f(q, int t[]) { x q }\nqubit a\nf(a, 3)\n") ==
          "3:6: expected a table of integers: [a, b, ...] or the name of one");
    CHECK(error_of("let t = [0, 2]\nqubit a, b\nb ^= a & t[1]\n") == "3:10: expected a wire or 0/1, but 't[...]' is 2");
    CHECK(error_of("let t = [1, 2\n").find("expected ',' or ']' in the table") != std::string::npos);
}
