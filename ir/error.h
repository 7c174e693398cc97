// The two error channels: UserError (bad input, located, recoverable) and WHITTLE_ASSERT (a bug).
#pragma once

#include <stdexcept>
#include <string>

#include "ir/source_loc.h"

namespace whittle {

/// A problem in the user's input or options. Messages are lowercase, without a trailing period;
/// the driver formats them as `file:line:column: error: message`, the source line and a caret.
class UserError : public std::runtime_error {
public:
    explicit UserError(std::string message, ir::SourceLoc loc = {}, std::string file_name = {})
        : std::runtime_error(std::move(message)), loc_(loc), file_name_(std::move(file_name)) {}
    const ir::SourceLoc& loc() const { return loc_; }
    /// The file the location refers to, when the thrower knew it (else the driver uses loc.file).
    const std::string& file_name() const { return file_name_; }

private:
    ir::SourceLoc loc_;
    std::string file_name_;
};

/// Thrown by WHITTLE_ASSERT: an internal invariant failed (a compiler bug, never the user's fault).
class InternalError : public std::logic_error {
public:
    using std::logic_error::logic_error;
};

[[noreturn]] void assertion_failed(const char* cond, const char* file, int line);

}  // namespace whittle

/// Internal invariant check, always on. Write `WHITTLE_ASSERT(cond && "why")`.
#define WHITTLE_ASSERT(cond) \
    ((cond) ? (void)0 : ::whittle::assertion_failed(#cond, __FILE__, __LINE__))
