// Exact proof of a symbolic rule: the project's checker at enough exact parameter points (see prove.cpp).
#pragma once

#include <string>

#include "rules/library.h"

namespace whittle::rulegen {

struct ProofResult {
    bool proved = false;
    int points = 0;   ///< parameter points the checker decided
    std::string why;  ///< when not proved: the point and the checker's answer
};

/// Proves lhs = rhs (up to global phase) for every parameter value, or says why not.
ProofResult prove_rule(const rules::Rule& rule, const rules::GateSet& set);

/// How many distinct points parameter j needs: 2 * (half-angle degree of j in lhs + in rhs) + 1.
int points_needed(const rules::Rule& rule, int param);

}  // namespace whittle::rulegen
