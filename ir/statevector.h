// Reference semantics: a dense state-vector simulator for every op kind (Eigen, complex<double>).
#pragma once

#include <cstdint>
#include <random>
#include <vector>

#include <Eigen/Dense>

#include "ir/circuit.h"
#include "ir/gate_matrix.h"

namespace whittle::ir {

/// Amplitudes of n qubits; basis index bit w is the value of wire w (wire 0 = least significant bit).
class StateVector {
public:
    explicit StateVector(uint32_t num_qubits);  // |0...0>
    static constexpr uint32_t kMaxQubits = 28;

    uint32_t num_qubits() const { return n_; }
    Eigen::VectorXcd& amplitudes() { return amp_; }
    const Eigen::VectorXcd& amplitudes() const { return amp_; }

    /// Applies one op. Measurements collapse with `rng` and write `cbits`; conditions read `cbits`
    /// against the circuit's classical registers.
    void apply(const Op& op, const Circuit& c, std::vector<uint8_t>& cbits, std::mt19937_64& rng);
    /// Applies every op of the circuit and the global phase.
    void run(const Circuit& c, std::vector<uint8_t>& cbits, std::mt19937_64& rng);
    void run(const Circuit& c);

    /// A random normalized state (Gaussian amplitudes) on all wires.
    void randomize(std::mt19937_64& rng);

private:
    uint32_t n_;
    Eigen::VectorXcd amp_;
};

/// True when the op's classical condition holds for these bits (or it has none).
bool condition_holds(const Op& op, const Circuit& c, const std::vector<uint8_t>& cbits);

/// The full unitary of a circuit without measurements (up to 12 qubits), column j = image of |j>.
Eigen::MatrixXcd circuit_unitary(const Circuit& c);

/// min over phi of ||A - e^{i phi} B|| in the Frobenius norm, divided by sqrt(rows) (0 = equal up to
/// global phase).
double distance_up_to_phase(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b);

}  // namespace whittle::ir
