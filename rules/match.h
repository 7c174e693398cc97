// Matching a rule's left side against a window of a gate sequence (wires renamed, angles solved).
#pragma once

#include <cstddef>
#include <array>
#include <optional>
#include <vector>

#include "rules/library.h"

namespace whittle::rules {

/// When `seq[at .. at + side.size())` is `side` with its wires renamed (injectively) and its
/// parameters replaced by angle forms of the sequence, returns `other` under the same renaming and
/// replacement (the rewrite); else nothing. Each parameter of `side` must be determined by the
/// window (a slot with one unknown parameter of coefficient +-1 fixes it), every parameter and
/// wire of `other` must occur in `side`, and coefficients stay within +-100.
std::optional<Seq> match_window(const Seq& side, const Seq& other, const Seq& seq, size_t at);

/// A circuit op read as a gate of a set: its name, wires (w[0] the control of cx) and angles
/// (a[1] is R's phi).
struct OpGate {
    GateName name = GateName::X;
    std::array<uint32_t, 2> w{};
    std::array<ir::Angle, 2> a{};
};

/// The op as a gate of `set`, or nothing (another gate, a classical condition, a measurement).
std::optional<OpGate> op_gate(const ir::Op& op, const GateSet& set);

/// When `ops` (in order) are `side` with its wires renamed and its parameters given values,
/// returns `other`'s ops under the same renaming and values; else nothing. With `partial`, `ops`
/// may be a prefix of `side` and nothing is built (an empty vector says the prefix fits). Angles
/// are compared modulo 2*pi: a rotation stored modulo 2*pi differs from the written one by a sign,
/// a global phase, as every gate of the sets is uncontrolled.
std::optional<std::vector<ir::Op>> match_ops(const Seq& side, const Seq& other, const std::vector<OpGate>& ops,
                                             bool partial);

}  // namespace whittle::rules
