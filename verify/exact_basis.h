// Exact sparse simulation of one basis input through a circuit whose phases are multiples of pi/4.
#pragma once

#include <complex>
#include <cstdint>
#include <vector>

#include "ir/circuit.h"

namespace whittle::passes {

/// a0 + a1 w + a2 w^2 + a3 w^3 with w = e^{i pi/4}: the ring Z[w] that Clifford+T amplitudes live in
/// (times a power of 1/sqrt2).
struct ZOmega {
    int64_t a[4] = {0, 0, 0, 0};
    bool is_zero() const { return !(a[0] | a[1] | a[2] | a[3]); }
    bool operator==(const ZOmega&) const = default;
};

/// A value x / sqrt2^k of Z[w][1/sqrt2] in its unique reduced form (x not divisible by sqrt2, or x = 0
/// and k = 0), so two values are equal exactly when their forms are. Used to compare products.
struct ExactValue {
    __int128 a[4] = {0, 0, 0, 0};
    int k = 0;
    bool operator==(const ExactValue&) const = default;
};

/// The state of the circuit on one basis input, as a list of basis states with amplitudes
/// amp / sqrt2^k (one k for the whole state). Exact: amplitudes that cancel disappear.
class ExactBasisState {
public:
    ExactBasisState(uint32_t num_wires, const std::vector<uint8_t>& input_bits);

    /// True when `op` is simulated exactly: unconditioned X, Swap, Phase, Parity, Y, iSWAP with
    /// angles in multiples of pi/4 (controlled RZ in multiples of pi/2), uncontrolled H, SX, SXdg.
    /// Uncontrolled global phases are dropped (every comparison is up to one global phase).
    static bool supports(const ir::Op& op);
    static bool supports(const ir::Circuit& c);

    /// Runs the whole circuit; false when the state grew over `max_terms` basis states or a
    /// coefficient over 2^60 (the state is then unusable).
    bool run(const ir::Circuit& c, size_t max_terms);

    size_t size() const { return amps_.size(); }
    bool bit(size_t term, uint32_t wire) const { return (key(term)[wire >> 6] >> (wire & 63)) & 1; }
    const ZOmega& amp(size_t term) const { return amps_[term]; }
    int sqrt2_power() const { return k_; }
    /// amp(term) / sqrt2^k, in reduced form.
    ExactValue value(size_t term) const;
    std::complex<double> complex_value(size_t term) const;
    /// Sorted by basis state (done by run()); two states then compare term by term.
    bool same_basis_states(const ExactBasisState& other) const;

    /// min over phases of || a/|a| - e^{i phi} b/|b| ||, in doubles: how far apart two states are
    /// up to a global phase (an approximated rotation leaves exact states unequal but close).
    double distance_up_to_phase(const ExactBasisState& other) const;

    /// The exact product of two values (for ratio tests: x/y == u/v iff x*v == u*y).
    static ExactValue product(const ExactValue& x, const ExactValue& y);

private:
    const uint64_t* key(size_t t) const { return keys_.data() + t * words_; }
    uint64_t* key(size_t t) { return keys_.data() + t * words_; }
    bool holds(size_t t, const ir::Op& op) const;
    bool apply(const ir::Op& op, size_t max_terms);
    void hadamard(uint32_t wire);
    void merge();
    void multiply(size_t t, int units);  // by w^units

    uint32_t words_;
    std::vector<uint64_t> keys_;
    std::vector<ZOmega> amps_;
    int k_ = 0;
    bool overflow_ = false;
};

}  // namespace whittle::passes
