// zx-merge: phase teleportation (Kissinger, van de Wetering 2020, arXiv:1903.10477) on the IR.
#include "passes/zx_merge.h"

#include <algorithm>
#include <chrono>


#include "zx/from_circuit.h"
#include "zx/simplify.h"

namespace whittle::passes {
namespace {

/// Ops whose phase is one Z step of its own in the diagram (zx::lower_op) and can be rewritten
/// alone: a phase on one literal (a negative one is X Z X there), a one-wire parity, an
/// uncontrolled RZ (e^{-ia/2} diag(1, e^{ia})). Clifford phases are constants of the diagram.
bool trackable(const ir::Op& op) {
    if (op.is_conditioned() || op.angle.is_multiple_of_pi_over(2)) return false;
    switch (op.kind) {
    case ir::OpKind::Phase:
    case ir::OpKind::Parity: return op.controls.size() == 1;
    case ir::OpKind::RZ: return op.controls.empty();
    default: return false;
    }
}

bool t_like(const ir::Angle& a) {
    const int e = a.eighths();
    return e >= 0 && e % 2 == 1;
}

/// The simplification's budget: ample for circuits the pipeline meets; a partial simplification
/// still proves the merges it found.
constexpr double kSecondsPerMillionOps = 20;
constexpr double kMinSeconds = 2;

/// Ops per diagram. A diagram of a long random Clifford+T circuit grows dense under local
/// complementation, and a rule sweep cannot stop midway (10^5 random ops took 74 s and 2.3 GB as
/// one diagram, 5.6 s in windows of 8192 ops). A circuit of up to kWholeOps ops is one diagram
/// (every circuit of the benchmark suite and the samples: at most ~3100 ops at this pass); a longer
/// one is simplified in consecutive windows of kWindowOps ops, each a circuit of its own, and merges
/// across a window's edge are given up.
constexpr size_t kWholeOps = 16384;
constexpr size_t kWindowOps = 1024;

struct MergeTotals {
    size_t groups = 0, merged = 0, cuts = 0, spiders = 0, rewrites = 0, windows = 0;
    int64_t t_saved = 0;
    bool stopped = false;
};

/// Phase teleportation on ops [lo, hi): merged angles written into the group's first op, the
/// others marked in `erase`.
void merge_window(ir::Circuit& c, size_t lo, size_t hi, std::vector<uint8_t>& erase, MergeTotals& tot) {
    zx::Graph g;
    zx::DiagramBuilder build(g, c.num_qubits(), {}, true);
    std::vector<zx::Step> steps;
    std::vector<uint32_t> wires;
    for (size_t i = lo; i < hi; ++i) {
        const ir::Op& op = c.ops[i];
        steps.clear();
        if (zx::lower_op(op, trackable(op) ? uint32_t(i) : zx::kNoSource, steps)) {
            wires.clear();
            op.wires(wires);
            for (uint32_t w : wires) build.cut(w);
            ++tot.cuts;
            continue;
        }
        for (const zx::Step& s : steps) build.apply(s);
    }
    build.finish();
    const double seconds = std::max(kMinSeconds, kSecondsPerMillionOps * double(hi - lo) * 1e-6);
    const auto deadline = std::chrono::steady_clock::now() +
                          std::chrono::duration_cast<std::chrono::steady_clock::duration>(std::chrono::duration<double>(seconds));
    zx::SimplifyStats st;
    if (!zx::reduce_to_fixpoint(g, st, deadline)) tot.stopped = true;
    ++tot.windows;
    tot.spiders += g.num_vertices();
    tot.rewrites += st.total();

    // Each spider holding two or more sources is a group: the diagram depends on their values only
    // through sum(sign * angle). Source s acts as e^{i a_s f} for sign +1 and e^{i a_s (1 xor f)}
    // for sign -1, f the spider's value, so the group is e^{i theta f} e^{i sum_{sign -1} a_s}: the
    // first op gets theta (or -theta on 1 xor f, which costs e^{-i theta}) and the global phase the rest.
    for (zx::Vertex v = 0; v < g.id_bound(); ++v) {
        if (!g.alive(v) || g.sources(v).size() < 2) continue;
        std::vector<uint32_t> src = g.sources(v);
        std::sort(src.begin(), src.end());
        ir::Angle theta, rest;
        int64_t t_before = 0;
        for (uint32_t s : src) {
            const ir::Angle& a = c.ops[s].angle;
            theta += g.sign(s) > 0 ? a : -a;
            if (g.sign(s) < 0) rest += a;
            t_before += t_like(a);
        }
        const uint32_t rep = src[0];
        const ir::Angle fresh = g.sign(rep) > 0 ? theta : -theta;
        if (g.sign(rep) < 0) rest += theta;
        const int64_t t_after = fresh.is_zero() ? 0 : t_like(fresh);
        if (t_after > t_before) continue;  // e.g. pi/8 + pi/8 = pi/4: fewer rotations, one more T
        ++tot.groups;
        tot.merged += src.size() - (fresh.is_zero() ? 0 : 1);
        tot.t_saved += t_before - t_after;
        c.global_phase += rest;
        for (uint32_t s : src) {
            ir::Op& op = c.ops[s];
            const ir::Angle now = s == rep ? fresh : ir::Angle();
            if (op.kind == ir::OpKind::RZ)  // RZ(a) = e^{-ia/2} diag(1, e^{ia}): keep its scalar exactly
                c.global_phase += now.divided_by(2) - op.angle.divided_by(2);
            op.angle = now;
            if (now.is_zero()) erase[s] = 1;
        }
    }
}

}  // namespace

PassResult zx_merge(ir::Circuit& c, const PassOptions&) {
    PassResult res;
    size_t candidates = 0;
    for (const ir::Op& op : c.ops) candidates += trackable(op);
    if (candidates < 2) return res;

    std::vector<uint8_t> erase(c.ops.size(), 0);
    MergeTotals tot;
    const size_t window = c.ops.size() <= kWholeOps ? c.ops.size() : kWindowOps;
    for (size_t lo = 0; lo < c.ops.size(); lo += window) merge_window(c, lo, std::min(c.ops.size(), lo + window), erase, tot);
    res.count("spiders-left", int64_t(tot.spiders));
    res.count("rewrites", int64_t(tot.rewrites));
    res.count("cuts", int64_t(tot.cuts));
    if (tot.windows > 1) res.count("windows", int64_t(tot.windows));
    if (tot.stopped) res.notes.push_back("simplification stopped at its time budget; the merges found so far are used");
    if (tot.groups == 0) return res;
    size_t out = 0;
    for (size_t i = 0; i < c.ops.size(); ++i)
        if (!erase[i]) {
            if (out != i) c.ops[out] = std::move(c.ops[i]);
            ++out;
        }
    c.ops.resize(out);
    res.changed = true;
    res.count("groups-merged", int64_t(tot.groups));
    res.count("phases-removed", int64_t(tot.merged));
    res.count("t-saved", tot.t_saved);
    return res;
}

}  // namespace whittle::passes
