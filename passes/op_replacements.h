// Rebuilding a circuit's op list from per-op "dropped" flags and ops inserted after each index,
// the shared last step of the passes that replace runs of ops (fuse-1q, resynth-2q).
#pragma once

#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

/// Keeps op i unless dropped[i], then appends insert[i] (moved out); both are indexed like c.ops.
void apply_replacements(ir::Circuit& c, const std::vector<uint8_t>& dropped, std::vector<std::vector<ir::Op>>& insert);

}  // namespace whittle::passes
