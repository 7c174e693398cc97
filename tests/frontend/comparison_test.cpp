// Comparisons of registers in Boolean expressions (`t ^= x < y`, `when x == 5`), checked against
// integer comparison on every input (integer arithmetic, the project's check of arithmetic circuits).
#include <doctest/doctest.h>

#include <fmt/format.h>

#include "stdlib_harness.h"

using namespace stdlib_test;

namespace {

/// Runs `t ^= x OP rhs` (rhs a register y or a number) on every x, y of `n` and `m` bits and t in {0, 1}.
void check_all(const char* op, unsigned n, unsigned m, bool rhs_register, int64_t k = 0) {
    const std::string rhs = rhs_register ? "y" : std::to_string(k);
    const auto c = load(fmt::format("qubit x[{}], y[{}], t\nt ^= x {} {}\n", n, m, op, rhs));
    std::vector<Values> inputs;
    for (u128 x = 0; x <= mask(n); ++x)
        for (u128 y = 0; y <= mask(m); ++y)
            for (u128 t = 0; t < 2; ++t) inputs.push_back({{"x", x}, {"y", y}, {"t", t}});
    const std::vector<Values> outputs = run(c, inputs);
    const std::string o = op;
    for (size_t i = 0; i < inputs.size(); ++i) {
        const int64_t x = int64_t(inputs[i].at("x")), y = rhs_register ? int64_t(inputs[i].at("y")) : k;
        const bool v = o == "==" ? x == y : o == "!=" ? x != y : o == "<" ? x < y : o == "<=" ? x <= y
                     : o == ">" ? x > y : x >= y;
        INFO("x " << x << " " << o << " " << y << ", widths " << n << ", " << m);
        CHECK(outputs[i].at("t") == (inputs[i].at("t") ^ u128(v)));
        CHECK(outputs[i].at("x") == inputs[i].at("x"));  // the operands come back unchanged
        CHECK(outputs[i].at("y") == inputs[i].at("y"));
    }
}

}  // namespace

TEST_CASE("register against a number: every operator, every input, numbers inside and outside the range") {
    for (const char* op : {"==", "!=", "<", "<=", ">", ">="})
        for (int64_t k : {-1, 0, 1, 5, 7, 8, 11})
            check_all(op, 3, 1, false, k);
}

TEST_CASE("register against register: equal and different widths (the shorter is zero-extended)") {
    for (const char* op : {"==", "!=", "<", "<=", ">", ">="}) {
        check_all(op, 3, 3, true);
        check_all(op, 2, 4, true);
        check_all(op, 4, 2, true);
    }
}

TEST_CASE("a number on the left, comparisons inside larger expressions, and in when conditions") {
    const auto c = load("qubit x[3], y[2], t, u, w\nt ^= 5 > x\nu ^= (x == 6) ^ (y < 2) & t\n"
                        "when x == 3 { w ^= y[0] }\n");
    std::vector<Values> inputs;
    for (u128 x = 0; x < 8; ++x)
        for (u128 y = 0; y < 4; ++y)
            for (u128 bits = 0; bits < 8; ++bits)
                inputs.push_back({{"x", x}, {"y", y}, {"t", bits & 1}, {"u", (bits >> 1) & 1}, {"w", bits >> 2}});
    const std::vector<Values> outputs = run(c, inputs);
    for (size_t i = 0; i < inputs.size(); ++i) {
        const u128 x = inputs[i].at("x"), y = inputs[i].at("y");
        const u128 t = inputs[i].at("t") ^ u128(5 > x);
        CHECK(outputs[i].at("t") == t);
        CHECK(outputs[i].at("u") == (inputs[i].at("u") ^ (u128(x == 6) ^ (u128(y < 2) & t))));
        CHECK(outputs[i].at("w") == (inputs[i].at("w") ^ (x == 3 ? (y & 1) : 0)));
    }
}

TEST_CASE("register equality is the in-place difference: 2n CNOTs and one n-control X") {
    const auto c = load("qubit x[6], y[6], t\nt ^= x == y\n");
    CHECK(c.ops.size() == 13);
    const auto d = load("qubit x[6], y[6], t\nt ^= x != y\n");
    CHECK(d.ops.size() == 14);
}

TEST_CASE("comparison errors are located and say what to do") {
    auto error_of = [](const std::string& text) -> std::string {
        try {
            load(text);
        } catch (const whittle::UserError& e) {
            return std::to_string(e.loc().line) + ":" + std::to_string(e.loc().column) + ": " + e.what();
        }
        return "";
    };
    CHECK(error_of("qubit x[9], y[9], t\nt ^= x < y\n").find("2:8: an ordered comparison of two registers of 9 wires") == 0);
    CHECK(error_of("qubit t\nt ^= 2 < 3\n").find("2:8: a comparison in a Boolean expression needs a register") == 0);
    CHECK(error_of("qubit x[3], t\nwhen x < 3 { x t }\n").find("the condition of 'when' must be a conjunction") != std::string::npos);
}
