// MCX with borrowed (dirty) wires: Barenco et al. 1995 (quant-ph/9503016) Lemma 7.2 and Lemma 7.3.
#include "lowering/mcx_constructions.h"

namespace whittle::lowering {
namespace {

/// The "down" half of Lemma 7.2: Toffoli(l_i, d_{i-2} -> d_{i-1}) for i = n-1 .. 3 (1-based), then
/// Toffoli(l1, l2 -> d1), then back up: the ladder that puts AND terms on the borrowed wires.
void ladder(ControlLowerer& lw, const ir::LitVec& l, const std::vector<uint32_t>& d) {
    const size_t n = l.size();
    for (size_t i = n - 1; i >= 3; --i) lw.sink().x(d[i - 2], {l[i - 1], ir::Lit::pos(d[i - 3])});
    lw.sink().x(d[0], {l[0], l[1]});
    for (size_t i = 3; i <= n - 1; ++i) lw.sink().x(d[i - 2], {l[i - 1], ir::Lit::pos(d[i - 3])});
}

}  // namespace

void mcx_barenco_dirty(ControlLowerer& lw, const ir::LitVec& l, uint32_t target, const std::vector<uint32_t>& d) {
    const size_t n = l.size();
    const ir::LitVec top{l[n - 1], ir::Lit::pos(d[n - 3])};
    // First pass: target toggled by AND(l) xor (terms of the dirty wires), which the second top
    // Toffoli cancels; the second ladder restores the dirty wires.
    lw.sink().x(target, top);
    ladder(lw, l, d);
    lw.sink().x(target, top);
    ladder(lw, l, d);
}

void mcx_one_wire_split(ControlLowerer& lw, const ir::LitVec& l, uint32_t target, uint32_t d) {
    const size_t n = l.size();
    const size_t m1 = (n + 1) / 2;
    ir::LitVec first(l.begin(), l.begin() + long(m1));
    ir::LitVec second(l.begin() + long(m1), l.end());
    second.push_back(ir::Lit::pos(d));
    // t ^= AND(L2) * (d xor (d xor AND(L1))) = AND(L); d is toggled twice and comes back.
    lw.mcx(second, target);
    lw.mcx(first, d);
    lw.mcx(second, target);
    lw.mcx(first, d);
}

}  // namespace whittle::lowering
