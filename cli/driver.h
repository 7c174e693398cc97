// Shared pieces of the command-line driver: error reporting, exit codes, safe output files.
#pragma once

#include <functional>
#include <iosfwd>
#include <string>

#include "frontend/diagnostics.h"

namespace whittle::cli {

/// Exit codes (DESIGN.md): 0 success, 1 a check failed, 2 usage or input error.
enum Exit : int { kOk = 0, kCheckFailed = 1, kInputError = 2 };

/// Runs `body`, turning UserError into a located message on `err` (stderr by default) and exit 2,
/// and internal errors into an "internal error" message and exit 2. Returns the exit code.
int guarded(const frontend::SourceManager& sm, const std::function<int()>& body);
int guarded(const frontend::SourceManager& sm, const std::function<int()>& body, std::ostream& err);

/// Writes `text` to `path` through a temporary file in the same folder and a rename, so a failure
/// never leaves a partial file. "-" or "" writes to stdout.
void write_output(const std::string& path, const std::string& text);

/// UserError when `out` names the same file as `in`.
void refuse_overwriting_input(const std::string& in, const std::string& out);

}  // namespace whittle::cli
