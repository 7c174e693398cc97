// Hash-consing table of uint32 sequences (see sequence_table.h).
#include "passes/sequence_table.h"

#include <algorithm>

namespace whittle::passes {

namespace {

uint64_t slot_of(uint64_t h, uint32_t id) { return (h & 0xffffffff00000000ull) | (uint64_t(id) + 1); }

}  // namespace

SequenceTable::SequenceTable() : start_{0}, slots_(64, 0) { intern({}); }

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
    // The hashes are not kept (8 bytes an id): they are computed again, reading data_ in order.
    std::vector<uint64_t> slots(slots_.size() * 2, 0);
    const size_t mask = slots.size() - 1;
    for (uint32_t id = 0; id < size(); ++id) {
        if (!indexed_[id]) continue;
        const uint64_t h = hash((*this)[id]);
        size_t i = size_t(h) & mask;
        while (slots[i] != 0) i = (i + 1) & mask;
        slots[i] = slot_of(h, id);
    }
    slots_ = std::move(slots);
}

uint32_t SequenceTable::append(std::span<const uint32_t> s, bool indexed) {
    const uint32_t id = size();
    if (!s.empty() && s.data() >= data_.data() && s.data() < data_.data() + data_.size()) {
        const std::vector<uint32_t> own(s.begin(), s.end());  // a piece of the table: the insert may move it
        data_.insert(data_.end(), own.begin(), own.end());
    } else {
        data_.insert(data_.end(), s.begin(), s.end());
    }
    start_.push_back(data_.size());
    indexed_.push_back(indexed);
    return id;
}

uint32_t SequenceTable::add_unindexed(std::span<const uint32_t> s) { return append(s, false); }

uint32_t SequenceTable::intern(std::span<const uint32_t> s, uint64_t h) {
    const uint64_t tag = h & 0xffffffff00000000ull;
    const size_t mask = slots_.size() - 1;
    size_t i = size_t(h) & mask;
    for (; slots_[i] != 0; i = (i + 1) & mask) {
        if ((slots_[i] & 0xffffffff00000000ull) != tag) continue;
        const uint32_t id = uint32_t(slots_[i]) - 1;
        const std::span<const uint32_t> t = (*this)[id];
        if (std::equal(s.begin(), s.end(), t.begin(), t.end())) return id;
    }
    const uint32_t id = append(s, true);
    slots_[i] = slot_of(h, id);
    if (2 * ++indexed_count_ > slots_.size()) grow();  // load factor at most 1/2
    return id;
}

}  // namespace whittle::passes
