// OpenQASM 2.0 and 3.0 export (Cross et al. 2017, arXiv:1707.03429; Cross et al. 2022, arXiv:2104.14722).
#pragma once

#include <string>

#include "ir/circuit.h"

namespace whittle::lowering {

/// OpenQASM 2.0 text. Ops with no standard-header form (more than two controls, ...) raise a
/// UserError that says to pick a --target; gates outside the header carry a `gate` definition.
std::string emit_qasm2(const ir::Circuit& c);

/// OpenQASM 3.0 text using stdgates.inc names, `bit` registers and `if` for feed-forward.
std::string emit_qasm3(const ir::Circuit& c);

}  // namespace whittle::lowering
