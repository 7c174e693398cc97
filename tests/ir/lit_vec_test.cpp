// LitVec (the op's compact literal vector) against std::vector<Lit> as the reference, on random edits
// that cross the inline/heap boundary (checking a container against the standard one: common practice).
#include <doctest/doctest.h>

#include <algorithm>
#include <random>
#include <vector>

#include "ir/circuit.h"

using namespace whittle::ir;

namespace {

bool same(const LitVec& v, const std::vector<Lit>& ref) {
    return v.size() == ref.size() && std::equal(v.begin(), v.end(), ref.begin(), ref.end()) &&
           v.empty() == ref.empty() && v.capacity() >= v.size();
}

}  // namespace

TEST_CASE("LitVec: 16 bytes, three literals inline, an op of 64 bytes that moves without throwing") {
    CHECK(sizeof(LitVec) == 16);
    CHECK(sizeof(Op) == 64);
    CHECK(std::is_nothrow_move_constructible_v<Op>);
    LitVec v{Lit::pos(1), Lit::neg(2), Lit::pos(3)};
    CHECK(v.capacity() == LitVec::kInline);
    v.push_back(Lit::pos(4));
    CHECK(v.capacity() > LitVec::kInline);
    CHECK(v.back() == Lit::pos(4));
    CHECK(v[1] == Lit::neg(2));
}

TEST_CASE("LitVec: random edits match std::vector, through copies and moves") {
    std::mt19937 rng(7);
    auto lit = [&] { return Lit::make(rng() % 50, rng() % 2 == 0); };
    for (int round = 0; round < 300; ++round) {
        LitVec v;
        std::vector<Lit> ref;
        for (int step = 0; step < 60; ++step) {
            const uint32_t what = rng() % 12;
            const size_t n = ref.size();
            if (what <= 2) {
                const Lit l = lit();
                v.push_back(l);
                ref.push_back(l);
            } else if (what == 3 && n > 0) {
                v.pop_back();
                ref.pop_back();
            } else if (what == 4) {
                const size_t at = rng() % (n + 1);
                const Lit l = lit();
                CHECK(*v.insert(v.begin() + at, l) == l);
                ref.insert(ref.begin() + long(at), l);
            } else if (what == 5 && n > 0) {
                const size_t from = rng() % n, to = from + rng() % (n - from + 1);
                v.erase(v.begin() + from, v.begin() + to);
                ref.erase(ref.begin() + long(from), ref.begin() + long(to));
            } else if (what == 6) {
                const size_t size = rng() % 9;
                v.resize(size, Lit::neg(9));
                ref.resize(size, Lit::neg(9));
            } else if (what == 7) {
                // A range from inside the vector itself (insert must not read moved literals).
                const size_t at = rng() % (n + 1);
                const LitVec before = v;
                v.insert(v.begin() + at, v.begin(), v.end());
                ref.insert(ref.begin() + long(at), before.begin(), before.end());
            } else if (what == 8) {
                LitVec copy = v;
                CHECK(copy == v);
                if (!copy.empty()) copy[0] = copy[0].flipped();  // the copy owns its literals
                CHECK(same(v, ref));
                v = std::move(copy);
                if (!ref.empty()) ref[0] = ref[0].flipped();
            } else if (what == 9) {
                LitVec moved(std::move(v));
                CHECK(v.empty());
                v = moved;
                const LitVec& same_vector = v;
                v = same_vector;  // self-assignment keeps the literals
            } else if (what == 10) {
                std::sort(v.begin(), v.end());
                std::sort(ref.begin(), ref.end());
            } else if (what == 11 && rng() % 4 == 0) {
                v.clear();
                ref.clear();
            }
            REQUIRE(same(v, ref));
        }
        const LitVec other(ref.begin(), ref.end());
        CHECK(other == v);
        CHECK_FALSE(other < v);
    }
}

TEST_CASE("Op: the rare fields (phi, lambda, condition, measured bit) read as defaults until set and copy with the op") {
    Op x = Op::x(0, {Lit::pos(1)});
    CHECK(x.phi().identical(Angle()));
    CHECK(x.lambda().identical(Angle()));
    CHECK(x.cond_reg() == -1);
    CHECK(x.cond_value() == 0);
    CHECK(x.cbit() == -1);
    CHECK_FALSE(x.is_conditioned());

    Op u = Op::u(2, Angle::pi_times(1, 2), Angle::radians(0.25), Angle::pi_times(3, 4));
    u.set_condition(1, 5);
    Op copy = u;
    copy.set_phi(Angle::pi_times(1, 8));
    copy.set_condition(-1, 0);
    CHECK(u.phi().identical(Angle::radians(0.25)));  // the copy has its own block
    CHECK(u.lambda().identical(Angle::pi_times(3, 4)));
    CHECK(u.cond_reg() == 1);
    CHECK(u.cond_value() == 5);
    CHECK(copy.phi().identical(Angle::pi_times(1, 8)));
    CHECK_FALSE(copy.is_conditioned());

    Op m = Op::measure(3, 4);
    Op moved = std::move(m);
    CHECK(moved.cbit() == 4);
    Op assigned;
    assigned = moved;
    CHECK(assigned.cbit() == 4);
    CHECK(assigned.target == 3);
}
