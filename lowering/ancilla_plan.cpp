// Clean-wire tracking over a circuit (see ancilla_plan.h for the value model).
#include "lowering/ancilla_plan.h"

#include <algorithm>

namespace whittle::lowering {
namespace {

constexpr size_t kMaxTerms = 16;

}  // namespace

CleanWireTracker::CleanWireTracker(const ir::Circuit& c) : c_(c), wires_(c.num_qubits()) {
    for (uint32_t w = 0; w < c.num_qubits(); ++w) wires_[w].clean = c.qubits[w].role == ir::Role::Clean;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        scratch_.clear();
        c.ops[i].wires(scratch_);
        for (uint32_t w : scratch_) {
            wires_[w].first_use = std::min(wires_[w].first_use, i);
            wires_[w].last_use = i + 1;
        }
    }
    for (uint32_t w = 0; w < c.num_qubits(); ++w)
        if (wires_[w].clean) zero_.insert(w);
}

void CleanWireTracker::refresh(uint32_t w, size_t index) {
    Wire& s = wires_[w];
    if (!s.clean) return;
    // After its last use a clean wire is |0> by the role's contract.
    const bool zero = index >= s.last_use || (!s.unknown && s.terms.empty());
    if (zero) zero_.insert(w);
    else zero_.erase(w);
}

void CleanWireTracker::step(size_t index) {
    at_ = index + 1;
    const ir::Op& op = c_.ops[index];
    auto bump = [&](uint32_t w) { ++wires_[w].version; };
    const bool writes_target = op.target != ir::kNoWire && !op.is_diagonal();
    if (op.kind == ir::OpKind::X && !op.is_conditioned()) {
        Wire& t = wires_[op.target];
        if (t.clean && !t.unknown) {
            Term term;
            for (ir::Lit l : op.controls)
                term.push_back((uint64_t(l.bits()) << 32) | wires_[l.wire()].version);
            std::sort(term.begin(), term.end());
            auto it = std::find(t.terms.begin(), t.terms.end(), term);
            if (it != t.terms.end()) t.terms.erase(it);
            else if (t.terms.size() < kMaxTerms) t.terms.push_back(std::move(term));
            else t.unknown = true;
        }
        bump(op.target);
    } else if (op.kind == ir::OpKind::Reset && !op.is_conditioned()) {
        Wire& t = wires_[op.target];
        t.terms.clear();
        t.unknown = false;
        bump(op.target);
    } else {
        if (writes_target) {
            wires_[op.target].unknown = true;
            wires_[op.target].terms.clear();
            bump(op.target);
        }
        if (op.target2 != ir::kNoWire) {
            wires_[op.target2].unknown = true;
            wires_[op.target2].terms.clear();
            bump(op.target2);
        }
    }
    scratch_.clear();
    op.wires(scratch_);
    for (uint32_t w : scratch_) refresh(w, index + 1);
}

std::vector<uint32_t> pick_wires(const std::set<uint32_t>* candidates, uint32_t num_qubits,
                                 const std::vector<uint8_t>& exclude, size_t count) {
    std::vector<uint32_t> out;
    if (count == 0) return out;
    if (candidates) {
        for (uint32_t w : *candidates) {
            if (exclude[w]) continue;
            out.push_back(w);
            if (out.size() == count) break;
        }
        return out;
    }
    for (uint32_t w = 0; w < num_qubits && out.size() < count; ++w)
        if (!exclude[w]) out.push_back(w);
    return out;
}

}  // namespace whittle::lowering
