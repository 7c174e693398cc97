// Control literals (a wire and a polarity) and LitVec, the 16-byte vector of them an ir::Op holds.
#pragma once

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <initializer_list>
#include <functional>
#include <iterator>
#include <memory>
#include <new>
#include <type_traits>
#include <utility>

namespace whittle::ir {

/// A control literal: a wire and a polarity (negative = the op acts when the wire is |0>).
class Lit {
public:
    constexpr Lit() = default;
    static constexpr Lit pos(uint32_t wire) { return Lit(wire << 1); }
    static constexpr Lit neg(uint32_t wire) { return Lit((wire << 1) | 1u); }
    static constexpr Lit make(uint32_t wire, bool positive) { return positive ? pos(wire) : neg(wire); }
    constexpr uint32_t wire() const { return bits_ >> 1; }
    constexpr bool positive() const { return (bits_ & 1u) == 0; }
    constexpr Lit flipped() const { return Lit(bits_ ^ 1u); }
    constexpr uint32_t bits() const { return bits_; }
    friend constexpr bool operator==(Lit a, Lit b) { return a.bits_ == b.bits_; }
    friend constexpr bool operator!=(Lit a, Lit b) { return a.bits_ != b.bits_; }
    friend constexpr bool operator<(Lit a, Lit b) { return a.bits_ < b.bits_; }

private:
    constexpr explicit Lit(uint32_t b) : bits_(b) {}
    uint32_t bits_ = 0;
};

/// A vector of literals in 16 bytes: up to three inline (every X, CNOT, Toffoli and CCZ), more on
/// the heap. The op vector is most of the memory at 10^7 ops, and a general small vector with three
/// inline literals takes 40 bytes. Iterators are plain pointers; the members are the part of
/// std::vector's interface the compiler uses. A copy of a heap vector of at most three literals is
/// inline again.
class LitVec {
public:
    using value_type = Lit;
    using size_type = std::size_t;
    using difference_type = std::ptrdiff_t;
    using reference = Lit&;
    using const_reference = const Lit&;
    using pointer = Lit*;
    using const_pointer = const Lit*;
    using iterator = Lit*;
    using const_iterator = const Lit*;
    using reverse_iterator = std::reverse_iterator<iterator>;
    using const_reverse_iterator = std::reverse_iterator<const_iterator>;

    static constexpr uint32_t kInline = 3;

    LitVec() noexcept : inline_{} {}
    LitVec(std::initializer_list<Lit> lits) : LitVec() { append(lits.begin(), lits.size()); }
    template <std::forward_iterator It>
    LitVec(It first, It last) : LitVec() {
        insert(end(), first, last);
    }
    LitVec(const LitVec& o) : LitVec() { append(o.data(), o.size()); }
    LitVec(LitVec&& o) noexcept : LitVec() { steal(o); }
    ~LitVec() { release(); }

    LitVec& operator=(const LitVec& o) {
        if (this != &o) assign(o.begin(), o.end());
        return *this;
    }
    LitVec& operator=(LitVec&& o) noexcept {
        if (this != &o) {
            release();
            size_ = 0;
            steal(o);
        }
        return *this;
    }
    LitVec& operator=(std::initializer_list<Lit> lits) {
        assign(lits.begin(), lits.end());
        return *this;
    }

    template <std::forward_iterator It>
    void assign(It first, It last) {
        if (aliases(first, last)) {
            LitVec copy(first, last);
            *this = std::move(copy);
            return;
        }
        clear();
        insert(end(), first, last);
    }

    Lit* data() noexcept { return on_heap() ? heap_data() : inline_; }
    const Lit* data() const noexcept { return on_heap() ? heap_data() : inline_; }
    iterator begin() noexcept { return data(); }
    iterator end() noexcept { return data() + size(); }
    const_iterator begin() const noexcept { return data(); }
    const_iterator end() const noexcept { return data() + size(); }
    const_iterator cbegin() const noexcept { return begin(); }
    const_iterator cend() const noexcept { return end(); }
    reverse_iterator rbegin() noexcept { return reverse_iterator(end()); }
    reverse_iterator rend() noexcept { return reverse_iterator(begin()); }
    const_reverse_iterator rbegin() const noexcept { return const_reverse_iterator(end()); }
    const_reverse_iterator rend() const noexcept { return const_reverse_iterator(begin()); }

    size_t size() const noexcept { return size_ & kSizeMask; }
    bool empty() const noexcept { return size() == 0; }
    size_t capacity() const noexcept { return on_heap() ? heap_.capacity : kInline; }

    Lit& operator[](size_t i) noexcept { return data()[i]; }
    const Lit& operator[](size_t i) const noexcept { return data()[i]; }
    Lit& front() noexcept { return data()[0]; }
    const Lit& front() const noexcept { return data()[0]; }
    Lit& back() noexcept { return data()[size() - 1]; }
    const Lit& back() const noexcept { return data()[size() - 1]; }

    void reserve(size_t n) {
        if (n > capacity()) reallocate(n);
    }
    void push_back(Lit l) {
        const size_t n = size();
        if (n == capacity()) reallocate(grown(n + 1));
        data()[n] = l;
        ++size_;
    }
    void emplace_back(Lit l) { push_back(l); }
    void pop_back() noexcept { --size_; }
    void clear() noexcept { size_ &= kHeapBit; }
    void resize(size_t n, Lit fill = {}) {
        const size_t old = size();
        if (n > capacity()) reallocate(n);
        Lit* d = data();
        for (size_t i = old; i < n; ++i) d[i] = fill;
        set_size(n);
    }

    iterator insert(const_iterator pos, Lit l) { return insert(pos, &l, &l + 1); }
    template <std::forward_iterator It>
    iterator insert(const_iterator pos, It first, It last) {
        const size_t at = size_t(pos - begin());
        if (aliases(first, last)) {
            const LitVec copy(first, last);
            return insert(begin() + at, copy.begin(), copy.end());
        }
        const size_t count = size_t(std::distance(first, last));
        const size_t n = size();
        if (n + count > capacity()) reallocate(grown(n + count));
        Lit* d = data();
        std::memmove(static_cast<void*>(d + at + count), d + at, (n - at) * sizeof(Lit));
        std::copy(first, last, d + at);
        set_size(n + count);
        return d + at;
    }
    iterator erase(const_iterator pos) noexcept { return erase(pos, pos + 1); }
    iterator erase(const_iterator first, const_iterator last) noexcept {
        Lit* d = data();
        const size_t from = size_t(first - d), to = size_t(last - d), n = size();
        std::memmove(static_cast<void*>(d + from), d + to, (n - to) * sizeof(Lit));
        set_size(n - (to - from));
        return d + from;
    }

    void swap(LitVec& o) noexcept {
        LitVec t(std::move(o));
        o = std::move(*this);
        *this = std::move(t);
    }

    friend bool operator==(const LitVec& a, const LitVec& b) noexcept {
        return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin());
    }
    friend bool operator<(const LitVec& a, const LitVec& b) noexcept {
        return std::lexicographical_compare(a.begin(), a.end(), b.begin(), b.end());
    }

private:
    // The top bit of size_ marks heap storage; the heap pointer is kept as bytes so the union stays
    // 4-aligned and the inline literals can start right after size_ (offset 4; the pointer lands on
    // offset 8).
    static constexpr uint32_t kHeapBit = 0x80000000u;
    static constexpr uint32_t kSizeMask = ~kHeapBit;
    struct Heap {
        uint32_t capacity;
        unsigned char pointer[sizeof(Lit*)];
    };

    bool on_heap() const noexcept { return (size_ & kHeapBit) != 0; }
    Lit* heap_data() const noexcept {
        Lit* p;
        std::memcpy(&p, heap_.pointer, sizeof p);
        return p;
    }
    void set_size(size_t n) noexcept { size_ = (size_ & kHeapBit) | uint32_t(n); }
    // Capacity for growing to `needed` literals by appending: at least 8, then doubling.
    static size_t grown(size_t needed) noexcept { return std::max<size_t>(8, 2 * needed); }

    template <class It>
    bool aliases(It first, It last) const noexcept {
        if constexpr (std::is_same_v<std::remove_cv_t<std::remove_pointer_t<It>>, Lit> && std::is_pointer_v<It>) {
            if (first == last) return false;
            const Lit* b = data();
            return std::less_equal<const Lit*>()(b, &*first) && std::less<const Lit*>()(&*first, b + capacity());
        } else {
            (void)first;
            (void)last;
            return false;
        }
    }

    // Moves the literals to a heap block of `cap` literals (cap > size()).
    void reallocate(size_t cap) {
        Lit* fresh = static_cast<Lit*>(::operator new(cap * sizeof(Lit)));
        const size_t n = size();
        std::uninitialized_copy(data(), data() + n, fresh);
        release();
        heap_.capacity = uint32_t(cap);
        std::memcpy(heap_.pointer, &fresh, sizeof fresh);
        size_ = uint32_t(n) | kHeapBit;
    }
    void append(const Lit* src, size_t n) {
        if (n > capacity()) reallocate(n);
        std::uninitialized_copy(src, src + n, data() + size());
        set_size(size() + n);
    }
    // Takes o's literals (this is empty and inline); o is left empty and inline.
    // (Each union member is written by name, which makes it the active one.)
    void steal(LitVec& o) noexcept {
        size_ = o.size_;
        if (o.on_heap()) {
            heap_ = o.heap_;
            o.inline_[0] = o.inline_[1] = o.inline_[2] = Lit();
        } else {
            for (uint32_t i = 0; i < kInline; ++i) inline_[i] = o.inline_[i];
        }
        o.size_ = 0;
    }
    void release() noexcept {
        if (on_heap()) ::operator delete(heap_data());
    }

    uint32_t size_ = 0;
    union {
        Lit inline_[kInline];
        Heap heap_;
    };
};

static_assert(sizeof(LitVec) == 16, "LitVec: 4-byte size, then three literals or a capacity and a pointer");

}  // namespace whittle::ir
