// Which work wires are free at each op: clean wires provably at |0>, and wires an op may borrow.
#pragma once

#include <cstdint>
#include <set>
#include <vector>

#include "ir/circuit.h"

namespace whittle::lowering {

/// Walks a circuit op by op and knows which Clean-role wires are provably |0> before the current op.
///
/// A clean wire is |0> before its first use and after its last use (the role's contract). In
/// between, its value is tracked classically as an XOR of AND-terms over (wire, version) literals,
/// where a wire's version changes whenever a non-diagonal op writes it: an X-type op toggles a
/// term, identical terms cancel, and an empty set means |0> on every basis branch. Any other write
/// (H, a swap, a conditioned X, a measurement) makes the wire unknown until a reset or its last use.
/// Each op costs O(its size * log) (a term is a sorted small vector).
class CleanWireTracker {
public:
    explicit CleanWireTracker(const ir::Circuit& c);

    /// Clean wires that are |0> before op `index` (the next op to step over), in wire order.
    const std::set<uint32_t>& zero_wires() const { return zero_; }
    bool is_zero(uint32_t w) const { return zero_.count(w) != 0; }
    /// A clean wire provably holding the constant 1 before the next op (a loaded constant bit).
    bool is_one(uint32_t w) const {
        const Wire& s = wires_[w];
        return s.clean && !s.unknown && at_ < s.last_use && s.terms.size() == 1 && s.terms[0].empty();
    }
    /// Advances past op `index` (ops must be stepped in order, starting at 0).
    void step(size_t index);
    /// Whether the next op to step over lies strictly inside `w`'s life (after its first use and
    /// before its last): a clean wire taken there for a construction keeps its first and last
    /// use, where one taken before its first use or after its last lives longer.
    bool inside_life(uint32_t w) const { return wires_[w].first_use < at_ && at_ + 1 < wires_[w].last_use; }

private:
    using Term = std::vector<uint64_t>;  // sorted (lit bits << 32 | version)
    struct Wire {
        bool clean = false, unknown = false;
        std::vector<Term> terms;
        uint32_t version = 0;
        size_t first_use = ~size_t(0);  // index of the first op on the wire
        size_t last_use = 0;                // index of the last op on the wire, plus one
    };
    const ir::Circuit& c_;
    std::vector<Wire> wires_;
    std::set<uint32_t> zero_;
    size_t at_ = 0;  // the next op to step over
    std::vector<uint32_t> scratch_;
    void refresh(uint32_t w, size_t index);
};

/// Picks up to `count` wires not in `exclude` (wire flags, 1 = excluded) from `candidates` or, when
/// `candidates` is null, from all wires 0..num_qubits-1. Stops at the first `count` found.
std::vector<uint32_t> pick_wires(const std::set<uint32_t>* candidates, uint32_t num_qubits,
                                 const std::vector<uint8_t>& exclude, size_t count);

}  // namespace whittle::lowering
