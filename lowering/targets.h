// The native gate sets (DESIGN.md target table plus nct) and the membership test for each.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"
#include "ir/entangler.h"
#include "synthesis/euler.h"

namespace whittle::lowering {

enum class Target : uint8_t { CliffordT, CxRzSx, CzRxRz, ISwapRzRx, XxR, UCx, Nct };

/// The target named `name` ("clifford+t", "cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r", "u+cx",
/// "nct"); UserError listing the known names otherwise.
Target parse_target(const std::string& name);
const char* target_name(Target t);
std::vector<Target> all_targets();

/// True when `op` is one of the target's gates (measure, reset, barrier and classical conditions
/// are allowed everywhere; nct allows no measurement).
bool in_target(const ir::Op& op, Target t);

/// The target's one-qubit vocabulary (nct has none beyond X).
OneQubitBasis one_qubit_basis(Target t);

/// The two-qubit gate the target is built on.
using ir::Entangler;
Entangler entangler(Target t);

}  // namespace whittle::lowering
