// The .wq grammar: one file's text to its syntax tree (frontend/ast.h).
#pragma once

#include "frontend/ast.h"
#include "frontend/diagnostics.h"
#include "frontend/limits.h"

namespace whittle::frontend {

/// Parses the file `file_id` of `sm`. Nesting of expressions and blocks is checked against `limits`
/// before each recursion, so no input can exhaust the stack. Throws UserError (located) on bad syntax.
File parse_wq_syntax(const SourceManager& sm, uint32_t file_id, SymbolTable& symbols, const Limits& limits);

}  // namespace whittle::frontend
