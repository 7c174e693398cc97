// Engine 2: X-type ops plus diagonal phases, exactly: per input (phase table) or as phase polynomials.
#include <array>
#include <numeric>
#include <random>

#include <fmt/format.h>

#include "verify/equiv_engines.h"
#include "verify/path_sum.h"

namespace whittle::passes::equiv {

bool in_phase_class(const ir::Op& op) {
    switch (op.kind) {
    case ir::OpKind::X:
    case ir::OpKind::Swap:
    case ir::OpKind::Barrier:
    case ir::OpKind::Phase:
    case ir::OpKind::Parity:
    case ir::OpKind::RZ:
    case ir::OpKind::Y: return !op.is_conditioned() && PathSum::supports(op);
    default: return false;
    }
}

namespace {

bool in_class(const ir::Circuit& c) {
    for (const ir::Op& op : c.ops)
        if (!in_phase_class(op)) return false;
    return true;
}

/// Common denominator D: every phase is an integer number of pi/D (0 when over 2^24).
int64_t common_denominator(const Aligned& al) {
    int64_t d = 2;
    auto take = [&](const ir::Angle& a) {
        d = std::lcm(d, a.den());
        if (d > (int64_t(1) << 24)) d = 0;
    };
    for (const ir::Circuit* c : {&al.a, &al.b})
        for (const ir::Op& op : c->ops) {
            if (d == 0) return int64_t(0);
            take(op.angle);
            take(op.angle.divided_by(2));
        }
    return d;
}

/// 64 basis inputs at once: wire words and, per lane, the phase in units of pi/D (mod 2D).
struct Lanes {
    std::vector<uint64_t> wires;
    std::array<int64_t, 64> phase{};
};

void run_lanes(const ir::Circuit& c, int64_t d, Lanes& s) {
    auto units = [&](const ir::Angle& a) { return a.num() * (d / a.den()) % (2 * d); };
    auto add = [&](uint64_t mask, int64_t u) {
        for (; mask; mask &= mask - 1) {
            int64_t& p = s.phase[size_t(__builtin_ctzll(mask))];
            p = (p + u) % (2 * d);
        }
    };
    for (const ir::Op& op : c.ops) {
        if (op.kind == ir::OpKind::Barrier) continue;
        uint64_t on = ~uint64_t(0);
        if (op.kind != ir::OpKind::Parity)
            for (ir::Lit l : op.controls) on &= l.positive() ? s.wires[l.wire()] : ~s.wires[l.wire()];
        switch (op.kind) {
        case ir::OpKind::X: s.wires[op.target] ^= on; break;
        case ir::OpKind::Swap: {
            const uint64_t diff = (s.wires[op.target] ^ s.wires[op.target2]) & on;
            s.wires[op.target] ^= diff;
            s.wires[op.target2] ^= diff;
            break;
        }
        case ir::OpKind::Phase: add(on, units(op.angle)); break;
        case ir::OpKind::Parity: {
            uint64_t parity = 0;
            for (ir::Lit l : op.controls) parity ^= s.wires[l.wire()];
            add(parity, units(op.angle));
            break;
        }
        case ir::OpKind::RZ:
            add(on, units(-op.angle.divided_by(2)));
            add(on & s.wires[op.target], units(op.angle));
            break;
        case ir::OpKind::Y:
            add(on, d / 2);
            add(on & s.wires[op.target], d);
            s.wires[op.target] ^= on;
            break;
        default: break;
        }
    }
}

std::vector<uint8_t> lane_bits(const std::vector<uint64_t>& words, int lane) {
    std::vector<uint8_t> bits(words.size());
    for (size_t w = 0; w < words.size(); ++w) bits[w] = (words[w] >> lane) & 1;
    return bits;
}

/// Runs batches of inputs through both circuits; `fill(batch, inputs)` sets the free wires.
template <class Fill>
EquivResult compare_lanes(const Aligned& al, int64_t d, uint64_t batches, uint64_t valid, Fill&& fill,
                          const Deadline& dl, const char* engine, bool* timed_out, uint64_t* done) {
    bool have_ref = false;
    int64_t ref = 0;
    std::vector<uint8_t> ref_input;
    for (uint64_t batch = 0; batch < batches; ++batch) {
        if ((batch & 63) == 63 && dl.expired()) {
            *timed_out = true;
            *done = batch;
            return inconclusive(engine, "time budget exhausted");
        }
        Lanes la, lb;
        la.wires.assign(al.num_wires(), 0);
        fill(batch, la.wires);
        lb.wires = la.wires;
        const std::vector<uint64_t> inputs = la.wires;
        run_lanes(al.a, d, la);
        run_lanes(al.b, d, lb);
        uint64_t diff = 0;
        for (size_t w = 0; w < la.wires.size(); ++w) diff |= la.wires[w] ^ lb.wires[w];
        diff &= valid;
        if (diff) {
            const int lane = __builtin_ctzll(diff);
            return not_equivalent(engine, "exact (an input maps to different basis states)",
                                  fmt::format("input {}: outputs differ ({}; first vs second circuit)",
                                              format_basis(al, lane_bits(inputs, lane)),
                                              format_difference(al, lane_bits(la.wires, lane), lane_bits(lb.wires, lane))));
        }
        for (int lane = 0; lane < 64; ++lane) {
            if (!((valid >> lane) & 1)) continue;
            const int64_t rel = ((la.phase[size_t(lane)] - lb.phase[size_t(lane)]) % (2 * d) + 2 * d) % (2 * d);
            if (!have_ref) {
                have_ref = true;
                ref = rel;
                ref_input = lane_bits(inputs, lane);
                continue;
            }
            if (rel == ref) continue;
            const ir::Angle delta = ir::Angle::pi_times(rel - ref, d);
            return not_equivalent(engine, "exact (relative phases differ)",
                                  fmt::format("input {} against input {}: the relative phase differs by {}",
                                              format_basis(al, lane_bits(inputs, lane)), format_basis(al, ref_input),
                                              delta.to_string()));
        }
    }
    *done = batches;
    return equivalent(engine, "");
}

EquivResult phase_table(const Aligned& al, int64_t d, const Deadline& dl) {
    static constexpr uint64_t kLanePattern[6] = {0xAAAAAAAAAAAAAAAAull, 0xCCCCCCCCCCCCCCCCull, 0xF0F0F0F0F0F0F0F0ull,
                                                 0xFF00FF00FF00FF00ull, 0xFFFF0000FFFF0000ull, 0xFFFFFFFF00000000ull};
    const uint32_t k = uint32_t(al.free.size());
    const uint64_t batches = k <= 6 ? 1 : uint64_t(1) << (k - 6);
    const uint64_t valid = k >= 6 ? ~uint64_t(0) : (uint64_t(1) << (uint64_t(1) << k)) - 1;
    auto fill = [&](uint64_t batch, std::vector<uint64_t>& in) {
        for (uint32_t i = 0; i < k; ++i)
            in[al.free[i]] = i < 6 ? kLanePattern[i] : ((batch >> (i - 6)) & 1 ? ~uint64_t(0) : 0);
    };
    bool timed_out = false;
    uint64_t done = 0;
    EquivResult r = compare_lanes(al, d, batches, valid, fill, dl, name::kPhaseTable, &timed_out, &done);
    if (r.verdict == Verdict::Equivalent)
        r.confidence = fmt::format("exact (permutation and phase of all 2^{} inputs, exact angles)", k);
    return r;
}

EquivResult phase_sample(const Aligned& al, int64_t d, const EquivOptions& opts, const Deadline& dl,
                         const std::string& why) {
    std::mt19937_64 rng(opts.seed);
    auto fill = [&](uint64_t, std::vector<uint64_t>& in) {
        for (uint32_t w : al.free) in[w] = rng();
    };
    bool timed_out = false;
    uint64_t done = 0;
    EquivResult r = compare_lanes(al, d, 4096, ~uint64_t(0), fill, dl, name::kSampling, &timed_out, &done);
    if (r.verdict == Verdict::NotEquivalent) return r;
    const std::string conf = fmt::format("probabilistic ({} random inputs agree in permutation and phase; {})",
                                         done * 64, why);
    if (!opts.allow_probabilistic) return inconclusive(name::kSampling, conf + "; probabilistic answers not allowed");
    return equivalent(name::kSampling, conf);
}

EquivResult phase_polynomial(const Aligned& al) {
    PathSum pa(al.num_wires(), al.clean, false), pb(al.num_wires(), al.clean, false);
    for (const ir::Op& op : al.a.ops) pa.apply(op);
    for (const ir::Op& op : al.b.ops) pb.apply(op);
    auto outputs_at = [&](const PathSum& p, const std::vector<uint8_t>& in) {
        std::vector<uint8_t> out(al.num_wires());
        for (uint32_t w = 0; w < al.num_wires(); ++w) out[w] = p.outputs()[w].eval([&](Var v) { return in[v] != 0; });
        return out;
    };
    for (uint32_t w = 0; w < al.num_wires(); ++w) {
        if (pa.outputs()[w] == pb.outputs()[w]) continue;
        std::vector<uint8_t> in(al.num_wires(), 0);
        const Anf diff = pa.outputs()[w] ^ pb.outputs()[w];
        for (Var v : diff.minimal_monomial()) in[v] = 1;
        return not_equivalent(name::kPhasePoly, fmt::format("exact (output {} has different polynomials)", al.a.wire_name(w)),
                              fmt::format("input {}: outputs differ ({}; first vs second circuit)", format_basis(al, in),
                                          format_difference(al, outputs_at(pa, in), outputs_at(pb, in))));
    }
    PhasePoly diff = pa.phase();
    diff.subtract(pb.phase());
    if (!diff.exact()) return inconclusive(name::kPhasePoly, "an angle lost exactness");
    const Monomial* least = nullptr;
    for (const auto& [m, c] : diff.terms())
        if (!m.empty() && (!least || m.size() < least->size())) least = &m;
    if (least) {
        // No other non-constant monomial of the difference lies inside `least`, so the phase at
        // 1_least minus the phase at 0 is exactly its coefficient.
        std::vector<uint8_t> in(al.num_wires(), 0), zero(al.num_wires(), 0);
        for (Var v : *least) in[v] = 1;
        return not_equivalent(name::kPhasePoly, "exact (the phase polynomials differ beyond a constant)",
                              fmt::format("input {} against input {}: the relative phase differs by {}",
                                          format_basis(al, in), format_basis(al, zero),
                                          diff.terms().at(*least).to_string()));
    }
    return equivalent(name::kPhasePoly,
                      fmt::format("exact (outputs and phase polynomials over {} inputs equal up to a constant)",
                                  al.free.size()));
}

}  // namespace

EngineResult check_phase(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    if (!in_class(al.a) || !in_class(al.b)) return std::nullopt;
    const int64_t d = common_denominator(al);
    const uint32_t k = uint32_t(al.free.size());
    const size_t ops = al.a.ops.size() + al.b.ops.size() + 1;
    const bool cheap_table = d != 0 && (k <= 6 || (k <= 30 && (uint64_t(1) << (k - 6)) * ops <= (uint64_t(1) << 22)));
    if (cheap_table) return phase_table(al, d, dl);
    try {
        return phase_polynomial(al);
    } catch (const AnfOverflow&) {
        if (d != 0 && k <= kBitParallelInputs) return phase_table(al, d, dl);
        if (d != 0) return phase_sample(al, d, opts, dl, "polynomials over their size cap");
        return inconclusive(name::kPhasePoly, "polynomials over their size cap and angles without a small common denominator");
    }
}

}  // namespace whittle::passes::equiv
