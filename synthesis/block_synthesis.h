// Numerical synthesis of a unitary on two or three qubits with the fewest entanglers a bounded
// bottom-up search finds: placements of the entangler with general one-qubit gates between them,
// parameters instantiated by Levenberg–Marquardt on a Hilbert–Schmidt-type distance.
// Method: Davis et al. 2020, arXiv:2003.04462 (bottom-up search over entangler placements with
// numerical instantiation); Smith et al. 2021, arXiv:2106.11246 (growing the circuit layer by layer
// from the best prefixes). Budgets are counted (optimizer iterations), never clock time, so a result
// is the same on every run.
#pragma once

#include <cstdint>
#include <vector>

#include <Eigen/Dense>

#include "ir/circuit.h"
#include "ir/entangler.h"
#include "synthesis/euler.h"

namespace whittle::lowering {

struct BlockSynthesisOptions {
    double max_distance = 1e-8;  ///< accept when min over phi of ||V - e^{i phi} U||_F is at most this
    int max_entanglers = 14;     ///< the deepest placement list tried
    int beam = 8;                ///< placement lists kept per depth (the best by distance)
    int restarts = 3;            ///< instantiations per placement list: one warm-started from its parent, the rest seeded at random
    int max_iterations = 300;   ///< Levenberg–Marquardt steps per instantiation
    uint64_t budget = 100000;    ///< Levenberg–Marquardt steps for the whole call (search and snapping)
    uint64_t seed = 1;           ///< the restarts' generator seed
    /// When not empty, the search runs top-down from this placement list (pairs of indices into
    /// `wires`, e.g. a block's own entanglers): lists with one placement removed are instantiated,
    /// the first that fits is kept and shortened again, until none fits.
    std::vector<std::pair<int, int>> from_places;
    bool snap = true;            ///< round angles to multiples of pi/4 where the distance stays within max_distance
};

struct BlockSynthesis {
    bool found = false;
    int entanglers = 0;
    std::vector<ir::Op> ops;     ///< on the given wires, time order: the entangler and `basis` one-qubit gates
    ir::Angle phase;             ///< e^{i phase} * product(ops) approximates u
    double distance = 0;         ///< ||e^{i phase} product(ops) - u||_F, recomputed from the ops' gate matrices; it bounds the operator-norm error
    uint64_t iterations = 0;     ///< Levenberg–Marquardt steps used (each one evaluation of the circuit)
    uint64_t instantiations = 0; ///< optimizer runs started
    int angles = 0, snapped = 0; ///< free angles of the found circuit, and how many became multiples of pi/4
};

/// Searches circuits for `u` (2^k x 2^k, k = wires.size() in {2, 3}; basis index sum of bit(wires[i])
/// << (k-1-i), so wires[0] is the high bit) with 0, 1, ... entanglers up to opts.max_entanglers;
/// the first depth at which an instantiation reaches opts.max_distance wins. Gates are the
/// entangler (CX, CZ, iSWAP, or XX with its own free angle) on wire pairs and gates of `basis` (not
/// CliffordT). `found` is false when no depth succeeded within the budget.
BlockSynthesis synthesize_block(const Eigen::MatrixXcd& u, const std::vector<uint32_t>& wires, ir::Entangler e,
                                OneQubitBasis basis, const BlockSynthesisOptions& opts = {});

/// min over phi of ||v - e^{i phi} u||_F (computed entrywise, so it is accurate far below 1e-8).
double frobenius_distance_up_to_phase(const Eigen::MatrixXcd& v, const Eigen::MatrixXcd& u);

/// The unitary of ops on `wires` only (the same index convention as synthesize_block).
Eigen::MatrixXcd block_product(const std::vector<ir::Op>& ops, const std::vector<uint32_t>& wires);

}  // namespace whittle::lowering
