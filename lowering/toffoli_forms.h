// Toffoli and CCZ in Clifford+T: the exact forms, the relative-phase form, the temporary AND and its measured erase.
#pragma once

#include "ir/circuit.h"
#include "lowering/op_sink.h"

namespace whittle::lowering {

/// Toffoli (t ^= a & b, positive controls) in 7 T and 6 CNOT (T-count 7 optimal: Gosset,
/// Kliuchnikov, Mosca, Russo 2014, arXiv:1308.4134; CNOT count 6 optimal: Shende & Markov 2009,
/// arXiv:0803.2316; the circuit is the textbook one, Nielsen & Chuang Fig. 4.9).
void toffoli_7t(OpSink& s, uint32_t a, uint32_t b, uint32_t t);
/// CCZ on three wires: the same phase network without the target's Hadamards.
void ccz_7t(OpSink& s, uint32_t a, uint32_t b, uint32_t c);
/// T-depth 3 forms (Amy, Maslov, Mosca, Roetteler 2013, arXiv:1206.0758): the seven phase terms in
/// three layers {a,b,c}, {a^b^c, a^b, a^c}, {b^c}; 7 T, 8 CNOT in this layout.
void toffoli_tdepth3(OpSink& s, uint32_t a, uint32_t b, uint32_t t);
void ccz_tdepth3(OpSink& s, uint32_t a, uint32_t b, uint32_t c);
/// Relative-phase Toffoli: 4 T, 3 CNOT (Maslov 2016, arXiv:1508.03273). Equals CZ(a,t) * Toffoli *
/// CS^dagger(a,b): a Toffoli times a diagonal, so it may replace both halves of a compute/uncompute
/// pair whose middle uses a, b, t only as controls or in diagonal ops. `inverse` gives the dagger.
void toffoli_relative_phase(OpSink& s, uint32_t a, uint32_t b, uint32_t t, bool inverse);
/// Temporary logical AND into t known to be |0>: 4 T (Gidney 2018, arXiv:1709.06648): t = a & b exactly.
void temporary_and(OpSink& s, uint32_t a, uint32_t b, uint32_t t);
/// Measured erase of t = a & b: H t, measure t into `cbit` of scalar register `creg`; on 1 a CZ(a,b)
/// and an X that returns t to |0>. 0 T (Gidney 2018; Jones 2013, arXiv:1212.5069).
void measured_erase(OpSink& s, uint32_t a, uint32_t b, uint32_t t, int32_t creg, int32_t cbit);

}  // namespace whittle::lowering
