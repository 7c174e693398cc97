// The .wq language: parse (Boost.Spirit X3) and elaborate a file into an ir::Circuit.
#pragma once

#include <cstdint>

#include "frontend/diagnostics.h"
#include "frontend/load.h"
#include "ir/circuit.h"

namespace whittle::frontend {

/// Parses and elaborates the file `file_id` of `sm` (its text already registered).
ir::Circuit parse_wq(SourceManager& sm, uint32_t file_id, const LoadOptions& opts);

}  // namespace whittle::frontend
