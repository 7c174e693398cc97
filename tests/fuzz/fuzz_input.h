// Shared by the fuzz targets: tight input limits, and loading fuzz bytes as a program.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>

#include "frontend/load.h"

namespace whittle::fuzz {

/// Limits small enough that every input finishes in well under libFuzzer's timeout.
inline frontend::LoadOptions fuzz_load_options() {
    frontend::LoadOptions lo;
    lo.limits.max_loop_trips = 10'000;
    lo.limits.max_qubits = 4'096;
    lo.limits.max_ops = 100'000;
    lo.limits.max_expansion_terms = 4'096;
    lo.limits.max_file_bytes = 1 << 16;
    return lo;
}

inline std::string as_text(const uint8_t* data, size_t size) { return std::string(reinterpret_cast<const char*>(data), size); }

}  // namespace whittle::fuzz
