// See op_replacements.h.
#include "passes/op_replacements.h"

namespace whittle::passes {

void apply_replacements(ir::Circuit& c, const std::vector<uint8_t>& dropped, std::vector<std::vector<ir::Op>>& insert) {
    // The exact size: a second growth would hold three op vectors at once.
    size_t size = 0;
    for (size_t i = 0; i < c.ops.size(); ++i) size += (dropped[i] ? 0 : 1) + insert[i].size();
    std::vector<ir::Op> out;
    out.reserve(size);
    for (size_t i = 0; i < c.ops.size(); ++i) {
        if (!dropped[i]) out.push_back(std::move(c.ops[i]));  // c.ops is replaced below
        for (ir::Op& op : insert[i]) out.push_back(std::move(op));
    }
    c.ops = std::move(out);
}

}  // namespace whittle::passes
