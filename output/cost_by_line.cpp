// Sums the compiled circuit's costs by the source line of each op and register.
#include "output/cost_by_line.h"

#include <algorithm>
#include <map>
#include <tuple>
#include <utility>

#include <fmt/format.h>

#include "ir/resources.h"

namespace whittle::lowering {

std::vector<LineCost> cost_by_line(const ir::Circuit& output, const std::vector<passes::PassRecord>& records,
                                   ir::Metric metric) {
    std::map<std::pair<uint16_t, uint32_t>, LineCost> by_line;
    auto row = [&](const ir::SourceLoc& loc) -> LineCost& {
        const uint16_t file = loc.file;
        const uint32_t line = loc.line;
        const auto key = line == 0 ? std::make_pair(uint16_t(0), uint32_t(0)) : std::make_pair(file, line);
        LineCost& r = by_line[key];
        r.file = key.first;
        r.line = key.second;
        return r;
    };
    // Each op counted with the resource counter's own rules, so the columns add up to its totals.
    for (const ir::Op& op : output.ops) {
        if (op.kind == ir::OpKind::Barrier) continue;
        const ir::OpCounts k = ir::op_counts(op);
        LineCost& lc = row(op.loc);
        lc.t_count += k.t;
        lc.two_qubit += k.two_qubit;
        lc.rotations += k.arbitrary_rotation;
        ++lc.ops;
    }
    for (const ir::Register& reg : output.registers) row(reg.loc).qubits += reg.size;
    // The constructions chosen per line, with their multiplicity.
    std::map<std::pair<uint16_t, uint32_t>, std::map<std::string, int>> methods;
    for (const passes::PassRecord& rec : records)
        for (const passes::Construction& k : rec.result.constructions) {
            const LineCost& lc = row(k.loc);
            ++methods[{lc.file, lc.line}][k.method];
        }
    std::vector<LineCost> rows;
    for (auto& [key, lc] : by_line) {
        for (const auto& [m, n] : methods[key]) lc.constructions.push_back(n == 1 ? m : fmt::format("{} x{}", m, n));
        rows.push_back(std::move(lc));
    }
    auto key_of = [metric](const LineCost& r) {
        switch (metric) {
        case ir::Metric::TCount: return std::make_tuple(r.t_count + r.rotations, r.two_qubit, r.ops);
        case ir::Metric::TwoQubit: return std::make_tuple(r.two_qubit, r.t_count + r.rotations, r.ops);
        case ir::Metric::Depth: return std::make_tuple(r.ops, r.t_count + r.rotations, r.two_qubit);
        }
        return std::make_tuple(r.t_count, r.two_qubit, r.ops);
    };
    std::stable_sort(rows.begin(), rows.end(), [&](const LineCost& a, const LineCost& b) {
        if ((a.line == 0) != (b.line == 0)) return b.line == 0;  // the unattributed row last
        return key_of(a) > key_of(b);
    });
    return rows;
}

Json cost_by_line_json(const std::vector<LineCost>& rows, const ir::Circuit& output) {
    Json out = Json::array();
    for (const LineCost& r : rows) {
        Json j;
        j["file"] = r.line == 0 || r.file >= output.files.size() ? Json(nullptr) : Json(output.files[r.file]);
        j["line"] = r.line == 0 ? Json(nullptr) : Json(r.line);
        j["t_count"] = r.t_count;
        j["two_qubit_count"] = r.two_qubit;
        j["rotations"] = r.rotations;
        j["ops"] = r.ops;
        j["qubits"] = r.qubits;
        j["constructions"] = r.constructions;
        out.push_back(std::move(j));
    }
    return out;
}

}  // namespace whittle::lowering
