// OpenQASM 2.0 import (Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429) into the high-level IR.
#pragma once

#include <cstdint>

#include "frontend/diagnostics.h"
#include "frontend/load.h"
#include "ir/circuit.h"

namespace whittle::frontend {

/// Parses the OpenQASM 2.0 file `file_id` of `sm`; controlled gates become the high-level ops they are.
ir::Circuit import_qasm2(SourceManager& sm, uint32_t file_id, const LoadOptions& opts);

}  // namespace whittle::frontend
