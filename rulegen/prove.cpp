// Exact proof of a symbolic rule by the project's equivalence checker at finitely many exact points.
//
// Why finitely many points suffice. Write x_j = p_j / 2. Every gate matrix of a gate set is, entry by
// entry, a Laurent polynomial in z_j = e^{i x_j}: a rotation by a form sum c_j p_j (c_j in {-1,0,1})
// has entries in e^{+-i sum c_j x_j} (|c_j| in each z_j), R's phi enters as e^{+-i phi} (degree 2 in
// z_j per unit coefficient), fixed gates are constant. A product of gates therefore has entries of
// degree at most d_j(side) in z_j and z_j^{-1}, d_j the sum of those per-slot degrees (GateInfo::
// half_degree). L = e^{i g} R for some phase g holds at a point iff L and R are linearly dependent
// (both are unitary, so neither is 0), iff every 2x2 minor L_u R_v - L_v R_u (u, v entries) is 0.
// Each minor is a Laurent polynomial of degree at most D_j = d_j(L) + d_j(R) in z_j; times
// z_j^{D_j} it is a polynomial of degree at most 2 D_j in each z_j. A polynomial in several
// variables with degree <= 2 D_j in z_j that vanishes on a grid S_1 x ... x S_m with |S_j| > 2 D_j
// is zero (Alon 1999, "Combinatorial Nullstellensatz", Lemma 2.1; by induction on the variables,
// a one-variable polynomial of degree <= n with n + 1 roots is zero). So it suffices that the
// checker proves L = R up to global phase at p_j = 2*pi*k/N_j, k = 0..N_j-1, N_j = 2 D_j + 1: the
// points z_j = e^{i pi k / N_j} are distinct. Angles are stored mod 2*pi, which changes a rotation
// by a sign only (a global phase: every gate here is uncontrolled), so the check at the stored angle
// is the check at the point. Only the checker's exact engines count ("exact" confidence); a point
// it cannot decide exactly leaves the rule unproved.
#include "rulegen/prove.h"

#include <fmt/format.h>

#include "verify/equivalence.h"

namespace whittle::rulegen {
namespace {

using rules::kMaxParams;

int side_degree(const rules::Seq& s, int param) {
    int d = 0;
    for (const rules::Gate& g : s) {
        const rules::GateInfo& info = rules::gate_info(g.name);
        for (int slot = 0; slot < info.slots; ++slot)
            d += (g.a[slot].coef[param] != 0 ? 1 : 0) * info.half_degree[slot];
    }
    return d;
}

ir::Circuit build(const rules::Seq& s, int wires, const std::array<ir::Angle, kMaxParams>& values) {
    ir::Circuit c;
    c.add_register("q", uint32_t(wires), ir::Role::Data);
    for (const rules::Gate& g : s) c.ops.push_back(rules::to_op(g, values));
    return c;
}

}  // namespace

int points_needed(const rules::Rule& rule, int param) {
    return 2 * (side_degree(rule.lhs, param) + side_degree(rule.rhs, param)) + 1;
}

ProofResult prove_rule(const rules::Rule& rule, const rules::GateSet& set) {
    ProofResult out;
    std::array<int, kMaxParams> n{};
    for (int j = 0; j < kMaxParams; ++j) n[j] = points_needed(rule, j);
    passes::EquivOptions opts;
    opts.allow_probabilistic = false;
    opts.time_budget_seconds = 5;
    std::array<int, kMaxParams> k{};
    for (;;) {
        std::array<ir::Angle, kMaxParams> values;
        for (int j = 0; j < kMaxParams; ++j) values[j] = ir::Angle::pi_times(2 * k[j], n[j]);
        const passes::EquivResult r =
            passes::check_equivalence(build(rule.lhs, set.wires, values), build(rule.rhs, set.wires, values), opts);
        if (r.verdict != passes::Verdict::Equivalent || r.confidence.rfind("exact", 0) != 0) {
            std::string at;
            for (int j = 0; j < set.params; ++j) at += fmt::format(" {}={}", char('a' + j), values[j].to_string());
            out.why = fmt::format("at{}: {} by {} ({})", at.empty() ? " the only point" : at,
                                  passes::verdict_name(r.verdict), r.engine, r.confidence);
            return out;
        }
        ++out.points;
        int j = 0;
        while (j < kMaxParams && ++k[j] == n[j]) k[j++] = 0;
        if (j == kMaxParams) break;
    }
    out.proved = true;
    return out;
}

}  // namespace whittle::rulegen
