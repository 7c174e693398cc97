// Engine 3: the miter (second circuit inverted after the first) as a path sum, reduced to the identity.
#include <fmt/format.h>

#include "verify/equiv_engines.h"
#include "verify/path_sum.h"

namespace whittle::passes::equiv {

EngineResult check_path_sum(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    for (const ir::Circuit* c : {&al.a, &al.b})
        for (const ir::Op& op : c->ops)
            if (!PathSum::supports(op)) return std::nullopt;
    const uint32_t n = al.num_wires();
    PathSum ps(n, al.clean, true);
    try {
        for (const ir::Op& op : al.a.ops) ps.apply(op);
        for (size_t i = al.b.ops.size(); i-- > 0;) ps.apply_inverse(al.b.ops[i]);
        if (!ps.reduce(std::max(0.0, opts.time_budget_seconds / 2 - dl.elapsed())))
            return inconclusive(name::kPathSum, fmt::format("time budget exhausted with {} path variables left",
                                                            ps.num_path_vars()));
    } catch (const AnfOverflow&) {
        return inconclusive(name::kPathSum, "a polynomial grew over its size cap");
    }
    // An output that depends on inputs only and differs from the input wire: for the input found
    // below every path ends in a basis state orthogonal to the input, whatever is left to reduce.
    for (uint32_t w = 0; w < n; ++w) {
        const Anf& f = ps.outputs()[w];
        const Anf expect = al.clean[w] ? Anf() : Anf::var(w);
        if (f == expect) continue;
        bool inputs_only = true;
        for (const Monomial& m : f.terms())
            for (Var v : m) inputs_only = inputs_only && !ps.is_path_var(v);
        if (!inputs_only) continue;
        std::vector<uint8_t> in(n, 0);
        const Anf diff = f ^ expect;
        for (Var v : diff.minimal_monomial()) in[v] = 1;
        return not_equivalent(name::kPathSum, "exact (the miter moves a basis input)",
                              fmt::format("input {}: wire {} ends different in the two circuits", format_basis(al, in),
                                          al.a.wire_name(w)));
    }
    if (ps.num_path_vars() != 0)
        return inconclusive(name::kPathSum,
                            fmt::format("reduction stopped with {} path variables left", ps.num_path_vars()));
    for (uint32_t w = 0; w < n; ++w)
        if (ps.outputs()[w] != (al.clean[w] ? Anf() : Anf::var(w)))
            return inconclusive(name::kPathSum, "outputs left in an unexpected form");
    if (!ps.phase().exact()) return inconclusive(name::kPathSum, "an angle lost exactness");
    const Monomial* least = nullptr;
    for (const auto& [m, c] : ps.phase().terms())
        if (!m.empty() && (!least || m.size() < least->size())) least = &m;
    if (least) {
        std::vector<uint8_t> in(n, 0), zero(n, 0);
        for (Var v : *least) in[v] = 1;
        return not_equivalent(name::kPathSum, "exact (the reduced miter keeps a phase on the inputs)",
                              fmt::format("input {} against input {}: the relative phase differs by {}",
                                          format_basis(al, in), format_basis(al, zero),
                                          ps.phase().terms().at(*least).to_string()));
    }
    if (ps.sqrt2_power() != 0)
        return inconclusive(name::kPathSum, "the reduced miter is not normalized (internal inconsistency)");
    return equivalent(name::kPathSum, "exact (the miter reduces to the identity)");
}

}  // namespace whittle::passes::equiv
