// Time per angle and T-counts of Ross-Selinger Rz(theta) synthesis at epsilon 1e-3 .. 1e-15.
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <random>

#include "synthesis/rotation_synthesis.h"

namespace {

constexpr int kAngles = 100;

// One iteration synthesizes the same 100 pseudo-random angles (uncached) at epsilon = 10^-exponent.
void BM_rz_synthesis(benchmark::State& state) {
    const double eps = std::pow(10.0, -static_cast<double>(state.range(0)));
    std::mt19937_64 rng(2024);
    std::uniform_real_distribution<double> angle(0, 2 * std::numbers::pi);
    std::vector<double> thetas(kAngles);
    for (double& t : thetas) t = angle(rng);
    double sum_t = 0, max_t = 0, max_err = 0;
    for (auto _ : state) {
        sum_t = max_t = max_err = 0;
        for (double theta : thetas) {
            auto r = whittle::lowering::synthesize_rz(theta, eps);
            benchmark::DoNotOptimize(r.gates.data());
            sum_t += r.t_count;
            max_t = std::max(max_t, double(r.t_count));
            max_err = std::max(max_err, r.error_bound);
        }
    }
    state.counters["angles"] = kAngles;
    state.counters["mean_T"] = sum_t / kAngles;
    state.counters["max_T"] = max_t;
    state.counters["3log2(1/eps)"] = 3 * std::log2(1 / eps);
    state.counters["max_err/eps"] = max_err / eps;
    state.counters["time_per_angle"] =
        benchmark::Counter(double(kAngles) * state.iterations(), benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}

}  // namespace

BENCHMARK(BM_rz_synthesis)->DenseRange(3, 15, 1)->Unit(benchmark::kMillisecond)->Iterations(1);

BENCHMARK_MAIN();
