// The native gate sets (DESIGN.md target table plus nct) and the membership test for each.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"
#include "ir/entangler.h"
#include "ir/target.h"
#include "synthesis/euler.h"

namespace whittle::lowering {

// The enum and its names are in ir/target.h (options carry it below the lowering).
using ir::Target;
using ir::parse_target;
using ir::target_name;
using ir::all_targets;

/// True when `op` is one of the target's gates (measure, reset, barrier and classical conditions
/// are allowed everywhere; nct allows no measurement).
bool in_target(const ir::Op& op, Target t);

/// The target's one-qubit vocabulary (nct has none beyond X).
OneQubitBasis one_qubit_basis(Target t);

/// The two-qubit gate the target is built on.
using ir::Entangler;
Entangler entangler(Target t);

}  // namespace whittle::lowering
