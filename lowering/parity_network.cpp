// Multi-controlled phases and X as phase polynomials over a Gray-code CNOT network (no work wire, no Toffoli).
#include "lowering/mcx_constructions.h"

#include <bit>

namespace whittle::lowering {

void mc_phase_parity_network(ControlLowerer& lw, const ir::LitVec& lits, ir::Angle a) {
    const size_t k = lits.size();
    OpSink& s = lw.sink();
    for (ir::Lit l : lits)
        if (!l.positive()) s.x(l.wire());
    const ir::Angle unit = a.divided_by(int64_t(1) << (k - 1));
    // Parities whose highest wire is j: j's value runs through x_j ^ XOR_T(x) for every subset T of
    // the lower wires, one CNOT per Gray-code step, and one more CNOT restores it.
    for (size_t j = 0; j < k; ++j) {
        const uint32_t top = lits[j].wire();
        const uint64_t steps = uint64_t(1) << j;
        for (uint64_t i = 0; i < steps; ++i) {
            if (i > 0) {
                const uint64_t flipped = (i ^ (i >> 1)) ^ ((i - 1) ^ ((i - 1) >> 1));
                size_t bit = 0;
                while (!(flipped >> bit & 1)) ++bit;
                s.cx(ir::Lit::pos(lits[bit].wire()), top);
            }
            const uint64_t subset = i ^ (i >> 1);
            const bool odd = (std::popcount(subset) + 1) % 2 == 1;
            s.phase(odd ? unit : -unit, {ir::Lit::pos(top)});
        }
        if (j > 0) s.cx(ir::Lit::pos(lits[j - 1].wire()), top);
    }
    for (ir::Lit l : lits)
        if (!l.positive()) s.x(l.wire());
}

void mcx_parity_network(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target) {
    ir::LitVec lits = controls;
    lits.push_back(ir::Lit::pos(target));
    lw.sink().h(target);
    mc_phase_parity_network(lw, lits, ir::Angle::pi_times(1));
    lw.sink().h(target);
}

}  // namespace whittle::lowering
