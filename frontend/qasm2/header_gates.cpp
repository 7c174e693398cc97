// OpenQASM 2.0 header gates mapped to the high-level ops they are (ccx is a 2-control X, cu1 a
// controlled phase, ...), with exact angles and exact controlled phases.
#include "frontend/qasm2/header_gates.h"

#include <cmath>
#include <string>

#include "ir/error.h"

namespace whittle::frontend::qasm2 {
namespace {

using ir::Angle;
using ir::Lit;
using ir::LitVec;
using ir::Op;
using ir::OpKind;

const std::vector<HeaderGate> kGates = {
    {GateId::U, "U", 3, 1, true}, {GateId::CX, "CX", 0, 2, true},
    // the header of arXiv:1707.03429
    {GateId::u3, "u3", 3, 1, false}, {GateId::u2, "u2", 2, 1, false}, {GateId::u1, "u1", 1, 1, false},
    {GateId::cx, "cx", 0, 2, false}, {GateId::id, "id", 0, 1, false}, {GateId::x, "x", 0, 1, false},
    {GateId::y, "y", 0, 1, false}, {GateId::z, "z", 0, 1, false}, {GateId::h, "h", 0, 1, false},
    {GateId::s, "s", 0, 1, false}, {GateId::sdg, "sdg", 0, 1, false}, {GateId::t, "t", 0, 1, false},
    {GateId::tdg, "tdg", 0, 1, false}, {GateId::rx, "rx", 1, 1, false}, {GateId::ry, "ry", 1, 1, false},
    {GateId::rz, "rz", 1, 1, false}, {GateId::cz, "cz", 0, 2, false}, {GateId::cy, "cy", 0, 2, false},
    {GateId::swap, "swap", 0, 2, false}, {GateId::ch, "ch", 0, 2, false}, {GateId::ccx, "ccx", 0, 3, false},
    {GateId::cswap, "cswap", 0, 3, false}, {GateId::crz, "crz", 1, 2, false}, {GateId::cu1, "cu1", 1, 2, false},
    {GateId::cu3, "cu3", 3, 2, false},
    // later additions to the header
    {GateId::u0, "u0", 1, 1, false}, {GateId::u, "u", 3, 1, false}, {GateId::p, "p", 1, 1, false},
    {GateId::sx, "sx", 0, 1, false}, {GateId::sxdg, "sxdg", 0, 1, false}, {GateId::cp, "cp", 1, 2, false},
    {GateId::crx, "crx", 1, 2, false}, {GateId::cry, "cry", 1, 2, false}, {GateId::csx, "csx", 0, 2, false},
    {GateId::cu, "cu", 4, 2, false}, {GateId::rxx, "rxx", 1, 2, false}, {GateId::rzz, "rzz", 1, 2, false},
    {GateId::c3x, "c3x", 0, 4, false}, {GateId::c4x, "c4x", 0, 5, false},
};

constexpr double kTwoPi = 6.283185307179586476925286766559;

/// exp(-i*theta/2*P) has period 4*pi but Angle keeps theta mod 2*pi: true when reducing theta into
/// [0, 2*pi) changes the gate's sign (theta lies in [2*pi*(2k+1), 2*pi*(2k+2))).
bool half_angle_flips(const Value& theta) {
    if (theta.kind() == Value::Kind::PiRational) {
        // theta = (num/den)*pi: the number of whole turns is floor(num / (2*den)).
        __int128 n = theta.num(), d = __int128(2) * theta.den();
        __int128 turns = n / d - ((n % d != 0 && n < 0) ? 1 : 0);
        return (turns % 2) != 0;
    }
    double turns = std::floor(theta.to_double() / kTwoPi);
    return std::fmod(turns, 2.0) != 0.0;
}

/// A one-target op whose angle acts as exp(-i*theta/2*...): fixes the sign lost by reducing theta.
Angle push_half_angle(std::vector<Op>& out, Op op, const Value& theta) {
    bool flip = half_angle_flips(theta);
    LitVec controls = op.controls;
    out.push_back(std::move(op));
    if (!flip) return Angle();
    if (controls.empty()) return Angle::pi_times(1);
    out.push_back(Op::phase(Angle::pi_times(1), controls));
    return Angle();
}

Value half(const Value& v) { return v / Value::rational(2); }

}  // namespace

const std::vector<HeaderGate>& header_gates() { return kGates; }

// GateId lists the 2017 header's gates first (as the table does), cu3 last among them.
bool in_2017_header(GateId id) { return id <= GateId::cu3; }

const HeaderGate* find_header_gate(std::string_view name) {
    for (const HeaderGate& g : kGates)
        if (name == g.name) return &g;
    return nullptr;
}

Angle append_header_gate(const HeaderGate& g, const std::vector<Value>& p, const uint32_t* w, std::vector<Op>& out) {
    auto a = [&](size_t i) { return p[i].to_angle(); };
    // The common one- and two-wire gates are built in place in `out` (no temporary op to copy).
    auto fresh = [&](OpKind k) -> Op& {
        Op& op = out.emplace_back();
        op.kind = k;
        return op;
    };
    auto one = [&](OpKind k) {
        fresh(k).target = w[0];
        return Angle();
    };
    auto phase1 = [&](Angle t) {
        Op& op = fresh(OpKind::Phase);
        op.angle = t;
        op.controls.push_back(Lit::pos(w[0]));
        return Angle();
    };
    auto ctl = [&](OpKind k) { out.push_back(Op::one(k, w[1], Angle(), {Lit::pos(w[0])})); return Angle(); };
    // u3(theta, phi, lambda): theta acts through cos/sin(theta/2), so it has period 4*pi as well.
    auto u3 = [&](const Value& theta, const Value& phi, const Value& lambda, LitVec controls) {
        Op op = Op::u(w[controls.size()], theta.to_angle(), phi.to_angle(), lambda.to_angle());
        op.controls = controls;
        return push_half_angle(out, std::move(op), theta);
    };

    switch (g.id) {
    case GateId::U: case GateId::u3: case GateId::u: return u3(p[0], p[1], p[2], {});
    case GateId::u2: return u3(Value::pi_times(1, 2), p[0], p[1], {});
    case GateId::u1: case GateId::p: return phase1(a(0));
    case GateId::CX: case GateId::cx: {
        Op& op = fresh(OpKind::X);
        op.target = w[1];
        op.controls.push_back(Lit::pos(w[0]));
        return Angle();
    }
    case GateId::id: case GateId::u0: return Angle();
    case GateId::x: return one(OpKind::X);
    case GateId::y: return one(OpKind::Y);
    case GateId::h: return one(OpKind::H);
    case GateId::sx: return one(OpKind::SX);
    case GateId::sxdg: return one(OpKind::SXdg);
    case GateId::z: return phase1(Angle::pi_times(1));
    case GateId::s: return phase1(Angle::pi_times(1, 2));
    case GateId::sdg: return phase1(Angle::pi_times(-1, 2));
    case GateId::t: return phase1(Angle::pi_times(1, 4));
    case GateId::tdg: return phase1(Angle::pi_times(-1, 4));
    case GateId::rx: return push_half_angle(out, Op::one(OpKind::RX, w[0], a(0)), p[0]);
    case GateId::ry: return push_half_angle(out, Op::one(OpKind::RY, w[0], a(0)), p[0]);
    case GateId::rz: return push_half_angle(out, Op::one(OpKind::RZ, w[0], a(0)), p[0]);
    case GateId::crx: return push_half_angle(out, Op::one(OpKind::RX, w[1], a(0), {Lit::pos(w[0])}), p[0]);
    case GateId::cry: return push_half_angle(out, Op::one(OpKind::RY, w[1], a(0), {Lit::pos(w[0])}), p[0]);
    case GateId::crz: return push_half_angle(out, Op::one(OpKind::RZ, w[1], a(0), {Lit::pos(w[0])}), p[0]);
    case GateId::cz:
        out.push_back(Op::phase(Angle::pi_times(1), {Lit::pos(w[0]), Lit::pos(w[1])}));
        return Angle();
    case GateId::cu1: case GateId::cp:
        out.push_back(Op::phase(a(0), {Lit::pos(w[0]), Lit::pos(w[1])}));
        return Angle();
    case GateId::cy: return ctl(OpKind::Y);
    case GateId::ch: return ctl(OpKind::H);
    case GateId::csx: return ctl(OpKind::SX);
    case GateId::swap:
        out.push_back(Op::swap(w[0], w[1]));
        return Angle();
    case GateId::cswap:
        out.push_back(Op::swap(w[1], w[2], {Lit::pos(w[0])}));
        return Angle();
    case GateId::ccx: case GateId::c3x: case GateId::c4x: {
        Op& op = fresh(OpKind::X);
        op.target = w[g.num_qubits - 1];
        for (uint32_t i = 0; i + 1 < g.num_qubits; ++i) op.controls.push_back(Lit::pos(w[i]));
        return Angle();
    }
    case GateId::cu3: {
        // The header body: u1((lambda-phi)/2) t; cx c,t; u3(-theta/2,0,-(phi+lambda)/2) t; cx c,t;
        // u3(theta/2,phi,0) t. With control 0 it is the identity, with control 1 it is
        // Rz(phi) Ry(theta) Rz(lambda) = e^{-i(phi+lambda)/2} u3(theta,phi,lambda).
        Angle gp = u3(p[0], p[1], p[2], {Lit::pos(w[0])});
        out.push_back(Op::phase((-half(p[1] + p[2])).to_angle(), {Lit::pos(w[0])}));
        return gp;
    }
    case GateId::cu: {
        // cu(theta,phi,lambda,gamma) = controlled e^{i gamma} u3(theta,phi,lambda).
        Angle gp = u3(p[0], p[1], p[2], {Lit::pos(w[0])});
        if (!p[3].is_zero()) out.push_back(Op::phase(a(3), {Lit::pos(w[0])}));
        return gp;
    }
    case GateId::rxx: return push_half_angle(out, Op::two(OpKind::XX, w[0], w[1], a(0)), p[0]);
    case GateId::rzz:
        // exp(-i theta/2 Z(x)Z) = e^{-i theta/2} e^{i theta (a xor b)}
        out.push_back(Op::parity(a(0), {w[0], w[1]}));
        return (-half(p[0])).to_angle();
    }
    WHITTLE_ASSERT(false && "header gate without a mapping");
    return Angle();
}

}  // namespace whittle::frontend::qasm2
