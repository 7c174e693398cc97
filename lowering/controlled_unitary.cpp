// Controlled one-qubit unitaries, multi-controlled phases and controlled swaps (ControlLowerer members).
//
// One control: the ABC decomposition U = e^{ia} A X B X C with ABC = I (Barenco et al. 1995,
// quant-ph/9503016, Lemma 5.1; Nielsen & Chuang Fig. 4.6). Several controls: the AND of the
// controls into a clean wire and one singly controlled U, or without a clean wire the Barenco form
// Lambda_n(W) = A Lambda_n(X) B Lambda_n(X) C for W in SU(2) (Lemma 7.9) plus the phase e^{ia AND}.
#include <cmath>

#include <fmt/format.h>

#include "ir/error.h"
#include "lowering/control_lowerer.h"
#include "synthesis/euler.h"
#include "lowering/mcx_constructions.h"

namespace whittle::lowering {
namespace {

using ir::Angle;
using ir::Lit;
using ir::LitVec;
using ir::Mat2;
using ir::Op;
using ir::OpKind;

/// ZYZ Euler angles of the SU(2) part: U = e^{i alpha} Rz(beta) Ry(gamma) Rz(delta).
struct Abc {
    Angle alpha, beta, gamma, delta;
};

Abc abc_of(const Mat2& u) {
    EulerAngles e = euler_zyz(u);
    return Abc{e.phase, e.a, e.b, e.c};
}

/// A (Rz(beta) Ry(gamma/2)), B (Ry(-gamma/2) Rz(-(delta+beta)/2)), C (Rz((delta-beta)/2)) around
/// two X's on the target: emitted as C, X, B, X, A (time order); `x` emits the controlled X.
template <class EmitX>
void abc_around(OpSink& s, uint32_t t, const Abc& g, EmitX&& x) {
    s.one(OpKind::RZ, t, half_of_sum(g.delta, 1, g.beta, -1));
    x();
    s.one(OpKind::RZ, t, half_of_sum(g.delta, -1, g.beta, -1));
    s.one(OpKind::RY, t, -g.gamma.divided_by(2));
    x();
    s.one(OpKind::RY, t, g.gamma.divided_by(2));
    s.one(OpKind::RZ, t, g.beta);
}

bool is_diagonal(const Mat2& m) { return std::abs(m(0, 1)) < 1e-13 && std::abs(m(1, 0)) < 1e-13; }

}  // namespace

void ControlLowerer::mc_phase(const LitVec& lits, Angle a) {
    const size_t k = lits.size();
    if (a.is_zero()) return;
    if (k == 0) {
        sink_->add_global_phase(a);
        return;
    }
    const Angle pi = Angle::pi_times(1);
    if (k == 1 || (k <= 3 && a == pi)) {
        sink_->phase(a, lits);  // Z/S/T, CZ and CCZ stay for the Toffoli stage and the target
        return;
    }
    if (k == 2) {
        // e^{ia*la*lb} = e^{i(a/2)(la + lb - (la xor lb))}; the parity sits on wire b between two CNOTs.
        set_choice("controlled phase: 2 CNOTs");
        used("cphase");
        const Lit la = lits[0], lb = lits[1];
        const Angle half = a.divided_by(2);
        sink_->phase(half, {la});
        sink_->phase(half, {lb});
        sink_->cx(Lit::pos(la.wire()), lb.wire());
        sink_->phase(-half, {Lit::make(lb.wire(), la.positive() == lb.positive())});
        sink_->cx(Lit::pos(la.wire()), lb.wire());
        return;
    }
    const Lit last = lits[k - 1];
    LitVec rest(lits.begin(), lits.end() - 1);
    if (a == pi) {
        // Multi-controlled Z = H MCX H on the last wire.
        // The MCX's own choice (and its metric reason) is what the report shows.
        if (!last.positive()) sink_->x(last.wire());
        sink_->h(last.wire());
        mcx(rest, last.wire());
        sink_->h(last.wire());
        if (!last.positive()) sink_->x(last.wire());
        return;
    }
    // The shape of this op for the memo: the sub-ops of and-into-clean use further free wires.
    std::vector<uint32_t> clean = take_clean(k, wires_of(lits));
    release_clean(clean);
    const size_t borrowable = borrow(k, wires_of(lits)).size();
    std::vector<Candidate> cands;
    if (!clean.empty()) {
        // AND of all but the last literal into a clean wire, then a controlled phase.
        cands.push_back({"and-into-clean", fmt::format("clean wire {}", c_.wire_name(clean[0])), [=, this] {
                             std::vector<uint32_t> cl = take_clean(1, wires_of(lits));
                             const uint32_t w = cl[0];
                             const uint32_t pair = rest.size() == 2 ? new_pair() : 0;
                             if (pair) sink_->paired_x(w, rest, pair, ir::PairHalf::Compute);
                             else mcx(rest, w);
                             mc_phase({Lit::pos(w), last}, a);
                             if (pair) sink_->paired_x(w, rest, pair, ir::PairHalf::Uncompute);
                             else mcx(rest, w);
                             release_clean(cl);
                         }});
    }
    // e^{ia*A*l} = e^{i(a/2)A} * Lambda_A(Rz(+-a)) on the last wire; Lambda_A(Rz(f)) = Rz(f/2) MCX Rz(-f/2) MCX.
    cands.push_back({"phase-halving", "Barenco et al. Lemma 7.9 form", [=, this] {
                         // One half h (2h = a mod 2*pi) used throughout: halving -a separately could differ by pi.
                         const Angle h = a.divided_by(2);
                         mc_phase(rest, h);
                         const Angle fh = last.positive() ? h : -h;
                         sink_->one(OpKind::RZ, last.wire(), fh);
                         mcx(rest, last.wire());
                         sink_->one(OpKind::RZ, last.wire(), -fh);
                         mcx(rest, last.wire());
                     }});
    if (k <= kMaxParityNetworkLiterals)
        cands.push_back({"phase-polynomial", fmt::format("{}-literal parity network", k),
                         [=, this] { mc_phase_parity_network(*this, lits, a); }});
    emit_cheapest(fmt::format("mcphase/{}", k), fmt::format("mcphase/{}/{}/{}/{}", k, clean.size(), borrowable, a.to_string()), cands);
}

void ControlLowerer::mc_one_qubit(const LitVec& controls, const Op& op) {
    const uint32_t t = op.target;
    const size_t k = controls.size();
    auto plain = [&](OpKind kind, Angle a = {}) { sink_->one(kind, t, a); };
    if (k == 0) {
        Op copy = op;
        copy.controls.clear();
        sink_->push(copy);
        return;
    }
    LitVec with_t = controls;
    with_t.push_back(Lit::pos(t));
    // Exact forms first: each is the op conjugated into a (multi-)controlled phase or X.
    switch (op.kind) {
    case OpKind::X: mcx(controls, t); return;
    case OpKind::Phase:
    case OpKind::Parity: mc_phase(with_t, op.angle); return;
    case OpKind::RZ:
        // Rz(f) = e^{-if/2} diag(1, e^{if}).
        mc_phase(controls, -op.angle.divided_by(2));
        mc_phase(with_t, op.angle);
        return;
    case OpKind::RX:
    case OpKind::SX:
    case OpKind::SXdg: {
        // Rx(f) = H Rz(f) H; SX = H S H, SXdg = H Sdg H.
        plain(OpKind::H);
        if (op.kind == OpKind::RX) {
            mc_one_qubit(controls, Op::one(OpKind::RZ, t, op.angle));
        } else {
            mc_phase(with_t, Angle::pi_times(op.kind == OpKind::SX ? 1 : -1, 2));
        }
        plain(OpKind::H);
        return;
    }
    case OpKind::RY: {
        // Ry(f) = S Rx(f) Sdg.
        sink_->phase(Angle::pi_times(-1, 2), {Lit::pos(t)});
        mc_one_qubit(controls, Op::one(OpKind::RX, t, op.angle));
        sink_->phase(Angle::pi_times(1, 2), {Lit::pos(t)});
        return;
    }
    case OpKind::Y:
        // Y = S X Sdg.
        sink_->phase(Angle::pi_times(-1, 2), {Lit::pos(t)});
        mcx(controls, t);
        sink_->phase(Angle::pi_times(1, 2), {Lit::pos(t)});
        return;
    default: break;
    }
    const Mat2 u = ir::one_qubit_matrix(op);
    if (is_diagonal(u)) {
        mc_phase(controls, snap_angle(std::arg(u(0, 0))));
        mc_phase(with_t, snap_angle(std::arg(u(1, 1)) - std::arg(u(0, 0))));
        return;
    }
    const Abc g = abc_of(u);
    if (k == 1) {
        set_choice("controlled-U: ABC decomposition, 2 CNOTs");
        used("abc");
        sink_->phase(g.alpha, controls);
        abc_around(*sink_, t, g, [&] { sink_->x(t, controls); });
        return;
    }
    std::vector<uint32_t> clean = take_clean(k, wires_of(controls, {t}));
    release_clean(clean);
    const size_t borrowable = borrow(k, wires_of(controls, {t})).size();
    std::vector<Candidate> cands;
    if (!clean.empty()) {
        cands.push_back({"and-into-clean", fmt::format("clean wire {}, then ABC", c_.wire_name(clean[0])), [=, this] {
                             std::vector<uint32_t> cl = take_clean(1, wires_of(controls, {t}));
                             const uint32_t w = cl[0];
                             const uint32_t pair = k == 2 ? new_pair() : 0;
                             if (pair) sink_->paired_x(w, controls, pair, ir::PairHalf::Compute);
                             else mcx(controls, w);
                             mc_one_qubit({Lit::pos(w)}, op);
                             if (pair) sink_->paired_x(w, controls, pair, ir::PairHalf::Uncompute);
                             else mcx(controls, w);
                             release_clean(cl);
                         }});
    }
    cands.push_back({"barenco-su2", "Lemma 7.9 form, two MCX", [=, this] {
                         mc_phase(controls, g.alpha);
                         abc_around(*sink_, t, g, [&] { mcx(controls, t); });
                     }});
    const std::string key = fmt::format("cu/{}/{}/{}/{}/{}/{}/{}", k, clean.size(), borrowable, g.alpha.to_string(),
                                        g.beta.to_string(), g.gamma.to_string(), g.delta.to_string());
    emit_cheapest(fmt::format("controlled-U/{}", k), key, cands);
}

void ControlLowerer::mc_swap(const LitVec& controls, uint32_t a, uint32_t b) {
    if (controls.empty()) {
        sink_->push(Op::swap(a, b));
        return;
    }
    // Fredkin: CNOT(b -> a), MCX(controls & a -> b), CNOT(b -> a).
    LitVec with_a = controls;
    with_a.push_back(Lit::pos(a));
    sink_->cx(Lit::pos(b), a);
    mcx(with_a, b);
    sink_->cx(Lit::pos(b), a);
}

}  // namespace whittle::lowering
