// Placeholder until the OpenQASM exporters land.
#include "lowering/emit_qasm.h"
#include "ir/error.h"
namespace whittle::lowering {
std::string emit_qasm2(const ir::Circuit&) { throw UserError("OpenQASM export is not built yet"); }
std::string emit_qasm3(const ir::Circuit&) { throw UserError("OpenQASM export is not built yet"); }
}  // namespace whittle::lowering
