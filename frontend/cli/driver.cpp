// Error handling and atomic output for every subcommand.
#include "frontend/cli/driver.h"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <random>

#include <fmt/format.h>

namespace whittle::cli {

int guarded(const frontend::SourceManager& sm, const std::function<int()>& body) { return guarded(sm, body, std::cerr); }

int guarded(const frontend::SourceManager& sm, const std::function<int()>& body, std::ostream& err) {
    try {
        return body();
    } catch (const UserError& e) {
        err << frontend::format_error(e, sm);
        return kInputError;
    } catch (const InternalError& e) {
        err << e.what() << "\n(this is a bug in whittle; please report it with the input)\n";
        return kInputError;
    } catch (const std::bad_alloc&) {
        err << "error: out of memory\n";
        return kInputError;
    } catch (const std::exception& e) {
        err << "internal error: " << e.what() << "\n(this is a bug in whittle; please report it with the input)\n";
        return kInputError;
    }
}

void write_output(const std::string& path, const std::string& text) {
    if (path.empty() || path == "-") {
        std::cout << text;
        std::cout.flush();
        return;
    }
    namespace fs = std::filesystem;
    fs::path target(path);
    std::error_code ec;
    // A symbolic link stays a link: the file it names gets the text.
    if (fs::is_symlink(target, ec)) {
        const fs::path resolved = fs::weakly_canonical(target, ec);
        if (!ec) target = resolved;
    }
    // A device, pipe or socket (/dev/null, /dev/stdout, a named pipe) is written as it is: renaming
    // a finished file over it would replace the device with a regular file.
    const fs::file_status st = fs::status(target, ec);
    if (!ec && fs::exists(st) && !fs::is_regular_file(st)) {
        if (fs::is_directory(st)) throw UserError(fmt::format("cannot write '{}': it is a folder", path));
        std::ofstream out(target, std::ios::binary);
        if (!out) throw UserError(fmt::format("cannot write '{}'", path));
        out << text;
        out.flush();
        if (!out) throw UserError(fmt::format("cannot write '{}'", path));
        return;
    }
    fs::path dir = target.has_parent_path() ? target.parent_path() : fs::path(".");
    if (!fs::is_directory(dir, ec)) throw UserError(fmt::format("cannot write '{}': folder '{}' does not exist", path, dir.string()));
    std::random_device rd;
    fs::path tmp = dir / fmt::format(".{}.tmp{:08x}", target.filename().string(), rd());
    {
        std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
        if (!out) throw UserError(fmt::format("cannot write '{}'", path));
        out << text;
        out.flush();
        if (!out) {
            out.close();
            fs::remove(tmp, ec);
            throw UserError(fmt::format("cannot write '{}' (disk full?)", path));
        }
    }
    fs::rename(tmp, target, ec);
    if (ec) {
        fs::remove(tmp, ec);
        throw UserError(fmt::format("cannot write '{}'", path));
    }
}

void refuse_overwriting_input(const std::string& in, const std::string& out) {
    namespace fs = std::filesystem;
    if (out.empty() || out == "-") return;
    std::error_code ec;
    if (fs::exists(out, ec) && fs::equivalent(in, out, ec))
        throw UserError(fmt::format("output '{}' is the input file; choose another -o", out));
    if (fs::weakly_canonical(in, ec) == fs::weakly_canonical(out, ec))
        throw UserError(fmt::format("output '{}' is the input file; choose another -o", out));
}

}  // namespace whittle::cli
