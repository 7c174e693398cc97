// Does a circuit keep its promise to return every clean ancilla (`ancilla`, Role::Clean) to |0>?
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "ir/error.h"

namespace whittle::passes {

struct AncillaContract {
    enum class Status { Ok, Violated, Undecided };
    Status status = Status::Ok;
    uint32_t wire = 0;           ///< Violated: a clean wire the circuit does not return to |0>
    std::vector<uint8_t> input;  ///< Violated: a basis input (one bit per wire, clean wires 0) showing it
    bool at_one = false;         ///< Violated: the wire ends at |1> for that input (else in a superposition)
    std::string method;          ///< how it was decided ("exact (...)", "numerical (...)"), or why it was not
};

/// Checks that for every input with the clean wires at |0>, the circuit leaves them at |0>.
/// X-type and phase circuits exactly (output polynomials); pi/4-phase circuits exactly by path sums
/// (up to 64 H-like gates) and exact basis simulation (every input when few vary, else random ones, which can only find a
/// violation); other unitary circuits of up to 20 wires numerically by state vectors. Circuits with
/// measurements are Undecided. Stops after about `seconds`.
AncillaContract check_ancilla_contract(const ir::Circuit& c, double seconds);

/// The located error for a Violated result: at the register's declaration when it has one, else at
/// the last op on the wire (where it is left). The message names the wire, the input and `method`.
UserError contract_violation(const ir::Circuit& c, const AncillaContract& r);

/// "a=3 b=1": a basis input by the circuit's non-clean registers, for messages.
std::string format_contract_input(const ir::Circuit& c, const std::vector<uint8_t>& bits);

}  // namespace whittle::passes
