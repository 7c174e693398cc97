// Per-target lowering of the gates left after lower-controls / lower-toffoli into a target's own gates.
#pragma once

#include "ir/circuit.h"
#include "lowering/op_sink.h"
#include "lowering/targets.h"

namespace whittle::lowering {

/// The error allowance for rotations that are not multiples of pi/4 (Ross-Selinger approximation),
/// and what the approximations used of it.
struct RotationBudget {
    double epsilon = 1e-10;   ///< operator-norm error allowed per approximated rotation
    double error_bound = 0;   ///< sum of the approximations' error bounds
    int approximated = 0;     ///< rotations approximated
};

/// Appends `op` rewritten into clifford+t gates (H S Sdg T Tdg X Y Z CNOT, measurement and
/// feed-forward). Multiples of pi/4 become exact words; other angles are approximated within
/// budget.epsilon and their bounds added to the budget. UserError naming the op when it has no
/// clifford+t form (an op still controlled beyond CNOT/Toffoli: lower-controls did not run).
void to_clifford_t(const ir::Op& op, OpSink& s, const ir::Circuit& c, RotationBudget& budget);

/// Appends `op` as NOT/CNOT/Toffoli with positive controls; UserError for anything non-classical.
void to_nct(const ir::Op& op, OpSink& s, const ir::Circuit& c);

/// Appends `op` in the gates of a rotation target (cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, u+cx):
/// one-qubit gates by Euler synthesis in the target's axes, two-qubit gates by the KAK synthesis
/// with the target's entangler.
void to_rotation_target(const ir::Op& op, OpSink& s, const ir::Circuit& c, Target t);

/// "'ccx' on a[0],a[1],flag (file.wq:3:5)" label of an op for notes; errors leave out the location
/// (`with_location` false) because the driver prints the UserError's own location.
std::string describe_op(const ir::Circuit& c, const ir::Op& op, bool with_location = true);

}  // namespace whittle::lowering
