// The equivalence checker: are two circuits the same map up to global phase, with ancilla promises?
#pragma once

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

struct EquivOptions {
    double time_budget_seconds = 10;  ///< each engine stops and reports inconclusive past this
    int random_states = 6;            ///< random input states for the simulation fallback
    uint64_t seed = 1;
    bool allow_probabilistic = true;  ///< when false, sampling and random-state answers are inconclusive
    /// The second circuit approximates the first within this operator-norm bound (rotations
    /// synthesized within --epsilon). When > 0, an exact engine's "not equivalent" is not trusted (an
    /// approximation is exactly different) and the numerical engines widen their tolerance by 4x it.
    double approximation_bound = 0;
    /// State-vector engines run up to this many wires (at most 25). A state of n wires takes 16 * 2^n
    /// bytes and a gate on it time in proportion, and the engine checks its deadline between states,
    /// so compile's default check lowers this to keep within its budget.
    uint32_t max_simulated_wires = 25;
    /// Registers matched although named differently: (name in the first circuit, name in the second).
    std::vector<std::pair<std::string, std::string>> register_map;
};

enum class Verdict { Equivalent, NotEquivalent, Inconclusive };

const char* verdict_name(Verdict v);  // "equivalent", "not equivalent", "inconclusive"

struct EquivResult {
    Verdict verdict = Verdict::Inconclusive;
    std::string engine;          ///< the engine that decided ("bit-parallel", "path-sum", ...)
    std::string confidence;      ///< "exact (...)", "probabilistic (...)" or why it could not decide
    std::string counterexample;  ///< for NotEquivalent when one is known: "a=3 b=0 (...)"
    std::string detail;          ///< what the engines tried, one line each
};

/// Checks that `a` and `b` are equal up to global phase (Circuit::global_phase included).
///
/// Wires are matched by register name (or `register_map`) and index. A wire present on one side
/// only keeps that side's role: a declared `ancilla` (or a compiler work wire, which is one) is a
/// clean ancilla, a `borrow` wire a dirty one, a data wire takes every input and the other side
/// leaves it alone. When both sides have data registers the other lacks, the names do not match:
/// throws UserError naming them (unless `register_map` pairs them). Clean wires start at |0> and
/// only those inputs matter; every engine compares every wire's final value, clean wires included,
/// so one side leaving an ancilla dirty where the other returns it is a difference. Whether a side
/// keeps its own ancilla promise is check_ancilla_contract (ancilla_contract.h). With measurement and
/// feed-forward every branch must give the reference state, up to a phase per branch; clean wires
/// whose last op is a measurement count as reset afterwards.
///
/// Engines, strongest that applies: bit-parallel or ANF for X-type circuits; phase table or phase
/// polynomial for X-type plus diagonal phases with exact angles; the path sum (Amy 2018,
/// arXiv:1805.06908) for Clifford+T-like circuits with exact angles; state-vector simulation.
EquivResult check_equivalence(const ir::Circuit& a, const ir::Circuit& b, const EquivOptions& opts = {});

}  // namespace whittle::passes
