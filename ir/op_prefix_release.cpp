// Handing back the pages of a consumed op-list prefix (see op_prefix_release.h).
#include "ir/op_prefix_release.h"

#include <limits>

#if defined(__linux__)
#include <sys/mman.h>
#include <unistd.h>
#endif

namespace whittle::ir {

namespace {

uintptr_t round_up(uintptr_t a, uintptr_t unit) { return (a + unit - 1) / unit * unit; }
uintptr_t round_down(uintptr_t a, uintptr_t unit) { return a / unit * unit; }

}  // namespace

OpPrefixReleaser::OpPrefixReleaser(std::vector<Op>& ops) noexcept
    : begin_(reinterpret_cast<uintptr_t>(ops.data())), threshold_(std::numeric_limits<uintptr_t>::max()) {
#if defined(__linux__)
    const long page = sysconf(_SC_PAGESIZE);
    if (page <= 0 || ops.empty()) return;
    released_ = round_up(begin_, uintptr_t(page));
    threshold_ = round_up(released_ + kChunk, kChunk);
#endif
}

void OpPrefixReleaser::release(size_t n) noexcept {
#if defined(__linux__)
    const uintptr_t upto = round_down(begin_ + n * sizeof(Op), kChunk);
    if (upto <= released_) return;
    // Advice: if the kernel refuses, the pages keep the moved-from ops, which are just as valid.
    if (madvise(reinterpret_cast<void*>(released_), upto - released_, MADV_DONTNEED) == 0)
        released_bytes_ += upto - released_;
    released_ = upto;
    threshold_ = round_up(released_ + kChunk, kChunk);
#else
    (void)n;
#endif
}

void release_spare_capacity(std::vector<Op>& ops) noexcept {
#if defined(__linux__)
    const long page = sysconf(_SC_PAGESIZE);
    if (page <= 0 || ops.capacity() == 0) return;
    const auto data = reinterpret_cast<uintptr_t>(ops.data());
    const uintptr_t from = round_up(data + ops.size() * sizeof(Op), uintptr_t(page));
    const uintptr_t to = round_down(data + ops.capacity() * sizeof(Op), uintptr_t(page));
    if (to > from) madvise(reinterpret_cast<void*>(from), to - from, MADV_DONTNEED);
#else
    (void)ops;
#endif
}

}  // namespace whittle::ir
