// Witness search: random basis inputs through both circuits in exact arithmetic (exact_basis.h).
#include <cmath>
#include <random>

#include <fmt/format.h>

#include "verify/equiv_engines.h"
#include "verify/exact_basis.h"

namespace whittle::passes::equiv {
namespace {

constexpr size_t kMaxTerms = size_t(1) << 14;
/// Differences below this are not witnesses: a circuit with approximated rotations (Ross–Selinger,
/// within --epsilon each) is exactly different from its input but this close to it, which the
/// numerical engines accept (the unitary engine's tolerance is 1e-7).
constexpr double kBaseApproximationTolerance = 1e-6;

std::string describe(const Aligned& al, const ExactBasisState& s) {
    std::vector<uint8_t> bits(al.num_wires());
    auto basis = [&](size_t t) {
        for (uint32_t w = 0; w < al.num_wires(); ++w) bits[w] = s.bit(t, w);
        return format_basis(al, bits);
    };
    if (s.size() == 1) return basis(0);
    return fmt::format("a superposition of {} basis states (one is {})", s.size(), basis(0));
}

/// "pi/4" when the angle of z is a multiple of pi/4 within rounding, else radians.
std::string angle_text(std::complex<double> z) {
    const double a = std::arg(z);
    const double eighths = a / (M_PI / 4);
    const long r = std::lround(eighths);
    if (std::abs(eighths - double(r)) < 1e-9) return ir::Angle::pi_times(r, 4).to_string();
    return fmt::format("{:.6f} rad", a);
}

/// First circuit's amplitude over the second's at their first basis state, as an exact pair.
struct Ratio {
    ExactValue num, den;
    std::complex<double> approx;
};

}  // namespace

EngineResult check_witness(const Aligned& al, const EquivOptions& opts, const Deadline& dl, double seconds,
                           int max_inputs) {
    if (!ExactBasisState::supports(al.a) || !ExactBasisState::supports(al.b)) return std::nullopt;
    const Deadline mine(seconds);
    const double kApproximationTolerance = kBaseApproximationTolerance + 4 * opts.approximation_bound;
    std::mt19937_64 rng(opts.seed ^ 0x9e3779b97f4a7c15ull);
    std::vector<uint8_t> in(al.num_wires(), 0), ref_in;
    bool have_ref = false;
    Ratio ref;
    int tried = 0, skipped = 0, close = 0;
    for (; tried < max_inputs && !dl.expired() && !mine.expired(); ++tried) {
        // The first input is all zeros, the rest random over the wires whose input varies.
        for (uint32_t w : al.free) in[w] = tried == 0 ? 0 : uint8_t(rng() & 1);
        ExactBasisState sa(al.num_wires(), in), sb(al.num_wires(), in);
        if (!sa.run(al.a, kMaxTerms) || !sb.run(al.b, kMaxTerms)) {
            ++skipped;
            continue;
        }
        const char* conf = "exact (a basis input maps to different states; exact arithmetic in Z[w]/sqrt2^k)";
        bool proportional = sa.same_basis_states(sb);
        for (size_t t = 1; proportional && t < sa.size(); ++t)
            proportional = ExactBasisState::product(sa.value(t), sb.value(0)) ==
                           ExactBasisState::product(sa.value(0), sb.value(t));
        if (!proportional && sa.distance_up_to_phase(sb) < kApproximationTolerance) {
            ++close;
            continue;
        }
        if (!proportional)
            return not_equivalent(name::kWitness, conf,
                                  fmt::format("input {}: first circuit gives {}, second gives {}", format_basis(al, in),
                                              describe(al, sa), describe(al, sb)));
        const Ratio r{sa.value(0), sb.value(0), sa.complex_value(0) / sb.complex_value(0)};
        if (!have_ref) {
            have_ref = true;
            ref = r;
            ref_in = in;
            continue;
        }
        // num/den == ref.num/ref.den, exactly
        if (ExactBasisState::product(r.num, ref.den) == ExactBasisState::product(ref.num, r.den)) continue;
        if (std::abs(std::arg(r.approx / ref.approx)) < kApproximationTolerance) {
            ++close;
            continue;
        }
        return not_equivalent(name::kWitness,
                              "exact (two basis inputs get different relative phases; exact arithmetic in Z[w]/sqrt2^k)",
                              fmt::format("input {} against input {}: the relative phase differs by {}",
                                          format_basis(al, in), format_basis(al, ref_in),
                                          angle_text(r.approx / ref.approx)));
    }
    return inconclusive(name::kWitness,
                        fmt::format("no witness among {} basis inputs{}{}", tried - skipped,
                                    close ? fmt::format(" ({} differ by less than {})", close, kApproximationTolerance)
                                          : std::string(),
                                    skipped ? fmt::format(" ({} more grew over {} basis states)", skipped, kMaxTerms)
                                            : std::string()));
}

}  // namespace whittle::passes::equiv
