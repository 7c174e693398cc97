// Phase folding over Boolean polynomials: simulate polynomials, collect terms, group by polynomial, re-emit.
#include "passes/phase_folding.h"

#include <algorithm>
#include <span>

#include <boost/container/small_vector.hpp>

#include "passes/sequence_table.h"

namespace whittle::passes {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

constexpr uint32_t kNone = 0xffffffffu;

/// A Boolean polynomial as the sorted ids of its monomials in a SequenceTable. Monomial id 0 is the
/// empty monomial (the constant 1), so a polynomial with a constant starts with 0. Wire values are
/// kept in this form (small, mostly without heap) and only term polynomials are interned.
using Poly = boost::container::small_vector<uint32_t, 4>;

/// a xor b: the symmetric difference of the sorted monomial ids.
Poly poly_xor(const Poly& a, const Poly& b) {
    Poly r;
    r.reserve(a.size() + b.size());
    std::set_symmetric_difference(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(r));
    return r;
}

Poly negated(const Poly& a) {
    static const Poly one{0};
    return poly_xor(a, one);
}

bool has_constant(const Poly& f) { return !f.empty() && f.front() == 0; }

/// e^{i (alpha * f + extra)} with f = key ^ constant, located at op `op` (subset 0: the op itself;
/// otherwise the parity over the op's literals in that bit mask). `key` is an interned polynomial.
struct Term {
    uint32_t op = 0;
    uint32_t subset = 0;
    uint32_t key = 0;
    uint32_t literals = 1;  ///< k of the AND term (1 for parities and one-wire phases)
    bool constant = false;
    Angle alpha;
    Angle extra;
    Angle effective() const { return constant ? -alpha : alpha; }       ///< coefficient of key
    Angle global_part() const { return extra + (constant ? alpha : Angle()); }
};

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

    /// Groups the terms by key in order of first occurrence; `keys` is the number of interned keys.
    void build(uint32_t keys) {
        std::vector<uint32_t> group_of_key(keys, kNone);
        group_of.assign(terms.size(), 0);
        for (size_t i = 0; i < terms.size(); ++i) {
            uint32_t& gk = group_of_key[terms[i].key];
            if (gk == kNone) {
                gk = uint32_t(groups.size());
                groups.push_back(Group{i, 0, Angle()});
            }
            Group& g = groups[gk];
            g.total += terms[i].effective();
            if (++g.size > 1) merges = true;
            group_of[i] = gk;
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

/// A term of the circuit as read (real_) with the range of its parity expansion in subterms_.
struct OpTerm {
    Term term;
    uint32_t sub_first = 0;
    uint32_t sub_count = 0;  ///< 0: not expandable
};

class Folder {
public:
    Folder(ir::Circuit& c, const FoldSettings& s) : c_(c), s_(s) {}

    bool run(PassResult& result) {
        collect();
        Plan plain;
        plain.terms.reserve(real_.size());
        for (const OpTerm& t : real_) plain.terms.push_back(t.term);
        plain.build(polys_.size());
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
        emit(chosen, expanded, result);
        if (expanded) result.count("products-expanded", expanded_);
        return true;
    }

private:
    Poly literal(Lit l) const { return l.positive() ? vals_[l.wire()] : negated(vals_[l.wire()]); }

    uint32_t var_monomial(uint32_t v) {
        const uint32_t one[1] = {v};
        return monomials_.intern(one);
    }

    void fresh(uint32_t w) { vals_[w] = Poly{var_monomial(next_var_++)}; }

    /// The product a * b, or false when it would pass `cap` monomials (the size cap that keeps folding
    /// linear). Same result and same refusals as the Anf product under the same cap. The monomial
    /// products are formed in a scratch arena and paired off there (x ^ x = 0); only a product that
    /// passes the cap is interned, so refused products (most of the large ones) leave no trace.
    bool times(const Poly& a, const Poly& b, size_t cap, Poly& out) {
        if (a.size() * b.size() > cap * cap) return false;
        out.clear();
        if (a.empty() || b.empty()) return true;
        arena_.clear();
        products_.clear();
        for (uint32_t ma : a)
            for (uint32_t mb : b) {
                const std::span<const uint32_t> x = monomials_[ma], y = monomials_[mb];
                const size_t off = arena_.size();
                std::set_union(x.begin(), x.end(), y.begin(), y.end(), std::back_inserter(arena_));
                const std::span<const uint32_t> m(arena_.data() + off, arena_.size() - off);
                products_.push_back(Product{SequenceTable::hash(m), uint32_t(off), uint32_t(m.size()), false});
            }
        // Pair off equal monomials in an open-addressing table over the products (x ^ x = 0).
        auto vars = [&](const Product& p) { return std::span<const uint32_t>(arena_.data() + p.off, p.len); };
        size_t slots = 16;
        while (slots < 2 * products_.size()) slots *= 2;
        if (slot_stamp_.size() < slots) {
            slot_stamp_.assign(slots, 0);
            slot_product_.resize(slots);
            stamp_ = 0;
        }
        if (++stamp_ == 0) {  // wrapped: clear the table once
            std::fill(slot_stamp_.begin(), slot_stamp_.end(), 0);
            stamp_ = 1;
        }
        const size_t mask = slots - 1;
        size_t survivors = 0;
        for (uint32_t k = 0; k < products_.size(); ++k) {
            Product& p = products_[k];
            size_t i = size_t(p.hash) & mask;
            for (; slot_stamp_[i] == stamp_; i = (i + 1) & mask) {
                Product& q = products_[slot_product_[i]];
                if (q.hash != p.hash) continue;
                const auto u = vars(p), v = vars(q);
                if (!std::equal(u.begin(), u.end(), v.begin(), v.end())) continue;
                q.odd = !q.odd;
                if (q.odd) ++survivors;
                else --survivors;
                break;
            }
            if (slot_stamp_[i] == stamp_) continue;  // met an equal product
            slot_stamp_[i] = stamp_;
            slot_product_[i] = k;
            p.odd = true;
            ++survivors;
        }
        if (survivors > cap) return false;
        for (const Product& p : products_)
            if (p.odd) out.push_back(monomials_.intern(vars(p)));
        std::sort(out.begin(), out.end());
        return true;
    }

    /// The product of the op's literals, or false over the cap.
    bool product(const Op& op, Poly& prod) {
        prod.assign(1, 0);
        Poly next;
        for (Lit l : op.controls) {
            if (!times(prod, literal(l), s_.max_terms, next)) return false;
            prod.swap(next);
        }
        return true;
    }

    Term make_term(uint32_t op, uint32_t subset, const Poly& f, Angle alpha, Angle extra, uint32_t literals) {
        Term t;
        t.op = op;
        t.subset = subset;
        t.constant = has_constant(f);
        const std::span<const uint32_t> key(f.data(), f.size());
        t.key = polys_.intern(t.constant ? key.subspan(1) : key);
        t.alpha = alpha;
        t.extra = extra;
        t.literals = literals;
        return t;
    }

    void add_term(uint32_t op, const Poly& f, Angle alpha, Angle extra, uint32_t literals) {
        real_.push_back(OpTerm{make_term(op, 0, f, alpha, extra, literals), 0, 0});
    }

    void collect() {
        const uint32_t n = c_.num_qubits();
        vals_.resize(n);
        for (uint32_t w = 0; w < n; ++w) vals_[w] = Poly{var_monomial(w)};
        next_var_ = n;
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
            Poly prod;
            if (!product(op, prod)) {
                fresh(op.target);
                return;
            }
            Poly v = poly_xor(vals_[op.target], prod);
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
            Poly prod;
            if (!product(op, prod)) return;  // too big to compare: not a term
            const uint32_t k = uint32_t(op.controls.size());
            add_term(i, prod, op.angle, Angle(), k);
            // Expand only when the parity terms stay Clifford+T (angle / 2^{k-1} a multiple of pi/4:
            // CS, CZ, CCZ): finer parities would need rotation synthesis where the product lowers
            // exactly through Toffolis.
            if (s_.expand_products && k >= 2 && k <= s_.max_expand_literals &&
                op.angle.divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(4))
                expand(i, op);
            return;
        }
        case OpKind::Parity: {
            if (op.pair != 0) return;
            Poly sum;
            for (Lit l : op.controls) sum = poly_xor(sum, vals_[l.wire()]);
            add_term(i, sum, op.angle, Angle(), 1);
            return;
        }
        case OpKind::RZ:
            if (op.pair != 0 || !op.controls.empty()) return;
            // RZ(t) = e^{-it/2} Phase(t) with the stored angle t.
            add_term(i, vals_[op.target], op.angle, -op.angle.divided_by(2), 1);
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
    /// They go to subterms_, recorded on the op's term (the last one added).
    void expand(uint32_t i, const Op& op) {
        const uint32_t k = uint32_t(op.controls.size());
        const Angle base = op.angle.divided_by(int64_t(1) << (k - 1));
        OpTerm& owner = real_.back();
        owner.sub_first = uint32_t(subterms_.size());
        owner.sub_count = (1u << k) - 1;
        for (uint32_t mask = 1; mask < (1u << k); ++mask) {
            Poly sum;
            int size = 0, negs = 0;
            for (uint32_t b = 0; b < k; ++b)
                if (mask >> b & 1) {
                    sum = poly_xor(sum, vals_[op.controls[b].wire()]);
                    ++size;
                    if (!op.controls[b].positive()) ++negs;
                }
            Angle phi = size % 2 == 1 ? base : -base;
            Angle extra;
            if (negs % 2 == 1) {  // e^{i phi (1 ^ P)} = e^{i phi} e^{-i phi P}
                extra = phi;
                phi = -phi;
            }
            subterms_.push_back(make_term(i, mask, sum, phi, extra, 1));
        }
    }

    std::span<const Term> subterms_of(const OpTerm& t) const {
        return {subterms_.data() + t.sub_first, t.sub_count};
    }

    /// Expands the products some of whose parities occur elsewhere (another term, or another
    /// product's expansion).
    Plan expansion_plan() {
        std::vector<uint32_t> sources(polys_.size(), 0);
        for (const OpTerm& t : real_) {
            if (t.sub_count == 0) {
                ++sources[t.term.key];
                continue;
            }
            const std::span<const Term> subs = subterms_of(t);
            for (size_t j = 0; j < subs.size(); ++j) {  // each distinct key of the expansion once
                bool seen = false;
                for (size_t e = 0; e < j && !seen; ++e) seen = subs[e].key == subs[j].key;
                if (!seen) ++sources[subs[j].key];
            }
        }
        Plan p;
        for (const OpTerm& t : real_) {
            bool useful = false;
            for (const Term& s : subterms_of(t)) useful = useful || sources[s.key] >= 2;
            if (!useful) {
                p.terms.push_back(t.term);
                continue;
            }
            ++expanded_;
            for (const Term& s : subterms_of(t)) p.terms.push_back(s);
        }
        p.build(polys_.size());
        return p;
    }

    /// Re-emits the ops with the plan's terms. Without expansion every op gives at most one op, so the
    /// ops are rewritten in place (no second vector of ops); an expansion can give more and builds one.
    void emit(const Plan& plan, bool expanded, PassResult& result) {
        std::vector<Op> out;
        if (expanded) out.reserve(c_.ops.size() + 8 * size_t(expanded_));
        size_t kept = 0;  // in place: ops written so far, always <= the op being read
        auto put = [&](Op&& op) {
            if (expanded) out.push_back(std::move(op));
            else {
                if (&op != &c_.ops[kept]) c_.ops[kept] = std::move(op);  // not an op kept where it is
                ++kept;
            }
        };
        Angle global = c_.global_phase;
        size_t next = 0;  // plan terms are in op order
        int64_t removed = 0;
        const uint32_t n = uint32_t(c_.ops.size());
        for (uint32_t i = 0; i < n; ++i) {
            if (next >= plan.terms.size() || plan.terms[next].op != i) {
                put(std::move(c_.ops[i]));
                continue;
            }
            const Op op = c_.ops[i];  // a copy: in place, position i may be overwritten below
            for (; next < plan.terms.size() && plan.terms[next].op == i; ++next) {
                const Term& t = plan.terms[next];
                const Group& g = plan.groups[plan.group_of[next]];
                if (g.size == 1 && t.subset == 0) {  // alone and not expanded: as it was
                    put(Op(op));
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
                    p.angle = a;
                    put(std::move(p));
                    continue;
                }
                Op p = op;
                p.angle = a;
                if (p.kind == OpKind::RZ) global += p.angle.divided_by(2);  // Phase(a) = e^{ia/2} RZ(a)
                put(std::move(p));
            }
        }
        result.count("terms-merged", removed);
        if (expanded) c_.ops = std::move(out);
        else c_.ops.erase(c_.ops.begin() + std::ptrdiff_t(kept), c_.ops.end());
        c_.global_phase = global;
    }

    ir::Circuit& c_;
    const FoldSettings& s_;
    SequenceTable monomials_;  ///< monomial id -> sorted variables (id 0: the constant 1)
    SequenceTable polys_;      ///< term key id -> sorted monomial ids
    std::vector<Poly> vals_;   ///< each wire's current value
    uint32_t next_var_ = 0;
    std::vector<OpTerm> real_;     ///< the terms of the circuit, in op order
    std::vector<Term> subterms_;   ///< parity expansions of the expandable AND terms
    int64_t expanded_ = 0;
    /// Scratch of times(): the monomial products of one polynomial product, back to back.
    struct Product {
        uint64_t hash;
        uint32_t off, len;
        bool odd;  ///< the first of its equals, met an odd number of times so far
    };
    std::vector<uint32_t> arena_;
    std::vector<Product> products_;
    std::vector<uint32_t> slot_stamp_, slot_product_;  ///< the pairing table; a slot is used when its stamp is stamp_
    uint32_t stamp_ = 0;
};

}  // namespace

bool fold_phase_terms(ir::Circuit& c, const FoldSettings& settings, PassResult& result) {
    return Folder(c, settings).run(result);
}

}  // namespace whittle::passes
