// Backward-walking rewriter with per-wire index lists (see backward_rewriter.h).
#include "passes/backward_rewriter.h"

#include <algorithm>
#include <optional>
#include <unordered_set>

#include "ir/error.h"
#include "passes/commutation.h"
#include "passes/kickback.h"

namespace whittle::passes {

using ir::Op;

namespace {

constexpr uint32_t kNone = 0xffffffffu;

struct Slot {
    Op op;
    bool live = true;
    std::vector<Op> kicked;  ///< kickback ops that follow `op` (see RewriteLimits::kickback)
};

/// A kickback move made by the walk in progress: `extra` goes right after slot `slot` if it pays.
struct PendingKick {
    uint32_t slot;
    Op extra;
};

class Rewriter {
public:
    Rewriter(ir::Circuit& c, const CombineRule& combine, PassResult& result, RewriteLimits limits)
        : c_(c), combine_(combine), result_(result), limits_(limits), on_wire_(c.num_qubits()) {}

    bool run() {
        slots_.reserve(c_.ops.size());
        for (const Op& op : c_.ops) place(op);
        if (!fired_) return false;
        std::vector<Op> out;
        out.reserve(slots_.size());
        for (Slot& s : slots_)
            if (s.live) {
                if (s.op.pair != 0 && broken_.count(s.op.pair)) {
                    s.op.pair = 0;
                    s.op.half = ir::PairHalf::None;
                }
                out.push_back(std::move(s.op));
                for (Op& k : s.kicked) out.push_back(std::move(k));
            }
        c_.ops = std::move(out);
        c_.global_phase += global_;
        return true;
    }

private:
    void append(const Op& op) {
        const uint32_t idx = uint32_t(slots_.size());
        slots_.push_back(Slot{op, true, {}});
        if (is_fence(op)) fence_ = idx;
        wires_.clear();
        op.wires(wires_);
        for (uint32_t w : wires_) on_wire_[w].push_back(idx);
    }

    void add_wire(uint32_t idx, uint32_t w) {
        std::vector<uint32_t>& v = on_wire_[w];
        auto it = std::lower_bound(v.begin(), v.end(), idx);
        if (it == v.end() || *it != idx) v.insert(it, idx);
    }

    void note_pairs(const Op& a, const Op& b, Combined how) {
        const bool own_inverse = how == Combined::Vanished && a.pair != 0 && a.pair == b.pair && a.half != b.half;
        if (own_inverse) return;
        if (a.pair) broken_.insert(a.pair);
        if (b.pair) broken_.insert(b.pair);
    }

    void place(const Op& op) {
        if (is_fence(op)) {
            append(op);
            return;
        }
        std::vector<uint32_t> ws;
        op.wires(ws);
        // One cursor per wire of the mover into that wire's index list, walked from the back.
        std::vector<size_t> cur(ws.size());
        for (size_t i = 0; i < ws.size(); ++i) cur[i] = on_wire_[ws[i]].size();
        Op moved = op;
        ir::Angle g;
        std::optional<PendingKick> kick;
        uint32_t visited = 0, steps = 0;
        while (visited < limits_.window && steps < 4 * limits_.window) {
            uint32_t j = kNone;
            for (size_t i = 0; i < ws.size(); ++i)
                if (cur[i] > 0) {
                    uint32_t cand = on_wire_[ws[i]][cur[i] - 1];
                    if (j == kNone || cand > j) j = cand;
                }
            if (j == kNone || (fence_ != kNone && j <= fence_)) break;
            for (size_t i = 0; i < ws.size(); ++i)
                while (cur[i] > 0 && on_wire_[ws[i]][cur[i] - 1] >= j) --cur[i];
            ++steps;
            Slot& s = slots_[j];
            if (!s.live) continue;
            if (!s.kicked.empty()) break;  // its kickback op is not in the wire lists' order: a wall
            ++visited;
            ir::Angle g2 = g;
            added_.clear();
            if (kick) {
                // Only a vanishing pair pays for the extra op; try the rule on copies first.
                Op trial = s.op;
                PassResult scratch;
                const Combined how = combine_(trial, moved, g2, added_, scratch);
                if (how != Combined::No) {
                    const bool pays =
                        how == Combined::Vanished && estimated_t_cost(kick->extra) <= pair_t_cost(s.op, moved);
                    if (!pays) break;
                    for (const auto& [name, n] : scratch.stats) result_.count(name, n);
                    commit_kick(*kick);
                    note_pairs(s.op, moved, how);
                    s.live = false;
                    global_ += g2;
                    fired_ = true;
                    return;
                }
            } else {
                const Combined how = combine_(s.op, moved, g2, added_, result_);
                if (how != Combined::No) {
                    note_pairs(s.op, moved, how);
                    if (how == Combined::Vanished) s.live = false;
                    for (uint32_t w : added_) add_wire(j, w);
                    global_ += g2;
                    fired_ = true;
                    return;
                }
            }
            if (move_before(s.op, moved, g)) continue;
            Op extra;
            if (!limits_.kickback || kick || !kickback_move(s.op, moved, extra)) break;
            kick = PendingKick{j, std::move(extra)};
        }
        append(op);
    }

    /// The estimated T-cost of a pair about to vanish, as the lowering could price it.
    uint64_t pair_t_cost(const Op& a, const Op& b) const {
        const bool clean_target = a.kind == ir::OpKind::X && a.target < c_.num_qubits() &&
                                  c_.qubits[a.target].role == ir::Role::Clean;
        if (limits_.measured_erase && clean_target) return estimated_measured_pair_t_cost(a);
        return estimated_t_cost(a) + estimated_t_cost(b);
    }

    void commit_kick(PendingKick& k) {
        Slot& s = slots_[k.slot];
        // The kicked-from op now has a new neighbour its compute/uncompute partner does not know of.
        if (s.op.pair) broken_.insert(s.op.pair);
        wires_.clear();
        k.extra.wires(wires_);
        for (uint32_t w : wires_) add_wire(k.slot, w);
        s.kicked.push_back(std::move(k.extra));
        result_.count("kickbacks");
    }

    ir::Circuit& c_;
    const CombineRule& combine_;
    PassResult& result_;
    RewriteLimits limits_;
    std::vector<Slot> slots_;
    std::vector<std::vector<uint32_t>> on_wire_;
    std::vector<uint32_t> wires_, added_;
    std::unordered_set<uint32_t> broken_;
    uint32_t fence_ = kNone;
    ir::Angle global_;
    bool fired_ = false;
};

}  // namespace

bool rewrite_backwards(ir::Circuit& c, const CombineRule& combine, PassResult& result, RewriteLimits limits) {
    return Rewriter(c, combine, result, limits).run();
}

}  // namespace whittle::passes
