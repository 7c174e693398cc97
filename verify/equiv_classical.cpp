// Engine 1: X-type circuits, by bit-parallel simulation of every input, ANF comparison, or sampling.
#include <random>

#include <fmt/format.h>

#include "ir/classical_sim.h"
#include "verify/anf.h"
#include "verify/equiv_engines.h"

namespace whittle::passes::equiv {
namespace {

/// Output bits of an X-type circuit for one basis input (one bit per wire).
std::vector<uint8_t> run_basis(const ir::Circuit& c, const std::vector<uint8_t>& in) {
    std::vector<uint64_t> words(c.num_qubits());
    for (uint32_t w = 0; w < c.num_qubits(); ++w) words[w] = in[w] ? ~uint64_t(0) : 0;
    ir::simulate_bits(c, words);
    std::vector<uint8_t> out(c.num_qubits());
    for (uint32_t w = 0; w < c.num_qubits(); ++w) out[w] = words[w] & 1;
    return out;
}

std::string describe(const Aligned& al, const std::vector<uint8_t>& in) {
    const std::vector<uint8_t> oa = run_basis(al.a, in), ob = run_basis(al.b, in);
    return fmt::format("input {}: outputs differ ({}; first vs second circuit)", format_basis(al, in),
                       format_difference(al, oa, ob));
}

/// Bit j of the words is input j of this batch; returns the lanes where the outputs differ.
uint64_t differing_lanes(const Aligned& al, const std::vector<uint64_t>& inputs, uint64_t valid) {
    std::vector<uint64_t> wa = inputs, wb = inputs;
    ir::simulate_bits(al.a, wa);
    ir::simulate_bits(al.b, wb);
    uint64_t diff = 0;
    for (size_t w = 0; w < wa.size(); ++w) diff |= wa[w] ^ wb[w];
    return diff & valid;
}

std::vector<uint8_t> lane_input(const std::vector<uint64_t>& inputs, int lane) {
    std::vector<uint8_t> in(inputs.size());
    for (size_t w = 0; w < inputs.size(); ++w) in[w] = (inputs[w] >> lane) & 1;
    return in;
}

EquivResult bit_parallel(const Aligned& al, const Deadline& dl) {
    static constexpr uint64_t kLanePattern[6] = {0xAAAAAAAAAAAAAAAAull, 0xCCCCCCCCCCCCCCCCull, 0xF0F0F0F0F0F0F0F0ull,
                                                 0xFF00FF00FF00FF00ull, 0xFFFF0000FFFF0000ull, 0xFFFFFFFF00000000ull};
    const uint32_t k = uint32_t(al.free.size());
    const uint64_t batches = k <= 6 ? 1 : uint64_t(1) << (k - 6);
    const uint64_t valid = k >= 6 ? ~uint64_t(0) : (uint64_t(1) << (uint64_t(1) << k)) - 1;
    std::vector<uint64_t> inputs(al.num_wires(), 0);
    for (uint64_t batch = 0; batch < batches; ++batch) {
        if ((batch & 255) == 255 && dl.expired())
            return inconclusive(name::kBitParallel, fmt::format("time budget exhausted after {} of 2^{} inputs",
                                                                batch * 64, k));
        for (uint32_t i = 0; i < k; ++i)
            inputs[al.free[i]] = i < 6 ? kLanePattern[i] : ((batch >> (i - 6)) & 1 ? ~uint64_t(0) : 0);
        if (uint64_t diff = differing_lanes(al, inputs, valid))
            return not_equivalent(name::kBitParallel, fmt::format("exact (simulated inputs up to the first difference)"),
                                  describe(al, lane_input(inputs, __builtin_ctzll(diff))));
    }
    return equivalent(name::kBitParallel, fmt::format("exact (all 2^{} inputs simulated)", k));
}

/// Each wire's output as a Boolean polynomial over the free input wires.
std::vector<Anf> symbolic_outputs(const Aligned& al, const ir::Circuit& c) {
    std::vector<Anf> wire(al.num_wires());
    for (uint32_t w : al.free) wire[w] = Anf::var(w);
    for (const ir::Op& op : c.ops) {
        if (op.kind == ir::OpKind::Barrier) continue;
        Anf on = Anf::one();
        for (ir::Lit l : op.controls) on = on & (l.positive() ? wire[l.wire()] : wire[l.wire()].negated());
        if (op.kind == ir::OpKind::X) {
            wire[op.target] ^= on;
            continue;
        }
        const Anf diff = (wire[op.target] ^ wire[op.target2]) & on;  // Swap
        wire[op.target] ^= diff;
        wire[op.target2] ^= diff;
    }
    return wire;
}

EquivResult compare_anf(const Aligned& al) {
    const std::vector<Anf> fa = symbolic_outputs(al, al.a), fb = symbolic_outputs(al, al.b);
    for (uint32_t w = 0; w < al.num_wires(); ++w) {
        if (fa[w] == fb[w]) continue;
        const Anf d = fa[w] ^ fb[w];
        std::vector<uint8_t> in(al.num_wires(), 0);
        for (Var v : d.minimal_monomial()) in[v] = 1;
        return not_equivalent(name::kAnf, fmt::format("exact (output {} has different polynomials)", al.a.wire_name(w)),
                              describe(al, in));
    }
    return equivalent(name::kAnf, fmt::format("exact (every output's polynomial over {} inputs is equal)", al.free.size()));
}

EquivResult sample(const Aligned& al, const EquivOptions& opts, const Deadline& dl, const std::string& why) {
    std::mt19937_64 rng(opts.seed);
    std::vector<uint64_t> inputs(al.num_wires(), 0);
    uint64_t batches = 0;
    for (; batches < 4096 && !dl.expired(); ++batches) {
        for (uint32_t w : al.free) inputs[w] = rng();
        if (uint64_t diff = differing_lanes(al, inputs, ~uint64_t(0)))
            return not_equivalent(name::kSampling, "exact (a sampled input differs)",
                                  describe(al, lane_input(inputs, __builtin_ctzll(diff))));
    }
    const std::string conf = fmt::format("probabilistic ({} random inputs agree; {})", batches * 64, why);
    if (!opts.allow_probabilistic) return inconclusive(name::kSampling, conf + "; probabilistic answers not allowed");
    return equivalent(name::kSampling, conf);
}

}  // namespace

EngineResult check_classical(const Aligned& al, const EquivOptions& opts, const Deadline& dl) {
    if (!ir::is_classical(al.a) || !ir::is_classical(al.b)) return std::nullopt;
    if (al.free.size() <= kBitParallelInputs) return bit_parallel(al, dl);
    try {
        return compare_anf(al);
    } catch (const AnfOverflow&) {
        return sample(al, opts, dl, fmt::format("output polynomials over the cap of {} terms", Anf::kMaxTerms));
    }
}

}  // namespace whittle::passes::equiv
