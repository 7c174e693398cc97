// ControlLowerer: work-wire bookkeeping and the per-op choice among the MCX constructions.
#include "lowering/control_lowerer.h"

#include <fmt/format.h>

#include "ir/error.h"
#include "lowering/ancilla_plan.h"
#include "lowering/mcx_constructions.h"

namespace whittle::lowering {

std::vector<uint32_t> wires_of(const ir::LitVec& lits, std::initializer_list<uint32_t> extra) {
    std::vector<uint32_t> w;
    for (ir::Lit l : lits) w.push_back(l.wire());
    for (uint32_t e : extra) w.push_back(e);
    return w;
}

ControlLowerer::ControlLowerer(ir::Circuit& c, OpSink& sink, const std::set<uint32_t>& clean_zero, ControlStyle style,
                               bool classical_only)
    : c_(c), sink_(sink), clean_zero_(clean_zero), style_(style), classical_only_(classical_only),
      in_use_(c.num_qubits(), 0), scratch_(c.num_qubits(), 0) {}

std::vector<uint32_t> ControlLowerer::take_clean(size_t n, const std::vector<uint32_t>& busy) {
    for (uint32_t w : busy) scratch_[w] = 1;
    // Exclude wires already holding a value for an enclosing construction.
    std::vector<uint32_t> out;
    for (uint32_t w : clean_zero_) {
        if (out.size() == n) break;
        if (scratch_[w] || in_use_[w]) continue;
        out.push_back(w);
    }
    for (uint32_t w : busy) scratch_[w] = 0;
    for (uint32_t w : out) in_use_[w] = 1;
    return out;
}

void ControlLowerer::release_clean(const std::vector<uint32_t>& wires) {
    for (uint32_t w : wires) in_use_[w] = 0;
}

std::vector<uint32_t> ControlLowerer::borrow(size_t n, const std::vector<uint32_t>& busy) {
    for (uint32_t w : busy) scratch_[w] = 1;
    std::vector<uint32_t> out = pick_wires(nullptr, c_.num_qubits(), scratch_, n);
    for (uint32_t w : busy) scratch_[w] = 0;
    return out;
}

void ControlLowerer::set_choice(const std::string& what) {
    if (top_choice_.empty()) top_choice_ = what;
}

void ControlLowerer::mcx(const ir::LitVec& controls, uint32_t target) {
    const size_t n = controls.size();
    if (n <= 2) {
        sink_.x(target, controls);
        return;
    }
    // The op's own wires are not |0> work wires for the sub-ops of its construction, even when the
    // tracker proved one of them |0> before the op (its target is toggled while the op is built).
    const std::vector<uint32_t> busy = wires_of(controls, {target});
    std::vector<uint32_t> marked;
    for (uint32_t w : busy)
        if (!in_use_[w]) {
            in_use_[w] = 1;
            marked.push_back(w);
        }
    mcx_construct(controls, target, busy);
    for (uint32_t w : marked) in_use_[w] = 0;
}

void ControlLowerer::mcx_construct(const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& busy) {
    const size_t n = controls.size();
    std::vector<uint32_t> clean = take_clean(n - 2, busy);
    if (clean.size() == n - 2 && style_ == ControlStyle::Depth) {
        set_choice(fmt::format("mcx/{}: and-tree, {} clean wires", n, clean.size()));
        used("and-tree");
        mcx_and_tree(*this, controls, target, clean);
        release_clean(clean);
        return;
    }
    if (!clean.empty()) {
        set_choice(clean.size() == n - 2 ? fmt::format("mcx/{}: v-chain, {} clean wires", n, clean.size())
                                         : fmt::format("mcx/{}: partial v-chain, {} clean wires", n, clean.size()));
        used(clean.size() == n - 2 ? "v-chain" : "partial-v-chain");
        mcx_v_chain(*this, controls, target, clean);
        release_clean(clean);
        return;
    }
    std::vector<uint32_t> dirty = borrow(n - 2, busy);
    if (dirty.size() == n - 2) {
        set_choice(fmt::format("mcx/{}: barenco-dirty (Lemma 7.2), {} borrowed wires", n, dirty.size()));
        used("barenco-dirty");
        mcx_barenco_dirty(*this, controls, target, dirty);
        return;
    }
    if (!dirty.empty()) {
        set_choice(fmt::format("mcx/{}: one-wire split (Lemma 7.3), borrowed {}", n, c_.wire_name(dirty[0])));
        used("one-wire-split");
        mcx_one_wire_split(*this, controls, target, dirty[0]);
        return;
    }
    if (classical_only_)
        throw UserError(fmt::format("a {}-control X on all {} wires has no NOT/CNOT/Toffoli form without a work wire "
                                    "(use --extra-ancillas 1)",
                                    n, c_.num_qubits()),
                        sink_.loc());
    set_choice(fmt::format("mcx/{}: no work wire (Lemma 7.5 sqrt(X) recursion)", n));
    used("no-ancilla");
    mcx_no_ancilla(*this, controls, target);
}

}  // namespace whittle::lowering
