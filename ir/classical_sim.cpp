// Bit-parallel simulation of reversible (X-type) circuits.
#include "ir/classical_sim.h"

#include "ir/error.h"

namespace whittle::ir {

bool is_classical(const Circuit& c) {
    for (const Op& op : c.ops)
        if (!op.is_xtype() && op.kind != OpKind::Barrier) return false;
    return true;
}

void simulate_bits(const Circuit& c, std::vector<uint64_t>& wires) {
    WHITTLE_ASSERT(wires.size() >= c.num_qubits() && "one word per wire");
    for (const Op& op : c.ops) {
        if (op.kind == OpKind::Barrier) continue;
        uint64_t on = ~uint64_t(0);
        for (Lit l : op.controls) on &= l.positive() ? wires[l.wire()] : ~wires[l.wire()];
        if (op.kind == OpKind::X && !op.is_conditioned()) {
            wires[op.target] ^= on;
        } else if (op.kind == OpKind::Swap && !op.is_conditioned()) {
            const uint64_t diff = (wires[op.target] ^ wires[op.target2]) & on;
            wires[op.target] ^= diff;
            wires[op.target2] ^= diff;
        } else {
            throw InternalError("internal error: simulate_bits: not an X-type op");
        }
    }
}

uint64_t simulate_basis(const Circuit& c, uint64_t input) {
    WHITTLE_ASSERT(c.num_qubits() <= 64 && "simulate_basis handles up to 64 wires");
    std::vector<uint64_t> wires(c.num_qubits());
    for (uint32_t w = 0; w < c.num_qubits(); ++w) wires[w] = (input >> w) & 1 ? ~uint64_t(0) : 0;
    simulate_bits(c, wires);
    uint64_t out = 0;
    for (uint32_t w = 0; w < c.num_qubits(); ++w)
        if (wires[w] & 1) out |= uint64_t(1) << w;
    return out;
}

}  // namespace whittle::ir
