// Exact expansions of Boolean expressions: ESOP cubes and integer multilinear coefficients.
#include "frontend/boolean_expr.h"

#include <algorithm>
#include <map>
#include <optional>

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::frontend {

using ir::Lit;
using ir::LitVec;

uint32_t BoolExpr::constant(bool v, ir::SourceLoc loc) {
    BoolNode n;
    n.kind = BoolNode::Const;
    n.value = v;
    n.loc = loc;
    return root = add(n);
}

uint32_t BoolExpr::var(uint32_t wire, ir::SourceLoc loc) {
    BoolNode n;
    n.kind = BoolNode::Var;
    n.wire = wire;
    n.loc = loc;
    return root = add(n);
}

uint32_t BoolExpr::op(BoolNode::Kind k, uint32_t a, uint32_t b, ir::SourceLoc loc) {
    BoolNode n;
    n.kind = k;
    n.a = a;
    n.b = b;
    n.loc = loc;
    return root = add(n);
}

bool BoolExpr::eval(const std::vector<bool>& input) const {
    // Operands precede their parents, so one forward sweep evaluates every node.
    std::vector<char> v(nodes.size());
    for (size_t i = 0; i < nodes.size(); ++i) {
        const BoolNode& n = nodes[i];
        switch (n.kind) {
        case BoolNode::Const: v[i] = n.value; break;
        case BoolNode::Var: v[i] = input.at(n.wire); break;
        case BoolNode::Not: v[i] = !v[n.a]; break;
        case BoolNode::And: v[i] = v[n.a] && v[n.b]; break;
        case BoolNode::Xor: v[i] = v[n.a] != v[n.b]; break;
        case BoolNode::Or: v[i] = v[n.a] || v[n.b]; break;
        }
    }
    return v[root];
}

bool and_literal(LitVec& product, Lit lit) {
    for (Lit l : product) {
        if (l == lit) return true;
        if (l.wire() == lit.wire()) return false;
    }
    product.push_back(lit);
    return true;
}

namespace {

/// Strips negations: returns the literal a Var under any number of Nots stands for, if it is one.
std::optional<Lit> literal_of(const BoolExpr& e, uint32_t i) {
    bool positive = true;
    while (e.nodes[i].kind == BoolNode::Not) {
        positive = !positive;
        i = e.nodes[i].a;
    }
    if (e.nodes[i].kind != BoolNode::Var) return std::nullopt;
    return Lit::make(e.nodes[i].wire, positive);
}

/// Constant under any number of Nots.
std::optional<bool> constant_of(const BoolExpr& e, uint32_t i) {
    bool flip = false;
    while (e.nodes[i].kind == BoolNode::Not) {
        flip = !flip;
        i = e.nodes[i].a;
    }
    if (e.nodes[i].kind != BoolNode::Const) return std::nullopt;
    return e.nodes[i].value != flip;
}

/// Leaves of a maximal tree of `kind` nodes under `root`, left to right (explicit stack: no recursion).
void leaves(const BoolExpr& e, uint32_t root, BoolNode::Kind kind, std::vector<uint32_t>& out) {
    std::vector<uint32_t> stack{root};
    while (!stack.empty()) {
        uint32_t i = stack.back();
        stack.pop_back();
        if (e.nodes[i].kind == kind) {
            stack.push_back(e.nodes[i].b);
            stack.push_back(e.nodes[i].a);
        } else {
            out.push_back(i);
        }
    }
}

[[noreturn]] void too_many(uint32_t max_terms, ir::SourceLoc loc) {
    throw UserError(fmt::format("the exact expansion of this expression has more than {} terms (the expansion limit)",
                                max_terms),
                    loc);
}

using Cubes = std::vector<LitVec>;

void sort_cube(LitVec& c) { std::sort(c.begin(), c.end()); }

/// Sorts the cubes and cancels equal pairs (x ^ x = 0).
void normalize(Cubes& cs) {
    std::sort(cs.begin(), cs.end(), [](const LitVec& a, const LitVec& b) {
        return std::lexicographical_compare(a.begin(), a.end(), b.begin(), b.end());
    });
    Cubes out;
    out.reserve(cs.size());
    for (size_t i = 0; i < cs.size();) {
        size_t j = i;
        while (j < cs.size() && cs[j] == cs[i]) ++j;
        if ((j - i) % 2 == 1) out.push_back(std::move(cs[i]));
        i = j;
    }
    cs = std::move(out);
}

/// !f = 1 ^ f: flips a one-literal cube when there is one (!(x ^ r) = !x ^ r), else toggles the
/// constant cube.
Cubes negate(Cubes f) {
    for (LitVec& c : f)
        if (c.size() == 1) {
            c[0] = c[0].flipped();
            normalize(f);
            return f;
        }
    f.push_back(LitVec{});
    normalize(f);
    return f;
}

Cubes xor_of(Cubes f, const Cubes& g) {
    f.insert(f.end(), g.begin(), g.end());
    normalize(f);
    return f;
}

std::optional<Cubes> and_of(const Cubes& f, const Cubes& g, uint32_t max_terms) {
    if (uint64_t(f.size()) * g.size() > max_terms) return std::nullopt;
    Cubes out;
    out.reserve(f.size() * g.size());
    for (const LitVec& a : f)
        for (const LitVec& b : g) {
            LitVec c = a;
            bool ok = true;
            for (Lit l : b)
                if (!(ok = and_literal(c, l))) break;
            if (!ok) continue;
            sort_cube(c);
            out.push_back(std::move(c));
        }
    normalize(out);
    return out;
}

using Poly = std::map<std::vector<uint32_t>, int64_t>;

void add_term(Poly& p, const std::vector<uint32_t>& m, int64_t c, uint32_t max_terms, ir::SourceLoc loc) {
    if (c == 0) return;
    auto [it, fresh] = p.emplace(m, c);
    if (!fresh) {
        if (__builtin_add_overflow(it->second, c, &it->second)) too_many(max_terms, loc);
        if (it->second == 0) p.erase(it);
    }
    if (p.size() > max_terms) too_many(max_terms, loc);
}

Poly scaled_sum(const Poly& f, int64_t a, const Poly& g, int64_t b, uint32_t max_terms, ir::SourceLoc loc) {
    Poly out;
    for (auto& [m, c] : f) {
        int64_t v;
        if (__builtin_mul_overflow(c, a, &v)) too_many(max_terms, loc);
        add_term(out, m, v, max_terms, loc);
    }
    for (auto& [m, c] : g) {
        int64_t v;
        if (__builtin_mul_overflow(c, b, &v)) too_many(max_terms, loc);
        add_term(out, m, v, max_terms, loc);
    }
    return out;
}

Poly product(const Poly& f, const Poly& g, uint32_t max_terms, ir::SourceLoc loc) {
    if (uint64_t(f.size()) * g.size() > max_terms) too_many(max_terms, loc);
    Poly out;
    std::vector<uint32_t> m;
    for (auto& [ma, ca] : f)
        for (auto& [mb, cb] : g) {
            m.clear();
            std::set_union(ma.begin(), ma.end(), mb.begin(), mb.end(), std::back_inserter(m));
            int64_t v;
            if (__builtin_mul_overflow(ca, cb, &v)) too_many(max_terms, loc);
            add_term(out, m, v, max_terms, loc);
        }
    return out;
}

}  // namespace

bool as_conjunction(const BoolExpr& e, LitVec& product, bool& is_zero) {
    product.clear();
    is_zero = false;
    std::vector<uint32_t> ls;
    leaves(e, e.root, BoolNode::And, ls);
    for (uint32_t i : ls) {
        if (auto c = constant_of(e, i)) {
            if (!*c) is_zero = true;
            continue;
        }
        auto l = literal_of(e, i);
        if (!l) return false;
        if (!and_literal(product, *l)) is_zero = true;
    }
    if (is_zero) product.clear();
    return true;
}

bool as_parity(const BoolExpr& e, std::vector<uint32_t>& wires, bool& constant) {
    wires.clear();
    constant = false;
    std::vector<uint32_t> ls;
    leaves(e, e.root, BoolNode::Xor, ls);
    for (uint32_t i : ls) {
        if (auto c = constant_of(e, i)) {
            constant = constant != *c;
            continue;
        }
        auto l = literal_of(e, i);
        if (!l) return false;
        if (!l->positive()) constant = !constant;
        auto it = std::find(wires.begin(), wires.end(), l->wire());
        if (it != wires.end()) wires.erase(it);
        else wires.push_back(l->wire());
    }
    return true;
}

namespace {

/// How many parents read each node: an operand shared by several parents (comparisons build a DAG)
/// is released only after its last reader.
std::vector<uint32_t> reader_counts(const BoolExpr& e) {
    std::vector<uint32_t> readers(e.nodes.size(), 0);
    for (const BoolNode& n : e.nodes) {
        if (n.kind == BoolNode::Const || n.kind == BoolNode::Var) continue;
        ++readers[n.a];
        if (n.kind != BoolNode::Not) ++readers[n.b];
    }
    return readers;
}

}  // namespace

std::vector<LitVec> esop(const BoolExpr& e, uint32_t max_terms, ir::SourceLoc loc) {
    // Operands precede parents: one forward sweep; an operand's cubes are moved into its last reader.
    std::vector<Cubes> val(e.nodes.size());
    std::vector<uint32_t> readers = reader_counts(e);
    auto take = [&](uint32_t a) { return readers[a] == 1 ? std::move(val[a]) : Cubes(val[a]); };
    for (size_t i = 0; i < e.nodes.size(); ++i) {
        const BoolNode& n = e.nodes[i];
        switch (n.kind) {
        case BoolNode::Const:
            if (n.value) val[i].push_back(LitVec{});
            break;
        case BoolNode::Var: val[i].push_back(LitVec{Lit::pos(n.wire)}); break;
        case BoolNode::Not: val[i] = negate(take(n.a)); break;
        case BoolNode::Xor: val[i] = xor_of(take(n.a), val[n.b]); break;
        case BoolNode::And: {
            auto r = and_of(val[n.a], val[n.b], max_terms);
            if (!r) too_many(max_terms, loc);
            val[i] = std::move(*r);
            break;
        }
        case BoolNode::Or: {
            // f | g = f ^ g ^ fg = !(!f & !g): keep the shorter exact form.
            const Cubes& f = val[n.a];
            const Cubes& g = val[n.b];
            std::optional<Cubes> first, second;
            if (auto fg = and_of(f, g, max_terms)) first = xor_of(xor_of(f, g), *fg);
            if (auto nn = and_of(negate(f), negate(g), max_terms)) second = negate(std::move(*nn));
            if (!first && !second) too_many(max_terms, loc);
            if (!first || (second && second->size() < first->size())) val[i] = std::move(*second);
            else val[i] = std::move(*first);
            break;
        }
        }
        if (val[i].size() > max_terms) too_many(max_terms, loc);
        auto release = [&](uint32_t a) {
            if (--readers[a] > 0) return;
            val[a].clear();
            val[a].shrink_to_fit();
        };
        if (n.kind != BoolNode::Const && n.kind != BoolNode::Var) {
            release(n.a);
            if (n.kind != BoolNode::Not) release(n.b);
        }
    }
    return std::move(val[e.root]);
}

std::vector<Monomial> multilinear(const BoolExpr& e, uint32_t max_terms, ir::SourceLoc loc) {
    std::vector<Poly> val(e.nodes.size());
    std::vector<uint32_t> readers = reader_counts(e);
    const Poly one{{{}, 1}};
    for (size_t i = 0; i < e.nodes.size(); ++i) {
        const BoolNode& n = e.nodes[i];
        switch (n.kind) {
        case BoolNode::Const:
            if (n.value) val[i] = one;
            break;
        case BoolNode::Var: val[i][{n.wire}] = 1; break;
        case BoolNode::Not: val[i] = scaled_sum(one, 1, val[n.a], -1, max_terms, loc); break;  // 1 - f
        case BoolNode::And: val[i] = product(val[n.a], val[n.b], max_terms, loc); break;
        case BoolNode::Xor: {  // f + g - 2fg
            Poly fg = product(val[n.a], val[n.b], max_terms, loc);
            val[i] = scaled_sum(scaled_sum(val[n.a], 1, val[n.b], 1, max_terms, loc), 1, fg, -2, max_terms, loc);
            break;
        }
        case BoolNode::Or: {  // f + g - fg
            Poly fg = product(val[n.a], val[n.b], max_terms, loc);
            val[i] = scaled_sum(scaled_sum(val[n.a], 1, val[n.b], 1, max_terms, loc), 1, fg, -1, max_terms, loc);
            break;
        }
        }
        if (n.kind != BoolNode::Const && n.kind != BoolNode::Var) {
            if (--readers[n.a] == 0) val[n.a].clear();
            if (n.kind != BoolNode::Not && --readers[n.b] == 0) val[n.b].clear();
        }
    }
    std::vector<Monomial> out;
    for (auto& [m, c] : val[e.root]) out.push_back(Monomial{m, c});
    return out;
}

}  // namespace whittle::frontend
