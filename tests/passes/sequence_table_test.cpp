// SequenceTable: equal sequences share one id, distinct ones never do, across growth of the index.
#include <doctest/doctest.h>

#include <map>
#include <random>
#include <vector>

#include "passes/sequence_table.h"

using whittle::passes::SequenceTable;

TEST_CASE("id 0 is the empty sequence; equal sequences get one id, distinct ones their own") {
    SequenceTable t;
    CHECK(t.size() == 1);
    CHECK(t.intern({}) == 0);
    const std::vector<uint32_t> a{1, 2, 3}, b{1, 2, 3}, c{1, 2}, d{3, 2, 1};
    const uint32_t ia = t.intern(a);
    CHECK(ia == 1);
    CHECK(t.intern(b) == ia);
    const uint32_t ic = t.intern(c), id = t.intern(d);
    CHECK(ic != ia);
    CHECK(id != ia);  // order matters: the caller keeps its sequences sorted
    CHECK(id != ic);
    CHECK(t.size() == 4);
    CHECK(std::vector<uint32_t>(t[ia].begin(), t[ia].end()) == a);
    CHECK(t[0].empty());
}

TEST_CASE("a piece of the table itself can be interned (the append may move the storage)") {
    SequenceTable t;
    const uint32_t id = t.intern(std::vector<uint32_t>{5, 6, 7, 8});
    const uint32_t tail = t.intern(t[id].subspan(1));  // {6, 7, 8}: new, appended from the table's own storage
    CHECK(std::vector<uint32_t>(t[tail].begin(), t[tail].end()) == std::vector<uint32_t>{6, 7, 8});
    CHECK(t.intern(t[id]) == id);
}

TEST_CASE("random sequences: ids agree with a std::map over many index growths") {
    SequenceTable t;
    std::map<std::vector<uint32_t>, uint32_t> reference{{{}, 0}};
    std::mt19937_64 rng(8);
    std::uniform_int_distribution<uint32_t> len(0, 5), val(0, 40);
    for (int i = 0; i < 20000; ++i) {
        std::vector<uint32_t> s(len(rng));
        for (uint32_t& v : s) v = val(rng);
        const uint32_t got = t.intern(s);
        auto [it, fresh] = reference.emplace(s, uint32_t(reference.size()));
        REQUIRE(got == it->second);  // ids are handed out in order of first intern
        if (fresh) REQUIRE(got == t.size() - 1);
    }
    CHECK(t.size() == reference.size());
    for (const auto& [s, id] : reference) CHECK(std::vector<uint32_t>(t[id].begin(), t[id].end()) == s);
}

TEST_CASE("unindexed sequences get ids in the same order and read back, and interning is unaffected") {
    SequenceTable t;
    std::map<std::vector<uint32_t>, uint32_t> interned{{{}, 0}};
    std::vector<std::vector<uint32_t>> by_id{{}};
    std::mt19937_64 rng(9);
    std::uniform_int_distribution<uint32_t> len(2, 5), val(0, 30);
    for (uint32_t i = 0; i < 30000; ++i) {
        if (i % 3 == 0) {  // a one-element sequence the caller maps itself, as the folding engine's variables
            const uint32_t one[1] = {i};
            REQUIRE(t.add_unindexed(one) == by_id.size());
            by_id.push_back({i});
            continue;
        }
        std::vector<uint32_t> s(len(rng));
        for (uint32_t& v : s) v = val(rng);
        const uint32_t got = t.intern(s);
        auto [it, fresh] = interned.emplace(s, uint32_t(by_id.size()));
        REQUIRE(got == it->second);
        if (fresh) by_id.push_back(s);
    }
    REQUIRE(t.size() == by_id.size());
    for (uint32_t id = 0; id < t.size(); ++id) CHECK(std::vector<uint32_t>(t[id].begin(), t[id].end()) == by_id[id]);
}

TEST_CASE("sequences longer than a storage chunk, and many that fill several chunks, read back") {
    SequenceTable t;
    std::vector<uint32_t> big(3u << 20);  // 3 Mi words: more than one 1 Mi-word chunk
    for (uint32_t i = 0; i < big.size(); ++i) big[i] = i * 7u;
    std::vector<uint32_t> small{1, 2, 3};
    const uint32_t a = t.intern(small);
    const uint32_t b = t.intern(big);
    std::vector<uint32_t> ids;
    for (uint32_t i = 0; i < 400000; ++i) ids.push_back(t.intern(std::vector<uint32_t>{i, i + 1, i + 2}));  // 1.6 Mi words
    CHECK(t.intern(big) == b);
    CHECK(t.intern(small) == a);
    CHECK(std::vector<uint32_t>(t[b].begin(), t[b].end()) == big);
    for (uint32_t i = 0; i < 400000; i += 997) CHECK(std::vector<uint32_t>(t[ids[i]].begin(), t[ids[i]].end()) == std::vector<uint32_t>{i, i + 1, i + 2});
    CHECK(ids[1] == a);  // {1, 2, 3} was interned before
}
