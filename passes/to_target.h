// Pass to-target: rewrites the lowered circuit into the gates of opts.target.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Rewrites every op into the gate set named by opts.target (lowering/targets.h), each target by
/// its own rules (lowering/target_*.cpp), keeping the global phase exact. Expects lower-controls
/// (and, except for nct, lower-toffoli) to have run; UserError naming the op when an op has no
/// form in the target (a non-classical gate for nct). On clifford+t an angle that is not a multiple
/// of pi/4 is approximated within opts.epsilon (Ross–Selinger), its bound added to error_bound.
PassResult to_target(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
