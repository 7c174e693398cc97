// An identity library: proved rules over one gate set, and its text file format (docs/rules.md).
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "rules/gate_set.h"

namespace whittle::rules {

/// lhs = rhs up to global phase for every value of the parameters; `points` is the number of exact
/// parameter points the proof checked (rulegen/prove.h).
struct Rule {
    Seq lhs, rhs;
    int points = 0;
};

struct Library {
    GateSet set;
    std::vector<Rule> rules;
};

/// The file text: a header comment, a `set` line, one `rule` line per rule.
std::string print_library(const Library& lib);
/// Reads a library file; UserError at file:line:column on bad text (an unknown gate, a wire out of
/// range, a parameter beyond the set's, a malformed line).
Library parse_library(std::string_view text, const std::string& file_name);

}  // namespace whittle::rules
