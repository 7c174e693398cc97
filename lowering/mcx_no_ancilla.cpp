// MCX with no free wire: Barenco et al. 1995 (quant-ph/9503016) Lemma 7.5, controlled-sqrt(X) recursion.
#include "lowering/mcx_constructions.h"

namespace whittle::lowering {

void mcx_no_ancilla(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target) {
    const size_t n = controls.size();
    const ir::Lit last = controls[n - 1];
    const uint32_t lw_wire = last.wire();
    ir::LitVec rest(controls.begin(), controls.end() - 1);
    // The last control becomes a target below: make it a positive literal first.
    if (!last.positive()) lw.sink().x(lw_wire);
    const ir::Op v = ir::Op::one(ir::OpKind::SX, target);
    const ir::Op vdg = ir::Op::one(ir::OpKind::SXdg, target);
    const ir::LitVec one{ir::Lit::pos(lw_wire)};
    // V on t with exponent l - (l xor A) + A = 2*l*A, A = AND(rest): V^2 = X exactly when all hold.
    // The MCX into the last control borrows t; the final controlled-V borrows the last control.
    lw.mc_one_qubit(one, v);
    lw.mcx(rest, lw_wire);
    lw.mc_one_qubit(one, vdg);
    lw.mcx(rest, lw_wire);
    lw.mc_one_qubit(rest, v);
    if (!last.positive()) lw.sink().x(lw_wire);
}

}  // namespace whittle::lowering
