// T-count reduction by third-order homogeneous polynomial elimination (TOHPE) with a counted search around it.
#pragma once

#include <cstdint>
#include <vector>

#include "tcount/todd.h"

namespace whittle::tcount {

struct TohpeSettings {
    uint64_t work_budget = uint64_t(1) << 30;  ///< words of GF(2) elimination, deterministic
    uint32_t max_kicks = 16;                   ///< plateau moves tried after the first descent
    uint64_t seed = 0x5eed;                    ///< of the kicks' pseudo-random choices (fixed: deterministic)
};

/// Same contract as todd_reduce (todd.h): columns with the signature tensor of `columns`, never
/// more of them, deterministic. Descends by TOHPE steps (y in the kernel of the map
/// y -> sum_j y_j a_j a_j^T, z chosen by the columns it removes) and TODD steps (todd_reduce) in
/// turn; at a local minimum it moves along the plateau (an update y in N_z that keeps the column
/// count, z a sum of two columns) and descends again, keeping the best list seen, until the
/// budget or the kicks run out.
ToddResult tohpe_reduce(std::vector<uint64_t> columns, uint32_t n, const TohpeSettings& settings = {});

}  // namespace whittle::tcount
