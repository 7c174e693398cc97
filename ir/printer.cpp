// The .wq printer: declarations, the global phase, then one op per line (pair tags group runs).
#include "ir/printer.h"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <string_view>

namespace whittle::ir {
namespace {

/// Words the .wq grammar (frontend/wq_grammar.cpp) gives a meaning of its own. A register or bit
/// with one of these names (an OpenQASM register called `when`, say) is written `when` in
/// backquotes, which the lexer reads as a plain name. Gate names need no quotes: a wire never
/// starts a statement except before `^=`, `[` or `<->`, where the parser reads it as a wire.
constexpr std::array<std::string_view, 24> kReservedWords = {
    "pi",     "let",     "qubit", "ancilla", "borrow", "bit",       "routine", "when",
    "compute", "then",   "for",   "in",      "repeat", "use",       "measure", "as",
    "if",     "else",    "reset", "barrier", "phase",  "uncompute", "int",     "angle"};

std::string name_text(const std::string& name) {
    if (std::find(kReservedWords.begin(), kReservedWords.end(), name) == kReservedWords.end()) return name;
    return "`" + name + "`";
}

std::string wire_text(const Circuit& c, uint32_t wire) {
    if (wire >= c.qubits.size()) return c.wire_name(wire);
    const Qubit& q = c.qubits[wire];
    const Register& r = c.registers[q.reg];
    return r.scalar ? name_text(r.name) : fmt::format("{}[{}]", name_text(r.name), q.index);
}

// Appended rather than `"!" + name`: GCC 12 at -O2/-O3 warns (-Wrestrict, a false positive) on the
// inlined insert-at-front of that operator+, which breaks the Release build under -Werror.
std::string lit_text(const Circuit& c, Lit l) {
    std::string s(l.positive() ? "" : "!");
    s += wire_text(c, l.wire());
    return s;
}

std::string product_text(const Circuit& c, const LitVec& lits, const char* op) {
    std::string s;
    for (size_t i = 0; i < lits.size(); ++i) {
        if (i) s += op;
        s += lit_text(c, lits[i]);
    }
    return s;
}

}  // namespace

std::string stored_angle_text(const Angle& a) {
    if (!a.is_exact()) {
        std::string t = fmt::format("{:.17g}", a.to_radians());
        if (t.find_first_of(".e") == std::string::npos) t += ".0";
        return t;
    }
    if (a.num() == 0) return "0";
    std::string head = a.num() == 1 ? "pi" : fmt::format("{}*pi", a.num());
    return a.den() == 1 ? head : fmt::format("{}/{}", head, a.den());
}

namespace {

/// The op's statement without its condition, pair tag or `when` controls.
std::string bare_op(const Circuit& c, const Op& op) {
    auto w = [&](uint32_t wire) { return wire_text(c, wire); };
    const std::string a0 = stored_angle_text(op.angle);
    switch (op.kind) {
    case OpKind::X: return fmt::format("x {}", w(op.target));
    case OpKind::H: return fmt::format("h {}", w(op.target));
    case OpKind::Y: return fmt::format("y {}", w(op.target));
    case OpKind::SX: return fmt::format("sx {}", w(op.target));
    case OpKind::SXdg: return fmt::format("~sx {}", w(op.target));
    case OpKind::RX: return fmt::format("rx({}) {}", a0, w(op.target));
    case OpKind::RY: return fmt::format("ry({}) {}", a0, w(op.target));
    case OpKind::RZ: return fmt::format("rz({}) {}", a0, w(op.target));
    case OpKind::U:
        return fmt::format("u({}, {}, {}) {}", a0, op.phi().to_string(), op.lambda().to_string(), w(op.target));
    case OpKind::Swap: return fmt::format("{} <-> {}", w(op.target), w(op.target2));
    case OpKind::ISwap: return fmt::format("iswap {}, {}", w(op.target), w(op.target2));
    case OpKind::XX: return fmt::format("xx({}) {}, {}", a0, w(op.target), w(op.target2));
    case OpKind::R: return fmt::format("r({}, {}) {}", a0, op.phi().to_string(), w(op.target));
    case OpKind::Reset: return fmt::format("reset {}", w(op.target));
    case OpKind::Measure: {
        for (const ClassicalRegister& r : c.cregs) {
            if (op.cbit() < int32_t(r.first) || op.cbit() >= int32_t(r.first + r.size)) continue;
            if (r.scalar) return fmt::format("measure {} as {}", w(op.target), name_text(r.name));
            return fmt::format("measure {} as {}[{}]", w(op.target), name_text(r.name), uint32_t(op.cbit()) - r.first);
        }
        return fmt::format("measure {} as <bit {}>", w(op.target), op.cbit());
    }
    case OpKind::Barrier: return op.controls.empty() ? "barrier" : "barrier " + product_text(c, op.controls, ", ");
    case OpKind::Phase:
    case OpKind::Parity: break;
    }
    return "?";
}

/// The op as one statement, `when` included, condition and pair tag not.
std::string op_statement(const Circuit& c, const Op& op) {
    switch (op.kind) {
    case OpKind::X:
        if (op.controls.empty()) return bare_op(c, op);
        return fmt::format("{} ^= {}", wire_text(c, op.target), product_text(c, op.controls, " & "));
    case OpKind::Phase: {
        if (op.controls.size() == 1 && op.controls[0].positive()) {
            const std::string q = wire_text(c, op.controls[0].wire());
            const Angle& a = op.angle;
            if (a == Angle::pi_times(1) && a.is_exact()) return "z " + q;
            if (a.is_exact() && a == Angle::pi_times(1, 2)) return "s " + q;
            if (a.is_exact() && a == Angle::pi_times(-1, 2)) return "~s " + q;
            if (a.is_exact() && a == Angle::pi_times(1, 4)) return "t " + q;
            if (a.is_exact() && a == Angle::pi_times(-1, 4)) return "~t " + q;
        }
        return fmt::format("phase({}) {}", op.angle.to_string(), product_text(c, op.controls, " & "));
    }
    case OpKind::Parity:
        // A one-wire parity keeps its kind through the explicit `^ 0`.
        return fmt::format("phase({}) {}{}", op.angle.to_string(), product_text(c, op.controls, " ^ "),
                           op.controls.size() == 1 ? " ^ 0" : "");
    case OpKind::Barrier: return bare_op(c, op);
    default: break;
    }
    if (op.controls.empty()) return bare_op(c, op);
    return fmt::format("when {} {{ {} }}", product_text(c, op.controls, " & "), bare_op(c, op));
}

std::string with_condition(const Circuit& c, const Op& op, std::string stmt) {
    if (!op.is_conditioned()) return stmt;
    if (size_t(op.cond_reg()) >= c.cregs.size()) return fmt::format("if <bits {}> == {} {{ {} }}", op.cond_reg(), op.cond_value(), stmt);
    const ClassicalRegister& r = c.cregs[size_t(op.cond_reg())];
    if (r.scalar && op.cond_value() == 1) return fmt::format("if {} {{ {} }}", name_text(r.name), stmt);
    if (r.scalar && op.cond_value() == 0) return fmt::format("if !{} {{ {} }}", name_text(r.name), stmt);
    return fmt::format("if {} == {} {{ {} }}", name_text(r.name), op.cond_value(), stmt);
}

std::string tag_text(const Op& op) {
    return fmt::format("@{}({})", op.half == PairHalf::Uncompute ? "uncompute" : "compute", op.pair);
}

bool tagged(const Op& op) { return op.half != PairHalf::None && op.pair != 0; }

}  // namespace

std::string print_op(const Circuit& c, const Op& op) {
    std::string s = with_condition(c, op, op_statement(c, op));
    if (tagged(op)) s = tag_text(op) + " " + s;
    return s;
}

std::string print_wq(const Circuit& c) {
    std::string out;
    // Declarations: consecutive registers of one role share a line.
    for (size_t i = 0; i < c.registers.size();) {
        Role role = c.registers[i].role;
        std::string line = role_name(role);
        size_t j = i;
        for (; j < c.registers.size() && c.registers[j].role == role; ++j) {
            const Register& r = c.registers[j];
            line += (j == i ? " " : ", ") + (r.scalar ? name_text(r.name) : fmt::format("{}[{}]", name_text(r.name), r.size));
        }
        i = j;
        out += line + "\n";
    }
    if (!c.cregs.empty()) {
        std::string line = "bit";
        for (size_t i = 0; i < c.cregs.size(); ++i) {
            const ClassicalRegister& r = c.cregs[i];
            line += (i ? ", " : " ") + (r.scalar ? name_text(r.name) : fmt::format("{}[{}]", name_text(r.name), r.size));
        }
        out += line + "\n";
    }
    if (!c.global_phase.is_zero() || !c.global_phase.is_exact())
        out += fmt::format("phase({}) 1  # global phase\n", c.global_phase.to_string());
    for (size_t i = 0; i < c.ops.size();) {
        const Op& op = c.ops[i];
        if (!tagged(op)) {
            out += with_condition(c, op, op_statement(c, op)) + "\n";
            ++i;
            continue;
        }
        size_t j = i + 1;
        while (j < c.ops.size() && c.ops[j].pair == op.pair && c.ops[j].half == op.half) ++j;
        if (j == i + 1) {
            out += print_op(c, op) + "\n";
        } else {
            out += tag_text(op) + " {\n";
            for (size_t k = i; k < j; ++k) out += "    " + with_condition(c, c.ops[k], op_statement(c, c.ops[k])) + "\n";
            out += "}\n";
        }
        i = j;
    }
    return out;
}

}  // namespace whittle::ir
