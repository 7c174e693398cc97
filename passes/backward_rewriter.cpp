// Backward-walking rewriter with per-wire index lists (see backward_rewriter.h).
#include "passes/backward_rewriter.h"

#include <algorithm>
#include <optional>
#include <unordered_map>
#include <unordered_set>

#include "ir/error.h"
#include "passes/commutation.h"
#include "passes/kickback.h"

namespace whittle::passes {

using ir::Op;

namespace {

constexpr uint32_t kNone = 0xffffffffu;

/// A kickback move made by the walk in progress: `extra` goes right after the op placed at
/// position `slot` (in reading order) if it pays.
struct PendingKick {
    uint32_t slot;
    Op extra;
};

/// The ops are rewritten where they lie in Circuit::ops: a walk reads earlier ops there, a combine
/// rule changes the earlier op in place, and ops that are gone are only marked dead until the final
/// compaction. Nothing is copied when no rule fires (only rules that fire change an op), and no
/// second vector of ops is built when one does, unless a kickback added an op. Positions in the
/// per-wire lists are placement positions: p-th op placed, which is op p, or op n-1-p when the ops
/// are read right to left.
class Rewriter {
public:
    Rewriter(ir::Circuit& c, const CombineRule& combine, PassResult& result, RewriteLimits limits, bool right_to_left)
        : c_(c), combine_(combine), result_(result), limits_(limits), right_to_left_(right_to_left),
          n_(uint32_t(c.ops.size())), on_wire_(c.num_qubits()) {}

    bool run() {
        live_.assign(n_, 1);
        for (uint32_t p = 0; p < n_; ++p) place(p);
        if (!fired_) return false;
        for (uint32_t i = 0; i < n_; ++i) {
            if (!live_[i]) continue;
            Op& op = c_.ops[i];
            if (op.pair != 0 && broken_.count(op.pair)) {
                op.pair = 0;
                op.half = ir::PairHalf::None;
            }
        }
        if (kicked_.empty()) {
            // Compaction in op order: for a right-to-left reading this is the rewritten sequence read back.
            size_t k = 0;
            for (uint32_t i = 0; i < n_; ++i) {
                if (!live_[i]) continue;
                if (k != i) c_.ops[k] = std::move(c_.ops[i]);
                ++k;
            }
            c_.ops.erase(c_.ops.begin() + std::ptrdiff_t(k), c_.ops.end());
        } else {
            // A kickback op follows its op in reading order: after it left to right, before it
            // right to left.
            std::vector<Op> out;
            out.reserve(n_ + kicked_.size());
            for (uint32_t i = 0; i < n_; ++i) {
                auto it = live_[i] ? kicked_.find(position_of(i)) : kicked_.end();
                if (it != kicked_.end() && right_to_left_) out.push_back(std::move(it->second));
                if (live_[i]) out.push_back(std::move(c_.ops[i]));
                if (it != kicked_.end() && !right_to_left_) out.push_back(std::move(it->second));
            }
            c_.ops = std::move(out);
        }
        c_.global_phase += global_;
        return true;
    }

private:
    uint32_t index_of(uint32_t p) const { return right_to_left_ ? n_ - 1 - p : p; }
    uint32_t position_of(uint32_t i) const { return right_to_left_ ? n_ - 1 - i : i; }

    void append(uint32_t p, const Op& op) {
        if (is_fence(op)) fence_ = p;
        wires_.clear();
        op.wires(wires_);
        for (uint32_t w : wires_) on_wire_[w].push_back(p);
    }

    void add_wire(uint32_t p, uint32_t w) {
        std::vector<uint32_t>& v = on_wire_[w];
        auto it = std::lower_bound(v.begin(), v.end(), p);
        if (it == v.end() || *it != p) v.insert(it, p);
    }

    void note_pairs(const Op& a, const Op& b, Combined how) {
        const bool own_inverse = how == Combined::Vanished && a.pair != 0 && a.pair == b.pair && a.half != b.half;
        if (own_inverse) return;
        if (a.pair) broken_.insert(a.pair);
        if (b.pair) broken_.insert(b.pair);
    }

    void place(uint32_t p) {
        const Op& op = c_.ops[index_of(p)];
        if (is_fence(op)) {
            append(p, op);
            return;
        }
        // One cursor per wire of the mover into that wire's index list, walked from the back. The
        // two lists are members reused by every walk (no allocation per op).
        std::vector<uint32_t>& ws = mover_wires_;
        std::vector<size_t>& cur = cursors_;
        ws.clear();
        op.wires(ws);
        cur.resize(ws.size());
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
            const uint32_t earlier = index_of(j);
            if (!live_[earlier]) continue;
            if (!kicked_.empty() && kicked_.count(j)) break;  // its kickback op is not in the wire lists' order: a wall
            ++visited;
            Op& e = c_.ops[earlier];
            ir::Angle g2 = g;
            added_.clear();
            if (kick) {
                // Only a vanishing pair pays for the extra op; try the rule on a copy first.
                Op trial = e;
                PassResult scratch;
                const Combined how = combine_(trial, moved, g2, added_, scratch);
                if (how != Combined::No) {
                    const bool pays =
                        how == Combined::Vanished && estimated_t_cost(kick->extra) <= pair_t_cost(e, moved);
                    if (!pays) break;
                    for (const auto& [name, n] : scratch.stats) result_.count(name, n);
                    commit_kick(*kick);
                    note_pairs(e, moved, how);
                    live_[earlier] = 0;
                    live_[index_of(p)] = 0;
                    global_ += g2;
                    fired_ = true;
                    return;
                }
            } else {
                const Combined how = combine_(e, moved, g2, added_, result_);
                if (how != Combined::No) {
                    note_pairs(e, moved, how);
                    if (how == Combined::Vanished) live_[earlier] = 0;
                    live_[index_of(p)] = 0;  // the mover is gone either way
                    for (uint32_t w : added_) add_wire(j, w);
                    global_ += g2;
                    fired_ = true;
                    return;
                }
            }
            if (move_before(e, moved, g)) continue;
            Op extra;
            if (!limits_.kickback || kick || !kickback_move(e, moved, extra)) break;
            kick = PendingKick{j, std::move(extra)};
        }
        append(p, op);
    }

    /// The estimated T-cost of a pair about to vanish, as the lowering could price it.
    uint64_t pair_t_cost(const Op& a, const Op& b) const {
        const bool clean_target = a.kind == ir::OpKind::X && a.target < c_.num_qubits() &&
                                  c_.qubits[a.target].role == ir::Role::Clean;
        if (limits_.measured_erase && clean_target) return estimated_measured_pair_t_cost(a);
        return estimated_t_cost(a) + estimated_t_cost(b);
    }

    void commit_kick(PendingKick& k) {
        Op& from = c_.ops[index_of(k.slot)];
        // The kicked-from op now has a new neighbour its compute/uncompute partner does not know of.
        if (from.pair) broken_.insert(from.pair);
        wires_.clear();
        k.extra.wires(wires_);
        for (uint32_t w : wires_) add_wire(k.slot, w);
        kicked_.emplace(k.slot, std::move(k.extra));
        result_.count("kickbacks");
    }

    ir::Circuit& c_;
    const CombineRule& combine_;
    PassResult& result_;
    RewriteLimits limits_;
    bool right_to_left_;
    uint32_t n_;
    std::vector<uint8_t> live_;  ///< by op index
    std::unordered_map<uint32_t, Op> kicked_;  ///< kickback op following the op placed at a position
    std::vector<std::vector<uint32_t>> on_wire_;
    std::vector<uint32_t> wires_, added_, mover_wires_;
    std::vector<size_t> cursors_;
    std::unordered_set<uint32_t> broken_;
    uint32_t fence_ = kNone;
    ir::Angle global_;
    bool fired_ = false;
};

}  // namespace

bool rewrite_backwards(ir::Circuit& c, const CombineRule& combine, PassResult& result, RewriteLimits limits,
                       bool right_to_left) {
    return Rewriter(c, combine, result, limits, right_to_left).run();
}

}  // namespace whittle::passes
