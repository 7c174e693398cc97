// Path sums: building one gate by gate, and the reduction rules of Amy 2018 (arXiv:1805.06908).
#include "verify/path_sum.h"

#include <chrono>
#include <limits>

#include "ir/error.h"

namespace whittle::passes {
namespace {

const ir::Angle kPi = ir::Angle::pi_times(1);
const ir::Angle kHalfPi = ir::Angle::pi_times(1, 2);

bool halvable(const ir::Angle& a) { return a.is_exact() && a.divided_by(2).is_exact(); }

}  // namespace

PathSum::PathSum(uint32_t num_wires, const std::vector<uint8_t>& clean, bool name_products)
    : n_(num_wires), name_products_(name_products), out_(num_wires) {
    for (uint32_t w = 0; w < num_wires; ++w)
        if (!clean[w]) out_[w] = Anf::var(w);
}

bool PathSum::supports(const ir::Op& op) {
    if (op.is_conditioned()) return false;
    for (const ir::Angle& a : {op.angle, op.phi(), op.lambda()})
        if (!halvable(a)) return false;
    switch (op.kind) {
    case ir::OpKind::X:
    case ir::OpKind::Phase:
    case ir::OpKind::Parity:
    case ir::OpKind::RZ:
    case ir::OpKind::Y:
    case ir::OpKind::Swap:
    case ir::OpKind::ISwap:
    case ir::OpKind::XX:
    case ir::OpKind::Barrier: return true;
    case ir::OpKind::H:
    case ir::OpKind::SX:
    case ir::OpKind::SXdg:
    case ir::OpKind::RX:
    case ir::OpKind::RY:
    case ir::OpKind::U:
    case ir::OpKind::R: return op.controls.empty();
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: return false;
    }
    return false;
}

Var PathSum::fresh() {
    live_.push_back(1);
    return Var(n_ + live_.size() - 1);
}

uint32_t PathSum::num_path_vars() const {
    uint32_t k = 0;
    for (uint8_t l : live_) k += l;
    return k;
}

void PathSum::hadamard(uint32_t wire) {
    // H|x> = 2^{-1/2} sum_y (-1)^{x y} |y>
    const Var y = fresh();
    phase_.add_indicator(kPi, out_[wire] & Anf::var(y));
    out_[wire] = Anf::var(y);
    sqrt2_power_ -= 1;
}

Anf PathSum::control_product(const ir::Op& op) const {
    Anf on = Anf::one();
    for (ir::Lit l : op.controls) on = on & (l.positive() ? out_[l.wire()] : out_[l.wire()].negated());
    return on;
}

void PathSum::mcx(uint32_t target, const Anf& on) {
    const bool nonlinear = [&] {
        for (const Monomial& m : on.terms())
            if (m.size() > 1) return true;
        return false;
    }();
    if (!name_products_ || !nonlinear) {
        out_[target] ^= on;
        return;
    }
    hadamard(target);  // X^on = H Z^on H
    phase_.add_indicator(kPi, on & out_[target]);
    hadamard(target);
}

void PathSum::rz(uint32_t target, const ir::Angle& a, const Anf& on) {
    // exp(-i a/2 Z) = e^{-i a/2} e^{i a [t]} on the wires where `on` holds
    phase_.add_indicator(-a.divided_by(2), on);
    phase_.add_indicator(a, on & out_[target]);
}

void PathSum::apply(const ir::Op& op) {
    WHITTLE_ASSERT(supports(op) && "PathSum::apply on an unsupported op");
    const uint32_t t = op.target, t2 = op.target2;
    const ir::Angle& a = op.angle;
    switch (op.kind) {
    case ir::OpKind::Barrier: return;
    case ir::OpKind::X: mcx(t, control_product(op)); return;
    case ir::OpKind::Phase: phase_.add_indicator(a, control_product(op)); return;
    case ir::OpKind::Parity: {
        Anf f;
        for (ir::Lit l : op.controls) f ^= out_[l.wire()];
        phase_.add_indicator(a, f);
        return;
    }
    case ir::OpKind::RZ: rz(t, a, control_product(op)); return;
    case ir::OpKind::Y: {
        // Y = X diag(i, -i): the phase i(-1)^t before the flip
        const Anf on = control_product(op);
        phase_.add_indicator(kHalfPi, on);
        phase_.add_indicator(kPi, on & out_[t]);
        mcx(t, on);
        return;
    }
    case ir::OpKind::Swap: {
        if (op.controls.empty()) {
            std::swap(out_[t], out_[t2]);
            return;
        }
        out_[t] ^= out_[t2];  // controlled swap = CNOT(t2->t), C&t -> t2, CNOT(t2->t)
        mcx(t2, control_product(op) & out_[t]);
        out_[t] ^= out_[t2];
        return;
    }
    case ir::OpKind::ISwap:  // iSWAP = SWAP CZ (S (x) S)
        phase_.add_indicator(kHalfPi, out_[t]);
        phase_.add_indicator(kHalfPi, out_[t2]);
        phase_.add_indicator(kPi, out_[t] & out_[t2]);
        std::swap(out_[t], out_[t2]);
        return;
    case ir::OpKind::XX:  // (H (x) H) exp(-i a/2 Z(x)Z) (H (x) H)
        hadamard(t);
        hadamard(t2);
        phase_.add_indicator(a, out_[t] ^ out_[t2]);
        phase_.add({}, -a.divided_by(2));
        hadamard(t);
        hadamard(t2);
        return;
    case ir::OpKind::H: hadamard(t); return;
    case ir::OpKind::SX:  // H S H
    case ir::OpKind::SXdg:
        hadamard(t);
        phase_.add_indicator(op.kind == ir::OpKind::SX ? kHalfPi : -kHalfPi, out_[t]);
        hadamard(t);
        return;
    case ir::OpKind::RX:  // H RZ H
        hadamard(t);
        rz(t, a, Anf::one());
        hadamard(t);
        return;
    case ir::OpKind::RY:  // S RX S^dagger
        phase_.add_indicator(-kHalfPi, out_[t]);
        hadamard(t);
        rz(t, a, Anf::one());
        hadamard(t);
        phase_.add_indicator(kHalfPi, out_[t]);
        return;
    case ir::OpKind::U: {  // e^{i(phi+lambda)/2} RZ(phi) RY(theta) RZ(lambda)
        const ir::Angle phi = op.phi(), lambda = op.lambda();
        rz(t, lambda, Anf::one());
        ir::Op ry = ir::Op::one(ir::OpKind::RY, t, a);
        apply(ry);
        rz(t, phi, Anf::one());
        phase_.add({}, (phi + lambda).divided_by(2));
        return;
    }
    case ir::OpKind::R: {  // RZ(phi) RX(theta) RZ(-phi)
        const ir::Angle phi = op.phi();
        rz(t, -phi, Anf::one());
        apply(ir::Op::one(ir::OpKind::RX, t, a));
        rz(t, phi, Anf::one());
        return;
    }
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: break;
    }
    WHITTLE_ASSERT(false && "unreachable: unsupported op in a path sum");
}

void PathSum::apply_inverse(const ir::Op& op) {
    WHITTLE_ASSERT(supports(op) && "PathSum::apply_inverse on an unsupported op");
    if (op.kind == ir::OpKind::RZ) {
        // RZ(a)^dagger = e^{+i a/2} e^{-i a [t]} where the controls hold
        const Anf on = control_product(op);
        phase_.add_indicator(op.angle.divided_by(2), on);
        phase_.add_indicator(-op.angle, on & out_[op.target]);
        return;
    }
    if (op.kind == ir::OpKind::ISwap) {
        // (SWAP CZ (S (x) S))^dagger = (S^dagger (x) S^dagger) CZ SWAP
        std::swap(out_[op.target], out_[op.target2]);
        phase_.add_indicator(kPi, out_[op.target] & out_[op.target2]);
        phase_.add_indicator(-kHalfPi, out_[op.target]);
        phase_.add_indicator(-kHalfPi, out_[op.target2]);
        return;
    }
    // Every other kind inverts exactly, or (uncontrolled rotations) up to a global phase.
    std::vector<ir::Op> inverse;
    ir::append_inverse(op, inverse);
    for (const ir::Op& o : inverse) apply(o);
}

bool PathSum::apply_rule(bool& progressed) {
    const size_t nv = live_.size();
    std::vector<uint32_t> in_outputs(nv, 0);
    std::vector<std::vector<const PhasePoly::Terms::value_type*>> terms_of(nv);
    for (const Anf& f : out_)
        for (const Monomial& m : f.terms())
            for (Var v : m)
                if (v >= n_) ++in_outputs[v - n_];
    for (const auto& term : phase_.terms())
        for (Var v : term.first)
            if (v >= n_) terms_of[v - n_].push_back(&term);

    // [Elim]: sum_y 1 = 2.
    bool elim = false;
    for (size_t i = 0; i < nv; ++i) {
        if (!live_[i] || in_outputs[i] || !terms_of[i].empty()) continue;
        live_[i] = 0;
        sqrt2_power_ += 2;
        elim = true;
    }
    if (elim) return progressed = true;

    Var best_y = 0, best_z = 0;
    Anf best_r;
    size_t best_cost = std::numeric_limits<size_t>::max();
    for (size_t i = 0; i < nv; ++i) {
        if (!live_[i] || in_outputs[i]) continue;
        const Var y = Var(n_ + i);
        bool all_pi = true;
        ir::Angle single;  // coefficient of the monomial {y}
        std::vector<Monomial> rest;
        for (const auto* term : terms_of[i]) {
            Monomial r;
            for (Var v : term->first)
                if (v != y) r.push_back(v);
            if (r.empty()) single = term->second;
            else if (term->second != kPi) all_pi = false;
            if (!r.empty() || term->second == kPi) rest.push_back(std::move(r));
        }
        if (!all_pi) continue;
        if (single == kHalfPi || single == -kHalfPi) {
            // [omega]: sum_y i^{+-y} (-1)^{yQ} = sqrt2 e^{+-i pi/4} e^{-+i pi/2 [Q]}
            const bool plus = single == kHalfPi;
            const Anf q = Anf::from_terms(std::move(rest));
            std::vector<Monomial> drop;
            for (const auto* term : terms_of[i]) drop.push_back(term->first);
            for (const Monomial& m : drop) phase_.add(m, -phase_.terms().at(m));
            phase_.add({}, ir::Angle::pi_times(plus ? 1 : -1, 4));
            phase_.add_indicator(plus ? -kHalfPi : kHalfPi, q);
            live_[i] = 0;
            sqrt2_power_ += 1;
            return progressed = true;
        }
        if (!single.is_zero() && single != kPi) continue;
        // [HH]: sum_y (-1)^{yQ} = 2 [Q = 0]; Q = z xor R with z a path variable: z := R.
        const Anf q = Anf::from_terms(std::move(rest));
        for (const Monomial& m : q.terms()) {
            if (m.size() != 1 || m[0] < n_ || m[0] == y || !q.is_linear_in(m[0])) continue;
            const Var z = m[0];
            size_t occurrences = in_outputs[z - n_];
            for (const auto* term : terms_of[z - n_])
                if (!monomial_contains(term->first, y)) ++occurrences;
            const Anf r = q ^ Anf::var(z);
            const size_t cost = occurrences * (r.size() > 1 ? r.size() - 1 : 0);
            if (cost < best_cost) {
                best_cost = cost;
                best_y = y;
                best_z = z;
                best_r = r;
            }
        }
    }
    if (best_cost == std::numeric_limits<size_t>::max()) return false;
    std::vector<Monomial> drop;
    for (const auto* term : terms_of[best_y - n_]) drop.push_back(term->first);
    for (const Monomial& m : drop) phase_.add(m, -phase_.terms().at(m));
    phase_.substitute(best_z, best_r);
    for (Anf& f : out_)
        if (f.contains_var(best_z)) f = f.substitute(best_z, best_r);
    live_[best_y - n_] = 0;
    live_[best_z - n_] = 0;
    sqrt2_power_ += 2;
    return progressed = true;
}

bool PathSum::reduce(double seconds) {
    const auto start = std::chrono::steady_clock::now();
    bool progressed = false;
    while (apply_rule(progressed)) {
        if (std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count() > seconds) return false;
    }
    return true;
}

}  // namespace whittle::passes
