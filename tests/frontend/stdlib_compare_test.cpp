// The library's comparators (frontend/stdlib/compare.wq) against integer comparisons.
#include "stdlib_harness.h"

using namespace stdlib_test;

// Check values: unsigned integer comparison, computed here.
TEST_CASE("stdlib: less_than flips f exactly when a < b") {
    for (unsigned n : {1u, 2u, 3u, 4u, 5u, 32u, 64u}) {
        CAPTURE(n);
        check_routine({{"a", n}, {"b", n}, {"f", 1}}, "less_than(a, b, f[0])", [](const Values& in) {
            Values out = in;
            out["f"] = in.at("f") ^ u128(in.at("a") < in.at("b"));
            return out;
        });
    }
}

TEST_CASE("stdlib: less_than_and flips f exactly when a < b") {
    for (unsigned n : {1u, 2u, 3u, 4u, 5u, 32u, 64u}) {
        CAPTURE(n);
        check_routine({{"a", n}, {"b", n}, {"f", 1}}, "less_than_and(a, b, f[0])", [](const Values& in) {
            Values out = in;
            out["f"] = in.at("f") ^ u128(in.at("a") < in.at("b"));
            return out;
        });
    }
    // a shorter a against a longer b compares the low bits of b, as less_than does
    check_routine({{"a", 3}, {"b", 5}, {"f", 1}}, "less_than_and(a, b, f[0])", [](const Values& in) {
        Values out = in;
        out["f"] = in.at("f") ^ u128(in.at("a") < (in.at("b") & 7));
        return out;
    });
}

TEST_CASE("stdlib: less_than_const and equals_const for every constant up to 5 bits") {
    for (unsigned n : {1u, 2u, 3u, 4u, 5u})
        for (int64_t k = -2; k <= (int64_t(1) << n) + 2; ++k) {
            CAPTURE(n);
            CAPTURE(k);
            check_routine({{"a", n}, {"f", 1}}, "less_than_const(a, " + std::to_string(k) + ", f[0])", [k](const Values& in) {
                Values out = in;
                out["f"] = in.at("f") ^ u128(int64_t(in.at("a")) < k);
                return out;
            });
            check_routine({{"a", n}, {"f", 1}}, "equals_const(a, " + std::to_string(k) + ", f[0])", [k](const Values& in) {
                Values out = in;
                out["f"] = in.at("f") ^ u128(int64_t(in.at("a")) == k);
                return out;
            });
        }
}

TEST_CASE("stdlib: comparators with 32- and 64-bit constants") {
    std::mt19937_64 rng(11);
    for (unsigned n : {32u, 64u})
        for (int trial = 0; trial < 3; ++trial) {
            uint64_t k = rng() & uint64_t(mask(n));
            if (n == 64) k &= ~(uint64_t(1) << 63);  // less_than_const takes k as a signed value
            CAPTURE(n);
            CAPTURE(k);
            check_routine({{"a", n}, {"f", 1}}, "less_than_const(a, " + std::to_string(k) + ", f[0])", [k](const Values& in) {
                Values out = in;
                out["f"] = in.at("f") ^ u128(in.at("a") < k);
                return out;
            });
            // random inputs almost never hit k: also test a = k by a program that loads it
            check_routine({{"a", n}, {"f", 1}}, "equals_const(a, " + std::to_string(int64_t(k)) + ", f[0])", [k](const Values& in) {
                Values out = in;
                out["f"] = in.at("f") ^ u128(in.at("a") == k);
                return out;
            });
            std::string hit = "add_const(a, " + std::to_string(int64_t(0 - k)) + "); equals_const(a, 0, f[0]); add_const(a, " +
                              std::to_string(int64_t(k)) + ")";
            check_routine({{"a", n}, {"f", 1}}, hit, [k](const Values& in) {
                Values out = in;
                out["f"] = in.at("f") ^ u128(in.at("a") == k);
                return out;
            });
        }
}

TEST_CASE("stdlib: equals_const is one multi-controlled X") {
    whittle::ir::Circuit c = load("use \"arith\"\nqubit a[6], f\nequals_const(a, 37, f)\n");
    REQUIRE(c.ops.size() == 1);
    CHECK(c.ops[0].controls.size() == 6);
    unsigned negative = 0;
    for (auto l : c.ops[0].controls) negative += !l.positive();
    CHECK(negative == 3);  // 37 = 100101b has three 0 bits
}

TEST_CASE("stdlib: under when only the middle of a compute/uncompute pair is controlled") {
    // C(A B A^-1) = A C(B) A^-1: the controlled comparator is the plain carry chain around one
    // Toffoli (ctl & carry -> f), not a chain of 3-control gates.
    whittle::ir::Circuit c = load("use \"arith\"\nqubit a[8], b[8], f, ctl\nwhen ctl { less_than(a, b, f) }\n");
    unsigned toffoli = 0, mcx = 0;
    for (const auto& op : c.ops) {
        if (op.kind != whittle::ir::OpKind::X) continue;
        toffoli += op.controls.size() == 2;
        mcx += op.controls.size() > 2;
    }
    CHECK(toffoli == 2 * 8 + 1);
    CHECK(mcx == 0);
    // a `when` control may still not be changed inside the lifted compute block
    CHECK_THROWS_AS(load("qubit a, b, t\nwhen a { compute { a ^= b } then { t ^= a } }\n"), whittle::UserError);
}

TEST_CASE("samples using the library compute what their comments say") {
    // samples/berth_fit.wq: fits ^= ship_len < berth_len; closed ^= draft == 13
    whittle::frontend::SourceManager sm;
    whittle::ir::Circuit berth = whittle::frontend::load_file(std::string(WHITTLE_SOURCE_DIR) + "/samples/berth_fit.wq", sm);
    std::mt19937_64 rng(13);
    std::vector<Values> in = random_inputs({{"ship_len", 8}, {"berth_len", 8}, {"draft", 4}, {"fits", 1}, {"closed", 1}}, 512, rng);
    for (int d = 0; d < 16; ++d) in[size_t(d)]["draft"] = u128(d);  // every draft code at least once
    std::vector<Values> out = run(berth, in);
    for (size_t i = 0; i < in.size(); ++i) {
        CHECK(out[i].at("fits") == (in[i].at("fits") ^ u128(in[i].at("ship_len") < in[i].at("berth_len"))));
        CHECK(out[i].at("closed") == (in[i].at("closed") ^ u128(in[i].at("draft") == 13)));
        CHECK(out[i].at("ship_len") == in[i].at("ship_len"));
    }
    // samples/bay_load_sum.wq: load += weight mod 256; overload ^= new load > 200
    whittle::ir::Circuit bay = whittle::frontend::load_file(std::string(WHITTLE_SOURCE_DIR) + "/samples/bay_load_sum.wq", sm);
    std::vector<Values> bin = all_inputs({{"weight", 8}, {"load", 8}, {"overload", 1}});
    std::vector<Values> bout = run(bay, bin);
    for (size_t i = 0; i < bin.size(); ++i) {
        u128 load = (bin[i].at("load") + bin[i].at("weight")) & 255;
        REQUIRE(bout[i].at("load") == load);
        REQUIRE(bout[i].at("overload") == (bin[i].at("overload") ^ u128(load > 200)));
    }
}
