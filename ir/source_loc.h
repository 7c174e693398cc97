// Where an op or a diagnostic came from: an index into the source-file table plus line and column.
#pragma once

#include <cstdint>

namespace whittle::ir {

/// At most this many source files in one run (SourceManager::add reports more as an input error):
/// SourceLoc::file is 16 bits.
constexpr uint32_t kMaxSourceFiles = 65536;

/// Packed to 10 bytes (no padding after the 16-bit file index) so that ir::Op, which holds one,
/// stays at 64 bytes. Copy a field into a local before taking its address or binding a reference.
struct [[gnu::packed]] SourceLoc {
    uint16_t file = 0;  // index into Circuit::files (0 = the main input, or none when files is empty)
    uint32_t line = 0;  // 1-based; 0 = unknown (compiler-made op)
    uint32_t column = 0;
    bool known() const { return line != 0; }
};

static_assert(sizeof(SourceLoc) == 10);

}  // namespace whittle::ir
