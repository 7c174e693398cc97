// Source texts kept for diagnostics, and the `file:line:column: error:` formatting with a caret.
#pragma once

#include <cstdint>
#include <deque>
#include <string>
#include <string_view>
#include <vector>

#include "ir/error.h"

namespace whittle::frontend {

/// Owns the text of every file read in one run, so diagnostics can show the offending line. Texts
/// stay at their address while files are added (lexers keep views of them).
class SourceManager {
public:
    /// Registers a file's text and returns its id (the SourceLoc::file of locations inside it).
    /// Throws UserError at `requested_at` (the include or `use`) past ir::kMaxSourceFiles files.
    uint32_t add(std::string name, std::string text, const ir::SourceLoc& requested_at = {});
    const std::string& name(uint32_t id) const { return files_.at(id).name; }
    const std::string& text(uint32_t id) const { return files_.at(id).text; }
    size_t size() const { return files_.size(); }
    /// The given 1-based line without its line end ("" when out of range).
    std::string_view line(uint32_t id, uint32_t line_no) const;

private:
    struct File {
        std::string name;
        std::string text;
    };
    std::deque<File> files_;  // a deque: adding a file never moves the texts that lexers are reading
};

/// "file:line:column: error: message", then the source line and a caret under the column
/// (just "error: message" when the location is unknown).
std::string format_error(const UserError& e, const SourceManager& sm);

}  // namespace whittle::frontend
