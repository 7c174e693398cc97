// Block synthesis (Davis et al. 2020, arXiv:2003.04462; Smith et al. 2021, arXiv:2106.11246): a
// depth-by-depth search over entangler placements, each placement list instantiated by
// Levenberg–Marquardt on the residual V(x) - e^{i phi} U, the Jacobian from prefix and suffix
// products. Everything is counted (steps, instantiations) and seeded, so results are reproducible.
#include "synthesis/block_synthesis.h"

#include <algorithm>
#include <cmath>
#include <set>

#include "ir/error.h"
#include "ir/gate_matrix.h"
#include "ir/statevector.h"

namespace whittle::lowering {
namespace {

using ir::Complex;
using ir::Mat2;
using ir::Mat4;
using ir::Op;
using MatN = Eigen::Matrix<Complex, Eigen::Dynamic, Eigen::Dynamic, 0, 8, 8>;
constexpr double kPi = 3.14159265358979323846;
const Complex kI(0, 1);
/// A run whose squared residual fell by less than 10% over 20 steps is at a local minimum.
constexpr int kStallWindow = 20;
constexpr double kStallRatio = 0.9;

/// A splitmix64 stream: the same numbers on every platform (std distributions are not specified).
struct Rng {
    uint64_t s;
    uint64_t next() {
        uint64_t z = (s += 0x9E3779B97F4A7C15ull);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
        return z ^ (z >> 31);
    }
    double uniform() { return double(next() >> 11) * 0x1.0p-53; }
};

Mat2 rz(double t) {
    Mat2 m;
    m << std::exp(-kI * (t / 2)), 0, 0, std::exp(kI * (t / 2));
    return m;
}
Mat2 ry(double t) {
    Mat2 m;
    m << std::cos(t / 2), -std::sin(t / 2), std::sin(t / 2), std::cos(t / 2);
    return m;
}
Mat2 pauli_z() {
    Mat2 m;
    m << 1, 0, 0, -1;
    return m;
}
Mat2 pauli_y() {
    Mat2 m;
    m << 0, -kI, kI, 0;
    return m;
}

/// The entangler's 4x4 matrix on (q0, q1), sub-index 2*bit(q0) + bit(q1); CX has q0 as control.
Mat4 entangler_matrix(ir::Entangler e, double angle) {
    Mat4 m = Mat4::Zero();
    switch (e) {
    case ir::Entangler::CX: m(0, 0) = m(1, 1) = m(2, 3) = m(3, 2) = 1; break;
    case ir::Entangler::CZ: m(0, 0) = m(1, 1) = m(2, 2) = 1, m(3, 3) = -1; break;
    case ir::Entangler::ISwap: m(0, 0) = m(3, 3) = 1, m(1, 2) = m(2, 1) = kI; break;
    case ir::Entangler::XX: {
        const Complex c = std::cos(angle / 2), s = -kI * std::sin(angle / 2);
        m(0, 0) = m(1, 1) = m(2, 2) = m(3, 3) = c;
        m(0, 3) = m(3, 0) = m(1, 2) = m(2, 1) = s;
        break;
    }
    }
    return m;
}

/// X tensor X, the generator of XX(t) = exp(-i t/2 XX).
Mat4 xx_generator() {
    Mat4 m = Mat4::Zero();
    m(0, 3) = m(3, 0) = m(1, 2) = m(2, 1) = 1;
    return m;
}

/// A = (m on the qubit with bit mask b) * A.
void left1(MatN& a, int b, const Mat2& m) {
    const int n = int(a.rows());
    for (int r0 = 0; r0 < n; ++r0) {
        if (r0 & b) continue;
        const int r1 = r0 | b;
        for (int c = 0; c < n; ++c) {
            const Complex x0 = a(r0, c), x1 = a(r1, c);
            a(r0, c) = m(0, 0) * x0 + m(0, 1) * x1;
            a(r1, c) = m(1, 0) * x0 + m(1, 1) * x1;
        }
    }
}
/// A = A * (m on the qubit with bit mask b).
void right1(MatN& a, int b, const Mat2& m) {
    const int n = int(a.rows());
    for (int c0 = 0; c0 < n; ++c0) {
        if (c0 & b) continue;
        const int c1 = c0 | b;
        for (int r = 0; r < n; ++r) {
            const Complex x0 = a(r, c0), x1 = a(r, c1);
            a(r, c0) = x0 * m(0, 0) + x1 * m(1, 0);
            a(r, c1) = x0 * m(0, 1) + x1 * m(1, 1);
        }
    }
}
/// A = (m on qubits with masks b0 (high) and b1) * A.
void left2(MatN& a, int b0, int b1, const Mat4& m) {
    const int n = int(a.rows());
    for (int r = 0; r < n; ++r) {
        if (r & (b0 | b1)) continue;
        const int idx[4] = {r, r | b1, r | b0, r | b0 | b1};
        for (int c = 0; c < n; ++c) {
            Complex x[4];
            for (int i = 0; i < 4; ++i) x[i] = a(idx[i], c);
            for (int i = 0; i < 4; ++i) a(idx[i], c) = m(i, 0) * x[0] + m(i, 1) * x[1] + m(i, 2) * x[2] + m(i, 3) * x[3];
        }
    }
}
/// A = A * (m on qubits with masks b0 (high) and b1).
void right2(MatN& a, int b0, int b1, const Mat4& m) {
    const int n = int(a.rows());
    for (int c = 0; c < n; ++c) {
        if (c & (b0 | b1)) continue;
        const int idx[4] = {c, c | b1, c | b0, c | b0 | b1};
        for (int r = 0; r < n; ++r) {
            Complex x[4];
            for (int i = 0; i < 4; ++i) x[i] = a(r, idx[i]);
            for (int j = 0; j < 4; ++j) a(r, idx[j]) = x[0] * m(0, j) + x[1] * m(1, j) + x[2] * m(2, j) + x[3] * m(3, j);
        }
    }
}

/// A placement list as a parametrized circuit: a one-qubit slot Rz(a) Ry(b) Rz(c) on every wire,
/// then per placement (p, q) the entangler and a slot on p and on q. Parameter 0 is the global
/// phase; each slot holds 3 and an XX entangler 1, in gate order (a child's parameters extend its
/// parent's).
struct Model {
    struct Gate {
        bool slot;
        int q0, q1;  // slot: q0; entangler: (q0, q1)
        int p;       // first parameter (-1: a fixed entangler)
    };
    int k = 0, n = 0;
    ir::Entangler e{};
    std::vector<Gate> gates;
    int params = 1;

    Model(int k_, ir::Entangler e_, const std::vector<std::pair<int, int>>& places) : k(k_), n(1 << k_), e(e_) {
        for (int q = 0; q < k; ++q) add_slot(q);
        for (auto [a, b] : places) {
            gates.push_back({false, a, b, e == ir::Entangler::XX ? params : -1});
            if (e == ir::Entangler::XX) ++params;
            add_slot(a);
            add_slot(b);
        }
    }
    void add_slot(int q) {
        gates.push_back({true, q, -1, params});
        params += 3;
    }
    int mask(int q) const { return 1 << (k - 1 - q); }

    Mat2 slot_matrix(const Eigen::VectorXd& x, int p) const { return rz(x[p]) * ry(x[p + 1]) * rz(x[p + 2]); }

    void apply_left(MatN& a, const Gate& g, const Eigen::VectorXd& x) const {
        if (g.slot) left1(a, mask(g.q0), slot_matrix(x, g.p));
        else left2(a, mask(g.q0), mask(g.q1), entangler_matrix(e, g.p >= 0 ? x[g.p] : 0));
    }
    void apply_right(MatN& a, const Gate& g, const Eigen::VectorXd& x) const {
        if (g.slot) right1(a, mask(g.q0), slot_matrix(x, g.p));
        else right2(a, mask(g.q0), mask(g.q1), entangler_matrix(e, g.p >= 0 ? x[g.p] : 0));
    }

    MatN unitary(const Eigen::VectorXd& x) const {
        MatN v = MatN::Identity(n, n);
        for (const Gate& g : gates) apply_left(v, g, x);
        return v;
    }
};

double frob_distance(const MatN& v, const MatN& u) {
    const Complex t = (u.adjoint() * v).trace();
    const Complex ph = std::abs(t) > 0 ? t / std::abs(t) : Complex(1);
    return (v - ph * u).norm();
}

/// Residual vector of V - e^{i phi} U (real parts, then imaginary parts, column-major).
void residual(const MatN& v, const MatN& u, double phi, Eigen::VectorXd& r) {
    const int n = int(v.rows()), nn = n * n;
    const Complex ph = std::polar(1.0, phi);
    r.resize(2 * nn);
    for (int c = 0; c < n; ++c)
        for (int i = 0; i < n; ++i) {
            const Complex d = v(i, c) - ph * u(i, c);
            r[c * n + i] = d.real();
            r[nn + c * n + i] = d.imag();
        }
}

void put_column(Eigen::MatrixXd& j, int col, const MatN& d) {
    const int n = int(d.rows()), nn = n * n;
    for (int c = 0; c < n; ++c)
        for (int i = 0; i < n; ++i) {
            j(c * n + i, col) = d(i, c).real();
            j(nn + c * n + i, col) = d(i, c).imag();
        }
}

/// The Jacobian of the residual in the free parameters (columns in the order of `free_index`).
void jacobian(const Model& m, const Eigen::VectorXd& x, const MatN& u, const std::vector<int>& column_of,
              int free_count, Eigen::MatrixXd& jac) {
    const int n = m.n;
    jac.setZero(2 * n * n, free_count);
    if (column_of[0] >= 0) put_column(jac, column_of[0], MatN(-kI * std::polar(1.0, x[0]) * u));
    // prefix[i] = product of gates before gate i.
    std::vector<MatN> prefix(m.gates.size() + 1);
    prefix[0] = MatN::Identity(n, n);
    for (size_t i = 0; i < m.gates.size(); ++i) {
        prefix[i + 1] = prefix[i];
        m.apply_left(prefix[i + 1], m.gates[i], x);
    }
    MatN suffix = MatN::Identity(n, n);  // product of gates after gate i
    const Mat2 hz = -0.5 * kI * pauli_z(), hy = -0.5 * kI * pauli_y();
    for (size_t gi = m.gates.size(); gi-- > 0;) {
        const Model::Gate& g = m.gates[gi];
        if (g.slot) {
            const int p = g.p;
            const Mat2 a = rz(x[p]), b = ry(x[p + 1]), c = rz(x[p + 2]);
            const Mat2 d[3] = {hz * a * b * c, a * hy * b * c, a * b * c * hz};
            for (int t = 0; t < 3; ++t) {
                if (column_of[p + t] < 0) continue;
                MatN y = prefix[gi];
                left1(y, m.mask(g.q0), d[t]);
                put_column(jac, column_of[p + t], MatN(suffix * y));
            }
        } else if (g.p >= 0 && column_of[g.p] >= 0) {
            MatN y = prefix[gi];
            const Mat4 dg = -0.5 * kI * xx_generator() * entangler_matrix(m.e, x[g.p]);
            left2(y, m.mask(g.q0), m.mask(g.q1), dg);
            put_column(jac, column_of[g.p], MatN(suffix * y));
        }
        m.apply_right(suffix, g, x);
    }
}

struct Fit {
    Eigen::VectorXd x;
    double distance = 1e300;
};

/// Levenberg–Marquardt from x on the free parameters (fixed[i] true keeps x[i]); stops at
/// `target`, at a stall, after max_iter steps or when the budget runs out. Each step (one
/// circuit evaluation) is counted in `steps`.
Fit instantiate(const Model& m, const MatN& u, Eigen::VectorXd x, const std::vector<char>& fixed, int max_iter,
                double target, uint64_t& steps, uint64_t budget) {
    std::vector<int> column_of(size_t(m.params), -1);
    int free_count = 0;
    for (int i = 0; i < m.params; ++i)
        if (!fixed[size_t(i)]) column_of[size_t(i)] = free_count++;
    MatN v = m.unitary(x);
    if (!fixed[0]) {
        const Complex t = (u.adjoint() * v).trace();
        x[0] = std::arg(t);
    }
    Eigen::VectorXd r, rn;
    residual(v, u, x[0], r);
    double cost = r.squaredNorm();
    Fit best{x, frob_distance(v, u)};
    Eigen::MatrixXd jac;
    double lambda = 1e-3;
    double checkpoint = cost;
    for (int it = 0; it < max_iter && steps < budget; ++it) {
        if (best.distance <= target) break;
        jacobian(m, x, u, column_of, free_count, jac);
        const Eigen::MatrixXd a = jac.transpose() * jac;
        const Eigen::VectorXd g = jac.transpose() * r;
        bool improved = false;
        while (steps < budget) {
            ++steps;
            Eigen::MatrixXd sys = a;
            sys.diagonal().array() += lambda * (a.diagonal().array() + 1e-12);
            const Eigen::VectorXd delta = sys.ldlt().solve(g);
            Eigen::VectorXd xn = x;
            for (int i = 0; i < m.params; ++i)
                if (column_of[size_t(i)] >= 0) xn[i] -= delta[column_of[size_t(i)]];
            const MatN vn = m.unitary(xn);
            residual(vn, u, xn[0], rn);
            const double cn = rn.squaredNorm();
            if (cn < cost) {
                x = xn;
                r = rn;
                cost = cn;
                lambda = std::max(lambda / 3, 1e-15);
                improved = true;
                const double d = frob_distance(vn, u);
                if (d < best.distance) best = {x, d};
                break;
            }
            lambda *= 4;
            if (lambda > 1e10) break;
        }
        if (!improved) break;
        // A stall far from a solution: a local minimum (or a placement list that cannot reach u).
        if (it % kStallWindow == kStallWindow - 1) {
            if (cost > 1e-8 && cost > kStallRatio * checkpoint) break;
            checkpoint = cost;
        }
    }
    return best;
}

/// The nearest multiple of pi/4 to t, and how far it is.
double nearest_quarter(double t) { return std::round(t / (kPi / 4)) * (kPi / 4); }

struct Candidate {
    std::vector<std::pair<int, int>> places;
    Fit fit;
};

}  // namespace

double frobenius_distance_up_to_phase(const Eigen::MatrixXcd& v, const Eigen::MatrixXcd& u) {
    const Complex t = (u.adjoint() * v).trace();
    const Complex ph = std::abs(t) > 0 ? t / std::abs(t) : Complex(1);
    return (v - ph * u).norm();
}

Eigen::MatrixXcd block_product(const std::vector<Op>& ops, const std::vector<uint32_t>& wires) {
    const uint32_t k = uint32_t(wires.size());
    ir::Circuit c;
    c.add_register("q", k, ir::Role::Data);
    // wires[i] carries bit k-1-i of the index; circuit_unitary's wire w carries bit w.
    auto map = [&](uint32_t w) {
        for (uint32_t i = 0; i < k; ++i)
            if (wires[i] == w) return k - 1 - i;
        throw InternalError("internal error: block_product: op off the block's wires");
    };
    for (Op op : ops) {
        if (op.target != ir::kNoWire) op.target = map(op.target);
        if (op.target2 != ir::kNoWire) op.target2 = map(op.target2);
        for (ir::Lit& l : op.controls) l = ir::Lit::make(map(l.wire()), l.positive());
        op.set_condition(-1, 0);
        c.ops.push_back(op);
    }
    return ir::circuit_unitary(c);
}

BlockSynthesis synthesize_block(const Eigen::MatrixXcd& u_in, const std::vector<uint32_t>& wires, ir::Entangler e,
                                OneQubitBasis basis, const BlockSynthesisOptions& opts) {
    const int k = int(wires.size());
    WHITTLE_ASSERT((k == 2 || k == 3) && u_in.rows() == (1 << k) && u_in.cols() == (1 << k) &&
                   basis != OneQubitBasis::CliffordT && "synthesize_block: 2 or 3 wires, a rotation basis");
    const MatN u = u_in;
    BlockSynthesis out;
    std::vector<std::pair<int, int>> pairs = {{0, 1}};
    if (k == 3) pairs = {{0, 1}, {1, 2}, {0, 2}};
    // Instantiations stop well inside the bound so that snapping has room.
    const double target = opts.max_distance * 1e-3;
    Rng rng{opts.seed};
    auto random_angles = [&](Eigen::VectorXd& x, int from) {
        for (int i = from; i < int(x.size()); ++i) x[i] = 2 * kPi * rng.uniform();
    };
    auto fit_list = [&](const std::vector<std::pair<int, int>>& places, const Eigen::VectorXd* warm) {
        const Model m(k, e, places);
        const std::vector<char> fixed(size_t(m.params), 0);
        Fit best;
        for (int s = 0; s < std::max(1, opts.restarts) && out.iterations < opts.budget; ++s) {
            Eigen::VectorXd x(m.params);
            x.setZero();
            if (s == 0 && warm) {
                x.head(warm->size()) = *warm;
                for (int i = int(warm->size()); i < m.params; ++i) x[i] = 0.2 * (rng.uniform() - 0.5);
                // A new XX entangler starts at a quarter turn (an entangling angle), not near 0.
                if (e == ir::Entangler::XX) x[warm->size()] = kPi / 2;
            } else {
                random_angles(x, 1);
            }
            ++out.instantiations;
            Fit f = instantiate(m, u, x, fixed, opts.max_iterations, target, out.iterations, opts.budget);
            if (f.distance < best.distance) best = std::move(f);
            if (best.distance <= target) break;
        }
        return best;
    };

    std::vector<Candidate> beam;
    Candidate found;
    bool ok = false;
    if (!opts.from_places.empty()) {
        std::vector<std::pair<int, int>> cur = opts.from_places;
        std::set<std::vector<std::pair<int, int>>> seen;
        bool shorter = true;
        while (shorter && !cur.empty() && out.iterations < opts.budget) {
            shorter = false;
            for (size_t d = 0; d < cur.size() && out.iterations < opts.budget; ++d) {
                std::vector<std::pair<int, int>> ch = cur;
                ch.erase(ch.begin() + std::ptrdiff_t(d));
                if (!seen.insert(ch).second) continue;
                Fit f = fit_list(ch, nullptr);
                if (f.distance <= target) {
                    found = {ch, std::move(f)};
                    ok = shorter = true;
                    cur = std::move(ch);
                    break;
                }
            }
        }
    }
    for (int depth = 0; !opts.from_places.empty() ? false : depth <= opts.max_entanglers && out.iterations < opts.budget && !ok; ++depth) {
        std::vector<Candidate> level;
        std::set<std::vector<std::pair<int, int>>> seen;
        if (depth == 0) {
            level.push_back({{}, fit_list({}, nullptr)});
        } else {
            for (const Candidate& parent : beam) {
                for (auto pr : pairs) {
                    // Four entanglers in a row on one pair are never needed (three realize any
                    // two-qubit unitary).
                    const size_t d = parent.places.size();
                    if (d >= 3 && parent.places[d - 1] == pr && parent.places[d - 2] == pr && parent.places[d - 3] == pr)
                        continue;
                    Candidate ch{parent.places, {}};
                    ch.places.push_back(pr);
                    if (!seen.insert(ch.places).second) continue;
                    ch.fit = fit_list(ch.places, &parent.fit.x);
                    level.push_back(std::move(ch));
                    if (level.back().fit.distance <= target) break;
                }
                if (!level.empty() && level.back().fit.distance <= target) break;
            }
        }
        std::stable_sort(level.begin(), level.end(),
                         [](const Candidate& a, const Candidate& b) { return a.fit.distance < b.fit.distance; });
        if (!level.empty() && level.front().fit.distance <= opts.max_distance) {
            found = level.front();
            ok = true;
            break;
        }
        if (int(level.size()) > opts.beam) level.resize(size_t(std::max(1, opts.beam)));
        beam = std::move(level);
    }
    if (!ok) return out;

    const Model m(k, e, found.places);
    Eigen::VectorXd x = found.fit.x;
    std::vector<char> fixed(size_t(m.params), 0);
    out.angles = m.params - 1;
    if (opts.snap) {
        // Angles already within 1e-9 of a multiple of pi/4 are set to it first (one check for all),
        // then the others one at a time, nearest first, each with a refit of the free ones.
        auto dist_of = [&](const Eigen::VectorXd& y) { return frob_distance(m.unitary(y), u); };
        Eigen::VectorXd y = x;
        for (int i = 1; i < m.params; ++i)
            if (std::fabs(y[i] - nearest_quarter(y[i])) < 1e-9) y[i] = nearest_quarter(y[i]), fixed[size_t(i)] = 1;
        if (dist_of(y) <= target) x = y;
        else std::fill(fixed.begin(), fixed.end(), 0);
        std::vector<int> order;
        for (int i = 1; i < m.params; ++i)
            if (!fixed[size_t(i)]) order.push_back(i);
        std::stable_sort(order.begin(), order.end(), [&](int a, int b) {
            return std::fabs(x[a] - nearest_quarter(x[a])) < std::fabs(x[b] - nearest_quarter(x[b]));
        });
        for (int i : order) {
            if (out.iterations >= opts.budget) break;
            Eigen::VectorXd z = x;
            z[i] = nearest_quarter(z[i]);
            fixed[size_t(i)] = 1;
            Fit f = instantiate(m, u, z, fixed, 30, target, out.iterations, opts.budget);
            if (f.distance <= target) x = f.x;
            else fixed[size_t(i)] = 0;
        }
        for (int i = 1; i < m.params; ++i) out.snapped += fixed[size_t(i)];
    }

    // Emit: slots as `basis` gates (Euler angles come back exact within 1e-12 of k*pi/d), entanglers
    // as the IR's gates; the global phase is read off the emitted circuit's own product.
    std::vector<Op> ops;
    ir::Angle unused;
    for (const Model::Gate& g : m.gates) {
        const uint32_t a = wires[size_t(g.q0)];
        if (g.slot) {
            const bool ok1 = synthesize_1q(m.slot_matrix(x, g.p), a, basis, ops, unused);
            WHITTLE_ASSERT(ok1 && "a rotation basis writes every one-qubit unitary");
            continue;
        }
        const uint32_t b = wires[size_t(g.q1)];
        switch (e) {
        case ir::Entangler::CX: ops.push_back(Op::x(b, {ir::Lit::pos(a)})); break;
        case ir::Entangler::CZ: ops.push_back(Op::phase(ir::Angle::pi_times(1), {ir::Lit::pos(a), ir::Lit::pos(b)})); break;
        case ir::Entangler::ISwap: ops.push_back(Op::two(ir::OpKind::ISwap, a, b)); break;
        case ir::Entangler::XX: {
            const double t = x[g.p];
            ops.push_back(Op::two(ir::OpKind::XX, a, b, std::fabs(t - nearest_quarter(t)) < 1e-12
                                                           ? snap_angle(nearest_quarter(t))
                                                           : snap_angle(t)));
            break;
        }
        }
    }
    const Eigen::MatrixXcd v = block_product(ops, wires);
    const Complex t = (v.adjoint() * u_in).trace();
    out.phase = snap_angle(std::arg(t));
    out.distance = (std::polar(1.0, out.phase.to_radians()) * v - u_in).norm();
    out.entanglers = int(found.places.size());
    out.ops = std::move(ops);
    out.found = out.distance <= opts.max_distance;
    return out;
}

}  // namespace whittle::lowering
