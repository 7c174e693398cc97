// TODD, third-order duplicate-then-destroy: Heyfron, Campbell 2018, arXiv:1712.01557. Implemented
// from memory of the method (the paper was not at hand): the null-space condition below is derived
// here from the signature tensor, and the candidate order and scoring by created duplicates follow
// the idea of the fast variant of Vandaele, Martiel, Perdrix, Vuillot 2024, arXiv:2407.08695, also
// from memory.
//
// The method. A (n x m over GF(2)) holds one column a_j per T gate; its signature tensor is
// S = sum_j a_j (x) a_j (x) a_j. For z in F_2^n and y in F_2^m, A' = A + z y^T has
//   S' - S = sum_j y_j [sym(z, a_j, a_j) + sym(z, z, a_j)] + |y| z(x)z(x)z      (mod 2),
// and appending the column z when |y| is odd cancels the last term. Write M(y) = sum_j y_j a_j a_j^T
// (symmetric; its diagonal is A y, since a_aj^2 = a_aj). In a basis where z = e_1, the entries of
// S' - S read: (1,1,c), c != 1: (A y)_c; (1,b,c), b, c != 1: M_bc; the others vanish. So S' = S
// exactly when the symmetric form M(y) vanishes on the hyperplane z-perp = {u : u.z = 0} (its
// diagonal u^T M u = u.(A y) included), i.e. when M(y) lies in
//   V_z = { z w^T + w z^T : w in F_2^n } + span(z z^T)          (dimension n),
// the symmetric matrices that are zero on z-perp x z-perp. The admissible y form N_z = M^{-1}(V_z).
// If a_k + a_l = z and y_k != y_l, columns k and l become equal and both go (two T gates become one
// Clifford S-class term); if a_k = z and y_k = 1, column k becomes zero. Each step picks the z
// (a sum of two columns) and the y in N_z that remove the most columns, until none removes any.
//
// Per step, the images M(e_j) = a_j a_j^T (packed upper triangles), an echelon basis of their span
// with each row tagged by the columns it combines, and the kernel K0 of M are computed once. For a
// candidate z, each basis vector of V_z is reduced by that echelon basis; the dependencies among
// the residues give elements of V_z inside the image and, through the tags, their preimages; N_z
// is K0 plus those preimages. Candidates are tried in order of the most columns they could remove
// (two per pair of columns summing to z, one for a column equal to z), so the search stops as soon
// as no untried candidate can beat the best found.
#include "tcount/todd.h"

#include <algorithm>
#include <bit>

#include "tcount/gf2.h"

namespace whittle::tcount {
namespace {

/// Position of entry (a, b), a <= b, in the packed upper triangle (diagonal included) of an n x n matrix.
size_t sym_index(uint32_t a, uint32_t b, uint32_t n) { return size_t(a) * (2 * size_t(n) - a + 1) / 2 + (b - a); }

struct Candidate {
    uint64_t z = 0;
    uint32_t lo = 0, hi = 0;  ///< its pairs of columns k < l with a_k ^ a_l = z: sums[lo, hi)
    int column = -1;          ///< a column equal to z, if any
    int bound = 0;            ///< most columns a y could remove
};

struct PairSum {
    uint64_t z;
    uint32_t k, l;
};

/// Scratch space of the candidate search, kept between candidates (no allocation per candidate).
struct Scratch {
    TaggedEchelon residues;
    BitVec v, tag;
};

/// N_z = M^{-1}(V_z): K0 plus the preimages of the part of V_z inside the image of M (see the top).
std::vector<BitVec> admissible(const TaggedEchelon& image, const std::vector<BitVec>& k0, uint64_t z, uint32_t n, size_t m,
                               Scratch& s, uint64_t& work) {
    const size_t tri = size_t(n) * (n + 1) / 2;
    const uint32_t p = uint32_t(std::countr_zero(z));
    std::vector<BitVec> ys = k0;
    s.residues.clear();
    if (s.v.size() != tri) s.v = BitVec(tri);
    if (s.tag.size() != m) s.tag = BitVec(m);
    work += (n + 1) * ((tri + m) / 64 + 1);
    for (uint32_t c = 0; c <= n; ++c) {
        if (c == p) continue;
        BitVec& v = s.v;
        BitVec& tag = s.tag;
        v.reset();
        tag.reset();
        if (c == n) {  // z z^T
            for (uint64_t r = z; r; r &= r - 1) {
                const uint32_t a = uint32_t(std::countr_zero(r));
                for (uint64_t q = z >> a; q; q &= q - 1) v.set(sym_index(a, a + uint32_t(std::countr_zero(q)), n));
            }
        } else {  // z e_c^T + e_c z^T
            for (uint64_t r = z; r; r &= r - 1) {
                const uint32_t a = uint32_t(std::countr_zero(r));
                if (a < c) v.set(sym_index(a, c, n));
                else if (a > c) v.set(sym_index(c, a, n));
            }
        }
        image.reduce(v, tag, work);
        if (!s.residues.insert(v, tag, work) && tag.any()) ys.push_back(tag);
    }
    return ys;
}


/// Columns after A + z y^T (and z when |y| is odd), made proper.
std::vector<uint64_t> apply_step(const std::vector<uint64_t>& cols, uint64_t z, const BitVec& y) {
    std::vector<uint64_t> out = cols;
    for (size_t j = 0; j < out.size(); ++j)
        if (y.get(j)) out[j] ^= z;
    if (y.popcount() & 1) out.push_back(z);
    make_proper(out);
    return out;
}

/// Solves the constraints greedily: each (g, rhs) says sum_i g_i c_i = rhs over the coefficient
/// space of the basis `ys`; a constraint inconsistent with the ones kept is skipped. Returns
/// y = sum c_i ys_i.
BitVec greedy_solution(const std::vector<BitVec>& ys, const std::vector<std::pair<BitVec, bool>>& constraints, size_t m,
                       uint64_t& work) {
    const size_t e = ys.size();
    TaggedEchelon sys;
    for (const auto& [g, rhs] : constraints) {
        BitVec v = g;
        BitVec t(1);
        if (rhs) t.set(0);
        sys.insert(v, t, work);  // a dependent constraint is either implied or inconsistent: skipped either way
    }
    // Back substitution, highest pivot first; free coefficients are 0.
    BitVec c(e);
    std::vector<const TaggedEchelon::Row*> rows;
    for (size_t r = 0; r < sys.size(); ++r) rows.push_back(&sys.row(r));
    std::sort(rows.begin(), rows.end(), [](const auto* a, const auto* b) { return a->pivot > b->pivot; });
    for (const auto* r : rows) {
        bool v = r->tag.get(0);
        for (size_t i = r->pivot + 1; i < e; ++i)
            if (r->v.get(i) && c.get(i)) v = !v;
        c.assign(r->pivot, v);
    }
    BitVec y(m);
    for (size_t i = 0; i < e; ++i)
        if (c.get(i)) y ^= ys[i];
    return y;
}

}  // namespace

void image_of_columns(const std::vector<uint64_t>& cols, uint32_t n, TaggedEchelon& image, std::vector<BitVec>& k0,
                      uint64_t& work) {
    const size_t m = cols.size(), tri = size_t(n) * (n + 1) / 2;
    for (size_t j = 0; j < m; ++j) {
        BitVec v(tri);
        for (uint64_t r = cols[j]; r; r &= r - 1) {
            const uint32_t a = uint32_t(std::countr_zero(r));
            for (uint64_t q = cols[j] >> a; q; q &= q - 1) v.set(sym_index(a, a + uint32_t(std::countr_zero(q)), n));
        }
        BitVec tag(m);
        tag.set(j);
        if (!image.insert(v, tag, work)) k0.push_back(tag);
    }
}

void make_proper(std::vector<uint64_t>& columns) {
    std::sort(columns.begin(), columns.end());
    std::vector<uint64_t> out;
    for (size_t i = 0; i < columns.size();) {
        size_t j = i;
        while (j < columns.size() && columns[j] == columns[i]) ++j;
        if (columns[i] != 0 && (j - i) % 2 == 1) out.push_back(columns[i]);
        i = j;
    }
    columns = std::move(out);
}

bool same_signature(const std::vector<uint64_t>& a, const std::vector<uint64_t>& b, uint32_t n) {
    // S_abc for a <= b <= c; with repeated indices it is the count of columns holding the distinct ones.
    for (uint32_t i = 0; i < n; ++i)
        for (uint32_t j = i; j < n; ++j)
            for (uint32_t k = j; k < n; ++k) {
                const uint64_t mask = (uint64_t(1) << i) | (uint64_t(1) << j) | (uint64_t(1) << k);
                int pa = 0, pb = 0;
                for (uint64_t c : a) pa ^= (c & mask) == mask;
                for (uint64_t c : b) pb ^= (c & mask) == mask;
                if (pa != pb) return false;
            }
    return true;
}

namespace {

ToddResult descend(std::vector<uint64_t> cols, uint32_t n, const ToddSettings& settings) {
    ToddResult res;
    make_proper(cols);
    while (cols.size() >= 2 && n >= 1) {
        if (res.work > settings.work_budget) {
            res.budget_exhausted = true;
            break;
        }
        const size_t m = cols.size();
        TaggedEchelon image;
        std::vector<BitVec> k0;
        image_of_columns(cols, n, image, k0, res.work);
        // Candidates z = a_k ^ a_l (and each column alone, which y may clear), sorted by z.
        std::vector<PairSum> sums;
        sums.reserve(m * (m - 1) / 2 + m);
        for (uint32_t k = 0; k < m; ++k)
            for (uint32_t l = k + 1; l < m; ++l) sums.push_back({cols[k] ^ cols[l], k, l});
        for (uint32_t k = 0; k < m; ++k) sums.push_back({cols[k], k, k});  // k == l: the column itself
        res.work += sums.size();
        std::sort(sums.begin(), sums.end(), [](const PairSum& a, const PairSum& b) {
            return a.z != b.z ? a.z < b.z : (a.k != b.k ? a.k < b.k : a.l < b.l);
        });
        std::vector<Candidate> cands;
        for (uint32_t lo = 0; lo < sums.size();) {
            uint32_t hi = lo;
            Candidate c;
            c.z = sums[lo].z;
            while (hi < sums.size() && sums[hi].z == c.z) {
                if (sums[hi].k == sums[hi].l) c.column = int(sums[hi].k);
                ++hi;
            }
            // The column entry (k == l) sorts after the pairs with the same z only by k; keep it
            // out of the pair range by moving pairs first.
            std::stable_partition(sums.begin() + lo, sums.begin() + hi, [](const PairSum& p) { return p.k != p.l; });
            c.lo = lo;
            c.hi = hi - (c.column >= 0 ? 1 : 0);
            c.bound = 2 * int(c.hi - c.lo) + (c.column >= 0 ? 1 : 0);
            cands.push_back(c);
            lo = hi;
        }
        std::stable_sort(cands.begin(), cands.end(), [](const Candidate& a, const Candidate& b) { return a.bound > b.bound; });
        Scratch scratch;
        int best_gain = 0;
        std::vector<uint64_t> best_cols;
        for (const Candidate& cand : cands) {
            if (cand.bound <= best_gain || res.work > settings.work_budget) break;
            const uint64_t z = cand.z;
            std::vector<BitVec> ys = admissible(image, k0, z, n, m, scratch, res.work);
            if (ys.empty()) continue;
            const size_t e = ys.size();
            std::vector<std::pair<BitVec, bool>> wanted;
            for (uint32_t q = cand.lo; q < cand.hi; ++q) {
                const uint32_t k = sums[q].k, l = sums[q].l;
                BitVec g(e);
                for (size_t i = 0; i < e; ++i)
                    if (ys[i].get(k) != ys[i].get(l)) g.set(i);
                wanted.emplace_back(std::move(g), true);
            }
            if (cand.column >= 0) {
                BitVec g(e);
                for (size_t i = 0; i < e; ++i)
                    if (ys[i].get(size_t(cand.column))) g.set(i);
                wanted.emplace_back(std::move(g), true);
            }
            BitVec even(e);
            for (size_t i = 0; i < e; ++i)
                if (ys[i].popcount() & 1) even.set(i);
            // Two tries: the wanted duplicates first, and the same with |y| even asked before them.
            for (int attempt = 0; attempt < 2; ++attempt) {
                std::vector<std::pair<BitVec, bool>> cons;
                if (attempt == 1) cons.emplace_back(even, false);
                cons.insert(cons.end(), wanted.begin(), wanted.end());
                const BitVec y = greedy_solution(ys, cons, m, res.work);
                if (!y.any()) continue;
                std::vector<uint64_t> next = apply_step(cols, z, y);
                const int gain = int(m) - int(next.size());
                if (gain > best_gain) {
                    best_gain = gain;
                    best_cols = std::move(next);
                }
            }
        }
        if (best_gain <= 0) break;
        cols = std::move(best_cols);
        ++res.steps;
    }
    res.columns = std::move(cols);
    return res;
}

}  // namespace

ToddResult todd_reduce(std::vector<uint64_t> cols, uint32_t n, const ToddSettings& settings) {
    return descend(std::move(cols), n, settings);
}

}  // namespace whittle::tcount

namespace whittle::tcount {

std::vector<BitVec> admissible_basis(const std::vector<uint64_t>& cols, uint32_t n, uint64_t z, uint64_t& work) {
    TaggedEchelon image;
    std::vector<BitVec> k0;
    image_of_columns(cols, n, image, k0, work);
    Scratch scratch;
    return admissible(image, k0, z, n, cols.size(), scratch, work);
}

std::vector<std::vector<uint8_t>> admissible_updates(const std::vector<uint64_t>& cols, uint32_t n, uint64_t z) {
    uint64_t work = 0;
    std::vector<std::vector<uint8_t>> out;
    for (const BitVec& y : admissible_basis(cols, n, z, work)) {
        std::vector<uint8_t> v(cols.size());
        for (size_t j = 0; j < cols.size(); ++j) v[j] = y.get(j);
        out.push_back(std::move(v));
    }
    return out;
}

}  // namespace whittle::tcount
