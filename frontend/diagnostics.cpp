// Diagnostic formatting.
#include "frontend/diagnostics.h"

#include <fmt/format.h>

namespace whittle::frontend {

uint32_t SourceManager::add(std::string name, std::string text, const ir::SourceLoc& requested_at) {
    if (files_.size() >= ir::kMaxSourceFiles)
        throw UserError(fmt::format("more than {} source files (each include reads one)", ir::kMaxSourceFiles), requested_at);
    files_.push_back(File{std::move(name), std::move(text)});
    return uint32_t(files_.size() - 1);
}

std::string_view SourceManager::line(uint32_t id, uint32_t line_no) const {
    if (id >= files_.size() || line_no == 0) return {};
    std::string_view t = files_[id].text;
    size_t pos = 0;
    for (uint32_t l = 1; l < line_no; ++l) {
        pos = t.find('\n', pos);
        if (pos == std::string_view::npos) return {};
        ++pos;
    }
    size_t end = t.find('\n', pos);
    if (end == std::string_view::npos) end = t.size();
    std::string_view s = t.substr(pos, end - pos);
    if (!s.empty() && s.back() == '\r') s.remove_suffix(1);
    return s;
}

std::string format_error(const UserError& e, const SourceManager& sm) {
    const ir::SourceLoc& loc = e.loc();
    std::string file = e.file_name();
    if (file.empty() && loc.file < sm.size()) file = sm.name(loc.file);
    if (!loc.known()) {
        if (!file.empty()) return fmt::format("{}: error: {}\n", file, e.what());
        return fmt::format("error: {}\n", e.what());
    }
    std::string out = fmt::format("{}:{}:{}: error: {}\n", file, uint32_t(loc.line), uint32_t(loc.column), e.what());
    if (loc.file < sm.size()) {
        std::string_view src = sm.line(loc.file, loc.line);
        // Columns count from after a leading UTF-8 byte order mark (both readers skip it).
        if (loc.line == 1 && src.substr(0, 3) == "\xEF\xBB\xBF") src.remove_prefix(3);
        if (!src.empty() && src.size() < 400) {
            std::string shown, caret;
            for (size_t i = 0; i < src.size(); ++i) {
                unsigned char ch = static_cast<unsigned char>(src[i]);
                shown += (ch == '\t') ? ' ' : (ch < 32 || ch >= 127 ? '?' : char(ch));
            }
            size_t col = loc.column == 0 ? 0 : loc.column - 1;
            caret.assign(std::min(col, shown.size()), ' ');
            out += fmt::format("  {}\n  {}^\n", shown, caret);
        }
    }
    return out;
}

}  // namespace whittle::frontend
