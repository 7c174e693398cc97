// Interning of sorted uint32 sequences (monomials, polynomials) so equal ones share one small id.
#pragma once

#include <cstdint>
#include <span>
#include <vector>

namespace whittle::passes {

/// A hash-consing table: every distinct sequence of uint32 gets one id, handed out in order of first
/// `intern`, and id 0 is the empty sequence. Comparing two interned sequences is then comparing two
/// integers, and a map keyed by them is a vector. The phase-folding engine interns monomials (sorted
/// variable lists) and term polynomials (sorted monomial-id lists) here instead of hashing and copying
/// vectors of vectors. Sequences are stored back to back in one array; the index is open addressing
/// with linear probing, each slot holding an id and the upper half of its sequence's hash, so a probe
/// reads one slot and an intern costs one hash of the sequence plus, on a hit, one comparison (the
/// slot array is the only memory a probe touches; at a million ids it is far larger than the caches).
/// Nothing is ever removed: the table lives as long as one engine run.
class SequenceTable {
public:
    SequenceTable();

    /// The id of `s` (the same id for every equal sequence).
    uint32_t intern(std::span<const uint32_t> s) { return intern(s, hash(s)); }
    /// The same with `h` = hash(s) already at hand.
    uint32_t intern(std::span<const uint32_t> s, uint64_t h);
    /// Stores `s` under a new id without indexing it: for a caller that keeps its own map to such
    /// sequences and never passes one of them to intern (the folding engine's one-variable
    /// monomials, one per variable, each made once). Saves the probe of a table far larger than
    /// the caches.
    uint32_t add_unindexed(std::span<const uint32_t> s);
    /// Asks the processor to load the slot where a sequence of hash `h` starts its probe: a caller
    /// with many sequences to intern prefetches them all first, so their cache misses overlap.
    void prefetch(uint64_t h) const { __builtin_prefetch(slots_.data() + (size_t(h) & (slots_.size() - 1))); }
    /// The sequence of an id handed out by intern.
    std::span<const uint32_t> operator[](uint32_t id) const {
        return {data_.data() + start_[id], data_.data() + start_[id + 1]};
    }
    /// Number of distinct sequences (ids are 0 .. size() - 1).
    uint32_t size() const { return uint32_t(start_.size() - 1); }
    /// The hash the table uses (callers that pair off sequences before interning reuse it).
    static uint64_t hash(std::span<const uint32_t> s);

private:
    void grow();
    uint32_t append(std::span<const uint32_t> s, bool indexed);

    std::vector<uint32_t> data_;   ///< all sequences back to back
    std::vector<uint64_t> start_;  ///< id -> offset into data_; one extra entry marks the end
    /// The open-addressing index: 0 = free, else (upper 32 bits of the hash) << 32 | (id + 1).
    std::vector<uint64_t> slots_;
    std::vector<bool> indexed_;  ///< id -> in the index (not added by add_unindexed)
    size_t indexed_count_ = 0;
};

}  // namespace whittle::passes
