// Structural equality of two circuits (registers, roles, cregs, ops in order, angles, pairs,
// conditions, global phase), ignoring source locations; a readable first difference on mismatch.
#pragma once

#include <string>

#include <fmt/format.h>

#include "ir/circuit.h"
#include "ir/printer.h"

namespace whittle::test {

/// Exact angles must match exactly; inexact ones by value (the printer keeps 17 digits).
inline bool same_angle(const ir::Angle& a, const ir::Angle& b) {
    if (a.is_exact() != b.is_exact()) return false;
    if (a.is_exact()) return a.num() == b.num() && a.den() == b.den();
    return a == b;
}

/// "" when identical, else a description of the first difference.
inline std::string ir_difference(const ir::Circuit& x, const ir::Circuit& y) {
    using namespace ir;
    if (x.registers.size() != y.registers.size())
        return fmt::format("register count {} vs {}", x.registers.size(), y.registers.size());
    for (size_t i = 0; i < x.registers.size(); ++i) {
        const Register &a = x.registers[i], &b = y.registers[i];
        if (a.name != b.name || a.first != b.first || a.size != b.size || a.role != b.role || a.scalar != b.scalar)
            return fmt::format("register {}: {} vs {}", i, a.name, b.name);
    }
    if (x.qubits.size() != y.qubits.size()) return "qubit count";
    for (size_t i = 0; i < x.qubits.size(); ++i)
        if (x.qubits[i].reg != y.qubits[i].reg || x.qubits[i].index != y.qubits[i].index ||
            x.qubits[i].role != y.qubits[i].role)
            return fmt::format("qubit {}", i);
    if (x.cregs.size() != y.cregs.size() || x.num_cbits != y.num_cbits) return "classical registers";
    for (size_t i = 0; i < x.cregs.size(); ++i)
        if (x.cregs[i].name != y.cregs[i].name || x.cregs[i].first != y.cregs[i].first ||
            x.cregs[i].size != y.cregs[i].size || x.cregs[i].scalar != y.cregs[i].scalar)
            return fmt::format("classical register {}", i);
    if (!same_angle(x.global_phase, y.global_phase))
        return fmt::format("global phase {} vs {}", x.global_phase.to_string(), y.global_phase.to_string());
    if (x.ops.size() != y.ops.size()) return fmt::format("op count {} vs {}", x.ops.size(), y.ops.size());
    for (size_t i = 0; i < x.ops.size(); ++i) {
        const Op &a = x.ops[i], &b = y.ops[i];
        bool same = a.kind == b.kind && a.half == b.half && a.target == b.target && a.target2 == b.target2 &&
                    a.controls == b.controls && a.pair == b.pair && a.cbit() == b.cbit() && a.cond_reg() == b.cond_reg() &&
                    a.cond_value() == b.cond_value() && same_angle(a.angle, b.angle) && same_angle(a.phi(), b.phi()) &&
                    same_angle(a.lambda(), b.lambda());
        if (!same) return fmt::format("op {}: '{}' vs '{}'", i, print_op(x, a), print_op(y, b));
    }
    return "";
}

}  // namespace whittle::test
