// The one list of passes by name, read by the CLI, the pipeline, the tests and the report.
#pragma once

#include <string_view>
#include <vector>

#include "passes/pass.h"

namespace whittle::passes {

/// Every pass, in registry order (see registry.cpp).
const std::vector<PassInfo>& all_passes();

/// The pass with this name (built-in, then registered), or nullptr.
const PassInfo* find_pass(std::string_view name);

/// Adds a pass defined by a program that links the library (a tool of its own, or a test that needs
/// a deliberately wrong pass to exercise `--verify`). It is then found by name like the built-in
/// ones (`--passes`, run_passes) but is not in all_passes() or any -O pipeline. The name must be
/// new (UserError otherwise). Not thread-safe: register before running passes.
void register_pass(const PassInfo& pass);

}  // namespace whittle::passes
