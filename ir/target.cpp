// The names of the targets and metrics.
#include "ir/target.h"

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::ir {

std::vector<Target> all_targets() {
    return {Target::CliffordT, Target::CxRzSx, Target::CzRxRz, Target::ISwapRzRx, Target::XxR, Target::UCx, Target::Nct};
}

const char* target_name(Target t) {
    switch (t) {
    case Target::CliffordT: return "clifford+t";
    case Target::CxRzSx: return "cx+rz+sx";
    case Target::CzRxRz: return "cz+rx+rz";
    case Target::ISwapRzRx: return "iswap+rz+rx";
    case Target::XxR: return "xx+r";
    case Target::UCx: return "u+cx";
    case Target::Nct: return "nct";
    }
    return "?";
}

std::string known_target_names() {
    std::string known;
    for (Target t : all_targets()) known += (known.empty() ? "" : ", ") + std::string(target_name(t));
    return known;
}

Target parse_target(const std::string& name) {
    for (Target t : all_targets())
        if (name == target_name(t)) return t;
    throw UserError(fmt::format("unknown target '{}' (known targets: {})", name, known_target_names()));
}

std::optional<Target> parse_optional_target(const std::string& name) {
    if (name.empty()) return std::nullopt;
    return parse_target(name);
}

std::string target_label(const std::optional<Target>& t) { return t ? target_name(*t) : ""; }

const char* metric_name(Metric m) {
    switch (m) {
    case Metric::TCount: return "t";
    case Metric::TwoQubit: return "2q";
    case Metric::Depth: return "depth";
    }
    return "?";
}

Metric parse_metric(const std::string& name, const std::string& what) {
    if (name == "t") return Metric::TCount;
    if (name == "2q") return Metric::TwoQubit;
    if (name == "depth") return Metric::Depth;
    throw UserError(fmt::format("{} takes t, 2q or depth, not '{}'", what, name));
}

}  // namespace whittle::ir
