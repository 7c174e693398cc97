// The T-count engine: Hadamard-free regions of a lowered circuit, TODD on each, parity-network resynthesis.
#pragma once

#include <cstddef>
#include <cstdint>

#include "ir/circuit.h"
#include "tcount/todd.h"
#include "tcount/tohpe.h"

namespace whittle::tcount {

struct EngineSettings {
    bool exchange_frames = true;      ///< first move H gates out of CNOT stretches (hadamard_frames.h)
    uint32_t max_width = 64;          ///< wires per region (the parities are 64-bit masks)
    size_t max_region_ops = 20000;    ///< ops per region
    size_t scan_window = 4096;        ///< ops read while growing one region, at most
    uint32_t max_todd_width = 48;     ///< regions wider than this keep their T gates (resynthesis only)
    size_t max_todd_columns = 512;    ///< ... and those with more T terms than this
    /// A region whose T gates cannot drop is rebuilt (for fewer CNOTs) only up to this width and
    /// this many phase terms: resynthesis is most of the engine's time on large generic circuits.
    uint32_t max_cnot_only_width = 24;
    size_t max_cnot_only_terms = 96;
    /// The whole-region parity network is tried up to this width and term count; larger regions
    /// keep their CNOT skeleton with the terms placed on it (much cheaper to build).
    uint32_t max_full_width = 32;
    size_t max_full_terms = 256;
    /// T first: a region with fewer T gates is taken even with more CNOTs. When false (the user
    /// optimizes for two-qubit gates or depth), only when its CNOTs do not grow.
    bool cnots_may_grow = true;
    ToddSettings todd;                ///< effort per region
    /// TOHPE (tohpe.h) also runs on each region TODD runs on, with TODD's per-region cap and a
    /// circuit-wide cap of its own (total_work_budget again); the shorter column list is kept.
    bool run_tohpe = true;
    TohpeSettings tohpe;              ///< its plateau moves (the budget is set per region)
    uint64_t total_work_budget = uint64_t(16) << 30;  ///< effort for the whole circuit, then regions are left alone
};

struct EngineStats {
    size_t regions = 0;            ///< regions of two ops or more
    size_t ops_read = 0;           ///< ops read while growing regions (an op can be read by several)
    size_t regions_rewritten = 0;
    size_t hadamards_removed = 0;  ///< by the frame exchange
    int64_t t_saved = 0;
    int64_t cnot_saved = 0;        ///< over the rewritten regions (may be negative when T fell)
    size_t todd_steps = 0;
    size_t todd_runs = 0;          ///< regions the reduction ran on
    uint64_t todd_work = 0;        ///< its effort, in words of elimination
    size_t todd_out_of_budget = 0; ///< regions whose reduction stopped at the effort cap
    size_t tohpe_runs = 0;         ///< regions TOHPE ran on
    size_t tohpe_wins = 0;         ///< ... and gave fewer T than TODD
    uint64_t tohpe_work = 0;       ///< its effort, in words of elimination
    size_t skipped_large = 0;      ///< regions too wide or with too many T terms for the reduction
};

/// On a circuit in H / CNOT / X / phase form (a lowered circuit before to-target): optionally the
/// frame exchange, then each maximal Hadamard-free region (CNOT, X, Swap, CZ, phases on one
/// literal and on parities; finer angles than pi/4 are passed through to the same parity) is read
/// as a phase polynomial, its odd part reduced by TODD (todd.h), the Clifford difference computed
/// exactly (even_difference) and added back, and the region rebuilt by a Gray-code parity network
/// followed by its linear output map, or on its own CNOT skeleton, whichever has fewer CNOTs. A
/// region is replaced only when the new one has fewer T gates (and, unless cnots_may_grow, no more
/// CNOTs), or as many and fewer CNOTs; every replacement is checked against the region's phase
/// polynomial (output map, all terms) before it is kept (an internal error if it differs).
/// Deterministic. Returns true when the circuit changed; Circuit::global_phase absorbs the
/// constants the regions move out.
bool reduce_t_count(ir::Circuit& c, const EngineSettings& settings, EngineStats& stats);

}  // namespace whittle::tcount
