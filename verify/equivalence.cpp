// The equivalence dispatcher: aligns the two circuits' wires, then runs the strongest engine that applies.
#include "verify/equivalence.h"

#include <functional>

#include <fmt/format.h>

#include "ir/error.h"
#include "verify/equiv_engines.h"

namespace whittle::passes {

const char* verdict_name(Verdict v) {
    switch (v) {
    case Verdict::Equivalent: return "equivalent";
    case Verdict::NotEquivalent: return "not equivalent";
    case Verdict::Inconclusive: return "inconclusive";
    }
    return "?";
}

namespace equiv {
namespace {

ir::Role merged_role(const ir::Circuit& a, int ra, const ir::Circuit& b, int rb, uint32_t index) {
    const bool in_a = ra >= 0 && index < a.registers[size_t(ra)].size;
    const bool in_b = rb >= 0 && index < b.registers[size_t(rb)].size;
    auto role_of = [&](const ir::Circuit& c, int r) { return c.qubits[c.registers[size_t(r)].first + index].role; };
    if (in_a && in_b) {
        const ir::Role x = role_of(a, ra), y = role_of(b, rb);
        if (x == ir::Role::Clean || y == ir::Role::Clean) return ir::Role::Clean;
        if (x == ir::Role::Dirty || y == ir::Role::Dirty) return ir::Role::Dirty;
        return ir::Role::Data;
    }
    // A wire one side has: the other side leaves it alone, and its role is what the side that has
    // it declares (a data wire there takes every input).
    return in_a ? role_of(a, ra) : role_of(b, rb);
}

ir::Circuit remapped(const ir::Circuit& src, const ir::Circuit& table, const std::vector<uint32_t>& map) {
    ir::Circuit c = table.empty_copy();
    c.cregs = src.cregs;
    c.num_cbits = src.num_cbits;
    c.global_phase = src.global_phase;
    c.files = src.files;
    c.ops.reserve(src.ops.size());
    for (const ir::Op& op : src.ops) {
        ir::Op o = op;
        if (o.target != ir::kNoWire) o.target = map[o.target];
        if (o.target2 != ir::kNoWire) o.target2 = map[o.target2];
        for (ir::Lit& l : o.controls) l = ir::Lit::make(map[l.wire()], l.positive());
        c.ops.push_back(std::move(o));
    }
    return c;
}

}  // namespace

Aligned align(const ir::Circuit& a, const ir::Circuit& b,
              const std::vector<std::pair<std::string, std::string>>& register_map) {
    // The second circuit's registers under the names they are matched by.
    ir::Circuit bn;
    bn.registers = b.registers;
    bn.qubits = b.qubits;
    for (const auto& [first, second] : register_map) {
        if (a.find_register(first) < 0)
            throw UserError(fmt::format("register map: the first program has no quantum register '{}'", first));
        const int r = b.find_register(second);
        if (r < 0) throw UserError(fmt::format("register map: the second program has no quantum register '{}'", second));
        for (const auto& [f2, s2] : register_map)
            if ((f2 == first) != (s2 == second))
                throw UserError(fmt::format("register map: '{}' and '{}' are paired more than once", first, second));
        bn.registers[size_t(r)].name = "\x01" + first;  // marked until every pair is renamed
    }
    for (ir::Register& r : bn.registers)
        if (!r.name.empty() && r.name[0] == '\x01') r.name = r.name.substr(1);
        else if (a.find_register(r.name) >= 0)
            for (const auto& [first, second] : register_map)
                if (first == r.name)
                    throw UserError(fmt::format("register map: the second program's register '{}' is matched by name "
                                                "and also paired with '{}'", r.name, second));
    // Data registers on one side only are fine (the other side leaves them alone), but both sides
    // having some means the names do not match (a writer's rename, a typo): guessing would compare
    // the wrong wires.
    auto data_only_in = [](const ir::Circuit& x, const ir::Circuit& y) {
        std::string list;
        for (const ir::Register& r : x.registers)
            if (y.find_register(r.name) < 0 && r.role == ir::Role::Data)
                list += fmt::format("{}'{}'", list.empty() ? "" : ", ", r.name);
        return list;
    };
    const std::string only_a = data_only_in(a, bn), only_b = data_only_in(bn, a);
    if (!only_a.empty() && !only_b.empty())
        throw UserError(fmt::format("the registers do not match: {} only in the first program, {} only in the "
                                    "second; pair them with --map FIRST=SECOND",
                                    only_a, only_b));
    ir::Circuit table;
    std::vector<std::string> names;
    for (const ir::Register& r : a.registers) names.push_back(r.name);
    for (const ir::Register& r : bn.registers)
        if (a.find_register(r.name) < 0) names.push_back(r.name);
    for (const std::string& name : names) {
        const int ra = a.find_register(name), rb = bn.find_register(name);
        const uint32_t sa = ra >= 0 ? a.registers[size_t(ra)].size : 0;
        const uint32_t sb = rb >= 0 ? bn.registers[size_t(rb)].size : 0;
        const uint32_t size = std::max(sa, sb);
        const bool scalar = sa == sb ? (ra >= 0 ? a.registers[size_t(ra)].scalar : bn.registers[size_t(rb)].scalar)
                                     : false;
        const uint32_t first = table.add_register(name, size, merged_role(a, ra, bn, rb, 0), scalar && size == 1);
        for (uint32_t i = 0; i < size; ++i) table.qubits[first + i].role = merged_role(a, ra, bn, rb, i);
    }
    auto wire_map = [&](const ir::Circuit& c) {  // `c` is a or bn (b's registers, matched names)
        std::vector<uint32_t> map(c.num_qubits());
        for (uint32_t w = 0; w < c.num_qubits(); ++w) {
            const ir::Qubit& q = c.qubits[w];
            const int r = table.find_register(c.registers[q.reg].name);
            WHITTLE_ASSERT(r >= 0 && "every register is in the merged table");
            map[w] = table.registers[size_t(r)].first + q.index;
        }
        return map;
    };
    Aligned al;
    al.a = remapped(a, table, wire_map(a));
    al.b = remapped(b, table, wire_map(bn));
    al.clean.resize(table.num_qubits());
    for (uint32_t w = 0; w < table.num_qubits(); ++w) {
        al.clean[w] = table.qubits[w].role == ir::Role::Clean;
        if (!al.clean[w]) al.free.push_back(w);
    }
    return al;
}

namespace {

std::string register_value(const ir::Register& r, const std::vector<uint8_t>& bits) {
    if (r.size <= 64) {
        uint64_t v = 0;
        for (uint32_t i = 0; i < r.size; ++i)
            if (bits[r.first + i]) v |= uint64_t(1) << i;
        return fmt::format("{}", v);
    }
    std::string s = "0b";
    for (uint32_t i = r.size; i-- > 0;) s += bits[r.first + i] ? '1' : '0';
    return s;
}

}  // namespace

std::string format_basis(const Aligned& al, const std::vector<uint8_t>& bits) {
    std::string s;
    for (const ir::Register& r : al.a.registers)
        s += fmt::format("{}{}={}", s.empty() ? "" : " ", r.name, register_value(r, bits));
    return s;
}

std::string format_difference(const Aligned& al, const std::vector<uint8_t>& x, const std::vector<uint8_t>& y) {
    std::string s;
    for (const ir::Register& r : al.a.registers) {
        const std::string vx = register_value(r, x), vy = register_value(r, y);
        if (vx != vy) s += fmt::format("{}{}: {} vs {}", s.empty() ? "" : ", ", r.name, vx, vy);
    }
    return s;
}

EquivResult equivalent(const char* engine, std::string confidence) {
    EquivResult r;
    r.verdict = Verdict::Equivalent;
    r.engine = engine;
    r.confidence = std::move(confidence);
    return r;
}

EquivResult not_equivalent(const char* engine, std::string confidence, std::string counterexample) {
    EquivResult r;
    r.verdict = Verdict::NotEquivalent;
    r.engine = engine;
    r.confidence = std::move(confidence);
    r.counterexample = std::move(counterexample);
    return r;
}

EquivResult inconclusive(const char* engine, std::string why) {
    EquivResult r;
    r.verdict = Verdict::Inconclusive;
    r.engine = engine;
    r.confidence = std::move(why);
    return r;
}

}  // namespace equiv

EquivResult check_equivalence(const ir::Circuit& a, const ir::Circuit& b, const EquivOptions& opts) {
    using namespace equiv;
    const Aligned al = align(a, b, opts.register_map);
    const Deadline dl(opts.time_budget_seconds);
    std::string tried;
    auto finish = [&](EquivResult r) {
        r.detail = tried + fmt::format("{}: {} ({:.3f} s)", r.engine, r.confidence, dl.elapsed());
        return r;
    };
    // Engine order: the exact engines for the narrowest class first. Each returns nullopt when the
    // circuits are outside its class and Inconclusive when it applies but cannot decide. Before the
    // path sum (which can spend half the budget and still stall on large circuits), a short witness
    // search; after it, a long one when no state vector fits.
    auto quick_witness = [](const Aligned& x, const EquivOptions& o, const Deadline& d) {
        return check_witness(x, o, d, o.time_budget_seconds / 10, 32);
    };
    auto long_witness = [](const Aligned& x, const EquivOptions& o, const Deadline& d) -> EngineResult {
        if (x.num_wires() <= kSimulateWires) return std::nullopt;
        return check_witness(x, o, d, o.time_budget_seconds, 1 << 20);
    };
    // The ZX engine decides wide equal circuits where the path sum stalls, and never says "not
    // equivalent". On circuits over kUnitaryWires wires a first try goes before the path sum with a
    // tenth of the budget (a 100-wire, 10^4-op miter takes under a second), and the path sum then
    // still gets its own half of the budget, counted from its start; when the first try ran out of
    // time, it goes on after the path sum with what is left. On narrow circuits (where the path sum
    // decides both ways, with a counterexample) it runs only after the path sum.
    double zx_early_seconds = 0;
    bool zx_early_timed_out = false;
    auto zx_early = [&](const Aligned& x, const EquivOptions& o, const Deadline& d) -> EngineResult {
        if (x.num_wires() <= kUnitaryWires) return std::nullopt;
        const double t0 = d.elapsed();
        EngineResult r = check_zx(x, o, d, o.time_budget_seconds / 10);
        zx_early_seconds = d.elapsed() - t0;
        zx_early_timed_out = r && r->verdict == Verdict::Inconclusive && r->confidence.rfind("time budget", 0) == 0;
        return r;
    };
    auto path_sum = [&](const Aligned& x, const EquivOptions& o, const Deadline& d) -> EngineResult {
        return check_path_sum(x, o, d.shifted(zx_early_seconds));
    };
    auto zx_late = [&](const Aligned& x, const EquivOptions& o, const Deadline& d) -> EngineResult {
        if (x.num_wires() > kUnitaryWires && !zx_early_timed_out) return std::nullopt;
        return check_zx(x, o, d, o.time_budget_seconds);
    };
    using Engine = std::function<EngineResult(const Aligned&, const EquivOptions&, const Deadline&)>;
    const Engine engines[] = {check_classical, check_phase, quick_witness, zx_early,
                              path_sum,        zx_late,     long_witness,  check_simulate};
    for (const Engine& engine : engines) {
        if (dl.expired()) break;
        EngineResult r = engine(al, opts, dl);
        if (!r) continue;
        // An approximated output is exactly different from its input: only a numerical engine, whose
        // tolerance covers the bound, or a witness farther away than it may say "not equivalent".
        const bool measured = r->engine == name::kUnitary || r->engine == name::kRandomStates ||
                              r->engine == name::kBranches || r->engine == name::kWitness;
        if (r->verdict == Verdict::NotEquivalent && opts.approximation_bound > 0 && !measured) {
            tried += fmt::format("{}: differs exactly, which an approximation within {:g} may do\n", r->engine,
                                 opts.approximation_bound);
            continue;
        }
        if (r->verdict != Verdict::Inconclusive) return finish(std::move(*r));
        tried += fmt::format("{}: {}\n", r->engine, r->confidence);
    }
    EquivResult r = inconclusive("none", dl.expired() ? "time budget exhausted" : "no engine could decide");
    return finish(std::move(r));
}

}  // namespace whittle::passes
