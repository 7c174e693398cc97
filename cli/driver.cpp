// Error handling and atomic output for every subcommand.
#include "cli/driver.h"

#include <signal.h>
#include <unistd.h>

#include <atomic>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <mutex>
#include <random>

#include <fmt/format.h>

namespace whittle::cli {
namespace {

// The temporary files being written, so that a terminating signal removes them on the way out.
// The handler reads only these slots and calls unlink, sigaction and raise (async-signal-safe);
// a slot's path is complete before its state says so. One slot per concurrent write (compile -j
// runs at most 1024 jobs, each writing one file at a time).
constexpr size_t kTempSlots = 1100;
constexpr size_t kTempPathMax = 4096;
struct TempSlot {
    std::atomic<int> state{0};  // 0 free, 1 being filled, 2 holds a path
    char path[kTempPathMax];
};
static_assert(std::atomic<int>::is_always_lock_free);
TempSlot g_temps[kTempSlots];

extern "C" void remove_temps_and_reraise(int sig) {
    for (TempSlot& t : g_temps)
        if (t.state.load() == 2) unlink(t.path);
    struct sigaction dfl{};
    dfl.sa_handler = SIG_DFL;
    sigemptyset(&dfl.sa_mask);
    sigaction(sig, &dfl, nullptr);
    raise(sig);
}

void install_signal_cleanup() {
    static std::once_flag once;
    std::call_once(once, [] {
        for (int sig : {SIGTERM, SIGINT, SIGHUP, SIGQUIT}) {
            struct sigaction old{};
            sigaction(sig, nullptr, &old);
            if (old.sa_handler == SIG_IGN) continue;  // started ignoring it (nohup): keep that
            struct sigaction sa{};
            sa.sa_handler = remove_temps_and_reraise;
            sigemptyset(&sa.sa_mask);
            sigaction(sig, &sa, nullptr);
        }
    });
}

/// Registers a temporary file's path for the signal handler while it exists.
class TempFileGuard {
public:
    explicit TempFileGuard(const std::filesystem::path& p) {
        install_signal_cleanup();
        std::error_code ec;
        const std::string abs = std::filesystem::absolute(p, ec).string();
        if (ec || abs.size() >= kTempPathMax) return;
        for (size_t i = 0; i < kTempSlots; ++i) {
            int free_state = 0;
            if (!g_temps[i].state.compare_exchange_strong(free_state, 1)) continue;
            std::memcpy(g_temps[i].path, abs.c_str(), abs.size() + 1);
            g_temps[i].state.store(2);
            slot_ = i;
            return;
        }
    }
    ~TempFileGuard() {
        if (slot_ < kTempSlots) g_temps[slot_].state.store(0);
    }
    TempFileGuard(const TempFileGuard&) = delete;
    TempFileGuard& operator=(const TempFileGuard&) = delete;

private:
    size_t slot_ = kTempSlots;
};

}  // namespace

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
        // A full disk, a closed pipe or /dev/full: the output is lost, so the run failed.
        if (!std::cout) throw UserError("cannot write the output to standard output");
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
    // Registered before it is created and until it is renamed: SIGTERM in between removes it.
    TempFileGuard guard(tmp);
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
