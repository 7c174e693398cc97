// rewrite-search: dependency-graph matching of library rules and an iterated local search over them.
#include "passes/rewrite_search.h"

#include <algorithm>
#include <array>
#include <chrono>
#include <cstdint>
#include <map>
#include <mutex>
#include <optional>
#include <random>
#include <tuple>

#include "ir/error.h"
#include "ir/resources.h"
#include "ir/statevector.h"
#include "passes/commutation.h"
#include "rules/embedded.h"
#include "rules/match.h"
#include "synthesis/euler.h"

namespace whittle::passes {
namespace {

using rules::GateName;
using rules::OpGate;
using rules::Seq;

/// Ops looked at past a match's first op, and how far a sweep steps back after a rewrite.
constexpr size_t kWindow = 24;
constexpr size_t kStepBack = 8;
/// Match attempts per unit of effort (a count, so that the search is deterministic).
constexpr int64_t kAttemptsPerEffort = 150000;

/// Lexicographic cost: the metric's count first, then two-qubit gates, then gates.
using Cost = std::tuple<int64_t, int64_t, int64_t>;

constexpr size_t kGateNames = size_t(GateName::XX) + 1;
using NameCounts = std::array<uint8_t, kGateNames>;

struct Move {
    const Seq* from;
    const Seq* to;
    Cost delta;         ///< cost(to) - cost(from), per component
    NameCounts needs{};  ///< gates of `from` by name (a window without them cannot match)
};

/// Gates by name among the ops a match anchored at `i` may use.
NameCounts window_counts(const std::vector<std::optional<OpGate>>& gates, size_t i) {
    NameCounts n{};
    for (size_t k = i; k < gates.size() && k - i <= kWindow; ++k)
        if (gates[k] && n[size_t(gates[k]->name)] < 255) ++n[size_t(gates[k]->name)];
    return n;
}

bool covers(const NameCounts& have, const NameCounts& need) {
    for (size_t k = 0; k < kGateNames; ++k)
        if (have[k] < need[k]) return false;
    return true;
}

struct Loaded {
    rules::Library lib;
    std::vector<Move> moves;
    std::map<GateName, std::vector<size_t>> by_first;  ///< moves by the first gate of their side
};

int64_t two_qubit(const Seq& s) {
    int64_t n = 0;
    for (const rules::Gate& g : s) n += rules::gate_info(g.name).arity == 2;
    return n;
}

int64_t t_like(const Seq& s) {
    int64_t n = 0;
    for (const rules::Gate& g : s) n += g.name == GateName::T || g.name == GateName::Tdg;
    return n;
}

Cost seq_cost(const Seq& s, ir::Metric m) {
    const int64_t first = m == ir::Metric::TCount ? t_like(s) : two_qubit(s);
    return {first, two_qubit(s), int64_t(s.size())};
}

Cost minus(const Cost& a, const Cost& b) {
    return {std::get<0>(a) - std::get<0>(b), std::get<1>(a) - std::get<1>(b), std::get<2>(a) - std::get<2>(b)};
}

const Loaded* library_for(ir::Target t, ir::Metric m) {
    static std::mutex mu;
    static std::map<std::pair<ir::Target, ir::Metric>, std::unique_ptr<Loaded>> cache;
    std::lock_guard<std::mutex> lock(mu);
    auto& slot = cache[{t, m}];
    if (slot) return slot.get();
    const std::string_view text = rules::embedded_library_text(t);
    if (text.empty()) return nullptr;
    auto loaded = std::make_unique<Loaded>();
    loaded->lib = rules::parse_library(text, "rules/library/" + rules::library_file_name(t));
    for (const rules::Rule& r : loaded->lib.rules) {
        const Cost l = seq_cost(r.lhs, m), rc = seq_cost(r.rhs, m);
        if (!r.lhs.empty()) loaded->moves.push_back({&r.lhs, &r.rhs, minus(rc, l)});
        if (!r.rhs.empty()) loaded->moves.push_back({&r.rhs, &r.lhs, minus(l, rc)});
    }
    for (Move& mv : loaded->moves)
        for (const rules::Gate& g : *mv.from) ++mv.needs[size_t(g.name)];
    for (size_t k = 0; k < loaded->moves.size(); ++k) loaded->by_first[loaded->moves[k].from->front().name].push_back(k);
    slot = std::move(loaded);
    return slot.get();
}

bool disjoint(const ir::Op& a, const ir::Op& b) {
    std::vector<uint32_t> wa, wb;
    a.wires(wa);
    b.wires(wb);
    for (uint32_t x : wa)
        if (std::find(wb.begin(), wb.end(), x) != wb.end()) return false;
    return true;
}


struct State {
    std::vector<ir::Op> ops;
    std::vector<std::optional<OpGate>> gates;
    Cost cost{};
    ir::Angle phase;  ///< global phase gathered by the rewrites (rules hold up to a phase)
};

ir::Angle synthesis_phase(std::complex<double> z) { return lowering::snap_angle(std::arg(z)); }

/// The unitary of `ops` on their own few wires (renumbered in order of first use).
Eigen::MatrixXcd local_unitary(const std::vector<const ir::Op*>& ops, std::vector<uint32_t>& wires) {
    ir::Circuit c;
    std::vector<ir::Op> local;
    auto index = [&](uint32_t w) {
        auto it = std::find(wires.begin(), wires.end(), w);
        if (it != wires.end()) return uint32_t(it - wires.begin());
        wires.push_back(w);
        return uint32_t(wires.size() - 1);
    };
    for (const ir::Op* op : ops) {
        ir::Op l = *op;
        if (l.target != ir::kNoWire) l.target = index(l.target);
        if (l.target2 != ir::kNoWire) l.target2 = index(l.target2);
        ir::LitVec lits;
        for (ir::Lit x : op->controls) lits.push_back(ir::Lit::make(index(x.wire()), x.positive()));
        l.controls = lits;
        local.push_back(std::move(l));
    }
    c.add_register("q", uint32_t(std::max<size_t>(wires.size(), 1)), ir::Role::Data);
    c.ops = std::move(local);
    return ir::circuit_unitary(c);
}

bool disjoint_gates(const OpGate& a, const OpGate& b) {
    const int na = rules::gate_info(a.name).arity, nb = rules::gate_info(b.name).arity;
    for (int i = 0; i < na; ++i)
        for (int k = 0; k < nb; ++k)
            if (a.w[i] == b.w[k]) return false;
    return true;
}

/// Can op `mover`, after op `earlier`, move before it unchanged?
bool commutes(const State& s, size_t earlier, size_t mover) {
    const ir::Op& e = s.ops[earlier];
    const ir::Op& m = s.ops[mover];
    if (s.gates[earlier] && s.gates[mover] ? disjoint_gates(*s.gates[earlier], *s.gates[mover]) : disjoint(e, m)) return true;
    if (rewrites_mover(e)) return false;
    return commutes_unchanged(e, m);
}

struct Match {
    std::vector<size_t> idx;
    std::vector<ir::Op> replacement;
};

class Search {
public:
    Search(const Loaded& lib, ir::Metric metric, uint32_t effort)
        : lib_(lib), metric_(metric), rewrites_left_(int64_t(4000) * effort),
          attempts_left_(int64_t(kAttemptsPerEffort) * effort),
          deadline_(std::chrono::steady_clock::now() + std::chrono::milliseconds(1000) * effort) {}

    State make_state(const std::vector<ir::Op>& ops) const {
        State s;
        s.ops = ops;
        for (const ir::Op& op : ops) {
            s.gates.push_back(rules::op_gate(op, lib_.lib.set));
            if (s.gates.back()) s.cost = add(s.cost, gate_cost(*s.gates.back()));
        }
        return s;
    }

    /// The rewrite and match-attempt budgets are counts (deterministic); the deadline is a safety
    /// cap that a normal run does not reach.
    bool out_of_budget() {
        if (rewrites_left_ <= 0 || attempts_left_ <= 0) return true;
        if (std::chrono::steady_clock::now() > deadline_) timed_out_ = true;
        return timed_out_;
    }
    bool timed_out() const { return timed_out_; }
    int64_t attempts() const { return attempts_done_; }

    /// Applies improving moves at anchors from `lo` until none applies up to `hi` (or the budget
    /// ends); a rewrite widens the range around itself.
    void descend(State& s, size_t lo = 0, size_t hi = SIZE_MAX) {
        for (size_t i = lo; i < s.ops.size() && i < hi;) {
            if (out_of_budget()) return;
            bool applied = false;
            if (s.gates[i]) {
                auto it = lib_.by_first.find(s.gates[i]->name);
                const NameCounts have = window_counts(s.gates, i);
                if (it != lib_.by_first.end())
                    for (size_t k : it->second) {
                        const Move& mv = lib_.moves[k];
                        if (!(mv.delta < Cost{}) || !covers(have, mv.needs)) continue;
                        if (std::optional<Match> m = try_match(s, i, mv)) {
                            const size_t span = m->idx.back() - i + 1;
                            apply(s, *m, mv);
                            if (hi != SIZE_MAX) hi = std::max(hi, i + span + kWindow);
                            applied = true;
                            break;
                        }
                    }
            }
            if (applied) i = i > kStepBack ? i - kStepBack : 0;
            else ++i;
        }
    }

    /// Applies up to `count` moves that do not lower the cost, at random places; returns the
    /// range of anchors they touched ([lo, hi), empty when none applied).
    std::pair<size_t, size_t> perturb(State& s, int count, std::mt19937_64& rng) {
        size_t lo = SIZE_MAX, hi = 0;
        for (int done = 0, tries = 0; done < count && tries < 16 && !s.ops.empty(); ++tries) {
            const size_t i = size_t(rng() % s.ops.size());
            if (!s.gates[i]) continue;
            auto it = lib_.by_first.find(s.gates[i]->name);
            if (it == lib_.by_first.end() || it->second.empty()) continue;
            const size_t start = size_t(rng() % it->second.size());
            const NameCounts have = window_counts(s.gates, i);
            for (size_t j = 0; j < it->second.size(); ++j) {
                const Move& mv = lib_.moves[it->second[(start + j) % it->second.size()]];
                if (mv.delta < Cost{} || !covers(have, mv.needs)) continue;
                if (std::optional<Match> m = try_match(s, i, mv)) {
                    const size_t span = m->idx.back() - i + 1;
                    apply(s, *m, mv);
                    lo = std::min(lo, i);
                    hi = std::max(hi, i + span + m->replacement.size());
                    ++done;
                    break;
                }
            }
        }
        return {lo, hi};
    }

    int64_t rewrites() const { return rewrites_done_; }

private:
    Cost gate_cost(const OpGate& g) const {
        const bool two = rules::gate_info(g.name).arity == 2;
        const bool t = g.name == GateName::T || g.name == GateName::Tdg;
        return {metric_ == ir::Metric::TCount ? int64_t(t) : int64_t(two), int64_t(two), 1};
    }
    static Cost add(const Cost& a, const Cost& b) {
        return {std::get<0>(a) + std::get<0>(b), std::get<1>(a) + std::get<1>(b), std::get<2>(a) + std::get<2>(b)};
    }

    std::optional<Match> try_match(const State& s, size_t i, const Move& mv) {
        --attempts_left_;
        ++attempts_done_;
        const Seq& side = *mv.from;
        std::vector<OpGate> gates = {*s.gates[i]};
        if (!rules::match_ops(side, {}, gates, true)) return std::nullopt;
        Match m;
        m.idx.push_back(i);
        std::vector<size_t> skipped;
        for (size_t k = i + 1; k < s.ops.size() && k - i <= kWindow && m.idx.size() < side.size(); ++k) {
            const ir::Op& op = s.ops[k];
            if (is_fence(op)) break;
            bool taken = false;
            if (s.gates[k] && s.gates[k]->name == side[m.idx.size()].name &&
                std::all_of(skipped.begin(), skipped.end(), [&](size_t j) { return commutes(s, j, k); })) {
                gates.push_back(*s.gates[k]);
                if (rules::match_ops(side, {}, gates, true)) {
                    m.idx.push_back(k);
                    taken = true;
                } else {
                    gates.pop_back();
                }
            }
            if (!taken) skipped.push_back(k);
        }
        if (m.idx.size() != side.size()) return std::nullopt;
        std::optional<std::vector<ir::Op>> repl = rules::match_ops(side, *mv.to, gates, false);
        if (!repl) return std::nullopt;
        m.replacement = std::move(*repl);
        return m;
    }

    void apply(State& s, Match& m, const Move& mv) {
        State next;
        next.cost = add(s.cost, mv.delta);
        const size_t first = m.idx.front(), last = m.idx.back();
        {
            // The phase between the matched ops (as gathered) and their replacement, kept exact
            // where it is a rational multiple of pi.
            std::vector<const ir::Op*> old_ops, new_ops;
            for (size_t j : m.idx) old_ops.push_back(&s.ops[j]);
            for (const ir::Op& op : m.replacement) new_ops.push_back(&op);
            std::vector<uint32_t> wires;
            const Eigen::MatrixXcd u_old = local_unitary(old_ops, wires);
            const Eigen::MatrixXcd u_new = local_unitary(new_ops, wires);
            WHITTLE_ASSERT(u_new.rows() == u_old.rows() && "a rule's sides share their wires");
            next.phase = s.phase + synthesis_phase((u_new.adjoint() * u_old).trace());
        }
        next.ops.reserve(s.ops.size() + m.replacement.size());
        for (size_t j = 0; j < first; ++j) {
            next.ops.push_back(std::move(s.ops[j]));
            next.gates.push_back(s.gates[j]);
        }
        for (ir::Op& op : m.replacement) {
            op.loc = s.ops[first].loc;
            next.gates.push_back(rules::op_gate(op, lib_.lib.set));
            next.ops.push_back(std::move(op));
        }
        size_t in_match = 0;
        for (size_t j = first; j < s.ops.size(); ++j) {
            if (j <= last && in_match < m.idx.size() && m.idx[in_match] == j) {
                ++in_match;
                continue;
            }
            next.ops.push_back(std::move(s.ops[j]));
            next.gates.push_back(s.gates[j]);
        }
        s = std::move(next);
        --rewrites_left_;
        ++rewrites_done_;
    }

    const Loaded& lib_;
    ir::Metric metric_;
    int64_t rewrites_left_;
    int64_t rewrites_done_ = 0;
    int64_t attempts_left_;
    int64_t attempts_done_ = 0;
    bool timed_out_ = false;
    std::chrono::steady_clock::time_point deadline_;
};

/// The metric's value and the tie-breakers, from the IR's own counts.
Cost circuit_cost(const ir::Circuit& c, ir::Metric m) {
    const ir::Resources r = ir::count_resources(c);
    const uint64_t first = m == ir::Metric::TCount ? r.t_count : m == ir::Metric::Depth ? r.depth : r.two_qubit_count;
    return {int64_t(first), int64_t(r.two_qubit_count), int64_t(c.ops.size())};
}

}  // namespace

PassResult rewrite_search(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (!opts.target || opts.rewrite_effort == 0 || c.ops.empty()) return r;
    const Loaded* lib = library_for(*opts.target, opts.optimize_for);
    if (!lib) return r;
    Search search(*lib, opts.optimize_for, opts.rewrite_effort);
    State best = search.make_state(c.ops);
    search.descend(best);
    std::mt19937_64 rng(0x77686974u);
    const uint32_t rounds = 32 * opts.rewrite_effort;
    for (uint32_t round = 0; round < rounds && !search.out_of_budget(); ++round) {
        State s = best;
        const auto [lo, hi] = search.perturb(s, 1 + int(rng() % 3), rng);
        if (lo >= hi) continue;
        // The rest of the circuit is at a local optimum already: descend around the change.
        search.descend(s, lo > kWindow ? lo - kWindow : 0, hi + kWindow);
        if (s.cost < best.cost) best = std::move(s);
    }
    ir::Circuit out = c.empty_copy();
    out.global_phase = c.global_phase + best.phase;
    out.ops = std::move(best.ops);
    const Cost before = circuit_cost(c, opts.optimize_for), after = circuit_cost(out, opts.optimize_for);
    r.count("search-rewrites", search.rewrites());
    r.count("match-attempts", search.attempts());
    if (search.timed_out()) r.notes.push_back("the search reached its time cap (1 s per unit of --rewrite-effort); the result may depend on the machine's speed");
    if (!(after < before) || std::get<0>(after) > std::get<0>(before)) return r;
    r.count("two-qubit-gates-removed", std::get<1>(before) - std::get<1>(after));
    r.count("gates-removed", std::get<2>(before) - std::get<2>(after));
    c.ops = std::move(out.ops);
    c.global_phase = out.global_phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
