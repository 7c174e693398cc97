// The one list of passes by name, read by the CLI, the pipeline, the tests and the report.
#pragma once

#include <string_view>
#include <vector>

#include "passes/pass.h"

namespace whittle::passes {

/// Every pass, in registry order (see registry.cpp).
const std::vector<PassInfo>& all_passes();

/// The pass with this name, or nullptr.
const PassInfo* find_pass(std::string_view name);

}  // namespace whittle::passes
