// Scale benchmark (issue 8): parse throughput, per-pass time and ops/s, whole -O2 clifford+t compile,
// peak memory per op, and scaling t(10N)/t(N). Each measurement runs in a forked child (under an
// address-space and a time limit) so its peak RSS and CPU time are its own. Prints markdown tables;
// `whittle_bench_compile --help` lists the options.
#include <sys/resource.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include <algorithm>
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
#include "compiler/compile.h"

using namespace whittle;
using Clock = std::chrono::steady_clock;

namespace {

struct PassTime {
    std::string name;
    double seconds = 0, cpu_seconds = 0;
    uint64_t ops_before = 0;
    long peak_kib = 0;  ///< the child's peak RSS after the pass
};

struct Measure {
    double parse_s = 0, parse_cpu = 0, count_s = 0, compile_s = 0, compile_cpu = 0;
    double bytes = 0;
    uint64_t ops = 0, ops_out = 0;
    long peak_kib = 0;
    std::vector<PassTime> passes;
};

/// One family of inputs: its name, the language it is written in, and the sizes to run.
struct Case {
    std::string kind;
    std::vector<uint64_t> sizes;
};

double since(Clock::time_point t0) { return std::chrono::duration<double>(Clock::now() - t0).count(); }

/// CPU seconds (user + system) of this process so far.
double cpu_now() {
    timespec ts{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
    return double(ts.tv_sec) + double(ts.tv_nsec) * 1e-9;
}

uint32_t random_width(uint64_t n) { return uint32_t(std::max<uint64_t>(64, n / 1000)); }

std::string make_input(const std::string& kind, uint64_t n) {
    if (kind == "clifford-t") return bench::random_clifford_t_qasm(random_width(n), n, 7);
    if (kind == "clifford-t-wq") return bench::random_clifford_t_wq(random_width(n), n, 7);
    if (kind == "high-level") return bench::random_high_level_wq(random_width(n), n, 7);
    if (kind == "adder") return bench::cuccaro_adder_qasm(uint32_t(n));
    if (kind == "adder-wq") return bench::cuccaro_adder_wq(uint32_t(n));
    return bench::schoolbook_multiplier_wq(uint32_t(n));
}

/// Input ops for a size (to skip sizes over --max-ops before generating them).
uint64_t estimated_ops(const std::string& kind, uint64_t n) {
    if (kind == "adder" || kind == "adder-wq") return 6 * n + 1;
    if (kind == "multiplier") return n * (6 * n + 1);
    return n;
}

frontend::InputFormat format_of(const std::string& kind) {
    return (kind == "clifford-t" || kind == "adder") ? frontend::InputFormat::Qasm2 : frontend::InputFormat::Wq;
}

const char* format_name(const std::string& kind) {
    return format_of(kind) == frontend::InputFormat::Qasm2 ? "qasm2" : "wq";
}

// Runs in the child: generate, parse (timed), count, compile (timed per pass; skipped when
// `compile` is false). Writes results to fd.
void measure_child(const std::string& kind, uint64_t n, bool compile, int fd) {
    std::string text = make_input(kind, n);
    Measure m;
    m.bytes = double(text.size());
    frontend::SourceManager sm;
    frontend::LoadOptions lo;
    lo.limits.max_ops = 200'000'000;
    lo.limits.max_loop_trips = 100'000'000;
    auto t0 = Clock::now();
    double c0 = cpu_now();
    // The text moves into the SourceManager, as `whittle compile` keeps the file's text for diagnostics.
    ir::Circuit c = frontend::load_text(std::move(text), "bench", format_of(kind), sm, lo);
    m.parse_s = since(t0);
    m.parse_cpu = cpu_now() - c0;
    m.ops = c.ops.size();
    t0 = Clock::now();
    ir::Resources r = ir::count_resources(c);
    m.count_s = m.parse_s + since(t0);
    (void)r;
    compiler::CompileOptions co;
    co.target = ir::Target::CliffordT;
    co.level = 2;
    co.check = false;  // the pipeline's time and memory alone
    t0 = Clock::now();
    c0 = cpu_now();
    std::vector<passes::PassRecord> records;
    if (compile) {
        compiler::CompileResult res = compiler::compile(std::move(c), co);
        records = std::move(res.records);
        c = std::move(res.circuit);
    }
    m.compile_s = since(t0);
    m.compile_cpu = cpu_now() - c0;
    m.ops_out = c.ops.size();
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    m.peak_kib = ru.ru_maxrss;
    std::string out = fmt::format("{} {} {} {} {} {} {} {} {} {}\n", m.parse_s, m.parse_cpu, m.count_s, m.compile_s,
                                  m.compile_cpu, m.bytes, m.ops, m.ops_out, m.peak_kib, records.size());
    for (auto& rec : records) out += fmt::format("{} {} {} {} {}\n", rec.name, rec.seconds, rec.cpu_seconds, rec.ops_before, rec.peak_rss_kib);
    ssize_t w = write(fd, out.data(), out.size());
    (void)w;
}

struct Limits {
    double mem_gib = 8;
    unsigned timeout_s = 900;
    uint64_t compile_max_ops = UINT64_MAX;  ///< larger inputs are parsed and counted only
};

/// Runs one measurement in a child. Returns "" on success, else why it failed.
std::string measure(const std::string& kind, uint64_t n, const Limits& limits, Measure& m) {
    int fds[2];
    if (pipe(fds) != 0) return "pipe failed";
    pid_t pid = fork();
    if (pid == 0) {
        close(fds[0]);
        // The machine is shared: a size that would need more memory than the limit fails alone.
        rlimit as{};
        as.rlim_cur = as.rlim_max = rlim_t(limits.mem_gib * double(1ull << 30));
        setrlimit(RLIMIT_AS, &as);
        alarm(limits.timeout_s);
        try {
            measure_child(kind, n, estimated_ops(kind, n) <= limits.compile_max_ops, fds[1]);
        } catch (const std::bad_alloc&) {
            _exit(3);
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
    if (WIFSIGNALED(status) && WTERMSIG(status) == SIGALRM) return fmt::format("over {} s", limits.timeout_s);
    if (WIFEXITED(status) && WEXITSTATUS(status) == 3) return fmt::format("over {} GiB", limits.mem_gib);
    if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) return "failed";
    char* p = buf.data();
    m.parse_s = std::strtod(p, &p);
    m.parse_cpu = std::strtod(p, &p);
    m.count_s = std::strtod(p, &p);
    m.compile_s = std::strtod(p, &p);
    m.compile_cpu = std::strtod(p, &p);
    m.bytes = std::strtod(p, &p);
    m.ops = std::strtoull(p, &p, 10);
    m.ops_out = std::strtoull(p, &p, 10);
    m.peak_kib = std::strtol(p, &p, 10);
    size_t npasses = std::strtoull(p, &p, 10);
    for (size_t i = 0; i < npasses; ++i) {
        while (*p == '\n' || *p == ' ') ++p;
        char* start = p;
        while (*p && *p != ' ') ++p;
        PassTime t;
        t.name.assign(start, p);
        t.seconds = std::strtod(p, &p);
        t.cpu_seconds = std::strtod(p, &p);
        t.ops_before = std::strtoull(p, &p, 10);
        t.peak_kib = std::strtol(p, &p, 10);
        m.passes.push_back(t);
    }
    return "";
}

double median(std::vector<double> v) {
    std::sort(v.begin(), v.end());
    const size_t k = v.size();
    return k == 0 ? 0 : k % 2 ? v[k / 2] : 0.5 * (v[k / 2 - 1] + v[k / 2]);
}

/// The per-field median of repeated measurements of one input (the same generated circuit, so the
/// sizes, op counts and pass lists agree).
Measure median_of(const std::vector<Measure>& runs) {
    Measure m = runs.front();
    auto field = [&](auto get) {
        std::vector<double> v;
        for (const Measure& r : runs) v.push_back(double(get(r)));
        return median(v);
    };
    m.parse_s = field([](const Measure& r) { return r.parse_s; });
    m.parse_cpu = field([](const Measure& r) { return r.parse_cpu; });
    m.count_s = field([](const Measure& r) { return r.count_s; });
    m.compile_s = field([](const Measure& r) { return r.compile_s; });
    m.compile_cpu = field([](const Measure& r) { return r.compile_cpu; });
    m.peak_kib = long(field([](const Measure& r) { return r.peak_kib; }));
    for (size_t i = 0; i < m.passes.size(); ++i) {
        m.passes[i].seconds = field([&](const Measure& r) { return r.passes[i].seconds; });
        m.passes[i].cpu_seconds = field([&](const Measure& r) { return r.passes[i].cpu_seconds; });
        m.passes[i].peak_kib = long(field([&](const Measure& r) { return r.passes[i].peak_kib; }));
    }
    return m;
}

/// "12.3 (x10)": t(big)/t(small) and the ratio of their input sizes.
std::string scaling(double small_t, double big_t, uint64_t small_ops, uint64_t big_ops) {
    if (small_t <= 0) return "-";
    return fmt::format("{:.1f} (x{:.0f})", big_t / small_t, double(big_ops) / double(std::max<uint64_t>(small_ops, 1)));
}

void usage() {
    std::printf(
        "usage: whittle_bench_compile [--quick] [--only KIND] [--sizes N,N,...] [--max-ops N]\n"
        "                             [--compile-max-ops N] [--mem-limit-gib G] [--timeout S]\n"
        "       whittle_bench_compile --write KIND N FILE\n"
        "  KIND: clifford-t, clifford-t-wq, high-level, adder, adder-wq, multiplier\n"
        "  --sizes N,N,...    the sizes for every KIND run (ops, or bits for adders and multipliers)\n"
        "  --repeat K         measure every size K times, the sizes taking turns; figures are the\n"
        "                     medians (default 1)\n"
        "  --max-ops N        skip sizes with more than N input ops\n"
        "  --mem-limit-gib G  address-space limit of each measurement (default 8)\n"
        "  --timeout S        time limit of each measurement in seconds (default 900)\n"
        "  --compile-max-ops N  sizes with more input ops are parsed and counted, not compiled\n"
        "  --write KIND N FILE  only write the input of KIND at size N to FILE (to profile it alone)\n");
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<Case> cases = {{"clifford-t", {100000, 1000000, 10000000}},
                               {"clifford-t-wq", {100000, 1000000}},
                               {"high-level", {100000, 1000000, 10000000}},
                               {"adder", {256, 4096}},
                               {"adder-wq", {256, 4096}},
                               {"multiplier", {32, 128, 512}}};
    std::string only;
    uint64_t max_ops = UINT64_MAX;
    unsigned repeat = 1;
    Limits limits;
    for (int i = 1; i < argc; ++i) {
        std::string a = argv[i];
        bool has_value = i + 1 < argc;
        if (a == "--quick") {
            cases = {{"clifford-t", {10000, 100000}}, {"clifford-t-wq", {10000, 100000}}, {"high-level", {10000, 100000}},
                     {"adder", {64, 640}},           {"adder-wq", {64, 640}},            {"multiplier", {8, 24}}};
        } else if (a == "--only" && has_value) {
            only = argv[++i];
        } else if (a == "--sizes" && has_value) {
            // One list for every kind run (ops for the random inputs, bits for adders and multipliers).
            std::vector<uint64_t> list;
            for (char* p = argv[++i]; *p;) {
                list.push_back(std::strtoull(p, &p, 10));
                if (*p != ',') break;
                ++p;
            }
            for (Case& cs : cases) cs.sizes = list;
        } else if (a == "--repeat" && has_value) {
            repeat = unsigned(std::max(1ul, std::strtoul(argv[++i], nullptr, 10)));
        } else if (a == "--max-ops" && has_value) {
            max_ops = std::strtoull(argv[++i], nullptr, 10);
        } else if (a == "--mem-limit-gib" && has_value) {
            limits.mem_gib = std::strtod(argv[++i], nullptr);
        } else if (a == "--compile-max-ops" && has_value) {
            limits.compile_max_ops = std::strtoull(argv[++i], nullptr, 10);
        } else if (a == "--write" && i + 3 < argc) {
            std::string kind = argv[i + 1];
            static const char* kKinds[] = {"clifford-t", "clifford-t-wq", "high-level", "adder", "adder-wq", "multiplier"};
            if (std::find(std::begin(kKinds), std::end(kKinds), kind) == std::end(kKinds)) {
                std::fprintf(stderr, "whittle_bench_compile: unknown KIND '%s'\n", kind.c_str());
                return 2;
            }
            std::string text = make_input(kind, std::strtoull(argv[i + 2], nullptr, 10));
            FILE* f = std::fopen(argv[i + 3], "wb");
            if (!f || std::fwrite(text.data(), 1, text.size(), f) != text.size() || std::fclose(f) != 0) {
                std::fprintf(stderr, "whittle_bench_compile: cannot write %s\n", argv[i + 3]);
                return 1;
            }
            return 0;
        } else if (a == "--timeout" && has_value) {
            limits.timeout_s = unsigned(std::strtoul(argv[++i], nullptr, 10));
        } else {
            usage();
            return a == "--help" ? 0 : 2;
        }
    }
    std::printf("Wall and CPU seconds (CPU = user + system of the measuring process); peak RSS of the whole run "
                "(generation, parse, compile) per input op; medians of %u run(s) per size, with the range of the "
                "compile's CPU seconds.\n\n", repeat);
    std::printf("| input | format | size | ops in | ops out | parse MB/s (wall) | parse MB/s (CPU) | count s | "
                "compile s (wall) | compile s (CPU) | CPU range | compile/count (CPU) | peak bytes/op |\n");
    std::printf("|---|---|---|---|---|---|---|---|---|---|---|---|---|\n");
    std::vector<std::pair<std::string, std::vector<Measure>>> all;
    for (const Case& cs : cases) {
        if (!only.empty() && cs.kind != only) continue;
        std::vector<Measure> done;
        // The sizes take turns (size 1, size 2, ..., size 1, ...), so a slow spell of the machine
        // does not fall on one size's runs alone.
        std::vector<uint64_t> sizes;
        for (uint64_t n : cs.sizes)
            if (estimated_ops(cs.kind, n) <= max_ops) sizes.push_back(n);
        std::vector<std::vector<Measure>> runs(sizes.size());
        std::vector<std::string> failed(sizes.size());
        for (unsigned rep = 0; rep < repeat; ++rep)
            for (size_t k = 0; k < sizes.size(); ++k) {
                if (!failed[k].empty()) continue;
                Measure m;
                failed[k] = measure(cs.kind, sizes[k], limits, m);
                if (failed[k].empty()) runs[k].push_back(std::move(m));
            }
        for (size_t k = 0; k < sizes.size(); ++k) {
            const uint64_t n = sizes[k];
            const std::string& why = failed[k];
            if (!why.empty()) {
                std::printf("| %s | %s | %llu | %s | | | | | | | | | |\n", cs.kind.c_str(), format_name(cs.kind),
                            (unsigned long long)n, why.c_str());
                std::fflush(stdout);
                continue;
            }
            Measure m = median_of(runs[k]);
            double lo = runs[k].front().compile_cpu, hi = lo;
            for (const Measure& r : runs[k]) {
                lo = std::min(lo, r.compile_cpu);
                hi = std::max(hi, r.compile_cpu);
            }
            // `whittle count` is parse plus count; the goal compares the compile's CPU time with it.
            const double count_cpu = m.parse_cpu + (m.count_s - m.parse_s);
            if (m.passes.empty()) {
                std::printf("| %s | %s | %llu | %llu | (parse only) | %.1f | %.1f | %.3f | - | - | - | - | %.0f |\n",
                            cs.kind.c_str(), format_name(cs.kind), (unsigned long long)n, (unsigned long long)m.ops,
                            m.bytes / 1e6 / std::max(m.parse_s, 1e-9), m.bytes / 1e6 / std::max(m.parse_cpu, 1e-9),
                            m.count_s, double(m.peak_kib) * 1024.0 / double(std::max<uint64_t>(m.ops, 1)));
                std::fflush(stdout);
                continue;
            }
            std::printf("| %s | %s | %llu | %llu | %llu | %.1f | %.1f | %.3f | %.2f | %.2f | %.2f-%.2f | %.1f | %.0f |\n",
                        cs.kind.c_str(), format_name(cs.kind), (unsigned long long)n, (unsigned long long)m.ops,
                        (unsigned long long)m.ops_out, m.bytes / 1e6 / std::max(m.parse_s, 1e-9),
                        m.bytes / 1e6 / std::max(m.parse_cpu, 1e-9), m.count_s, m.compile_s, m.compile_cpu, lo, hi,
                        (m.parse_cpu + m.compile_cpu) / std::max(count_cpu, 1e-9),
                        double(m.peak_kib) * 1024.0 / double(std::max<uint64_t>(m.ops, 1)));
            std::fflush(stdout);
            done.push_back(std::move(m));
        }
        all.emplace_back(cs.kind, std::move(done));
    }
    std::printf("\nPer pass at the largest size that ran: CPU seconds, ops entering the pass per CPU second, and "
                "scaling = CPU t(big)/t(small) between the two largest sizes (their ratio in brackets), and the "
                "run's peak RSS so far per input op, read after the pass\n\n");
    std::printf("| input | pass | CPU s | ops/s | scaling | peak bytes/op so far |\n|---|---|---|---|---|---|\n");
    for (auto& [kind, ms] : all) {
        if (ms.empty()) continue;
        const Measure& big = ms.back();
        const Measure* small = ms.size() >= 2 ? &ms[ms.size() - 2] : nullptr;
        for (size_t i = 0; i < big.passes.size(); ++i) {
            const PassTime& pt = big.passes[i];
            std::string sc = "-";
            if (small && i < small->passes.size())
                sc = scaling(small->passes[i].cpu_seconds, pt.cpu_seconds, small->ops, big.ops);
            std::printf("| %s | %s | %.3f | %.3g | %s | %.0f |\n", kind.c_str(), pt.name.c_str(), pt.cpu_seconds,
                        double(pt.ops_before) / std::max(pt.cpu_seconds, 1e-9), sc.c_str(),
                        double(pt.peak_kib) * 1024.0 / double(std::max<uint64_t>(big.ops, 1)));
        }
        std::string sc = small ? scaling(small->compile_cpu, big.compile_cpu, small->ops, big.ops) : "-";
        std::printf("| %s | (whole compile) | %.3f | %.3g | %s | %.0f |\n", kind.c_str(), big.compile_cpu,
                    double(big.ops) / std::max(big.compile_cpu, 1e-9), sc.c_str(),
                    double(big.peak_kib) * 1024.0 / double(std::max<uint64_t>(big.ops, 1)));
    }
    return 0;
}
