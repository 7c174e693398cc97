// Which clean work wires the wire-sharing passes may move: helpers of split- and share-work-wires.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

/// Registers (flags by register index) whose every wire is clean and never measured or reset: a
/// measured wire ends in a classical value, not at |0>, so it may not be handed to another life.
std::vector<bool> movable_work_registers(const ir::Circuit& c);

/// `work`, or `work_2`, `work_3`, ... when the circuit already names a register so; registers
/// flagged in `leaving` (by register index; empty = none) do not count, they are about to go.
std::string fresh_work_register_name(const ir::Circuit& c, const std::vector<bool>& leaving = {});

/// True for the names the wire-sharing passes give (`work`, `work_2`, `work_2_1`, ...).
bool is_work_register_name(const std::string& name);

}  // namespace whittle::passes
