// Euler decompositions and per-target one-qubit resynthesis with exact angles where they snap.
#include "synthesis/euler.h"

#include <cmath>

#include "ir/error.h"

namespace whittle::lowering {
namespace {

using ir::Complex;
using ir::Mat2;
constexpr double kPi = 3.14159265358979323846;

Mat2 rz(double t) {
    Mat2 m;
    m << std::exp(Complex(0, -t / 2)), 0, 0, std::exp(Complex(0, t / 2));
    return m;
}
Mat2 ry(double t) {
    Mat2 m;
    m << std::cos(t / 2), -std::sin(t / 2), std::sin(t / 2), std::cos(t / 2);
    return m;
}

/// The global phase phi with u = e^{i phi} s (u, s equal up to phase).
double phase_between(const Mat2& u, const Mat2& s) { return std::arg((s.adjoint() * u).trace()); }

}  // namespace

ir::Angle snap_angle(double r) {
    if (!std::isfinite(r)) return ir::Angle::radians(0.0);
    for (int64_t d = 1; d <= 64; ++d) {
        const double k = std::round(r * double(d) / kPi);
        if (std::fabs(r - k * kPi / double(d)) < 1e-12) return ir::Angle::pi_times(int64_t(k), d);
    }
    return ir::Angle::radians(r);
}

ir::Angle half_of_sum(const ir::Angle& x, int sx, const ir::Angle& y, int sy) {
    if (x.is_exact() && y.is_exact()) {
        // Representatives num/den in [0, 2): the sum is taken without reduction, then halved.
        const int64_t den = x.den() * y.den();
        const int64_t num = sx * x.num() * y.den() + sy * y.num() * x.den();
        if (den > 0 && den < (int64_t(1) << 30)) return ir::Angle::pi_times(num, 2 * den);
    }
    return snap_angle((sx * x.to_radians() + sy * y.to_radians()) / 2);
}

EulerAngles euler_zyz(const Mat2& u) {
    const Complex det = u.determinant();
    const Mat2 v = u / std::sqrt(det);
    const double c0 = std::abs(v(0, 0)), s0 = std::abs(v(1, 0));
    double a, b, c;
    if (s0 < 1e-13) {
        b = 0;
        a = 2 * std::arg(v(1, 1));
        c = 0;
    } else if (c0 < 1e-13) {
        b = kPi;
        a = 2 * std::arg(v(1, 0));
        c = 0;
    } else {
        b = 2 * std::atan2(s0, c0);
        a = std::arg(v(1, 1)) + std::arg(v(1, 0));
        c = std::arg(v(1, 1)) - std::arg(v(1, 0));
    }
    EulerAngles e;
    e.a = snap_angle(a);
    e.b = snap_angle(b);
    e.c = snap_angle(c);
    const Mat2 s = rz(e.a.to_radians()) * ry(e.b.to_radians()) * rz(e.c.to_radians());
    e.phase = snap_angle(phase_between(u, s));
    return e;
}

EulerAngles euler_zxz(const Mat2& u) {
    // Rx(b) = Rz(-pi/2) Ry(b) Rz(pi/2), so a = a' + pi/2 and c = c' - pi/2 with no phase change.
    EulerAngles e = euler_zyz(u);
    if (e.b.is_zero()) return e;
    e.a += ir::Angle::pi_times(1, 2);
    e.c += ir::Angle::pi_times(-1, 2);
    if (!e.a.is_exact()) e.a = snap_angle(e.a.to_radians());
    if (!e.c.is_exact()) e.c = snap_angle(e.c.to_radians());
    return e;
}

Mat2 one_qubit_product(const std::vector<ir::Op>& ops) {
    Mat2 m = Mat2::Identity();
    for (const ir::Op& op : ops) m = ir::one_qubit_matrix(op) * m;
    return m;
}

void append_phase_word(int eighths, uint32_t w, std::vector<ir::Op>& out) {
    auto p = [&](int k) { out.push_back(ir::Op::phase(ir::Angle::pi_times(k, 4), {ir::Lit::pos(w)})); };
    switch (((eighths % 8) + 8) % 8) {
    case 0: return;
    case 1: p(1); return;
    case 2: p(2); return;
    case 3: p(2); p(1); return;
    case 4: p(4); return;
    case 5: p(4); p(1); return;
    case 6: p(-2); return;
    case 7: p(-1); return;
    }
}

bool synthesize_1q(const Mat2& u, uint32_t w, OneQubitBasis basis, std::vector<ir::Op>& out, ir::Angle& global_phase) {
    using ir::Angle;
    using ir::Op;
    using ir::OpKind;
    std::vector<Op> ops;
    auto rot = [&](OpKind k, Angle a) {
        if (!a.is_zero()) ops.push_back(Op::one(k, w, a));
    };
    const Angle half_pi = Angle::pi_times(1, 2), pi = Angle::pi_times(1);
    switch (basis) {
    case OneQubitBasis::CliffordT: {
        EulerAngles e = euler_zxz(u);
        const int a = e.a.eighths(), b = e.b.eighths(), c = e.c.eighths();
        if (a < 0 || b < 0 || c < 0) return false;
        append_phase_word(c, w, ops);
        if (b == 4) {
            ops.push_back(Op::x(w));
        } else if (b != 0) {
            ops.push_back(Op::one(OpKind::H, w));
            append_phase_word(b, w, ops);
            ops.push_back(Op::one(OpKind::H, w));
        }
        append_phase_word(a, w, ops);
        break;
    }
    case OneQubitBasis::ZSX: {
        EulerAngles x = euler_zxz(u);
        if (x.b.is_zero()) {
            rot(OpKind::RZ, x.a + x.c);
        } else if (x.b == pi) {
            rot(OpKind::RZ, x.c);
            ops.push_back(Op::x(w));
            rot(OpKind::RZ, x.a);
        } else if (x.b == half_pi || x.b == -half_pi) {
            // Rx(-pi/2) = Rz(pi) Rx(pi/2) Rz(-pi).
            const Angle shift = x.b == half_pi ? Angle() : pi;
            rot(OpKind::RZ, x.c - shift);
            ops.push_back(Op::one(OpKind::SX, w));
            rot(OpKind::RZ, x.a + shift);
        } else {
            // Ry(b) ~ SX Rz(pi - b) SX Rz(-pi) (Rx(pi/2) conjugates Z into -Y).
            EulerAngles y = euler_zyz(u);
            rot(OpKind::RZ, y.c - pi);
            ops.push_back(Op::one(OpKind::SX, w));
            rot(OpKind::RZ, pi - y.b);
            ops.push_back(Op::one(OpKind::SX, w));
            rot(OpKind::RZ, y.a);
        }
        break;
    }
    case OneQubitBasis::ZXZ: {
        EulerAngles x = euler_zxz(u);
        if (x.b.is_zero()) {
            rot(OpKind::RZ, x.a + x.c);
            break;
        }
        rot(OpKind::RZ, x.c);
        rot(OpKind::RX, x.b);
        rot(OpKind::RZ, x.a);
        break;
    }
    case OneQubitBasis::RRz: {
        // Rz(a) Rx(b) Rz(c) = Rz(a + c) R(b, -c), since R(t, p) = Rz(p) Rx(t) Rz(-p).
        EulerAngles x = euler_zxz(u);
        if (!x.b.is_zero()) {
            Op r = Op::one(OpKind::R, w, x.b);
            r.set_phi(-x.c);
            ops.push_back(r);
        }
        rot(OpKind::RZ, x.a + x.c);
        break;
    }
    case OneQubitBasis::U3: {
        EulerAngles y = euler_zyz(u);
        if (!(y.a.is_zero() && y.b.is_zero() && y.c.is_zero())) ops.push_back(Op::u(w, y.b, y.a, y.c));
        break;
    }
    }
    global_phase += snap_angle(phase_between(u, one_qubit_product(ops)));
    for (Op& op : ops) out.push_back(std::move(op));
    return true;
}

}  // namespace whittle::lowering
