// Pass lower-toffoli: Toffolis and CCZs into Clifford+T, using pairs for relative phases and measured erases.
#pragma once

#include "passes/pass.h"

namespace whittle::passes {

/// Rewrites every Toffoli (X with two controls) and CCZ into Clifford+T ops:
///  - a compute/uncompute pair (same pair id, same target and controls) whose middle uses the
///    target and controls only as controls or in diagonal ops (checked) gets the 4-T relative-phase
///    Toffoli on both halves (Maslov 2016, arXiv:1508.03273);
///  - with opts.allow_measurement and a target provably |0> at the compute, the temporary AND (4 T)
///    and the measured erase (0 T) instead (Gidney 2018, arXiv:1709.06648), into one classical bit;
///  - everything else the 7-T/6-CNOT form, or the T-depth-3 form under --optimize-for depth.
PassResult lower_toffoli(ir::Circuit& c, const PassOptions& opts);

}  // namespace whittle::passes
