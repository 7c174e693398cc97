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
