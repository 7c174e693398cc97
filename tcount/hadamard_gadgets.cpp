// Hadamard gadgets: stretches of H and region ops, their inner H gates replaced by measured fresh wires.
//
// The gadget, derived here (the idea of trading an inner Hadamard for an ancilla, a measurement and
// a Clifford correction is Heyfron, Campbell 2018, arXiv:1712.01557, "Hadamard gadgets"; this form
// and its correction are worked out below, not copied). Wire q holds the state sum_g psi_g |g>, a
// fresh wire a holds |+> = sum_y |y> / sqrt2. CZ(q, a) then SWAP(q, a) give
// sum_{g,y} psi_g (-1)^{g y} |y>_q |g>_a / sqrt2. Measuring a in the X basis (H, then Z) with outcome
// m projects on sum_g (-1)^{m g} <g| / sqrt2, leaving sum_y (sum_g psi_g (-1)^{g (y ^ m)}) |y>_q / 2,
// which is X^m H |psi> / sqrt2: the H, up to X^m on q right after it. Nothing after the gadget
// touches a, so its measurement can wait for the end of the stretch; the X^m, pushed through the
// rest D of the stretch, is D X_q D^dagger. D is a CNOT + phase circuit: D|v> = e^{i pi/4 f(v)}
// |M v + b> with f = sum_p c_p (p . v) (each parity read as 0 or 1). Then
// D X_q D^dagger |w> = e^{i pi/4 (f(v + e_q) - f(v))} |w + M e_q>, v = M^{-1}(w + b), and
// (p . (v + e_q)) = 1 - (p . v) for p holding q, so the phase is sum_{p holds q} c_p (1 - 2 (p . v)):
// a constant (a phase of the branch, unobservable after the measurement) and -2 c_p on each such
// parity, a multiple of pi/2: Clifford. (A finer angle on such a parity would not be; stretches hold
// none.) Writing p = r M (r a set of output rows), (p . v) = (r . w) ^ (r . b). The gadgets are
// measured in order: D for gadget j does not touch the wires of gadgets 1..j, so neither does the
// correction, and the state after the correction is the state the circuit with X^{m_j} right after
// H_j would have, on which gadget j+1's measurement is taken.
#include "tcount/hadamard_gadgets.h"

#include <algorithm>
#include <bit>
#include <map>
#include <string>

#include <fmt/format.h>

#include "ir/error.h"
#include "tcount/phase_polynomial.h"

namespace whittle::tcount {
namespace {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

bool plain(const Op& op) { return !op.is_conditioned() && op.pair == 0 && op.half == ir::PairHalf::None; }

/// H, or a region op whose angle (if any) is a multiple of pi/4.
bool in_stretch(const Op& op) {
    if (!plain(op)) return false;
    if (op.kind == OpKind::H) return op.controls.empty();
    if (!is_region_op(op)) return false;
    if (op.kind == OpKind::Phase || op.kind == OpKind::Parity) return op.angle.eighths() >= 0;
    return true;
}

enum class Role : uint8_t { Middle, Prefix, Suffix, Gadget, Dropped };

class Gadgetizer {
public:
    Gadgetizer(ir::Circuit& c, const GadgetSettings& s, GadgetStats& stats)
        : c_(c), s_(s), stats_(stats), nq_(c.num_qubits()), touched_(nq_, 0), started_(nq_, 0), pending_(nq_) {}

    bool run() {
        out_.reserve(c_.ops.size() + c_.ops.size() / 8);
        for (size_t i = 0; i < c_.ops.size();) {
            if (!in_stretch(c_.ops[i]) || c_.ops[i].controls.size() + 2 > s_.max_width) {
                close(i);
                out_.push_back(std::move(c_.ops[i]));
                begin_ = ++i;
                continue;
            }
            if (admit(i)) {
                ++i;
                continue;
            }
            // It does not fit: the stretch ends before it, and it starts the next one.
            WHITTLE_ASSERT(i > begin_ && "hadamard gadgets: one op fills a stretch");
            close(i);
            begin_ = i;
        }
        close(c_.ops.size());
        if (used_wires_ == 0) {
            // Nothing replaced: the ops go back as they were (close moved them only into out_).
            c_.ops = std::move(out_);
            return false;
        }
        c_.ops = std::move(out_);
        std::string name = "gadget";
        for (int k = 1; c_.find_register(name) >= 0; ++k) name = fmt::format("gadget{}", k);
        const uint32_t first = c_.add_register(name, used_wires_, ir::Role::Clean);
        WHITTLE_ASSERT(first == nq_ && "hadamard gadgets: the gadget wires follow the circuit's");
        stats_.wires = used_wires_;
        return true;
    }

private:
    /// Takes op i into the stretch when the width and the wire budget allow; false otherwise.
    bool admit(size_t i) {
        const Op& op = c_.ops[i];
        wires_.clear();
        op.wires(wires_);
        uint32_t fresh = 0, need = 0;
        for (uint32_t w : wires_) {
            fresh += !touched_[w];
            need += started_[w] && pending_[w].size() % 2 == 1 && op.kind != OpKind::H;
        }
        if (i > begin_ && (width_ + fresh + h_ + need > s_.max_width || h_ + need > s_.max_wires)) return false;
        if (roles_.size() < i - begin_ + 1) roles_.resize(i - begin_ + 1);
        for (uint32_t w : wires_)
            if (!touched_[w]) {
                touched_[w] = 1;
                list_.push_back(w);
                ++width_;
            }
        Role& role = roles_[i - begin_];
        if (op.kind == OpKind::H) {
            const uint32_t w = op.target;
            if (!started_[w]) {
                role = Role::Prefix;
            } else {
                role = Role::Dropped;
                pending_[w].push_back(i);
            }
            return true;
        }
        role = Role::Middle;
        for (uint32_t w : wires_) {
            std::vector<size_t>& p = pending_[w];
            if (p.size() % 2 == 1) {
                roles_[p.front() - begin_] = Role::Gadget;
                ++h_;
                stats_.hadamards_dropped += p.size() - 1;
            } else {
                stats_.hadamards_dropped += p.size();
            }
            p.clear();
            started_[w] = 1;
        }
        return true;
    }

    /// Ends the stretch [begin_, end): emits it (with its gadgets when it has any) and resets the wires.
    void close(size_t end) {
        for (uint32_t w : list_)
            for (size_t idx : pending_[w]) roles_[idx - begin_] = Role::Suffix;
        if (h_ == 0) {
            // Even runs of H were marked dropped; without a gadget the stretch stays as it was.
            for (size_t i = begin_; i < end; ++i) out_.push_back(std::move(c_.ops[i]));
        } else {
            emit(end);
        }
        for (uint32_t w : list_) {
            touched_[w] = started_[w] = 0;
            pending_[w].clear();
        }
        list_.clear();
        roles_.clear();
        width_ = 0;
        h_ = 0;
    }

    void emit(size_t end) {
        ++stats_.stretches;
        stats_.gadgets += h_;
        used_wires_ = std::max(used_wires_, h_);
        if (creg_ < 0) {
            std::string name = "gadget";
            for (int k = 1; c_.find_creg(name) >= 0; ++k) name = fmt::format("gadget{}", k);
            creg_ = int32_t(c_.add_creg(name, 1, true));
            cbit_ = int32_t(c_.cregs[size_t(creg_)].first);
        }
        const ir::SourceLoc loc = c_.ops[begin_].loc;
        // Region variables: the stretch's wires, then its gadget wires.
        std::vector<uint32_t> var_wire = list_;
        for (uint32_t j = 0; j < h_; ++j) var_wire.push_back(nq_ + j);
        const uint32_t width = uint32_t(var_wire.size());
        WHITTLE_ASSERT(width <= 64 && "hadamard gadgets: a stretch has at most 64 wires");
        for (uint32_t v = 0; v < width; ++v) var_of_[var_wire[v]] = v;
        auto var = [&](uint32_t w) { return var_of_.at(w); };

        for (size_t i = begin_; i < end; ++i)
            if (roles_[i - begin_] == Role::Prefix) out_.push_back(std::move(c_.ops[i]));
        for (uint32_t j = 0; j < h_; ++j) push(Op::one(OpKind::H, nq_ + j), loc);
        std::vector<Op> mid;
        std::vector<size_t> after(h_);
        std::vector<uint32_t> q_of(h_);
        uint32_t j = 0;
        for (size_t i = begin_; i < end; ++i) {
            Op& op = c_.ops[i];
            switch (roles_[i - begin_]) {
            case Role::Middle: mid.push_back(std::move(op)); break;
            case Role::Gadget: {
                const uint32_t q = op.target, a = nq_ + j;
                Op cz = Op::phase(Angle::pi_times(1), {Lit::pos(std::min(q, a)), Lit::pos(std::max(q, a))});
                Op sw = Op::swap(std::min(q, a), std::max(q, a));
                cz.loc = sw.loc = op.loc;
                mid.push_back(std::move(cz));
                mid.push_back(std::move(sw));
                after[j] = mid.size();
                q_of[j] = q;
                ++j;
                break;
            }
            case Role::Prefix:
            case Role::Suffix:
            case Role::Dropped: break;
            }
        }
        WHITTLE_ASSERT(j == h_ && "hadamard gadgets: every gadget placed");
        // The corrections, each from the rest of the stretch after its gadget.
        std::vector<std::vector<Op>> fix(h_);
        for (j = 0; j < h_; ++j) fix[j] = correction(mid, after[j], var_of_.at(q_of[j]), j, var_wire, var, loc);
        for (Op& op : mid) out_.push_back(std::move(op));
        for (j = 0; j < h_; ++j) {
            const uint32_t a = nq_ + j;
            push(Op::one(OpKind::H, a), loc);
            push(Op::measure(a, cbit_), loc);
            for (Op& op : fix[j]) out_.push_back(std::move(op));
            Op reset = Op::x(a);
            reset.set_condition(creg_, 1);
            push(std::move(reset), loc);
        }
        for (size_t i = begin_; i < end; ++i)
            if (roles_[i - begin_] == Role::Suffix) out_.push_back(std::move(c_.ops[i]));
        for (uint32_t w : var_wire) var_of_.erase(w);
    }

    /// D X_q D^dagger for D = mid[from, end), as ops conditioned on the gadget's outcome being 1.
    template <class VarOf>
    std::vector<Op> correction(const std::vector<Op>& mid, size_t from, uint32_t vq, uint32_t j,
                               const std::vector<uint32_t>& var_wire, VarOf var, const ir::SourceLoc& loc) {
        const uint32_t width = uint32_t(var_wire.size());
        RegionBuilder b(width);
        for (size_t k = from; k < mid.size(); ++k) b.add(mid[k], var);
        const RegionPolynomial poly = b.finish();
        WHITTLE_ASSERT(poly.other.empty() && "hadamard gadgets: a stretch holds only multiples of pi/4");
        // tag[v]: the output rows whose sum is e_v (Gauss-Jordan on the output map M).
        std::vector<uint64_t> row = poly.out_parity, tag(width);
        for (uint32_t i = 0; i < width; ++i) tag[i] = uint64_t(1) << i;
        for (uint32_t col = 0; col < width; ++col) {
            uint32_t r = col;
            while (r < width && !(row[r] >> col & 1)) ++r;
            WHITTLE_ASSERT(r < width && "hadamard gadgets: a CNOT circuit's output map is invertible");
            std::swap(row[r], row[col]);
            std::swap(tag[r], tag[col]);
            for (uint32_t k = 0; k < width; ++k)
                if (k != col && (row[k] >> col & 1)) {
                    row[k] ^= row[col];
                    tag[k] ^= tag[col];
                }
        }
        uint64_t flips = 0;
        for (uint32_t i = 0; i < width; ++i)
            if (poly.out_flip[i]) flips |= uint64_t(1) << i;
        // Wires of gadgets 1..j (measured before this correction) must stay out of it.
        uint64_t measured = 0;
        for (uint32_t k = 0; k <= j; ++k) measured |= uint64_t(1) << var(nq_ + k);
        std::map<uint64_t, int> phase;  // parity of the current wires -> coefficient in pi/4, mod 8
        for (const auto& [p, coef] : poly.z8) {
            if (!(p >> vq & 1)) continue;
            uint64_t r = 0;
            for (uint64_t bits = p; bits; bits &= bits - 1) r ^= tag[std::countr_zero(bits)];
            const int k = (8 - (2 * coef) % 8) % 8;                     // -2 c_p
            const bool flip = std::popcount(r & flips) & 1;              // (p . v) = (r . w) ^ flip
            int& slot = phase[r];
            slot = (slot + (flip ? 8 - k : k)) % 8;                      // k (1 - x) = k - k x
        }
        std::vector<Op> out;
        for (const auto& [r, coef] : phase) {
            if (coef == 0) continue;
            WHITTLE_ASSERT(!(r & measured) && "hadamard gadgets: a correction reads a measured wire");
            std::vector<uint32_t> ws;
            for (uint64_t bits = r; bits; bits &= bits - 1) ws.push_back(var_wire[std::countr_zero(bits)]);
            std::sort(ws.begin(), ws.end());
            const Angle a = Angle::pi_times(coef, 4);
            out.push_back(ws.size() == 1 ? Op::phase(a, {Lit::pos(ws[0])}) : Op::parity(a, ws));
        }
        for (uint32_t i = 0; i < width; ++i)
            if (poly.out_parity[i] >> vq & 1) {
                WHITTLE_ASSERT(!(measured >> i & 1) && "hadamard gadgets: a correction flips a measured wire");
                out.push_back(Op::x(var_wire[i]));
            }
        for (Op& op : out) {
            op.loc = loc;
            op.set_condition(creg_, 1);
        }
        return out;
    }

    void push(Op op, const ir::SourceLoc& loc) {
        op.loc = loc;
        out_.push_back(std::move(op));
    }

    ir::Circuit& c_;
    const GadgetSettings& s_;
    GadgetStats& stats_;
    const uint32_t nq_;
    std::vector<Op> out_;
    // The current stretch [begin_, ...): per wire, touched / had an op other than H / its H gates since.
    size_t begin_ = 0;
    std::vector<uint8_t> touched_, started_;
    std::vector<std::vector<size_t>> pending_;
    std::vector<uint32_t> list_, wires_;
    std::vector<Role> roles_;
    uint32_t width_ = 0, h_ = 0, used_wires_ = 0;
    int32_t creg_ = -1, cbit_ = -1;
    std::map<uint32_t, uint32_t> var_of_;
};

}  // namespace

bool insert_hadamard_gadgets(ir::Circuit& c, const GadgetSettings& settings, GadgetStats& stats) {
    if (settings.max_wires == 0) return false;
    WHITTLE_ASSERT(settings.max_width <= 64 && "hadamard gadgets: a stretch has at most 64 wires");
    return Gadgetizer(c, settings, stats).run();
}

}  // namespace whittle::tcount
