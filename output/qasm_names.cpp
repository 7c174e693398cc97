// Register naming for the OpenQASM emitters.
#include "output/qasm_names.h"

#include <set>

#include <fmt/format.h>

namespace whittle::lowering {
namespace {

// Names a 2.0 output cannot use: its keywords, and the gates of qelib1.inc in every version of the
// header (a reader with a newer header must see no clash) plus the gates the writer defines.
const std::set<std::string>& reserved_v2() {
    static const std::set<std::string> r = {
        "OPENQASM", "include", "qreg", "creg", "gate", "opaque", "measure", "reset", "barrier", "if", "pi", "U", "CX",
        "sin", "cos", "tan", "exp", "ln", "sqrt",
        "u3", "u2", "u1", "u0", "u", "p", "cx", "id", "x", "y", "z", "h", "s", "sdg", "t", "tdg", "sx", "sxdg", "rx",
        "ry", "rz", "cz", "cy", "swap", "ch", "ccx", "cswap", "crx", "cry", "crz", "cu1", "cp", "cu3", "csx", "cu",
        "rxx", "rzz", "rccx", "rc3x", "c3x", "c3sqrtx", "c4x", "iswap", "r"};
    return r;
}

// Keywords of OpenQASM 3.0 and every gate name its writer or stdgates.inc uses (and the 2.0 set, so
// a 3.0 output's names also read as 2.0 identifiers where the two agree).
const std::set<std::string>& reserved_v3() {
    static const std::set<std::string> r = [] {
        std::set<std::string> s = reserved_v2();
        for (const char* w :
             {"qubit", "bit", "int", "uint", "float", "angle", "bool", "complex", "const", "let", "def", "defcal",
              "defcalgrammar", "cal", "extern", "return", "else", "for", "while", "in", "break", "continue", "switch",
              "case", "default", "box", "delay", "duration", "stretch", "durationof", "sizeof", "array", "end", "input",
              "output", "ctrl", "negctrl", "inv", "pow", "gphase", "true", "false", "tau", "euler", "mutable",
              "readonly", "arccos", "arcsin", "arctan", "ceiling", "floor", "log", "mod", "popcount", "real", "imag",
              "rotl", "rotr", "phase", "cphase"})
            s.insert(w);
        return s;
    }();
    return r;
}

bool valid(const std::string& s) {
    if (s.empty() || !(s[0] >= 'a' && s[0] <= 'z')) return false;
    for (char ch : s)
        if (!((ch >= 'a' && ch <= 'z') || (ch >= 'A' && ch <= 'Z') || (ch >= '0' && ch <= '9') || ch == '_')) return false;
    return true;
}

std::string pick(const std::string& want, const char* prefix, std::set<std::string>& taken,
                 const std::set<std::string>& reserved) {
    if (valid(want) && !reserved.count(want) && !taken.count(want)) {
        taken.insert(want);
        return want;
    }
    std::string base;
    for (char ch : want)
        base += ((ch >= 'a' && ch <= 'z') || (ch >= 'A' && ch <= 'Z') || (ch >= '0' && ch <= '9') || ch == '_') ? ch : '_';
    if (!valid(base) || reserved.count(base)) base = prefix + base;
    std::string name = base;
    for (int k = 2; !valid(name) || reserved.count(name) || taken.count(name); ++k) name = fmt::format("{}_{}", base, k);
    taken.insert(name);
    return name;
}

}  // namespace

QasmNames qasm_names(const ir::Circuit& c, bool v3) {
    const std::set<std::string>& reserved = v3 ? reserved_v3() : reserved_v2();
    QasmNames out;
    std::set<std::string> taken;
    // Valid names first, so a renamed register never takes a name that a later register needs.
    for (const ir::Register& r : c.registers)
        if (valid(r.name) && !reserved.count(r.name)) taken.insert(r.name);
    for (const ir::ClassicalRegister& r : c.cregs)
        if (valid(r.name) && !reserved.count(r.name) && !taken.count(r.name)) taken.insert(r.name);
    std::set<std::string> kept;
    auto name_for = [&](const std::string& want, const char* prefix) {
        if (valid(want) && !reserved.count(want) && !kept.count(want)) {
            kept.insert(want);
            return want;
        }
        std::string n = pick(want, prefix, taken, reserved);
        kept.insert(n);
        return n;
    };
    for (const ir::Register& r : c.registers) {
        out.qregs.push_back(name_for(r.name, "q_"));
        const std::string& written = out.qregs.back();
        if (written != r.name || r.role != ir::Role::Data)
            out.annotations.push_back(
                fmt::format("{}{} source {} role {}", kQasmAnnotation, written, r.name, ir::role_name(r.role)));
    }
    for (const ir::ClassicalRegister& r : c.cregs) {
        out.cregs.push_back(name_for(r.name, "c_"));
        if (out.cregs.back() != r.name)
            out.renames.push_back(fmt::format("// register '{}' is written as '{}'", r.name, out.cregs.back()));
    }
    return out;
}

}  // namespace whittle::lowering
