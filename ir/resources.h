// Resource counts of a circuit: qubits by role, gates by name, T-count, T-depth, CNOT, 2q, depth.
#pragma once

#include <cstdint>
#include <map>
#include <string>

#include "ir/circuit.h"

namespace whittle::ir {

struct Resources {
    uint32_t qubits = 0, data_qubits = 0, clean_qubits = 0, dirty_qubits = 0;
    uint64_t ops = 0;
    uint64_t t_count = 0;          ///< one-wire phases by an odd multiple of pi/4 (T, T-dagger and T-like)
    uint64_t t_depth = 0;          ///< layers of T gates when every other gate is scheduled ASAP
    uint64_t cnot_count = 0;       ///< X with exactly one control
    uint64_t two_qubit_count = 0;  ///< ops on exactly two wires
    uint64_t toffoli_count = 0;    ///< X with exactly two controls
    uint64_t mcx_count = 0;        ///< X with three or more controls
    uint64_t measurements = 0;
    uint64_t depth = 0;            ///< ASAP layers over all ops except barriers
    uint64_t non_clifford_rotations = 0;  ///< rotations/phases whose angle is not a multiple of pi/4 (or pi/2 for controls)
    uint64_t rotation_depth = 0;   ///< layers of those rotations when every other op is scheduled ASAP
    /// Most wires live at once, in op order: a data wire is live throughout; a clean or borrowed wire
    /// from the first op that touches it to the last (an untouched one never).
    uint32_t peak_live_qubits = 0;
    std::map<std::string, uint64_t> gates;  ///< count by gate name (see gate_name)
};

/// The name a gate is counted under: x, cx, ccx, mcx, z, s, sdg, t, tdg, p, cz, cp, ccz, mcphase,
/// parity, h, ch, rz, crz, ..., swap, cswap, iswap, xx, r, u, measure, reset. Classically
/// conditioned ops count under the same name.
std::string gate_name(const Op& op);

Resources count_resources(const Circuit& c);

/// What one op adds to the counts above (the rules count_resources uses).
struct OpCounts {
    bool t = false;                   ///< a T-like one-wire phase
    bool two_qubit = false;           ///< on exactly two wires
    bool arbitrary_rotation = false;  ///< a rotation or phase by an angle that is not a multiple of pi/4
};
OpCounts op_counts(const Op& op);

/// The T-count and CNOT count alone, as count_resources counts them (the pass runner records these
/// at every pass boundary; no depth, no table by gate name).
struct TAndCnotCount {
    uint64_t t_count = 0, cnot_count = 0;
};
TAndCnotCount count_t_and_cnot(const Circuit& c);

}  // namespace whittle::ir
