// Phase folding over Boolean polynomials: simulate polynomials, collect terms, group by polynomial, re-emit.
#include "passes/phase_folding.h"

#include <optional>
#include <unordered_map>

#include "passes/anf.h"

namespace whittle::passes {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

struct AnfHash {
    size_t operator()(const Anf& a) const {
        size_t h = 0x9e3779b97f4a7c15ull ^ a.size();
        for (const Monomial& m : a.terms()) {
            size_t hm = m.size() * 0x100000001b3ull;
            for (Var v : m) hm = (hm ^ v) * 0x100000001b3ull;
            h = (h ^ hm) * 0xff51afd7ed558ccdull;
        }
        return h;
    }
};

bool has_constant(const Anf& f) { return !f.terms().empty() && f.terms().front().empty(); }

/// The product, or nothing when it would pass `cap` monomials (the size cap that keeps folding linear).
std::optional<Anf> times(const Anf& a, const Anf& b, size_t cap) {
    if (a.size() * b.size() > cap * cap) return std::nullopt;
    try {
        Anf r = a & b;
        if (r.size() > cap) return std::nullopt;
        return r;
    } catch (const AnfOverflow&) {
        return std::nullopt;
    }
}

/// e^{i (alpha * f + extra)} with f = key ^ constant, located at op `op` (subset 0: the op itself;
/// otherwise the parity over the op's literals in that bit mask).
struct Term {
    uint32_t op = 0;
    uint32_t subset = 0;
    Anf key;
    bool constant = false;
    Angle alpha;
    Angle extra;
    uint32_t literals = 1;  ///< k of the AND term (1 for parities and one-wire phases)
    Angle effective() const { return constant ? -alpha : alpha; }       ///< coefficient of key
    Angle global_part() const { return extra + (constant ? alpha : Angle()); }
};

Term make_term(uint32_t op, uint32_t subset, const Anf& f, Angle alpha, Angle extra, uint32_t literals) {
    Term t;
    t.op = op;
    t.subset = subset;
    t.constant = has_constant(f);
    t.key = t.constant ? f.negated() : f;
    t.alpha = alpha;
    t.extra = extra;
    t.literals = literals;
    return t;
}

struct Group {
    size_t first = 0;  ///< index into the plan's term list
    size_t size = 0;
    Angle total;       ///< coefficient of the key
};

struct Plan {
    std::vector<Term> terms;
    std::vector<uint32_t> group_of;
    std::vector<Group> groups;
    bool merges = false;

    void build() {
        std::unordered_map<Anf, uint32_t, AnfHash> index;
        group_of.assign(terms.size(), 0);
        for (size_t i = 0; i < terms.size(); ++i) {
            auto [it, fresh] = index.emplace(terms[i].key, uint32_t(groups.size()));
            if (fresh) groups.push_back(Group{i, 0, Angle()});
            Group& g = groups[it->second];
            g.total += terms[i].effective();
            if (++g.size > 1) merges = true;
            group_of[i] = it->second;
        }
    }

    /// Non-Clifford cost: a group emitted as a k-literal AND term costs 2^k - 1 unless its angle
    /// divided by 2^{k-1} is a multiple of pi/2 (its parity expansion then is Clifford).
    int64_t cost() const {
        int64_t c = 0;
        for (const Group& g : groups) {
            const uint32_t k = terms[g.first].literals;
            if (!g.total.divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(2)) c += (int64_t(1) << k) - 1;
        }
        return c;
    }
};

class Folder {
public:
    Folder(ir::Circuit& c, const FoldSettings& s) : c_(c), s_(s) {}

    bool run(PassResult& result) {
        collect();
        Plan plain;
        for (size_t i = 0; i < c_.ops.size(); ++i)
            if (has_term_[i]) plain.terms.push_back(real_[i]);
        plain.build();
        Plan chosen = std::move(plain);
        bool expanded = false;
        if (s_.expand_products && !subterms_.empty()) {
            Plan wide = expansion_plan();
            if (wide.cost() < chosen.cost()) {
                chosen = std::move(wide);
                expanded = true;
            }
        }
        if (!chosen.merges && !expanded) return false;
        emit(chosen, result);
        if (expanded) result.count("products-expanded", int64_t(expanded_.size()));
        return true;
    }

private:
    Anf literal(Lit l) const { return l.positive() ? vals_[l.wire()] : vals_[l.wire()].negated(); }

    void fresh(uint32_t w) { vals_[w] = Anf::var(next_var_++); }

    void collect() {
        const uint32_t n = c_.num_qubits();
        vals_.resize(n);
        for (uint32_t w = 0; w < n; ++w) vals_[w] = Anf::var(w);
        next_var_ = n;
        real_.resize(c_.ops.size());
        has_term_.assign(c_.ops.size(), false);
        for (uint32_t i = 0; i < c_.ops.size(); ++i) step(i, c_.ops[i]);
    }

    void step(uint32_t i, const Op& op) {
        if (op.kind == OpKind::Barrier) return;
        if (op.is_conditioned() || op.kind == OpKind::Measure || op.kind == OpKind::Reset) {
            if (op.kind == OpKind::X || op.kind == OpKind::Measure || op.kind == OpKind::Reset || !op.is_diagonal()) {
                if (op.target != ir::kNoWire) fresh(op.target);
                if (op.target2 != ir::kNoWire) fresh(op.target2);
            }
            return;
        }
        switch (op.kind) {
        case OpKind::X: {
            Anf prod = Anf::one();
            for (Lit l : op.controls) {
                auto p = times(prod, literal(l), s_.max_terms);
                if (!p) {
                    fresh(op.target);
                    return;
                }
                prod = std::move(*p);
            }
            Anf v = vals_[op.target] ^ prod;
            if (v.size() > s_.max_terms) fresh(op.target);
            else vals_[op.target] = std::move(v);
            return;
        }
        case OpKind::Swap:
            if (op.controls.empty()) std::swap(vals_[op.target], vals_[op.target2]);
            else {
                fresh(op.target);
                fresh(op.target2);
            }
            return;
        case OpKind::Phase: {
            if (op.pair != 0) return;
            Anf prod = Anf::one();
            for (Lit l : op.controls) {
                auto p = times(prod, literal(l), s_.max_terms);
                if (!p) return;  // too big to compare: not a term
                prod = std::move(*p);
            }
            const uint32_t k = uint32_t(op.controls.size());
            real_[i] = make_term(i, 0, prod, op.angles[0], Angle(), k);
            has_term_[i] = true;
            // Expand only when the parity terms stay Clifford+T (angle / 2^{k-1} a multiple of pi/4:
            // CS, CZ, CCZ): finer parities would need rotation synthesis where the product lowers
            // exactly through Toffolis.
            if (s_.expand_products && k >= 2 && k <= s_.max_expand_literals &&
                op.angles[0].divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(4))
                expand(i, op);
            return;
        }
        case OpKind::Parity: {
            if (op.pair != 0) return;
            Anf sum;
            for (Lit l : op.controls) sum ^= vals_[l.wire()];
            real_[i] = make_term(i, 0, sum, op.angles[0], Angle(), 1);
            has_term_[i] = true;
            return;
        }
        case OpKind::RZ:
            if (op.pair != 0 || !op.controls.empty()) return;
            // RZ(t) = e^{-it/2} Phase(t) with the stored angle t.
            real_[i] = make_term(i, 0, vals_[op.target], op.angles[0], -op.angles[0].divided_by(2), 1);
            has_term_[i] = true;
            return;
        case OpKind::H:
        case OpKind::Y:
        case OpKind::SX:
        case OpKind::SXdg:
        case OpKind::RX:
        case OpKind::RY:
        case OpKind::U:
        case OpKind::R:
        case OpKind::ISwap:
        case OpKind::XX:
        case OpKind::Measure:
        case OpKind::Reset:
        case OpKind::Barrier:
            if (op.target != ir::kNoWire) fresh(op.target);
            if (op.target2 != ir::kNoWire) fresh(op.target2);
            return;
        }
    }

    /// The parity terms of e^{it AND(l_1..l_k)}: for each non-empty S, angle (-1)^{|S|-1} t / 2^{k-1}
    /// on XOR(l_S) = XOR of the wires in S, negated when S holds an odd number of negative literals.
    void expand(uint32_t i, const Op& op) {
        const uint32_t k = uint32_t(op.controls.size());
        const Angle base = op.angles[0].divided_by(int64_t(1) << (k - 1));
        std::vector<Term> subs;
        for (uint32_t mask = 1; mask < (1u << k); ++mask) {
            Anf sum;
            int size = 0, negs = 0;
            for (uint32_t b = 0; b < k; ++b)
                if (mask >> b & 1) {
                    sum ^= vals_[op.controls[b].wire()];
                    ++size;
                    if (!op.controls[b].positive()) ++negs;
                }
            Angle phi = size % 2 == 1 ? base : -base;
            Angle extra;
            if (negs % 2 == 1) {  // e^{i phi (1 ^ P)} = e^{i phi} e^{-i phi P}
                extra = phi;
                phi = -phi;
            }
            subs.push_back(make_term(i, mask, sum, phi, extra, 1));
        }
        subterms_.emplace(i, std::move(subs));
    }

    /// Expands the products some of whose parities occur elsewhere (another term, or another
    /// product's expansion).
    Plan expansion_plan() {
        std::unordered_map<Anf, uint32_t, AnfHash> sources;
        for (size_t i = 0; i < c_.ops.size(); ++i) {
            if (!has_term_[i]) continue;
            auto sub = subterms_.find(uint32_t(i));
            if (sub == subterms_.end()) {
                ++sources[real_[i].key];
                continue;
            }
            std::unordered_map<Anf, bool, AnfHash> own;
            for (const Term& t : sub->second) own.emplace(t.key, true);
            for (const auto& [key, unused] : own) ++sources[key];
        }
        Plan p;
        for (uint32_t i = 0; i < c_.ops.size(); ++i) {
            if (!has_term_[i]) continue;
            auto sub = subterms_.find(i);
            bool useful = false;
            if (sub != subterms_.end())
                for (const Term& t : sub->second) useful = useful || sources[t.key] >= 2;
            if (!useful) {
                p.terms.push_back(real_[i]);
                continue;
            }
            expanded_.push_back(i);
            for (const Term& t : sub->second) p.terms.push_back(t);
        }
        p.build();
        return p;
    }

    void emit(const Plan& plan, PassResult& result) {
        std::vector<Op> out;
        out.reserve(c_.ops.size());
        Angle global = c_.global_phase;
        size_t next = 0;  // plan terms are in op order
        int64_t removed = 0;
        for (uint32_t i = 0; i < c_.ops.size(); ++i) {
            const Op& op = c_.ops[i];
            if (next >= plan.terms.size() || plan.terms[next].op != i) {
                out.push_back(op);
                continue;
            }
            for (; next < plan.terms.size() && plan.terms[next].op == i; ++next) {
                const Term& t = plan.terms[next];
                const Group& g = plan.groups[plan.group_of[next]];
                if (g.size == 1 && t.subset == 0) {  // alone and not expanded: as it was
                    out.push_back(op);
                    continue;
                }
                global += t.global_part();
                if (g.first != next) {
                    ++removed;
                    continue;
                }
                // Realize e^{i total * key} with this term's function f = key ^ constant.
                const Angle a = t.constant ? -g.total : g.total;
                if (t.constant) global += g.total;
                if (a.is_zero()) {
                    ++removed;
                    continue;
                }
                if (t.subset != 0) {
                    Op p = op;
                    p.controls.clear();
                    for (uint32_t b = 0; b < op.controls.size(); ++b)
                        if (t.subset >> b & 1) p.controls.push_back(Lit::pos(op.controls[b].wire()));
                    p.kind = p.controls.size() == 1 ? OpKind::Phase : OpKind::Parity;
                    p.angles[0] = a;
                    out.push_back(std::move(p));
                    continue;
                }
                Op p = op;
                p.angles[0] = a;
                if (p.kind == OpKind::RZ) global += p.angles[0].divided_by(2);  // Phase(a) = e^{ia/2} RZ(a)
                out.push_back(std::move(p));
            }
        }
        result.count("terms-merged", removed);
        c_.ops = std::move(out);
        c_.global_phase = global;
    }

    ir::Circuit& c_;
    const FoldSettings& s_;
    std::vector<Anf> vals_;
    uint32_t next_var_ = 0;
    std::vector<Term> real_;
    std::vector<bool> has_term_;
    std::unordered_map<uint32_t, std::vector<Term>> subterms_;
    std::vector<uint32_t> expanded_;
};

}  // namespace

bool fold_phase_terms(ir::Circuit& c, const FoldSettings& settings, PassResult& result) {
    return Folder(c, settings).run(result);
}

}  // namespace whittle::passes
