// Dispatch from a path or text to the right reader.
#include "frontend/load.h"

#include <filesystem>
#include <fstream>
#include <sstream>

#include <fmt/format.h>

#include "frontend/qasm2_import.h"
#include "frontend/wq_parser.h"

namespace whittle::frontend {

InputFormat format_for_path(const std::string& path) {
    std::string ext = std::filesystem::path(path).extension().string();
    if (ext == ".wq") return InputFormat::Wq;
    if (ext == ".qasm") return InputFormat::Qasm2;
    throw UserError(fmt::format("cannot tell the input format of '{}': use a .wq or .qasm file", path));
}

std::string stdlib_dir() {
    if (const char* env = std::getenv("WHITTLE_STDLIB")) return env;
    if (std::filesystem::exists(WHITTLE_STDLIB_DIR_BUILD)) return WHITTLE_STDLIB_DIR_BUILD;
    return WHITTLE_STDLIB_DIR_INSTALL;
}

ir::Circuit load_text(std::string text, const std::string& name, InputFormat format, SourceManager& sm,
                      const LoadOptions& opts) {
    if (text.size() > opts.limits.max_file_bytes)
        throw UserError(fmt::format("input is {} bytes, over the limit of {} bytes", text.size(),
                                    opts.limits.max_file_bytes),
                        {}, name);
    uint32_t id = sm.add(name, std::move(text));
    if (format == InputFormat::Qasm2) return import_qasm2(sm, id, opts);
    return parse_wq(sm, id, opts);
}

ir::Circuit load_file(const std::string& path, SourceManager& sm, const LoadOptions& opts) {
    InputFormat format = format_for_path(path);
    std::error_code ec;
    if (std::filesystem::is_directory(path, ec)) throw UserError(fmt::format("'{}' is a directory", path));
    std::ifstream in(path, std::ios::binary);
    if (!in) throw UserError(fmt::format("cannot open '{}'", path));
    auto size = std::filesystem::file_size(path, ec);
    if (!ec && size > opts.limits.max_file_bytes)
        throw UserError(fmt::format("input is {} bytes, over the limit of {} bytes", size, opts.limits.max_file_bytes),
                        {}, path);
    // Read straight into one string of the file's size (no stream buffer and copy of a large input).
    std::string text;
    if (!ec) {
        text.resize(size_t(size));
        in.read(text.data(), std::streamsize(size));
        text.resize(size_t(in.gcount()));
    }
    std::ostringstream rest;  // whatever the size did not cover (a file that grew, or one without a size)
    rest << in.rdbuf();
    text += rest.str();
    return load_text(std::move(text), path, format, sm, opts);
}

}  // namespace whittle::frontend
