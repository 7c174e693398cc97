// ControlLowerer: lowers one multi-controlled op, choosing a published construction by the free wires.
#pragma once

#include <map>
#include <set>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "lowering/op_sink.h"

namespace whittle::lowering {

/// What the constructions compete on (mirrors passes::Metric without depending on passes/).
enum class ControlStyle : uint8_t { TCount, TwoQubit, Depth };

/// Lowers multi-controlled X, phase, one-qubit unitaries and swaps to ops with at most two controls
/// (Toffoli, CNOT, CZ, CCZ) and uncontrolled one-qubit gates. Constructions recurse through it, so
/// each sub-op again picks by the wires free at that point:
///   n-2 clean wires free  -> V-chain (2n-3 Toffolis; an AND tree under depth), partial V-chain on fewer;
///   dirty wires (any wire the op does not touch) -> Barenco et al. 1995 Lemma 7.2 (4(n-2) Toffolis),
///                            or with one such wire the Lemma 7.3 split;
///   no wire at all         -> Barenco et al. 1995 Lemma 7.5 (controlled-sqrt(X) recursion).
/// Compute/uncompute Toffolis of the clean constructions are tagged as pairs for lower-toffoli.
class ControlLowerer {
public:
    ControlLowerer(ir::Circuit& c, OpSink& sink, const std::set<uint32_t>& clean_zero, ControlStyle style,
                   bool classical_only);

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

    OpSink& sink() { return sink_; }
    ir::Circuit& circuit() { return c_; }
    ControlStyle style() const { return style_; }
    bool classical_only() const { return classical_only_; }
    uint32_t new_pair() { return c_.new_pair_id(); }

    /// Records that a construction ran (counted per name, for PassResult stats).
    void used(const std::string& construction) { ++used_[construction]; }
    const std::map<std::string, int64_t>& used() const { return used_; }
    /// The first (outermost) construction chosen since the last reset, with its detail.
    const std::string& top_choice() const { return top_choice_; }
    void set_choice(const std::string& what);
    void reset_choice() { top_choice_.clear(); }

private:
    ir::Circuit& c_;
    OpSink& sink_;
    const std::set<uint32_t>& clean_zero_;
    ControlStyle style_;
    bool classical_only_;
    std::vector<uint8_t> in_use_, scratch_;
    std::map<std::string, int64_t> used_;
    std::string top_choice_;
};

/// The wires of a literal list plus extra wires (for take_clean/borrow `busy`).
std::vector<uint32_t> wires_of(const ir::LitVec& lits, std::initializer_list<uint32_t> extra = {});

}  // namespace whittle::lowering
