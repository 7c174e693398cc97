// KAK decomposition by simultaneous real diagonalization of U^T U in the magic basis.
#include "synthesis/kak.h"

#include <array>
#include <cmath>

#include <Eigen/Eigenvalues>

#include "ir/error.h"

namespace whittle::lowering {
namespace {

using ir::Complex;
using ir::Mat2;
using ir::Mat4;
constexpr double kPi = 3.14159265358979323846;

Mat4 magic() {
    const double r = 1 / std::sqrt(2.0);
    const Complex i(0, 1);
    Mat4 m;
    m << 1, 0, 0, i, 0, i, 1, 0, 0, i, -1, 0, 1, 0, 0, -i;
    return m * r;
}

Mat4 to_su4(const Mat4& u) { return u / std::pow(u.determinant(), 0.25); }

/// Real orthogonal P (det +1) and eigenvalues d with P^T m P = diag(d), for m symmetric unitary.
void diagonalize(const Mat4& m, Eigen::Matrix4d& p, Eigen::Vector4cd& d) {
    const Eigen::Matrix4d re = m.real(), im = m.imag();
    const double mixes[] = {0.6180339887, 1.3247179572, -0.41421356, 2.7182818, 0.1};
    double best = 1e300;
    for (double r : mixes) {
        Eigen::SelfAdjointEigenSolver<Eigen::Matrix4d> es(re + r * im);
        Eigen::Matrix4d q = es.eigenvectors();
        if (q.determinant() < 0) q.col(0) *= -1;
        const Mat4 dm = q.transpose().cast<Complex>() * m * q.cast<Complex>();
        double off = 0;
        for (int i = 0; i < 4; ++i)
            for (int j = 0; j < 4; ++j)
                if (i != j) off += std::norm(dm(i, j));
        if (off < best) {
            best = off;
            p = q;
            d = dm.diagonal();
        }
        if (off < 1e-24) return;
    }
}

double reduce(double c) {
    double r = c - std::round(c / (kPi / 2)) * (kPi / 2);
    if (r < -kPi / 4 + 1e-12) r += kPi / 2;
    return r;
}

bool near(double a, double b, double tol) { return std::fabs(a - b) < tol; }

}  // namespace

Mat4 kron(const Mat2& a, const Mat2& b) {
    Mat4 m;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) m.block<2, 2>(2 * i, 2 * j) = a(i, j) * b;
    return m;
}

Mat4 canonical_gate(double x, double y, double z) {
    const Complex i(0, 1);
    Mat2 px, py, pz;
    px << 0, 1, 1, 0;
    py << 0, -i, i, 0;
    pz << 1, 0, 0, -1;
    auto e = [&](double t, const Mat4& p) -> Mat4 { return std::cos(t) * Mat4::Identity() + i * std::sin(t) * p; };
    return e(x, kron(px, px)) * e(y, kron(py, py)) * e(z, kron(pz, pz));
}

WeylCoords weyl_coordinates(const Mat4& u) {
    const Mat4 mg = magic();
    const Mat4 up = mg.adjoint() * to_su4(u) * mg;
    Eigen::Matrix4d p;
    Eigen::Vector4cd d;
    diagonalize(up.transpose() * up, p, d);
    // Magic-basis phases of exp(i(xXX+yYY+zZZ)) are (x-y+z, x+y-z, -x-y-z, -x+y+z); d holds twice them.
    std::array<double, 4> f{};
    for (int k = 0; k < 4; ++k) f[size_t(k)] = std::arg(d(k));
    WeylCoords w;
    w.x = reduce((f[0] + f[1]) / 4);
    w.y = reduce((f[1] + f[3]) / 4);
    w.z = reduce((f[0] + f[3]) / 4);
    return w;
}

int min_cnot_count(const Mat4& u, double tol) {
    const WeylCoords w = weyl_coordinates(u);
    const double c[3] = {w.x, w.y, w.z};
    int zeros = 0, quarters = 0;
    for (double v : c) {
        if (near(v, 0, tol)) ++zeros;
        else if (near(std::fabs(v), kPi / 4, tol)) ++quarters;
    }
    if (zeros == 3) return 0;
    if (zeros == 2 && quarters == 1) return 1;
    if (zeros >= 1) return 2;
    return 3;
}

int sbm_cnot_count(const Mat4& u, double tol) {
    const Complex i(0, 1);
    Mat2 py;
    py << 0, -i, i, 0;
    const Mat4 yy = kron(py, py);
    const Mat4 s = to_su4(u);
    const Mat4 g = s * yy * s.transpose() * yy;
    const Complex tr = g.trace();
    if ((g - Mat4::Identity()).norm() < tol * 10 || (g + Mat4::Identity()).norm() < tol * 10) return 0;
    if (std::abs(tr) < tol * 10 && (g * g + Mat4::Identity()).norm() < tol * 10) return 1;
    if (std::fabs(tr.imag()) < tol * 10) return 2;
    return 3;
}

void split_tensor(const Mat4& l, Mat2& a, Mat2& b) {
    int bi = 0, bj = 0;
    double best = -1;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) {
            const double n = l.block<2, 2>(2 * i, 2 * j).norm();
            if (n > best) {
                best = n;
                bi = i;
                bj = j;
            }
        }
    const Mat2 blk = l.block<2, 2>(2 * bi, 2 * bj);
    b = blk / std::sqrt(blk.determinant());
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) a(i, j) = (b.adjoint() * l.block<2, 2>(2 * i, 2 * j)).trace() / 2.0;
}

LocalMatch match_locals(const Mat4& u, const Mat4& c) {
    const Mat4 mg = magic();
    const Mat4 up = mg.adjoint() * to_su4(u) * mg;
    Mat4 cp = mg.adjoint() * to_su4(c) * mg;
    Eigen::Matrix4d pu, pc;
    Eigen::Vector4cd du, dc;
    diagonalize(up.transpose() * up, pu, du);
    diagonalize(cp.transpose() * cp, pc, dc);
    // Pair the spectra (up to a common sign, from the fourth root in to_su4).
    std::array<int, 4> perm{};
    int sign = 0;
    for (int s : {1, -1}) {
        std::array<bool, 4> used{};
        bool ok = true;
        for (int k = 0; k < 4 && ok; ++k) {
            int pick = -1;
            double bestd = 1e-6;
            for (int j = 0; j < 4; ++j) {
                if (used[size_t(j)]) continue;
                const double dist = std::abs(du(k) - double(s) * dc(j));
                if (dist < bestd) {
                    bestd = dist;
                    pick = j;
                }
            }
            if (pick < 0) ok = false;
            else {
                used[size_t(pick)] = true;
                perm[size_t(k)] = pick;
            }
        }
        if (ok) {
            sign = s;
            break;
        }
    }
    WHITTLE_ASSERT(sign != 0 && "match_locals: the gates are not locally equivalent");
    if (sign < 0) cp *= Complex(0, 1);
    Eigen::Matrix4d pcp;
    for (int k = 0; k < 4; ++k) pcp.col(k) = pc.col(perm[size_t(k)]);
    if (pcp.determinant() < 0) pcp.col(0) *= -1;
    Eigen::Vector4cd root;
    for (int k = 0; k < 4; ++k) root(k) = std::sqrt(du(k));
    const Mat4 inv_root = root.cwiseInverse().asDiagonal();
    const Eigen::Matrix4d k1u = (up * pu.cast<Complex>() * inv_root).real();
    const Eigen::Matrix4d k1c = (cp * pcp.cast<Complex>() * inv_root).real();
    const Mat4 o1 = (k1u * k1c.transpose()).cast<Complex>();
    const Mat4 o2 = (pcp * pu.transpose()).cast<Complex>();
    const Mat4 l1 = mg * o1 * mg.adjoint(), l2 = mg * o2 * mg.adjoint();
    LocalMatch r;
    split_tensor(l1, r.after_a, r.after_b);
    split_tensor(l2, r.before_a, r.before_b);
    const Mat4 rebuilt = kron(r.after_a, r.after_b) * c * kron(r.before_a, r.before_b);
    r.phase = std::arg((rebuilt.adjoint() * u).trace());
    r.error = (u - std::polar(1.0, r.phase) * rebuilt).norm() / 2;
    return r;
}

}  // namespace whittle::lowering
