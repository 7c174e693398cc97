// Frame exchange of CNOT stretches between Hadamards (see hadamard_frames.h).
#include "tcount/hadamard_frames.h"

#include <algorithm>
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

/// A wire's ops between two H gates. Segments are numbered in the order the walk opens them (all
/// wires' first segments, then one per H in op order), so a second walk finds the same numbers.
struct Segment {
    uint32_t wire = 0;
    uint32_t prev = kNone;  ///< the segment before it on its wire (kNone: it starts at the circuit's start)
    uint32_t next = kNone;  ///< the segment after it (kNone: it ends at the circuit's end)
    bool ok = true;         ///< holds only CNOT, X, Z
    bool used = false;      ///< holds some op
    bool flipped = false;
};

uint32_t find(std::vector<uint32_t>& parent, uint32_t x) {
    while (parent[x] != x) x = parent[x] = parent[parent[x]];
    return x;
}

/// Walks the ops keeping each wire's current segment; calls on_bound(op index, segment before,
/// segment after) at each H and on_op(op index) at every other op, with cur[w] up to date.
template <class OnBound, class OnOp>
void walk(const ir::Circuit& c, std::vector<uint32_t>& cur, uint32_t& count, OnBound on_bound, OnOp on_op) {
    const uint32_t n = c.num_qubits();
    for (uint32_t w = 0; w < n; ++w) cur[w] = w;
    count = n;
    for (uint32_t i = 0; i < c.ops.size(); ++i) {
        const Op& op = c.ops[i];
        if (is_bound(op)) {
            const uint32_t before = cur[op.target];
            cur[op.target] = count++;
            on_bound(i, before, cur[op.target]);
            continue;
        }
        on_op(i);
    }
}

}  // namespace

size_t exchange_hadamard_frames(ir::Circuit& c) {
    const uint32_t n = c.num_qubits();
    std::vector<uint32_t> cur(n);
    std::vector<Segment> segs(n);
    for (uint32_t w = 0; w < n; ++w) segs[w].wire = w;
    std::vector<std::pair<uint32_t, uint32_t>> edges;  // segments joined by a CNOT
    std::vector<uint32_t> wires;
    uint32_t count = 0;
    bool any_h = false;
    walk(
        c, cur, count,
        [&](uint32_t, uint32_t before, uint32_t after) {
            any_h = true;
            segs.push_back({segs[before].wire, before, kNone, true, false, false});
            segs[before].next = after;
        },
        [&](uint32_t i) {
            const Op& op = c.ops[i];
            if (is_cnot(op)) {
                const uint32_t a = cur[op.controls[0].wire()], b = cur[op.target];
                segs[a].used = segs[b].used = true;
                edges.emplace_back(a, b);
                return;
            }
            if (is_not(op) || is_z(op)) {
                segs[op.kind == OpKind::X ? cur[op.target] : cur[op.controls[0].wire()]].used = true;
                return;
            }
            wires.clear();
            op.wires(wires);
            for (uint32_t w : wires) {
                segs[cur[w]].used = true;
                segs[cur[w]].ok = false;
            }
        });
    if (!any_h) return 0;
    const uint32_t ns = uint32_t(segs.size());
    // Partners by segment (CSR), then: a segment joined by a CNOT to one that cannot change frame
    // cannot either.
    std::vector<uint32_t> start(ns + 1, 0), partner(2 * edges.size());
    for (const auto& [a, b] : edges) {
        ++start[a + 1];
        ++start[b + 1];
    }
    std::partial_sum(start.begin(), start.end(), start.begin());
    {
        std::vector<uint32_t> fill(start.begin(), start.end() - 1);
        for (const auto& [a, b] : edges) {
            partner[fill[a]++] = b;
            partner[fill[b]++] = a;
        }
    }
    std::vector<uint32_t> work;
    for (uint32_t s = 0; s < ns; ++s)
        if (!segs[s].ok) work.push_back(s);
    while (!work.empty()) {
        const uint32_t s = work.back();
        work.pop_back();
        for (uint32_t k = start[s]; k < start[s + 1]; ++k)
            if (segs[partner[k]].ok) {
                segs[partner[k]].ok = false;
                work.push_back(partner[k]);
            }
    }
    // Components of the remaining used segments, each flipped as a whole or not at all, in order
    // of their first segment.
    std::vector<uint32_t> parent(ns);
    std::iota(parent.begin(), parent.end(), 0u);
    for (const auto& [a, b] : edges)
        if (segs[a].ok) parent[find(parent, a)] = find(parent, b);
    std::vector<uint32_t> order;
    for (uint32_t s = 0; s < ns; ++s)
        if (segs[s].ok && segs[s].used) order.push_back(s);
    if (order.empty()) return 0;
    std::vector<uint32_t> root(ns, kNone);
    for (uint32_t s : order) root[s] = find(parent, s);
    std::stable_sort(order.begin(), order.end(), [&](uint32_t a, uint32_t b) { return root[a] < root[b]; });
    // An H between segments p and q stays exactly when flipped(p) + flipped(q) is even (H^(1+k));
    // a flipped segment at the circuit's start or end adds an H there. Flip a component when that
    // lowers the count, given the components flipped before it.
    std::vector<uint8_t> in_comp(ns, 0);
    size_t removed = 0, added = 0;
    for (size_t lo = 0; lo < order.size();) {
        size_t hi = lo;
        while (hi < order.size() && root[order[hi]] == root[order[lo]]) ++hi;
        for (size_t k = lo; k < hi; ++k) in_comp[order[k]] = 1;
        int delta = 0;
        for (size_t k = lo; k < hi; ++k) {
            const Segment& s = segs[order[k]];
            if (s.prev == kNone) ++delta;
            else {  // the H on the left, once per H
                const bool other = segs[s.prev].flipped;
                const bool both = in_comp[s.prev] != 0;
                const int before = (int(other)) % 2 == 0, after = (int(other) + 1 + int(both)) % 2 == 0;
                delta += after - before;
            }
            if (s.next == kNone) ++delta;
            else if (!in_comp[s.next]) {  // the H on the right, unless counted as the next one's left
                const bool other = segs[s.next].flipped;
                delta += int((int(other) + 1) % 2 == 0) - int(int(other) % 2 == 0);
            }
        }
        if (delta < 0)
            for (size_t k = lo; k < hi; ++k) {
                segs[order[k]].flipped = true;
                added += (segs[order[k]].prev == kNone) + (segs[order[k]].next == kNone);
            }
        for (size_t k = lo; k < hi; ++k) in_comp[order[k]] = 0;
        lo = hi;
    }
    // Rewrite in place: drop the H gates with an odd number of flipped neighbours, turn the
    // flipped segments' gates, then the new H gates at the ends (fewer than the ones removed).
    size_t out = 0;
    walk(
        c, cur, count,
        [&](uint32_t i, uint32_t before, uint32_t after) {
            if ((int(segs[before].flipped) + int(segs[after].flipped)) % 2 == 1) {
                ++removed;
                return;
            }
            if (out != i) c.ops[out] = std::move(c.ops[i]);
            ++out;
        },
        [&](uint32_t i) {
            Op& op = c.ops[i];
            const uint32_t w = op.kind == OpKind::Phase ? op.controls[0].wire() : op.target;
            if (op.target != ir::kNoWire || op.kind == OpKind::Phase) {
                if (segs[cur[w]].flipped) {
                    const ir::SourceLoc loc = op.loc;
                    if (is_cnot(op)) op = Op::x(op.controls[0].wire(), {Lit::pos(op.target)});
                    else if (is_not(op)) op = Op::phase(ir::Angle::pi_times(1), {Lit::pos(op.target)});
                    else op = Op::x(op.controls[0].wire());
                    op.loc = loc;
                }
            }
            if (out != i) c.ops[out] = std::move(op);
            ++out;
        });
    std::vector<uint32_t> front, back;
    for (uint32_t s = 0; s < ns; ++s)
        if (segs[s].flipped) {
            if (segs[s].prev == kNone) front.push_back(segs[s].wire);
            if (segs[s].next == kNone) back.push_back(segs[s].wire);
        }
    std::sort(front.begin(), front.end());
    std::sort(back.begin(), back.end());
    c.ops.resize(out);  // shrinks: nothing allocated
    c.ops.resize(out + front.size());
    std::move_backward(c.ops.begin(), c.ops.begin() + std::ptrdiff_t(out), c.ops.end());
    for (size_t k = 0; k < front.size(); ++k) c.ops[k] = Op::one(OpKind::H, front[k]);
    for (uint32_t w : back) c.ops.push_back(Op::one(OpKind::H, w));
    return removed - added;
}

}  // namespace whittle::tcount
