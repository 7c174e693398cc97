// OpenQASM 2.0 and 3.0 text from the IR. Both dialects share one writer: the op-by-op forms are
// the same constructions, only the spelling (declarations, measure, if, control modifiers) differs.
#include "output/emit_qasm.h"

#include <fmt/format.h>

#include "ir/printer.h"
#include "ir/error.h"
#include "output/qasm_names.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Circuit;
using ir::Lit;
using ir::Op;
using ir::OpKind;

enum class Dialect { V2, V3 };

using ir::stored_angle_text;  // the stored [0, 2*pi) form: rotations have period 4*pi

std::string text(const Angle& a) { return a.to_string(); }

class Writer {
public:
    Writer(const Circuit& c, Dialect d) : c_(c), d_(d), names_(qasm_names(c, d == Dialect::V3)) {
        bit_reg_.assign(c.num_cbits, -1);
        for (size_t r = 0; r < c.cregs.size(); ++r)
            for (uint32_t i = 0; i < c.cregs[r].size; ++i)
                if (c.cregs[r].first + i < c.num_cbits) bit_reg_[c.cregs[r].first + i] = int(r);
    }

    std::string run() {
        // Room for the usual line lengths (about 16 bytes per gate): the body of a 10^7-gate
        // circuit then never grows by copying, which would hold it twice. Pages not written cost nothing.
        body_.reserve(24 * c_.ops.size() + 4096);
        for (const Op& op : c_.ops) emit(op);
        std::string out = d_ == Dialect::V2 ? "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                                            : "OPENQASM 3.0;\ninclude \"stdgates.inc\";\n";
        for (const std::string& r : names_.annotations) out += r + "\n";
        for (const std::string& r : names_.renames) out += r + "\n";
        out += definitions();
        for (size_t i = 0; i < c_.registers.size(); ++i) {
            const ir::Register& r = c_.registers[i];
            if (d_ == Dialect::V2) out += fmt::format("qreg {}[{}];\n", names_.qregs[i], r.size);
            else if (r.scalar) out += fmt::format("qubit {};\n", names_.qregs[i]);
            else out += fmt::format("qubit[{}] {};\n", r.size, names_.qregs[i]);
        }
        for (size_t i = 0; i < c_.cregs.size(); ++i) {
            const ir::ClassicalRegister& r = c_.cregs[i];
            if (d_ == Dialect::V2) out += fmt::format("creg {}[{}];\n", names_.cregs[i], r.size);
            else if (r.scalar) out += fmt::format("bit {};\n", names_.cregs[i]);
            else out += fmt::format("bit[{}] {};\n", r.size, names_.cregs[i]);
        }
        if (!c_.global_phase.is_zero()) {
            if (d_ == Dialect::V3) out += fmt::format("gphase({});\n", text(c_.global_phase));
            else out += fmt::format("// global phase {} (OpenQASM 2.0 cannot write it)\n", text(c_.global_phase));
        }
        body_.insert(0, out);  // in place (no second copy of the body) while the reserved room lasts
        return std::move(body_);
    }

private:
    // ---- spelling --------------------------------------------------------------------------------

    std::string q(uint32_t w) const {
        const ir::Qubit& qb = c_.qubits[w];
        const ir::Register& r = c_.registers[qb.reg];
        if (d_ == Dialect::V3 && r.scalar) return names_.qregs[qb.reg];
        return fmt::format("{}[{}]", names_.qregs[qb.reg], qb.index);
    }

    std::string bit(int32_t b) const {
        int r = b >= 0 && uint32_t(b) < bit_reg_.size() ? bit_reg_[size_t(b)] : -1;
        if (r < 0) throw UserError(fmt::format("classical bit {} belongs to no register", b), cur_->loc);
        const ir::ClassicalRegister& cr = c_.cregs[size_t(r)];
        if (d_ == Dialect::V3 && cr.scalar) return names_.cregs[size_t(r)];
        return fmt::format("{}[{}]", names_.cregs[size_t(r)], uint32_t(b) - cr.first);
    }

    std::string sep() const { return d_ == Dialect::V2 ? "," : ", "; }

    std::string list(const std::vector<uint32_t>& ws) const {
        std::string s;
        for (uint32_t w : ws) s += (s.empty() ? "" : sep()) + q(w);
        return s;
    }

    /// One statement; under a classical condition it gets `if(c==v)` (2.0) or `if (c == v) { }` (3.0).
    void line(const std::string& stmt) {
        // A barrier has no effect to condition (and 2.0 has no conditioned barrier): write it plainly.
        if (!cur_->is_conditioned() || cur_->kind == OpKind::Barrier) {
            body_ += stmt + "\n";
            return;
        }
        const std::string& reg = names_.cregs[size_t(cur_->cond_reg())];
        if (d_ == Dialect::V2) body_ += fmt::format("if({}=={}) {}\n", reg, cur_->cond_value(), stmt);
        else body_ += fmt::format("if ({} == {}) {{ {} }}\n", reg, cur_->cond_value(), stmt);
    }

    /// `name(params) wires;`
    void gate(const std::string& name, const std::vector<std::string>& params, const std::vector<uint32_t>& wires) {
        std::string p;
        for (const std::string& s : params) p += (p.empty() ? "" : sep()) + s;
        line(fmt::format("{}{} {};", name, params.empty() ? "" : "(" + p + ")", list(wires)));
    }

    /// 3.0 only: `ctrl(k) @ name(params) controls..., targets...;`
    void ctrl_gate(const std::string& name, const std::vector<std::string>& params, std::vector<uint32_t> controls,
                   const std::vector<uint32_t>& targets) {
        std::string mod = controls.size() == 1 ? "ctrl @ " : fmt::format("ctrl({}) @ ", controls.size());
        controls.insert(controls.end(), targets.begin(), targets.end());
        gate(mod + name, params, controls);
    }

    [[noreturn]] void refuse(const std::string& what) const {
        throw UserError(fmt::format("{} has no OpenQASM 2.0 form: lower it first with --target (for example "
                                    "--target clifford+t), or emit OpenQASM 3.0 with --emit qasm3",
                                    what),
                        cur_->loc);
    }

    std::string definitions() const {
        std::string out;
        if (use_iswap_)
            out += d_ == Dialect::V2 ? "gate iswap a,b { s a; s b; h a; cx a,b; cx b,a; h b; }\n"
                                     : "gate iswap a, b { s a; s b; h a; cx a, b; cx b, a; h b; }\n";
        if (use_r_)
            out += d_ == Dialect::V2 ? "gate r(theta,phi) a { u3(theta,phi-pi/2,-phi+pi/2) a; }\n"
                                     : "gate r(theta, phi) a { U(theta, phi - pi/2, -phi + pi/2) a; }\n";
        if (use_rxx_)  // 3.0 only: stdgates.inc has no XX rotation
            out += "gate rxx(theta) a, b { h a; h b; cx a, b; rz(theta) b; cx a, b; h a; h b; }\n";
        return out;
    }

    // ---- ops -----------------------------------------------------------------------------------------

    void emit(const Op& op) {
        cur_ = &op;
        switch (op.kind) {
        case OpKind::Measure:
            if (d_ == Dialect::V2) line(fmt::format("measure {} -> {};", q(op.target), bit(op.cbit())));
            else line(fmt::format("{} = measure {};", bit(op.cbit()), q(op.target)));
            return;
        case OpKind::Reset: return gate("reset", {}, {op.target});
        case OpKind::Barrier: {
            std::vector<uint32_t> ws;
            for (Lit l : op.controls) ws.push_back(l.wire());
            if (ws.empty()) return;
            return gate("barrier", {}, ws);
        }
        case OpKind::ISwap:
            use_iswap_ = true;
            return gate("iswap", {}, {op.target, op.target2});
        case OpKind::XX:
            // 2.0: rxx of the later qelib1.inc; 3.0: defined in the file.
            if (d_ == Dialect::V3) use_rxx_ = true;
            return gate("rxx", {text(op.angle)}, {op.target, op.target2});
        case OpKind::R:
            use_r_ = true;
            return gate("r", {text(op.angle), text(op.phi())}, {op.target});
        case OpKind::Parity: return parity(op);
        case OpKind::X:
        case OpKind::Phase:
        case OpKind::H:
        case OpKind::Y:
        case OpKind::SX:
        case OpKind::SXdg:
        case OpKind::RX:
        case OpKind::RY:
        case OpKind::RZ:
        case OpKind::U:
        case OpKind::Swap: {
            // Negative controls: X before and after turns them into positive ones.
            std::vector<uint32_t> flips, wires;
            for (Lit l : op.controls) {
                wires.push_back(l.wire());
                if (!l.positive()) flips.push_back(l.wire());
            }
            for (uint32_t w : flips) gate("x", {}, {w});
            if (op.kind == OpKind::Phase) phase(op.angle, wires);
            else controlled(op, wires);
            for (uint32_t w : flips) gate("x", {}, {w});
            return;
        }
        }
    }

    /// e^{i*theta*(w1 xor ... xor wk)}: a CNOT ladder computes the parity into the last wire, a phase
    /// on it, and the ladder undoes it. Exact, with no global phase.
    void parity(const Op& op) {
        std::vector<uint32_t> ws;
        for (Lit l : op.controls) ws.push_back(l.wire());
        uint32_t last = ws.back();
        for (size_t i = 0; i + 1 < ws.size(); ++i) gate("cx", {}, {ws[i], last});
        phase(op.angle, {last});
        for (size_t i = ws.size() - 1; i-- > 0;) gate("cx", {}, {ws[i], last});
    }

    /// e^{i*theta*AND(ws)} on positive literals.
    void phase(const Angle& theta, const std::vector<uint32_t>& ws) {
        const bool v2 = d_ == Dialect::V2;
        if (ws.size() == 1) {
            // The Clifford+T names where the angle is one of them (the clifford+t target's gates).
            static const char* const named[8] = {nullptr, "t", "s", nullptr, "z", nullptr, "sdg", "tdg"};
            const int e = theta.eighths();
            if (e > 0 && named[e]) return gate(named[e], {}, ws);
            return gate(v2 ? "u1" : "p", {text(theta)}, ws);
        }
        if (ws.size() == 2) {
            if (theta == Angle::pi_times(1)) return gate("cz", {}, ws);  // both headers have cz
            return gate(v2 ? "cu1" : "cp", {text(theta)}, ws);
        }
        if (!v2) return ctrl_gate("p", {text(theta)}, {ws.begin(), ws.end() - 1}, {ws.back()});
        if (ws.size() > 3) refuse(fmt::format("a phase on a product of {} wires", ws.size()));
        const uint32_t a = ws[0], b = ws[1], t = ws[2];
        if (theta == Angle::pi_times(1)) {  // CCZ = (I(x)I(x)H) CCX (I(x)I(x)H)
            gate("h", {}, {t});
            gate("ccx", {}, {a, b, t});
            gate("h", {}, {t});
            return;
        }
        // theta*a*b*t = theta/2*(b*t) - theta/2*((a xor b)*t) + theta/2*(a*t), since a + b - (a xor b) = 2ab.
        std::string h = text(theta.divided_by(2)), mh = text(-theta.divided_by(2));
        gate("cu1", {h}, {b, t});
        gate("cx", {}, {a, b});
        gate("cu1", {mh}, {b, t});
        gate("cx", {}, {a, b});
        gate("cu1", {h}, {a, t});
    }

    void controlled(const Op& op, const std::vector<uint32_t>& cs) {
        const bool v2 = d_ == Dialect::V2;
        const size_t n = cs.size();
        const uint32_t t = op.target;
        auto with = [&](std::initializer_list<uint32_t> extra) {
            std::vector<uint32_t> w = cs;
            w.insert(w.end(), extra);
            return w;
        };
        auto too_many = [&](size_t allowed) {
            if (v2 && n > allowed)
                refuse(fmt::format("'{}' with {} controls", ir::op_kind_name(op.kind), n));
        };
        const std::string th = stored_angle_text(op.angle);  // exact under controls (see above)
        switch (op.kind) {
        case OpKind::X:
            too_many(2);
            if (n <= 2) return gate(n == 0 ? "x" : n == 1 ? "cx" : "ccx", {}, with({t}));
            return ctrl_gate("x", {}, cs, {t});
        case OpKind::Y:
        case OpKind::H: {
            too_many(1);
            const char* base = op.kind == OpKind::Y ? "y" : "h";
            if (n == 0) return gate(base, {}, {t});
            if (n == 1) return gate(op.kind == OpKind::Y ? "cy" : "ch", {}, with({t}));
            return ctrl_gate(base, {}, cs, {t});
        }
        case OpKind::SX:
        case OpKind::SXdg: {
            too_many(1);
            const bool dg = op.kind == OpKind::SXdg;
            if (n == 0) return gate(v2 ? (dg ? "sxdg" : "sx") : (dg ? "inv @ sx" : "sx"), {}, {t});
            if (!v2) return ctrl_gate(dg ? "inv @ sx" : "sx", {}, cs, {t});
            // sqrt(X) = H S H exactly, so its controlled form is H . controlled-S . H.
            gate("h", {}, {t});
            gate("cu1", {dg ? "-pi/2" : "pi/2"}, with({t}));
            gate("h", {}, {t});
            return;
        }
        case OpKind::RX:
        case OpKind::RY:
        case OpKind::RZ: {
            too_many(1);
            const char* base = op.kind == OpKind::RX ? "rx" : op.kind == OpKind::RY ? "ry" : "rz";
            if (n == 0) return gate(base, {text(op.angle)}, {t});
            if (!v2) {
                if (n == 1) return gate(std::string("c") + base, {th}, with({t}));
                return ctrl_gate(base, {th}, cs, {t});
            }
            if (op.kind == OpKind::RZ) return gate("crz", {th}, with({t}));
            if (op.kind == OpKind::RX) {  // Rx = H Rz H
                gate("h", {}, {t});
                gate("crz", {th}, with({t}));
                gate("h", {}, {t});
                return;
            }
            // controlled Ry(theta): Ry(theta/2), CX, Ry(-theta/2), CX (X Ry(a) X = Ry(-a)).
            gate("ry", {text(op.angle.divided_by(2))}, {t});
            gate("cx", {}, with({t}));
            gate("ry", {text(-op.angle.divided_by(2))}, {t});
            gate("cx", {}, with({t}));
            return;
        }
        case OpKind::U: {
            too_many(1);
            const Angle& theta = op.angle;
            const Angle phi = op.phi();
            const Angle lambda = op.lambda();
            if (n == 0) return gate(v2 ? "u3" : "U", {text(theta), text(phi), text(lambda)}, {t});
            if (!v2) {
                if (n == 1) return gate("cu", {th, text(phi), text(lambda), "0"}, with({t}));
                return ctrl_gate("U", {th, text(phi), text(lambda)}, cs, {t});
            }
            // Controlled u3 from u1, u3 and cx only (the header's cu3 body plus the control phase
            // (phi+lambda)/2 that makes it controlled-u3; no dependence on the header's version).
            // Halves are taken before sums so no reduction mod 2*pi happens in between.
            const uint32_t c = cs[0];
            Angle hp = phi.divided_by(2), hl = lambda.divided_by(2), ht = theta.divided_by(2);
            gate("u1", {text(hl + hp)}, {c});
            gate("u1", {text(hl - hp)}, {t});
            gate("cx", {}, {c, t});
            gate("u3", {text(-ht), "0", text(-(hp + hl))}, {t});
            gate("cx", {}, {c, t});
            gate("u3", {text(ht), text(phi), "0"}, {t});
            return;
        }
        case OpKind::Swap:
            too_many(1);
            if (n <= 1) return gate(n == 0 ? "swap" : "cswap", {}, with({t, op.target2}));
            return ctrl_gate("swap", {}, cs, {t, op.target2});
        case OpKind::Phase:
        case OpKind::Parity:
        case OpKind::ISwap:
        case OpKind::XX:
        case OpKind::R:
        case OpKind::Measure:
        case OpKind::Reset:
        case OpKind::Barrier:
            break;
        }
        WHITTLE_ASSERT(false && "op kind handled before controlled()");
    }

    const Circuit& c_;
    Dialect d_;
    QasmNames names_;
    std::vector<int> bit_reg_;
    std::string body_;
    const Op* cur_ = nullptr;
    bool use_iswap_ = false;
    bool use_r_ = false;
    bool use_rxx_ = false;
};

}  // namespace

std::string emit_qasm2(const ir::Circuit& c) { return Writer(c, Dialect::V2).run(); }

std::string emit_qasm3(const ir::Circuit& c) { return Writer(c, Dialect::V3).run(); }

}  // namespace whittle::lowering
