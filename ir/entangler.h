// The two-qubit gate a gate set is built on: shared by the synthesis (templates per entangler) and the targets.
#pragma once

#include <cstdint>

namespace whittle::ir {

enum class Entangler : uint8_t { CX, CZ, ISwap, XX };

}  // namespace whittle::ir
