// drop-idle-wires: removes untouched work wires (whole registers, or a register's idle tail).
#include "passes/drop_idle_wires.h"

#include <vector>

#include "ir/error.h"

namespace whittle::passes {

PassResult drop_idle_wires(ir::Circuit& c, const PassOptions&) {
    PassResult r;
    const uint32_t n = c.num_qubits();
    std::vector<bool> used(n, false);
    std::vector<uint32_t> wires;
    for (const ir::Op& op : c.ops) {
        if (op.kind == ir::OpKind::Barrier) continue;
        wires.clear();
        op.wires(wires);
        for (uint32_t w : wires) used[w] = true;
    }
    // The size each register keeps: all of a data register; a work register up to its last used wire.
    std::vector<uint32_t> keep(c.registers.size());
    bool any = false;
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        const ir::Register& reg = c.registers[ri];
        uint32_t k = reg.size;
        if (reg.role != ir::Role::Data)
            while (k > 0 && !used[reg.first + k - 1] && c.qubits[reg.first + k - 1].role != ir::Role::Data) --k;
        keep[ri] = k;
        any = any || k != reg.size;
    }
    if (!any) return r;
    constexpr uint32_t kGone = ~uint32_t(0);
    std::vector<uint32_t> to(n, kGone);
    ir::Circuit out = c.empty_copy();
    out.global_phase = c.global_phase;
    out.registers.clear();
    out.qubits.clear();
    uint64_t dropped = 0;
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        const ir::Register& reg = c.registers[ri];
        dropped += reg.size - keep[ri];
        if (keep[ri] == 0) continue;
        const uint32_t first = out.add_register(reg.name, keep[ri], reg.role, reg.scalar && keep[ri] == 1);
        out.registers.back().loc = reg.loc;
        for (uint32_t i = 0; i < keep[ri]; ++i) {
            to[reg.first + i] = first + i;
            out.qubits[first + i].role = c.qubits[reg.first + i].role;
        }
    }
    out.ops.reserve(c.ops.size());
    for (ir::Op& op : c.ops) {
        ir::LitVec lits;
        for (ir::Lit l : op.controls) {
            if (to[l.wire()] == kGone) {
                WHITTLE_ASSERT(op.kind == ir::OpKind::Barrier && "drop-idle-wires: a used wire was dropped");
                continue;
            }
            lits.push_back(l.positive() ? ir::Lit::pos(to[l.wire()]) : ir::Lit::neg(to[l.wire()]));
        }
        if (op.kind == ir::OpKind::Barrier && lits.empty()) continue;
        op.controls = std::move(lits);
        if (op.target != ir::kNoWire) op.target = to[op.target];
        if (op.target2 != ir::kNoWire) op.target2 = to[op.target2];
        out.ops.push_back(std::move(op));
    }
    c = std::move(out);
    r.count("wires-dropped", int64_t(dropped));
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
