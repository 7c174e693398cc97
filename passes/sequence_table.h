// Interning of sorted uint32 sequences (monomials, polynomials) so equal ones share one small id.
#pragma once

#include <cstdint>
#include <memory>
#include <span>
#include <vector>

namespace whittle::passes {

/// A hash-consing table: every distinct sequence of uint32 gets one id, handed out in order of first
/// `intern`, and id 0 is the empty sequence. Comparing two interned sequences is then comparing two
/// integers, and a map keyed by them is a vector. The phase-folding engine interns monomials (sorted
/// variable lists) and term polynomials (sorted monomial-id lists) here instead of hashing and copying
/// vectors of vectors. Nothing is ever removed: the table lives as long as one engine run.
///
/// Made for tables far larger than the caches (a million ids and more): sequences are stored in
/// fixed chunks that never move (growth copies nothing); the index is open addressing with linear
/// probing whose slots hold an id and the upper half of its sequence's hash, so a probe reads only
/// the slot array and an intern costs one hash plus, on a hit, one comparison. A sequence's home slot
/// is the top bits of its hash, so the slot order is the hash order and doubling the index is one
/// pass over the old slots writing the new ones in order (no hashing, no random writes).
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
    void prefetch(uint64_t h) const { __builtin_prefetch(slots_.data() + home(h)); }
    /// The sequence of an id handed out by intern or add_unindexed.
    std::span<const uint32_t> operator[](uint32_t id) const {
        const uint64_t at = at_[id];
        const uint32_t* p = chunks_[at >> 32].get() + uint32_t(at);
        return {p + 1, p[0]};
    }
    /// Number of distinct sequences (ids are 0 .. size() - 1).
    uint32_t size() const { return uint32_t(at_.size()); }
    /// The hash the table uses (callers that pair off sequences before interning reuse it).
    static uint64_t hash(std::span<const uint32_t> s);

private:
    size_t home(uint64_t h) const { return size_t(h >> shift_); }
    void grow();
    uint32_t append(std::span<const uint32_t> s, bool indexed);

    /// The sequences, each as its length and then its elements, never across two chunks.
    std::vector<std::unique_ptr<uint32_t[]>> chunks_;
    size_t chunk_size_ = 0, chunk_used_ = 0;  ///< of the last chunk, in words
    std::vector<uint64_t> at_;                ///< id -> chunk << 32 | offset of its length word
    /// The index: 0 = free, else (upper 32 bits of the hash) << 32 | (id + 1).
    std::vector<uint64_t> slots_;
    unsigned shift_ = 0;          ///< 64 - log2(slots_.size())
    std::vector<bool> indexed_;   ///< id -> in the index (not added by add_unindexed)
    size_t indexed_count_ = 0;
};

}  // namespace whittle::passes
