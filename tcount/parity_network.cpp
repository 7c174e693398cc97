// Gray-code parity networks (Amy, Azimzadeh, Mosca 2018, arXiv:1712.01859; from memory) and CNOT synthesis.
#include "tcount/parity_network.h"

#include <algorithm>
#include <bit>

#include "ir/error.h"

namespace whittle::tcount {
namespace {

/// The network under construction: wire values, the terms still to place expressed in the
/// current wires (bit w = wire w takes part), and the gates so far.
struct Network {
    uint32_t n;
    std::vector<uint64_t> cur;        ///< wire w holds (cur[w] . x)
    std::vector<uint64_t> y;          ///< term t's parity in the current wires
    std::vector<uint8_t> placed;
    const std::vector<PhaseToPlace>* terms;
    std::vector<NetOp> ops;

    /// wire t ^= wire c. A parity sum_w y_w wire_w keeps its value when y_c ^= y_t.
    void cnot(uint32_t c, uint32_t t) {
        ops.push_back({NetOp::Kind::Cnot, c, t, {}});
        cur[t] ^= cur[c];
        for (size_t i = 0; i < y.size(); ++i)
            if (!placed[i] && (y[i] >> t & 1)) y[i] ^= uint64_t(1) << c;
        place_ready();
    }
    void place_ready() {
        for (size_t i = 0; i < y.size(); ++i)
            if (!placed[i] && std::popcount(y[i]) == 1) {
                ops.push_back({NetOp::Kind::Phase, uint32_t(std::countr_zero(y[i])), 0, (*terms)[i].angle, (*terms)[i].complement});
                placed[i] = 1;
            }
    }
};

struct Part {
    std::vector<uint32_t> terms;
    uint64_t rows;  ///< rows not split on yet
    int target;     ///< the wire every term of the part contains (-1: none chosen)
};

}  // namespace

namespace {

/// Row operations (row t ^= row c, recorded as {c, t}) making the matrix `a` (rows as bit masks)
/// upper triangular with the diagonal kept at one: the lower half of Patel, Markov, Hayes 2008
/// (arXiv:quant-ph/0302002, from memory of the method): per section of `m` columns, rows whose
/// part in the section repeats an earlier row's are cleared by that row first, then Gaussian
/// elimination finishes the section.
std::vector<std::pair<uint32_t, uint32_t>> lower_sweep(std::vector<uint64_t>& a, uint32_t n, uint32_t m) {
    std::vector<std::pair<uint32_t, uint32_t>> ops;
    auto add = [&](uint32_t c, uint32_t t) {
        a[t] ^= a[c];
        ops.emplace_back(c, t);
    };
    for (uint32_t lo = 0; lo < n; lo += m) {
        const uint32_t hi = std::min(n, lo + m);
        const uint64_t sec = (hi - lo == 64 ? ~uint64_t(0) : ((uint64_t(1) << (hi - lo)) - 1)) << lo;
        std::vector<int> first(size_t(1) << (hi - lo), -1);
        for (uint32_t r = lo; r < n; ++r) {
            const uint64_t pat = (a[r] & sec) >> lo;
            if (!pat) continue;
            if (first[pat] < 0) first[pat] = int(r);
            else add(uint32_t(first[pat]), r);
        }
        for (uint32_t col = lo; col < hi; ++col) {
            bool diag = a[col] >> col & 1;
            for (uint32_t r = col + 1; r < n; ++r) {
                if (!(a[r] >> col & 1)) continue;
                if (!diag) {
                    add(r, col);
                    diag = true;
                }
                add(col, r);
            }
        }
    }
    return ops;
}

/// Row operations reducing the invertible `t` to the identity (Gauss-Jordan).
std::vector<std::pair<uint32_t, uint32_t>> gauss_jordan(std::vector<uint64_t> t, uint32_t n) {
    std::vector<std::pair<uint32_t, uint32_t>> red;
    for (uint32_t c = 0; c < n; ++c) {
        if (!(t[c] >> c & 1)) {
            uint32_t r = c + 1;
            while (r < n && !(t[r] >> c & 1)) ++r;
            WHITTLE_ASSERT(r < n && "synthesize_linear: the target map is not invertible");
            t[c] ^= t[r];
            red.emplace_back(r, c);
        }
        for (uint32_t k = 0; k < n; ++k)
            if (k != c && (t[k] >> c & 1)) {
                t[k] ^= t[c];
                red.emplace_back(c, k);
            }
    }
    return red;
}

/// The same by Patel-Markov-Hayes: the lower sweep on t, then on the transpose of what is left
/// (an upper triangular u; a row operation on u^T is a column operation on u).
std::vector<std::pair<uint32_t, uint32_t>> pmh(std::vector<uint64_t> t, uint32_t n) {
    uint32_t m = 1;
    while ((uint32_t(1) << (2 * m)) <= n) ++m;  // about log2(n) / 2
    std::vector<std::pair<uint32_t, uint32_t>> red = lower_sweep(t, n, m);
    std::vector<uint64_t> ut(n, 0);
    for (uint32_t i = 0; i < n; ++i)
        for (uint64_t b = t[i]; b; b &= b - 1) ut[std::countr_zero(b)] |= uint64_t(1) << i;
    const std::vector<std::pair<uint32_t, uint32_t>> upper = lower_sweep(ut, n, m);
    // E' u^T = I with E' = R'_k ... R'_1 gives u^{-1} = R'_1^T ... R'_k^T; R^T swaps control and target.
    for (auto it = upper.rbegin(); it != upper.rend(); ++it) red.emplace_back(it->second, it->first);
    return red;
}

}  // namespace

std::vector<NetOp> synthesize_linear(uint32_t n, std::vector<uint64_t> from, const std::vector<uint64_t>& to) {
    // from^{-1} by Gauss-Jordan on [from | I].
    std::vector<uint64_t> inv(n);
    for (uint32_t i = 0; i < n; ++i) inv[i] = uint64_t(1) << i;
    for (uint32_t c = 0; c < n; ++c) {
        uint32_t r = c;
        while (r < n && !(from[r] >> c & 1)) ++r;
        WHITTLE_ASSERT(r < n && "synthesize_linear: the wire values are not independent");
        std::swap(from[r], from[c]);
        std::swap(inv[r], inv[c]);
        for (uint32_t k = 0; k < n; ++k)
            if (k != c && (from[k] >> c & 1)) {
                from[k] ^= from[c];
                inv[k] ^= inv[c];
            }
    }
    // Now from is I and inv = from^{-1}. to = T from with T_r = sum over bits s of to_r of inv_s.
    std::vector<uint64_t> t(n, 0);
    for (uint32_t r = 0; r < n; ++r)
        for (uint64_t b = to[r]; b; b &= b - 1) t[r] ^= inv[std::countr_zero(b)];
    // Row operations reducing T to I (row k ^= row c is CNOT c -> k), the shorter of two methods;
    // the circuit is the reduction in reverse order (each row operation is its own inverse).
    std::vector<std::pair<uint32_t, uint32_t>> red = gauss_jordan(t, n);
    if (n >= 4) {
        std::vector<std::pair<uint32_t, uint32_t>> other = pmh(t, n);
        if (other.size() < red.size()) red = std::move(other);
    }
    std::vector<NetOp> out;
    out.reserve(red.size());
    for (auto it = red.rbegin(); it != red.rend(); ++it) out.push_back({NetOp::Kind::Cnot, it->first, it->second, {}, false});
    return out;
}

std::vector<NetOp> synthesize_parity_network(uint32_t n, const std::vector<PhaseToPlace>& terms,
                                             const std::vector<uint64_t>& out_parity,
                                             const std::vector<uint8_t>& out_flip) {
    Network net{n, {}, {}, {}, &terms, {}};
    net.cur.resize(n);
    for (uint32_t i = 0; i < n; ++i) net.cur[i] = uint64_t(1) << i;
    for (const PhaseToPlace& t : terms) {
        WHITTLE_ASSERT(t.parity != 0 && "a phase term on the empty parity");
        net.y.push_back(t.parity);
    }
    net.placed.assign(terms.size(), 0);
    net.place_ready();

    const uint64_t all_rows = n == 64 ? ~uint64_t(0) : (uint64_t(1) << n) - 1;
    std::vector<Part> stack;
    {
        Part root{{}, all_rows, -1};
        for (uint32_t i = 0; i < terms.size(); ++i)
            if (!net.placed[i]) root.terms.push_back(i);
        stack.push_back(std::move(root));
    }
    auto prune = [&](std::vector<uint32_t>& s) {
        std::erase_if(s, [&](uint32_t i) { return net.placed[i] != 0; });
    };
    while (!stack.empty()) {
        Part part = std::move(stack.back());
        stack.pop_back();
        prune(part.terms);
        if (part.terms.empty()) continue;
        if (part.target >= 0) {
            const uint32_t i = uint32_t(part.target);
            // Rows every term of the part has: fold them into the target wire.
            while (!part.terms.empty()) {
                // (Every term holds wire i by construction; a CNOT into i only clears the others'
                // common row when it does, so stop if a term lost it.)
                uint64_t common = all_rows & ~(uint64_t(1) << i);
                for (uint32_t t : part.terms) common &= (net.y[t] >> i & 1) ? net.y[t] : 0;
                if (!common) break;
                net.cnot(uint32_t(std::countr_zero(common)), i);
                prune(part.terms);
            }
        }
        if (part.terms.empty() || part.rows == 0) continue;
        // Split on the row whose zeros or ones are most numerous (ties: lowest row).
        uint32_t best = 64;
        size_t best_score = 0;
        for (uint64_t r = part.rows; r; r &= r - 1) {
            const uint32_t j = uint32_t(std::countr_zero(r));
            size_t ones = 0;
            for (uint32_t t : part.terms) ones += net.y[t] >> j & 1;
            const size_t score = std::max(ones, part.terms.size() - ones);
            if (best == 64 || score > best_score) {
                best = j;
                best_score = score;
            }
        }
        Part zero{{}, part.rows & ~(uint64_t(1) << best), part.target};
        Part one{{}, zero.rows, part.target >= 0 ? part.target : int(best)};
        for (uint32_t t : part.terms) (net.y[t] >> best & 1 ? one : zero).terms.push_back(t);
        stack.push_back(std::move(one));
        stack.push_back(std::move(zero));  // popped first
    }
    // Terms the splits left over (possible once earlier CNOTs rewrote rows already split on):
    // fold each into its lowest wire directly.
    for (size_t i = 0; i < net.y.size(); ++i)
        while (!net.placed[i]) {
            const uint32_t t = uint32_t(std::countr_zero(net.y[i]));
            const uint64_t rest = net.y[i] & ~(uint64_t(1) << t);
            net.cnot(uint32_t(std::countr_zero(rest)), t);
        }
    std::vector<NetOp> ops = std::move(net.ops);
    for (NetOp& op : synthesize_linear(n, net.cur, out_parity)) ops.push_back(op);
    for (uint32_t w = 0; w < n; ++w)
        if (out_flip[w]) ops.push_back({NetOp::Kind::Not, w, 0, {}});
    return ops;
}

}  // namespace whittle::tcount
