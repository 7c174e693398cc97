// reduce-t: the T-count engine (tcount/) as a pass, with its effort chosen by the -O level.
#include "passes/reduce_t.h"

#include <algorithm>

#include "tcount/engine.h"

namespace whittle::passes {

PassResult reduce_t(ir::Circuit& c, const PassOptions& opts) {
    PassResult result;
    tcount::EngineSettings s;
    // The reduction's effort (words of GF(2) elimination, deterministic) grows with the circuit:
    // at least enough for a GF(2^6) multiplier's one region (about 2^25), then 16 words per op at
    // -O2 (linear time: a tenth of a second per 10^6 ops on this machine) and 256 at -O3.
    const uint64_t ops = c.ops.size();
    s.todd.work_budget = uint64_t(1) << 32;
    s.total_work_budget = std::max<uint64_t>(uint64_t(1) << 31, 256 * ops);
    if (opts.level <= 2) {
        // -O2 keeps its near-linear time: smaller regions, small effort caps, and regions are
        // rebuilt only for fewer T (a rebuild for CNOTs alone leaves gate pairs at its borders that
        // only -O3's last gate-cancel takes).
        s.scan_window = 1024;
        s.max_width = 32;
        s.max_todd_columns = 160;
        s.todd.work_budget = uint64_t(1) << 24;
        s.total_work_budget = std::max<uint64_t>(uint64_t(1) << 24, 16 * ops);
        s.max_cnot_only_width = 0;  // only regions whose T-count falls are rebuilt
        s.max_cnot_only_terms = 0;
        s.max_full_width = 24;
        s.max_full_terms = 192;
    }
    s.cnots_may_grow = opts.optimize_for == Metric::TCount;
    tcount::EngineStats st;
    result.changed = tcount::reduce_t_count(c, s, st);
    if (st.hadamards_removed) result.count("hadamards-removed", int64_t(st.hadamards_removed));
    result.count("regions", int64_t(st.regions));
    result.count("ops-read", int64_t(st.ops_read));
    if (st.regions_rewritten) {
        result.count("regions-rewritten", int64_t(st.regions_rewritten));
        result.count("t-saved", st.t_saved);
        result.count("cnot-saved", st.cnot_saved);
    }
    if (st.todd_runs) {
        result.count("todd-runs", int64_t(st.todd_runs));
        result.count("todd-steps", int64_t(st.todd_steps));
        result.count("todd-work", int64_t(st.todd_work));
    }
    if (st.todd_out_of_budget) result.count("regions-at-effort-cap", int64_t(st.todd_out_of_budget));
    if (st.skipped_large) result.count("regions-too-large", int64_t(st.skipped_large));
    return result;
}

}  // namespace whittle::passes
