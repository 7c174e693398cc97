// The engine under cancel, merge-controls and gate-cancel: each op walks back over the ops it commutes with.
#pragma once

#include <cstdint>
#include <memory>
#include <vector>

#include "ir/circuit.h"
#include "passes/pass.h"

namespace whittle::passes {

/// What a combine rule did with a mover that met an earlier op.
enum class Combined : uint8_t {
    No,        ///< no interaction; the walk goes on if the two commute
    Absorbed,  ///< the mover is gone; the earlier op was changed in place (still non-trivial)
    Vanished,  ///< both are gone (inverse pair, or the merged op became the identity)
};

/// The shape of an op the rewriter keeps beside each wire's list of positions (so a walk decides
/// most steps without reading the op itself).
struct OpShape {
    ir::OpKind kind;
    uint32_t wires;  ///< number of distinct wires the op touches
};

/// A combine rule. `combine`: `earlier` is a live op the (possibly transformed) `mover` reached.
/// It may change `earlier` (but may only add wires to it through the `added_wires` out-list) and
/// add to `global` when it absorbs; when it returns Combined::No it must leave both as they were.
/// It is called only with non-fence ops, and returns Vanished only for an `earlier` with the
/// mover's kind (or SX against SXdg), targets and number of controls (so a kickback's price is
/// known before the walk meets the pair). `may_combine` is its cheap pre-filter: it returns false
/// only when `combine` returns No for every pair of ops of these shapes sharing `shared` wires.
struct CombineRule {
    Combined (*combine)(ir::Op& earlier, const ir::Op& mover, ir::Angle& global, std::vector<uint32_t>& added_wires,
                        PassResult& result);
    bool (*may_combine)(OpShape earlier, OpShape mover, uint32_t shared);
};

struct RewriteLimits {
    /// Live ops sharing a wire with the mover that one walk may visit (keeps the pass O(n * window)).
    uint32_t window = 96;
    /// Also move the mover across an op it does not commute with by the kickback identity
    /// (kickback.h), at most once per walk, and keep that move only when the walk then ends with
    /// the mover vanishing against an earlier op (ops: -2 + 1) and the kickback op's estimated
    /// T-cost is at most that of the vanished pair. The extra op sits right after the op it was
    /// kicked from; later walks of the same sweep stop there (the next sweep sees it as any op).
    bool kickback = false;
    /// For the kickback price: an X pair into a clean wire may lower to temporary ANDs with a
    /// measured erase (estimated_measured_pair_t_cost), so it is priced so (--allow-measurement).
    bool measured_erase = false;
};

/// Runs one left-to-right sweep: every op is moved back across the ops it commutes with (rules in
/// commutation.h) until `combine` absorbs it or a non-commuting op stops it. Per-wire indices of
/// the ops placed so far keep each walk to the ops that share a wire with the mover. The circuit
/// is left untouched (and false returned) when no rule fired. Pair ids of ops that took part in a
/// combination other than "a compute op met its own uncompute and both vanished" are cleared on
/// every op of that pair, since the halves are then no longer inverses of each other.
/// With `right_to_left` the ops are read last to first, exactly as if they were reversed, swept and
/// reversed back, without moving them. The ops are rewritten in place (see the .cpp); a combine
/// rule must leave `earlier` as it was when it returns Combined::No.
/// Memory that consecutive sweeps reuse: the per-wire lists keep their capacity, so a fixpoint of
/// several sweeps allocates them once instead of growing them afresh in every sweep.
class RewriteBuffers {
public:
    RewriteBuffers();
    ~RewriteBuffers();
    RewriteBuffers(const RewriteBuffers&) = delete;
    RewriteBuffers& operator=(const RewriteBuffers&) = delete;
    struct Lists;  // defined in backward_rewriter.cpp
    std::unique_ptr<Lists> lists;
};

bool rewrite_backwards(ir::Circuit& c, const CombineRule& rule, PassResult& result, RewriteBuffers& buffers,
                       RewriteLimits limits = {}, bool right_to_left = false);

}  // namespace whittle::passes
