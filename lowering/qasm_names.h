// Register names for OpenQASM output: the source's names, changed only when OpenQASM cannot take them.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::lowering {

struct QasmNames {
    std::vector<std::string> qregs;  ///< one per Circuit::registers entry
    std::vector<std::string> cregs;  ///< one per Circuit::cregs entry
    /// "// register X is written as Y" lines for every name that had to change.
    std::vector<std::string> renames;
};

/// Keeps each register name when it is a valid OpenQASM 2.0 and 3.0 identifier (lowercase first
/// letter, then letters, digits, '_'), not a keyword or a gate name, and not taken; otherwise
/// derives a close unique one. Quantum and classical registers share one namespace.
QasmNames qasm_names(const ir::Circuit& c);

}  // namespace whittle::lowering
