// The gate vocabularies the identity library is built over: one per target, gates with symbolic angles.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include <Eigen/Dense>

#include "ir/circuit.h"
#include "ir/target.h"

namespace whittle::rules {

/// Symbolic angle parameters a rule may use (written a, b).
constexpr int kMaxParams = 2;

/// An angle slot's value: sum of coef[j] * p_j (coefficients -1, 0 or 1).
struct AngleForm {
    std::array<int8_t, kMaxParams> coef{};
    bool operator==(const AngleForm&) const = default;
    bool empty() const;
};

/// "a", "-b", "a+b", "a-b" ("0" for the empty form).
std::string form_text(const AngleForm& f);

enum class GateName : uint8_t { X, SX, RZ, RX, H, S, Sdg, T, Tdg, R, CX, CZ, ISwap, XX };

struct GateInfo {
    GateName name;
    const char* text;   ///< the name in the library file
    int arity;          ///< 1 or 2 wires
    int slots;          ///< symbolic angle slots (0, 1 or 2)
    bool symmetric;     ///< a two-wire gate equal to itself with its wires exchanged
    /// Degree of one slot in e^{i*p/2} per unit coefficient: 1 for rotation angles (half angles in
    /// the matrix), 2 for R's phi (the matrix holds e^{i*phi}); see rulegen/prove.cpp.
    std::array<int, 2> half_degree;
};

/// Every gate's entry, in GateName order.
extern const GateInfo kGateTable[14];
inline const GateInfo& gate_info(GateName g) { return kGateTable[size_t(g)]; }
/// The gate named `text` in the library file, or false.
bool find_gate(std::string_view text, GateName& out);

/// One gate of a rule: its name, wires (w[1] unused for one-wire gates) and angle forms.
struct Gate {
    GateName name = GateName::X;
    std::array<uint8_t, 2> w{};
    std::array<AngleForm, 2> a{};
    bool operator==(const Gate&) const = default;
};
using Seq = std::vector<Gate>;

/// "rz(a) 0", "cx 0 1", "r(a,-b) 2".
std::string gate_text(const Gate& g);
/// Gates joined by "; ", "()" for none.
std::string seq_text(const Seq& s);

/// A vocabulary and the size of the enumeration over it.
struct GateSet {
    ir::Target target;
    std::vector<GateName> gates;
    int wires = 3;      ///< circuits on up to this many wires
    int params = 2;     ///< symbolic parameters (<= kMaxParams)
    int max_gates = 3;  ///< enumerate sequences of up to this many gates
};

/// The gate sets, one per rotation target and clifford+t (cx+rz+sx, cz+rx+rz, iswap+rz+rx, xx+r, clifford+t).
std::vector<GateSet> all_gate_sets();
/// The gate set for `t`; UserError when the target has none.
GateSet gate_set_for(ir::Target t);
/// "cx+rz+sx.rules" and so on.
std::string library_file_name(ir::Target t);

/// The IR op of gate `name` on wires a (and b) with angle values v0 (and v1, R's phi).
ir::Op make_op(GateName name, uint32_t a, uint32_t b, ir::Angle v0, ir::Angle v1);
/// The IR op the gate stands for with parameter p_j set to values[j].
ir::Op to_op(const Gate& g, const std::array<ir::Angle, kMaxParams>& values);
/// The angle of a form at the given parameter values (exact when the values are).
ir::Angle form_value(const AngleForm& f, const std::array<ir::Angle, kMaxParams>& values);

/// The unitary of a sequence on `wires` wires (wire w is bit w of the basis index) at numeric
/// parameter values; equal to the IR's reference matrices up to global phase.
Eigen::MatrixXcd seq_unitary(const Seq& s, int wires, const std::array<double, kMaxParams>& values);
/// The sequence applied to the columns of `m` (2^wires rows): seq_unitary(...) * m, faster for few columns.
Eigen::MatrixXcd seq_apply(const Seq& s, int wires, const std::array<double, kMaxParams>& values, Eigen::MatrixXcd m);

}  // namespace whittle::rules
