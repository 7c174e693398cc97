// GF(2) vectors of any length and an echelon basis with tags, for the T-count engine's eliminations.
#pragma once

#include <bit>
#include <cstddef>
#include <cstdint>
#include <algorithm>
#include <vector>

namespace whittle::tcount {

/// A vector over GF(2) of a fixed length, 64 entries per word.
class BitVec {
public:
    BitVec() = default;
    explicit BitVec(size_t bits) : bits_(bits), words_((bits + 63) / 64, 0) {}

    size_t size() const { return bits_; }
    bool get(size_t i) const { return words_[i >> 6] >> (i & 63) & 1; }
    void set(size_t i) { words_[i >> 6] |= uint64_t(1) << (i & 63); }
    void flip(size_t i) { words_[i >> 6] ^= uint64_t(1) << (i & 63); }
    void reset() { std::fill(words_.begin(), words_.end(), 0); }
    void assign(size_t i, bool v) {
        if (get(i) != v) flip(i);
    }
    BitVec& operator^=(const BitVec& o) {
        for (size_t k = 0; k < words_.size(); ++k) words_[k] ^= o.words_[k];
        return *this;
    }
    bool any() const {
        for (uint64_t w : words_)
            if (w) return true;
        return false;
    }
    size_t popcount() const {
        size_t n = 0;
        for (uint64_t w : words_) n += size_t(std::popcount(w));
        return n;
    }
    /// Index of the lowest set entry, or size() when there is none.
    size_t first() const {
        for (size_t k = 0; k < words_.size(); ++k)
            if (words_[k]) return k * 64 + size_t(std::countr_zero(words_[k]));
        return bits_;
    }
    bool operator==(const BitVec& o) const { return bits_ == o.bits_ && words_ == o.words_; }
    const std::vector<uint64_t>& words() const { return words_; }

private:
    size_t bits_ = 0;
    std::vector<uint64_t> words_;
};

/// Echelon basis of inserted vectors, each carrying a tag that records the combination of inputs
/// it is (the caller decides what a tag means). Every basis vector has a distinct pivot (its lowest
/// entry), and inserting reduces the new vector by the basis in pivot order.
class TaggedEchelon {
public:
    struct Row {
        BitVec v, tag;
        size_t pivot;
    };

    /// Reduces (v, tag) by the basis; appends it and returns true when something is left,
    /// otherwise leaves (v, tag) reduced (v zero: tag is a dependency) and returns false.
    /// `work` counts the words touched (a deterministic effort measure).
    bool insert(BitVec& v, BitVec& tag, uint64_t& work) {
        reduce(v, tag, work);
        const size_t p = v.first();
        if (p == v.size()) return false;
        if (size_ == rows_.size()) rows_.push_back({v, tag, p});
        else rows_[size_] = {v, tag, p};  // reuses the row's storage after clear()
        if (p >= pivot_row_.size()) pivot_row_.resize(p + 1, kNone);
        pivot_row_[p] = size_++;
        return true;
    }
    /// Reduces v (and its tag) by the basis, lowest pivots first.
    void reduce(BitVec& v, BitVec& tag, uint64_t& work) const {
        for (size_t p = v.first(); p < v.size();) {
            ++work;  // each entry visited
            const size_t r = p < pivot_row_.size() ? pivot_row_[p] : kNone;
            if (r == kNone) {
                p = next_set(v, p + 1);
                continue;
            }
            v ^= rows_[r].v;
            tag ^= rows_[r].tag;
            work += v.words().size() + tag.words().size();
            p = next_set(v, p + 1);
        }
    }
    /// Empties the basis, keeping its storage for the next use.
    void clear() {
        for (size_t r = 0; r < size_; ++r) pivot_row_[rows_[r].pivot] = kNone;
        size_ = 0;
    }
    size_t size() const { return size_; }
    const Row& row(size_t r) const { return rows_[r]; }

private:
    static constexpr size_t kNone = ~size_t(0);
    static size_t next_set(const BitVec& v, size_t from) {
        const auto& w = v.words();
        size_t k = from >> 6;
        if (k >= w.size()) return v.size();
        uint64_t cur = w[k] & (~uint64_t(0) << (from & 63));
        while (true) {
            if (cur) return k * 64 + size_t(std::countr_zero(cur));
            if (++k >= w.size()) return v.size();
            cur = w[k];
        }
    }
    std::vector<Row> rows_;
    size_t size_ = 0;
    std::vector<size_t> pivot_row_;
};

}  // namespace whittle::tcount
