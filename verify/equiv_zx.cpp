// The ZX engine: the miter (first circuit, then the second inverted) as a ZX diagram, simplified to bare wires.
//
// Peham, Burgholzer, Wille 2022, arXiv:2208.12820: if the graph-like simplification of Duncan,
// Kissinger, Perdrix, van de Wetering 2020 (arXiv:1902.03178) reduces the diagram of b^dagger a to
// the identity, a and b are equal up to a global phase; if it does not, nothing follows, so this
// engine only ever answers "equivalent" or passes on.
//
// Why "bare wires" proves it: every rule keeps the diagram's map up to a non-zero scalar, and the
// miter with |0> plugged into its clean wires is b^dagger a (I x |0>), a non-zero map. A diagram
// whose boundaries are only input-output wires in the identity permutation (and |0> effects on the
// clean outputs, see below), plus parts with no boundary (numbers), is c (I x |0>) with c != 0;
// so b^dagger a |x,0> = c |x,0> for every x, and unitarity makes |c| = 1.
#include <fmt/format.h>

#include "verify/equiv_engines.h"
#include "zx/from_circuit.h"
#include "zx/simplify.h"

namespace whittle::passes::equiv {
namespace {

bool exact_angles(const ir::Op& op) {
    return op.angle.is_exact() && op.phi().is_exact() && op.lambda().is_exact();
}

}  // namespace

EngineResult check_zx(const Aligned& al, const EquivOptions& opts, const Deadline& dl, double seconds) {
    // Measurements, resets and classical conditions are refused by lower_op: the miter of two
    // measured circuits is not a unitary, and the bare-wire argument above needs one.
    std::vector<zx::Step> steps;
    for (const ir::Circuit* c : {&al.a, &al.b})
        for (const ir::Op& op : c->ops) {
            steps.clear();
            if (!exact_angles(op) || zx::lower_op(op, zx::kNoSource, steps)) return std::nullopt;
        }
    const uint32_t n = al.num_wires();
    zx::Graph g;
    zx::DiagramBuilder build(g, n, al.clean);
    for (const ir::Op& op : al.a.ops) {
        steps.clear();
        zx::lower_op(op, zx::kNoSource, steps);
        for (const zx::Step& s : steps) build.apply(s);
    }
    for (size_t i = al.b.ops.size(); i-- > 0;) {
        steps.clear();
        zx::lower_op(al.b.ops[i], zx::kNoSource, steps);
        zx::invert_steps(steps);
        for (const zx::Step& s : steps) build.apply(s);
    }
    build.finish();
    const size_t built = g.num_vertices();
    const double left = std::max(0.0, std::min(seconds, opts.time_budget_seconds - dl.elapsed()));
    const auto deadline = std::chrono::steady_clock::now() + std::chrono::duration_cast<std::chrono::steady_clock::duration>(
                                                                  std::chrono::duration<double>(left));
    zx::SimplifyStats st;
    if (!zx::reduce_to_fixpoint(g, st, deadline))
        return inconclusive(name::kZx, fmt::format("time budget exhausted with {} of {} vertices left",
                                                   g.num_vertices(), built));
    for (uint32_t w = 0; w < n; ++w) {
        const zx::Vertex out = g.outputs[w];
        if (g.degree(out) != 1) return inconclusive(name::kZx, "a boundary lost its one edge (internal inconsistency)");
        const zx::Vertex v = g.neighbors(out)[0];
        const zx::EdgeKind k = g.edge_kind(out, v);
        // A clean wire started as |0> and must end as |0>: a phase-free Z spider of degree 1 behind
        // a Hadamard edge. A data wire must be a plain edge to its own input.
        const bool ok = al.clean[w] ? !g.is_boundary(v) && g.degree(v) == 1 && g.phase(v).is_exact() &&
                                          g.phase(v).is_zero() && k == zx::EdgeKind::Hadamard
                                    : v == g.inputs[w] && k == zx::EdgeKind::Plain;
        if (!ok)
            return inconclusive(name::kZx, fmt::format("the diagram kept {} of {} vertices (wire {} is not a bare wire)",
                                                       g.num_vertices(), built, al.a.wire_name(w)));
    }
    return equivalent(name::kZx, fmt::format("exact (the miter's ZX diagram reduces to bare wires: {} of {} "
                                             "vertices left after {} rewrites)",
                                             g.num_vertices(), built, st.total()));
}

}  // namespace whittle::passes::equiv
