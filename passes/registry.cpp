// The pass registry: add a pass by adding its header and one line here.
#include "passes/registry.h"

namespace whittle::passes {

const std::vector<PassInfo>& all_passes() {
    static const std::vector<PassInfo> passes = {
        // High-level passes (on multi-controlled ops and phase polynomials) go here,
        // then the lowering steps, then the low-level passes.
    };
    return passes;
}

const PassInfo* find_pass(std::string_view name) {
    for (const PassInfo& p : all_passes())
        if (name == p.name) return &p;
    return nullptr;
}

}  // namespace whittle::passes
