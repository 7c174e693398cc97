// The .wq printer: text that the parser reads back to the identical IR.
#pragma once

#include <string>

#include "ir/circuit.h"

namespace whittle::ir {

/// Prints the circuit as a .wq program (declarations, then one op per line).
std::string print_wq(const Circuit& c);

/// A rotation angle as stored, in [0, 2*pi) ("7*pi/4", "5.5"): exp(-i*theta/2*P) has period 4*pi, so
/// printing the stored value (not the (-pi, pi] form, which may differ by 2*pi and flip the gate's
/// sign) is what reads back to the same operator.
std::string stored_angle_text(const Angle& a);

/// One op in .wq syntax, without a line end (for diagnostics and --dump-after).
std::string print_op(const Circuit& c, const Op& op);

}  // namespace whittle::ir
