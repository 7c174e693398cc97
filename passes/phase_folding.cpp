// Phase folding over Boolean polynomials: simulate polynomials, collect terms, group by polynomial, re-emit.
#include "passes/phase_folding.h"

#include <algorithm>
#include <array>
#include <bit>
#include <limits>
#include <span>

#include <boost/container/small_vector.hpp>

#include "ir/error.h"
#include "ir/op_prefix_release.h"
#include "passes/sequence_table.h"

namespace whittle::passes {

using ir::Angle;
using ir::Lit;
using ir::Op;
using ir::OpKind;

namespace {

constexpr uint32_t kNone = 0xffffffffu;
/// Term::key of a term whose key no other term has (the census proved it): alone in every plan.
constexpr uint32_t kLoneKey = 0xffffffffu;

/// A Boolean polynomial as the sorted ids of its monomials in a SequenceTable. Monomial id 0 is the
/// empty monomial (the constant 1), so a polynomial with a constant starts with 0. Wire values are
/// kept in this form (small, mostly without heap) and only term polynomials are interned.
using Poly = boost::container::small_vector<uint32_t, 4>;

/// a xor b: the symmetric difference of the sorted monomial ids, into `out`.
void poly_xor(const Poly& a, const Poly& b, Poly& out) {
    out.clear();
    out.reserve(a.size() + b.size());
    std::set_symmetric_difference(a.begin(), a.end(), b.begin(), b.end(), std::back_inserter(out));
}

Poly poly_xor(const Poly& a, const Poly& b) {
    Poly r;
    poly_xor(a, b, r);
    return r;
}

bool has_constant(const Poly& f) { return !f.empty() && f.front() == 0; }

/// f ^ 1: the constant monomial (id 0, first when present) comes or goes.
void toggle_constant(Poly& f) {
    if (has_constant(f)) f.erase(f.begin());
    else f.insert(f.begin(), 0u);
}

/// The constant part of a term, e^{i extra}, as a function of its angle alpha (see Term::extra).
enum Extra : uint8_t {
    kNoExtra = 0,
    kMinusHalf = 1,  ///< -alpha / 2: an RZ(alpha) = e^{-i alpha/2} Phase(alpha)
    kMinus = 2,      ///< -alpha: a parity over an odd number of negative literals (alpha = -phi)
};

/// e^{i (alpha * f + extra)} with f = key ^ constant, located at op `op` (subset 0: the op itself;
/// otherwise the parity over the op's literals in that bit mask). `key` is an interned polynomial.
/// 32 bytes: there is one per phase op of the circuit.
struct Term {
    uint32_t op = 0;
    uint32_t key = 0;
    /// An expandable AND term: its 2^literals - 1 parity terms start here in the engine's subterms_.
    uint32_t sub_first = kNone;
    uint16_t literals = 1;  ///< k of the AND term (1 for parities and one-wire phases)
    uint8_t subset = 0;
    bool constant : 1 = false;
    uint8_t extra : 2 = kNoExtra;  ///< an Extra: the constant phase follows from alpha
    Angle alpha;
    Angle effective() const { return constant ? -alpha : alpha; }  ///< coefficient of key
    Angle extra_angle() const {
        if (extra == kMinusHalf) return -alpha.divided_by(2);
        return extra == kMinus ? -alpha : Angle();
    }
    Angle global_part() const { return extra_angle() + (constant ? alpha : Angle()); }
    uint32_t sub_count() const { return sub_first == kNone ? 0 : (1u << literals) - 1; }
};

struct Group {
    uint32_t first = 0;  ///< index into the plan's term list
    uint32_t size = 0;
    Angle total;         ///< coefficient of the key
};

struct Plan {
    Plan() = default;
    Plan(Plan&&) = default;  // moving keeps `own`'s buffer, so `terms` stays valid
    Plan& operator=(Plan&&) = default;
    Plan(const Plan&) = delete;

    std::vector<Term> own;         ///< the terms of an expansion plan (a plain plan reads the engine's)
    std::span<const Term> terms;   ///< in op order
    std::vector<uint32_t> group_of;
    std::vector<Group> groups;
    bool merges = false;

    /// Groups the terms by key in order of first occurrence; `keys` is the number of interned keys
    /// (a term with kLoneKey is a group of its own).
    void build(uint32_t keys) {
        std::vector<uint32_t> group_of_key(keys, kNone);
        group_of.assign(terms.size(), 0);
        groups.reserve(terms.size());
        for (size_t i = 0; i < terms.size(); ++i) {
            uint32_t lone = kNone;
            uint32_t& gk = terms[i].key == kLoneKey ? lone : group_of_key[terms[i].key];
            if (gk == kNone) {
                gk = uint32_t(groups.size());
                groups.push_back(Group{uint32_t(i), 0, Angle()});
            }
            Group& g = groups[gk];
            g.total += terms[i].effective();
            if (++g.size > 1) merges = true;
            group_of[i] = gk;
        }
    }

    /// Non-Clifford cost: a group emitted as a k-literal AND term costs 2^k - 1 unless its angle
    /// divided by 2^{k-1} is a multiple of pi/2 (its parity expansion then is Clifford).
    /// Products of more than 40 literals are priced as 40: 2^40 - 1 already outweighs any plan that
    /// could compete, and the shifts stay defined (a term may have up to 65535 literals).
    int64_t cost() const {
        int64_t c = 0;
        for (const Group& g : groups) {
            const uint32_t k = std::min<uint32_t>(terms[g.first].literals, 40);
            if (!g.total.divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(2))
                c = std::min(c + ((int64_t(1) << k) - 1), std::numeric_limits<int64_t>::max() / 2);
        }
        return c;
    }
};

class Folder {
public:
    Folder(ir::Circuit& c, const FoldSettings& s) : c_(c), s_(s) {}

    /// One round: reads the circuit, chooses a plan and, when it changes anything, re-emits the ops.
    bool run(PassResult& result) {
        collect();
        bool expanded = false;
        Plan chosen = choose(expanded);
        if (!chosen.merges && !expanded) return false;
        emit(chosen, expanded, result);
        if (expanded) result.count("products-expanded", expanded_);
        else last_plain_ = std::move(chosen);
        last_expanded_ = expanded;
        return true;
    }

    /// After a round that changed the circuit: whether the next round would change it again. After
    /// an expansion that takes a real round (the new parities change the terms). Otherwise the next
    /// round would read the same wire values (only phase terms changed) and so the same terms, each
    /// group merged into its first term; that list is built from this round's and the choice made on
    /// it, without reading the circuit again. A merged AND term could change its expansion (the
    /// angle decides whether and how it expands): then this answers yes and the next round is real.
    bool next_round_changes() {
        if (last_expanded_) return true;
        const Plan& plan = last_plain_;
        std::vector<Term> next;
        next.reserve(real_.size());
        for (size_t i = 0; i < real_.size(); ++i) {
            const Group& g = plan.groups[plan.group_of[i]];
            if (g.size == 1) {  // emitted as it was
                next.push_back(real_[i]);
                continue;
            }
            if (g.first != i) continue;  // merged into the first
            Term t = real_[i];
            if (t.literals >= 2) return true;
            t.alpha = t.constant ? -g.total : g.total;  // as emit writes it
            if (t.alpha.is_zero()) continue;
            next.push_back(t);
        }
        last_plain_ = Plan();  // it reads real_
        real_ = std::move(next);
        bool expanded = false;
        const Plan p = choose(expanded);
        return p.merges || expanded;
    }

private:
    /// The plan of this round: every term as read, or the expansion plan when it costs less.
    Plan choose(bool& expanded) {
        Plan plain;
        plain.terms = real_;
        plain.build(polys_.size());
        expanded = false;
        if (s_.expand_products && !subterms_.empty()) {
            Plan wide = expansion_plan();
            if (wide.cost() < plain.cost()) {
                expanded = true;
                return wide;
            }
        }
        return plain;
    }

    Poly literal(Lit l) const {
        Poly f = vals_[l.wire()];
        if (!l.positive()) toggle_constant(f);
        return f;
    }

    /// The number of monomials of literal(l), without forming it.
    size_t literal_size(Lit l) const {
        const Poly& f = vals_[l.wire()];
        return l.positive() ? f.size() : has_constant(f) ? f.size() - 1 : f.size() + 1;
    }

    /// The monomial of a new variable v. One-variable monomials are not in the table's index: each
    /// is made once, and a product that comes out as one variable finds it in var_monomial_.
    uint32_t var_monomial(uint32_t v) {
        if (v < var_monomial_.size()) return var_monomial_[v];  // made by the census, the same variable
        WHITTLE_ASSERT(v == var_monomial_.size() && "variables are made in order");
        const uint32_t one[1] = {v};
        var_monomial_.push_back(monomials_.add_unindexed(one));
        return var_monomial_.back();
    }

    void fresh(uint32_t w) { vals_[w] = Poly{var_monomial(next_var_++)}; }

    /// The product a * b, or false when it would pass `cap` monomials (the size cap that keeps folding
    /// linear). Same result and same refusals as the equivalence checker's Anf product (anf.h) under the same cap. The monomial
    /// products are formed in a scratch arena and paired off there (x ^ x = 0); only a product that
    /// passes the cap is interned, so refused products (most of the large ones) leave no trace.
    bool times(const Poly& a, const Poly& b, size_t cap, Poly& out) {
        if (a.size() * b.size() > cap * cap) return false;
        out.clear();
        if (a.empty() || b.empty()) return true;
        // Most products over the cap are refused; the bound refuses them before forming them.
        if (a.size() * b.size() > cap && surviving_lower_bound(a, b) > cap) return false;
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
            if (p.odd && p.len != 1) monomials_.prefetch(p.hash);
        for (const Product& p : products_) {
            if (!p.odd) continue;
            if (p.len == 1) out.push_back(var_monomial_[arena_[p.off]]);
            else out.push_back(monomials_.intern(vars(p), p.hash));
        }
        std::sort(out.begin(), out.end());
        return true;
    }

    /// A lower bound on the monomials of a * b (a xor-sum of the monomial products) that survive
    /// the pairing off: the products m * n of a monomial m of a and n of b that both avoid every
    /// variable a and b share are pairwise distinct (m is (m * n) restricted to a's own variables,
    /// n likewise) and unlike every other product (those hold a shared variable), so none cancels.
    size_t surviving_lower_bound(const Poly& a, const Poly& b) {
        if (var_mark_.size() < next_var_) var_mark_.resize(size_t(next_var_) + next_var_ / 2, 0);
        if (mark_ >= 0xfffffffcu) {  // about to wrap: clear the marks once
            std::fill(var_mark_.begin(), var_mark_.end(), 0);
            mark_ = 0;
        }
        mark_ += 2;
        const uint32_t in_a = mark_, shared = mark_ + 1;  // a variable's mark this call
        for (uint32_t m : a)
            for (uint32_t v : monomials_[m]) var_mark_[v] = in_a;
        for (uint32_t m : b)
            for (uint32_t v : monomials_[m])
                if (var_mark_[v] == in_a) var_mark_[v] = shared;
        auto own = [&](const Poly& f) {
            size_t n = 0;
            for (uint32_t m : f) {
                const std::span<const uint32_t> vars = monomials_[m];
                n += std::none_of(vars.begin(), vars.end(), [&](uint32_t v) { return var_mark_[v] == shared; });
            }
            return n;
        };
        return own(a) * own(b);
    }

    /// The product of the op's literals, or false over the cap. (1 * f = f: the first literal is
    /// the start, so one-literal products form nothing.)
    bool product(const Op& op, Poly& prod) {
        if (op.controls.empty()) {
            prod.assign(1, 0);
            return true;
        }
        if (literal_size(op.controls[0]) > s_.max_terms) return false;
        prod = literal(op.controls[0]);
        Poly next;
        for (size_t j = 1; j < op.controls.size(); ++j) {
            if (!times(prod, literal(op.controls[j]), s_.max_terms, next)) return false;
            prod.swap(next);
        }
        return true;
    }

    /// The term e^{i alpha f} with f = `f` ^ `negate` (kept as an interned key and a constant), to be
    /// stored at `where` (an index of real_, or kSub | an index of subterms_), where its key is set
    /// when its batch is interned.
    Term make_term(uint32_t where, uint32_t op, uint32_t subset, const Poly& f, bool negate, Angle alpha,
                   Extra extra, uint32_t literals) {
        Term t;
        t.op = op;
        t.subset = uint8_t(subset);
        const bool c = has_constant(f);
        t.constant = c != negate;
        const std::span<const uint32_t> key = key_of(f);
        const uint64_t h = SequenceTable::hash(key);
        if (may_be_shared(h)) queue_key(where, key, h);
        else t.key = kLoneKey;
        t.alpha = alpha;
        t.extra = extra;
        t.literals = uint16_t(literals);
        return t;
    }

    /// The term of op `op` (see make_term); `expandable` when its parity terms follow (expand).
    void add_term(uint32_t op, const Poly& f, bool negate, Angle alpha, Extra extra, uint32_t literals,
                  bool expandable) {
        if (census_) {
            count_key(key_of(f));
            return;
        }
        const Term t = make_term(uint32_t(real_.size()), op, 0, f, negate, alpha, extra, literals);
        // A lone key that cannot expand is a group of one in every plan, which emits its op as it
        // is: such terms (most of a large circuit's) are not stored.
        if (t.key == kLoneKey && !expandable) return;
        real_.push_back(t);
        stored();
    }

    /// A term's key: its polynomial without the constant monomial (id 0, first when present).
    static std::span<const uint32_t> key_of(const Poly& f) {
        const std::span<const uint32_t> key(f.data(), f.size());
        return has_constant(f) ? key.subspan(1) : key;
    }

    /// The census: a first reading of the circuit that only marks each term key's hash as seen,
    /// and as shared when it was seen before. A key whose mark is not shared belongs to one term
    /// only (equal keys have equal hashes), so the real reading neither interns nor stores it: at
    /// 10^7 ops most keys are lone, and interning them all was most of the engine's memory. Two
    /// keys whose hashes share a mark only cost an interning; the result is exact. Marks are set
    /// in batches with their words prefetched (the order of marking does not matter).
    void count_key(std::span<const uint32_t> key) {
        const uint64_t h = SequenceTable::hash(key);
        __builtin_prefetch(marks_.data() + 2 * (mark_of(h) >> 6), 1);
        census_batch_[census_batched_++] = h;
        if (census_batched_ == kKeyBatch) mark_batch();
    }
    void mark_batch() {
        for (size_t k = 0; k < census_batched_; ++k) {
            const size_t bit = mark_of(census_batch_[k]);
            uint64_t* words = marks_.data() + 2 * (bit >> 6);  // seen, then shared
            const uint64_t m = uint64_t(1) << (bit & 63);
            if (words[0] & m) words[1] |= m;
            words[0] |= m;
        }
        census_batched_ = 0;
    }
    size_t mark_of(uint64_t h) const { return size_t(h >> mark_shift_); }
    bool may_be_shared(uint64_t h) const {
        if (marks_.empty()) return true;  // no census: every key is interned
        const size_t bit = mark_of(h);
        return (marks_[2 * (bit >> 6) + 1] >> (bit & 63)) & 1;
    }

    /// Term keys wait in a small batch before they are interned: each key's index slot is prefetched
    /// when it is queued, so the cache misses of a batch (about one per key once the table outgrows
    /// the caches) overlap instead of following one another.
    void queue_key(uint32_t where, std::span<const uint32_t> key, uint64_t h) {
        polys_.prefetch(h);
        pending_.push_back(PendingKey{where, uint32_t(pending_words_.size()), uint32_t(key.size()), h});
        pending_words_.insert(pending_words_.end(), key.begin(), key.end());
    }

    /// After a term is stored: interns a full batch.
    void stored() {
        if (pending_.size() >= kKeyBatch) intern_pending();
    }

    void intern_pending() {
        for (const PendingKey& p : pending_) {
            const uint32_t id = polys_.intern({pending_words_.data() + p.off, p.len}, p.hash);
            (p.where & kSub ? subterms_[p.where & ~kSub] : real_[p.where]).key = id;
        }
        pending_.clear();
        pending_words_.clear();
    }

    /// Reads the circuit twice on a large circuit: the census (see count_key), then the reading
    /// that makes the terms. Both see the same wire values (the census made the monomials and
    /// variables the second one finds again).
    void collect() {
        if (c_.ops.size() < s_.census_from_ops) {
            real_.reserve(c_.ops.size());  // an upper bound: pages past the terms are never touched
            simulate();
            intern_pending();
            return;
        }
        // Eight mark bits per op: a lone key shares its mark with another key about 1 time in 16
        // (there are at most about half as many keys as ops).
        size_t bits = 64;
        while (bits < 8 * c_.ops.size()) bits *= 2;
        mark_shift_ = unsigned(64 - std::countr_zero(bits));
        marks_.assign(2 * (bits / 64), 0);
        census_ = true;
        simulate();
        mark_batch();
        census_ = false;
        real_.reserve(c_.ops.size());  // an upper bound: pages past the terms are never touched
        simulate();
        intern_pending();
        std::vector<uint64_t>().swap(marks_);
    }

    void simulate() {
        const uint32_t n = c_.num_qubits();
        vals_.assign(n, Poly());
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
            // target ^= product; the new value is formed in scratch_ and swapped in, so the old
            // value's storage is the next scratch (no allocation per op).
            if (op.controls.size() == 1) {  // a CNOT: the product is the literal itself
                const Lit l = op.controls[0];
                if (literal_size(l) > s_.max_terms) {
                    fresh(op.target);
                    return;
                }
                poly_xor(vals_[op.target], vals_[l.wire()], scratch_);
                if (!l.positive()) toggle_constant(scratch_);
            } else {
                if (!product(op, prod_)) {
                    fresh(op.target);
                    return;
                }
                poly_xor(vals_[op.target], prod_, scratch_);
            }
            if (scratch_.size() > s_.max_terms) fresh(op.target);
            else vals_[op.target].swap(scratch_);
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
            const uint32_t k = uint32_t(op.controls.size());
            if (k > 0xffff) return;  // not a term (its cost 2^k - 1 would not fit either)
            if (k == 1) {  // the literal itself, read in place
                const Lit l = op.controls[0];
                if (literal_size(l) > s_.max_terms) return;
                add_term(i, vals_[l.wire()], !l.positive(), op.angle, kNoExtra, 1, false);
                return;
            }
            if (!product(op, prod_)) return;  // too big to compare: not a term
            // Expand only when the parity terms stay Clifford+T (angle / 2^{k-1} a multiple of pi/4:
            // CS, CZ, CCZ): finer parities would need rotation synthesis where the product lowers
            // exactly through Toffolis.
            const bool expandable = s_.expand_products && k >= 2 && k <= s_.max_expand_literals &&
                                    op.angle.divided_by(int64_t(1) << (k - 1)).is_multiple_of_pi_over(4);
            add_term(i, prod_, false, op.angle, kNoExtra, k, expandable);
            if (expandable) expand(i, op);
            return;
        }
        case OpKind::Parity: {
            if (op.pair != 0) return;
            Poly sum;
            for (Lit l : op.controls) sum = poly_xor(sum, vals_[l.wire()]);
            add_term(i, sum, false, op.angle, kNoExtra, 1, false);
            return;
        }
        case OpKind::RZ:
            if (op.pair != 0 || !op.controls.empty()) return;
            // RZ(t) = e^{-it/2} Phase(t) with the stored angle t.
            add_term(i, vals_[op.target], false, op.angle, kMinusHalf, 1, false);
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
        if (!census_) real_.back().sub_first = uint32_t(subterms_.size());
        for (uint32_t mask = 1; mask < (1u << k); ++mask) {
            Poly sum;
            int size = 0, negs = 0;
            for (uint32_t b = 0; b < k; ++b)
                if (mask >> b & 1) {
                    sum = poly_xor(sum, vals_[op.controls[b].wire()]);
                    ++size;
                    if (!op.controls[b].positive()) ++negs;
                }
            if (census_) {
                count_key(key_of(sum));
                continue;
            }
            const Angle phi = size % 2 == 1 ? base : -base;
            // e^{i phi (1 ^ P)} = e^{i phi} e^{-i phi P}: angle -phi, constant part phi (exact, so
            // -(-phi) gives phi back)
            const uint32_t where = kSub | uint32_t(subterms_.size());
            if (negs % 2 == 1) subterms_.push_back(make_term(where, i, mask, sum, false, -phi, kMinus, 1));
            else subterms_.push_back(make_term(where, i, mask, sum, false, phi, kNoExtra, 1));
            stored();
        }
    }

    std::span<const Term> subterms_of(const Term& t) const {
        if (t.sub_first == kNone) return {};
        return {subterms_.data() + t.sub_first, t.sub_count()};
    }

    /// Expands the products some of whose parities occur elsewhere (another term, or another
    /// product's expansion).
    Plan expansion_plan() {
        expanded_ = 0;
        std::vector<uint32_t> sources(polys_.size(), 0);
        for (const Term& t : real_) {
            if (t.sub_first == kNone) {
                if (t.key != kLoneKey) ++sources[t.key];
                continue;
            }
            const std::span<const Term> subs = subterms_of(t);
            for (size_t j = 0; j < subs.size(); ++j) {  // each distinct key of the expansion once
                if (subs[j].key == kLoneKey) continue;  // its only source is here
                bool seen = false;
                for (size_t e = 0; e < j && !seen; ++e) seen = subs[e].key == subs[j].key;
                if (!seen) ++sources[subs[j].key];
            }
        }
        Plan p;
        p.own.reserve(real_.size());
        for (const Term& t : real_) {
            bool useful = false;
            for (const Term& s : subterms_of(t)) useful = useful || (s.key != kLoneKey && sources[s.key] >= 2);
            if (!useful) {
                p.own.push_back(t);
                continue;
            }
            ++expanded_;
            for (const Term& s : subterms_of(t)) p.own.push_back(s);
        }
        p.terms = p.own;
        p.build(polys_.size());
        return p;
    }

    /// emit() for an op that carries exactly one term of the plan.
    template <class Put>
    static void rewrite_in_place(const Plan& plan, size_t index, Op& op, Angle& global, int64_t& removed, Put& put) {
        const Term& t = plan.terms[index];
        const Group& g = plan.groups[plan.group_of[index]];
        if (g.size == 1 && t.subset == 0) {  // alone and not expanded: as it was
            put(std::move(op));
            return;
        }
        global += t.global_part();
        const Angle a = t.constant ? -g.total : g.total;
        if (g.first != index || a.is_zero()) {  // merged into the first, or the group sums to 0
            if (g.first == index && t.constant) global += g.total;
            ++removed;
            return;
        }
        WHITTLE_ASSERT(t.subset == 0 && "a one-term op is the term of the op itself");
        if (t.constant) global += g.total;
        op.angle = a;
        if (op.kind == OpKind::RZ) global += a.divided_by(2);  // Phase(a) = e^{ia/2} RZ(a)
        put(std::move(op));
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
        // Building a new list: the input's pages are handed back behind the reading position.
        ir::OpPrefixReleaser release(c_.ops);
        for (uint32_t i = 0; i < n; ++i) {
            if (expanded && i > 0) {
                c_.ops[i - 1] = Op();  // moved out, or a merged-away op that may still own literals
                release.consumed(i);
            }
            if (next >= plan.terms.size() || plan.terms[next].op != i) {
                put(std::move(c_.ops[i]));
                continue;
            }
            if (next + 1 == plan.terms.size() || plan.terms[next + 1].op != i) {  // one term: no copy
                rewrite_in_place(plan, next++, c_.ops[i], global, removed, put);
                continue;
            }
            const Op op = std::move(c_.ops[i]);  // taken out: in place, position i may be overwritten below
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
    Poly scratch_, prod_;      ///< step()'s scratch values (kept to reuse their storage)
    uint32_t next_var_ = 0;
    std::vector<Term> real_;       ///< the terms of the circuit, in op order
    std::vector<Term> subterms_;   ///< parity expansions of the expandable AND terms
    int64_t expanded_ = 0;
    Plan last_plain_;             ///< the plan run() emitted, when it expanded nothing
    bool last_expanded_ = false;
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
    std::vector<uint32_t> var_mark_;  ///< surviving_lower_bound's marks per variable
    std::vector<uint32_t> var_monomial_;  ///< variable -> its one-variable monomial
    static constexpr size_t kKeyBatch = 32;
    static constexpr uint32_t kSub = 0x80000000u;  ///< PendingKey::where of a subterm
    struct PendingKey {
        uint32_t where;  ///< index into real_, or kSub | index into subterms_
        uint32_t off, len;
        uint64_t hash;
    };
    std::vector<PendingKey> pending_;
    std::vector<uint32_t> pending_words_;
    uint32_t mark_ = 0;
    bool census_ = false;          ///< collect()'s first reading: keys are only counted
    /// The census's marks, per 64 marks two words: some key has the mark (seen), some two keys
    /// have it (shared; a key whose mark is not shared is lone). Empty when no census was taken.
    std::vector<uint64_t> marks_;
    unsigned mark_shift_ = 64;     ///< a key's mark is the top bits of its hash
    std::array<uint64_t, kKeyBatch> census_batch_{};  ///< hashes waiting to be marked
    size_t census_batched_ = 0;
};

}  // namespace

bool fold_phase_terms(ir::Circuit& c, const FoldSettings& settings, PassResult& result) {
    WHITTLE_ASSERT(settings.max_expand_literals <= 8 && "a term's subset is a byte");
    bool changed = false;
    for (size_t round = 0; round < settings.rounds; ++round) {
        Folder folder(c, settings);
        if (!folder.run(result)) break;
        changed = true;
        if (round + 1 < settings.rounds && !folder.next_round_changes()) break;
    }
    return changed;
}

}  // namespace whittle::passes
