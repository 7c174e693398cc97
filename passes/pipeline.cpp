// The pipelines for each -O level, written out in one place, and the pass runner.
#include "passes/pipeline.h"

#include <sys/resource.h>
#include <time.h>

#include <chrono>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/op_prefix_release.h"
#include "ir/resources.h"
#include "passes/registry.h"

namespace whittle::passes {
namespace {

/// CPU seconds used so far by the calling thread.
double thread_cpu_seconds() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return double(ts.tv_sec) + double(ts.tv_nsec) * 1e-9;
}

/// From this many ops (64 MiB of op list) on, the runner hands unused memory back after each pass.
constexpr size_t kLargeOpList = size_t(1) << 20;

/// The process's peak resident set so far in KiB (Linux reports ru_maxrss in KiB).
long peak_rss_kib() {
    rusage ru{};
    return getrusage(RUSAGE_SELF, &ru) == 0 ? ru.ru_maxrss : 0;
}

}  // namespace

std::vector<std::string> pipeline_for(const PassOptions& opts) {
    std::vector<std::string> p;
    auto add = [&](std::initializer_list<const char*> names) {
        for (const char* n : names) p.emplace_back(n);
    };
    const int level = opts.level;
    // -O0: no optimization; only the lowering (below) runs when a target is given.
    if (level >= 1) {
        // normalize first: every later pass compares ops structurally and expects phases as
        // Phase ops with sorted literals. cancel then removes the cheap inverse pairs (nested
        // compute/uncompute halves first) so later passes see less.
        add({"normalize", "cancel"});
    }
    if (level >= 2) {
        // merge-controls after cancel: cancellation can leave op(C&x), op(C&!x) side by side.
        // fold-phases next, on the fewest and largest ops (a merged control is one term, not two);
        // it runs before lowering, while AND terms are still visible as products. The last cancel
        // picks up inverse pairs the merges and folds exposed.
        add({"merge-controls", "fold-phases", "cancel"});
    }
    if (level >= 3) {
        // -O3 repeats the round: merges expose cancellations and foldings, and vice versa.
        add({"merge-controls", "fold-phases", "cancel"});
    }
    // Last of all (at -O1 and up): clean work wires whose lives do not overlap share wires, and the
    // work wires no op touches leave the output.
    if (!opts.target) {
        if (level >= 1) add({"split-work-lives", "share-work-wires", "drop-idle-wires"});
        return p;
    }
    // Lowering to the target gate set (lowering/): pairs and free wires are found on the optimized
    // high-level ops, multi-controls become Toffolis chosen by those free wires, Toffolis become
    // Clifford+T (nct keeps them), then the target's own gates and its cleanup (one-qubit fusion,
    // and KAK resynthesis of two-qubit blocks on the rotation targets).
    // split-work-lives first, while the work wires' values are still classical: a wire the front
    // end handed from one routine call to the next, back at |0> in between, becomes one wire per
    // life, so the lowering sees it free between them and share-work-wires (last) can pack the lives.
    // (It can also cost T, by splitting what the lowering would have paired; compile then keeps
    // the cheaper of the runs with and without it.)
    if (level >= 2 && opts.split_work_lives) add({"split-work-lives"});
    add({"pair-uncompute", "plan-ancillas", "lower-controls"});
    // pair-uncompute again: the constructions' own Toffolis (e.g. the two halves of the Lemma 7.3
    // split) form pairs that lower-toffoli can give relative phases; it checks every middle.
    if (*opts.target != ir::Target::Nct) add({"pair-uncompute", "lower-toffoli"});
    if (level >= 1) {
        // Low level, still in H / CNOT / phase form (before to-target turns H into the target's
        // axes and hides the path variables). gate-cancel first removes the H pairs between
        // Toffolis on one target (the Clifford+T forms end and start with H on it), so
        // fold-rotations sees one path variable where there were two; it then merges rotations
        // on equal parities (the control-only terms of a Toffoli and of its uncompute). A last
        // gate-cancel removes the pairs the merges left.
        add({"gate-cancel", "fold-rotations", "gate-cancel"});
        if (level >= 3) add({"fold-rotations", "gate-cancel"});
        // clifford+t, where T is the cost: reduce-t after the folding (it starts from the folded
        // terms, and its regions are the H-free stretches gate-cancel left), still before
        // to-target (its phases and CZs are lowered there). At -O3 a last gate-cancel takes the
        // gate pairs where a rebuilt region meets its neighbours (-O2 rebuilds only regions whose
        // T-count falls, and saves the time).
        if (level >= 2 && *opts.target == ir::Target::CliffordT) add({"reduce-t"});
        // zx-merge after it: phase teleportation finds the merges that a ZX diagram's graph-like
        // simplification exposes across H gates and CZ structure; it only removes or changes
        // phases, so reduce-t's regions and CNOTs stay as they are.
        if (level >= 2 && *opts.target == ir::Target::CliffordT) add({"zx-merge"});
        if (level >= 3 && *opts.target == ir::Target::CliffordT) add({"gate-cancel"});
    }
    add({"to-target", "fuse-1q"});
    if (*opts.target != ir::Target::Nct && *opts.target != ir::Target::CliffordT) add({"resynth-2q", "fuse-1q"});
    // -O3 on the rotation targets with a library: the rule search after the KAK blocks (it finds
    // the rewrites across three wires and across commuting gates that a two-wire block cannot
    // see), and one-qubit fusion again for the runs its rewrites leave.
    const bool has_library = *opts.target == ir::Target::CxRzSx || *opts.target == ir::Target::CzRxRz ||
                             *opts.target == ir::Target::ISwapRzRx || *opts.target == ir::Target::XxR;
    // -O3 on the rotation targets, on request only (--resynth-effort N, default 0): three-wire
    // blocks resynthesized numerically with fewer entanglers (after the two-wire blocks took what
    // KAK finds, so only the wider wins are searched), then one-qubit fusion for the gates the new
    // circuits meet. Off by default: on the benchmark suite it found almost nothing the rule
    // search does not, at 20x the compile time (docs/resynthesis.md).
    if (level >= 3 && has_library && opts.resynth_effort > 0) add({"resynth-3q", "fuse-1q"});
    if (level >= 3 && has_library && opts.rewrite_effort > 0) add({"rewrite-search", "fuse-1q"});
    if (level >= 1) add({"share-work-wires", "drop-idle-wires"});
    return p;
}

std::vector<std::string> parse_pass_list(const std::string& list) {
    std::vector<std::string> names;
    size_t start = 0;
    while (start <= list.size()) {
        size_t comma = list.find(',', start);
        if (comma == std::string::npos) comma = list.size();
        std::string name = list.substr(start, comma - start);
        if (!name.empty()) {
            if (!find_pass(name)) {
                std::string known;
                for (const PassInfo& p : all_passes()) known += (known.empty() ? "" : ", ") + std::string(p.name);
                throw UserError(fmt::format("unknown pass '{}' (known passes: {})", name, known));
            }
            names.push_back(name);
        }
        start = comma + 1;
    }
    return names;
}

std::vector<PassRecord> run_passes(ir::Circuit& c, const std::vector<std::string>& names, const PassOptions& opts,
                                   const PipelineHooks& hooks) {
    std::vector<PassRecord> records;
    // One count per pass boundary: a pass's "after" is the next one's "before", and a pass that
    // reports no change (PassResult::changed is false exactly then) leaves both alone.
    ir::TAndCnotCount before;
    bool counted = false;
    for (size_t i = 0; i < names.size(); ++i) {
        const PassInfo* info = find_pass(names[i]);
        if (!info) throw UserError(fmt::format("unknown pass '{}'", names[i]));
        if (hooks.progress) hooks.progress(info->name, i, names.size());
        PassRecord rec;
        rec.name = info->name;
        if (!counted) before = ir::count_t_and_cnot(c);
        counted = true;
        rec.ops_before = c.ops.size();
        rec.t_before = int64_t(before.t_count);
        rec.cnot_before = int64_t(before.cnot_count);
        ir::Circuit snapshot;
        if (hooks.verify) snapshot = c;
        auto t0 = std::chrono::steady_clock::now();
        const double cpu0 = thread_cpu_seconds();
        rec.result = info->run(c, opts);
        if (c.ops.capacity() >= kLargeOpList) {
            // What the pass left resident but unused goes back before the next pass builds its
            // tables: the op list's pages past its end (a pass that erased or over-reserved), and
            // the free pages inside malloc's heap (a pass's many small per-wire vectors, freed).
            ir::release_spare_capacity(c.ops);
#if defined(__GLIBC__)
            malloc_trim(0);
#endif
        }
        rec.cpu_seconds = thread_cpu_seconds() - cpu0;
        rec.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        rec.peak_rss_kib = peak_rss_kib();
        rec.changed = rec.result.changed;
        if (rec.changed) {
            ir::verify(c);
            before = ir::count_t_and_cnot(c);
        } else if (c.ops.size() != rec.ops_before) {
            throw InternalError(fmt::format("pass '{}' changed the op count but reported no change", rec.name));
        }
        const ir::TAndCnotCount& after = before;
        rec.ops_after = c.ops.size();
        rec.t_after = int64_t(after.t_count);
        rec.cnot_after = int64_t(after.cnot_count);
        if (hooks.verify && rec.changed) rec.checked_by = hooks.verify(rec.name, snapshot, c);
        if (hooks.after_pass && rec.changed) hooks.after_pass(rec.name, c);
        records.push_back(std::move(rec));
    }
    if (hooks.progress) hooks.progress("done", names.size(), names.size());
    return records;
}

}  // namespace whittle::passes
