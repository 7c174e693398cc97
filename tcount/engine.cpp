// The T-count engine's driver: growing Hadamard-free regions, reducing and resynthesizing each one.
#include "tcount/engine.h"

#include <algorithm>
#include <bit>
#include <optional>
#include <unordered_map>

#include "ir/error.h"
#include "ir/op_prefix_release.h"
#include "tcount/gf2.h"
#include "tcount/hadamard_frames.h"
#include "tcount/parity_network.h"
#include "tcount/phase_polynomial.h"
#include "tcount/tohpe.h"

namespace whittle::tcount {
namespace {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

enum WireState : uint8_t { NotYet = 0, Open = 1, Closed = 2 };

bool in_region(const Op& op) { return is_region_op(op) && op.pair == 0 && op.half == ir::PairHalf::None; }

/// T gates an op costs once lowered: phases and parities by odd multiples of pi/4.
int64_t t_cost(const Op& op) {
    const int e = op.angle.eighths();
    if (op.kind == OpKind::Parity || (op.kind == OpKind::Phase && op.controls.size() == 1)) return e >= 0 && e % 2 == 1;
    return 0;
}

/// CNOTs an op costs once lowered.
int64_t cnot_cost(const Op& op) {
    const int64_t k = int64_t(op.controls.size());
    switch (op.kind) {
    case OpKind::X: return k == 1;
    case OpKind::Swap: return 3;
    case OpKind::Parity: return 2 * (k - 1);
    case OpKind::Phase: return k == 2;  // CZ
    default: return 0;
    }
}

struct Rebuilt {
    std::vector<Op> ops;
    std::vector<uint32_t> replaces;  ///< the region's old ops
    Angle global_phase;
    int64_t t_old = 0, t_new = 0, cnot_old = 0, cnot_new = 0;
};

/// The even (Clifford) part of a region's phase, realized: S-class terms 2 (p . x) on parities
/// that are placed anyway, the remaining linear part on single variables, and CZ gates for the
/// pairs left over. With 2 (p . x) = 2 sum_{i in p} x_i - 4 sum_{i<j in p} x_i x_j (mod 8), an S on
/// p toggles every pair inside p; the pairs of the even part are a vector over GF(2) in the space
/// of pairs, reduced by the pair sets ("cliques") of the free parities.
struct EvenPlan {
    std::map<uint64_t, int> terms;                   ///< parity -> even coefficient (singles included)
    std::vector<std::pair<uint32_t, uint32_t>> cz;   ///< CZ gates on region variables
};

EvenPlan plan_even(const EvenQuadratic& e, uint32_t n, const std::vector<uint64_t>& free_parities) {
    EvenPlan plan;
    std::vector<int> lin = e.lin;
    auto pair_index = [n](uint32_t i, uint32_t j) { return size_t(i) * (2 * size_t(n) - i - 1) / 2 + (j - i - 1); };
    const size_t pairs = size_t(n) * (n - 1) / 2;
    if (!e.cz.empty() && pairs > 0) {
        uint64_t work = 0;
        TaggedEchelon cliques;
        std::vector<uint64_t> used;
        for (uint64_t p : free_parities) {
            if (std::popcount(p) < 2) continue;
            BitVec v(pairs);
            for (uint64_t a = p; a; a &= a - 1)
                for (uint64_t b = a & (a - 1); b; b &= b - 1)
                    v.set(pair_index(uint32_t(std::countr_zero(a)), uint32_t(std::countr_zero(b))));
            BitVec tag(free_parities.size());
            tag.set(used.size());
            used.push_back(p);
            cliques.insert(v, tag, work);
        }
        BitVec q(pairs), tag(free_parities.size());
        for (const auto& [i, j] : e.cz) q.set(pair_index(i, j));
        cliques.reduce(q, tag, work);
        for (size_t k = 0; k < used.size(); ++k)
            if (tag.get(k)) {
                plan.terms[used[k]] = 2;
                for (uint64_t a = used[k]; a; a &= a - 1) lin[std::countr_zero(a)] += 6;  // minus the 2 per variable of 2 (p . x)
            }
        for (uint32_t i = 0; i < n; ++i)
            for (uint32_t j = i + 1; j < n; ++j)
                if (q.get(pair_index(i, j))) plan.cz.emplace_back(i, j);
    }
    for (uint32_t i = 0; i < n; ++i)
        if (lin[i] % 8 != 0) plan.terms[uint64_t(1) << i] += lin[i] % 8;
    return plan;
}

/// Every phase to place: one T per column, the even plan's terms, the finer angles (a parity with
/// a Z8 part and a finer one gets two phases).
std::vector<PhaseToPlace> terms_of(const std::vector<uint64_t>& cols, const EvenPlan& even, const RegionPolynomial& poly) {
    std::map<uint64_t, int> g = even.terms;
    for (uint64_t p : cols) g[p] += 1;
    std::vector<PhaseToPlace> terms;
    for (const auto& [p, coef] : g)
        if (coef % 8 != 0) terms.push_back({p, Angle::pi_times(coef % 8, 4), false});
    for (const auto& [p, a] : poly.other) terms.push_back({p, a, false});
    std::stable_sort(terms.begin(), terms.end(), [](const auto& a, const auto& b) { return a.parity < b.parity; });
    return terms;
}

Op cz_gate(uint32_t a, uint32_t b) { return Op::phase(Angle::pi_times(1), {Lit::pos(std::min(a, b)), Lit::pos(std::max(a, b))}); }

/// Appends a synthesized network's gates on the region's wires; returns its CNOT count.
int64_t append_net(const std::vector<NetOp>& net, const std::vector<uint32_t>& var_wire, std::vector<Op>& out) {
    int64_t cnots = 0;
    for (const NetOp& n : net) {
        switch (n.kind) {
        case NetOp::Kind::Cnot:
            out.push_back(Op::x(var_wire[n.b], {Lit::pos(var_wire[n.a])}));
            ++cnots;
            break;
        case NetOp::Kind::Phase: out.push_back(Op::phase(n.angle, {Lit::make(var_wire[n.a], !n.complement)})); break;
        case NetOp::Kind::Not: out.push_back(Op::x(var_wire[n.a])); break;
        }
    }
    return cnots;
}

/// Removes pairs of equal CNOTs, NOTs and CZs with nothing between them on their wires (the
/// parity networks' compute and uncompute steps meet the skeleton's CNOTs); returns the CNOTs left
/// (a CZ counts as one).
int64_t cancel_adjacent(std::vector<Op>& ops, uint32_t wires) {
    auto self_inverse = [](const Op& op) {
        return (op.kind == OpKind::X && op.controls.size() <= 1) ||
               (op.kind == OpKind::Phase && op.controls.size() == 2 && op.angle.eighths() == 4);
    };
    auto same = [](const Op& a, const Op& b) {
        if (a.kind != b.kind || a.target != b.target || a.controls.size() != b.controls.size()) return false;
        for (size_t k = 0; k < a.controls.size(); ++k)
            if (a.controls[k] != b.controls[k]) return false;
        return true;
    };
    std::vector<std::vector<uint32_t>> last(wires);  // per region wire: the live ops on it, in order
    std::vector<uint8_t> dead(ops.size(), 0);
    std::vector<uint32_t> ws;
    (void)wires;
    std::unordered_map<uint32_t, uint32_t> slot;  // circuit wire -> index into `last`
    auto stack_of = [&](uint32_t w) -> std::vector<uint32_t>& {
        auto [it, fresh] = slot.emplace(w, uint32_t(slot.size()));
        if (it->second >= last.size()) last.resize(it->second + 1);
        return last[it->second];
    };
    for (uint32_t i = 0; i < ops.size(); ++i) {
        ws.clear();
        ops[i].wires(ws);
        if (self_inverse(ops[i])) {
            const std::vector<uint32_t>& first = stack_of(ws[0]);
            if (!first.empty()) {
                const uint32_t j = first.back();
                bool all = same(ops[j], ops[i]);
                for (uint32_t w : ws) all = all && !stack_of(w).empty() && stack_of(w).back() == j;
                if (all) {
                    dead[j] = dead[i] = 1;
                    for (uint32_t w : ws) stack_of(w).pop_back();
                    continue;
                }
            }
        }
        for (uint32_t w : ws) stack_of(w).push_back(i);
    }
    int64_t cnots = 0;
    size_t out = 0;
    for (size_t i = 0; i < ops.size(); ++i) {
        if (dead[i]) continue;
        cnots += cnot_cost(ops[i]);
        if (out != i) ops[out] = std::move(ops[i]);
        ++out;
    }
    ops.resize(out);
    return cnots;
}

/// (a): CZ gates, then one parity network for every term and the output map. Returns the CNOTs
/// (a CZ counts as one).
int64_t synthesize_full(const RegionPolynomial& poly, const std::vector<uint64_t>& cols, const EvenQuadratic& even,
                        const std::vector<uint32_t>& var_wire, std::vector<Op>& out) {
    const EvenPlan plan = plan_even(even, poly.width, cols);
    for (const auto& [i, j] : plan.cz) out.push_back(cz_gate(var_wire[i], var_wire[j]));
    const std::vector<NetOp> net =
        synthesize_parity_network(poly.width, terms_of(cols, plan, poly), poly.out_parity, poly.out_flip);
    return int64_t(plan.cz.size()) + append_net(net, var_wire, out);
}

/// (b): the region's X, CNOT and Swap ops kept. A term whose parity some wire holds at some point
/// is placed there (on a negative literal where the wire holds its complement); each other term
/// goes where the wires' values express its parity with the fewest of them, made there by a small
/// parity network that returns the wires to their values. Returns the CNOTs, or -1 when the region
/// has phases on several literals (their parities are not wire values).
int64_t synthesize_on_skeleton(const ir::Circuit& c, const std::vector<uint32_t>& region,
                               const std::vector<uint32_t>& var_of_wire, const RegionPolynomial& poly,
                               const std::vector<uint64_t>& cols, const EvenQuadratic& even,
                               const std::vector<uint32_t>& var_wire, std::vector<Op>& out) {
    struct Where {
        uint32_t pos, var;
        bool flip;
    };
    const uint32_t width = poly.width;
    std::vector<const Op*> skeleton;
    int64_t cnots = 0;
    for (uint32_t idx : region) {
        const Op& op = c.ops[idx];
        if (op.kind == OpKind::Phase && op.controls.size() > 1) return -1;
        if (op.kind != OpKind::X && op.kind != OpKind::Swap) continue;
        skeleton.push_back(&op);
        cnots += cnot_cost(op);
    }
    // The wires' values along the skeleton: mask . x ^ flip; linv = the inverse of the masks' matrix
    // (row i, bit w: x_i's coefficient on wire w), kept by column operations.
    std::vector<uint64_t> mask(width), linv(width);
    std::vector<uint8_t> flip(width, 0);
    auto reset = [&] {
        for (uint32_t i = 0; i < width; ++i) mask[i] = linv[i] = uint64_t(1) << i;
        std::fill(flip.begin(), flip.end(), 0);
    };
    auto step = [&](const Op& op) -> int {  // the wire whose value changed, or -1
        if (op.kind == OpKind::Swap) {
            const uint32_t a = var_of_wire[op.target], b = var_of_wire[op.target2];
            std::swap(mask[a], mask[b]);
            std::swap(flip[a], flip[b]);
            for (uint64_t& r : linv)
                if ((r >> a & 1) != (r >> b & 1)) r ^= (uint64_t(1) << a) | (uint64_t(1) << b);
            return -1;
        }
        const uint32_t t = var_of_wire[op.target];
        if (op.controls.empty()) {
            flip[t] ^= 1;
            return int(t);
        }
        const uint32_t k = var_of_wire[op.controls[0].wire()];
        mask[t] ^= mask[k];
        flip[t] ^= flip[k] ^ uint8_t(!op.controls[0].positive());
        // L' = E L with E = I + e_t e_k^T; L'^{-1} = L^{-1} E: column k ^= column t.
        for (uint64_t& r : linv)
            if (r >> t & 1) r ^= uint64_t(1) << k;
        return int(t);
    };
    std::unordered_map<uint64_t, Where> seen;
    reset();
    for (uint32_t i = 0; i < width; ++i) seen.emplace(mask[i], Where{0, i, false});
    for (uint32_t pos = 1; pos <= skeleton.size(); ++pos) {
        const int t = step(*skeleton[pos - 1]);
        if (t >= 0 && mask[t]) seen.try_emplace(mask[t], Where{pos, uint32_t(t), flip[t] != 0});
    }
    std::vector<uint64_t> free_parities = cols;
    for (const auto& [p, w] : seen) free_parities.push_back(p);
    std::sort(free_parities.begin(), free_parities.end());
    free_parities.erase(std::unique(free_parities.begin(), free_parities.end()), free_parities.end());
    const EvenPlan plan = plan_even(even, width, free_parities);
    std::vector<std::vector<std::pair<Where, Angle>>> direct(skeleton.size() + 1);
    std::vector<PhaseToPlace> extra;
    for (const PhaseToPlace& t : terms_of(cols, plan, poly)) {
        auto it = seen.find(t.parity);
        if (it == seen.end()) extra.push_back(t);
        else direct[it->second.pos].emplace_back(it->second, t.angle);
    }
    // Each other term where its parity takes the fewest wires: p . x = sum over w in W of the wire
    // values with W = p L^{-1}, minus the flips of those wires.
    std::vector<std::vector<PhaseToPlace>> made(skeleton.size() + 1);
    if (!extra.empty()) {
        std::vector<int> best(extra.size(), 65);
        std::vector<uint32_t> best_pos(extra.size(), 0);
        std::vector<PhaseToPlace> best_term(extra.size());
        reset();
        for (uint32_t pos = 0; pos <= skeleton.size(); ++pos) {
            if (pos > 0) step(*skeleton[pos - 1]);
            for (size_t k = 0; k < extra.size(); ++k) {
                uint64_t w = 0;
                for (uint64_t b = extra[k].parity; b; b &= b - 1) w ^= linv[std::countr_zero(b)];
                const int weight = std::popcount(w);
                if (weight >= best[size_t(k)]) continue;
                bool c_flip = false;
                for (uint64_t b = w; b; b &= b - 1) c_flip ^= flip[std::countr_zero(b)] != 0;
                best[k] = weight;
                best_pos[k] = pos;
                best_term[k] = {w, extra[k].angle, c_flip};
            }
        }
        for (size_t k = 0; k < extra.size(); ++k) made[best_pos[k]].push_back(best_term[k]);
    }
    for (const auto& [i, j] : plan.cz) out.push_back(cz_gate(var_wire[i], var_wire[j]));
    std::vector<uint64_t> identity(width);
    for (uint32_t i = 0; i < width; ++i) identity[i] = uint64_t(1) << i;
    const std::vector<uint8_t> no_flip(width, 0);
    for (size_t pos = 0; pos <= skeleton.size(); ++pos) {
        if (pos > 0) out.push_back(*skeleton[pos - 1]);
        for (const auto& [w, a] : direct[pos]) out.push_back(Op::phase(a, {Lit::make(var_wire[w.var], !w.flip)}));
        if (!made[pos].empty()) cnots += append_net(synthesize_parity_network(width, made[pos], identity, no_flip), var_wire, out);
    }
    return int64_t(plan.cz.size()) + cnots;
}

/// The region's new circuit when it is better than the old one.
std::optional<Rebuilt> rebuild_region(const ir::Circuit& c, const std::vector<uint32_t>& region,
                                      const std::vector<uint32_t>& var_wire, const std::vector<uint32_t>& var_of_wire,
                                      const EngineSettings& settings, EngineStats& stats, uint64_t& work_left,
                                      uint64_t& tohpe_left) {
    const uint32_t width = uint32_t(var_wire.size());
    auto var = [&](uint32_t w) { return var_of_wire[w]; };
    RegionBuilder builder(width);
    Rebuilt r;
    for (uint32_t idx : region) {
        builder.add(c.ops[idx], var);
        r.t_old += t_cost(c.ops[idx]);
        r.cnot_old += cnot_cost(c.ops[idx]);
    }
    const RegionPolynomial poly = builder.finish();
    const std::vector<Z8Term> f = poly.z8_terms();
    const std::vector<uint64_t> odd = poly.odd_parities();

    // The odd part, reduced where the region is small enough.
    std::vector<uint64_t> cols = odd;
    if (odd.size() >= 2) {
        if (width > settings.max_todd_width || odd.size() > settings.max_todd_columns) {
            ++stats.skipped_large;
        } else if (work_left > 0) {
            ToddSettings ts = settings.todd;
            ts.work_budget = std::min(ts.work_budget, work_left);
            ToddResult tr = todd_reduce(odd, width, ts);
            work_left -= std::min(work_left, tr.work);
            ++stats.todd_runs;
            stats.todd_work += tr.work;
            if (tr.budget_exhausted) ++stats.todd_out_of_budget;
            stats.todd_steps += size_t(tr.steps);
            cols = std::move(tr.columns);
            // TOHPE (tohpe.h) from the same start with the same cap; the shorter list is kept, so
            // the region never gets more T than TODD alone gives it.
            if (settings.run_tohpe && tohpe_left > 0) {
                TohpeSettings hs = settings.tohpe;
                hs.work_budget = std::min(settings.todd.work_budget, tohpe_left);
                ToddResult hr = tohpe_reduce(odd, width, hs);
                tohpe_left -= std::min(tohpe_left, hr.work);
                ++stats.tohpe_runs;
                stats.tohpe_work += hr.work;
                if (hr.columns.size() < cols.size()) {
                    ++stats.tohpe_wins;
                    cols = std::move(hr.columns);
                }
            }
        }
    }
    // Each column is one T gate. When that is all the region has already, only fewer CNOTs could
    // be gained: worth a resynthesis on small regions only.
    if (int64_t(cols.size()) >= r.t_old &&
        (width > settings.max_cnot_only_width || poly.z8.size() + poly.other.size() > settings.max_cnot_only_terms))
        return std::nullopt;
    // The phase is f = (one T per column) + an even part, which is f minus the columns, computed
    // exactly as a quadratic form (even_difference); it is never assumed to vanish.
    auto as_terms = [](const std::vector<uint64_t>& cs) {
        std::vector<Z8Term> t;
        for (uint64_t p : cs) t.push_back({p, 1});
        return t;
    };
    std::optional<EvenQuadratic> even = even_difference(width, f, as_terms(cols));
    if (!even) {
        // The reduction changed the signature tensor, which it must not: keep the old columns.
        WHITTLE_ASSERT(cols != odd && "a phase polynomial differs from its odd part by a non-Clifford function");
        cols = odd;
        even = even_difference(width, f, as_terms(cols));
        WHITTLE_ASSERT(even && "a phase polynomial differs from its odd part by a non-Clifford function");
    }

    // Two ways to build the region; the one with fewer CNOTs is kept (both place one T per column).
    std::vector<Op> full, kept;
    int64_t kept_cnots = synthesize_on_skeleton(c, region, var_of_wire, poly, cols, *even, var_wire, kept);
    if (kept_cnots >= 0) kept_cnots = cancel_adjacent(kept, width);
    const bool try_full = kept_cnots < 0 || (width <= settings.max_full_width &&
                                             poly.z8.size() + poly.other.size() <= settings.max_full_terms);
    int64_t full_cnots = try_full ? synthesize_full(poly, cols, *even, var_wire, full) : -1;
    if (full_cnots >= 0) full_cnots = cancel_adjacent(full, width);
    if (kept_cnots < 0 && full_cnots < 0) return std::nullopt;
    const bool use_kept = kept_cnots >= 0 && (full_cnots < 0 || kept_cnots < full_cnots);
    r.ops = std::move(use_kept ? kept : full);
    r.cnot_new = use_kept ? kept_cnots : full_cnots;
    const ir::SourceLoc loc = c.ops[region.front()].loc;
    for (Op& op : r.ops) {
        op.loc = loc;
        r.t_new += t_cost(op);
    }
    const bool better = (r.t_new < r.t_old && (settings.cnots_may_grow || r.cnot_new <= r.cnot_old)) ||
                        (r.t_new == r.t_old && r.cnot_new < r.cnot_old);
    if (!better) return std::nullopt;

    // The new circuit against the region's polynomial: same output map, same finer terms, the same
    // phase function mod 8 (exact, see same_z8_function) and the same constant.
    RegionBuilder check(width);
    for (const Op& op : r.ops) check.add(op, var);
    const RegionPolynomial got = check.finish();
    const bool same = got.out_parity == poly.out_parity && got.out_flip == poly.out_flip && got.other == poly.other &&
                      got.global_phase.is_zero() && same_z8_function(width, f, got.z8_terms());
    WHITTLE_ASSERT(same && "reduce-t: a resynthesized region differs from the region it replaces");
    r.global_phase = poly.global_phase;
    return r;
}

/// The ops not yet placed, in order: first `front` from `fpos`, then c.ops from `tail`.
struct Pending {
    std::vector<uint32_t> front;
    size_t fpos = 0;
    size_t tail = 0;
    size_t total = 0;
    bool done() const { return fpos >= front.size() && tail >= total; }
    uint32_t peek() const { return fpos < front.size() ? front[fpos] : uint32_t(tail); }
    void advance() {
        if (fpos < front.size()) ++fpos;
        else ++tail;
    }
};

}  // namespace

bool reduce_t_count(ir::Circuit& c, const EngineSettings& settings, EngineStats& stats) {
    bool changed = false;
    if (settings.exchange_frames) {
        const size_t h = exchange_hadamard_frames(c);
        stats.hadamards_removed += h;
        changed = h > 0;
    }
    const uint32_t nq = c.num_qubits();
    WHITTLE_ASSERT(c.ops.size() < (size_t(1) << 31) && "reduce-t: op indices fit in 31 bits");
    constexpr uint32_t kRegionMark = 0x80000000u;
    std::vector<uint32_t> plan;  // op index, or kRegionMark | index into `rebuilt`
    plan.reserve(c.ops.size());
    std::vector<Rebuilt> rebuilt;
    // Wire nq stands for the classical bits: measurements write them and conditioned ops read them,
    // so those keep their order among themselves like ops on one wire.
    std::vector<uint8_t> state(nq + 1, NotYet);
    std::vector<uint32_t> var_of_wire(nq + 1, 0);
    auto wires_of = [&](const Op& op, std::vector<uint32_t>& out) {
        out.clear();
        op.wires(out);
        if (op.kind == OpKind::Measure || op.is_conditioned()) out.push_back(nq);
    };
    std::vector<uint32_t> var_wire, region, after, wires, touched;
    enum Role : uint8_t { Joined, Before, After, Hoisted };
    struct Scanned {
        uint32_t idx;
        Role role;
    };
    std::vector<Scanned> scan;          // the ops read while growing a region, in order
    std::vector<uint32_t> needed(nq + 1, 0);  // wire -> epoch at which it was marked
    uint32_t epoch = 0;
    uint64_t work_left = settings.total_work_budget;
    uint64_t tohpe_left = settings.total_work_budget;  // its own, so TODD's regions keep theirs
    Pending pend;
    pend.total = c.ops.size();
    while (!pend.done()) {
        // Ops before the next region op stay where they are.
        while (!pend.done() && !in_region(c.ops[pend.peek()])) {
            plan.push_back(pend.peek());
            pend.advance();
        }
        if (pend.done()) break;
        // Grow a region from here: an op joins when it is a region op on wires the region has not
        // closed; an op on wires the region never touched goes before it; any other op goes after
        // it and closes its wires (what follows on them depends on an op outside the region).
        region.clear();
        var_wire.clear();
        touched.clear();
        scan.clear();
        scan.reserve(settings.scan_window);
        size_t open = 0;
        while (!pend.done() && scan.size() < settings.scan_window) {
            const uint32_t idx = pend.peek();
            pend.advance();
            const Op& op = c.ops[idx];
            wires_of(op, wires);
            bool any_closed = false, all_new = true;
            uint32_t fresh = 0;
            for (uint32_t w : wires) {
                any_closed |= state[w] == Closed;
                all_new &= state[w] == NotYet;
                fresh += state[w] == NotYet;
            }
            if (in_region(op) && !any_closed && var_wire.size() + fresh <= settings.max_width &&
                region.size() < settings.max_region_ops) {
                for (uint32_t w : wires)
                    if (state[w] == NotYet) {
                        state[w] = Open;
                        ++open;
                        var_of_wire[w] = uint32_t(var_wire.size());
                        var_wire.push_back(w);
                        touched.push_back(w);
                    }
                region.push_back(idx);
                scan.push_back({idx, Joined});
                continue;
            }
            if (all_new) {
                scan.push_back({idx, Before});
                continue;
            }
            for (uint32_t w : wires) {
                if (state[w] == Open) --open;
                if (state[w] == NotYet) touched.push_back(w);
                state[w] = Closed;
            }
            scan.push_back({idx, After});
            if (open == 0) break;
        }
        stats.ops_read += scan.size();
        for (uint32_t w : touched) state[w] = NotYet;
        std::optional<Rebuilt> nr;
        if (region.size() >= 2) {
            ++stats.regions;
            nr = rebuild_region(c, region, var_wire, var_of_wire, settings, stats, work_left, tohpe_left);
        }
        after.clear();
        if (nr) {
            ++stats.regions_rewritten;
            stats.t_saved += nr->t_old - nr->t_new;
            stats.cnot_saved += nr->cnot_old - nr->cnot_new;
            // Only the ops read before the region that share a wire with it (or with such an op
            // after them) must precede it; the others keep their places among the ops after it.
            ++epoch;
            for (size_t k = scan.size(); k-- > 0;) {
                if (scan[k].role == After) continue;
                wires_of(c.ops[scan[k].idx], wires);
                bool need = scan[k].role == Joined;
                for (uint32_t w : wires) need |= needed[w] == epoch;
                if (!need) continue;
                if (scan[k].role == Before) scan[k].role = Hoisted;
                for (uint32_t w : wires) needed[w] = epoch;
            }
            for (const Scanned& e : scan)
                if (e.role == Hoisted) plan.push_back(e.idx);
            plan.push_back(kRegionMark | uint32_t(rebuilt.size()));
            nr->replaces = region;
            rebuilt.push_back(std::move(*nr));
            for (const Scanned& e : scan)
                if (e.role == Before || e.role == After) after.push_back(e.idx);
        } else {
            // The region stays: its ops and those before it in their order, the others after.
            for (const Scanned& e : scan) {
                if (e.role == After) after.push_back(e.idx);
                else plan.push_back(e.idx);
            }
        }
        // What was read but not placed comes next, then what was not read.
        after.insert(after.end(), pend.front.begin() + std::ptrdiff_t(pend.fpos), pend.front.end());
        pend.front.swap(after);
        pend.fpos = 0;
    }
    if (rebuilt.empty()) return changed;
    // The new list. The plan follows the old order but for moves within a scan window, so the old
    // list's pages go back to the kernel behind the lowest op not yet placed (op_prefix_release.h).
    std::vector<Op> out;
    out.reserve(plan.size() + c.ops.size() / 64);
    ir::OpPrefixReleaser releaser(c.ops);
    std::vector<uint8_t> placed(c.ops.size(), 0);
    size_t low = 0;
    for (uint32_t p : plan) {
        if (!(p & kRegionMark)) {
            out.push_back(std::move(c.ops[p]));
            placed[p] = 1;
        } else {
            Rebuilt& r = rebuilt[p & ~kRegionMark];
            c.global_phase += r.global_phase;
            for (Op& op : r.ops) out.push_back(std::move(op));
            for (uint32_t idx : r.replaces) {
                c.ops[idx] = Op();
                placed[idx] = 1;
            }
            r = Rebuilt();
        }
        while (low < placed.size() && placed[low]) ++low;
        releaser.consumed(low);
    }
    c.ops = std::move(out);
    return true;
}

}  // namespace whittle::tcount
