// The .wq printer: text that the parser reads back to the identical IR.
#pragma once

#include <string>

#include "ir/circuit.h"

namespace whittle::ir {

/// Prints the circuit as a .wq program (declarations, then one op per line).
std::string print_wq(const Circuit& c);

/// One op in .wq syntax, without a line end (for diagnostics and --dump-after).
std::string print_op(const Circuit& c, const Op& op);

}  // namespace whittle::ir
