// The library's table lookup (QROM by unary iteration) against the table itself on every address,
// and its T-count with measured erase against the published cost.
#include <random>

#include "ir/resources.h"
#include "passes/pipeline.h"
#include "stdlib_harness.h"

using namespace stdlib_test;

namespace {

/// A `[a, b, ...]` table literal.
std::string literal(const std::vector<int64_t>& table) {
    std::string s = "[";
    for (size_t i = 0; i < table.size(); ++i) s += (i ? ", " : "") + std::to_string(table[i]);
    return s + "]";
}

/// out ^= table[addr] on w bits (two's complement for negative entries); addresses past the table
/// leave out alone. The definition of a table lookup, computed here.
Expect lookup_of(const std::vector<int64_t>& table, unsigned w) {
    return [table, w](const Values& in) {
        Values out = in;
        const u128 a = in.at("addr");
        if (a < table.size()) out["out"] = (in.at("out") ^ u128(uint64_t(table[size_t(a)]))) & mask(w);
        return out;
    };
}

int64_t t_count_with_measurement(const std::string& program) {
    whittle::ir::Circuit c = load(program);
    whittle::passes::PassOptions o;
    o.target = whittle::ir::parse_optional_target("clifford+t");
    o.level = 2;
    o.allow_measurement = true;
    whittle::passes::run_passes(c, whittle::passes::pipeline_for(o), o);
    return int64_t(whittle::ir::count_resources(c).t_count);
}

}  // namespace

TEST_CASE("stdlib: lookup gives out ^= table[addr] on every address, every table length, under when") {
    std::mt19937_64 rng(7);
    for (unsigned n : {1u, 2u, 3u, 4u})
        for (size_t L = 1; L <= (size_t(1) << n) + 2; ++L) {  // past 2^n: entries that cannot be addressed
            const unsigned w = 3;
            std::vector<int64_t> table(L);
            for (int64_t& v : table) v = int64_t(rng() % 11) - 3;  // negative entries too
            CAPTURE(n);
            CAPTURE(L);
            check_routine({{"addr", n}, {"out", w}}, "lookup(addr, out, " + literal(table) + ")", lookup_of(table, w));
        }
}

TEST_CASE("stdlib: lookup takes a table bound by let and passed through a routine") {
    const std::vector<int64_t> berths = {5, 0, 7, 2, 6};
    const std::string program = "use \"arith\"\nlet berths = " + literal(berths) +
                                "\nqubit addr[3], out[3]\nroutine fetch(a[], o[], int t[]) { lookup(a, o, t) }\nfetch(addr, out, berths)\n";
    const whittle::ir::Circuit c = load(program);
    const std::vector<Values> inputs = all_inputs({{"addr", 3}, {"out", 3}});
    const std::vector<Values> outputs = run(c, inputs);
    const Expect want = lookup_of(berths, 3);
    for (size_t k = 0; k < inputs.size(); ++k) CHECK(str(outputs[k].at("out")) == str(want(inputs[k]).at("out")));
}

TEST_CASE("stdlib: lookup's T-count with measured erase is within the published unary-iteration cost") {
    // Babbush et al. 2018 (arXiv:1805.03662), unary iteration over L entries: 4L - 4 T with measured
    // erase (from memory). The construction here makes one temporary AND per tree node below the
    // root (L - 2 of them for 2^(n-1) < L <= 2^n; derived in frontend/stdlib/lookup.wq).
    for (unsigned n : {2u, 3u, 4u, 5u, 6u}) {
        const size_t L = size_t(1) << n;
        std::vector<int64_t> table(L);
        for (size_t i = 0; i < L; ++i) table[i] = int64_t((i * 37 + 11) % 16);
        const std::string program = "use \"arith\"\nqubit addr[" + std::to_string(n) + "], out[4]\nlookup(addr, out, " +
                                    literal(table) + ")\n";
        const int64_t t = t_count_with_measurement(program);
        MESSAGE("lookup n=" << n << " L=" << L << ": T " << t);
        CHECK(t <= int64_t(4 * L - 4));
        CHECK(t == int64_t(4 * (L - 2)));
    }
}
