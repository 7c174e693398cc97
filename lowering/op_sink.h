// OpSink: appends ops that inherit one source op's location and classical condition (used by every construction).
#pragma once

#include <vector>

#include "ir/circuit.h"
#include "ir/gate_matrix.h"

namespace whittle::lowering {

/// Where a construction writes its ops. Every op it appends carries the location and the classical
/// condition of the op being lowered, so reports and feed-forward survive the decomposition.
class OpSink {
public:
    OpSink(std::vector<ir::Op>& out, ir::Angle& global_phase) : out_(&out), global_phase_(&global_phase) {}
    /// Takes location and condition from `origin` (pair tags are not copied).
    void inherit(const ir::Op& origin);

    void push(ir::Op op);
    void x(uint32_t target, ir::LitVec controls = {}) { push(ir::Op::x(target, std::move(controls))); }
    void cx(ir::Lit control, uint32_t target) { push(ir::Op::x(target, {control})); }
    void h(uint32_t w) { push(ir::Op::one(ir::OpKind::H, w)); }
    /// e^{i*a*AND(lits)}; nothing for a zero angle.
    void phase(ir::Angle a, ir::LitVec lits);
    void one(ir::OpKind k, uint32_t w, ir::Angle a = {});
    /// A Toffoli (or CNOT) tagged as one half of a compute/uncompute pair.
    void paired_x(uint32_t target, ir::LitVec controls, uint32_t pair, ir::PairHalf half);
    /// Adds to the circuit's global phase (only when the source op is unconditioned: a phase on one
    /// classical branch is not observable and would be wrong on the other branch).
    void add_global_phase(ir::Angle a);
    /// An arbitrary one-qubit unitary as Rz(a) Ry(b) Rz(c) with exact angles where they snap.
    void unitary(uint32_t w, const ir::Mat2& m);

    std::vector<ir::Op>& out() { return *out_; }
    const ir::SourceLoc& loc() const { return loc_; }

private:
    std::vector<ir::Op>* out_;
    ir::Angle* global_phase_;
    ir::SourceLoc loc_;
    int32_t cond_reg_ = -1;
    uint64_t cond_value_ = 0;
};

}  // namespace whittle::lowering
