// Entry point for .wq input: parse and elaborate on a thread with a large stack.
#include "frontend/wq_parser.h"

#include <pthread.h>

#include <exception>

#include "frontend/elaborator.h"

namespace whittle::frontend {
namespace {

// Expression and block nesting are bounded by Limits; this stack is sized so that the bounds hold
// with room to spare even in sanitizer builds (reserved address space, touched only as used).
constexpr size_t kStackBytes = size_t(512) << 20;

struct Job {
    const std::function<void()>* work;
    std::exception_ptr error;
};

void* run_job(void* p) {
    Job* job = static_cast<Job*>(p);
    try {
        (*job->work)();
    } catch (...) {
        job->error = std::current_exception();
    }
    return nullptr;
}

}  // namespace

void run_on_parser_stack(const std::function<void()>& work) {
    Job job{&work, nullptr};
    pthread_attr_t attr;
    pthread_t thread;
    bool threaded = pthread_attr_init(&attr) == 0 && pthread_attr_setstacksize(&attr, kStackBytes) == 0 &&
                    pthread_create(&thread, &attr, run_job, &job) == 0;
    pthread_attr_destroy(&attr);
    if (threaded) pthread_join(thread, nullptr);
    else run_job(&job);  // no thread available: run here (the limits still bound the recursion)
    if (job.error) std::rethrow_exception(job.error);
}

ir::Circuit parse_wq(SourceManager& sm, uint32_t file_id, const LoadOptions& opts) {
    ir::Circuit result;
    run_on_parser_stack([&] { result = Elaborator(sm, opts).run(file_id); });
    return result;
}

}  // namespace whittle::frontend
