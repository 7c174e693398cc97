// The library generator (the method of Xu et al. 2022, arXiv:2204.09033, in the project's own form).
#include "rulegen/derive.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <optional>
#include <random>
#include <string>
#include <unordered_map>
#include <unordered_set>

#include "rules/match.h"
#include "rulegen/prove.h"

namespace whittle::rulegen {
namespace {

using rules::AngleForm;
using rules::Gate;
using rules::GateName;
using rules::kMaxParams;
using rules::Seq;

// Every angle form over `params` parameters with coefficients in {-1, 0, 1}, not all 0.
std::vector<AngleForm> all_forms(int params) {
    std::vector<AngleForm> out;
    if (params == 0) return out;
    const int n = int(std::pow(3, params));
    for (int code = 0; code < n; ++code) {
        AngleForm f;
        int c = code;
        for (int j = 0; j < params; ++j, c /= 3) f.coef[j] = int8_t(c % 3 == 2 ? -1 : c % 3);
        if (!f.empty()) out.push_back(f);
    }
    return out;
}

// Every gate instance of the set, in a fixed order (gate set order, then wires, then forms).
std::vector<Gate> all_instances(const rules::GateSet& set) {
    std::vector<Gate> out;
    const std::vector<AngleForm> forms = all_forms(set.params);
    for (GateName name : set.gates) {
        const rules::GateInfo& info = rules::gate_info(name);
        std::vector<std::array<uint8_t, 2>> wire_sets;
        for (int a = 0; a < set.wires; ++a) {
            if (info.arity == 1) {
                wire_sets.push_back({uint8_t(a), 0});
                continue;
            }
            for (int b = 0; b < set.wires; ++b)
                if (a != b && (!info.symmetric || a < b)) wire_sets.push_back({uint8_t(a), uint8_t(b)});
        }
        for (const auto& w : wire_sets) {
            Gate g;
            g.name = name;
            g.w = w;
            if (info.slots == 0) {
                out.push_back(g);
                continue;
            }
            for (const AngleForm& f0 : forms) {
                g.a[0] = f0;
                if (info.slots == 1) {
                    out.push_back(g);
                    continue;
                }
                for (const AngleForm& f1 : forms) {
                    g.a[1] = f1;
                    out.push_back(g);
                }
            }
        }
    }
    return out;
}

int arity(const Gate& g) { return rules::gate_info(g.name).arity; }

bool share_wire(const Gate& a, const Gate& b) {
    for (int i = 0; i < arity(a); ++i)
        for (int k = 0; k < arity(b); ++k)
            if (a.w[i] == b.w[k]) return true;
    return false;
}

// The sequence with wires renumbered by first use, parameters renumbered by first use and signed so
// that each first occurrence has coefficient +1, and symmetric gates' wires in increasing order. A
// sequence equal to its canonical form stands for every renaming of itself.
Seq canonical(const Seq& s) {
    std::array<int, 8> wire_map;
    wire_map.fill(-1);
    int next_wire = 0;
    std::array<int, kMaxParams> param_map, param_sign;
    param_map.fill(-1);
    param_sign.fill(1);
    int next_param = 0;
    Seq out = s;
    for (Gate& g : out) {
        const rules::GateInfo& info = rules::gate_info(g.name);
        for (int i = 0; i < info.arity; ++i) {
            if (wire_map[g.w[i]] < 0) wire_map[g.w[i]] = next_wire++;
            g.w[i] = uint8_t(wire_map[g.w[i]]);
        }
        if (info.symmetric && g.w[0] > g.w[1]) std::swap(g.w[0], g.w[1]);
        for (int slot = 0; slot < info.slots; ++slot) {
            AngleForm f;
            for (int j = 0; j < kMaxParams; ++j) {
                if (g.a[slot].coef[j] == 0) continue;
                if (param_map[j] < 0) {
                    param_map[j] = next_param++;
                    param_sign[j] = g.a[slot].coef[j];
                }
                f.coef[param_map[j]] = int8_t(g.a[slot].coef[j] * param_sign[j]);
            }
            g.a[slot] = f;
        }
    }
    return out;
}

std::string key(const Seq& s) {
    std::string k;
    k.reserve(s.size() * 7);
    for (const Gate& g : s) {
        k += char(g.name);
        k += char(g.w[0]);
        k += char(g.w[1]);
        for (const AngleForm& f : g.a)
            for (int8_t c : f.coef) k += char(c + 1);
    }
    return k;
}

// A fingerprint: the unitary applied to a fixed random state (equal up to a phase for equal
// unitaries) and a phase-free scalar of it to bucket by.
struct Print {
    Eigen::VectorXcd v;
    double scalar = 0;
};

class Fingerprinter {
public:
    Fingerprinter(int wires, uint64_t seed) : wires_(wires) {
        std::mt19937_64 rng(seed);
        std::uniform_real_distribution<double> u(-1, 1);
        const Eigen::Index dim = Eigen::Index(1) << wires;
        in_ = Eigen::VectorXcd(dim);
        probe_ = Eigen::VectorXcd(dim);
        for (Eigen::Index i = 0; i < dim; ++i) {
            in_(i) = {u(rng), u(rng)};
            probe_(i) = {u(rng), u(rng)};
        }
        in_.normalize();
        for (double& v : values_) v = 3.0 * (u(rng) + 1.0) + 0.1;  // generic values in (0.1, 6.1)
    }
    Print operator()(const Seq& s) const {
        Print p;
        p.v = rules::seq_apply(s, wires_, values_, in_);
        p.scalar = std::abs(probe_.dot(p.v));
        return p;
    }
    static bool same(const Print& a, const Print& b) { return std::abs(a.v.dot(b.v)) > 1 - 1e-9; }

private:
    int wires_;
    Eigen::VectorXcd in_, probe_;
    std::array<double, kMaxParams> values_{};
};

// True when the gates of both sides, joined by shared wires, fall apart into more than one group: the
// rule is then independent identities on fewer wires side by side, each found on its own.
bool splits(const Seq& lhs, const Seq& rhs, int wires) {
    std::array<int, 8> parent;
    for (int w = 0; w < 8; ++w) parent[w] = w;
    auto root = [&](int w) {
        while (parent[w] != w) w = parent[w];
        return w;
    };
    std::array<bool, 8> used{};
    for (const Seq* s : {&lhs, &rhs})
        for (const Gate& g : *s) {
            used[g.w[0]] = true;
            if (arity(g) == 2) {
                used[g.w[1]] = true;
                parent[root(g.w[0])] = root(g.w[1]);
            }
        }
    int groups = 0;
    for (int w = 0; w < wires; ++w) groups += used[w] && root(w) == w;
    return groups > 1;
}

// True when the two sides hold the same gates in another order: a commutation, which the rewrite
// search gets from passes/commutation.h rather than from the library.
bool reordering(const Seq& lhs, const Seq& rhs) {
    if (lhs.size() != rhs.size()) return false;
    std::vector<std::string> a, b;
    for (const Gate& g : lhs) a.push_back(key({g}));
    for (const Gate& g : rhs) b.push_back(key({g}));
    std::sort(a.begin(), a.end());
    std::sort(b.begin(), b.end());
    return a == b;
}

// True when `a` uses a parameter that `b` does not (a rule b = a could not be applied from b: the
// parameter would be free).
bool uses_more_params(const Seq& a, const Seq& b) {
    std::array<bool, kMaxParams> in_a{}, in_b{};
    for (const auto& [s, used] : {std::pair{&a, &in_a}, std::pair{&b, &in_b}})
        for (const Gate& g : *s)
            for (const AngleForm& f : g.a)
                for (int j = 0; j < kMaxParams; ++j) (*used)[j] = (*used)[j] || f.coef[j] != 0;
    for (int j = 0; j < kMaxParams; ++j)
        if (in_a[j] && !in_b[j]) return true;
    return false;
}

// True when a kept rule of the same length, its angles substituted, is `r` (iswap; rz(a+b) from
// iswap; rz(a)).
bool instance_of_kept(const rules::Rule& r, const std::vector<rules::Rule>& kept) {
    for (const rules::Rule& k : kept)
        if (k.lhs.size() == r.lhs.size() && k.rhs.size() == r.rhs.size())
            if (std::optional<Seq> rhs = rules::match_window(k.lhs, k.rhs, r.lhs, 0); rhs && *rhs == r.rhs) return true;
    return false;
}

// Rewrites `s` with the shortening rules until none applies (each step removes a gate).
Seq shortest_form(Seq s, const std::vector<const rules::Rule*>& shortening) {
    for (bool changed = true; changed;) {
        changed = false;
        for (size_t at = 0; at < s.size() && !changed; ++at)
            for (const rules::Rule* r : shortening) {
                std::optional<Seq> rhs = rules::match_window(r->lhs, r->rhs, s, at);
                if (!rhs) continue;
                s.erase(s.begin() + long(at), s.begin() + long(at + r->lhs.size()));
                s.insert(s.begin() + long(at), rhs->begin(), rhs->end());
                changed = true;
                break;
            }
    }
    return s;
}

}  // namespace

rules::Library derive_library(const rules::GateSet& set, DeriveStats* stats) {
    DeriveStats local;
    DeriveStats& st = stats ? *stats : local;
    const std::vector<Gate> instances = all_instances(set);
    const Fingerprinter fp(set.wires, 0x5eed0f7u);
    constexpr double kBucket = 1e-7;

    struct Class {
        Seq rep;
        Print print;
    };
    std::vector<Class> classes;
    std::unordered_map<int64_t, std::vector<size_t>> buckets;
    std::unordered_set<std::string> reps;
    auto find_class = [&](const Print& p) -> int64_t {
        const int64_t b = int64_t(std::floor(p.scalar / kBucket));
        for (int64_t d = -1; d <= 1; ++d) {
            auto it = buckets.find(b + d);
            if (it == buckets.end()) continue;
            for (size_t c : it->second)
                if (Fingerprinter::same(classes[c].print, p)) return int64_t(c);
        }
        return -1;
    };
    // A new representative also stands for its wire renamings: the canonical sequences never hold
    // them, so without them a sequence equal to a renamed short one would find no class (or a long
    // representative) and its rule would be missed.
    std::vector<std::array<uint8_t, 8>> renamings;
    {
        std::array<uint8_t, 8> perm{};
        for (int w = 0; w < 8; ++w) perm[w] = uint8_t(w);
        do renamings.push_back(perm);
        while (std::next_permutation(perm.begin(), perm.begin() + set.wires));
    }
    auto add_class = [&](const Seq& s, Print p) {
        reps.insert(key(s));
        for (size_t k = 0; k < renamings.size(); ++k) {
            Seq renamed = s;
            for (Gate& g : renamed) {
                for (int i = 0; i < arity(g); ++i) g.w[i] = renamings[k][g.w[i]];
                if (rules::gate_info(g.name).symmetric && g.w[0] > g.w[1]) std::swap(g.w[0], g.w[1]);
            }
            Print q = k == 0 ? p : fp(renamed);
            if (k > 0 && find_class(q) >= 0) continue;
            buckets[int64_t(std::floor(q.scalar / kBucket))].push_back(classes.size());
            classes.push_back({std::move(renamed), std::move(q)});
        }
    };
    add_class({}, fp({}));

    std::vector<rules::Rule> candidates;
    std::vector<Seq> frontier = {{}};
    for (int len = 1; len <= set.max_gates; ++len) {
        std::vector<Seq> next;
        for (const Seq& prefix : frontier) {
            for (const Gate& g : instances) {
                // Gates on disjoint wires commute: keep only the order of increasing instance index.
                if (!prefix.empty() && !share_wire(prefix.back(), g) && !(key({prefix.back()}) < key({g}))) continue;
                Seq s = prefix;
                s.push_back(g);
                if (canonical(s) != s) continue;
                if (len > 1 && !reps.count(key(canonical(Seq(s.begin() + 1, s.end()))))) continue;
                ++st.sequences;
                Print p = fp(s);
                const int64_t c = find_class(p);
                if (c < 0) {
                    add_class(s, std::move(p));
                    next.push_back(std::move(s));
                    continue;
                }
                ++st.candidates;
                const Seq& rep = classes[size_t(c)].rep;
                if ((!rep.empty() && (rep.front() == s.front() || rep.back() == s.back())) ||
                    splits(s, rep, set.wires) || reordering(s, rep) || uses_more_params(rep, s)) {
                    ++st.implied;
                    continue;
                }
                candidates.push_back({std::move(s), rep, 0});
            }
        }
        frontier = std::move(next);
    }
    st.classes = classes.size();

    rules::Library lib;
    lib.set = set;
    std::vector<const rules::Rule*> shortening;
    lib.rules.reserve(candidates.size());
    for (rules::Rule& r : candidates) {
        // Implied by the rules kept so far (with their angles substituted): both sides shorten to
        // the same sequence.
        if (shortest_form(r.lhs, shortening) == shortest_form(r.rhs, shortening) || instance_of_kept(r, lib.rules)) {
            ++st.implied;
            continue;
        }
        const ProofResult proof = prove_rule(r, set);
        if (!proof.proved) {
            ++st.unproved;
            continue;
        }
        r.points = proof.points;
        lib.rules.push_back(std::move(r));
        if (lib.rules.back().rhs.size() < lib.rules.back().lhs.size()) shortening.push_back(&lib.rules.back());
    }
    st.rules = lib.rules.size();
    return lib;
}

}  // namespace whittle::rulegen
