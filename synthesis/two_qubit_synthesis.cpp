// Templates per entangler (Vatan & Williams 2004 for 3 CNOTs), completed by the KAK local matching.
#include "synthesis/two_qubit_synthesis.h"

#include <cmath>

#include "ir/error.h"
#include "ir/statevector.h"
#include "synthesis/kak.h"

namespace whittle::lowering {
namespace {

using ir::Complex;
using ir::Mat2;
using ir::Mat4;
using ir::Op;
constexpr double kPi = 3.14159265358979323846;
constexpr double kTol = 1e-9;

/// A template step: a local pair (la on a, lb on b) or one entangling gate.
struct Step {
    bool local = true;
    Mat2 la = Mat2::Identity(), lb = Mat2::Identity();
    Op gate;
    Mat4 m = Mat4::Identity();
};

Mat2 rx(double t) {
    Mat2 m;
    m << std::cos(t / 2), Complex(0, -std::sin(t / 2)), Complex(0, -std::sin(t / 2)), std::cos(t / 2);
    return m;
}
Mat2 ry(double t) {
    Mat2 m;
    m << std::cos(t / 2), -std::sin(t / 2), std::sin(t / 2), std::cos(t / 2);
    return m;
}
Mat2 rz(double t) {
    Mat2 m;
    m << std::exp(Complex(0, -t / 2)), 0, 0, std::exp(Complex(0, t / 2));
    return m;
}
Mat2 hadamard() {
    Mat2 m;
    const double r = 1 / std::sqrt(2.0);
    m << r, r, r, -r;
    return m;
}
Mat2 sgate(bool dagger) {
    Mat2 m;
    m << 1, 0, 0, Complex(0, dagger ? -1 : 1);
    return m;
}

Step local(const Mat2& a, const Mat2& b) {
    Step s;
    s.la = a;
    s.lb = b;
    return s;
}

Step gate(const Op& op, uint32_t a, uint32_t b) {
    Step s;
    s.local = false;
    s.gate = op;
    s.m = two_qubit_product({op}, a, b);
    return s;
}

Mat4 product(const std::vector<Step>& steps) {
    Mat4 m = Mat4::Identity();
    for (const Step& s : steps) m = (s.local ? kron(s.la, s.lb) : s.m) * m;
    return m;
}

bool zero(double v) { return std::fabs(v) < kTol; }
bool quarter(double v) { return std::fabs(std::fabs(v) - kPi / 4) < kTol; }

struct Builder {
    uint32_t a, b;
    Entangler e;

    Step cx(bool a_controls) const {
        return gate(a_controls ? Op::x(b, {ir::Lit::pos(a)}) : Op::x(a, {ir::Lit::pos(b)}), a, b);
    }
    /// A CNOT in the entangler's terms: CX itself, or H CZ H on the target.
    void add_cx(std::vector<Step>& out, bool a_controls) const {
        if (e == Entangler::CZ) {
            const Mat2 h = hadamard(), i = Mat2::Identity();
            out.push_back(a_controls ? local(i, h) : local(h, i));
            out.push_back(gate(Op::phase(ir::Angle::pi_times(1), {ir::Lit::pos(a), ir::Lit::pos(b)}), a, b));
            out.push_back(a_controls ? local(i, h) : local(h, i));
            return;
        }
        out.push_back(cx(a_controls));
    }

    /// CNOT family: a gate locally equivalent to exp(i(xXX + yYY + zZZ)).
    std::vector<Step> cx_template(double x, double y, double z) const {
        std::vector<Step> t;
        const int zeros = zero(x) + zero(y) + zero(z);
        if (zeros == 3) return t;
        if (zeros == 2 && (quarter(x) || quarter(y) || quarter(z))) {
            add_cx(t, true);
            return t;
        }
        if (zeros >= 1) {
            // exp(i(p XX + q ZZ)) = CX (Rx(-2p) x Rz(-2q)) CX.
            double p = x, q = z;
            if (zero(x)) p = y;
            else if (zero(z)) q = y;
            add_cx(t, true);
            t.push_back(local(rx(-2 * p), rz(-2 * q)));
            add_cx(t, true);
            return t;
        }
        return vatan_williams(x, y, z);
    }

    /// Vatan & Williams 2004 (quant-ph/0308006): N(x, y, z) in three CNOTs in alternating
    /// directions, for any coordinates.
    std::vector<Step> vatan_williams(double x, double y, double z) const {
        std::vector<Step> t;
        add_cx(t, false);
        t.push_back(local(rz(kPi / 2 - 2 * z), ry(2 * x - kPi / 2)));
        add_cx(t, true);
        t.push_back(local(Mat2::Identity(), ry(kPi / 2 - 2 * y)));
        add_cx(t, false);
        return t;
    }

    std::vector<Step> xx_template(double x, double y, double z) const {
        std::vector<Step> t;
        auto xx = [&](double c) {
            t.push_back(gate(Op::two(ir::OpKind::XX, a, b, snap_angle(-2 * c)), a, b));
        };
        if (!zero(x)) xx(x);
        if (!zero(y)) {
            // exp(iyYY) = (S x S) exp(iyXX) (Sdg x Sdg).
            t.push_back(local(sgate(true), sgate(true)));
            xx(y);
            t.push_back(local(sgate(false), sgate(false)));
        }
        if (!zero(z)) {
            t.push_back(local(hadamard(), hadamard()));
            xx(z);
            t.push_back(local(hadamard(), hadamard()));
        }
        return t;
    }

    /// iSWAP (Rx(-2p) x Rx(-2q)) iSWAP is locally equivalent to exp(i(p XX + q YY)).
    std::vector<Step> iswap_pair(double p, double q) const {
        std::vector<Step> t;
        t.push_back(gate(Op::two(ir::OpKind::ISwap, a, b), a, b));
        t.push_back(local(rx(-2 * p), rx(-2 * q)));
        t.push_back(gate(Op::two(ir::OpKind::ISwap, a, b), a, b));
        return t;
    }

    /// Steps equal to exactly `target` (a matrix locally equivalent to the template).
    std::vector<Step> exactly(const Mat4& target, std::vector<Step> tmpl, double& phase) const {
        const LocalMatch lm = match_locals(target, product(tmpl));
        std::vector<Step> out;
        out.push_back(local(lm.before_a, lm.before_b));
        for (Step& s : tmpl) out.push_back(std::move(s));
        out.push_back(local(lm.after_a, lm.after_b));
        phase += lm.phase;
        return out;
    }

    /// Minimal iSWAP count from the coordinates. iSWAP = SWAP * CZ * (S x S), and SWAP commutes with
    /// CZ and moves across locals by exchanging them, so k iSWAPs realize exactly the classes of
    /// SWAP^k times a k-CZ circuit: 0 locals, 1 the iSWAP class, 2 the two-CNOT classes (a zero
    /// coordinate), 3 everything (SWAP times a 3-CNOT circuit). Counts as in Schuch & Siewert 2003,
    /// quant-ph/0209035 (CNOT needs 2 iSWAPs, any gate 3; from memory); the argument above is ours.
    std::vector<Step> iswap_template(double x, double y, double z) const {
        const int zeros = zero(x) + zero(y) + zero(z);
        const int quarters = quarter(x) + quarter(y) + quarter(z);
        std::vector<Step> t;
        if (zeros == 3) return t;
        if (zeros == 1 && quarters == 2) {
            t.push_back(gate(Op::two(ir::OpKind::ISwap, a, b), a, b));
            return t;
        }
        if (zeros >= 1) {
            std::vector<double> nz;
            for (double v : {x, y, z})
                if (!zero(v)) nz.push_back(v);
            return iswap_pair(nz[0], nz.size() > 1 ? nz[1] : 0.0);
        }
        // SWAP = e^{-i pi/4} N(pi/4, pi/4, pi/4) up to phase: the 3-CZ part carries c - pi/4.
        const double q = kPi / 4;
        return iswap_from_cz(Builder{a, b, Entangler::CZ}.vatan_williams(x - q, y - q, z - q));
    }

    /// Rewrites a circuit of locals and CZs with an odd number k of CZs into k iSWAPs whose product
    /// is SWAP times it: each CZ = SWAP * iSWAP * (Sdg x Sdg), and the SWAPs are moved to the end,
    /// exchanging the wires of every local they pass.
    std::vector<Step> iswap_from_cz(const std::vector<Step>& cz_steps) const {
        std::vector<Step> t;
        bool swapped = false;
        for (const Step& s : cz_steps) {
            if (s.local) {
                t.push_back(swapped ? local(s.lb, s.la) : local(s.la, s.lb));
                continue;
            }
            t.push_back(local(sgate(true), sgate(true)));
            t.push_back(gate(Op::two(ir::OpKind::ISwap, a, b), a, b));
            swapped = !swapped;
        }
        WHITTLE_ASSERT(swapped && "iswap_from_cz needs an odd number of CZs");
        return t;
    }
};

}  // namespace

Mat4 two_qubit_product(const std::vector<Op>& ops, uint32_t a, uint32_t b) {
    // Simulate on a two-wire circuit where a -> wire 1 (high bit) and b -> wire 0.
    ir::Circuit c;
    c.add_register("q", 2, ir::Role::Data);
    for (Op op : ops) {
        auto map = [&](uint32_t w) { return w == a ? 1u : w == b ? 0u : ir::kNoWire; };
        if (op.target != ir::kNoWire) op.target = map(op.target);
        if (op.target2 != ir::kNoWire) op.target2 = map(op.target2);
        for (ir::Lit& l : op.controls) l = ir::Lit::make(map(l.wire()), l.positive());
        op.set_condition(-1, 0);
        c.ops.push_back(op);
    }
    return ir::circuit_unitary(c);
}

int entangler_count(const Mat4& u, Entangler e) {
    const WeylCoords w = weyl_coordinates(u);
    Builder bld{1, 0, e};
    std::vector<Step> t;
    switch (e) {
    case Entangler::CX:
    case Entangler::CZ: t = bld.cx_template(w.x, w.y, w.z); break;
    case Entangler::XX: t = bld.xx_template(w.x, w.y, w.z); break;
    case Entangler::ISwap: t = bld.iswap_template(w.x, w.y, w.z); break;
    }
    int n = 0;
    for (const Step& s : t) n += !s.local;
    return n;
}

TwoQubitSynthesis synthesize_2q(const Mat4& u, uint32_t a, uint32_t b, Entangler e, OneQubitBasis basis) {
    const WeylCoords w = weyl_coordinates(u);
    Builder bld{a, b, e};
    double phase = 0;
    std::vector<Step> t;
    switch (e) {
    case Entangler::CX:
    case Entangler::CZ: t = bld.cx_template(w.x, w.y, w.z); break;
    case Entangler::XX: t = bld.xx_template(w.x, w.y, w.z); break;
    case Entangler::ISwap: t = bld.iswap_template(w.x, w.y, w.z); break;
    }
    std::vector<Step> steps = bld.exactly(u, std::move(t), phase);
    TwoQubitSynthesis r;
    // Merge runs of locals, then write each wire's local in the target basis.
    Mat2 pa = Mat2::Identity(), pb = Mat2::Identity();
    auto flush = [&] {
        const bool ok_a = synthesize_1q(pa, a, basis, r.ops, r.phase);
        const bool ok_b = synthesize_1q(pb, b, basis, r.ops, r.phase);
        WHITTLE_ASSERT(ok_a && ok_b && "a KAK local has no exact form in this basis");
        pa = pb = Mat2::Identity();
    };
    for (const Step& s : steps) {
        if (s.local) {
            pa = s.la * pa;
            pb = s.lb * pb;
            continue;
        }
        flush();
        r.ops.push_back(s.gate);
        ++r.entanglers;
    }
    flush();
    r.phase += snap_angle(phase);
    r.error = (two_qubit_product(r.ops, a, b) * std::polar(1.0, r.phase.to_radians()) - u).norm() / 2;
    return r;
}

}  // namespace whittle::lowering
