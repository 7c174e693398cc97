// Placeholder until the .wq parser lands.
#include "frontend/wq_parser.h"
namespace whittle::frontend {
ir::Circuit parse_wq(SourceManager&, uint32_t, const LoadOptions&) { throw UserError("the .wq parser is not built yet"); }
}  // namespace whittle::frontend
