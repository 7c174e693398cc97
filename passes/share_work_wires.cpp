// share-work-wires: clean work wires with disjoint lives share output wires (interval colouring).
#include "passes/share_work_wires.h"

#include <algorithm>
#include <map>
#include <vector>

#include "ir/error.h"
#include "passes/work_wire_lives.h"

namespace whittle::passes {
namespace {

constexpr uint64_t kNone = ~uint64_t(0);
constexpr uint32_t kGone = ~uint32_t(0);

/// Slots tried for each new work wire before a fresh one is opened (the best fits first).
constexpr int kSlotTries = 32;

}  // namespace

PassResult share_work_wires(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    const uint32_t n = c.num_qubits();
    const std::vector<bool> reg_shared = movable_work_registers(c);
    std::vector<bool> shareable(n, false);
    bool any = false;
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        if (!reg_shared[ri]) continue;
        any = true;
        for (uint32_t i = 0; i < c.registers[ri].size; ++i) shareable[c.registers[ri].first + i] = true;
    }
    if (!any) return r;

    // An as-soon-as-possible layer schedule (barriers take no layer, as in ir::count_resources).
    const size_t m = c.ops.size();
    std::vector<uint32_t> layer(m, 0), wire_layer(n, 0);
    std::vector<uint64_t> first(n, kNone), last(n, kNone);
    std::vector<uint8_t> starts_a_life(m, 0);
    std::vector<uint32_t> wires;
    uint32_t depth = 0;
    for (size_t i = 0; i < m; ++i) {
        const ir::Op& op = c.ops[i];
        if (op.kind == ir::OpKind::Barrier) continue;
        wires.clear();
        op.wires(wires);
        uint32_t l = 0;
        for (uint32_t u : wires) l = std::max(l, wire_layer[u]);
        layer[i] = l;
        for (uint32_t u : wires) {
            wire_layer[u] = l + 1;
            if (!shareable[u]) continue;
            if (first[u] == kNone) {
                first[u] = i;
                starts_a_life[i] = 1;
            }
            last[u] = i;
        }
        if (!wires.empty()) depth = std::max(depth, l + 1);
    }
    // Where depth is not the metric, lives need only be disjoint in op order: positions serve as
    // the schedule (a wire taken over may then wait for its last occupant, and depth may grow).
    if (opts.optimize_for != ir::Metric::Depth) {
        for (size_t i = 0; i < m; ++i) layer[i] = uint32_t(i);
        std::fill(starts_a_life.begin(), starts_a_life.end(), 0);
    }
    // The op that starts a life moves as late as the ops after it on its wires allow (a constant
    // loaded by an X has no op before it and would otherwise sit in layer 0). The schedule stays
    // valid: each op is placed before every op that follows it on one of its wires.
    std::vector<uint64_t> next_op(n, kNone);
    for (size_t i = m; i-- > 0;) {
        const ir::Op& op = c.ops[i];
        if (op.kind == ir::OpKind::Barrier) continue;
        wires.clear();
        op.wires(wires);
        if (wires.empty()) continue;
        if (starts_a_life[i]) {
            uint32_t bound = depth - 1;
            for (uint32_t u : wires)
                if (next_op[u] != kNone) bound = std::min(bound, layer[next_op[u]] - 1);
            layer[i] = std::max(layer[i], bound);
        }
        for (uint32_t u : wires) next_op[u] = i;
    }

    // Interval colouring: lives by start, each into a slot whose last life ended before it starts,
    // both in layers and in op order (then the renamed circuit runs the same ops in the same order
    // and the schedule above still fits it: depth is unchanged).
    std::vector<uint32_t> lives;
    for (uint32_t w = 0; w < n; ++w)
        if (shareable[w] && first[w] != kNone) lives.push_back(w);
    std::sort(lives.begin(), lives.end(), [&](uint32_t a, uint32_t b) {
        return std::pair(layer[first[a]], first[a]) < std::pair(layer[first[b]], first[b]);
    });
    std::vector<uint32_t> slot_of(n, kGone);
    std::vector<uint64_t> slot_end_pos;
    std::multimap<uint32_t, uint32_t> slot_by_end_layer;
    for (uint32_t w : lives) {
        const uint32_t start_layer = layer[first[w]];
        uint32_t slot = kGone;
        auto it = slot_by_end_layer.lower_bound(start_layer);
        for (int tries = 0; it != slot_by_end_layer.begin() && tries < kSlotTries; ++tries) {
            --it;
            if (slot_end_pos[it->second] < first[w]) {
                slot = it->second;
                slot_by_end_layer.erase(it);
                break;
            }
        }
        if (slot == kGone) {
            slot = uint32_t(slot_end_pos.size());
            slot_end_pos.push_back(0);
        }
        slot_of[w] = slot;
        slot_end_pos[slot] = last[w];
        slot_by_end_layer.emplace(layer[last[w]], slot);
    }
    const uint32_t slots = uint32_t(slot_end_pos.size());
    if (slots >= lives.size()) return r;  // no two lives share; drop-idle-wires takes the idle wires

    // The output: the other registers as they were, then one register of shared work wires.
    ir::Circuit out = c.empty_copy();
    out.global_phase = c.global_phase;
    out.registers.clear();
    out.qubits.clear();
    std::vector<uint32_t> to(n, kGone);
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        const ir::Register& reg = c.registers[ri];
        if (reg_shared[ri]) continue;
        const uint32_t f = out.add_register(reg.name, reg.size, reg.role, reg.scalar);
        out.registers.back().loc = reg.loc;
        for (uint32_t i = 0; i < reg.size; ++i) {
            to[reg.first + i] = f + i;
            out.qubits[f + i].role = c.qubits[reg.first + i].role;
        }
    }
    // When the pool replaces one named register (and the `work` registers split-work-lives cut from
    // it) and has its size, it keeps that name, so the output still pairs with the source by name;
    // otherwise it is a fresh `work` register.
    std::vector<size_t> named;
    for (size_t ri = 0; ri < c.registers.size(); ++ri)
        if (reg_shared[ri] && !is_work_register_name(c.registers[ri].name)) named.push_back(ri);
    const std::string pool_name = named.size() == 1 && c.registers[named[0]].size == slots
                                      ? c.registers[named[0]].name
                                      : fresh_work_register_name(c, reg_shared);
    const uint32_t pool = out.add_register(pool_name, slots, ir::Role::Clean, false);
    for (uint32_t w : lives) to[w] = pool + slot_of[w];
    out.ops.reserve(c.ops.size());
    for (ir::Op& op : c.ops) {
        ir::LitVec lits;
        for (ir::Lit l : op.controls) {
            const uint32_t t = to[l.wire()];
            if (t == kGone || (op.kind == ir::OpKind::Barrier &&
                               std::any_of(lits.begin(), lits.end(), [&](ir::Lit x) { return x.wire() == t; }))) {
                WHITTLE_ASSERT(op.kind == ir::OpKind::Barrier && "share-work-wires: a used wire has no slot");
                continue;
            }
            lits.push_back(l.positive() ? ir::Lit::pos(t) : ir::Lit::neg(t));
        }
        if (op.kind == ir::OpKind::Barrier && lits.empty()) continue;
        // Literals stay sorted by wire (normalize's form; the renaming is not monotone).
        std::sort(lits.begin(), lits.end(), [](ir::Lit a, ir::Lit b) { return a.wire() < b.wire(); });
        op.controls = std::move(lits);
        if (op.target != ir::kNoWire) op.target = to[op.target];
        if (op.target2 != ir::kNoWire) op.target2 = to[op.target2];
        out.ops.push_back(std::move(op));
    }
    c = std::move(out);
    r.count("work-wires-before", int64_t(lives.size()));
    r.count("work-wires-after", int64_t(slots));
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
