// ControlLowerer: lowers one multi-controlled op, choosing a published construction by the free wires.
#pragma once

#include <functional>
#include <map>
#include <set>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "lowering/ancilla_plan.h"
#include "lowering/op_sink.h"

namespace whittle::lowering {

/// What the constructions compete on (mirrors passes::Metric without depending on passes/).
enum class ControlStyle : uint8_t { TCount, TwoQubit, Depth };
const char* style_name(ControlStyle s);  // "T-count", "two-qubit count", "depth"

/// What a construction costs once its Toffolis are lowered the way lower-toffoli will lower them
/// (relative-phase in pairs, else the 7-T form, the T-depth-3 form under depth).
struct ConstructionCost {
    int64_t t = 0;          ///< T gates, plus rotation_t_cost per rotation that is not Clifford+T
    int64_t two_qubit = 0;  ///< gates on two wires
    int64_t depth = 0;      ///< ASAP layers (a non-Clifford+T rotation weighs rotation_depth_cost)
};

/// One way to lower an op: its name for the report and a function that emits it through the lowerer.
struct Candidate {
    std::string method;
    std::string detail;  ///< the wires it uses, for the report
    std::function<void()> emit;
};

/// Lowers multi-controlled X, phase, one-qubit unitaries and swaps to ops with at most two controls
/// (Toffoli, CNOT, CZ, CCZ) and uncontrolled one-qubit gates. Constructions recurse through it, so
/// each sub-op again picks by the wires free at that point:
///   n-2 clean wires free  -> V-chain (2n-3 Toffolis; an AND tree under depth), partial V-chain on fewer;
///   dirty wires (any wire the op does not touch) -> Barenco et al. 1995 Lemma 7.2 (4(n-2) Toffolis),
///                            or with one such wire the Lemma 7.3 split;
///   no wire at all         -> Barenco et al. 1995 Lemma 7.5 (controlled-sqrt(X) recursion).
/// Without a work wire, or when it is cheaper in the asked metric, the phase-polynomial form: a
/// multi-controlled phase as 2^k - 1 parity phases over a Gray-code CNOT network (2^k - 2 CNOTs).
/// Compute/uncompute Toffolis of the clean constructions are tagged as pairs for lower-toffoli.
///
/// The choice is metric-driven: every candidate the free wires allow is emitted into a scratch
/// list (its sub-ops choosing the same way), costed by `ConstructionCost`, and the cheapest in the
/// asked metric wins (ties: the other metrics, then the order listed above). Decisions are
/// memoized per shape (op kind, literal count, free clean and borrowable wire counts, angle).
class ControlLowerer {
public:
    /// `rotation_t_cost`: what one rotation that is not Clifford+T costs in the T metric (its
    /// approximation's T-count at the run's epsilon); `rotation_depth_cost`: its depth (1 where the
    /// target has the rotation, its approximating word's length on clifford+t).
    ControlLowerer(ir::Circuit& c, OpSink& sink, const std::set<uint32_t>& clean_zero, ControlStyle style,
                   bool classical_only, int64_t rotation_t_cost = 100, int64_t rotation_depth_cost = 1);

    /// target ^= AND(controls).
    void mcx(const ir::LitVec& controls, uint32_t target);
    /// e^{i*a*AND(lits)}.
    void mc_phase(const ir::LitVec& lits, ir::Angle a);
    /// The one-qubit op `op` (kind and angles; its own controls are ignored) under `controls`.
    void mc_one_qubit(const ir::LitVec& controls, const ir::Op& op);
    /// A swap of a and b under `controls` (Fredkin form: CNOT, MCX, CNOT).
    void mc_swap(const ir::LitVec& controls, uint32_t a, uint32_t b);

    // Work-wire bookkeeping used by the constructions.
    /// Up to n clean |0> wires not touched by `busy` wires; marks them in use.
    /// Picks and emits the construction for one MCX whose own wires are `busy`.
    void mcx_construct(const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& busy);
    std::vector<uint32_t> take_clean(size_t n, const std::vector<uint32_t>& busy);
    void release_clean(const std::vector<uint32_t>& wires);
    /// Up to n wires (any state) that `busy` does not touch; they must be restored by the caller.
    std::vector<uint32_t> borrow(size_t n, const std::vector<uint32_t>& busy);

    OpSink& sink() { return *sink_; }
    ir::Circuit& circuit() { return c_; }
    ControlStyle style() const { return style_; }
    bool classical_only() const { return classical_only_; }
    uint32_t new_pair() { return c_.new_pair_id(); }

    /// Emits the cheapest of `cands` (non-empty) in the asked metric; `key` memoizes the decision
    /// for ops of the same shape. Returns the winner's index.
    size_t emit_cheapest(const std::string& what, const std::string& key, const std::vector<Candidate>& cands);
    /// The cost of what `emit` would write, without writing it.
    ConstructionCost dry_run(const std::function<void()>& emit);
    /// Cost of lowered ops (Toffolis and CCZs are expanded into their Clifford+T forms first).
    ConstructionCost estimate(const std::vector<ir::Op>& ops) const;
    /// The cost of the outermost construction chosen since the last reset (zero when none).
    const ConstructionCost& top_cost() const { return top_cost_; }
    const std::string& top_method() const { return top_method_; }

    /// Records that a construction ran (counted per name, for PassResult stats).
    void used(const std::string& construction) { ++used_[construction]; }
    const std::map<std::string, int64_t>& used() const { return used_; }
    /// The first (outermost) construction chosen since the last reset, with its detail.
    const std::string& top_choice() const { return top_choice_; }
    void set_choice(const std::string& what);
    /// Clean wires are taken first from those whose life (in `lives`, which walks the same ops)
    /// encloses the op, so a construction's work wires add no qubit that share-work-wires could
    /// have saved; then in wire order.
    void prefer_wires_inside_lives(const CleanWireTracker& lives) { lives_ = &lives; }
    /// With prefer_wires_inside_lives: take clean wires only inside their lives, and borrow no clean
    /// wire at |0> outside its life, so no construction makes a work wire live where it was not
    /// (the lowered circuit's peak of live qubits stays the input's; the constructions may cost more).
    void only_within_lives(bool on) { within_lives_ = on; }
    void reset_choice() {
        top_choice_.clear();
        top_method_.clear();
        top_cost_ = {};
    }

private:
    struct Decision {
        std::string method;
        ConstructionCost cost;
        std::string runner_up;
        ConstructionCost runner_up_cost;
    };
    bool cheaper(const ConstructionCost& a, const ConstructionCost& b) const;
    std::string cost_text(const ConstructionCost& k) const;

    ir::Circuit& c_;
    OpSink* sink_;
    const std::set<uint32_t>& clean_zero_;
    const CleanWireTracker* lives_ = nullptr;  // see prefer_wires_inside_lives
    bool within_lives_ = false;                 // see only_within_lives
    ControlStyle style_;
    bool classical_only_;
    int64_t rotation_t_cost_, rotation_depth_cost_;
    std::vector<uint8_t> in_use_, scratch_;
    std::map<std::string, int64_t> used_;
    std::string top_choice_, top_method_;
    ConstructionCost top_cost_;
    std::map<std::string, Decision> memo_;
    int dry_depth_ = 0;
};

/// The wires of a literal list plus extra wires (for take_clean/borrow `busy`).
std::vector<uint32_t> wires_of(const ir::LitVec& lits, std::initializer_list<uint32_t> extra = {});

}  // namespace whittle::lowering
