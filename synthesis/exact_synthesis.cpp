// Exact Clifford+T synthesis of D[omega] unitaries: KMM denominator reduction plus a normal-form table.
#include "synthesis/exact_synthesis.h"

#include <algorithm>
#include <unordered_map>

#include "ir/error.h"

namespace whittle::lowering {

const char* clifford_t_gate_name(CliffordTGate g) {
    switch (g) {
    case CliffordTGate::H: return "h";
    case CliffordTGate::S: return "s";
    case CliffordTGate::Sdg: return "sdg";
    case CliffordTGate::T: return "t";
    case CliffordTGate::Tdg: return "tdg";
    case CliffordTGate::X: return "x";
    case CliffordTGate::Y: return "y";
    case CliffordTGate::Z: return "z";
    }
    return "?";
}

int t_count(const std::vector<CliffordTGate>& gates) {
    return static_cast<int>(std::count_if(gates.begin(), gates.end(), [](CliffordTGate g) {
        return g == CliffordTGate::T || g == CliffordTGate::Tdg;
    }));
}

DOmegaMatrix DOmegaMatrix::identity() {
    DOmegaMatrix u;
    u.m[0][0] = 1;
    u.m[1][1] = 1;
    return u;
}

DOmegaMatrix DOmegaMatrix::of_gate(CliffordTGate g) {
    DOmegaMatrix u;
    auto diag = [&](int eighths) {
        u.m[0][0] = 1;
        u.m[1][1] = ZOmega::omega_pow(eighths);
    };
    switch (g) {
    case CliffordTGate::H:
        u.m[0][0] = 1, u.m[0][1] = 1, u.m[1][0] = 1, u.m[1][1] = -1;
        u.k = 1;
        break;
    case CliffordTGate::S: diag(2); break;
    case CliffordTGate::Sdg: diag(6); break;
    case CliffordTGate::T: diag(1); break;
    case CliffordTGate::Tdg: diag(7); break;
    case CliffordTGate::X: u.m[0][1] = 1, u.m[1][0] = 1; break;
    case CliffordTGate::Y: u.m[0][1] = ZOmega::omega_pow(6), u.m[1][0] = ZOmega::omega_pow(2); break;
    case CliffordTGate::Z: diag(4); break;
    }
    return u;
}

DOmegaMatrix DOmegaMatrix::operator*(const DOmegaMatrix& o) const {
    DOmegaMatrix r;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) r.m[i][j] = m[i][0] * o.m[0][j] + m[i][1] * o.m[1][j];
    r.k = k + o.k;
    r.reduce();
    return r;
}

DOmegaMatrix DOmegaMatrix::times_omega_pow(int n) const {
    DOmegaMatrix r = *this;
    for (auto& row : r.m)
        for (auto& e : row) e = e.times_omega_pow(n);
    return r;
}

void DOmegaMatrix::reduce() {
    auto all = [&](auto pred) {
        for (auto& row : m)
            for (auto& e : row)
                if (!pred(e)) return false;
        return true;
    };
    if (all([](const ZOmega& e) { return e.is_zero(); })) return;
    while (all([](const ZOmega& e) { return e.divisible_by_sqrt2(); })) {
        for (auto& row : m)
            for (auto& e : row) e = e.divided_by_sqrt2();
        --k;
    }
}

bool DOmegaMatrix::is_unitary() const {
    if (k < 0) return false;
    BigInt scale = BigInt(1) << k;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) {
            ZOmega s = m[0][i].conj() * m[0][j] + m[1][i].conj() * m[1][j];
            if (s != ZOmega(i == j ? scale : BigInt(0), 0, 0, 0)) return false;
        }
    return true;
}

bool DOmegaMatrix::operator==(const DOmegaMatrix& o) const {
    DOmegaMatrix a = *this, b = o;
    a.reduce();
    b.reduce();
    if (a.k != b.k) return false;
    for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j)
            if (a.m[i][j] != b.m[i][j]) return false;
    return true;
}

std::string DOmegaMatrix::to_string() const {
    return "1/sqrt2^" + std::to_string(k) + " [" + m[0][0].to_string() + " " + m[0][1].to_string() + "; " +
           m[1][0].to_string() + " " + m[1][1].to_string() + "]";
}

DOmegaMatrix matrix_of(const std::vector<CliffordTGate>& gates, int phase_eighths) {
    DOmegaMatrix u = DOmegaMatrix::identity().times_omega_pow(phase_eighths);
    for (CliffordTGate g : gates) u = DOmegaMatrix::of_gate(g) * u;
    return u;
}

namespace {

using Word = std::vector<CliffordTGate>;

// The smallest denominator exponent of |u00|^2 as an element of Z[1/sqrt2].
int sde_abs2_top_left(const DOmegaMatrix& u) {
    if (u.m[0][0].is_zero()) return 0;
    return 2 * u.k - sqrt2_valuation(u.m[0][0].norm_sqrt2());
}

// H T^j U, reduced.
DOmegaMatrix h_t_pow_times(const DOmegaMatrix& u, int j) {
    DOmegaMatrix r;
    for (int col = 0; col < 2; ++col) {
        ZOmega lower = u.m[1][col].times_omega_pow(j);
        r.m[0][col] = u.m[0][col] + lower;
        r.m[1][col] = u.m[0][col] - lower;
    }
    r.k = u.k + 1;
    r.reduce();
    return r;
}

// A key equal for matrices that differ by a power of omega, and the power that maps u to the
// representative: representative = omega^phase * u.
struct PhaseFreeKey {
    std::string key;
    int phase = 0;
};

std::string serialize(const DOmegaMatrix& u) {
    std::string s = std::to_string(u.k);
    for (auto& row : u.m)
        for (auto& e : row)
            for (auto& c : e.c) {
                s += ',';
                s += c.str();
            }
    return s;
}

PhaseFreeKey phase_free_key(DOmegaMatrix u) {
    u.reduce();
    PhaseFreeKey best{serialize(u), 0};
    for (int p = 1; p < 8; ++p) {
        std::string s = serialize(u.times_omega_pow(p));
        if (s < best.key) best = {std::move(s), p};
    }
    return best;
}

struct TableEntry {
    Word word;
    int phase = 0;  // phase_free_key(matrix_of(word)).phase
};

constexpr int kTableMaxTCount = 6;

// Every unitary of T-count <= kTableMaxTCount, up to phase, with a T-optimal word: the
// Matsumoto-Amano normal forms (T | e)(HT | SHT)^n C (Matsumoto & Amano 2008, arXiv:0806.3834;
// uniqueness and T-optimality of the form as recalled from that paper, memory).
class NormalFormTable {
public:
    NormalFormTable() {
        // The 24 Cliffords up to phase, by breadth-first search over short words.
        std::vector<std::pair<Word, DOmegaMatrix>> cliffords{{Word{}, DOmegaMatrix::identity()}};
        insert(Word{}, DOmegaMatrix::identity());
        const CliffordTGate gens[] = {CliffordTGate::H, CliffordTGate::S, CliffordTGate::Sdg,
                                      CliffordTGate::X, CliffordTGate::Y, CliffordTGate::Z};
        for (size_t i = 0; i < cliffords.size(); ++i)
            for (CliffordTGate g : gens) {
                Word w = cliffords[i].first;
                w.push_back(g);
                DOmegaMatrix u = DOmegaMatrix::of_gate(g) * cliffords[i].second;
                if (insert(w, u)) cliffords.emplace_back(std::move(w), std::move(u));
            }
        WHITTLE_ASSERT(cliffords.size() == 24 && "the one-qubit Clifford group has 24 elements up to phase");

        const DOmegaMatrix t = DOmegaMatrix::of_gate(CliffordTGate::T);
        const DOmegaMatrix ht = DOmegaMatrix::of_gate(CliffordTGate::H) * t;
        const DOmegaMatrix sht = DOmegaMatrix::of_gate(CliffordTGate::S) * ht;
        std::vector<std::pair<Word, DOmegaMatrix>> level = cliffords;  // (HT | SHT)^n C
        for (int n = 1; n <= kTableMaxTCount; ++n) {
            // T-count n: T (HT|SHT)^{n-1} C, then (HT|SHT)^n C.
            for (auto& [w, u] : level) {
                Word tw = w;
                tw.push_back(CliffordTGate::T);
                insert(tw, t * u);
            }
            std::vector<std::pair<Word, DOmegaMatrix>> next;
            for (auto& [w, u] : level) {
                Word a = w;
                a.insert(a.end(), {CliffordTGate::T, CliffordTGate::H});
                Word b = a;
                b.push_back(CliffordTGate::S);
                DOmegaMatrix ua = ht * u, ub = sht * u;
                insert(a, ua);
                insert(b, ub);
                next.emplace_back(std::move(a), std::move(ua));
                next.emplace_back(std::move(b), std::move(ub));
            }
            level = std::move(next);
        }
    }

    // The unitary u as omega^phase * matrix_of(word), if u has T-count <= kTableMaxTCount.
    const TableEntry* find(const DOmegaMatrix& u, int& phase) const {
        PhaseFreeKey key = phase_free_key(u);
        auto it = table_.find(key.key);
        if (it == table_.end()) return nullptr;
        phase = ((it->second.phase - key.phase) % 8 + 8) % 8;
        return &it->second;
    }

private:
    bool insert(const Word& w, const DOmegaMatrix& u) {
        PhaseFreeKey key = phase_free_key(u);
        return table_.emplace(std::move(key.key), TableEntry{w, key.phase}).second;
    }

    std::unordered_map<std::string, TableEntry> table_;
};

const NormalFormTable& normal_form_table() {
    static const NormalFormTable table;
    return table;
}

void append_t_inverse_pow(Word& w, int j) {
    switch (j) {
    case 0: return;
    case 1: w.push_back(CliffordTGate::Tdg); return;
    case 2: w.push_back(CliffordTGate::Sdg); return;
    case 3:  // T^-3 = Z T
        w.push_back(CliffordTGate::T);
        w.push_back(CliffordTGate::Z);
        return;
    }
    WHITTLE_ASSERT(false && "power of T out of range");
}

}  // namespace

ExactSynthesis synthesize_exact(const DOmegaMatrix& unitary) {
    WHITTLE_ASSERT(unitary.is_unitary() && "exact synthesis needs a unitary over D[omega]");
    DOmegaMatrix u = unitary;
    u.reduce();
    // KMM: while sde(|u00|^2) >= 4 some H T^j lowers it by one; prefer the Clifford steps (even j).
    std::vector<int> steps;
    for (int s = sde_abs2_top_left(u); s >= 4; s = sde_abs2_top_left(u)) {
        bool found = false;
        for (int j : {0, 2, 1, 3}) {
            DOmegaMatrix v = h_t_pow_times(u, j);
            if (sde_abs2_top_left(v) == s - 1) {
                steps.push_back(j);
                u = std::move(v);
                found = true;
                break;
            }
        }
        WHITTLE_ASSERT(found && "KMM reduction step must exist for sde >= 4");
    }
    int phase = 0;
    const TableEntry* rest = normal_form_table().find(u, phase);
    WHITTLE_ASSERT(rest && "a unitary with sde(|u00|^2) < 4 must be in the normal-form table");
    ExactSynthesis out;
    out.gates = rest->word;
    // unitary = T^-j0 H T^-j1 H ... T^-j(m-1) H rest, so in circuit order the last step comes first.
    for (size_t i = steps.size(); i-- > 0;) {
        out.gates.push_back(CliffordTGate::H);
        append_t_inverse_pow(out.gates, steps[i]);
    }
    out.global_phase_eighths = phase;
    out.t_count = t_count(out.gates);
    return out;
}

}  // namespace whittle::lowering
