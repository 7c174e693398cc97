// reduce-t: the T-count engine (tcount/) as a pass, with its effort chosen by the -O level.
#include "passes/reduce_t.h"

#include <algorithm>

#include <fmt/format.h>

#include "ir/resources.h"
#include "tcount/engine.h"
#include "tcount/hadamard_frames.h"
#include "tcount/hadamard_gadgets.h"

namespace whittle::passes {
namespace {

/// Above this many ops the gadget run (a second copy of the circuit) is not tried.
constexpr size_t kGadgetMaxOps = size_t(1) << 21;

}  // namespace

PassResult reduce_t(ir::Circuit& c, const PassOptions& opts) {
    PassResult result;
    tcount::EngineSettings s;
    // The reduction's effort (words of GF(2) elimination, deterministic) grows with the circuit:
    // at least enough for a GF(2^6) multiplier's one region (about 2^25), then 16 words per op at
    // -O2 (linear time: a tenth of a second per 10^6 ops on this machine) and 256 at -O3.
    const uint64_t ops = c.ops.size();
    s.todd.work_budget = uint64_t(1) << 32;
    s.total_work_budget = std::max<uint64_t>(uint64_t(1) << 31, 256 * ops);
    s.tohpe.max_kicks = 16;  // plateau moves after TOHPE's first descent (-O3 only)
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
        s.run_tohpe = false;  // -O3 only: it more than doubles the reduction's time on GF(2^5)
    }
    s.cnots_may_grow = opts.optimize_for == Metric::TCount;
    tcount::EngineStats st;
    // With measurement allowed and gadget wires granted, a second run on a copy first replaces the
    // inner H gates by Hadamard gadgets (tcount/hadamard_gadgets.h), so that the engine sees whole
    // stretches as one region on n + h wires; it is kept only when it ends with fewer T gates
    // than the plain run, so the option never makes the T-count worse.
    const bool gadgets = opts.allow_measurement && opts.gadget_wires > 0 && c.ops.size() <= kGadgetMaxOps &&
                         !opts.work_wires_within_lives;
    // Where the lowering kept every work wire inside its life (PassOptions::work_wires_within_lives)
    // or the run has a qubit limit, a rebuilt region may stretch a life across it: the pass is
    // undone if it raised the peak of live qubits above both the limit and the peak before it.
    const bool guard_peak = opts.work_wires_within_lives || opts.qubit_limit;
    ir::Circuit before;
    uint32_t peak_cap = 0;
    if (guard_peak) {
        before = c;
        peak_cap = std::max(ir::count_resources(c).peak_live_qubits, opts.qubit_limit.value_or(0));
    }
    ir::Circuit with_gadgets;
    if (gadgets) with_gadgets = c;
    result.changed = tcount::reduce_t_count(c, s, st);
    if (gadgets) {
        tcount::GadgetSettings gs;
        gs.max_wires = opts.gadget_wires;
        // A stretch no wider than the regions TODD runs on: a wider one would only be resynthesized.
        gs.max_width = std::min<uint32_t>({s.max_width, s.max_todd_width, 64});
        tcount::GadgetStats gst;
        tcount::EngineStats gst_engine;
        const size_t frames = tcount::exchange_hadamard_frames(with_gadgets);
        if (tcount::insert_hadamard_gadgets(with_gadgets, gs, gst)) {
            tcount::EngineSettings gsettings = s;
            gsettings.exchange_frames = false;
            tcount::reduce_t_count(with_gadgets, gsettings, gst_engine);
            const ir::TAndCnotCount plain_count = ir::count_t_and_cnot(c), gadget_count = ir::count_t_and_cnot(with_gadgets);
            result.count("gadgets", int64_t(gst.gadgets));
            result.count("gadget-run-t", int64_t(gadget_count.t_count));
            const bool keep = gadget_count.t_count < plain_count.t_count;
            result.notes.push_back(fmt::format(
                "Hadamard gadgets ({} on {} fresh wire(s), --gadget-wires {}): T {} against {} without, CNOT {} against {}; {}",
                gst.gadgets, gst.wires, opts.gadget_wires, gadget_count.t_count, plain_count.t_count,
                gadget_count.cnot_count, plain_count.cnot_count, keep ? "kept" : "not kept (no fewer T)"));
            if (keep) {
                c = std::move(with_gadgets);
                st = gst_engine;
                st.hadamards_removed += frames;
                result.changed = true;
                result.count("gadget-wires", int64_t(gst.wires));
            }
        }
    }
    if (guard_peak && result.changed && ir::count_resources(c).peak_live_qubits > peak_cap) {
        result.notes.push_back(fmt::format("undone: the rebuilt regions raised the peak of live qubits above {}", peak_cap));
        c = std::move(before);
        result.changed = false;
        result.count("undone-for-peak-qubits");
        return result;
    }
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
    if (st.tohpe_runs) {
        result.count("tohpe-runs", int64_t(st.tohpe_runs));
        result.count("tohpe-wins", int64_t(st.tohpe_wins));
        result.count("tohpe-work", int64_t(st.tohpe_work));
    }
    if (st.todd_out_of_budget) result.count("regions-at-effort-cap", int64_t(st.todd_out_of_budget));
    if (st.skipped_large) result.count("regions-too-large", int64_t(st.skipped_large));
    return result;
}

}  // namespace whittle::passes
