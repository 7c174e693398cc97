// Giving back to the kernel the memory of the ops a rebuilding pass has already moved out of its input.
#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::ir {

/// A pass that rebuilds the op list (reads c.ops front to back, appends to a new vector) holds both
/// lists at once: at 10^7 ops that is what sets the peak memory. With this, the pass tells after
/// each op how many input ops it is done with, and the whole pages under them are handed back to the
/// kernel (madvise MADV_DONTNEED, at least 2 MiB at a time, ending on 2 MiB boundaries so that a
/// huge page goes back whole), so the peak is about the output so far plus the input still unread.
///
/// A released page reads as zero bytes afterwards, and an all-zero Op is a valid op whose destructor
/// does nothing (empty inline LitVec, no rare-field block, a trivial Angle): the input vector can
/// still be destroyed or assigned over as usual. The caller's side of the bargain: every op below
/// the count passed to consumed() has been moved from (or never owned heap storage: at most three
/// literals and no rare fields), and none of them is read again. The vector must not reallocate
/// while a releaser points into it. Does nothing on systems other than Linux, or for lists smaller
/// than a few MiB.
class OpPrefixReleaser {
public:
    explicit OpPrefixReleaser(std::vector<Op>& ops) noexcept;

    /// ops[0, n) are done with (see the class comment). Cheap when there is nothing to release.
    void consumed(size_t n) noexcept {
        if (begin_ + n * sizeof(Op) >= threshold_) release(n);
    }

    /// Bytes handed back so far (for tests).
    size_t released_bytes() const noexcept { return released_bytes_; }

    /// The unit of release: whole chunks of this size, on boundaries of this size (a huge page).
    static constexpr uintptr_t kChunk = uintptr_t(2) << 20;

private:
    void release(size_t n) noexcept;

    uintptr_t begin_ = 0;      ///< address of ops[0]
    uintptr_t released_ = 0;   ///< everything in [first page of the list, released_) is handed back
    uintptr_t threshold_ = 0;  ///< consumed() releases once the done ops reach this address
    size_t released_bytes_ = 0;
};

/// Hands back the whole pages of `ops`' storage past its last op (capacity a pass reserved or freed
/// by erasing, whose pages stay resident though no op lives there). The vector is unchanged; a later
/// push_back into that room gets fresh zero pages. Does nothing on systems other than Linux.
void release_spare_capacity(std::vector<Op>& ops) noexcept;

}  // namespace whittle::ir
