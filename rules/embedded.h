// The checked-in identity libraries, compiled into the program (cmake/embed_rules.cmake).
#pragma once

#include <string_view>

#include "ir/target.h"

namespace whittle::rules {

/// The text of rules/library/<target>.rules as built, or "" for a target without a library.
std::string_view embedded_library_text(ir::Target t);

}  // namespace whittle::rules
