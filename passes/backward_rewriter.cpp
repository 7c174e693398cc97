// Backward-walking rewriter with per-wire index lists (see backward_rewriter.h).
#include "passes/backward_rewriter.h"

#include <algorithm>
#include <bit>
#include <optional>
#include <unordered_set>

#include "ir/error.h"
#include "passes/commutation.h"
#include "passes/kickback.h"

namespace whittle::passes {

using ir::Op;

namespace {

constexpr uint32_t kNone = 0xffffffffu;
constexpr uint16_t kManyWires = 0xffff;

/// One entry of a wire's list: the position of an op placed on the wire and what a walk needs to
/// know of that op to pass it. The lists are read back to front and stay in cache, while the ops
/// themselves lie far apart at scale (1000 wires: ~1000 ops between neighbours on a wire), so a
/// step that reads only the entry costs no cache miss.
struct WireEntry {
    uint32_t pos;
    WireRole role;    ///< the op's role on this wire
    ir::OpKind kind;
    uint16_t wires;   ///< the op's wire count (kManyWires when it does not fit)
};

}  // namespace

/// The per-wire lists, all in one arena: wire w's entries form a ring of a power-of-two capacity
/// of at most `max_ring` entries, which is above the number of entries a walk can step over on one
/// wire (4 * window); a full ring of that size overwrites its oldest entry, which no walk can
/// reach. Each sweep lays the rings out once, sized by the wire's entry count in the previous sweep
/// of the same pass (counted from the ops before the first), so the arena is one block that holds
/// at most wires * max_ring entries however long the circuit; a ring that still fills up (an
/// insertion) moves to the arena's end at twice its size. One block instead of a vector per wire
/// keeps the lists' tails in few (huge) pages.
struct RewriteBuffers::Lists {
    struct Ring {
        uint64_t offset = 0;  ///< first slot in the arena
        uint32_t capacity = 0;
        uint32_t length = 0;  ///< entries ever pushed (or inserted) on the wire; the last `capacity` are kept
    };
    std::vector<WireEntry> arena;
    std::vector<Ring> rings;         ///< by wire
    std::vector<uint32_t> expected;  ///< by wire: entries the next sweep will likely push
    std::vector<uint8_t> state;      ///< by position: kLive, kWall, kStale
    uint32_t max_ring = 0;

    void reset(const ir::Circuit& c, uint32_t max_ring_entries) {
        const uint32_t wires = c.num_qubits();
        max_ring = max_ring_entries;
        if (expected.size() != wires) {  // the pass's first sweep: count each wire's ops
            expected.assign(wires, 0);
            for (const ir::Op& op : c.ops) {
                if (op.target != ir::kNoWire) ++expected[op.target];
                if (op.target2 != ir::kNoWire) ++expected[op.target2];
                for (ir::Lit l : op.controls) ++expected[l.wire()];
            }
        } else {
            for (uint32_t w = 0; w < wires; ++w) expected[w] = rings[w].length;
        }
        rings.resize(wires);
        uint64_t total = 0;
        for (uint32_t w = 0; w < wires; ++w) {
            // Room for two insertions before a ring has to move.
            const uint32_t cap = expected[w] == 0 ? 0 : std::min(max_ring, std::bit_ceil(std::min(expected[w], max_ring) + 2));
            rings[w] = Ring{total, cap, 0};
            total += cap;
        }
        arena.clear();
        arena.reserve(total + total / 8 + 64);  // moved rings go past `total` without reallocating
        arena.resize(total);
    }
    /// Oldest logical index still kept on the wire.
    uint32_t first(const Ring& r) const { return r.length > r.capacity ? r.length - r.capacity : 0; }
    WireEntry& at(const Ring& r, uint32_t k) { return arena[r.offset + (k & (r.capacity - 1))]; }
    void grow(Ring& r) {
        const uint32_t fresh = r.capacity == 0 ? 8 : std::min(max_ring, 2 * r.capacity);
        const uint64_t offset = arena.size();
        arena.resize(offset + fresh);
        for (uint32_t k = 0; k < r.length; ++k) arena[offset + (k & (fresh - 1))] = at(r, k);
        r.offset = offset;
        r.capacity = fresh;
    }
    void push(uint32_t w, const WireEntry& e) {
        Ring& r = rings[w];
        if (r.length == r.capacity && r.capacity < max_ring) grow(r);
        at(r, r.length++) = e;
    }
    /// Inserts `e` in position order (its position is below the last entry's); nothing when the
    /// wire already has an entry at that position.
    void insert_sorted(uint32_t w, const WireEntry& e) {
        Ring& r = rings[w];
        uint32_t lo = first(r), hi = r.length;
        while (lo < hi) {  // first index whose position is >= e.pos
            const uint32_t mid = lo + (hi - lo) / 2;
            if (at(r, mid).pos < e.pos) lo = mid + 1;
            else hi = mid;
        }
        if (lo < r.length && at(r, lo).pos == e.pos) return;
        if (r.length == r.capacity && r.capacity < max_ring) grow(r);
        for (uint32_t k = r.length; k > lo; --k) at(r, k) = at(r, k - 1);  // a full ring drops its oldest
        at(r, lo) = e;
        ++r.length;
    }
};

RewriteBuffers::RewriteBuffers() : lists(std::make_unique<Lists>()) {}
RewriteBuffers::~RewriteBuffers() = default;

namespace {

/// Per-position state bits.
enum : uint8_t {
    kLive = 1,   ///< not removed by a combination
    kWall = 2,   ///< a kickback op follows it, not in the wire lists' order: walks stop here
    kStale = 4,  ///< a combine rule changed the op: its wire entries may no longer describe it
};

/// A kickback op kept: `extra` goes right after the op placed at position `slot` (in reading order).
struct PendingKick {
    uint32_t slot;
    Op extra;
};

/// A kickback move made by the walk in progress, priced but not built (most walks end without
/// using it): the mover crossed the op placed at `slot`, and the extra op would cost `t_cost`.
/// `mover_copied`: the mover had been rewritten by then, and Rewriter::kick_mover_ holds it as it was.
struct WalkKick {
    uint32_t slot;
    uint64_t t_cost;
    bool mover_copied;
};

/// The ops are rewritten where they lie in Circuit::ops: a walk reads earlier ops there, a combine
/// rule changes the earlier op in place, and ops that are gone are only marked dead until the final
/// compaction (kickback ops are inserted by the same compaction, back to front). Nothing is copied
/// when no rule fires, and the mover itself is copied only when an uncontrolled X rewrites it.
/// Positions in the per-wire lists are placement positions: p-th op placed, which is op p, or op
/// n-1-p when the ops are read right to left.
class Rewriter {
public:
    Rewriter(ir::Circuit& c, const CombineRule& rule, PassResult& result, RewriteBuffers::Lists& lists,
             RewriteLimits limits, bool right_to_left)
        : c_(c), rule_(rule), result_(result), limits_(limits), right_to_left_(right_to_left),
          n_(uint32_t(c.ops.size())), lists_(lists), state_(lists.state) {
        // The arena is cleared, not freed: a later sweep reuses the capacity an earlier one grew.
        // A walk steps over at most 4 * window entries of one wire (see place()).
        lists_.reset(c, uint32_t(std::bit_ceil(4 * uint64_t(limits.window) + 1)));
    }

    bool run() {
        state_.assign(n_, kLive);
        for (uint32_t p = 0; p < n_; ++p) place(p);
        if (!fired_) return false;
        compact_and_insert_kicks();
        c_.global_phase += global_;
        return true;
    }

private:
    uint32_t index_of(uint32_t p) const { return right_to_left_ ? n_ - 1 - p : p; }
    uint32_t position_of(uint32_t i) const { return right_to_left_ ? n_ - 1 - i : i; }
    bool live(uint32_t p) const { return state_[p] & kLive; }

    /// Drops dead ops in op order (for a right-to-left reading this is the rewritten sequence read
    /// back) and clears the broken pair ids, then opens room for the kickback ops from the back: a
    /// kickback op follows its op in reading order, i.e. after it left to right and before it right
    /// to left. One pass over the ops and no second vector.
    void compact_and_insert_kicks() {
        std::sort(kicked_.begin(), kicked_.end(),
                  [&](const PendingKick& a, const PendingKick& b) { return index_of(a.slot) < index_of(b.slot); });
        std::vector<std::pair<size_t, Op*>> inserts;  // (compacted index of the kicked-from op, kickback op)
        size_t k = 0, q = 0;
        for (uint32_t i = 0; i < n_; ++i) {
            if (!live(position_of(i))) continue;
            Op& op = c_.ops[i];
            if (op.pair != 0 && broken_.count(op.pair)) {
                op.pair = 0;
                op.half = ir::PairHalf::None;
            }
            for (; q < kicked_.size() && index_of(kicked_[q].slot) <= i; ++q)
                if (index_of(kicked_[q].slot) == i) inserts.emplace_back(k, &kicked_[q].extra);
            if (k != i) c_.ops[k] = std::move(c_.ops[i]);
            ++k;
        }
        c_.ops.resize(k + inserts.size());
        size_t dst = c_.ops.size(), src = k, left = inserts.size();
        while (left > 0) {  // dst == src + left at the top: the ops below src are in place once left is 0
            --src;
            const bool here = inserts[left - 1].first == src;
            if (here && !right_to_left_) c_.ops[--dst] = std::move(*inserts[--left].second);
            if (--dst != src) c_.ops[dst] = std::move(c_.ops[src]);
            if (here && right_to_left_) c_.ops[--dst] = std::move(*inserts[--left].second);
        }
    }

    void push_entry(uint32_t p, const Op& op, uint32_t w, uint16_t count) {
        lists_.push(w, WireEntry{p, wire_role(op, w), op.kind, count});
    }

    static uint16_t wire_count(const Op& op) {
        const size_t n = (op.target != ir::kNoWire) + (op.target2 != ir::kNoWire) + op.controls.size();
        return uint16_t(std::min<size_t>(n, kManyWires));
    }

    void append(uint32_t p, const Op& op) {
        if (is_fence(op)) fence_ = p;
        const uint16_t count = wire_count(op);
        if (op.target != ir::kNoWire) push_entry(p, op, op.target, count);
        if (op.target2 != ir::kNoWire) push_entry(p, op, op.target2, count);
        for (ir::Lit l : op.controls) push_entry(p, op, l.wire(), count);
    }

    /// Adds position p to wire w's list (p is below the list's end: the entry goes in sorted).
    void add_wire(uint32_t p, uint32_t w, const Op& op) {
        lists_.insert_sorted(w, WireEntry{p, wire_role(op, w), op.kind, wire_count(op)});
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
        // One cursor per wire of the mover into that wire's list, walked from the back, and the
        // mover's role on that wire (the walk's rewrites flip polarities and negate angles, which
        // keeps every role). The lists are members reused by every walk (no allocation per op).
        std::vector<uint32_t>& ws = mover_wires_;
        ws.clear();
        op.wires(ws);
        // Per mover wire: the cursor (a logical index into the wire's ring, walked down to the
        // ring's oldest kept entry), the ring's slots and mask. Nothing is pushed or inserted
        // while the walk runs, so the arena does not move under `slots_`.
        if (cursors_.size() < ws.size()) {  // grown once to the widest op, never shrunk
            cursors_.resize(ws.size());
            ends_.resize(ws.size());
            slots_.resize(ws.size());
            masks_.resize(ws.size());
            roles_.resize(ws.size());
        }
        for (size_t i = 0; i < ws.size(); ++i) {
            const RewriteBuffers::Lists::Ring& r = lists_.rings[ws[i]];
            cursors_[i] = r.length;
            ends_[i] = lists_.first(r);
            slots_[i] = r.capacity ? &lists_.arena[r.offset] : nullptr;
            masks_[i] = r.capacity - 1;
            roles_[i] = wire_role(op, ws[i]);
        }
        const OpShape mover_shape{op.kind, wire_count(op)};
        const Op* mover = &op;  // points at moved_ once a rewrite made a copy
        ir::Angle g;
        std::optional<WalkKick> kick;
        uint32_t visited = 0, steps = 0;
        // The next position to visit: the largest among the cursors' entries (kNone: none left).
        // The lists do not change during the walk, so each step finds the following one while it
        // steps the cursors.
        uint32_t next = kNone;
        for (size_t i = 0; i < ws.size(); ++i)
            if (cursors_[i] > ends_[i]) {
                const uint32_t cand = slots_[i][(cursors_[i] - 1) & masks_[i]].pos;
                if (next == kNone || cand > next) next = cand;
            }
        while (visited < limits_.window && steps < 4 * limits_.window) {
            const uint32_t j = next;
            if (j == kNone || (fence_ != kNone && j <= fence_)) break;
            next = kNone;
            // Step every cursor at j over it; `agree`: on every shared wire both ops have one role
            // (not Other), so they commute (commutation.h) unless the rule combines them. Without
            // agreement they can still commute when they are orthogonal (a shared wire both read
            // as a control) or the earlier op is an uncontrolled X, or cross by a kickback (an X
            // target meets a control).
            uint32_t shared = 0;
            bool agree = true, both_z = false, earlier_x_meets_z = false, earlier_z_meets_x = false;
            const WireEntry* entry = nullptr;
            uint32_t shared_wire = 0;
            for (size_t i = 0; i < ws.size(); ++i) {
                if (cursors_[i] == ends_[i]) continue;
                const WireEntry& en = slots_[i][(cursors_[i] - 1) & masks_[i]];
                if (en.pos != j) {
                    if (next == kNone || en.pos > next) next = en.pos;
                    continue;
                }
                --cursors_[i];
                if (cursors_[i] > ends_[i]) {
                    const uint32_t cand = slots_[i][(cursors_[i] - 1) & masks_[i]].pos;
                    if (next == kNone || cand > next) next = cand;
                }
                ++shared;
                entry = &en;
                shared_wire = ws[i];
                agree = agree && en.role == roles_[i] && en.role != WireRole::Other;
                both_z = both_z || (en.role == WireRole::Z && roles_[i] == WireRole::Z);
                earlier_x_meets_z = earlier_x_meets_z || (en.role == WireRole::X && roles_[i] == WireRole::Z);
                earlier_z_meets_x = earlier_z_meets_x || (en.role == WireRole::Z && roles_[i] == WireRole::X);
            }
            ++steps;
            const uint8_t st = state_[j];
            if (!(st & kLive)) continue;
            if (st & kWall) break;
            ++visited;
            const bool shaped = !(st & kStale) && entry->wires != kManyWires && mover_shape.wires != kManyWires;
            const bool may_combine = !shaped || rule_.may_combine(OpShape{entry->kind, entry->wires}, mover_shape, shared);
            if (!may_combine) {  // decided without reading the earlier op where the entries suffice
                if (agree) continue;
                if (entry->kind == ir::OpKind::X && entry->wires == 1) {
                    // An uncontrolled X on the one shared wire: it may rewrite the mover, and it
                    // takes part in no kickback (it has no control, and its target is its only wire).
                    if (mover == &op) {
                        moved_ = op;
                        mover = &moved_;
                    }
                    if (move_before_not(shared_wire, moved_, g)) continue;
                    break;
                }
                const bool may_kick = limits_.kickback && !kick &&
                                      ((earlier_x_meets_z && kick_may_pay(*entry, *mover, true)) ||
                                       (earlier_z_meets_x && kick_may_pay(*entry, *mover, false)));
                if (!both_z && !may_kick) break;
            }
            const uint32_t earlier = index_of(j);
            Op& e = c_.ops[earlier];
            if (may_combine) {
                ir::Angle g2 = g;
                added_.clear();
                if (kick) {
                    // Only a vanishing pair pays for the extra op; try the rule on a copy first.
                    Op trial = e;
                    PassResult scratch;
                    const Combined how = rule_.combine(trial, *mover, g2, added_, scratch);
                    if (how != Combined::No) {
                        const bool pays =
                            how == Combined::Vanished && kick->t_cost <= pair_t_cost(e, *mover);
                        if (!pays) break;
                        for (const auto& [name, n] : scratch.stats) result_.count(name, n);
                        commit_kick(*kick, op);
                        note_pairs(e, *mover, how);
                        state_[j] &= uint8_t(~kLive);
                        state_[p] &= uint8_t(~kLive);
                        global_ += g2;
                        fired_ = true;
                        return;
                    }
                } else {
                    const Combined how = rule_.combine(e, *mover, g2, added_, result_);
                    if (how != Combined::No) {
                        note_pairs(e, *mover, how);
                        if (how == Combined::Vanished) state_[j] &= uint8_t(~kLive);
                        state_[j] |= kStale;
                        state_[p] &= uint8_t(~kLive);  // the mover is gone either way
                        for (uint32_t w : added_) add_wire(j, w, e);
                        global_ += g2;
                        fired_ = true;
                        return;
                    }
                }
            }
            if (rewrites_mover(e)) {
                if (mover == &op) {
                    moved_ = op;
                    mover = &moved_;
                }
                if (move_before(e, moved_, g)) continue;
            } else if (commutes_unchanged(e, *mover)) {
                continue;
            }
            uint64_t extra_t_cost = 0;
            if (!limits_.kickback || kick || !kickback_cost(e, *mover, extra_t_cost)) break;
            // Only a vanishing pair pays for the extra op, and its price is known now (a vanishing
            // earlier op has the mover's kind, targets and control count: CombineRule). A kick
            // that cannot pay would only let the walk end without a change.
            if (extra_t_cost > pair_t_cost(*mover, *mover)) break;
            const bool copied = mover != &op;
            if (copied) kick_mover_ = *mover;
            kick = WalkKick{j, extra_t_cost, copied};
        }
        // The mover stays: its entries, with the roles found above (op.wires() lists the wires in
        // append()'s order: target, target2, controls).
        const uint16_t count = wire_count(op);
        for (size_t i = 0; i < ws.size(); ++i) lists_.push(ws[i], WireEntry{p, roles_[i], op.kind, count});
    }

    /// From the earlier op's entry alone: can a kickback between it and the mover pay? With
    /// `earlier_is_x` the earlier op's X target meets a control of the mover, else the reverse.
    bool kick_may_pay(const WireEntry& earlier, const Op& mover, bool earlier_is_x) const {
        const uint32_t targets = earlier.kind == ir::OpKind::Swap ? 2 : earlier.kind == ir::OpKind::Phase ? 0 : 1;
        const uint32_t earlier_controls = earlier.wires >= targets ? earlier.wires - targets : 0;
        const uint32_t mover_controls = uint32_t(mover.controls.size());
        const uint64_t bound =
            earlier_is_x ? kickback_t_cost_bound(mover.kind, mover_controls, earlier_controls)
                         : kickback_t_cost_bound(earlier.kind, earlier_controls, mover_controls);
        const bool kinds = earlier_is_x ? kickback_kinds(earlier.kind, earlier.wires, mover.kind) && is_involution(mover)
                                        : kickback_kinds(mover.kind, uint32_t(mover.controls.size()) + 1, earlier.kind);
        return kinds && bound <= pair_t_cost(mover, mover);
    }

    /// The estimated T-cost of a pair about to vanish, as the lowering could price it.
    uint64_t pair_t_cost(const Op& a, const Op& b) const {
        const bool clean_target = a.kind == ir::OpKind::X && a.target < c_.num_qubits() &&
                                  c_.qubits[a.target].role == ir::Role::Clean;
        if (limits_.measured_erase && clean_target) return estimated_measured_pair_t_cost(a);
        return estimated_t_cost(a) + estimated_t_cost(b);
    }

    /// Builds and keeps the walk's kickback op (`op`: the mover as placed).
    void commit_kick(const WalkKick& walk_kick, const Op& op) {
        PendingKick k{walk_kick.slot, Op()};
        Op& from = c_.ops[index_of(k.slot)];
        // Neither op changed since the walk priced the move (combine rules ran on copies since).
        const bool built = kickback_move(from, walk_kick.mover_copied ? kick_mover_ : op, k.extra);
        WHITTLE_ASSERT(built && "a priced kickback can be built");
        // The kicked-from op now has a new neighbour its compute/uncompute partner does not know of.
        if (from.pair) broken_.insert(from.pair);
        wires_.clear();
        k.extra.wires(wires_);
        for (uint32_t w : wires_) add_wire(k.slot, w, k.extra);
        state_[k.slot] |= kWall;
        kicked_.push_back(std::move(k));
        result_.count("kickbacks");
    }

    ir::Circuit& c_;
    const CombineRule& rule_;
    PassResult& result_;
    RewriteLimits limits_;
    bool right_to_left_;
    uint32_t n_;
    RewriteBuffers::Lists& lists_;  ///< by wire: entries in placement order
    std::vector<uint8_t>& state_;   ///< by position: kLive, kWall, kStale
    std::vector<PendingKick> kicked_;  ///< kickback ops, each following the op placed at its slot
    std::vector<uint32_t> wires_, added_, mover_wires_;
    std::vector<uint32_t> cursors_, ends_, masks_;
    std::vector<const WireEntry*> slots_;
    std::vector<WireRole> roles_;
    Op moved_;  ///< the mover once rewritten (storage reused by every walk)
    Op kick_mover_;  ///< the rewritten mover as it was when the walk's kickback was priced
    std::unordered_set<uint32_t> broken_;
    uint32_t fence_ = kNone;
    ir::Angle global_;
    bool fired_ = false;
};

}  // namespace

bool rewrite_backwards(ir::Circuit& c, const CombineRule& rule, PassResult& result, RewriteBuffers& buffers,
                       RewriteLimits limits, bool right_to_left) {
    return Rewriter(c, rule, result, *buffers.lists, limits, right_to_left).run();
}

}  // namespace whittle::passes
