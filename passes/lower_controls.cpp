// lower-controls: walks the ops with the clean-wire tracker and lets ControlLowerer pick per op.
#include "passes/lower_controls.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "lowering/ancilla_plan.h"
#include "lowering/control_lowerer.h"
#include "lowering/target_lowering.h"

namespace whittle::passes {
namespace {

using ir::OpKind;

constexpr size_t kMaxNotes = 200;

bool needs_lowering(const ir::Op& op) {
    const size_t nc = op.controls.size();
    switch (op.kind) {
    case OpKind::X: return nc >= 3;
    case OpKind::Phase: return nc >= 4 || (nc >= 2 && op.angle != ir::Angle::pi_times(1));
    case OpKind::Parity: return nc >= 2;
    case OpKind::Swap:
    case OpKind::H:
    case OpKind::Y:
    case OpKind::SX:
    case OpKind::SXdg:
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ:
    case OpKind::U: return nc >= 1;
    case OpKind::ISwap:
    case OpKind::XX:
    case OpKind::R:
    case OpKind::Measure:
    case OpKind::Reset:
    case OpKind::Barrier: return false;
    }
    return false;
}

/// Clean wires an op's best construction would use (the V-chain's n-2, else one).
size_t clean_wanted(const ir::Op& op) {
    const size_t nc = op.controls.size();
    if (op.kind == OpKind::X) return nc - 2;
    if (op.kind == OpKind::Swap) return nc >= 2 ? nc - 1 : 0;
    if (op.kind == OpKind::Phase) return nc >= 3 ? 1 : 0;
    return nc >= 2 ? 1 : 0;
}

/// Adds up to opts.extra_ancillas fresh clean wires when some op has fewer clean wires than wanted.
uint32_t add_work_wires(ir::Circuit& c, uint32_t limit) {
    if (limit == 0) return 0;
    lowering::CleanWireTracker tracker(c);
    size_t deficit = 0;
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        if (needs_lowering(op)) {
            wires.clear();
            op.wires(wires);
            size_t have = tracker.zero_wires().size();
            for (uint32_t w : wires)
                if (tracker.is_zero(w)) --have;
            const size_t want = clean_wanted(op);
            if (want > have) deficit = std::max(deficit, want - have);
        }
        tracker.step(i);
    }
    const uint32_t add = uint32_t(std::min<size_t>(deficit, limit));
    if (add == 0) return 0;
    std::string name = "work";
    for (int k = 1; c.find_register(name) >= 0; ++k) name = fmt::format("work{}", k);
    c.add_register(name, add, ir::Role::Clean);
    return add;
}

lowering::ControlStyle style_of(Metric m) {
    switch (m) {
    case Metric::TCount: return lowering::ControlStyle::TCount;
    case Metric::TwoQubit: return lowering::ControlStyle::TwoQubit;
    case Metric::Depth: return lowering::ControlStyle::Depth;
    }
    return lowering::ControlStyle::TCount;
}

}  // namespace

PassResult lower_controls(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (std::none_of(c.ops.begin(), c.ops.end(), needs_lowering)) return r;
    if (const uint32_t added = opts.work_wires_within_lives ? 0 : add_work_wires(c, opts.extra_ancillas)) {
        r.count("work-wires-added", added);
        r.notes.push_back(fmt::format("added {} clean work wire(s) (--extra-ancillas {})", added, opts.extra_ancillas));
    }
    lowering::CleanWireTracker tracker(c);
    std::vector<ir::Op> out;
    out.reserve(c.ops.size() + c.ops.size() / 4);
    ir::Angle phase = c.global_phase;
    lowering::OpSink sink(out, phase);
    // A rotation that is not Clifford+T costs its approximation in the T metric: typically
    // 3 log2(1/epsilon) T (Ross & Selinger 2016, arXiv:1403.2975; our mean at 1e-10 is 100).
    const int64_t rotation_t = int64_t(std::ceil(3 * std::log2(1 / std::max(opts.epsilon, 1e-300))));
    // On clifford+t such a rotation becomes a word of about two gates per T (measured: ~180 layers
    // per rotation at 1e-10); elsewhere it is one native gate.
    const int64_t rotation_depth = opts.target == ir::Target::CliffordT ? 2 * rotation_t : 1;
    lowering::ControlLowerer lw(c, sink, tracker.zero_wires(), style_of(opts.optimize_for), opts.target == ir::Target::Nct,
                                std::max<int64_t>(rotation_t, 1), rotation_depth);
    lw.prefer_wires_inside_lives(tracker);
    lw.only_within_lives(opts.work_wires_within_lives);
    size_t lowered = 0;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        if (!needs_lowering(op)) {
            out.push_back(op);
            tracker.step(i);
            continue;
        }
        sink.inherit(op);
        lw.reset_choice();
        ir::LitVec controls = op.controls;
        switch (op.kind) {
        case OpKind::X: lw.mcx(controls, op.target); break;
        case OpKind::Phase: lw.mc_phase(controls, op.angle); break;
        case OpKind::Parity: {
            const uint32_t last = controls.back().wire();
            for (size_t k = 0; k + 1 < controls.size(); ++k) sink.cx(controls[k], last);
            sink.phase(op.angle, {ir::Lit::pos(last)});
            for (size_t k = controls.size() - 1; k-- > 0;) sink.cx(controls[k], last);
            lw.set_choice(fmt::format("parity/{}: CNOT ladder", controls.size()));
            break;
        }
        case OpKind::Swap: lw.mc_swap(controls, op.target, op.target2); break;
        default: lw.mc_one_qubit(controls, op); break;
        }
        ++lowered;
        if (!lw.top_method().empty())
            r.constructions.push_back({lowering::describe_op(c, op, false), lw.top_method(), lw.top_choice(), op.loc,
                                       lw.top_cost().t, lw.top_cost().two_qubit});
        if (r.notes.size() < kMaxNotes)
            r.notes.push_back(fmt::format("op {} {}: {}", i, lowering::describe_op(c, op),
                                          lw.top_choice().empty() ? "direct" : lw.top_choice()));
        tracker.step(i);
    }
    if (lowered > kMaxNotes) r.notes.push_back(fmt::format("... and {} more ops", lowered - kMaxNotes));
    for (const auto& [name, n] : lw.used()) r.count(name, n);
    r.count("ops-lowered", int64_t(lowered));
    c.ops = std::move(out);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
