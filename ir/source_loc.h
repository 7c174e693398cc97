// Where an op or a diagnostic came from: an index into the source-file table plus line and column.
#pragma once

#include <cstdint>

namespace whittle::ir {

struct SourceLoc {
    uint32_t file = 0;  // index into Circuit::files (0 = the main input, or none when files is empty)
    uint32_t line = 0;  // 1-based; 0 = unknown (compiler-made op)
    uint32_t column = 0;
    bool known() const { return line != 0; }
};

}  // namespace whittle::ir
