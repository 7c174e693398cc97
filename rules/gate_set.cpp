// Gate vocabularies of the identity library: names, IR ops and numeric unitaries of symbolic gates.
#include "rules/gate_set.h"

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/gate_matrix.h"

namespace whittle::rules {
namespace {

using ir::Angle;
using ir::Lit;
using ir::OpKind;

}  // namespace

// In GateName order: gate_info indexes it by the name (tests/rules/library_test.cpp checks).
const GateInfo kGateTable[14] = {
    {GateName::X, "x", 1, 0, false, {0, 0}},        {GateName::SX, "sx", 1, 0, false, {0, 0}},
    {GateName::RZ, "rz", 1, 1, false, {1, 0}},      {GateName::RX, "rx", 1, 1, false, {1, 0}},
    {GateName::H, "h", 1, 0, false, {0, 0}},        {GateName::S, "s", 1, 0, false, {0, 0}},
    {GateName::Sdg, "sdg", 1, 0, false, {0, 0}},    {GateName::T, "t", 1, 0, false, {0, 0}},
    {GateName::Tdg, "tdg", 1, 0, false, {0, 0}},    {GateName::R, "r", 1, 2, false, {1, 2}},
    {GateName::CX, "cx", 2, 0, false, {0, 0}},      {GateName::CZ, "cz", 2, 0, true, {0, 0}},
    {GateName::ISwap, "iswap", 2, 0, true, {0, 0}}, {GateName::XX, "xx", 2, 1, true, {1, 0}},
};

namespace {

// Applies a 2x2 matrix on wire w to the rows of u (u := (m on w) * u).
void apply_1q(Eigen::MatrixXcd& u, const ir::Mat2& m, int w) {
    const Eigen::Index dim = u.rows();
    const Eigen::Index bit = Eigen::Index(1) << w;
    for (Eigen::Index i = 0; i < dim; ++i) {
        if (i & bit) continue;
        for (Eigen::Index c = 0; c < u.cols(); ++c) {
            const ir::Complex a = u(i, c), b = u(i | bit, c);
            u(i, c) = m(0, 0) * a + m(0, 1) * b;
            u(i | bit, c) = m(1, 0) * a + m(1, 1) * b;
        }
    }
}

// Applies a 4x4 matrix on (w0, w1), local index 2*bit(w0) + bit(w1).
void apply_2q(Eigen::MatrixXcd& u, const ir::Mat4& m, int w0, int w1) {
    const Eigen::Index dim = u.rows();
    const Eigen::Index b0 = Eigen::Index(1) << w0, b1 = Eigen::Index(1) << w1;
    for (Eigen::Index i = 0; i < dim; ++i) {
        if ((i & b0) || (i & b1)) continue;
        const Eigen::Index idx[4] = {i, i | b1, i | b0, i | b0 | b1};
        for (Eigen::Index c = 0; c < u.cols(); ++c) {
            ir::Complex v[4];
            for (int k = 0; k < 4; ++k) v[k] = u(idx[k], c);
            for (int r = 0; r < 4; ++r) {
                ir::Complex s = 0;
                for (int k = 0; k < 4; ++k) s += m(r, k) * v[k];
                u(idx[r], c) = s;
            }
        }
    }
}

}  // namespace

bool AngleForm::empty() const {
    for (int8_t c : coef)
        if (c != 0) return false;
    return true;
}

std::string form_text(const AngleForm& f) {
    std::string out;
    for (int j = 0; j < kMaxParams; ++j) {
        if (f.coef[j] == 0) continue;
        if (f.coef[j] < 0) out += '-';
        else if (!out.empty()) out += '+';
        out += char('a' + j);
    }
    return out.empty() ? "0" : out;
}

bool find_gate(std::string_view text, GateName& out) {
    for (const GateInfo& info : kGateTable)
        if (text == info.text) {
            out = info.name;
            return true;
        }
    return false;
}

std::string gate_text(const Gate& g) {
    const GateInfo& info = gate_info(g.name);
    std::string out = info.text;
    if (info.slots > 0) {
        out += '(';
        for (int s = 0; s < info.slots; ++s) {
            if (s) out += ',';
            out += form_text(g.a[s]);
        }
        out += ')';
    }
    out += fmt::format(" {}", g.w[0]);
    if (info.arity == 2) out += fmt::format(" {}", g.w[1]);
    return out;
}

std::string seq_text(const Seq& s) {
    if (s.empty()) return "()";
    std::string out;
    for (const Gate& g : s) {
        if (!out.empty()) out += "; ";
        out += gate_text(g);
    }
    return out;
}

std::vector<GateSet> all_gate_sets() {
    using G = GateName;
    return {
        {ir::Target::CxRzSx, {G::X, G::SX, G::RZ, G::CX}, 3, 2, 5},
        {ir::Target::CzRxRz, {G::RX, G::RZ, G::CZ}, 3, 2, 4},
        {ir::Target::ISwapRzRx, {G::RX, G::RZ, G::ISwap}, 3, 2, 4},
        {ir::Target::XxR, {G::RZ, G::R, G::XX}, 3, 2, 3},
        {ir::Target::CliffordT, {G::H, G::S, G::Sdg, G::T, G::Tdg, G::X, G::CX}, 3, 0, 5},
    };
}

GateSet gate_set_for(ir::Target t) {
    for (GateSet& gs : all_gate_sets())
        if (gs.target == t) return gs;
    throw UserError(fmt::format("target '{}' has no identity library", ir::target_name(t)));
}

std::string library_file_name(ir::Target t) { return std::string(ir::target_name(t)) + ".rules"; }

Angle form_value(const AngleForm& f, const std::array<Angle, kMaxParams>& values) {
    Angle out;
    for (int j = 0; j < kMaxParams; ++j) out += values[j] * f.coef[j];
    return out;
}

ir::Op make_op(GateName name, uint32_t a, uint32_t b, Angle v0, Angle v1) {
    switch (name) {
    case GateName::X: return ir::Op::x(a);
    case GateName::SX: return ir::Op::one(OpKind::SX, a);
    case GateName::RZ: return ir::Op::one(OpKind::RZ, a, v0);
    case GateName::RX: return ir::Op::one(OpKind::RX, a, v0);
    case GateName::H: return ir::Op::one(OpKind::H, a);
    case GateName::S: return ir::Op::phase(Angle::pi_times(1, 2), {Lit::pos(a)});
    case GateName::Sdg: return ir::Op::phase(Angle::pi_times(-1, 2), {Lit::pos(a)});
    case GateName::T: return ir::Op::phase(Angle::pi_times(1, 4), {Lit::pos(a)});
    case GateName::Tdg: return ir::Op::phase(Angle::pi_times(-1, 4), {Lit::pos(a)});
    case GateName::R: {
        ir::Op op = ir::Op::one(OpKind::R, a, v0);
        op.set_phi(v1);
        return op;
    }
    case GateName::CX: return ir::Op::x(b, {Lit::pos(a)});
    case GateName::CZ: return ir::Op::phase(Angle::pi_times(1), {Lit::pos(std::min(a, b)), Lit::pos(std::max(a, b))});
    case GateName::ISwap: return ir::Op::two(OpKind::ISwap, a, b);
    case GateName::XX: return ir::Op::two(OpKind::XX, a, b, v0);
    }
    WHITTLE_ASSERT(false && "every gate name is handled");
    return {};
}

ir::Op to_op(const Gate& g, const std::array<Angle, kMaxParams>& values) {
    return make_op(g.name, g.w[0], g.w[1], form_value(g.a[0], values), form_value(g.a[1], values));
}

Eigen::MatrixXcd seq_unitary(const Seq& s, int wires, const std::array<double, kMaxParams>& values) {
    const Eigen::Index dim = Eigen::Index(1) << wires;
    return seq_apply(s, wires, values, Eigen::MatrixXcd::Identity(dim, dim));
}

Eigen::MatrixXcd seq_apply(const Seq& s, int wires, const std::array<double, kMaxParams>& values, Eigen::MatrixXcd u) {
    WHITTLE_ASSERT(u.rows() == (Eigen::Index(1) << wires) && "one row per basis state");
    std::array<Angle, kMaxParams> angles;
    for (int j = 0; j < kMaxParams; ++j) angles[j] = Angle::radians(values[j]);
    for (const Gate& g : s) {
        const ir::Op op = to_op(g, angles);
        if (g.name == GateName::CX) {
            ir::Mat4 m = ir::Mat4::Zero();
            m(0, 0) = m(1, 1) = m(2, 3) = m(3, 2) = 1;
            apply_2q(u, m, g.w[0], g.w[1]);
        } else if (g.name == GateName::CZ) {
            ir::Mat4 m = ir::Mat4::Identity();
            m(3, 3) = -1;
            apply_2q(u, m, g.w[0], g.w[1]);
        } else if (gate_info(g.name).arity == 2) {
            apply_2q(u, ir::two_qubit_matrix(op), g.w[0], g.w[1]);
        } else {
            apply_1q(u, ir::one_qubit_matrix(op), g.w[0]);
        }
    }
    return u;
}

}  // namespace whittle::rules
