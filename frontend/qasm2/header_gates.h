// The gates of OpenQASM 2.0's standard header qelib1.inc (and the builtins U, CX) as high-level IR ops.
#pragma once

#include <cstdint>
#include <string_view>
#include <vector>

#include "frontend/qasm2/value.h"
#include "ir/circuit.h"

namespace whittle::frontend::qasm2 {

/// Which gate of the table (append_header_gate switches on it; no string compares per call).
enum class GateId : uint8_t {
    U, CX, u3, u2, u1, cx, id, x, y, z, h, s, sdg, t, tdg, rx, ry, rz, cz, cy, swap, ch, ccx, cswap, crz, cu1, cu3,
    u0, u, p, sx, sxdg, cp, crx, cry, csx, cu, rxx, rzz, c3x, c4x,
};

struct HeaderGate {
    GateId id;
    const char* name;
    uint8_t num_params;
    uint8_t num_qubits;
    bool builtin;  ///< U and CX: always there; the others need `include "qelib1.inc";`
};

/// The header gate or builtin with this name, or nullptr.
const HeaderGate* find_header_gate(std::string_view name);

/// True for U, CX and the gates of arXiv:1707.03429's qelib1.inc; false for the later additions
/// (u0, u, p, sx, sxdg, cp, crx, cry, csx, cu, rxx, rzz, c3x, c4x), which a 2.0 program may define
/// itself: its definition then shadows the built-in one.
bool in_2017_header(GateId id);

/// Every gate of the table (for checks that a user definition does not clash with the header).
const std::vector<HeaderGate>& header_gates();

/// Appends the ops of `g` applied to `wires` (size g.num_qubits, distinct) with `params` (size
/// g.num_params) and returns the global phase the gate adds. Matrices follow the header's gate
/// bodies (Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429), with the usual textbook phases
/// for the uncontrolled gates (u1 = p = diag(1, e^{i lambda}), rz = exp(-i phi/2 Z), u3 = the IR's U,
/// rzz = exp(-i theta/2 Z(x)Z)). Controlled gates are exact, including their phase: cu3 is the
/// header's controlled Rz(phi) Ry(theta) Rz(lambda), i.e. the IR's U with a control and a Phase of
/// -(phi+lambda)/2 on the control.
ir::Angle append_header_gate(const HeaderGate& g, const std::vector<Value>& params, const uint32_t* wires,
                             std::vector<ir::Op>& out);

}  // namespace whittle::frontend::qasm2
