// Register names for OpenQASM output: the source's names, changed only when OpenQASM cannot take them.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"
#include "ir/qasm_annotation.h"

namespace whittle::lowering {

struct QasmNames {
    std::vector<std::string> qregs;  ///< one per Circuit::registers entry
    std::vector<std::string> cregs;  ///< one per Circuit::cregs entry
    /// "// register X is written as Y" lines for every classical register name that had to change.
    std::vector<std::string> renames;
    /// `// whittle: qreg WRITTEN source NAME role ROLE` for every quantum register whose name had
    /// to change or whose role is not `qubit` (clean and dirty work wires, the compiler's `work`
    /// registers): the OpenQASM 2.0 reader takes the name and the role back from it.
    std::vector<std::string> annotations;
};

/// Keeps each register name when it is a valid identifier of the dialect (lowercase first letter,
/// then letters, digits, '_'), not one of its keywords and not the name of a gate the output
/// includes or defines, and not taken; otherwise derives a close unique one. Quantum and
/// classical registers share one namespace. `v3`: OpenQASM 3.0 (its keywords and stdgates.inc);
/// else 2.0 (its keywords and the qelib1.inc gates of every header version).
QasmNames qasm_names(const ir::Circuit& c, bool v3);

using ir::kQasmAnnotation;

}  // namespace whittle::lowering
