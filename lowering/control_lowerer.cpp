// ControlLowerer: work-wire bookkeeping and the per-op choice among the MCX constructions.
#include "lowering/control_lowerer.h"

#include <algorithm>

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/resources.h"
#include "lowering/ancilla_plan.h"
#include "lowering/mcx_constructions.h"
#include "lowering/toffoli_forms.h"

namespace whittle::lowering {

std::vector<uint32_t> wires_of(const ir::LitVec& lits, std::initializer_list<uint32_t> extra) {
    std::vector<uint32_t> w;
    for (ir::Lit l : lits) w.push_back(l.wire());
    for (uint32_t e : extra) w.push_back(e);
    return w;
}

const char* style_name(ControlStyle s) {
    switch (s) {
    case ControlStyle::TCount: return "T-count";
    case ControlStyle::TwoQubit: return "two-qubit count";
    case ControlStyle::Depth: return "depth";
    }
    return "?";
}

ControlLowerer::ControlLowerer(ir::Circuit& c, OpSink& sink, const std::set<uint32_t>& clean_zero, ControlStyle style,
                               bool classical_only, int64_t rotation_t_cost, int64_t rotation_depth_cost)
    : c_(c), sink_(&sink), clean_zero_(clean_zero), style_(style), classical_only_(classical_only),
      rotation_t_cost_(rotation_t_cost), rotation_depth_cost_(rotation_depth_cost), in_use_(c.num_qubits(), 0),
      scratch_(c.num_qubits(), 0) {}

ConstructionCost ControlLowerer::estimate(const std::vector<ir::Op>& ops) const {
    ir::Circuit low;
    low.add_register("w", c_.num_qubits(), ir::Role::Data);
    ir::Angle gp;
    OpSink s(low.ops, gp);
    const bool depth = style_ == ControlStyle::Depth;
    for (const ir::Op& op : ops) {
        const bool toffoli = op.kind == ir::OpKind::X && op.controls.size() == 2;
        const bool ccz = op.kind == ir::OpKind::Phase && op.controls.size() == 3 && op.angle == ir::Angle::pi_times(1);
        if (!toffoli && !ccz) {
            s.push(op);
            continue;
        }
        for (ir::Lit l : op.controls)
            if (!l.positive()) s.x(l.wire());
        const uint32_t a = op.controls[0].wire(), b = op.controls[1].wire();
        if (ccz) {
            if (depth) ccz_tdepth3(s, a, b, op.controls[2].wire());
            else ccz_7t(s, a, b, op.controls[2].wire());
        } else if (op.pair != 0) {
            toffoli_relative_phase(s, a, b, op.target, op.half == ir::PairHalf::Uncompute);
        } else if (depth) {
            toffoli_tdepth3(s, a, b, op.target);
        } else {
            toffoli_7t(s, a, b, op.target);
        }
        for (ir::Lit l : op.controls)
            if (!l.positive()) s.x(l.wire());
    }
    const ir::Resources r = ir::count_resources(low);
    ConstructionCost k;
    k.t = int64_t(r.t_count) + int64_t(r.non_clifford_rotations) * rotation_t_cost_;
    k.two_qubit = int64_t(r.two_qubit_count);
    // ASAP layers as in count_resources, with a rotation that becomes a word weighing its length.
    std::vector<int64_t> layer(c_.num_qubits(), 0);
    std::vector<uint32_t> wires;
    for (const ir::Op& op : low.ops) {
        wires.clear();
        op.wires(wires);
        int64_t l = 0;
        for (uint32_t w : wires) l = std::max(l, layer[w]);
        const bool rotation = op.kind == ir::OpKind::Phase || op.kind == ir::OpKind::Parity ||
                              op.kind == ir::OpKind::RX || op.kind == ir::OpKind::RY || op.kind == ir::OpKind::RZ;
        l += rotation && !op.angle.is_multiple_of_pi_over(4) ? rotation_depth_cost_ : 1;
        for (uint32_t w : wires) layer[w] = l;
        k.depth = std::max(k.depth, l);
    }
    return k;
}

ConstructionCost ControlLowerer::dry_run(const std::function<void()>& emit) {
    std::vector<ir::Op> ops;
    ir::Angle gp;
    OpSink scratch(ops, gp);
    // The emitters record choices and counters; a dry run must leave no trace of either.
    struct Restore {
        ControlLowerer& lw;
        OpSink* sink;
        std::map<std::string, int64_t> used;
        std::string choice, method;
        ConstructionCost cost;
        ~Restore() {
            lw.sink_ = sink;
            lw.used_ = std::move(used);
            lw.top_choice_ = std::move(choice);
            lw.top_method_ = std::move(method);
            lw.top_cost_ = cost;
            --lw.dry_depth_;
        }
    } restore{*this, sink_, used_, top_choice_, top_method_, top_cost_};
    ++dry_depth_;
    sink_ = &scratch;
    emit();
    return estimate(ops);
}

bool ControlLowerer::cheaper(const ConstructionCost& a, const ConstructionCost& b) const {
    auto key = [&](const ConstructionCost& k) {
        switch (style_) {
        case ControlStyle::TCount: return std::tuple(k.t, k.two_qubit, int64_t(0));
        case ControlStyle::TwoQubit: return std::tuple(k.two_qubit, k.t, int64_t(0));
        case ControlStyle::Depth: return std::tuple(k.depth, k.t, k.two_qubit);
        }
        return std::tuple(k.t, k.two_qubit, int64_t(0));
    };
    return key(a) < key(b);
}

std::string ControlLowerer::cost_text(const ConstructionCost& k) const {
    return fmt::format("{} T, {} two-qubit, depth {}", k.t, k.two_qubit, k.depth);
}

size_t ControlLowerer::emit_cheapest(const std::string& what, const std::string& key, const std::vector<Candidate>& cands) {
    WHITTLE_ASSERT(!cands.empty() && "emit_cheapest needs a candidate");
    auto index_of = [&](const std::string& method) {
        for (size_t i = 0; i < cands.size(); ++i)
            if (cands[i].method == method) return i;
        return cands.size();
    };
    auto it = memo_.find(key);
    if (it == memo_.end() || index_of(it->second.method) == cands.size()) {
        Decision d;
        size_t best = cands.size(), second = cands.size();
        std::vector<ConstructionCost> costs;
        for (size_t i = 0; i < cands.size(); ++i) {
            costs.push_back(dry_run(cands[i].emit));
            if (best == cands.size() || cheaper(costs[i], costs[best])) {
                second = best;
                best = i;
            } else if (second == cands.size() || cheaper(costs[i], costs[second])) {
                second = i;
            }
        }
        d.method = cands[best].method;
        d.cost = costs[best];
        if (second < cands.size()) {
            d.runner_up = cands[second].method;
            d.runner_up_cost = costs[second];
        }
        it = memo_.insert_or_assign(key, std::move(d)).first;
    }
    const Decision& d = it->second;
    const size_t pick = index_of(d.method);
    const Candidate& c = cands[pick];
    if (top_choice_.empty() && dry_depth_ == 0) {
        // The report line: the construction, its wires, and why it won in the asked metric.
        std::string why = d.runner_up.empty()
                              ? fmt::format("the only construction for the free wires")
                              : fmt::format("cheapest in {}: {} ({}) vs {} ({})", style_name(style_), c.method,
                                            cost_text(d.cost), d.runner_up, cost_text(d.runner_up_cost));
        set_choice(fmt::format("{}: {}{}; {}", what, c.method, c.detail.empty() ? "" : ", " + c.detail, why));
        top_method_ = c.method;
        top_cost_ = d.cost;
    }
    used(c.method);
    c.emit();
    return pick;
}

std::vector<uint32_t> ControlLowerer::take_clean(size_t n, const std::vector<uint32_t>& busy) {
    for (uint32_t w : busy) scratch_[w] = 1;
    // Exclude wires already holding a value for an enclosing construction.
    std::vector<uint32_t> out;
    const int rounds = lives_ && within_lives_ ? 1 : 2;
    for (int round = lives_ ? 0 : 1; round < rounds; ++round)
        for (uint32_t w : clean_zero_) {
            if (out.size() == n) break;
            if (scratch_[w] || in_use_[w]) continue;
            const bool inside = lives_ && lives_->inside_life(w);
            if ((round == 0) != inside) continue;  // round 0: inside a life; round 1: the rest
            out.push_back(w);
        }
    for (uint32_t w : busy) scratch_[w] = 0;
    for (uint32_t w : out) in_use_[w] = 1;
    return out;
}

void ControlLowerer::release_clean(const std::vector<uint32_t>& wires) {
    for (uint32_t w : wires) in_use_[w] = 0;
}

std::vector<uint32_t> ControlLowerer::borrow(size_t n, const std::vector<uint32_t>& busy) {
    for (uint32_t w : busy) scratch_[w] = 1;
    // Only within lives: a clean wire at |0> outside its life is not borrowed (it would become live).
    std::vector<uint32_t> idle;
    if (lives_ && within_lives_)
        for (uint32_t w : clean_zero_)
            if (!scratch_[w] && !lives_->inside_life(w)) {
                scratch_[w] = 1;
                idle.push_back(w);
            }
    std::vector<uint32_t> out = pick_wires(nullptr, c_.num_qubits(), scratch_, n);
    for (uint32_t w : busy) scratch_[w] = 0;
    for (uint32_t w : idle) scratch_[w] = 0;
    return out;
}

void ControlLowerer::set_choice(const std::string& what) {
    if (top_choice_.empty()) top_choice_ = what;
}

void ControlLowerer::mcx(const ir::LitVec& controls, uint32_t target) {
    const size_t n = controls.size();
    if (n <= 2) {
        sink_->x(target, controls);
        return;
    }
    // The op's own wires are not |0> work wires for the sub-ops of its construction, even when the
    // tracker proved one of them |0> before the op (its target is toggled while the op is built).
    const std::vector<uint32_t> busy = wires_of(controls, {target});
    std::vector<uint32_t> marked;
    for (uint32_t w : busy)
        if (!in_use_[w]) {
            in_use_[w] = 1;
            marked.push_back(w);
        }
    mcx_construct(controls, target, busy);
    for (uint32_t w : marked) in_use_[w] = 0;
}

void ControlLowerer::mcx_construct(const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& busy) {
    const size_t n = controls.size();
    // What is free for this op: the candidates below take their wires again when they run.
    std::vector<uint32_t> clean = take_clean(n - 2, busy);
    release_clean(clean);
    const std::vector<uint32_t> dirty = borrow(n - 2, busy);
    std::vector<Candidate> cands;
    if (clean.size() == n - 2) {
        const std::string detail = fmt::format("{} clean wires", clean.size());
        cands.push_back({"clean-ladder", detail, [=, this] {
                             std::vector<uint32_t> w = take_clean(n - 2, busy);
                             mcx_v_chain(*this, controls, target, w);
                             release_clean(w);
                         }});
        cands.push_back({"and-tree", detail, [=, this] {
                             std::vector<uint32_t> w = take_clean(n - 2, busy);
                             mcx_and_tree(*this, controls, target, w);
                             release_clean(w);
                         }});
    } else if (!clean.empty()) {
        cands.push_back({"partial-clean-ladder", fmt::format("{} clean wires", clean.size()), [=, this] {
                             std::vector<uint32_t> w = take_clean(clean.size(), busy);
                             mcx_v_chain(*this, controls, target, w);
                             release_clean(w);
                         }});
    }
    if (dirty.size() == n - 2)
        cands.push_back({"borrowed-ladder", fmt::format("Lemma 7.2, {} borrowed wires", dirty.size()),
                         [=, this] { mcx_barenco_dirty(*this, controls, target, dirty); }});
    if (!dirty.empty())
        cands.push_back({"one-wire-split", fmt::format("Lemma 7.3, borrowed {}", c_.wire_name(dirty[0])),
                         [=, this] { mcx_one_wire_split(*this, controls, target, dirty[0]); }});
    if (!classical_only_) {
        if (cands.empty())
            cands.push_back({"no-work-wire", "Lemma 7.5, controlled sqrt(X) steps", [=, this] { mcx_no_ancilla(*this, controls, target); }});
        if (n + 1 <= kMaxParityNetworkLiterals)
            cands.push_back({"phase-polynomial", fmt::format("H, {}-literal parity network, H", n + 1),
                             [=, this] { mcx_parity_network(*this, controls, target); }});
    }
    if (cands.empty())
        throw UserError(fmt::format("a {}-control X on all {} wires has no NOT/CNOT/Toffoli form without a work wire "
                                    "(use --extra-ancillas 1)",
                                    n, c_.num_qubits()),
                        sink_->loc());
    const std::string key = fmt::format("mcx/{}/{}/{}", n, clean.size(), dirty.size());
    emit_cheapest(fmt::format("mcx/{}", n), key, cands);
}

}  // namespace whittle::lowering
