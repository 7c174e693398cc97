// Helpers shared by split-work-lives and share-work-wires (see work_wire_lives.h).
#include "passes/work_wire_lives.h"

#include <cctype>

#include <fmt/format.h>

namespace whittle::passes {

std::vector<bool> movable_work_registers(const ir::Circuit& c) {
    std::vector<bool> measured(c.num_qubits(), false);
    for (const ir::Op& op : c.ops)
        if ((op.kind == ir::OpKind::Measure || op.kind == ir::OpKind::Reset) && op.target != ir::kNoWire)
            measured[op.target] = true;
    std::vector<bool> movable(c.registers.size(), false);
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        const ir::Register& reg = c.registers[ri];
        bool ok = reg.size > 0;
        for (uint32_t i = 0; i < reg.size && ok; ++i)
            ok = c.qubits[reg.first + i].role == ir::Role::Clean && !measured[reg.first + i];
        movable[ri] = ok;
    }
    return movable;
}

std::string fresh_work_register_name(const ir::Circuit& c, const std::vector<bool>& leaving) {
    auto taken = [&](const std::string& n) {
        const int r = c.find_register(n);
        if (r >= 0 && (size_t(r) >= leaving.size() || !leaving[size_t(r)])) return true;
        for (const ir::ClassicalRegister& r : c.cregs)
            if (r.name == n) return true;
        return false;
    };
    std::string name = "work";
    for (int k = 2; taken(name); ++k) name = fmt::format("work_{}", k);
    return name;
}

bool is_work_register_name(const std::string& name) {
    // `work` then any number of `_<digits>` groups (split-work-lives suffixes a taken fresh name).
    if (name.compare(0, 4, "work") != 0) return false;
    for (size_t i = 4; i < name.size();) {
        if (name[i] != '_' || i + 1 >= name.size() || !std::isdigit(static_cast<unsigned char>(name[i + 1])))
            return false;
        for (++i; i < name.size() && std::isdigit(static_cast<unsigned char>(name[i])); ++i) {
        }
    }
    return true;
}

}  // namespace whittle::passes
