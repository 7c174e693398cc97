// Global operator new that asks the kernel for transparent huge pages on large blocks.
//
// Why: a big circuit's op vectors and pass tables (hundreds of MB at 10^6 gates) are walked and
// probed all over; with 4 KiB pages every pass pays a page fault per 4 KiB of each fresh vector and a
// TLB miss on most random probes, and that cost grew faster than the circuit (issue 8's scaling). On
// Linux systems whose transparent huge pages are in "madvise" mode (the common default), advising
// large blocks with MADV_HUGEPAGE lets the kernel back them with 2 MiB pages. Blocks still come from
// and go back to malloc/free, so nothing else changes. Linked into the executables (whittle and the
// benchmark), not into the library: a program embedding the library keeps its own allocator.
#include <sys/mman.h>

#include <cstdint>
#include <cstdlib>
#include <new>

#if !defined(__SANITIZE_ADDRESS__)  // the sanitizer runtime supplies its own checked operator new

namespace {

constexpr std::size_t kHugePage = std::size_t(2) << 20;
constexpr std::size_t kAdviseFrom = kHugePage;  // below one huge page there is nothing to advise

void* allocate(std::size_t n) {
    if (n == 0) n = 1;
    for (;;) {
        if (void* p = std::malloc(n)) {
            if (n >= kAdviseFrom) {
                const auto start = reinterpret_cast<std::uintptr_t>(p);
                const std::uintptr_t first = (start + kHugePage - 1) & ~(kHugePage - 1);
                const std::uintptr_t last = (start + n) & ~(kHugePage - 1);
                // Advice only: a kernel without huge pages refuses it and the block works as before.
                if (last > first) madvise(reinterpret_cast<void*>(first), last - first, MADV_HUGEPAGE);
            }
            return p;
        }
        std::new_handler handler = std::get_new_handler();
        if (!handler) throw std::bad_alloc();
        handler();
    }
}

}  // namespace

void* operator new(std::size_t n) { return allocate(n); }
void* operator new[](std::size_t n) { return allocate(n); }
void operator delete(void* p) noexcept { std::free(p); }
void operator delete[](void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }
void operator delete[](void* p, std::size_t) noexcept { std::free(p); }

#endif
