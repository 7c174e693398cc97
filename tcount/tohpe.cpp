// TOHPE, third-order homogeneous polynomial elimination, and the scoring of candidates by the
// duplicates they create: Vandaele, Martiel, Perdrix, Vuillot 2024, arXiv:2407.08695 (the paper was
// not at hand; implemented from memory of its method, so the details below are this file's own).
//
// Notation of todd.cpp: A holds one column a_j per T gate; for y in F_2^m and z in F_2^n the update
// A + z y^T (with z appended when |y| is odd) keeps the signature tensor when M(y) = sum_j y_j a_j
// a_j^T lies in V_z. For y in K0 = ker M (M(y) = 0: A y = 0 and every pairwise product of rows of A
// is orthogonal to y) that holds for every z, so z is free: TOHPE computes K0 once per step by
// elimination with a pivot map (TaggedEchelon: each packed a_j a_j^T is reduced by the rows kept so
// far, and one that vanishes gives a kernel vector through its tag), and for each kernel basis vector
// y scores every z by the columns the update removes: with J the support of y, a pair j in J, k not in
// J with a_j + z = a_k makes two equal columns (both go), a j in J with a_j = z makes a zero column,
// and when |y| is odd the appended z cancels an a_k = z outside J or adds one column. The best (y, z)
// is applied while it removes columns. TODD steps (z a sum of two columns, y in the larger N_z) are
// taken in turn. At a local minimum of both, a plateau move (z a sum of two columns, a pseudo-random
// even y in N_z, so no column is added) changes the list without changing its length, and the descent
// starts again; the best list seen is kept. The pseudo-random choices come from a fixed seed and the
// effort is counted in words of elimination, so the result is deterministic.
#include "tcount/tohpe.h"

#include <algorithm>
#include <bit>
#include <unordered_map>

#include "tcount/gf2.h"

namespace whittle::tcount {
namespace {

/// splitmix64: a fixed, portable sequence.
struct Rng {
    uint64_t s;
    uint64_t next() {
        uint64_t z = (s += 0x9e3779b97f4a7c15ull);
        z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
        z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
        return z ^ (z >> 31);
    }
};

/// A basis of K0 = ker M, by elimination of the packed a_j a_j^T with a pivot map.
std::vector<BitVec> kernel_basis(const std::vector<uint64_t>& cols, uint32_t n, uint64_t& work) {
    TaggedEchelon image;
    std::vector<BitVec> k0;
    image_of_columns(cols, n, image, k0, work);
    return k0;
}

/// Columns after A + z y^T (and z when |y| is odd), made proper.
std::vector<uint64_t> apply_update(const std::vector<uint64_t>& cols, uint64_t z, const BitVec& y) {
    std::vector<uint64_t> out = cols;
    for (size_t j = 0; j < out.size(); ++j)
        if (y.get(j)) out[j] ^= z;
    if (y.popcount() & 1) out.push_back(z);
    make_proper(out);
    return out;
}

/// The best z for one y: the most columns removed (ties: the smallest z). Returns the gain.
int best_z(const std::vector<uint64_t>& cols, const BitVec& y, uint64_t& z_out, uint64_t& work) {
    const size_t m = cols.size();
    const bool odd = y.popcount() & 1;
    std::vector<uint64_t> in, out;
    for (size_t j = 0; j < m; ++j) (y.get(j) ? in : out).push_back(cols[j]);
    // gain(z) = 2 pairs(z) + [z in J] + (|y| odd ? ([z outside J] ? 1 : -1) : 0), summed by sorting.
    std::vector<std::pair<uint64_t, int>> contrib;
    contrib.reserve(in.size() * out.size() + m);
    for (uint64_t a : in)
        for (uint64_t b : out) contrib.emplace_back(a ^ b, 2);
    for (uint64_t a : in) contrib.emplace_back(a, 1);
    if (odd)
        for (uint64_t b : out) contrib.emplace_back(b, 2);  // +1 instead of the -1 below
    work += contrib.size() / 8 + 1;
    std::sort(contrib.begin(), contrib.end());
    int best = odd ? -1 : 0;
    z_out = 0;
    for (size_t i = 0; i < contrib.size();) {
        size_t k = i;
        int g = odd ? -1 : 0;
        while (k < contrib.size() && contrib[k].first == contrib[i].first) g += contrib[k++].second;
        if (contrib[i].first != 0 && g > best) {
            best = g;
            z_out = contrib[i].first;
        }
        i = k;
    }
    return z_out ? best : 0;
}

/// One TOHPE step: the best (y, z) over a basis of K0; false when none removes a column.
bool tohpe_step(std::vector<uint64_t>& cols, uint32_t n, uint64_t& work) {
    if (cols.size() < 2) return false;
    const std::vector<BitVec> k0 = kernel_basis(cols, n, work);
    int best = 0;
    uint64_t best_zv = 0;
    const BitVec* best_y = nullptr;
    for (const BitVec& y : k0) {
        uint64_t z = 0;
        const int g = best_z(cols, y, z, work);
        if (g > best) {
            best = g;
            best_zv = z;
            best_y = &y;
        }
    }
    if (!best_y) return false;
    cols = apply_update(cols, best_zv, *best_y);
    return true;
}

/// TOHPE and TODD steps in turn until neither removes a column.
void descend(std::vector<uint64_t>& cols, uint32_t n, uint64_t budget, ToddResult& res) {
    while (res.work < budget) {
        bool moved = false;
        while (res.work < budget && tohpe_step(cols, n, res.work)) {
            ++res.steps;
            moved = true;
        }
        if (res.work >= budget) break;
        ToddSettings ts;
        ts.work_budget = budget - res.work;
        ToddResult tr = todd_reduce(cols, n, ts);
        res.work += tr.work;
        res.steps += tr.steps;
        if (tr.columns.size() < cols.size()) {
            cols = std::move(tr.columns);
            moved = true;
        }
        if (!moved || tr.steps == 0) break;
    }
}

}  // namespace

ToddResult tohpe_reduce(std::vector<uint64_t> cols, uint32_t n, const TohpeSettings& settings) {
    ToddResult res;
    make_proper(cols);
    descend(cols, n, settings.work_budget, res);
    std::vector<uint64_t> best = cols;
    Rng rng{settings.seed};
    for (uint32_t kick = 0; kick < settings.max_kicks && res.work < settings.work_budget && cols.size() >= 2; ++kick) {
        const size_t m = cols.size();
        const uint64_t z = cols[rng.next() % m] ^ cols[rng.next() % m];
        if (!z) continue;
        const std::vector<BitVec> basis = admissible_basis(cols, n, z, res.work);
        if (basis.empty()) continue;
        BitVec y(m);
        for (const BitVec& b : basis)
            if (rng.next() & 1) y ^= b;
        if (y.popcount() & 1)  // an even y adds no column: one odd basis vector flips the parity
            for (const BitVec& b : basis)
                if (b.popcount() & 1) {
                    y ^= b;
                    break;
                }
        if (!y.any()) continue;
        std::vector<uint64_t> next = apply_update(cols, z, y);
        descend(next, n, settings.work_budget, res);
        if (next.size() <= cols.size() + 1) cols = std::move(next);
        if (cols.size() < best.size()) best = cols;
    }
    res.budget_exhausted = res.work >= settings.work_budget;
    res.columns = std::move(best);
    return res;
}

}  // namespace whittle::tcount
