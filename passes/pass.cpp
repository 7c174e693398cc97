// PassResult helpers.
#include "passes/pass.h"

namespace whittle::passes {

void PassResult::count(const std::string& name, int64_t by) {
    for (auto& [k, v] : stats)
        if (k == name) {
            v += by;
            return;
        }
    stats.emplace_back(name, by);
}

}  // namespace whittle::passes
