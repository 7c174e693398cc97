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
    {"U", 3, 1, true},     {"CX", 0, 2, true},
    // the header of arXiv:1707.03429
    {"u3", 3, 1, false},   {"u2", 2, 1, false},   {"u1", 1, 1, false},   {"cx", 0, 2, false},
    {"id", 0, 1, false},   {"x", 0, 1, false},    {"y", 0, 1, false},    {"z", 0, 1, false},
    {"h", 0, 1, false},    {"s", 0, 1, false},    {"sdg", 0, 1, false},  {"t", 0, 1, false},
    {"tdg", 0, 1, false},  {"rx", 1, 1, false},   {"ry", 1, 1, false},   {"rz", 1, 1, false},
    {"cz", 0, 2, false},   {"cy", 0, 2, false},   {"swap", 0, 2, false}, {"ch", 0, 2, false},
    {"ccx", 0, 3, false},  {"cswap", 0, 3, false}, {"crz", 1, 2, false}, {"cu1", 1, 2, false},
    {"cu3", 3, 2, false},
    // later additions to the header
    {"u0", 1, 1, false},   {"u", 3, 1, false},    {"p", 1, 1, false},    {"sx", 0, 1, false},
    {"sxdg", 0, 1, false}, {"cp", 1, 2, false},   {"crx", 1, 2, false},  {"cry", 1, 2, false},
    {"csx", 0, 2, false},  {"cu", 4, 2, false},   {"rxx", 1, 2, false},  {"rzz", 1, 2, false},
    {"c3x", 0, 4, false},  {"c4x", 0, 5, false},
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

const HeaderGate* find_header_gate(std::string_view name) {
    for (const HeaderGate& g : kGates)
        if (name == g.name) return &g;
    return nullptr;
}

Angle append_header_gate(const HeaderGate& g, const std::vector<Value>& p, const uint32_t* w, std::vector<Op>& out) {
    const std::string name = g.name;
    auto a = [&](size_t i) { return p[i].to_angle(); };
    auto one = [&](OpKind k) { out.push_back(Op::one(k, w[0])); return Angle(); };
    auto phase1 = [&](Angle t) { out.push_back(Op::phase(t, {Lit::pos(w[0])})); return Angle(); };
    auto ctl = [&](OpKind k) { out.push_back(Op::one(k, w[1], Angle(), {Lit::pos(w[0])})); return Angle(); };
    // u3(theta, phi, lambda): theta acts through cos/sin(theta/2), so it has period 4*pi as well.
    auto u3 = [&](const Value& theta, const Value& phi, const Value& lambda, LitVec controls) {
        Op op = Op::u(w[controls.size()], theta.to_angle(), phi.to_angle(), lambda.to_angle());
        op.controls = controls;
        return push_half_angle(out, std::move(op), theta);
    };

    if (name == "U" || name == "u3" || name == "u") return u3(p[0], p[1], p[2], {});
    if (name == "u2") return u3(Value::pi_times(1, 2), p[0], p[1], {});
    if (name == "u1" || name == "p") return phase1(a(0));
    if (name == "CX" || name == "cx") {
        out.push_back(Op::x(w[1], {Lit::pos(w[0])}));
        return Angle();
    }
    if (name == "id" || name == "u0") return Angle();
    if (name == "x") return one(OpKind::X);
    if (name == "y") return one(OpKind::Y);
    if (name == "h") return one(OpKind::H);
    if (name == "sx") return one(OpKind::SX);
    if (name == "sxdg") return one(OpKind::SXdg);
    if (name == "z") return phase1(Angle::pi_times(1));
    if (name == "s") return phase1(Angle::pi_times(1, 2));
    if (name == "sdg") return phase1(Angle::pi_times(-1, 2));
    if (name == "t") return phase1(Angle::pi_times(1, 4));
    if (name == "tdg") return phase1(Angle::pi_times(-1, 4));
    if (name == "rx" || name == "ry" || name == "rz") {
        OpKind k = name == "rx" ? OpKind::RX : name == "ry" ? OpKind::RY : OpKind::RZ;
        return push_half_angle(out, Op::one(k, w[0], a(0)), p[0]);
    }
    if (name == "crx" || name == "cry" || name == "crz") {
        OpKind k = name == "crx" ? OpKind::RX : name == "cry" ? OpKind::RY : OpKind::RZ;
        return push_half_angle(out, Op::one(k, w[1], a(0), {Lit::pos(w[0])}), p[0]);
    }
    if (name == "cz") {
        out.push_back(Op::phase(Angle::pi_times(1), {Lit::pos(w[0]), Lit::pos(w[1])}));
        return Angle();
    }
    if (name == "cu1" || name == "cp") {
        out.push_back(Op::phase(a(0), {Lit::pos(w[0]), Lit::pos(w[1])}));
        return Angle();
    }
    if (name == "cy") return ctl(OpKind::Y);
    if (name == "ch") return ctl(OpKind::H);
    if (name == "csx") return ctl(OpKind::SX);
    if (name == "swap") {
        out.push_back(Op::swap(w[0], w[1]));
        return Angle();
    }
    if (name == "cswap") {
        out.push_back(Op::swap(w[1], w[2], {Lit::pos(w[0])}));
        return Angle();
    }
    if (name == "ccx" || name == "c3x" || name == "c4x") {
        LitVec controls;
        for (uint32_t i = 0; i + 1 < g.num_qubits; ++i) controls.push_back(Lit::pos(w[i]));
        out.push_back(Op::x(w[g.num_qubits - 1], controls));
        return Angle();
    }
    if (name == "cu3") {
        // The header body: u1((lambda-phi)/2) t; cx c,t; u3(-theta/2,0,-(phi+lambda)/2) t; cx c,t;
        // u3(theta/2,phi,0) t. With control 0 it is the identity, with control 1 it is
        // Rz(phi) Ry(theta) Rz(lambda) = e^{-i(phi+lambda)/2} u3(theta,phi,lambda).
        Angle gp = u3(p[0], p[1], p[2], {Lit::pos(w[0])});
        out.push_back(Op::phase((-half(p[1] + p[2])).to_angle(), {Lit::pos(w[0])}));
        return gp;
    }
    if (name == "cu") {
        // cu(theta,phi,lambda,gamma) = controlled e^{i gamma} u3(theta,phi,lambda).
        Angle gp = u3(p[0], p[1], p[2], {Lit::pos(w[0])});
        if (!p[3].is_zero()) out.push_back(Op::phase(a(3), {Lit::pos(w[0])}));
        return gp;
    }
    if (name == "rxx") return push_half_angle(out, Op::two(OpKind::XX, w[0], w[1], a(0)), p[0]);
    if (name == "rzz") {
        // exp(-i theta/2 Z(x)Z) = e^{-i theta/2} e^{i theta (a xor b)}
        out.push_back(Op::parity(a(0), {w[0], w[1]}));
        return (-half(p[0])).to_angle();
    }
    WHITTLE_ASSERT(false && "header gate without a mapping");
    return Angle();
}

}  // namespace whittle::frontend::qasm2
