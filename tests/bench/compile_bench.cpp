// Scale benchmark (issue 8): parse throughput, per-pass time and ops/s, whole -O2 clifford+t compile,
// peak memory per op, and scaling t(10N)/t(N). Each measurement runs in a forked child so its peak
// RSS is its own. Prints markdown tables; `whittle_bench_compile --help` lists the options.
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
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
    double bytes = 0;
    uint64_t ops = 0;
    long peak_kib = 0;
    std::vector<std::pair<std::string, double>> pass_s;
};

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
    t0 = Clock::now();
    auto records = passes::run_passes(c, passes::pipeline_for(po), po);
    m.compile_s = since(t0);
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    m.peak_kib = ru.ru_maxrss;
    std::string out = fmt::format("{} {} {} {} {} {} {}\n", m.parse_s, m.count_s, m.compile_s, m.bytes, m.ops,
                                  m.peak_kib, records.size());
    for (auto& rec : records) out += fmt::format("{} {} {}\n", rec.name, rec.seconds, rec.ops_before);
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
        std::strtoull(p, &p, 10);
        m.pass_s.emplace_back(name, s);
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
        } else {
            std::printf("usage: whittle_bench_compile [--quick] [--only clifford-t|high-level|adder|multiplier]\n");
            return a == "--help" ? 0 : 2;
        }
    }
    std::printf("| input | size | ops | parse MB/s | count s | compile -O2 clifford+t s | compile/count | peak bytes/op |\n");
    std::printf("|---|---|---|---|---|---|---|---|\n");
    std::map<std::string, std::vector<Measure>> all;
    for (const std::string& kind : kinds) {
        for (uint64_t n : sizes[kind]) {
            Measure m;
            if (!measure(kind, n, m)) {
                std::printf("| %s | %llu | failed | | | | | |\n", kind.c_str(), (unsigned long long)n);
                continue;
            }
            std::printf("| %s | %llu | %llu | %.1f | %.3f | %.3f | %.1f | %.0f |\n", kind.c_str(),
                        (unsigned long long)n, (unsigned long long)m.ops, m.bytes / 1e6 / std::max(m.parse_s, 1e-9),
                        m.count_s, m.compile_s, m.compile_s / std::max(m.count_s, 1e-9),
                        double(m.peak_kib) * 1024.0 / double(std::max<uint64_t>(m.ops, 1)));
            std::fflush(stdout);
            all[kind].push_back(m);
        }
    }
    std::printf("\nPer pass (seconds; ops/s at the largest size; scaling = t(10N)/t(N) between the two last sizes that differ by 10x)\n\n");
    std::printf("| input | pass | seconds | ops/s | scaling |\n|---|---|---|---|---|\n");
    for (auto& [kind, ms] : all) {
        if (ms.empty()) continue;
        const Measure& big = ms.back();
        const Measure* small = ms.size() >= 2 ? &ms[ms.size() - 2] : nullptr;
        for (size_t i = 0; i < big.pass_s.size(); ++i) {
            double s = big.pass_s[i].second;
            std::string scaling = "-";
            if (small && i < small->pass_s.size() && small->pass_s[i].second > 0)
                scaling = fmt::format("{:.1f}", s / small->pass_s[i].second);
            std::printf("| %s | %s | %.3f | %.3g | %s |\n", kind.c_str(), big.pass_s[i].first.c_str(), s,
                        double(big.ops) / std::max(s, 1e-9), scaling.c_str());
        }
        if (small && small->compile_s > 0)
            std::printf("| %s | (whole compile) | %.3f | %.3g | %.1f |\n", kind.c_str(), big.compile_s,
                        double(big.ops) / std::max(big.compile_s, 1e-9), big.compile_s / small->compile_s);
    }
    return 0;
}
