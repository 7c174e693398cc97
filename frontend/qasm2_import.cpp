// Placeholder until the OpenQASM 2.0 importer lands.
#include "frontend/qasm2_import.h"
namespace whittle::frontend {
ir::Circuit import_qasm2(SourceManager&, uint32_t, const LoadOptions&) { throw UserError("OpenQASM import is not built yet"); }
}  // namespace whittle::frontend
