// What a compile aims at: the native gate set (Target) and the metric constructions compete on (Metric).
// Both are parsed from their names once, where the user gives them (the CLI, the Python module).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace whittle::ir {

/// The native gate sets (DESIGN.md target table plus nct); lowering/targets.h has their gates.
enum class Target : uint8_t { CliffordT, CxRzSx, CzRxRz, ISwapRzRx, XxR, UCx, Nct };

/// The target named `name` ("clifford+t", "cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r", "u+cx",
/// "nct"); UserError listing the known names otherwise.
Target parse_target(const std::string& name);
const char* target_name(Target t);
std::vector<Target> all_targets();
/// "" is no target (stay high level), anything else parse_target.
std::optional<Target> parse_optional_target(const std::string& name);
/// The target's name, "" for none.
std::string target_label(const std::optional<Target>& t);
/// "clifford+t, cx+rz+sx, ..." (for messages).
std::string known_target_names();

/// What the user asked the compiler to minimise when constructions compete.
enum class Metric : uint8_t { TCount, TwoQubit, Depth };

/// "t", "2q", "depth" (--optimize-for and the report).
const char* metric_name(Metric m);
/// The metric named `name`; UserError "`what` takes t, 2q or depth, not 'NAME'" otherwise.
Metric parse_metric(const std::string& name, const std::string& what);

}  // namespace whittle::ir
