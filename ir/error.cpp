// Formatting of internal assertion failures.
#include "ir/error.h"

#include <fmt/format.h>

namespace whittle {

void assertion_failed(const char* cond, const char* file, int line) {
    throw InternalError(fmt::format("internal error: {}:{}: assertion failed: {}", file, line, cond));
}

}  // namespace whittle
