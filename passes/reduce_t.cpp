// reduce-t: the T-count engine (tcount/) as a pass, with its effort chosen by the -O level.
#include "passes/reduce_t.h"

#include "tcount/engine.h"

namespace whittle::passes {

PassResult reduce_t(ir::Circuit& c, const PassOptions& opts) {
    PassResult result;
    tcount::EngineSettings s;
    if (opts.level <= 2) {
        // -O2 keeps its near-linear time: smaller regions and effort caps.
        s.scan_window = 1024;
        s.max_todd_columns = 160;
        s.todd.work_budget = uint64_t(1) << 27;
        s.total_work_budget = uint64_t(1) << 30;
    }
    tcount::EngineStats st;
    result.changed = tcount::reduce_t_count(c, s, st);
    if (st.hadamards_removed) result.count("hadamards-removed", int64_t(st.hadamards_removed));
    if (st.regions_rewritten) {
        result.count("regions-rewritten", int64_t(st.regions_rewritten));
        result.count("t-saved", st.t_saved);
        result.count("cnot-saved", st.cnot_saved);
    }
    if (st.todd_steps) result.count("todd-steps", int64_t(st.todd_steps));
    if (st.todd_out_of_budget) result.count("regions-at-effort-cap", int64_t(st.todd_out_of_budget));
    if (st.skipped_large) result.count("regions-too-large", int64_t(st.skipped_large));
    return result;
}

}  // namespace whittle::passes
