// rewrite-search: dependency-graph matching of library rules and an iterated local search over them.
#include "passes/rewrite_search.h"

#include <algorithm>
#include <chrono>
#include <map>
#include <mutex>
#include <optional>
#include <random>
#include <tuple>

#include "ir/resources.h"
#include "passes/commutation.h"
#include "rules/embedded.h"
#include "rules/match.h"

namespace whittle::passes {
namespace {

using rules::GateName;
using rules::OpGate;
using rules::Seq;

/// Ops looked at past a match's first op, and how far a sweep steps back after a rewrite.
constexpr size_t kWindow = 24;
constexpr size_t kStepBack = 8;

/// Lexicographic cost: the metric's count first, then two-qubit gates, then gates.
using Cost = std::tuple<int64_t, int64_t, int64_t>;

struct Move {
    const Seq* from;
    const Seq* to;
    Cost delta;  ///< cost(to) - cost(from), per component
};

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

/// Can `mover`, after `earlier`, move before it unchanged?
bool commutes(const ir::Op& earlier, const ir::Op& mover) {
    if (disjoint(earlier, mover)) return true;
    if (rewrites_mover(earlier)) return false;
    return commutes_unchanged(earlier, mover);
}

struct State {
    std::vector<ir::Op> ops;
    std::vector<std::optional<OpGate>> gates;
    Cost cost{};
};

struct Match {
    std::vector<size_t> idx;
    std::vector<ir::Op> replacement;
};

class Search {
public:
    Search(const Loaded& lib, ir::Metric metric, uint32_t effort)
        : lib_(lib), metric_(metric), rewrites_left_(int64_t(4000) * effort),
          deadline_(std::chrono::steady_clock::now() + std::chrono::milliseconds(500) * effort) {}

    State make_state(const std::vector<ir::Op>& ops) const {
        State s;
        s.ops = ops;
        for (const ir::Op& op : ops) {
            s.gates.push_back(rules::op_gate(op, lib_.lib.set));
            if (s.gates.back()) s.cost = add(s.cost, gate_cost(*s.gates.back()));
        }
        return s;
    }

    bool out_of_budget() const { return rewrites_left_ <= 0 || std::chrono::steady_clock::now() > deadline_; }

    /// Applies improving moves until none applies (or the budget ends).
    void descend(State& s) {
        for (size_t i = 0; i < s.ops.size();) {
            if (out_of_budget()) return;
            bool applied = false;
            if (s.gates[i]) {
                auto it = lib_.by_first.find(s.gates[i]->name);
                if (it != lib_.by_first.end())
                    for (size_t k : it->second) {
                        const Move& mv = lib_.moves[k];
                        if (!(mv.delta < Cost{})) continue;
                        if (std::optional<Match> m = try_match(s, i, mv)) {
                            apply(s, *m, mv);
                            applied = true;
                            break;
                        }
                    }
            }
            if (applied) i = i > kStepBack ? i - kStepBack : 0;
            else ++i;
        }
    }

    /// Applies up to `count` moves that do not lower the cost, at random places.
    void perturb(State& s, int count, std::mt19937_64& rng) {
        for (int done = 0, tries = 0; done < count && tries < 64 && !s.ops.empty(); ++tries) {
            const size_t i = size_t(rng() % s.ops.size());
            if (!s.gates[i]) continue;
            auto it = lib_.by_first.find(s.gates[i]->name);
            if (it == lib_.by_first.end() || it->second.empty()) continue;
            const size_t start = size_t(rng() % it->second.size());
            for (size_t j = 0; j < it->second.size(); ++j) {
                const Move& mv = lib_.moves[it->second[(start + j) % it->second.size()]];
                if (mv.delta < Cost{}) continue;
                if (std::optional<Match> m = try_match(s, i, mv)) {
                    apply(s, *m, mv);
                    ++done;
                    break;
                }
            }
        }
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

    std::optional<Match> try_match(const State& s, size_t i, const Move& mv) const {
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
                std::all_of(skipped.begin(), skipped.end(), [&](size_t j) { return commutes(s.ops[j], op); })) {
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
    const uint32_t rounds = 8 * opts.rewrite_effort;
    for (uint32_t round = 0; round < rounds && !search.out_of_budget(); ++round) {
        State s = best;
        search.perturb(s, 1 + int(rng() % 3), rng);
        search.descend(s);
        if (s.cost < best.cost) best = std::move(s);
    }
    ir::Circuit out = c.empty_copy();
    out.global_phase = c.global_phase;
    out.ops = std::move(best.ops);
    const Cost before = circuit_cost(c, opts.optimize_for), after = circuit_cost(out, opts.optimize_for);
    r.count("search-rewrites", search.rewrites());
    if (!(after < before) || std::get<0>(after) > std::get<0>(before)) return r;
    r.count("two-qubit-gates-removed", std::get<1>(before) - std::get<1>(after));
    r.count("gates-removed", std::get<2>(before) - std::get<2>(after));
    c.ops = std::move(out.ops);
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
