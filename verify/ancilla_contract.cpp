// The clean-ancilla contract of one circuit: output polynomials, path sums, exact and dense simulation.
#include "verify/ancilla_contract.h"

#include <algorithm>
#include <chrono>
#include <optional>
#include <random>

#include <fmt/format.h>

#include "ir/statevector.h"
#include "verify/equiv_engines.h"
#include "verify/exact_basis.h"
#include "verify/path_sum.h"

namespace whittle::passes {
namespace {

using Status = AncillaContract::Status;

constexpr uint32_t kEnumerateFree = 10;     // exact basis runs over every input up to 2^10
constexpr uint32_t kDenseWires = 20;        // state vectors of 2^20 amplitudes
constexpr size_t kMaxTerms = size_t(1) << 14;
constexpr size_t kPathSumBranchings = 64;

class Clock {
public:
    explicit Clock(double s) : start_(std::chrono::steady_clock::now()), budget_(s) {}
    double left() const {
        return budget_ - std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    }
    bool expired() const { return left() < 0; }

private:
    std::chrono::steady_clock::time_point start_;
    double budget_;
};

AncillaContract violated(uint32_t wire, std::vector<uint8_t> input, bool at_one, std::string method) {
    AncillaContract r;
    r.status = Status::Violated;
    r.wire = wire;
    r.input = std::move(input);
    r.at_one = at_one;
    r.method = std::move(method);
    return r;
}

AncillaContract decided_ok(std::string method) {
    AncillaContract r;
    r.method = std::move(method);
    return r;
}

/// From a path sum: every clean output the constant 0 (ok), or one that depends on inputs only and
/// is not 0 (violated, with the input of its least monomial). nullopt when neither.
std::optional<AncillaContract> from_outputs(const ir::Circuit& c, const std::vector<uint8_t>& clean, const PathSum& ps,
                                            const char* method) {
    bool all_zero = true;
    for (uint32_t w = 0; w < c.num_qubits(); ++w) {
        if (!clean[w] || ps.outputs()[w].is_zero()) continue;
        all_zero = false;
        const Anf& f = ps.outputs()[w];
        bool inputs_only = true;
        for (const Monomial& m : f.terms())
            for (Var v : m) inputs_only = inputs_only && !ps.is_path_var(v);
        if (!inputs_only) continue;
        std::vector<uint8_t> in(c.num_qubits(), 0);
        for (Var v : f.minimal_monomial()) in[v] = 1;
        return violated(w, std::move(in), true, method);
    }
    if (all_zero) return decided_ok(method);
    return std::nullopt;
}

/// One exact basis run; a clean wire found at 1 in some basis state of the output.
std::optional<AncillaContract> exact_run(const ir::Circuit& c, const std::vector<uint8_t>& clean,
                                         const std::vector<uint8_t>& in, bool* too_big) {
    ExactBasisState s(c.num_qubits(), in);
    if (!s.run(c, kMaxTerms)) {
        *too_big = true;
        return std::nullopt;
    }
    for (uint32_t w = 0; w < c.num_qubits(); ++w) {
        if (!clean[w]) continue;
        size_t ones = 0;
        for (size_t t = 0; t < s.size(); ++t) ones += s.bit(t, w);
        if (ones) return violated(w, in, ones == s.size(), "exact (a basis input simulated in exact arithmetic)");
    }
    return std::nullopt;
}

std::vector<uint8_t> spread(const std::vector<uint32_t>& free, uint32_t n, uint64_t j) {
    std::vector<uint8_t> in(n, 0);
    for (size_t i = 0; i < free.size(); ++i) in[free[i]] = (j >> i) & 1;
    return in;
}

}  // namespace

AncillaContract check_ancilla_contract(const ir::Circuit& c, double seconds) {
    const Clock clock(seconds);
    const uint32_t n = c.num_qubits();
    std::vector<uint8_t> clean(n, 0), touched(n, 0);
    std::vector<uint32_t> free;
    for (uint32_t w = 0; w < n; ++w) {
        clean[w] = c.qubits[w].role == ir::Role::Clean;
        if (!clean[w]) free.push_back(w);
    }
    bool unitary = true;
    for (const ir::Op& op : c.ops) {
        for (uint32_t w : op.wires()) touched[w] = 1;
        unitary = unitary && op.kind != ir::OpKind::Measure && op.kind != ir::OpKind::Reset && !op.is_conditioned();
    }
    bool any = false;
    for (uint32_t w = 0; w < n; ++w) any = any || (clean[w] && touched[w]);
    if (!any) return decided_ok("exact (no clean wire is used)");
    AncillaContract undecided;
    undecided.status = Status::Undecided;
    if (!unitary) {
        undecided.method = "the circuit measures or resets wires";
        return undecided;
    }

    // X-type ops and phases: each clean wire's output is a Boolean polynomial of the inputs.
    if (std::all_of(c.ops.begin(), c.ops.end(), equiv::in_phase_class)) {
        try {
            PathSum ps(n, clean, false);
            bool built = true;
            for (size_t i = 0; i < c.ops.size() && built; ++i) {
                if ((i & 63) == 63 && clock.left() < seconds / 2) built = false;
                else ps.apply(c.ops[i]);
            }
            if (built)
                if (auto r = from_outputs(c, clean, ps, "exact (output polynomials)")) return *r;
        } catch (const AnfOverflow&) {
        }
    }
    const bool exact_sim = ExactBasisState::supports(c);
    bool too_big = false;
    if (exact_sim && free.size() <= kEnumerateFree) {
        // Every basis input; by linearity that covers every input state.
        bool complete = true;
        for (uint64_t j = 0; j < (uint64_t(1) << free.size()); ++j) {
            if (clock.expired()) {
                complete = false;
                break;
            }
            if (auto r = exact_run(c, clean, spread(free, n, j), &too_big)) return *r;
            if (too_big) {
                complete = false;
                break;
            }
        }
        if (complete)
            return decided_ok(fmt::format("exact (all 2^{} basis inputs simulated in exact arithmetic)", free.size()));
    }
    // Path sum of the circuit alone: reduced clean outputs that are 0 hold on every path.
    // One rewrite step cannot be interrupted and can take seconds when the sum does not reduce
    // (a 30-bit Clifford+T adder with one broken Toffoli: 120 path variables, 20 s), so the path
    // sum is tried only with few Hadamard-like branchings.
    const size_t branchings = size_t(std::count_if(c.ops.begin(), c.ops.end(), [](const ir::Op& op) {
        return op.kind != ir::OpKind::X && op.kind != ir::OpKind::Phase && op.kind != ir::OpKind::Parity &&
               op.kind != ir::OpKind::Swap && op.kind != ir::OpKind::Barrier && op.kind != ir::OpKind::RZ;
    }));
    if (branchings <= kPathSumBranchings &&
        std::all_of(c.ops.begin(), c.ops.end(), [](const ir::Op& op) { return PathSum::supports(op); })) {
        try {
            PathSum ps(n, clean, true);
            bool built = true;
            for (size_t i = 0; i < c.ops.size() && built; ++i) {
                if ((i & 63) == 63 && clock.left() < seconds / 2) built = false;  // keep half for the runs below
                else ps.apply(c.ops[i]);
            }
            if (built && ps.reduce(std::max(0.0, clock.left() - seconds / 2)))
                if (auto r = from_outputs(c, clean, ps, "exact (reduced path sum)")) return *r;
        } catch (const AnfOverflow&) {
        }
    }
    if (exact_sim) {
        std::mt19937_64 rng(1);
        int runs = 0;
        for (; runs < 256 && !clock.expired(); ++runs) {
            std::vector<uint8_t> in(n, 0);
            for (uint32_t w : free) in[w] = uint8_t(rng() & 1);
            too_big = false;
            if (auto r = exact_run(c, clean, in, &too_big)) return *r;
        }
        undecided.method = runs > 0 ? fmt::format("{} random basis inputs return every clean wire to |0>", runs)
                                    : std::string("no time was left to run a basis input");
    }
    if (n <= kDenseWires && free.size() <= kDenseWires) {
        bool complete = true;
        for (uint64_t j = 0; j < (uint64_t(1) << free.size()); ++j) {
            if (clock.expired()) {
                complete = false;
                break;
            }
            const std::vector<uint8_t> in = spread(free, n, j);
            uint64_t idx = 0;
            for (uint32_t w = 0; w < n; ++w) idx |= uint64_t(in[w]) << w;
            ir::StateVector s(n);
            s.amplitudes().setZero();
            s.amplitudes()(Eigen::Index(idx)) = 1;
            s.run(c);
            for (uint32_t w = 0; w < n; ++w) {
                if (!clean[w]) continue;
                double p1 = 0;
                for (Eigen::Index i = 0; i < s.amplitudes().size(); ++i)
                    if ((uint64_t(i) >> w) & 1) p1 += std::norm(s.amplitudes()(i));
                if (p1 > 1e-9) return violated(w, in, p1 > 1 - 1e-9, fmt::format("numerical (probability {:.3g} of 1)", p1));
            }
        }
        if (complete) return decided_ok(fmt::format("numerical (all 2^{} basis inputs by state vector)", free.size()));
    }
    if (undecided.method.empty()) undecided.method = "no method applies within the budget";
    return undecided;
}

std::string format_contract_input(const ir::Circuit& c, const std::vector<uint8_t>& bits) {
    std::string s;
    for (const ir::Register& r : c.registers) {
        if (r.role == ir::Role::Clean) continue;
        std::string v;
        if (r.size <= 64) {
            uint64_t x = 0;
            for (uint32_t i = 0; i < r.size; ++i)
                if (bits[r.first + i]) x |= uint64_t(1) << i;
            v = fmt::format("{}", x);
        } else {
            v = "0b";
            for (uint32_t i = r.size; i-- > 0;) v += bits[r.first + i] ? '1' : '0';
        }
        s += fmt::format("{}{}={}", s.empty() ? "" : " ", r.name, v);
    }
    return s.empty() ? "the only input" : s;
}

UserError contract_violation(const ir::Circuit& c, const AncillaContract& r) {
    const std::string msg =
        fmt::format("ancilla '{}' is not returned to |0> (input {} leaves it {}; {})", c.wire_name(r.wire),
                    format_contract_input(c, r.input), r.at_one ? "at 1" : "in a superposition", r.method);
    ir::SourceLoc loc = c.registers[c.qubits[r.wire].reg].loc;
    if (!loc.known())
        for (const ir::Op& op : c.ops)
            for (uint32_t w : op.wires())
                if (w == r.wire) loc = op.loc;
    return UserError(msg, loc);
}

}  // namespace whittle::passes
