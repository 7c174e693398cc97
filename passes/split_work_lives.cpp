// split-work-lives: a clean work wire provably back at |0> between two ops continues on a fresh wire.
#include "passes/split_work_lives.h"

#include <algorithm>
#include <unordered_set>
#include <vector>

#include <fmt/format.h>

#include "passes/work_wire_lives.h"
#include "verify/anf.h"

namespace whittle::passes {
namespace {

/// A loaded constant bit idle for more than this many ops is unloaded and loaded again.
constexpr size_t kMinIdleOps = 8;
/// Monomials a wire's value may hold before it counts as unknown (and the largest product built).
constexpr size_t kMaxTerms = 256;
/// Inputs longer than this are left as they are.
constexpr size_t kMaxOps = size_t(1) << 21;

/// Each wire's value on every basis input as a Boolean polynomial over the input wires (algebraic
/// normal form, canonical: equal functions are equal polynomials), as far as X-type ops make it
/// known. A write by any other op (H, a rotation, a conditioned op, a controlled swap), or a value
/// over the size cap, makes the target unknown for good. Diagonal ops change no value.
class WireValues {
public:
    explicit WireValues(const ir::Circuit& c) : val_(c.num_qubits()), known_(c.num_qubits(), 1) {
        for (uint32_t w = 0; w < c.num_qubits(); ++w)
            if (c.qubits[w].role != ir::Role::Clean) val_[w] = Anf::var(w);
    }
    bool is_zero(uint32_t w) const { return known_[w] && val_[w].is_zero(); }
    bool is_one(uint32_t w) const { return known_[w] && val_[w].is_one(); }

    void step(const ir::Op& op) {
        if (op.kind == ir::OpKind::Barrier || (op.is_diagonal() && !op.is_conditioned())) return;
        if (op.kind == ir::OpKind::X && !op.is_conditioned()) return toggle(op);
        if (op.kind == ir::OpKind::Swap && op.controls.empty() && !op.is_conditioned()) {
            std::swap(val_[op.target], val_[op.target2]);
            std::swap(known_[op.target], known_[op.target2]);
            return;
        }
        if (op.target != ir::kNoWire) forget(op.target);
        if (op.target2 != ir::kNoWire) forget(op.target2);
    }

private:
    std::vector<Anf> val_;
    std::vector<uint8_t> known_;

    void forget(uint32_t w) {
        known_[w] = 0;
        val_[w] = Anf();
    }
    void toggle(const ir::Op& op) {
        const uint32_t t = op.target;
        if (!known_[t]) return;
        Anf product = Anf::one();
        for (ir::Lit l : op.controls) {
            if (!known_[l.wire()]) return forget(t);
            const Anf f = l.positive() ? val_[l.wire()] : val_[l.wire()].negated();
            if (product.size() * f.size() > 16 * kMaxTerms) return forget(t);
            product = product & f;
            if (product.is_zero()) return;  // nothing flips
            if (product.size() > kMaxTerms) return forget(t);
        }
        val_[t] ^= product;
        if (val_[t].size() > kMaxTerms) forget(t);
    }
};

}  // namespace

PassResult split_work_lives(ir::Circuit& c, const PassOptions& opts) {
    PassResult r;
    const uint32_t n = c.num_qubits();
    const std::vector<bool> movable_reg = movable_work_registers(c);
    std::vector<bool> movable(n, false);
    bool any = false;
    for (size_t ri = 0; ri < c.registers.size(); ++ri) {
        if (!movable_reg[ri]) continue;
        any = true;
        for (uint32_t i = 0; i < c.registers[ri].size; ++i) movable[c.registers[ri].first + i] = true;
    }
    if (!any || c.ops.size() > kMaxOps) return r;
    // The ops on each movable wire, in order (to find how long a wire stays idle).
    std::vector<std::vector<uint32_t>> uses(n);
    std::vector<uint32_t> wires;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        if (c.ops[i].kind == ir::OpKind::Barrier) continue;
        wires.clear();
        c.ops[i].wires(wires);
        for (uint32_t u : wires)
            if (movable[u]) uses[u].push_back(uint32_t(i));
    }
    std::vector<uint32_t> next_use(n, 0);  // index into uses[u] of the next op on u
    // A loaded constant left idle across other work (the cancel pass merges one call's unload
    // with the next call's load) costs a wire the whole time; two X gates free it, except where
    // depth is the metric (the reload may add a layer).
    const bool unload_constants = opts.optimize_for != ir::Metric::Depth;
    std::vector<std::vector<uint32_t>> reload_before(c.ops.size());  // wires loaded with 1 before op j

    // A wire is split only if its value after its last op is provably 0 as well: the lives then
    // each end at |0> by the same proof, and the pass needs no promise from the program (a wire
    // whose end is not proved stays whole).
    {
        WireValues end(c);
        for (const ir::Op& op : c.ops) end.step(op);
        for (uint32_t w = 0; w < n; ++w)
            if (movable[w] && !end.is_zero(w)) movable[w] = false;
    }
    WireValues tracker(c);
    std::vector<uint32_t> cur(n);
    for (uint32_t w = 0; w < n; ++w) cur[w] = w;
    // A life ends where the wire is back at |0> after holding a value (a wire that only ever
    // held 0, such as an unused carry-in, is left alone: splitting it gains nothing and would
    // make the two halves of a compute/uncompute pair name different wires).
    std::vector<uint8_t> held_value(n, 0), unloaded(n, 0);
    uint32_t lives = 0, constants_unloaded = 0;
    std::vector<ir::Op> out;
    out.reserve(c.ops.size());
    auto rename = [&](ir::Op& op) {
        for (ir::Lit& l : op.controls) l = ir::Lit::make(cur[l.wire()], l.positive());
        std::sort(op.controls.begin(), op.controls.end(), [](ir::Lit a, ir::Lit b) { return a.wire() < b.wire(); });
        if (op.target != ir::kNoWire) op.target = cur[op.target];
        if (op.target2 != ir::kNoWire) op.target2 = cur[op.target2];
    };
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        for (uint32_t u : reload_before[i]) {  // a new life, holding the constant 1 again
            cur[u] = n + lives++;
            unloaded[u] = 0;
            held_value[u] = 1;
            ir::Op x = ir::Op::x(cur[u]);
            x.loc = op.loc;
            out.push_back(std::move(x));
        }
        wires.clear();
        if (op.kind != ir::OpKind::Barrier) {
            op.wires(wires);
            for (uint32_t u : wires) {
                if (!movable[u]) continue;
                ++next_use[u];
                if (held_value[u] && tracker.is_zero(u)) {  // a new life starts here
                    cur[u] = n + lives++;
                    held_value[u] = 0;
                }
            }
        }
        tracker.step(op);
        out.push_back(op);
        rename(out.back());
        for (uint32_t u : wires) {
            if (!movable[u]) continue;
            if (!tracker.is_zero(u)) held_value[u] = 1;
            if (unload_constants && tracker.is_one(u) && next_use[u] < uses[u].size() &&
                uses[u][next_use[u]] - i > kMinIdleOps) {
                ir::Op x = ir::Op::x(cur[u]);  // back to |0>: this life ends here
                x.loc = op.loc;
                out.push_back(std::move(x));
                reload_before[uses[u][next_use[u]]].push_back(u);
                ++constants_unloaded;
            }
        }
    }
    if (lives == 0) return r;
    c.ops = std::move(out);
    // One register per new life: a life the lowering later measures (a temporary AND's measured
    // uncompute) then keeps only its own wire out of share-work-wires.
    const std::string base = fresh_work_register_name(c);
    std::unordered_set<std::string> taken;
    for (const ir::Register& reg : c.registers) taken.insert(reg.name);
    for (const ir::ClassicalRegister& reg : c.cregs) taken.insert(reg.name);
    for (uint32_t k = 0, suffix = 0; k < lives; ++k) {
        std::string name = base;
        while (taken.count(name)) name = fmt::format("{}_{}", base, ++suffix);
        taken.insert(name);
        c.add_register(name, 1, ir::Role::Clean, true);
    }
    r.count("lives-split", lives);
    if (constants_unloaded) r.count("constants-unloaded", constants_unloaded);
    r.changed = true;
    return r;
}

}  // namespace whittle::passes
