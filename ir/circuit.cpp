// Circuit construction helpers, op inverses and the IR verifier.
#include "ir/circuit.h"

#include <utility>
#include <algorithm>

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::ir {

const char* role_name(Role r) {
    switch (r) {
    case Role::Data: return "qubit";
    case Role::Clean: return "ancilla";
    case Role::Dirty: return "borrow";
    }
    return "?";
}

const char* op_kind_name(OpKind k) {
    switch (k) {
    case OpKind::X: return "x";
    case OpKind::Phase: return "phase";
    case OpKind::Parity: return "parity";
    case OpKind::H: return "h";
    case OpKind::Y: return "y";
    case OpKind::SX: return "sx";
    case OpKind::SXdg: return "sxdg";
    case OpKind::RX: return "rx";
    case OpKind::RY: return "ry";
    case OpKind::RZ: return "rz";
    case OpKind::U: return "u";
    case OpKind::Swap: return "swap";
    case OpKind::ISwap: return "iswap";
    case OpKind::XX: return "xx";
    case OpKind::R: return "r";
    case OpKind::Measure: return "measure";
    case OpKind::Reset: return "reset";
    case OpKind::Barrier: return "barrier";
    }
    return "?";
}

Op Op::x(uint32_t target, LitVec controls) {
    Op op;
    op.kind = OpKind::X;
    op.target = target;
    op.controls = std::move(controls);
    return op;
}

Op Op::phase(Angle a, LitVec product) {
    Op op;
    op.kind = OpKind::Phase;
    op.angle = a;
    op.controls = std::move(product);
    return op;
}

Op Op::parity(Angle a, const std::vector<uint32_t>& wires) {
    Op op;
    op.kind = OpKind::Parity;
    op.angle = a;
    for (uint32_t w : wires) op.controls.push_back(Lit::pos(w));
    return op;
}

Op Op::one(OpKind k, uint32_t target, Angle a, LitVec controls) {
    Op op;
    op.kind = k;
    op.target = target;
    op.angle = a;
    op.controls = std::move(controls);
    return op;
}

Op Op::u(uint32_t target, Angle theta, Angle phi, Angle lambda) {
    Op op;
    op.kind = OpKind::U;
    op.target = target;
    op.angle = theta;
    op.set_phi(phi);
    op.set_lambda(lambda);
    return op;
}

Op Op::swap(uint32_t a, uint32_t b, LitVec controls) {
    Op op;
    op.kind = OpKind::Swap;
    op.target = a;
    op.target2 = b;
    op.controls = std::move(controls);
    return op;
}

Op Op::two(OpKind k, uint32_t a, uint32_t b, Angle angle) {
    Op op;
    op.kind = k;
    op.target = a;
    op.target2 = b;
    op.angle = angle;
    return op;
}

Op Op::measure(uint32_t target, int32_t cbit) {
    Op op;
    op.kind = OpKind::Measure;
    op.target = target;
    op.set_cbit(cbit);
    return op;
}

Op Op::reset(uint32_t target) {
    Op op;
    op.kind = OpKind::Reset;
    op.target = target;
    return op;
}

bool Op::is_diagonal() const {
    return kind == OpKind::Phase || kind == OpKind::Parity || kind == OpKind::RZ;
}

bool Op::is_xtype() const {
    return (kind == OpKind::X || kind == OpKind::Swap) && !is_conditioned();
}

std::vector<uint32_t> Op::wires() const {
    std::vector<uint32_t> w;
    wires(w);
    return w;
}

uint32_t Circuit::add_register(const std::string& name, uint32_t size, Role role, bool scalar) {
    Register r;
    r.name = name;
    r.first = uint32_t(qubits.size());
    r.size = size;
    r.role = role;
    r.scalar = scalar;
    uint32_t reg_index = uint32_t(registers.size());
    registers.push_back(r);
    for (uint32_t i = 0; i < size; ++i) qubits.push_back(Qubit{reg_index, i, role});
    return r.first;
}

uint32_t Circuit::add_creg(const std::string& name, uint32_t size, bool scalar) {
    ClassicalRegister r;
    r.name = name;
    r.first = num_cbits;
    r.size = size;
    r.scalar = scalar;
    num_cbits += size;
    cregs.push_back(r);
    return uint32_t(cregs.size() - 1);
}

std::string Circuit::wire_name(uint32_t wire) const {
    if (wire >= qubits.size()) return fmt::format("<wire {}>", wire);
    const Qubit& q = qubits[wire];
    const Register& r = registers[q.reg];
    if (r.scalar) return r.name;
    return fmt::format("{}[{}]", r.name, q.index);
}

int Circuit::find_register(std::string_view name) const {
    for (size_t i = 0; i < registers.size(); ++i)
        if (registers[i].name == name) return int(i);
    return -1;
}

int Circuit::find_creg(std::string_view name) const {
    for (size_t i = 0; i < cregs.size(); ++i)
        if (cregs[i].name == name) return int(i);
    return -1;
}

Circuit Circuit::empty_copy() const {
    Circuit c;
    c.registers = registers;
    c.qubits = qubits;
    c.cregs = cregs;
    c.num_cbits = num_cbits;
    c.files = files;
    c.next_pair_id = next_pair_id;
    return c;
}

namespace {

/// exp(-i*theta/2*P) has period 4*pi while angles are kept mod 2*pi: the stored -theta (2*pi - theta)
/// is minus the true inverse for every theta != 0. Under controls that sign is a phase of pi on the
/// controls, pushed here; without controls it is a global phase and is dropped.
void push_half_period_sign(const Op& op, std::vector<Op>& out) {
    if (op.controls.empty() || op.angle.is_zero()) return;
    Op sign = Op::phase(Angle::pi_times(1), op.controls);
    sign.loc = op.loc;
    sign.copy_condition(op);
    sign.pair = op.pair;
    sign.half = op.half == PairHalf::Compute ? PairHalf::Uncompute : op.half == PairHalf::Uncompute ? PairHalf::Compute : PairHalf::None;
    out.push_back(sign);
}

}  // namespace

void append_inverse(const Op& op, std::vector<Op>& out) {
    Op inv = op;
    if (op.half == PairHalf::Compute) inv.half = PairHalf::Uncompute;
    else if (op.half == PairHalf::Uncompute) inv.half = PairHalf::Compute;
    switch (op.kind) {
    case OpKind::X:
    case OpKind::H:
    case OpKind::Y:
    case OpKind::Swap:
    case OpKind::Barrier:
        out.push_back(inv);
        return;
    case OpKind::Phase:
    case OpKind::Parity:
        inv.angle = -op.angle;
        out.push_back(inv);
        return;
    case OpKind::RX:
    case OpKind::RY:
    case OpKind::RZ:
    case OpKind::XX:
        inv.angle = -op.angle;
        out.push_back(inv);
        push_half_period_sign(op, out);
        return;
    case OpKind::SX:
        inv.kind = OpKind::SXdg;
        out.push_back(inv);
        return;
    case OpKind::SXdg:
        inv.kind = OpKind::SX;
        out.push_back(inv);
        return;
    case OpKind::U:
        inv.angle = -op.angle;
        inv.set_phi(-op.lambda());
        inv.set_lambda(-op.phi());
        out.push_back(inv);
        push_half_period_sign(op, out);
        return;
    case OpKind::R:
        inv.angle = -op.angle;
        out.push_back(inv);
        push_half_period_sign(op, out);
        return;
    case OpKind::ISwap: {
        // iSWAP^dagger = (Z(x)I) iSWAP (Z(x)I): Z(x)I anticommutes with XX and YY (Z(x)Z would commute).
        Op z1 = Op::phase(Angle::pi_times(1), {Lit::pos(op.target)});
        z1.loc = op.loc;
        z1.copy_condition(op);
        out.push_back(z1);
        out.push_back(inv);
        out.push_back(z1);
        return;
    }
    case OpKind::Measure:
    case OpKind::Reset:
        throw UserError(fmt::format("'{}' has no inverse", op_kind_name(op.kind)), op.loc);
    }
}

namespace {

[[noreturn]] void bad(const Circuit& c, size_t index, const std::string& why) {
    (void)c;
    throw InternalError(fmt::format("internal error: IR verifier: op {}: {}", index, why));
}

}  // namespace

void verify(const Circuit& c) {
    const uint32_t n = c.num_qubits();
    std::vector<uint32_t> seen(n, 0);
    uint32_t stamp = 0;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const Op& op = c.ops[i];
        ++stamp;
        auto touch = [&](uint32_t w, const char* what) {
            if (w >= n) bad(c, i, fmt::format("{} wire {} out of range ({} qubits)", what, w, n));
            if (seen[w] == stamp) bad(c, i, fmt::format("wire {} used twice", c.wire_name(w)));
            seen[w] = stamp;
        };
        const bool has_target = op.kind != OpKind::Phase && op.kind != OpKind::Parity && op.kind != OpKind::Barrier;
        const bool has_target2 = op.kind == OpKind::Swap || op.kind == OpKind::ISwap || op.kind == OpKind::XX;
        if (has_target) touch(op.target, "target");
        else if (op.target != kNoWire) bad(c, i, "unexpected target");
        if (has_target2) touch(op.target2, "second target");
        else if (op.target2 != kNoWire) bad(c, i, "unexpected second target");
        for (Lit l : op.controls) touch(l.wire(), "control");
        const bool positive_only = op.kind == OpKind::Parity || op.kind == OpKind::Barrier;
        if (positive_only)
            for (Lit l : op.controls)
                if (!l.positive()) bad(c, i, "negative literal in a parity or barrier");
        const bool no_controls = op.kind == OpKind::ISwap || op.kind == OpKind::XX || op.kind == OpKind::R ||
                                 op.kind == OpKind::Measure || op.kind == OpKind::Reset;
        if (no_controls && !op.controls.empty()) bad(c, i, fmt::format("'{}' cannot have controls", op_kind_name(op.kind)));
        if ((op.kind == OpKind::Phase || op.kind == OpKind::Parity) && op.controls.empty())
            bad(c, i, "phase without wires (use Circuit::global_phase)");
        if (op.kind == OpKind::Measure && (op.cbit() < 0 || uint32_t(op.cbit()) >= c.num_cbits))
            bad(c, i, "measurement bit out of range");
        if (op.cond_reg() >= 0 && size_t(op.cond_reg()) >= c.cregs.size()) bad(c, i, "condition register out of range");
        if (op.half != PairHalf::None && op.pair == 0) bad(c, i, "pair half without a pair id");
    }
}

}  // namespace whittle::ir
