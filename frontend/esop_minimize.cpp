// Exclusive-sum-of-products minimization: exact up to 4 variables, local exorlink rewriting beyond.
#include "frontend/esop_minimize.h"

#include <algorithm>
#include <array>
#include <functional>
#include <optional>
#include <queue>
#include <unordered_map>

#include "ir/error.h"

namespace whittle::frontend {

namespace {

// One variable's place in a cube: 0 = absent (the factor 1), 1 = positive (x), 2 = negated (!x).
// As functions of x the three values xor pairwise to the third: x ^ !x = 1, x ^ 1 = !x, !x ^ 1 = x.
unsigned value_of(const Cube& c, unsigned v) {
    uint64_t bit = uint64_t(1) << v;
    if (!(c.care & bit)) return 0;
    return (c.polarity & bit) ? 1 : 2;
}

Cube with_value(Cube c, unsigned v, unsigned value) {
    uint64_t bit = uint64_t(1) << v;
    c.care &= ~bit;
    c.polarity &= ~bit;
    if (value != 0) c.care |= bit;
    if (value == 1) c.polarity |= bit;
    return c;
}

/// The variables in which two cubes differ.
uint64_t difference(const Cube& a, const Cube& b) {
    return (a.care ^ b.care) | (a.care & b.care & (a.polarity ^ b.polarity));
}

struct CubeHash {
    size_t operator()(const Cube& c) const {
        return std::hash<uint64_t>{}(c.care * 0x9e3779b97f4a7c15ull ^ (c.polarity + 0x632be59bd9b4e019ull));
    }
};

uint64_t total_cost(const std::vector<Cube>& cubes, EsopCost cost) {
    uint64_t sum = 0;
    for (const Cube& c : cubes) sum += cube_cost(c, cost);
    return sum;
}

/// Drops pairs of equal cubes (c ^ c = 0).
void cancel_duplicates(std::vector<Cube>& cubes) {
    std::sort(cubes.begin(), cubes.end(), [](const Cube& a, const Cube& b) {
        return a.care != b.care ? a.care < b.care : a.polarity < b.polarity;
    });
    std::vector<Cube> out;
    out.reserve(cubes.size());
    for (const Cube& c : cubes) {
        if (!out.empty() && out.back() == c)
            out.pop_back();
        else
            out.push_back(c);
    }
    cubes = std::move(out);
}

/// Repeatedly replaces two cubes at distance 1 by their merge (and drops a merge that equals a
/// present cube, distance 0), until no two cubes are at distance 0 or 1. Input: no duplicates.
void merge_all(std::vector<Cube>& cubes) {
    uint64_t support = 0;
    for (const Cube& c : cubes) support |= c.care;
    std::unordered_map<Cube, size_t, CubeHash> where;  // cube -> index in `cubes`
    where.reserve(cubes.size() * 2);
    std::vector<bool> dead(cubes.size(), false);
    for (size_t i = 0; i < cubes.size(); ++i) where.emplace(cubes[i], i);

    std::vector<size_t> work(cubes.size());
    for (size_t i = 0; i < cubes.size(); ++i) work[i] = cubes.size() - 1 - i;
    auto remove = [&](size_t i) {
        dead[i] = true;
        where.erase(cubes[i]);
    };
    auto add = [&](const Cube& c) {
        auto it = where.find(c);
        if (it != where.end()) {  // distance 0: both vanish
            dead[it->second] = true;
            where.erase(it);
            return;
        }
        cubes.push_back(c);
        dead.push_back(false);
        where.emplace(c, cubes.size() - 1);
        work.push_back(cubes.size() - 1);
    };
    while (!work.empty()) {
        size_t i = work.back();
        work.pop_back();
        if (dead[i]) continue;
        Cube a = cubes[i];
        for (uint64_t rest = support; rest; rest &= rest - 1) {
            unsigned v = unsigned(__builtin_ctzll(rest));
            unsigned av = value_of(a, v);
            bool merged = false;
            for (unsigned bv = 0; bv < 3 && !merged; ++bv) {
                if (bv == av) continue;
                auto it = where.find(with_value(a, v, bv));
                if (it == where.end()) continue;
                size_t j = it->second;
                remove(i);
                remove(j);
                add(with_value(a, v, 3 - av - bv));
                merged = true;
            }
            if (merged) break;
        }
    }
    std::vector<Cube> out;
    out.reserve(where.size());
    for (size_t i = 0; i < cubes.size(); ++i)
        if (!dead[i]) out.push_back(cubes[i]);
    cubes = std::move(out);
}

// ---- exact minimum for at most 4 variables ------------------------------------------------------

/// For k variables: the least-cost ESOP of every function of k variables, as a shortest-path tree
/// over truth tables (bit x of a table = f(x)) with one edge per cube.
struct ExactTable {
    std::vector<Cube> cubes;       // the 3^k cubes over variables 0..k-1
    std::vector<uint32_t> tables;  // their truth tables
    std::vector<uint64_t> dist;
    std::vector<uint8_t> via;      // the last cube on a cheapest path (index into cubes)

    ExactTable(unsigned k, EsopCost cost) {
        unsigned n_cubes = 1;
        for (unsigned i = 0; i < k; ++i) n_cubes *= 3;
        for (unsigned code = 0; code < n_cubes; ++code) {
            Cube c;
            unsigned rest = code;
            for (unsigned v = 0; v < k; ++v, rest /= 3) c = with_value(c, v, rest % 3);
            uint32_t tt = 0;
            for (uint32_t x = 0; x < (1u << k); ++x)
                if (c.eval(x)) tt |= 1u << x;
            cubes.push_back(c);
            tables.push_back(tt);
        }
        size_t n_states = size_t(1) << (1u << k);
        dist.assign(n_states, UINT64_MAX);
        via.assign(n_states, 0);
        using Item = std::pair<uint64_t, uint32_t>;
        std::priority_queue<Item, std::vector<Item>, std::greater<>> queue;
        dist[0] = 0;
        queue.push({0, 0});
        while (!queue.empty()) {
            auto [d, s] = queue.top();
            queue.pop();
            if (d != dist[s]) continue;
            for (unsigned ci = 0; ci < cubes.size(); ++ci) {
                uint32_t t = s ^ tables[ci];
                uint64_t nd = d + cube_cost(cubes[ci], cost);
                if (nd < dist[t]) {
                    dist[t] = nd;
                    via[t] = uint8_t(ci);
                    queue.push({nd, t});
                }
            }
        }
    }

    std::vector<Cube> esop(uint32_t tt) const {
        std::vector<Cube> out;
        while (tt != 0) {
            unsigned ci = via[tt];
            out.push_back(cubes[ci]);
            tt ^= tables[ci];
        }
        return out;
    }
};

const ExactTable& exact_table(unsigned k, EsopCost cost) {
    WHITTLE_ASSERT(k <= 4 && "exact ESOP tables exist for at most 4 variables");
    if (cost == EsopCost::Cubes) {
        static const std::array<ExactTable, 5> by_cubes = {
            ExactTable(0, EsopCost::Cubes), ExactTable(1, EsopCost::Cubes), ExactTable(2, EsopCost::Cubes),
            ExactTable(3, EsopCost::Cubes), ExactTable(4, EsopCost::Cubes)};
        return by_cubes[k];
    }
    static const std::array<ExactTable, 5> by_toffolis = {
        ExactTable(0, EsopCost::Toffolis), ExactTable(1, EsopCost::Toffolis), ExactTable(2, EsopCost::Toffolis),
        ExactTable(3, EsopCost::Toffolis), ExactTable(4, EsopCost::Toffolis)};
    return by_toffolis[k];
}

/// The compact variables of `support` (compact i = original vars[i]).
std::vector<unsigned> variables_of(uint64_t support) {
    std::vector<unsigned> vars;
    for (uint64_t rest = support; rest; rest &= rest - 1) vars.push_back(unsigned(__builtin_ctzll(rest)));
    return vars;
}

std::vector<Cube> minimize_exact(const std::vector<Cube>& cubes, uint64_t support, EsopCost cost) {
    std::vector<unsigned> vars = variables_of(support);
    unsigned k = unsigned(vars.size());
    uint32_t tt = 0;
    for (uint32_t x = 0; x < (1u << k); ++x) {
        uint64_t assignment = 0;
        for (unsigned i = 0; i < k; ++i)
            if (x >> i & 1) assignment |= uint64_t(1) << vars[i];
        bool value = false;
        for (const Cube& c : cubes) value ^= c.eval(assignment);
        if (value) tt |= 1u << x;
    }
    std::vector<Cube> out;
    for (const Cube& compact : exact_table(k, cost).esop(tt)) {
        Cube c;
        for (unsigned i = 0; i < k; ++i) c = with_value(c, vars[i], value_of(compact, i));
        out.push_back(c);
    }
    return out;
}

// ---- local rewriting beyond 4 variables ---------------------------------------------------------

constexpr size_t kReshapeMaxCubes = 256;  // exorlink trials are quadratic in the cube count
constexpr unsigned kReshapeRounds = 64;

/// One round of distance-2 exorlinks: for each pair of cubes at distance 2, try both equivalent
/// rewrites of the pair; keep the first whose merges lower the cost. True when it improved.
bool reshape_round(std::vector<Cube>& cubes, EsopCost cost) {
    uint64_t before = total_cost(cubes, cost);
    for (size_t i = 0; i < cubes.size(); ++i) {
        for (size_t j = i + 1; j < cubes.size(); ++j) {
            uint64_t diff = difference(cubes[i], cubes[j]);
            if (__builtin_popcountll(diff) != 2) continue;
            unsigned x = unsigned(__builtin_ctzll(diff));
            unsigned y = unsigned(__builtin_ctzll(diff & (diff - 1)));
            const Cube a = cubes[i], b = cubes[j];
            unsigned xa = value_of(a, x), ya = value_of(a, y), xb = value_of(b, x), yb = value_of(b, y);
            // x_a y_a ^ x_b y_b = x3 y_a ^ x_b y3 = x_a y3 ^ x3 y_b, with x3 = x_a ^ x_b (the third value).
            const std::array<std::pair<Cube, Cube>, 2> rewrites = {
                std::pair{with_value(a, x, 3 - xa - xb), with_value(b, y, 3 - ya - yb)},
                std::pair{with_value(a, y, 3 - ya - yb), with_value(b, x, 3 - xa - xb)}};
            for (const auto& [na, nb] : rewrites) {
                std::vector<Cube> trial = cubes;
                trial[i] = na;
                trial[j] = nb;
                cancel_duplicates(trial);
                merge_all(trial);
                if (total_cost(trial, cost) < before) {
                    cubes = std::move(trial);
                    return true;
                }
            }
        }
    }
    return false;
}

// ---- fixed-polarity Reed-Muller starting points ------------------------------------------------

constexpr unsigned kTableMaxVars = 16;          // truth tables of at most 2^16 entries
constexpr uint64_t kTableMaxWork = 1ull << 26;  // cube evaluations to build one
constexpr unsigned kAllPolaritiesMaxVars = 10;  // beyond: the all-positive and all-negative forms only

/// Truth table over the compact variables: entry x is the value on the assignment whose compact bit i is x_i.
std::vector<uint8_t> truth_table(const std::vector<Cube>& cubes, const std::vector<unsigned>& vars) {
    size_t size = size_t(1) << vars.size();
    std::vector<uint8_t> table(size, 0);
    for (const Cube& c : cubes) {
        uint32_t care = 0, pol = 0;
        for (unsigned i = 0; i < vars.size(); ++i) {
            unsigned v = value_of(c, vars[i]);
            if (v != 0) care |= 1u << i;
            if (v == 1) pol |= 1u << i;
        }
        for (uint32_t x = 0; x < size; ++x)
            if (((x ^ pol) & care) == 0) table[x] ^= 1;
    }
    return table;
}

/// The Reed-Muller form of the function with variable i negated where bit i of `negated` is set:
/// f(x) = xor over monomials S of c_S * prod_{i in S} (x_i ^ negated_i), by the Moebius transform.
std::vector<Cube> reed_muller(const std::vector<uint8_t>& table, const std::vector<unsigned>& vars, uint32_t negated) {
    size_t size = table.size();
    std::vector<uint8_t> coef(size);
    for (uint32_t y = 0; y < size; ++y) coef[y] = table[y ^ negated];
    for (unsigned i = 0; i < vars.size(); ++i)
        for (uint32_t y = 0; y < size; ++y)
            if (y >> i & 1) coef[y] ^= coef[y ^ (1u << i)];
    std::vector<Cube> out;
    for (uint32_t s = 0; s < size; ++s) {
        if (!coef[s]) continue;
        Cube c;
        for (unsigned i = 0; i < vars.size(); ++i)
            if (s >> i & 1) c = with_value(c, vars[i], (negated >> i & 1) ? 2 : 1);
        out.push_back(c);
    }
    return out;
}

/// The cheapest fixed-polarity Reed-Muller form (every polarity up to kAllPolaritiesMaxVars
/// variables), or nothing when the truth table would be too large.
std::optional<std::vector<Cube>> best_reed_muller(const std::vector<Cube>& cubes, uint64_t support, EsopCost cost) {
    std::vector<unsigned> vars = variables_of(support);
    if (vars.size() > kTableMaxVars || uint64_t(cubes.size()) << vars.size() > kTableMaxWork) return std::nullopt;
    std::vector<uint8_t> table = truth_table(cubes, vars);
    uint32_t all = uint32_t((uint64_t(1) << vars.size()) - 1);
    std::vector<uint32_t> polarities;
    if (vars.size() <= kAllPolaritiesMaxVars)
        for (uint32_t p = 0; p <= all; ++p) polarities.push_back(p);
    else
        polarities = {0, all};
    std::vector<Cube> best;
    uint64_t best_cost = UINT64_MAX;
    for (uint32_t p : polarities) {
        std::vector<Cube> form = reed_muller(table, vars, p);
        uint64_t c = total_cost(form, cost);
        if (c < best_cost) {
            best_cost = c;
            best = std::move(form);
        }
    }
    return best;
}

/// Merges and exorlink reshapes from one starting ESOP.
std::vector<Cube> improve(std::vector<Cube> cubes, EsopCost cost) {
    cancel_duplicates(cubes);
    merge_all(cubes);
    if (cubes.size() <= kReshapeMaxCubes)
        for (unsigned round = 0; round < kReshapeRounds && reshape_round(cubes, cost); ++round) {
        }
    return cubes;
}

}  // namespace

uint64_t cube_cost(const Cube& c, EsopCost cost) {
    uint64_t k = c.literals();
    if (cost == EsopCost::Cubes) return 1000 + k;
    uint64_t toffolis = k >= 2 ? 2 * k - 3 : 0;
    return toffolis * 1'000'000 + 1000 + k;
}

std::vector<ir::LitVec> minimize_esop(const std::vector<ir::LitVec>& cubes) {
    std::vector<uint32_t> wires;  // variable i = wire wires[i]
    std::unordered_map<uint32_t, unsigned> var_of;
    std::vector<Cube> in;
    for (const ir::LitVec& lits : cubes) {
        Cube c;
        bool zero = false;
        for (ir::Lit l : lits) {
            auto [it, fresh] = var_of.emplace(l.wire(), unsigned(wires.size()));
            if (fresh) {
                if (wires.size() == 64) return cubes;
                wires.push_back(l.wire());
            }
            bool contradiction = false;
            c = c.conjoin(Cube::literal(it->second, l.positive()), contradiction);
            zero = zero || contradiction;  // x & !x: the cube is 0
        }
        if (!zero) in.push_back(c);
    }
    std::vector<ir::LitVec> out;
    for (const Cube& c : minimize_esop(std::move(in))) {
        ir::LitVec lits;
        for (uint64_t rest = c.care; rest; rest &= rest - 1) {
            unsigned v = unsigned(__builtin_ctzll(rest));
            lits.push_back(ir::Lit::make(wires[v], (c.polarity >> v) & 1));
        }
        std::sort(lits.begin(), lits.end(), [](ir::Lit a, ir::Lit b) { return a.wire() < b.wire(); });
        out.push_back(std::move(lits));
    }
    return out;
}

std::vector<Cube> minimize_esop(std::vector<Cube> cubes, EsopCost cost) {
    for (const Cube& c : cubes) WHITTLE_ASSERT((c.polarity & ~c.care) == 0 && "cube polarity outside its care set");
    cancel_duplicates(cubes);
    uint64_t support = 0;
    for (const Cube& c : cubes) support |= c.care;
    if (__builtin_popcountll(support) <= 4) return minimize_exact(cubes, support, cost);

    std::vector<Cube> best = cubes;
    uint64_t best_cost = total_cost(best, cost);
    std::vector<std::vector<Cube>> starts = {cubes};
    if (auto form = best_reed_muller(cubes, support, cost)) starts.push_back(std::move(*form));
    for (std::vector<Cube>& start : starts) {
        std::vector<Cube> improved = improve(std::move(start), cost);
        uint64_t c = total_cost(improved, cost);
        if (c < best_cost) {
            best_cost = c;
            best = std::move(improved);
        }
    }
    return best;
}

}  // namespace whittle::frontend
