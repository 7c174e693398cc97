// OpSink: location- and condition-preserving op emission.
#include "lowering/op_sink.h"

#include "synthesis/euler.h"

namespace whittle::lowering {

void OpSink::inherit(const ir::Op& origin) {
    loc_ = origin.loc;
    cond_reg_ = origin.cond_reg();
    cond_value_ = origin.cond_value();
}

void OpSink::push(ir::Op op) {
    op.loc = loc_;
    op.set_condition(cond_reg_, cond_value_);
    out_->push_back(std::move(op));
}

void OpSink::phase(ir::Angle a, ir::LitVec lits) {
    if (a.is_zero()) return;
    push(ir::Op::phase(a, std::move(lits)));
}

void OpSink::one(ir::OpKind k, uint32_t w, ir::Angle a) {
    const bool rotation = k == ir::OpKind::RX || k == ir::OpKind::RY || k == ir::OpKind::RZ;
    if (rotation && a.is_zero()) return;
    push(ir::Op::one(k, w, a));
}

void OpSink::paired_x(uint32_t target, ir::LitVec controls, uint32_t pair, ir::PairHalf half) {
    ir::Op op = ir::Op::x(target, std::move(controls));
    op.pair = pair;
    op.half = half;
    push(std::move(op));
}

void OpSink::add_global_phase(ir::Angle a) {
    if (cond_reg_ < 0) *global_phase_ += a;
}

void OpSink::unitary(uint32_t w, const ir::Mat2& m) {
    EulerAngles e = euler_zyz(m);
    add_global_phase(e.phase);
    one(ir::OpKind::RZ, w, e.c);
    one(ir::OpKind::RY, w, e.b);
    one(ir::OpKind::RZ, w, e.a);
}

}  // namespace whittle::lowering
