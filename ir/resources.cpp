// Resource counting in one pass over the ops, with per-wire layer counters for depth and T-depth.
#include "ir/resources.h"

#include <algorithm>
#include <utility>
#include <vector>

namespace whittle::ir {
namespace {

bool is_t_like(const Op& op) {
    if (op.kind == OpKind::Phase && op.controls.size() == 1) {
        int e = op.angle.eighths();
        return e >= 0 && (e % 2) == 1;
    }
    if ((op.kind == OpKind::RZ || op.kind == OpKind::Parity) && op.controls.size() <= 1) {
        if (op.kind == OpKind::Parity && op.controls.size() != 1) return false;
        int e = op.angle.eighths();
        return e >= 0 && (e % 2) == 1;
    }
    return false;
}

std::string controlled_prefix(size_t n) {
    if (n == 0) return "";
    if (n == 1) return "c";
    if (n == 2) return "cc";
    return "mc";
}

}  // namespace

std::string gate_name(const Op& op) {
    const size_t nc = op.controls.size();
    switch (op.kind) {
    case OpKind::X:
        if (nc == 0) return "x";
        if (nc == 1) return "cx";
        if (nc == 2) return "ccx";
        return "mcx";
    case OpKind::Phase: {
        int e = op.angle.eighths();
        if (nc == 1) {
            switch (e) {
            case 4: return "z";
            case 2: return "s";
            case 6: return "sdg";
            case 1: return "t";
            case 7: return "tdg";
            default: return "p";
            }
        }
        if (nc == 2) return e == 4 ? "cz" : "cp";
        if (nc == 3 && e == 4) return "ccz";
        return "mcphase";
    }
    case OpKind::Parity: return nc == 1 ? "p" : "parity";
    case OpKind::H: return controlled_prefix(nc) + "h";
    case OpKind::Y: return controlled_prefix(nc) + "y";
    case OpKind::SX: return controlled_prefix(nc) + "sx";
    case OpKind::SXdg: return controlled_prefix(nc) + "sxdg";
    case OpKind::RX: return controlled_prefix(nc) + "rx";
    case OpKind::RY: return controlled_prefix(nc) + "ry";
    case OpKind::RZ: return controlled_prefix(nc) + "rz";
    case OpKind::U: return controlled_prefix(nc) + "u";
    case OpKind::Swap: return controlled_prefix(nc) + "swap";
    case OpKind::ISwap: return "iswap";
    case OpKind::XX: return "xx";
    case OpKind::R: return "r";
    case OpKind::Measure: return "measure";
    case OpKind::Reset: return "reset";
    case OpKind::Barrier: return "barrier";
    }
    return "?";
}

namespace {

/// gate_name depends only on the kind, the control count (3 and 4-or-more are the last cases it
/// tells apart) and, for a Phase, its angle in eighths of pi (-1 when not a multiple of pi/4). Ops
/// are tallied under that key and each key is named once, so counting builds no string per op.
constexpr size_t kControlBuckets = 5;
constexpr size_t kAngleBuckets = 9;
constexpr size_t kKinds = size_t(OpKind::Barrier) + 1;

size_t name_key(const Op& op) {
    const size_t nc = std::min<size_t>(op.controls.size(), kControlBuckets - 1);
    const size_t e = op.kind == OpKind::Phase ? size_t(op.angle.eighths() + 1) : 0;
    return (size_t(op.kind) * kControlBuckets + nc) * kAngleBuckets + e;
}

}  // namespace

OpCounts op_counts(const Op& op) {
    OpCounts k;
    if (op.kind == OpKind::Barrier) return k;
    k.t = is_t_like(op);
    std::vector<uint32_t> wires;
    op.wires(wires);
    k.two_qubit = wires.size() == 2;
    const bool rotation = op.kind == OpKind::Phase || op.kind == OpKind::Parity || op.kind == OpKind::RX ||
                          op.kind == OpKind::RY || op.kind == OpKind::RZ;
    k.arbitrary_rotation = rotation && !op.angle.is_multiple_of_pi_over(4);
    return k;
}

Resources count_resources(const Circuit& c) {
    Resources r;
    r.qubits = c.num_qubits();
    for (const Qubit& q : c.qubits) {
        if (q.role == Role::Data) ++r.data_qubits;
        if (q.role == Role::Clean) ++r.clean_qubits;
        if (q.role == Role::Dirty) ++r.dirty_qubits;
    }
    std::vector<uint64_t> layer(c.num_qubits(), 0), tlayer(c.num_qubits(), 0), rlayer(c.num_qubits(), 0);
    // Live ranges of the work wires, as op positions (first touch, last touch); npos = untouched.
    constexpr uint64_t kUntouched = ~uint64_t(0);
    std::vector<uint64_t> first_use(c.num_qubits(), kUntouched), last_use(c.num_qubits(), 0);
    uint64_t position = 0;
    std::vector<uint64_t> by_key(kKinds * kControlBuckets * kAngleBuckets, 0);
    std::vector<const Op*> example(by_key.size(), nullptr);
    std::vector<uint32_t> wires;
    for (const Op& op : c.ops) {
        if (op.kind == OpKind::Barrier) continue;
        ++r.ops;
        const size_t key = name_key(op);
        if (by_key[key]++ == 0) example[key] = &op;
        wires.clear();
        op.wires(wires);
        const bool t = is_t_like(op);
        if (t) ++r.t_count;
        if (op.kind == OpKind::X && op.controls.size() == 1) ++r.cnot_count;
        if (op.kind == OpKind::X && op.controls.size() == 2) ++r.toffoli_count;
        if (op.kind == OpKind::X && op.controls.size() >= 3) ++r.mcx_count;
        if (op.kind == OpKind::Measure) ++r.measurements;
        if (wires.size() == 2) ++r.two_qubit_count;
        const bool rotation = op.kind == OpKind::Phase || op.kind == OpKind::Parity || op.kind == OpKind::RX ||
                              op.kind == OpKind::RY || op.kind == OpKind::RZ;
        const bool arbitrary = rotation && !op.angle.is_multiple_of_pi_over(4);
        if (arbitrary) ++r.non_clifford_rotations;
        uint64_t l = 0, tl = 0, rl = 0;
        for (uint32_t w : wires) {
            l = std::max(l, layer[w]);
            tl = std::max(tl, tlayer[w]);
            rl = std::max(rl, rlayer[w]);
            if (first_use[w] == kUntouched) first_use[w] = position;
            last_use[w] = position;
        }
        ++position;
        ++l;
        if (t) ++tl;
        if (arbitrary) ++rl;
        for (uint32_t w : wires) {
            layer[w] = l;
            tlayer[w] = tl;
            rlayer[w] = rl;
        }
        r.depth = std::max(r.depth, l);
        r.t_depth = std::max(r.t_depth, tl);
        r.rotation_depth = std::max(r.rotation_depth, rl);
    }
    // Peak live wires: a sweep over the work wires' ranges (+1 at the first touch, -1 after the
    // last) on top of the data wires, which are live throughout.
    std::vector<std::pair<uint64_t, int>> events;
    uint32_t always = 0;
    for (uint32_t w = 0; w < c.num_qubits(); ++w) {
        if (c.qubits[w].role == Role::Data) {
            ++always;
        } else if (first_use[w] != kUntouched) {
            events.emplace_back(first_use[w], 1);
            events.emplace_back(last_use[w] + 1, -1);
        }
    }
    std::sort(events.begin(), events.end());  // at one position the ends (-1) come before the starts
    int64_t live = 0, peak = 0;
    for (const auto& e : events) {
        live += e.second;
        peak = std::max(peak, live);
    }
    r.peak_live_qubits = always + uint32_t(peak);
    for (size_t key = 0; key < by_key.size(); ++key)
        if (by_key[key] != 0) r.gates[gate_name(*example[key])] += by_key[key];
    return r;
}

TAndCnotCount count_t_and_cnot(const Circuit& c) {
    TAndCnotCount r;
    for (const Op& op : c.ops) {
        if (op.kind == OpKind::Barrier) continue;
        if (is_t_like(op)) ++r.t_count;
        if (op.kind == OpKind::X && op.controls.size() == 1) ++r.cnot_count;
    }
    return r;
}

}  // namespace whittle::ir
