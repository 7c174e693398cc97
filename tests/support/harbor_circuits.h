// Small Harbor Logistics circuits built with the IR API, shared by the report and diagram tests.
#pragma once

#include "ir/circuit.h"

namespace whittle::testing {

/// Crane collision check: a compute/uncompute pair around a phase, an MCX with a negative control,
/// a parity alarm, one-qubit gates, a swap, a measurement with feed-forward and a barrier.
inline ir::Circuit crane_check() {
    using ir::Angle;
    using ir::Lit;
    using ir::Op;
    using ir::OpKind;
    ir::Circuit c;
    uint32_t crane = c.add_register("crane", 3, ir::Role::Data);
    uint32_t berth = c.add_register("berth", 2, ir::Role::Data);
    uint32_t flag = c.add_register("flag", 1, ir::Role::Data, true);
    uint32_t w = c.add_register("w", 1, ir::Role::Clean);
    uint32_t d = c.add_register("d", 1, ir::Role::Dirty, true);
    uint32_t m = c.add_creg("m", 1, true);
    uint32_t pair = c.new_pair_id();
    auto in_pair = [&](Op op, ir::PairHalf half) {
        op.pair = pair;
        op.half = half;
        return op;
    };
    c.ops.push_back(in_pair(Op::x(w, {Lit::pos(crane), Lit::neg(crane + 1)}), ir::PairHalf::Compute));
    c.ops.push_back(Op::phase(Angle::pi_times(1, 4), {Lit::pos(w), Lit::pos(berth)}));
    c.ops.push_back(Op::x(flag, {Lit::pos(crane + 2), Lit::neg(berth), Lit::pos(berth + 1)}));
    c.ops.push_back(Op::parity(Angle::pi_times(1, 4), {crane, berth + 1, flag}));
    c.ops.push_back(in_pair(Op::x(w, {Lit::pos(crane), Lit::neg(crane + 1)}), ir::PairHalf::Uncompute));
    c.ops.push_back(Op::one(OpKind::H, flag));
    c.ops.push_back(Op::phase(Angle::pi_times(1, 4), {Lit::pos(flag)}));
    c.ops.push_back(Op::one(OpKind::RZ, berth, Angle::pi_times(1, 8)));
    c.ops.push_back(Op::swap(crane, crane + 1));
    c.ops.push_back(Op::x(d, {Lit::pos(flag)}));
    c.ops.push_back(Op::measure(w, int32_t(c.cregs[m].first)));
    Op fix = Op::phase(Angle::pi_times(1), {Lit::pos(crane), Lit::pos(crane + 1)});
    fix.set_condition(int32_t(m), 1);
    c.ops.push_back(fix);
    Op barrier = Op::parity(Angle(), {crane, crane + 1, crane + 2});
    barrier.kind = OpKind::Barrier;
    c.ops.push_back(barrier);
    return c;
}

/// The Toffoli on (a, b; target c) in the 7-T, 6-CNOT, 2-H textbook form (Nielsen & Chuang,
/// Fig. 4.9; gate order recalled from memory, counts are the book's: 7 T/T†, 6 CNOT, 2 H).
inline ir::Circuit textbook_toffoli() {
    using ir::Angle;
    using ir::Lit;
    using ir::Op;
    ir::Circuit c;
    uint32_t q = c.add_register("q", 3, ir::Role::Data);
    const uint32_t a = q, b = q + 1, t = q + 2;
    auto cx = [&](uint32_t ctl, uint32_t tgt) { c.ops.push_back(Op::x(tgt, {Lit::pos(ctl)})); };
    auto tg = [&](uint32_t w, bool dagger) { c.ops.push_back(Op::phase(Angle::pi_times(dagger ? 7 : 1, 4), {Lit::pos(w)})); };
    auto h = [&](uint32_t w) { c.ops.push_back(Op::one(ir::OpKind::H, w)); };
    h(t); cx(b, t); tg(t, true); cx(a, t); tg(t, false); cx(b, t); tg(t, true); cx(a, t);
    tg(b, false); tg(t, false); h(t); cx(a, b); tg(a, false); tg(b, true); cx(a, b);
    return c;
}

}  // namespace whittle::testing
