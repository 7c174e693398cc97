// MCX with clean work wires: the V-chain (2n-3 Toffolis, common practice) and the log-depth AND tree.
#include "lowering/mcx_constructions.h"

namespace whittle::lowering {
namespace {

struct PairedAnd {
    uint32_t target;
    ir::LitVec controls;
    uint32_t pair;
};

void uncompute(ControlLowerer& lw, const std::vector<PairedAnd>& ands) {
    for (auto it = ands.rbegin(); it != ands.rend(); ++it)
        lw.sink().paired_x(it->target, it->controls, it->pair, ir::PairHalf::Uncompute);
}

}  // namespace

void mcx_v_chain(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& clean) {
    // Absorb controls l1..l_{c+1} into the last clean wire, one Toffoli per clean wire.
    std::vector<PairedAnd> ands;
    ir::Lit acc = controls[0];
    size_t next = 1;
    for (uint32_t w : clean) {
        PairedAnd a{w, {acc, controls[next++]}, lw.new_pair()};
        lw.sink().paired_x(a.target, a.controls, a.pair, ir::PairHalf::Compute);
        ands.push_back(a);
        acc = ir::Lit::pos(w);
    }
    ir::LitVec rest{acc};
    for (; next < controls.size(); ++next) rest.push_back(controls[next]);
    lw.mcx(rest, target);
    uncompute(lw, ands);
}

void mcx_and_tree(ControlLowerer& lw, const ir::LitVec& controls, uint32_t target, const std::vector<uint32_t>& clean) {
    std::vector<PairedAnd> ands;
    std::vector<ir::Lit> level(controls.begin(), controls.end());
    size_t free_index = 0;
    while (level.size() > 2) {
        std::vector<ir::Lit> up;
        size_t i = 0;
        for (; i + 1 < level.size(); i += 2) {
            if (up.size() + (level.size() - i) <= 2) break;  // the last two feed the target
            PairedAnd a{clean[free_index++], {level[i], level[i + 1]}, lw.new_pair()};
            lw.sink().paired_x(a.target, a.controls, a.pair, ir::PairHalf::Compute);
            ands.push_back(a);
            up.push_back(ir::Lit::pos(a.target));
        }
        for (; i < level.size(); ++i) up.push_back(level[i]);
        level = std::move(up);
    }
    lw.sink().x(target, {level[0], level[1]});
    uncompute(lw, ands);
}

}  // namespace whittle::lowering
