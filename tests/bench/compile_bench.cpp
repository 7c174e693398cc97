// Scale benchmark (issue 8): parse throughput, per-pass time and ops/s, whole -O2 clifford+t compile,
// peak memory per op, and scaling t(10N)/t(N). Each measurement runs in a forked child so its peak
// RSS is its own. Prints markdown tables; `whittle_bench_compile --help` lists the options.
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <ctime>
#include <cstdio>
#include <cstring>
#include <map>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "frontend/load.h"
#include "generators.h"
#include "ir/resources.h"
#include "passes/pipeline.h"

using namespace whittle;
using Clock = std::chrono::steady_clock;

namespace {

struct Measure {
    double parse_s = 0, count_s = 0, compile_s = 0;
    double compile_cpu_s = 0;  ///< CPU seconds (user + system) of the whole compile, from getrusage
    double bytes = 0;
    uint64_t ops = 0;
    long peak_kib = 0;
    std::vector<std::pair<std::string, double>> pass_s;
    /// CPU seconds per pass, from the process CPU clock at each pass start (so each figure includes the
    /// runner's bookkeeping for that pass: resource counts before and after, ir::verify).
    std::vector<double> pass_cpu_s;
};

double cpu_seconds() {
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    return double(ru.ru_utime.tv_sec + ru.ru_stime.tv_sec) + 1e-6 * double(ru.ru_utime.tv_usec + ru.ru_stime.tv_usec);
}

double process_cpu_clock() {
    timespec ts;
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
    return double(ts.tv_sec) + 1e-9 * double(ts.tv_nsec);
}

double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

std::string make_input(const std::string& kind, uint64_t n) {
    if (kind == "clifford-t") return bench::random_clifford_t_qasm(uint32_t(std::max<uint64_t>(64, n / 1000)), n, 7);
    if (kind == "high-level") return bench::random_high_level_wq(uint32_t(std::max<uint64_t>(64, n / 1000)), n, 7);
    if (kind == "adder") return bench::cuccaro_adder_qasm(uint32_t(n));
    return bench::schoolbook_multiplier_wq(uint32_t(n));
}

frontend::InputFormat format_of(const std::string& kind) {
    return (kind == "clifford-t" || kind == "adder") ? frontend::InputFormat::Qasm2 : frontend::InputFormat::Wq;
}

// Runs in the child: generate, parse (timed), count, compile (timed per pass). Writes results to fd.
void measure_child(const std::string& kind, uint64_t n, int fd) {
    std::string text = make_input(kind, n);
    Measure m;
    m.bytes = double(text.size());
    frontend::SourceManager sm;
    frontend::LoadOptions lo;
    lo.limits.max_ops = 200'000'000;
    lo.limits.max_loop_trips = 100'000'000;
    auto t0 = Clock::now();
    ir::Circuit c = frontend::load_text(text, "bench", format_of(kind), sm, lo);
    m.parse_s = since(t0);
    m.ops = c.ops.size();
    t0 = Clock::now();
    ir::Resources r = ir::count_resources(c);
    m.count_s = m.parse_s + since(t0);
    (void)r;
    text.clear();
    text.shrink_to_fit();
    passes::PassOptions po;
    po.target = "clifford+t";
    po.level = 2;
    std::vector<double> cpu_marks;  // process CPU clock at each pass start and at the end
    passes::PipelineHooks hooks;
    hooks.progress = [&](const std::string&, size_t, size_t) { cpu_marks.push_back(process_cpu_clock()); };
    const double cpu0 = cpu_seconds();
    t0 = Clock::now();
    auto records = passes::run_passes(c, passes::pipeline_for(po), po, hooks);
    m.compile_s = since(t0);
    m.compile_cpu_s = cpu_seconds() - cpu0;
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    m.peak_kib = ru.ru_maxrss;
    std::string out = fmt::format("{} {} {} {} {} {} {} {}\n", m.parse_s, m.count_s, m.compile_s, m.compile_cpu_s,
                                  m.bytes, m.ops, m.peak_kib, records.size());
    for (size_t i = 0; i < records.size(); ++i)
        out += fmt::format("{} {} {} {}\n", records[i].name, records[i].seconds, cpu_marks[i + 1] - cpu_marks[i],
                           records[i].ops_before);
    ssize_t w = write(fd, out.data(), out.size());
    (void)w;
}

bool measure(const std::string& kind, uint64_t n, Measure& m) {
    int fds[2];
    if (pipe(fds) != 0) return false;
    pid_t pid = fork();
    if (pid == 0) {
        close(fds[0]);
        try {
            measure_child(kind, n, fds[1]);
        } catch (const std::exception& e) {
            std::fprintf(stderr, "%s %llu: %s\n", kind.c_str(), (unsigned long long)n, e.what());
            _exit(1);
        }
        _exit(0);
    }
    close(fds[1]);
    std::string buf;
    char tmp[4096];
    ssize_t k;
    while ((k = read(fds[0], tmp, sizeof tmp)) > 0) buf.append(tmp, size_t(k));
    close(fds[0]);
    int status = 0;
    waitpid(pid, &status, 0);
    if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) return false;
    size_t npasses = 0;
    char* p = buf.data();
    m.parse_s = std::strtod(p, &p);
    m.count_s = std::strtod(p, &p);
    m.compile_s = std::strtod(p, &p);
    m.compile_cpu_s = std::strtod(p, &p);
    m.bytes = std::strtod(p, &p);
    m.ops = std::strtoull(p, &p, 10);
    m.peak_kib = std::strtol(p, &p, 10);
    npasses = std::strtoull(p, &p, 10);
    for (size_t i = 0; i < npasses; ++i) {
        while (*p == '\n' || *p == ' ') ++p;
        char* start = p;
        while (*p && *p != ' ') ++p;
        std::string name(start, p);
        double s = std::strtod(p, &p);
        double cpu = std::strtod(p, &p);
        std::strtoull(p, &p, 10);
        m.pass_s.emplace_back(name, s);
        m.pass_cpu_s.push_back(cpu);
    }
    return true;
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<std::string> kinds = {"clifford-t", "high-level", "adder", "multiplier"};
    std::map<std::string, std::vector<uint64_t>> sizes = {{"clifford-t", {100000, 1000000, 10000000}},
                                                          {"high-level", {100000, 1000000}},
                                                          {"adder", {256, 4096}},
                                                          {"multiplier", {32, 128}}};
    for (int i = 1; i < argc; ++i) {
        std::string a = argv[i];
        if (a == "--quick") {
            sizes = {{"clifford-t", {10000, 100000}}, {"high-level", {10000, 100000}}, {"adder", {64, 640}},
                     {"multiplier", {8, 24}}};
        } else if (a == "--only" && i + 1 < argc) {
            kinds = {argv[++i]};
        } else if (a == "--sizes" && i + 1 < argc) {
            // One list for every kind run (ops for clifford-t and high-level, bits for adder and multiplier).
            std::vector<uint64_t> list;
            for (char* p = argv[++i]; *p;) {
                list.push_back(std::strtoull(p, &p, 10));
                if (*p == ',') ++p;
                else if (*p) break;
            }
            for (auto& [kind, v] : sizes) v = list;
        } else {
            std::printf("usage: whittle_bench_compile [--quick] [--only clifford-t|high-level|adder|multiplier] "
                        "[--sizes N,N,...]\n");
            return a == "--help" ? 0 : 2;
        }
    }
    std::printf("| input | size | ops | parse MB/s | count s | compile -O2 clifford+t s | compile CPU s | compile/count | peak bytes/op |\n");
    std::printf("|---|---|---|---|---|---|---|---|---|\n");
    std::map<std::string, std::vector<Measure>> all;
    for (const std::string& kind : kinds) {
        for (uint64_t n : sizes[kind]) {
            Measure m;
            if (!measure(kind, n, m)) {
                std::printf("| %s | %llu | failed | | | | | | |\n", kind.c_str(), (unsigned long long)n);
                continue;
            }
            std::printf("| %s | %llu | %llu | %.1f | %.3f | %.3f | %.3f | %.1f | %.0f |\n", kind.c_str(),
                        (unsigned long long)n, (unsigned long long)m.ops, m.bytes / 1e6 / std::max(m.parse_s, 1e-9),
                        m.count_s, m.compile_s, m.compile_cpu_s, m.compile_s / std::max(m.count_s, 1e-9),
                        double(m.peak_kib) * 1024.0 / double(std::max<uint64_t>(m.ops, 1)));
            std::fflush(stdout);
            all[kind].push_back(m);
        }
    }
    std::printf("\nPer pass (wall and CPU seconds at each size; ops/s from CPU at the largest size; scaling = "
                "CPU t(10N)/t(N) between the two last sizes)\n\n");
    for (auto& [kind, ms] : all) {
        if (ms.empty()) continue;
        std::string head = "| input | pass |", rule = "|---|---|";
        for (const Measure& m : ms) {
            head += fmt::format(" wall s ({0} ops) | CPU s ({0} ops) |", m.ops);
            rule += "---|---|";
        }
        std::printf("%s ops/s | scaling |\n%s---|---|\n", head.c_str(), rule.c_str());
        const Measure& big = ms.back();
        const Measure* small = ms.size() >= 2 ? &ms[ms.size() - 2] : nullptr;
        auto row = [&](const std::string& name, auto wall_of, auto cpu_of) {
            std::string line = fmt::format("| {} | {} |", kind, name);
            for (const Measure& m : ms) line += fmt::format(" {:.3f} | {:.3f} |", wall_of(m), cpu_of(m));
            const double cpu = cpu_of(big);
            std::string scaling = "-";
            if (small && cpu_of(*small) > 0) scaling = fmt::format("{:.1f}", cpu / cpu_of(*small));
            line += fmt::format(" {:.3g} | {} |", double(big.ops) / std::max(cpu, 1e-9), scaling);
            std::printf("%s\n", line.c_str());
        };
        for (size_t i = 0; i < big.pass_s.size(); ++i) {
            auto at = [i](const std::vector<double>& v) { return i < v.size() ? v[i] : 0.0; };
            row(big.pass_s[i].first,
                [&](const Measure& m) { return i < m.pass_s.size() ? m.pass_s[i].second : 0.0; },
                [&](const Measure& m) { return at(m.pass_cpu_s); });
        }
        row("(whole compile)", [](const Measure& m) { return m.compile_s; },
            [](const Measure& m) { return m.compile_cpu_s; });
        std::printf("\n");
    }
    return 0;
}
