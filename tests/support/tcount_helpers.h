// Shared by the T-count engine tests: gate builders, the T-count, an independent matrix comparison,
// and a circuit lowered by the clifford+t pipeline up to reduce-t's place.
#pragma once

#include <string>
#include <vector>

#include "ir/resources.h"
#include "passes/pipeline.h"
#include "support/dense_unitary.h"
#include "support/textbook_circuits.h"

namespace whittle::test {

using testing::cx;
using testing::h;

/// A phase of `eighths` * pi/4 on wire w.
inline ir::Op ph(uint32_t w, int eighths) { return ir::Op::phase(ir::Angle::pi_times(eighths, 4), {ir::Lit::pos(w)}); }

inline uint64_t t_of(const ir::Circuit& c) { return ir::count_resources(c).t_count; }

/// The exact matrix, global phase included (tests/support/dense_unitary.h, independent of the compiler).
inline bool same_matrix(const ir::Circuit& a, const ir::Circuit& b) {
    return distance_exact(dense_unitary(a), dense_unitary(b)) < 1e-9;
}

/// `in` lowered by the clifford+t pipeline at `level` up to the T-count engine's place (before reduce-t).
inline ir::Circuit lowered_before_reduce_t(const ir::Circuit& in, int level) {
    passes::PassOptions o;
    o.level = level;
    o.target = ir::parse_optional_target("clifford+t");
    ir::Circuit c = in;
    std::vector<std::string> names;
    for (const std::string& n : passes::pipeline_for(o)) {
        if (n == "reduce-t") break;
        names.push_back(n);
    }
    passes::run_passes(c, names, o);
    return c;
}

}  // namespace whittle::test
