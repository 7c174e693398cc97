// Window matching for the identity libraries: wire renaming and angle forms solved slot by slot.
#include "rules/match.h"

#include <algorithm>
#include <array>
#include <cstdlib>

namespace whittle::rules {
namespace {

/// A parameter's value as a linear form over the matched sequence's own parameters.
struct Coefs {
    std::array<int, kMaxParams> c{};
    Coefs operator-(const Coefs& o) const {
        Coefs r = *this;
        for (int k = 0; k < kMaxParams; ++k) r.c[k] -= o.c[k];
        return r;
    }
    Coefs operator*(int f) const {
        Coefs r = *this;
        for (int& x : r.c) x *= f;
        return r;
    }
    Coefs& operator+=(const Coefs& o) {
        for (int k = 0; k < kMaxParams; ++k) c[k] += o.c[k];
        return *this;
    }
    bool is_zero() const { return c == std::array<int, kMaxParams>{}; }
};

Coefs coefs_of(const AngleForm& f) {
    Coefs r;
    for (int k = 0; k < kMaxParams; ++k) r.c[k] = f.coef[k];
    return r;
}

bool to_form(const Coefs& c, AngleForm& out) {
    for (int j = 0; j < kMaxParams; ++j) {
        if (std::abs(c.c[j]) > 100) return false;
        out.coef[j] = int8_t(c.c[j]);
    }
    return true;
}

template <class V>
using Values = std::array<std::optional<V>, kMaxParams>;

enum class Solved { Contradiction, Complete, Open };

/// Solves the parameters p_j of `side`'s first `count` gates from the values their angle slots
/// take (slot s of gate i reads sum_j coef_j p_j and takes slot_value(i, s)), one unknown at a time:
/// a slot with a single unknown of coefficient +-1 fixes it. V is the value type (an exact angle,
/// or a linear form over the sequence's parameters); V - V * int, V * int and is_zero() are used.
/// Open: some slot kept several unknowns when no slot could fix one more.
template <class V, class SlotValue>
Solved solve_parameters(const Seq& side, size_t count, SlotValue slot_value, Values<V>& value) {
    for (bool progress = true; progress;) {
        progress = false;
        bool open = false;
        for (size_t i = 0; i < count; ++i) {
            const GateInfo& info = gate_info(side[i].name);
            for (int slot = 0; slot < info.slots; ++slot) {
                const AngleForm& rf = side[i].a[slot];
                V rest = slot_value(i, slot);
                int unknown = -1, unknowns = 0;
                for (int j = 0; j < kMaxParams; ++j) {
                    if (rf.coef[j] == 0) continue;
                    if (!value[j]) {
                        unknown = j;
                        ++unknowns;
                        continue;
                    }
                    rest = rest - *value[j] * rf.coef[j];
                }
                if (unknowns == 0) {
                    if (!rest.is_zero()) return Solved::Contradiction;
                    continue;
                }
                if (unknowns > 1 || std::abs(rf.coef[unknown]) != 1) {
                    open = true;
                    continue;
                }
                value[unknown] = rest * rf.coef[unknown];  // coefficient +-1: its own inverse
                progress = true;
            }
        }
        if (!progress && open) return Solved::Open;
    }
    return Solved::Complete;
}

}  // namespace

std::optional<Seq> match_window(const Seq& side, const Seq& other, const Seq& seq, size_t at) {
    if (at + side.size() > seq.size()) return std::nullopt;
    std::array<int, 8> wire_map;
    wire_map.fill(-1);
    std::array<bool, 8> taken{};
    for (size_t i = 0; i < side.size(); ++i) {
        const Gate& r = side[i];
        const Gate& s = seq[at + i];
        if (r.name != s.name) return std::nullopt;
        const GateInfo& info = gate_info(r.name);
        auto bind = [&](const std::array<uint8_t, 2>& sw) {
            std::array<int, 8> m = wire_map;
            std::array<bool, 8> t = taken;
            for (int k = 0; k < info.arity; ++k) {
                if (m[r.w[k]] < 0) {
                    if (t[sw[k]]) return false;
                    m[r.w[k]] = sw[k];
                    t[sw[k]] = true;
                } else if (m[r.w[k]] != sw[k]) {
                    return false;
                }
            }
            wire_map = m;
            taken = t;
            return true;
        };
        if (!bind(s.w) && !(info.symmetric && bind({s.w[1], s.w[0]}))) return std::nullopt;
    }
    // Parameters: p_j = sum_k value[j][k] * q_k over the sequence's parameters q.
    Values<Coefs> value;
    if (solve_parameters<Coefs>(side, side.size(), [&](size_t i, int slot) { return coefs_of(seq[at + i].a[slot]); },
                                value) != Solved::Complete)
        return std::nullopt;
    Seq out;
    out.reserve(other.size());
    for (const Gate& r : other) {
        Gate g = r;
        const GateInfo& info = gate_info(r.name);
        for (int k = 0; k < info.arity; ++k) {
            if (wire_map[r.w[k]] < 0) return std::nullopt;
            g.w[k] = uint8_t(wire_map[r.w[k]]);
        }
        if (info.symmetric && g.w[0] > g.w[1]) std::swap(g.w[0], g.w[1]);
        for (int slot = 0; slot < info.slots; ++slot) {
            Coefs c;
            for (int j = 0; j < kMaxParams; ++j) {
                if (r.a[slot].coef[j] == 0) continue;
                if (!value[j]) return std::nullopt;
                c += *value[j] * r.a[slot].coef[j];
            }
            if (!to_form(c, g.a[slot])) return std::nullopt;
        }
        out.push_back(g);
    }
    return out;
}

std::optional<OpGate> op_gate(const ir::Op& op, const GateSet& set) {
    if (op.is_conditioned()) return std::nullopt;
    const size_t nc = op.controls.size();
    for (const ir::Lit l : op.controls)
        if (!l.positive()) return std::nullopt;
    OpGate g;
    bool ok = false;
    switch (op.kind) {
    case ir::OpKind::X:
        if (nc == 0) g = {GateName::X, {op.target, 0}, {}}, ok = true;
        else if (nc == 1) g = {GateName::CX, {op.controls[0].wire(), op.target}, {}}, ok = true;
        break;
    case ir::OpKind::SX: ok = nc == 0, g.name = GateName::SX, g.w[0] = op.target; break;
    case ir::OpKind::H: ok = nc == 0, g.name = GateName::H, g.w[0] = op.target; break;
    case ir::OpKind::RZ:
    case ir::OpKind::RX:
        ok = nc == 0;
        g = {op.kind == ir::OpKind::RZ ? GateName::RZ : GateName::RX, {op.target, 0}, {op.angle, {}}};
        break;
    case ir::OpKind::R: ok = true, g = {GateName::R, {op.target, 0}, {op.angle, op.phi()}}; break;
    case ir::OpKind::ISwap: ok = true, g = {GateName::ISwap, {op.target, op.target2}, {}}; break;
    case ir::OpKind::XX: ok = true, g = {GateName::XX, {op.target, op.target2}, {op.angle, {}}}; break;
    case ir::OpKind::Phase:
        if (nc == 2 && op.angle == ir::Angle::pi_times(1)) {
            ok = true, g = {GateName::CZ, {op.controls[0].wire(), op.controls[1].wire()}, {}};
        } else if (nc == 1) {
            const int e = op.angle.eighths();
            const GateName names[8] = {GateName::X, GateName::T, GateName::S, GateName::X,
                                       GateName::X, GateName::X, GateName::Sdg, GateName::Tdg};
            ok = e == 1 || e == 2 || e == 6 || e == 7;
            if (ok) g = {names[e], {op.controls[0].wire(), 0}, {}};
        }
        break;
    default: break;
    }
    if (!ok || std::find(set.gates.begin(), set.gates.end(), g.name) == set.gates.end()) return std::nullopt;
    return g;
}

std::optional<std::vector<ir::Op>> match_ops(const Seq& side, const Seq& other, const std::vector<OpGate>& ops,
                                             bool partial) {
    if (ops.size() > side.size() || (!partial && ops.size() != side.size())) return std::nullopt;
    std::vector<std::pair<uint8_t, uint32_t>> wire_map;  // (rule wire, circuit wire)
    auto mapped = [&](uint8_t rw) -> const uint32_t* {
        for (const auto& [r, c] : wire_map)
            if (r == rw) return &c;
        return nullptr;
    };
    auto used = [&](uint32_t cw) {
        for (const auto& m : wire_map)
            if (m.second == cw) return true;
        return false;
    };
    for (size_t i = 0; i < ops.size(); ++i) {
        const Gate& r = side[i];
        if (r.name != ops[i].name) return std::nullopt;
        const GateInfo& info = gate_info(r.name);
        auto bind = [&](uint32_t c0, uint32_t c1) {
            const auto saved = wire_map;
            const uint32_t cw[2] = {c0, c1};
            for (int k = 0; k < info.arity; ++k) {
                if (const uint32_t* m = mapped(r.w[k])) {
                    if (*m != cw[k]) return wire_map = saved, false;
                } else {
                    if (used(cw[k])) return wire_map = saved, false;
                    wire_map.emplace_back(r.w[k], cw[k]);
                }
            }
            return true;
        };
        if (!bind(ops[i].w[0], ops[i].w[1]) && !(info.symmetric && bind(ops[i].w[1], ops[i].w[0]))) return std::nullopt;
    }
    Values<ir::Angle> value;
    const Solved solved =
        solve_parameters<ir::Angle>(side, ops.size(), [&](size_t i, int slot) { return ops[i].a[slot]; }, value);
    if (solved == Solved::Contradiction || (solved == Solved::Open && !partial)) return std::nullopt;
    std::vector<ir::Op> out;
    if (partial) return out;
    for (const Gate& r : other) {
        const GateInfo& info = gate_info(r.name);
        uint32_t cw[2] = {0, 0};
        for (int k = 0; k < info.arity; ++k) {
            const uint32_t* m = mapped(r.w[k]);
            if (!m) return std::nullopt;
            cw[k] = *m;
        }
        ir::Angle v[2];
        for (int slot = 0; slot < info.slots; ++slot)
            for (int j = 0; j < kMaxParams; ++j) {
                if (r.a[slot].coef[j] == 0) continue;
                if (!value[j]) return std::nullopt;
                v[slot] += *value[j] * r.a[slot].coef[j];
            }
        out.push_back(make_op(r.name, cw[0], cw[1], v[0], v[1]));
    }
    return out;
}

}  // namespace whittle::rules
