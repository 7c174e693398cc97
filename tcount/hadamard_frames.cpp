// Frame exchange of CNOT stretches between Hadamards (see hadamard_frames.h).
#include "tcount/hadamard_frames.h"

#include <numeric>

namespace whittle::tcount {
namespace {

using ir::Lit;
using ir::Op;
using ir::OpKind;

constexpr uint32_t kNone = 0xffffffffu;

bool is_plain(const Op& op) { return !op.is_conditioned() && op.pair == 0 && op.half == ir::PairHalf::None; }
bool is_bound(const Op& op) { return op.kind == OpKind::H && op.controls.empty() && is_plain(op); }
bool is_cnot(const Op& op) {
    return op.kind == OpKind::X && op.controls.size() == 1 && op.controls[0].positive() && is_plain(op);
}
bool is_not(const Op& op) { return op.kind == OpKind::X && op.controls.empty() && is_plain(op); }
bool is_z(const Op& op) {
    return op.kind == OpKind::Phase && op.controls.size() == 1 && op.controls[0].positive() &&
           op.angle == ir::Angle::pi_times(1) && is_plain(op);
}

struct Segment {
    uint32_t wire = 0;
    uint32_t left = kNone;   ///< the H before it (kNone: the circuit's start)
    uint32_t right = kNone;  ///< the H after it (kNone: the circuit's end)
    bool ok = true;          ///< holds only CNOT, X, Z
    bool used = false;       ///< holds some op
    bool flipped = false;
    std::vector<uint32_t> partners;  ///< segments joined to it by a CNOT
};

uint32_t find(std::vector<uint32_t>& parent, uint32_t x) {
    while (parent[x] != x) x = parent[x] = parent[parent[x]];
    return x;
}

}  // namespace

size_t exchange_hadamard_frames(ir::Circuit& c) {
    const uint32_t n = c.num_qubits();
    std::vector<Segment> segs;
    std::vector<uint32_t> cur(n, kNone);
    auto open = [&](uint32_t w, uint32_t left) {
        cur[w] = uint32_t(segs.size());
        segs.push_back({w, left, kNone, true, false, false, {}});
    };
    for (uint32_t w = 0; w < n; ++w) open(w, kNone);
    // Per op: the segment of its target and of its control (CNOT), its target's (X, Z).
    std::vector<uint32_t> seg_t(c.ops.size(), kNone), seg_c(c.ops.size(), kNone);
    std::vector<uint32_t> wires;
    bool any_h = false;
    for (uint32_t i = 0; i < c.ops.size(); ++i) {
        const Op& op = c.ops[i];
        if (is_bound(op)) {
            segs[cur[op.target]].right = i;
            open(op.target, i);
            any_h = true;
            continue;
        }
        if (is_cnot(op)) {
            const uint32_t a = cur[op.controls[0].wire()], b = cur[op.target];
            segs[a].used = segs[b].used = true;
            segs[a].partners.push_back(b);
            segs[b].partners.push_back(a);
            seg_c[i] = a;
            seg_t[i] = b;
            continue;
        }
        if (is_not(op) || is_z(op)) {
            const uint32_t s = op.kind == OpKind::X ? cur[op.target] : cur[op.controls[0].wire()];
            segs[s].used = true;
            seg_t[i] = s;
            continue;
        }
        wires.clear();
        op.wires(wires);
        for (uint32_t w : wires) {
            segs[cur[w]].used = true;
            segs[cur[w]].ok = false;
        }
    }
    if (!any_h) return 0;
    // A segment joined by a CNOT to one that cannot change frame cannot either.
    std::vector<uint32_t> work;
    for (uint32_t s = 0; s < segs.size(); ++s)
        if (!segs[s].ok) work.push_back(s);
    while (!work.empty()) {
        const uint32_t s = work.back();
        work.pop_back();
        for (uint32_t p : segs[s].partners)
            if (segs[p].ok) {
                segs[p].ok = false;
                work.push_back(p);
            }
    }
    // Components of the remaining segments; each flips as a whole or not at all.
    std::vector<uint32_t> parent(segs.size());
    std::iota(parent.begin(), parent.end(), 0u);
    for (uint32_t s = 0; s < segs.size(); ++s)
        if (segs[s].ok)
            for (uint32_t p : segs[s].partners) parent[find(parent, s)] = find(parent, p);
    std::vector<std::vector<uint32_t>> comps(segs.size());
    for (uint32_t s = 0; s < segs.size(); ++s)
        if (segs[s].ok && segs[s].used) comps[find(parent, s)].push_back(s);
    // An H with k flipped neighbour segments stays exactly when k is even (H^(1+k)); a flipped
    // segment ending at the circuit's start or end adds an H there. Flip a component when that
    // lowers the count, given the components flipped before it.
    std::vector<uint8_t> k(c.ops.size(), 0);
    size_t removed = 0, added = 0;
    for (const auto& comp : comps) {
        if (comp.empty()) continue;
        std::vector<std::pair<uint32_t, int>> touched;  // (H op, flipped neighbours it gains)
        int delta = 0;
        for (uint32_t s : comp)
            for (uint32_t h : {segs[s].left, segs[s].right}) {
                if (h == kNone) {
                    ++delta;
                    continue;
                }
                bool seen = false;
                for (auto& [op, g] : touched)
                    if (op == h) {
                        ++g;
                        seen = true;
                    }
                if (!seen) touched.emplace_back(h, 1);
            }
        for (const auto& [h, g] : touched) {
            const bool before = k[h] % 2 == 0, after = (k[h] + g) % 2 == 0;
            delta += int(after) - int(before);
        }
        if (delta >= 0) continue;
        for (const auto& [h, g] : touched) k[h] = uint8_t(k[h] + g);
        for (uint32_t s : comp) {
            segs[s].flipped = true;
            added += (segs[s].left == kNone) + (segs[s].right == kNone);
        }
    }
    bool any = false;
    for (const Segment& s : segs) any |= s.flipped;
    if (!any) return 0;
    std::vector<Op> out;
    out.reserve(c.ops.size() + added);
    for (const Segment& s : segs)
        if (s.flipped && s.left == kNone) out.push_back(Op::one(OpKind::H, s.wire));
    for (uint32_t i = 0; i < c.ops.size(); ++i) {
        Op& op = c.ops[i];
        if (is_bound(op) && k[i] % 2 == 1) {
            ++removed;
            continue;
        }
        const bool flip = seg_t[i] != kNone && segs[seg_t[i]].flipped;
        if (!flip) {
            out.push_back(std::move(op));
            continue;
        }
        if (is_cnot(op)) {
            Op r = Op::x(op.controls[0].wire(), {Lit::pos(op.target)});
            r.loc = op.loc;
            out.push_back(std::move(r));
        } else if (is_not(op)) {
            Op r = Op::phase(ir::Angle::pi_times(1), {Lit::pos(op.target)});
            r.loc = op.loc;
            out.push_back(std::move(r));
        } else {
            Op r = Op::x(op.controls[0].wire());
            r.loc = op.loc;
            out.push_back(std::move(r));
        }
    }
    for (const Segment& s : segs)
        if (s.flipped && s.right == kNone) out.push_back(Op::one(OpKind::H, s.wire));
    c.ops = std::move(out);
    return removed - added;
}

}  // namespace whittle::tcount
