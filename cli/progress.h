// The one-line progress indicator of long compiles: on stderr, only on a terminal, only after a second.
#pragma once

#include <chrono>
#include <cstddef>
#include <string>

namespace whittle::cli {

/// Shows "whittle: [3/7] fold-phases  43%" on one rewritten stderr line. Silent unless `enabled`
/// (not --quiet), stderr is a terminal and the run has lasted over the threshold (1 s; the
/// environment variable WHITTLE_PROGRESS_AFTER_MS overrides it, for tests). Nothing of it ever
/// reaches a file or a pipe. The line is erased when the run ends.
class ProgressLine {
public:
    explicit ProgressLine(bool enabled);
    ~ProgressLine();
    ProgressLine(const ProgressLine&) = delete;
    ProgressLine& operator=(const ProgressLine&) = delete;

    /// Pass `name` is starting; `index` passes of `count` are done.
    void update(const std::string& name, size_t index, size_t count);
    /// Erases the line if one was shown (also done by the destructor).
    void finish();

private:
    bool enabled_;
    bool shown_ = false;
    std::chrono::steady_clock::time_point start_;
    std::chrono::milliseconds threshold_{1000};
};

}  // namespace whittle::cli
