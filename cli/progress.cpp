// Progress line on a terminal stderr (see progress.h).
#include "cli/progress.h"

#include <unistd.h>

#include <cstdio>
#include <cstdlib>

#include <fmt/format.h>

namespace whittle::cli {

ProgressLine::ProgressLine(bool enabled)
    : enabled_(enabled && isatty(STDERR_FILENO) == 1), start_(std::chrono::steady_clock::now()) {
    if (const char* ms = std::getenv("WHITTLE_PROGRESS_AFTER_MS")) threshold_ = std::chrono::milliseconds(std::atol(ms));
}

ProgressLine::~ProgressLine() { finish(); }

void ProgressLine::update(const std::string& name, size_t index, size_t count) {
    if (!enabled_ || std::chrono::steady_clock::now() - start_ < threshold_) return;
    const unsigned share = count == 0 ? 100u : unsigned(index * 100 / count);
    std::string line = fmt::format("\rwhittle: [{}/{}] {}  {}%\033[K", index, count, name, share);
    std::fputs(line.c_str(), stderr);
    std::fflush(stderr);
    shown_ = true;
}

void ProgressLine::finish() {
    if (!shown_) return;
    std::fputs("\r\033[K", stderr);
    std::fflush(stderr);
    shown_ = false;
}

}  // namespace whittle::cli
