// The .wq language: parse (Boost.Spirit X3) and elaborate a file into an ir::Circuit.
#pragma once

#include <cstdint>
#include <functional>

#include "frontend/diagnostics.h"
#include "frontend/load.h"
#include "ir/circuit.h"

namespace whittle::frontend {

/// Parses and elaborates the file `file_id` of `sm` (its text already registered).
ir::Circuit parse_wq(SourceManager& sm, uint32_t file_id, const LoadOptions& opts);

/// Runs `work` on a thread whose stack is large enough for the recursive-descent parser and the
/// elaborator at their nesting limits (also in sanitizer builds), and rethrows what it throws.
void run_on_parser_stack(const std::function<void()>& work);

}  // namespace whittle::frontend
