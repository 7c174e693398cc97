// Engine 4: state-vector simulation: the full unitary, random input states, or every measurement branch.
#include <cmath>
#include <functional>
#include <random>

#include <fmt/format.h>

#include "ir/statevector.h"
#include "verify/equiv_engines.h"

namespace whittle::passes::equiv {
namespace {

constexpr double kBaseTolerance = 1e-7;

/// The numerical tolerance: the base one plus room for the declared approximation.
double tolerance_for(const EquivOptions& opts) { return kBaseTolerance + 4 * opts.approximation_bound; }
constexpr uint32_t kEnumerateWires = 20;
constexpr int kEnumerateMeasurements = 10;
constexpr int kSampledBranches = 64;
constexpr uint32_t kDensityWires = 10;  // density matrices of 2^10 x 2^10

using Vec = Eigen::VectorXcd;

bool nonunitary(const ir::Circuit& c) {
    for (const ir::Op& op : c.ops)
        if (op.kind == ir::OpKind::Measure || op.kind == ir::OpKind::Reset || op.is_conditioned()) return true;
    return false;
}

int count_measurements(const ir::Circuit& c) {
    int k = 0;
    for (const ir::Op& op : c.ops) k += op.kind == ir::OpKind::Measure || op.kind == ir::OpKind::Reset;
    return k;
}

uint64_t spread(const Aligned& al, uint64_t j) {
    uint64_t idx = 0;
    for (size_t i = 0; i < al.free.size(); ++i)
        if ((j >> i) & 1) idx |= uint64_t(1) << al.free[i];
    return idx;
}

std::vector<uint8_t> index_bits(const Aligned& al, uint64_t idx) {
    std::vector<uint8_t> bits(al.num_wires());
    for (uint32_t w = 0; w < al.num_wires(); ++w) bits[w] = (idx >> w) & 1;
    return bits;
}

/// The basis state an output vector is (when it is one, up to rounding), for messages.
std::string describe_state(const Aligned& al, const Vec& v) {
    Eigen::Index best = 0;
    v.cwiseAbs2().maxCoeff(&best);
    if (std::norm(v(best)) > 1 - 1e-9) return format_basis(al, index_bits(al, uint64_t(best)));
    return fmt::format("a superposition (largest amplitude at {})", format_basis(al, index_bits(al, uint64_t(best))));
}

ir::Complex phase_between(const Vec& a, const Vec& b) {
    const ir::Complex inner = b.dot(a);  // <b|a>
    return std::abs(inner) > 1e-300 ? inner / std::abs(inner) : ir::Complex(1, 0);
}

std::mt19937_64 rng_for(const EquivOptions& opts) { return std::mt19937_64(opts.seed); }

EquivResult full_unitary(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    const double kTolerance = tolerance_for(opts);
    const uint32_t n = al.num_wires(), k = uint32_t(al.free.size());
    const uint64_t cols = uint64_t(1) << k;
    std::vector<Vec> ca, cb;
    ir::Complex inner = 0;
    for (uint64_t j = 0; j < cols; ++j) {
        if (dl.expired()) return inconclusive(name::kUnitary, "time budget exhausted");
        ir::StateVector sa(n);
        sa.amplitudes().setZero();
        sa.amplitudes()(Eigen::Index(spread(al, j))) = 1;
        ir::StateVector sb = sa;
        sa.run(al.a);
        sb.run(al.b);
        inner += sb.amplitudes().dot(sa.amplitudes());
        ca.push_back(sa.amplitudes());
        cb.push_back(sb.amplitudes());
    }
    const ir::Complex phase = std::abs(inner) > 1e-300 ? inner / std::abs(inner) : ir::Complex(1, 0);
    double worst = 0;
    uint64_t worst_j = 0;
    for (uint64_t j = 0; j < cols; ++j) {
        const double d = (ca[j] - phase * cb[j]).norm();
        if (d > worst) worst = d, worst_j = j;
    }
    if (worst < kTolerance)
        return equivalent(name::kUnitary,
                          fmt::format("numerical (all 2^{} basis inputs of the full unitary agree within {:g})", k, kTolerance));
    return not_equivalent(name::kUnitary, fmt::format("numerical (difference {:.3g}, tolerance {:g})", worst, kTolerance),
                          fmt::format("input {}: first circuit gives {}, second gives {}",
                                      format_basis(al, index_bits(al, spread(al, worst_j))),
                                      describe_state(al, ca[worst_j]), describe_state(al, cb[worst_j])));
}

/// A random normalized state with every clean wire at |0>.
Vec random_input(const Aligned& al, std::mt19937_64& rng) {
    ir::StateVector s(al.num_wires());
    s.randomize(rng);
    Vec v = s.amplitudes();
    uint64_t clean_mask = 0;
    for (uint32_t w = 0; w < al.num_wires(); ++w)
        if (al.clean[w]) clean_mask |= uint64_t(1) << w;
    for (Eigen::Index i = 0; i < v.size(); ++i)
        if (uint64_t(i) & clean_mask) v(i) = 0;
    v.normalize();
    return v;
}

EquivResult random_states(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    const double kTolerance = tolerance_for(opts);
    std::mt19937_64 rng = rng_for(opts);
    ir::Complex first_phase = 0;
    for (int s = 0; s < opts.random_states; ++s) {
        if (dl.expired()) return inconclusive(name::kRandomStates, fmt::format("time budget exhausted after {} states", s));
        ir::StateVector sa(al.num_wires());
        sa.amplitudes() = random_input(al, rng);
        ir::StateVector sb = sa;
        sa.run(al.a);
        sb.run(al.b);
        const ir::Complex phase = phase_between(sa.amplitudes(), sb.amplitudes());
        const double d = (sa.amplitudes() - phase * sb.amplitudes()).norm();
        if (s == 0) first_phase = phase;
        if (d > kTolerance || std::abs(phase - first_phase) > kTolerance)
            return not_equivalent(name::kRandomStates,
                                  fmt::format("numerical (random input state {} differs by {:.3g})", s + 1, d),
                                  "a random input superposition (no single basis input isolated)");
    }
    const std::string conf = fmt::format("probabilistic ({} random input states agree within {:g})",
                                         opts.random_states, kTolerance);
    if (!opts.allow_probabilistic) return inconclusive(name::kRandomStates, conf + "; probabilistic answers not allowed");
    return equivalent(name::kRandomStates, conf);
}

/// Clean wires whose last op in `c` is a measurement or reset: they hold a known basis value and
/// count as reset at the end.
uint64_t discarded_wires(const Aligned& al, const ir::Circuit& c) {
    std::vector<int> last(al.num_wires(), -1);
    for (size_t i = 0; i < c.ops.size(); ++i)
        for (uint32_t w : c.ops[i].wires()) last[w] = int(i);
    uint64_t mask = 0;
    for (uint32_t w = 0; w < al.num_wires(); ++w) {
        if (!al.clean[w] || last[w] < 0) continue;
        const ir::OpKind k = c.ops[size_t(last[w])].kind;
        if (k == ir::OpKind::Measure || k == ir::OpKind::Reset) mask |= uint64_t(1) << w;
    }
    return mask;
}

using BranchFn = std::function<bool(const Vec&, const std::string&, double)>;

/// Runs `c` from `s` and calls `done` on every branch with non-zero probability (all of them, or
/// `sampled` random ones). Returns false when `done` asked to stop.
bool run_branches(const ir::Circuit& c, size_t from, ir::StateVector s, std::vector<uint8_t> cbits,
                  const std::string& path, double prob, uint64_t discard, std::mt19937_64& rng, bool enumerate,
                  const Deadline& dl, const BranchFn& done) {
    if (dl.expired()) return false;
    std::string trail = path;
    for (size_t i = from; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        if (!ir::condition_holds(op, c, cbits)) continue;
        if ((i & 15) == 0 && dl.expired()) return false;  // an op on 2^20 amplitudes takes milliseconds
        if (!enumerate || (op.kind != ir::OpKind::Measure && op.kind != ir::OpKind::Reset)) {
            s.apply(op, c, cbits, rng);
            if (op.kind == ir::OpKind::Measure)
                trail += fmt::format("{}measure {} = {}", trail.empty() ? "" : ", ", c.wire_name(op.target),
                                     cbits[size_t(op.cbit())]);
            continue;
        }
        const uint64_t bt = uint64_t(1) << op.target;
        for (int outcome = 0; outcome < 2; ++outcome) {
            ir::StateVector t = s;
            Vec& v = t.amplitudes();
            for (Eigen::Index j = 0; j < v.size(); ++j)
                if (((uint64_t(j) & bt) != 0) != (outcome == 1)) v(j) = 0;
            const double p = v.squaredNorm();
            if (p < 1e-12) continue;
            v /= std::sqrt(p);
            std::vector<uint8_t> bits = cbits;
            std::string step;
            if (op.kind == ir::OpKind::Measure) {
                bits[size_t(op.cbit())] = uint8_t(outcome);
                step = fmt::format("measure {} = {}", c.wire_name(op.target), outcome);
            } else {
                if (outcome)
                    for (Eigen::Index j = 0; j < v.size(); ++j)
                        if (uint64_t(j) & bt) std::swap(v(j), v(Eigen::Index(uint64_t(j) ^ bt)));
                step = fmt::format("reset {} (was {})", c.wire_name(op.target), outcome);
            }
            if (!run_branches(c, i + 1, std::move(t), std::move(bits), trail + (trail.empty() ? "" : ", ") + step,
                              prob * p, discard, rng, enumerate, dl, done))
                return false;
        }
        return true;
    }
    if (!c.global_phase.is_zero()) s.amplitudes() *= std::polar(1.0, c.global_phase.to_radians());
    Vec& v = s.amplitudes();
    for (uint32_t w = 0; w < 64 && (discard >> w); ++w) {
        if (!((discard >> w) & 1)) continue;
        const uint64_t bw = uint64_t(1) << w;
        for (Eigen::Index j = 0; j < v.size(); ++j)
            if (uint64_t(j) & bw) {
                v(Eigen::Index(uint64_t(j) ^ bw)) += v(j);
                v(j) = 0;
            }
    }
    return done(v, trail, prob);
}

/// Every branch of `c` from `input` (all of them when `enumerate`, else kSampledBranches random ones).
/// Stops (false) when `fn` asks to or the deadline passes: a sampled run of a thousand ops at 20
/// wires takes seconds, so the deadline is read along each run, not only per input state.
bool for_each_branch(const Aligned& al, const ir::Circuit& c, const Vec& input, bool enumerate, std::mt19937_64& rng,
                     const Deadline& dl, const BranchFn& fn) {
    const uint64_t discard = discarded_wires(al, c);
    const int runs = enumerate || !nonunitary(c) ? 1 : kSampledBranches;
    for (int r = 0; r < runs; ++r) {
        ir::StateVector start(al.num_wires());
        start.amplitudes() = input;
        if (!run_branches(c, 0, std::move(start), std::vector<uint8_t>(c.num_cbits, 0), "", 1.0 / runs, discard, rng,
                          enumerate, dl, fn))
            return false;
    }
    return true;
}

EquivResult branches(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    const double kTolerance = tolerance_for(opts);
    const bool enumerate = al.num_wires() <= kEnumerateWires && count_measurements(al.a) <= kEnumerateMeasurements &&
                           count_measurements(al.b) <= kEnumerateMeasurements;
    std::mt19937_64 rng = rng_for(opts);
    size_t total = 0;
    bool used_density = false;
    for (int s = 0; s < opts.random_states; ++s) {
        if (dl.expired()) return inconclusive(name::kBranches, "time budget exhausted");
        const Vec input = random_input(al, rng);
        // Deterministic reference: every branch of the first circuit gives one state (up to phase).
        Vec ref;
        bool have_ref = false, deterministic = true;
        for_each_branch(al, al.a, input, enumerate, rng, dl, [&](const Vec& out, const std::string&, double) {
            ++total;
            if (!have_ref) {
                ref = out;
                have_ref = true;
                return true;
            }
            deterministic = (out - phase_between(out, ref) * ref).norm() <= kTolerance;
            return deterministic;
        });
        if (dl.expired()) return inconclusive(name::kBranches, "time budget exhausted");
        if (deterministic) {
            std::string failure;
            for_each_branch(al, al.b, input, enumerate, rng, dl, [&](const Vec& out, const std::string& path, double) {
                ++total;
                const double d = (out - phase_between(out, ref) * ref).norm();
                if (d <= kTolerance) return true;
                failure = fmt::format("random input state {}: the second circuit's branch [{}] gives another state "
                                      "than the first circuit (distance {:.3g})",
                                      s + 1, path.empty() ? "no measurement" : path, d);
                return false;
            });
            if (!failure.empty())
                return not_equivalent(name::kBranches, "numerical (a measurement branch gives another state)", failure);
            if (dl.expired()) return inconclusive(name::kBranches, "time budget exhausted");
            continue;
        }
        // The first circuit's outcome decides its output state: compare the output mixtures instead.
        if (!enumerate || al.num_wires() > kDensityWires)
            return inconclusive(name::kBranches, "the first circuit's measurement outcomes lead to different states, "
                                                 "and the circuits are too wide to compare output mixtures");
        used_density = true;
        Eigen::MatrixXcd rho[2];
        for (int side = 0; side < 2; ++side) {
            rho[side] = Eigen::MatrixXcd::Zero(input.size(), input.size());
            for_each_branch(al, side == 0 ? al.a : al.b, input, true, rng, dl, [&](const Vec& out, const std::string&, double p) {
                ++total;
                rho[side] += p * out * out.adjoint();
                return true;
            });
        }
        if (dl.expired()) return inconclusive(name::kBranches, "time budget exhausted");
        const double d = (rho[0] - rho[1]).norm();
        if (d > kTolerance)
            return not_equivalent(name::kBranches, "numerical (the output mixtures differ)",
                                  fmt::format("random input state {}: the output density matrices differ by {:.3g}", s + 1, d));
    }
    const std::string conf = fmt::format("probabilistic ({} random input states; {} {} branches agree within {:g}{})",
                                         opts.random_states, total, enumerate ? "enumerated" : "sampled", kTolerance,
                                         used_density ? ", as output mixtures where outcomes matter" : "");
    if (!opts.allow_probabilistic) return inconclusive(name::kBranches, conf + "; probabilistic answers not allowed");
    return equivalent(name::kBranches, conf);
}

}  // namespace

EngineResult check_simulate(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    if (al.num_wires() > std::min<uint32_t>(kSimulateWires, opts.max_simulated_wires)) return std::nullopt;
    if (nonunitary(al.a) || nonunitary(al.b)) return branches(al, opts, dl);
    if (al.num_wires() <= kUnitaryWires) return full_unitary(al, opts, dl);
    return random_states(al, opts, dl);
}

}  // namespace whittle::passes::equiv
