// The multi-controlled X constructions, one family per file (mcx_clean.cpp, mcx_dirty.cpp, mcx_no_ancilla.cpp,
// parity_network.cpp).
#pragma once

#include <vector>

#include "lowering/control_lowerer.h"

namespace whittle::lowering {

/// V-chain with clean wires: w1 = l1&l2, w_i = w_{i-1}&l_{i+1}, target ^= w_last&l_n, then the
/// uncompute; with n-2 clean wires 2n-3 Toffolis (common practice). With fewer clean wires c, the
/// chain absorbs c+1 controls and the rest is one smaller MCX lowered by `lw`.
void mcx_v_chain(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& clean);

/// AND tree with n-2 clean wires: pairwise ANDs level by level (depth ~log2 n), 2n-3 Toffolis.
void mcx_and_tree(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& clean);

/// Barenco et al. 1995 (quant-ph/9503016) Lemma 7.2: n controls, n-2 dirty wires, 4(n-2) Toffolis;
/// the dirty wires come back to their input state.
void mcx_barenco_dirty(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target,
                       const std::vector<uint32_t>& dirty);

/// Barenco et al. 1995 Lemma 7.3: one borrowed wire d splits the controls into two halves:
/// MCX(L2+d -> t), MCX(L1 -> d), MCX(L2+d -> t), MCX(L1 -> d); each half borrows the other's wires.
void mcx_one_wire_split(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target, uint32_t d);

/// No free wire: Barenco et al. 1995 Lemma 7.5: C^nX = CV(l_n -> t) C^{n-1}X(-> l_n) CV+(l_n -> t)
/// C^{n-1}X(-> l_n) C^{n-1}V(-> t) with V = sqrt(X); the sub-ops borrow t or l_n.
void mcx_no_ancilla(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target);

/// Largest literal count the phase-polynomial form is offered for (its CNOTs grow as 2^k).
constexpr size_t kMaxParityNetworkLiterals = 8;

/// e^{i*a*AND(lits)} without work wires as a phase polynomial: AND(x_1..x_k) =
/// 2^{1-k} * sum over non-empty S of (-1)^{|S|+1} XOR_S(x) (an integer identity, checked over all
/// inputs in the tests), each parity phase placed on the highest wire of S while a Gray-code walk
/// of CNOTs from the lower wires runs through every subset: 2^k - 1 phases, 2^k - 2 CNOTs, no T
/// gate but angles a / 2^{k-1}. Negative literals are conjugated by X.
void mc_phase_parity_network(ControlLowerer& lw, const ir::LitVec& lits, ir::Angle a);

/// target ^= AND(controls) as H, the (n+1)-literal phase network with angle pi, H.
void mcx_parity_network(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target);

}  // namespace whittle::lowering
