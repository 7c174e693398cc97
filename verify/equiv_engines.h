// Internal interface between the equivalence dispatcher and its engines (not for passes to include).
#pragma once

#include <chrono>
#include <optional>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "verify/equivalence.h"

namespace whittle::passes::equiv {

/// Both circuits over one merged wire table (registers matched by name and index).
struct Aligned {
    ir::Circuit a, b;               ///< same qubits/registers; each keeps its own classical registers
    std::vector<uint8_t> clean;     ///< per wire: input fixed to |0>
    std::vector<uint32_t> free;     ///< wires whose input varies, ascending
    uint32_t num_wires() const { return a.num_qubits(); }
};

/// Throws UserError when both sides have data registers the other lacks (see check_equivalence).
Aligned align(const ir::Circuit& a, const ir::Circuit& b,
              const std::vector<std::pair<std::string, std::string>>& register_map = {});

/// "a=5 b=0 flag=1" for a basis state given as one bit per merged wire (all registers, in order).
std::string format_basis(const Aligned& al, const std::vector<uint8_t>& bits);
/// The registers where two basis states differ: "c: 1 vs 0".
std::string format_difference(const Aligned& al, const std::vector<uint8_t>& x, const std::vector<uint8_t>& y);

class Deadline {
public:
    explicit Deadline(double seconds) : start_(std::chrono::steady_clock::now()), budget_(seconds) {}
    /// The same budget started `seconds` later (time another engine took does not count).
    Deadline shifted(double seconds) const {
        Deadline d = *this;
        d.start_ += std::chrono::duration_cast<std::chrono::steady_clock::duration>(std::chrono::duration<double>(seconds));
        return d;
    }
    bool expired() const { return elapsed() > budget_; }
    double elapsed() const {
        return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    }

private:
    std::chrono::steady_clock::time_point start_;
    double budget_;
};

/// What an engine returns: nullopt when it does not apply to these circuits; otherwise a result
/// (Inconclusive lets the dispatcher try the next engine).
using EngineResult = std::optional<EquivResult>;

/// Engine 1: X-type circuits. Bit-parallel up to kBitParallelInputs free wires, ANF beyond,
/// random sampling when the ANF grows over its cap.
EngineResult check_classical(const Aligned& al, const EquivOptions& opts, const Deadline& dl);
constexpr uint32_t kBitParallelInputs = 22;

/// Engine 2: X-type ops plus diagonal phases (Phase, Parity, RZ, Y) with exact angles.
EngineResult check_phase(const Aligned& al, const EquivOptions& opts, const Deadline& dl);
/// True for the ops of the phase engines' class: unconditioned X-type ops and diagonal phases with
/// exact angles (the ancilla contract check decides the same class exactly).
bool in_phase_class(const ir::Op& op);

/// Engine 3: path sums (see path_sum.h).
EngineResult check_path_sum(const Aligned& al, const EquivOptions& opts, const Deadline& dl);

/// Witness search: random basis inputs through both circuits, simulated exactly and sparsely
/// (exact_basis.h); finds "not equivalent" with a verified input, never decides "equivalent".
/// nullopt outside pi/4-phase circuits; stops after `max_inputs` inputs or `seconds`.
EngineResult check_witness(const Aligned& al, const EquivOptions& opts, const Deadline& dl, double seconds,
                           int max_inputs);

/// The ZX engine (equiv_zx.cpp): the miter as a ZX diagram, fully simplified; "equivalent" when it
/// reduces to bare wires, else Inconclusive (never "not equivalent"). nullopt outside its class
/// (measurements, resets, conditions, inexact angles, controlled gates other than X, phases, RZ and
/// swaps). Spends at most `seconds` of the budget.
EngineResult check_zx(const Aligned& al, const EquivOptions& opts, const Deadline& dl, double seconds);

/// Engine 4: state-vector simulation (full unitary, random states, measurement branches).
EngineResult check_simulate(const Aligned& al, const EquivOptions& opts, const Deadline& dl);
constexpr uint32_t kUnitaryWires = 12;
/// Two state vectors of 2^25 amplitudes take 1 GiB; over this the engine does not apply.
constexpr uint32_t kSimulateWires = 25;

/// Engine names as reported.
namespace name {
constexpr const char* kBitParallel = "bit-parallel";
constexpr const char* kAnf = "anf";
constexpr const char* kSampling = "sampling";
constexpr const char* kPhaseTable = "phase-table";
constexpr const char* kPhasePoly = "phase-polynomial";
constexpr const char* kPathSum = "path-sum";
constexpr const char* kUnitary = "unitary";
constexpr const char* kRandomStates = "random-states";
constexpr const char* kBranches = "branches";
constexpr const char* kWitness = "basis-witness";
constexpr const char* kZx = "zx";
}  // namespace name

/// Shared helpers for engines.
EquivResult equivalent(const char* engine, std::string confidence);
EquivResult not_equivalent(const char* engine, std::string confidence, std::string counterexample);
EquivResult inconclusive(const char* engine, std::string why);

}  // namespace whittle::passes::equiv
