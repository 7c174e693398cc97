// lower-toffoli: pair matching with per-wire write indices, then one emission walk.
#include "passes/lower_toffoli.h"

#include <algorithm>
#include <map>
#include <tuple>

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/op_prefix_release.h"
#include "lowering/ancilla_plan.h"
#include "lowering/op_sink.h"
#include "lowering/toffoli_forms.h"

namespace whittle::passes {
namespace {

using ir::Lit;
using ir::Op;
using ir::OpKind;

bool is_toffoli(const Op& op) { return op.kind == OpKind::X && op.controls.size() == 2; }
bool is_ccz(const Op& op) {
    return op.kind == OpKind::Phase && op.controls.size() == 3 && op.angle == ir::Angle::pi_times(1);
}

/// True when the op uses wire w other than as a control or inside a diagonal op.
bool disturbs(const Op& op, uint32_t w) {
    if (op.kind == OpKind::Barrier) return false;
    if (op.target == w) return !op.is_diagonal();
    return op.target2 == w;
}

enum class Form : uint8_t { Exact, Relative, TempAnd, Erase };

constexpr uint32_t kNoPartner = 0xffffffffu;

}  // namespace

PassResult lower_toffoli(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    if (std::none_of(c.ops.begin(), c.ops.end(), [](const Op& op) { return is_toffoli(op) || is_ccz(op); })) return r;
    const size_t n_ops = c.ops.size();
    WHITTLE_ASSERT(n_ops < kNoPartner && "lower-toffoli: op indices are 32-bit");
    // Per-wire sorted indices of disturbing ops, for "nothing disturbs w strictly between i and j".
    std::vector<std::vector<uint32_t>> disturbed(c.num_qubits());
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < n_ops; ++i) {
        wires.clear();
        c.ops[i].wires(wires);
        for (uint32_t w : wires)
            if (disturbs(c.ops[i], w)) disturbed[w].push_back(uint32_t(i));
    }
    auto quiet_between = [&](uint32_t w, size_t i, size_t j) {
        const auto& v = disturbed[w];
        auto it = std::upper_bound(v.begin(), v.end(), i);
        return it == v.end() || *it >= j;
    };
    // Match halves: the latest open compute with the same (pair, target, controls) key.
    using Key = std::tuple<uint32_t, uint32_t, uint32_t, uint32_t>;
    std::map<Key, std::vector<uint32_t>> open;
    std::vector<uint32_t> partner(n_ops, kNoPartner);
    auto key_of = [](const Op& op) {
        uint32_t a = op.controls[0].bits(), b = op.controls[1].bits();
        if (a > b) std::swap(a, b);
        return Key{op.pair, op.target, a, b};
    };
    for (size_t i = 0; i < n_ops; ++i) {
        const Op& op = c.ops[i];
        if (!is_toffoli(op) || op.pair == 0 || op.is_conditioned()) continue;
        if (op.half == ir::PairHalf::Compute) open[key_of(op)].push_back(uint32_t(i));
        if (op.half == ir::PairHalf::Uncompute) {
            auto it = open.find(key_of(op));
            if (it == open.end() || it->second.empty()) continue;
            const size_t j0 = it->second.back();
            it->second.pop_back();
            bool ok = quiet_between(op.target, j0, i);
            for (Lit l : op.controls) ok = ok && quiet_between(l.wire(), j0, i);
            if (ok) {
                partner[i] = uint32_t(j0);
                partner[j0] = uint32_t(i);
            } else {
                r.count("pairs-rejected");
            }
        }
    }
    std::vector<Form> form(n_ops, Form::Exact);
    // The relative-phase form is not symmetric in its controls (its diagonal is CZ(a,t) CS^dagger(a,b)),
    // so both halves of a pair are emitted with the compute half's control order: an uncompute whose
    // controls are written the other way round is swapped back.
    std::vector<uint8_t> swap_controls(n_ops, 0);
    for (size_t i = 0; i < n_ops; ++i)
        if (partner[i] != kNoPartner && partner[i] < i)
            swap_controls[i] = c.ops[i].controls[0].wire() != c.ops[partner[i]].controls[0].wire();
    {
        lowering::CleanWireTracker tracker(c);
        for (size_t i = 0; i < n_ops; ++i) {
            if (partner[i] != kNoPartner && partner[i] > i) {
                const bool measured = opts.allow_measurement && tracker.is_zero(c.ops[i].target);
                form[i] = measured ? Form::TempAnd : Form::Relative;
                form[partner[i]] = measured ? Form::Erase : Form::Relative;
            }
            tracker.step(i);
        }
    }
    // The matching tables are done with: freed before the output list grows.
    std::vector<std::vector<uint32_t>>().swap(disturbed);
    std::vector<uint32_t>().swap(partner);
    open.clear();
    int32_t creg = -1, cbit = -1;
    if (std::find(form.begin(), form.end(), Form::Erase) != form.end()) {
        std::string name = "erase";
        for (int k = 1; c.find_creg(name) >= 0; ++k) name = fmt::format("erase{}", k);
        creg = int32_t(c.add_creg(name, 1, true));
        cbit = int32_t(c.cregs[size_t(creg)].first);
    }
    const bool depth = opts.optimize_for == Metric::Depth;
    // Room for the longest form (15 gates) and the X pairs around negative controls.
    const size_t expanded = size_t(std::count_if(c.ops.begin(), c.ops.end(),
                                                 [](const Op& op) { return is_toffoli(op) || is_ccz(op); }));
    std::vector<Op> out;
    out.reserve(n_ops + 20 * expanded);
    ir::Angle phase = c.global_phase;
    lowering::OpSink s(out, phase);
    // The input's ops are moved out as they are read and its pages handed back behind the reading
    // position, so the input and the larger output are not held whole at once.
    ir::OpPrefixReleaser release(c.ops);
    for (size_t i = 0; i < n_ops; release.consumed(++i)) {
        if (!is_toffoli(c.ops[i]) && !is_ccz(c.ops[i])) {
            out.push_back(std::move(c.ops[i]));
            continue;
        }
        const Op op = std::move(c.ops[i]);
        s.inherit(op);
        for (Lit l : op.controls)
            if (!l.positive()) s.x(l.wire());
        uint32_t a = op.controls[0].wire(), b = op.controls[1].wire();
        if (swap_controls[i]) std::swap(a, b);
        if (is_ccz(op)) {
            const uint32_t d = op.controls[2].wire();
            if (depth) lowering::ccz_tdepth3(s, a, b, d);
            else lowering::ccz_7t(s, a, b, d);
            r.count(depth ? "ccz-tdepth3" : "ccz-7t");
        } else {
            switch (form[i]) {
            case Form::Exact:
                if (depth) lowering::toffoli_tdepth3(s, a, b, op.target);
                else lowering::toffoli_7t(s, a, b, op.target);
                r.count(depth ? "toffoli-tdepth3" : "toffoli-7t");
                break;
            case Form::Relative:
                lowering::toffoli_relative_phase(s, a, b, op.target, op.half == ir::PairHalf::Uncompute);
                r.count("toffoli-relative-phase");
                break;
            case Form::TempAnd:
                lowering::temporary_and(s, a, b, op.target);
                r.count("temporary-and");
                break;
            case Form::Erase:
                lowering::measured_erase(s, a, b, op.target, creg, cbit);
                r.count("measured-erase");
                break;
            }
        }
        for (Lit l : op.controls)
            if (!l.positive()) s.x(l.wire());
    }
    c.ops = std::move(out);
    c.global_phase = phase;
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
