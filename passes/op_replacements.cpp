// See op_replacements.h.
#include "passes/op_replacements.h"

#include <algorithm>

#include "ir/error.h"
#include "ir/op_prefix_release.h"

namespace whittle::passes {

void OpReplacements::apply(ir::Circuit& c) {
    WHITTLE_ASSERT(dropped_.size() == c.ops.size() && "replacements: made for another op list");
    std::sort(inserts_.begin(), inserts_.end(), [](const Insert& a, const Insert& b) { return a.at < b.at; });
    // The exact size: a second growth would hold three op vectors at once.
    size_t size = 0;
    for (uint8_t d : dropped_) size += d ? 0 : 1;
    for (size_t k = 0; k < inserts_.size(); ++k) {
        WHITTLE_ASSERT((k == 0 || inserts_[k - 1].at < inserts_[k].at) && "replacements: one list per index");
        size += inserts_[k].ops.size();
    }
    std::vector<ir::Op> out;
    out.reserve(size);
    ir::OpPrefixReleaser release(c.ops);
    size_t next = 0;  // the next insert, in index order
    for (size_t i = 0; i < c.ops.size(); release.consumed(++i)) {
        if (!dropped_[i]) out.push_back(std::move(c.ops[i]));
        else c.ops[i] = ir::Op();  // a dropped op may own heap storage: freed before its page goes back
        if (next < inserts_.size() && inserts_[next].at == i) {
            for (ir::Op& op : inserts_[next].ops) out.push_back(std::move(op));
            std::vector<ir::Op>().swap(inserts_[next].ops);
            ++next;
        }
    }
    c.ops = std::move(out);
    inserts_.clear();
    std::vector<uint8_t>().swap(dropped_);
}

}  // namespace whittle::passes
