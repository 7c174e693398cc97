// OpPrefixReleaser: a list rebuilt while its consumed prefix is handed back keeps every op, and the
// released ops (zero bytes) destruct cleanly (the sanitizer build checks the frees; a leak would be a
// heap block whose owner was zeroed before it was moved out).
#include <doctest/doctest.h>

#include <cstring>
#include <vector>

#include "ir/op_prefix_release.h"

using namespace whittle::ir;

namespace {

// Ops of every storage shape: inline literals, heap literals, a rare-field block.
Op sample_op(size_t i) {
    Op op;
    switch (i % 4) {
    case 0: op = Op::x(uint32_t(i % 97), {Lit::pos(uint32_t(i % 89) + 100), Lit::neg(200)}); break;
    case 1: {
        LitVec lits;
        for (uint32_t k = 0; k < 6; ++k) lits.push_back(Lit::pos(uint32_t(i % 50) + 10 * k));
        op = Op::phase(Angle::pi_times(int64_t(i % 7), 4), lits);
        break;
    }
    case 2: op = Op::u(uint32_t(i % 13), Angle::pi_times(1, 3), Angle::pi_times(1, 5), Angle::pi_times(int64_t(i % 9), 7)); break;
    default:
        op = Op::one(OpKind::H, uint32_t(i % 31));
        op.set_condition(0, i % 2);
        break;
    }
    op.loc.line = uint32_t(i + 1);
    return op;
}

bool same(const Op& a, const Op& b) {
    return a.kind == b.kind && a.target == b.target && a.controls == b.controls && a.angle.identical(b.angle) &&
           a.phi().identical(b.phi()) && a.lambda().identical(b.lambda()) && a.cond_reg() == b.cond_reg() &&
           a.cond_value() == b.cond_value() && a.loc.line == b.loc.line;
}

bool all_zero(const Op& op) {
    unsigned char zero[sizeof(Op)] = {};
    return std::memcmp(static_cast<const void*>(&op), zero, sizeof(Op)) == 0;
}

}  // namespace

TEST_CASE("OpPrefixReleaser: a list moved out front to back keeps every op; released ops are zero and empty") {
    const size_t n = 200000;  // 12.8 MB: several 2 MiB chunks
    std::vector<Op> in, reference;
    in.reserve(n);
    for (size_t i = 0; i < n; ++i) in.push_back(sample_op(i));
    reference = in;

    std::vector<Op> out;
    out.reserve(n);
    OpPrefixReleaser releaser(in);
    for (size_t i = 0; i < n; ++i) {
        out.push_back(std::move(in[i]));
        releaser.consumed(i + 1);
    }
    REQUIRE(out.size() == n);
    for (size_t i = 0; i < n; ++i) REQUIRE(same(out[i], reference[i]));

    size_t zero_ops = 0;
    for (const Op& op : in) {
        if (!all_zero(op)) continue;
        ++zero_ops;
        // What a pass could meet if it broke the contract and read a released op: an empty op.
        CHECK(op.controls.empty());
        CHECK(op.controls.capacity() == LitVec::kInline);
        CHECK(op.cond_reg() == -1);
        CHECK(op.phi().is_zero());
    }
#if defined(__linux__)
    // Everything but the last partial chunk and the first partial page goes back.
    CHECK(releaser.released_bytes() + 2 * OpPrefixReleaser::kChunk >= n * sizeof(Op));
    CHECK(zero_ops >= releaser.released_bytes() / sizeof(Op) - 1);
#else
    CHECK(releaser.released_bytes() == 0);
#endif
    in = std::vector<Op>(3, sample_op(1));  // the released list destructs like any other
    CHECK(in[2].controls.size() == 6);
}

TEST_CASE("OpPrefixReleaser: nothing goes back before a whole chunk is done, or from a small list") {
    std::vector<Op> small(100, sample_op(1));
    OpPrefixReleaser small_releaser(small);
    std::vector<Op> moved;
    for (size_t i = 0; i < small.size(); ++i) {
        moved.push_back(std::move(small[i]));
        small_releaser.consumed(i + 1);
    }
    CHECK(small_releaser.released_bytes() == 0);

    const size_t n = 3 * OpPrefixReleaser::kChunk / sizeof(Op);
    std::vector<Op> in(n);
    OpPrefixReleaser releaser(in);
    releaser.consumed(OpPrefixReleaser::kChunk / sizeof(Op) / 2);  // half a chunk: kept
    CHECK(releaser.released_bytes() == 0);
    releaser.consumed(n);
#if defined(__linux__)
    CHECK(releaser.released_bytes() >= OpPrefixReleaser::kChunk);
    CHECK(releaser.released_bytes() % 4096 == 0);
#endif
    // Releasing the same prefix again changes nothing.
    const size_t before = releaser.released_bytes();
    releaser.consumed(n);
    releaser.consumed(1);
    CHECK(releaser.released_bytes() == before);
}

TEST_CASE("release_spare_capacity: the ops stay, and the room past them still takes new ops") {
    std::vector<Op> ops;
    ops.reserve(3 * OpPrefixReleaser::kChunk / sizeof(Op));
    for (size_t i = 0; i < 1000; ++i) ops.push_back(sample_op(i));
    const Op* data = ops.data();
    const size_t capacity = ops.capacity();
    // Touch the spare room as a pass that erased ops would have left it: write ops, then erase them.
    for (size_t i = 1000; i < 20000; ++i) ops.push_back(sample_op(i));
    ops.erase(ops.begin() + 1000, ops.end());
    release_spare_capacity(ops);
    CHECK(ops.data() == data);
    CHECK(ops.capacity() == capacity);
    REQUIRE(ops.size() == 1000);
    for (size_t i = 0; i < 1000; ++i) REQUIRE(same(ops[i], sample_op(i)));
    for (size_t i = 1000; i < 20000; ++i) ops.push_back(sample_op(i));
    for (size_t i = 0; i < 20000; ++i) REQUIRE(same(ops[i], sample_op(i)));
    release_spare_capacity(ops);  // nothing past the end is an op; a full list is a no-op
    std::vector<Op> empty;
    release_spare_capacity(empty);
    CHECK(empty.empty());
}
