// Hash-consing table of uint32 sequences (see sequence_table.h).
#include "passes/sequence_table.h"

#include <algorithm>
#include <bit>

#include "ir/error.h"

namespace whittle::passes {

namespace {

constexpr uint64_t kTag = 0xffffffff00000000ull;
constexpr size_t kChunkWords = size_t(1) << 20;  // 4 MiB
constexpr size_t kFirstSlots = 64;

uint64_t slot_of(uint64_t h, uint32_t id) { return (h & kTag) | (uint64_t(id) + 1); }

}  // namespace

SequenceTable::SequenceTable() : slots_(kFirstSlots, 0), shift_(64 - std::countr_zero(kFirstSlots)) { intern({}); }

uint64_t SequenceTable::hash(std::span<const uint32_t> s) {
    uint64_t h = 0x9e3779b97f4a7c15ull ^ s.size();
    for (uint32_t v : s) {
        h ^= v;
        h *= 0xff51afd7ed558ccdull;
        h ^= h >> 32;
    }
    return h;
}

void SequenceTable::grow() {
    // A home is the top bits of the hash, all inside the kept upper half while the index has at most
    // 2^32 slots (ids are below 2^31): an entry's new home follows from its slot alone.
    std::vector<uint64_t> slots(slots_.size() * 2, 0);
    const unsigned shift = shift_ - 1;
    const size_t mask = slots.size() - 1;
    for (const uint64_t e : slots_) {
        if (e == 0) continue;
        size_t i = size_t((e & kTag) >> shift);
        while (slots[i] != 0) i = (i + 1) & mask;
        slots[i] = e;
    }
    slots_ = std::move(slots);
    shift_ = shift;
}

uint32_t SequenceTable::append(std::span<const uint32_t> s, bool indexed) {
    WHITTLE_ASSERT(at_.size() < (size_t(1) << 31) && "sequence table: at most 2^31 ids");
    const size_t words = s.size() + 1;
    if (chunk_size_ - chunk_used_ < words) {  // a new chunk; chunks never move, so `s` may be in one
        chunk_size_ = std::max(kChunkWords, words);
        chunks_.push_back(std::make_unique_for_overwrite<uint32_t[]>(chunk_size_));
        chunk_used_ = 0;
    }
    uint32_t* p = chunks_.back().get() + chunk_used_;
    p[0] = uint32_t(s.size());
    std::copy(s.begin(), s.end(), p + 1);
    const uint32_t id = size();
    at_.push_back(uint64_t(chunks_.size() - 1) << 32 | chunk_used_);
    chunk_used_ += words;
    indexed_.push_back(indexed);
    return id;
}

uint32_t SequenceTable::add_unindexed(std::span<const uint32_t> s) { return append(s, false); }

uint32_t SequenceTable::intern(std::span<const uint32_t> s, uint64_t h) {
    const uint64_t tag = h & kTag;
    const size_t mask = slots_.size() - 1;
    size_t i = home(h);
    for (; slots_[i] != 0; i = (i + 1) & mask) {
        if ((slots_[i] & kTag) != tag) continue;
        const std::span<const uint32_t> t = (*this)[uint32_t(slots_[i]) - 1];
        if (std::equal(s.begin(), s.end(), t.begin(), t.end())) return uint32_t(slots_[i]) - 1;
    }
    const uint32_t id = append(s, true);
    slots_[i] = slot_of(h, id);
    if (2 * ++indexed_count_ > slots_.size()) grow();  // load factor at most 1/2
    return id;
}

}  // namespace whittle::passes
