// The OpenQASM register annotation line: written by output/qasm_names.cpp, read back by the 2.0 reader.
#pragma once

namespace whittle::ir {

/// The marker that starts a `// whittle: qreg WRITTEN source NAME role ROLE` line.
inline constexpr const char* kQasmAnnotation = "// whittle: qreg ";

}  // namespace whittle::ir
