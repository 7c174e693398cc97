// Test support: the matrix of a small ZX diagram, summed from the textbook semantics of spiders and edges.
//
// Independent of the simplifier (shares no code with zx/simplify.cpp). Semantics (Coecke & Duncan
// 2011, arXiv:0906.4725; Duncan, Kissinger, Perdrix, van de Wetering 2020, arXiv:1902.03178,
// Section 2): a Z spider with phase a is |0..0><0..0| + e^{ia} |1..1><1..1|, so every leg of it
// carries one bit; a plain edge forces its two ends equal; a Hadamard edge is the matrix
// [[1,1],[1,-1]] between its ends (the 1/sqrt2 is a scalar and dropped). Entry (out, in) sums over
// one bit per spider; wire w is bit w of the row (outputs) and column (inputs) index.
#pragma once

#include <cmath>
#include <complex>
#include <stdexcept>

#include <Eigen/Dense>

#include "zx/graph.h"

namespace whittle::test {

inline Eigen::MatrixXcd zx_matrix(const zx::Graph& g) {
    std::vector<zx::Vertex> spiders;
    for (zx::Vertex v = 0; v < g.id_bound(); ++v)
        if (g.alive(v) && !g.is_boundary(v)) spiders.push_back(v);
    if (spiders.size() > 20) throw std::logic_error("zx_matrix: too many spiders");
    std::vector<std::pair<zx::Vertex, zx::Vertex>> edges;
    for (zx::Vertex v = 0; v < g.id_bound(); ++v)
        if (g.alive(v))
            for (zx::Vertex w : g.neighbors(v))
                if (v < w) edges.emplace_back(v, w);
    std::vector<int> slot(g.id_bound(), -1);  // bit position of each vertex in the joint assignment
    int next = 0;
    for (zx::Vertex v : g.inputs)
        if (v != zx::kNoVertex) slot[v] = next++;
    const int num_in = next;
    for (zx::Vertex v : g.outputs)
        if (v != zx::kNoVertex) slot[v] = next++;
    const int num_out = next - num_in;
    for (zx::Vertex v : spiders) slot[v] = next++;
    const std::complex<double> i(0, 1);
    Eigen::MatrixXcd m = Eigen::MatrixXcd::Zero(Eigen::Index(1) << num_out, Eigen::Index(1) << num_in);
    const uint64_t total = uint64_t(1) << next;
    for (uint64_t x = 0; x < total; ++x) {
        auto bit = [&](zx::Vertex v) { return (x >> slot[v]) & 1; };
        double sign = 1;
        bool zero = false;
        for (const auto& [u, w] : edges) {
            if (g.edge_kind(u, w) == zx::EdgeKind::Plain) {
                if (bit(u) != bit(w)) zero = true;
            } else if (bit(u) && bit(w)) {
                sign = -sign;
            }
        }
        if (zero) continue;
        std::complex<double> amp = sign;
        for (zx::Vertex v : spiders)
            if (bit(v)) amp *= std::exp(i * g.phase(v).to_radians());
        const uint64_t in = x & ((uint64_t(1) << num_in) - 1), out = (x >> num_in) & ((uint64_t(1) << num_out) - 1);
        m(Eigen::Index(out), Eigen::Index(in)) += amp;
    }
    return m;
}

/// True when a = c b for some c != 0 (relative tolerance 1e-9).
inline bool proportional(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b) {
    if (a.rows() != b.rows() || a.cols() != b.cols()) return false;
    Eigen::Index r = 0, c = 0;
    b.cwiseAbs().maxCoeff(&r, &c);
    if (std::abs(b(r, c)) < 1e-9 || std::abs(a(r, c)) < 1e-9) return false;
    const std::complex<double> k = a(r, c) / b(r, c);
    return (a - k * b).norm() <= 1e-9 * a.norm();
}

}  // namespace whittle::test
