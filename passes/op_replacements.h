// The edits of the passes that replace runs of ops (fuse-1q, resynth-2q): ops dropped and new ops
// placed after an index, applied in one rebuild of the op list.
#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

/// Collects the edits while a pass reads c.ops (indices are into c.ops as it was), then applies them.
/// Only the runs that change are stored, so most ops cost one byte (their "dropped" flag).
class OpReplacements {
public:
    explicit OpReplacements(size_t n_ops) : dropped_(n_ops, 0) {}

    /// Op i goes.
    void drop(size_t i) { dropped_[i] = 1; }
    /// `ops` come right after op i (which may itself be dropped); one list per index.
    void insert_after(size_t i, std::vector<ir::Op> ops) { inserts_.push_back(Insert{i, std::move(ops)}); }

    /// Rebuilds c.ops: op i unless dropped, then what was inserted after it. Ops are moved (the
    /// collected lists are emptied) and the input's pages are handed back behind the reading
    /// position, so the old and the new list are not held whole at once.
    void apply(ir::Circuit& c);

private:
    struct Insert {
        size_t at;
        std::vector<ir::Op> ops;
    };
    std::vector<uint8_t> dropped_;
    std::vector<Insert> inserts_;
};

}  // namespace whittle::passes
