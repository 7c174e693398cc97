// The high-level IR: a qubit table with roles and a flat vector of ops (see DEVELOPERS.md, "IR").
#pragma once

#include <cstdint>
#include <memory>
#include <string>
#include <string_view>
#include <type_traits>
#include <vector>

#include "ir/angle.h"
#include "ir/lit_vec.h"
#include "ir/source_loc.h"

namespace whittle::ir {

/// What a wire promises: data (any state in, anything out), clean work wire (|0> in and out),
/// dirty work wire (any state in, restored out).
enum class Role : uint8_t { Data, Clean, Dirty };

const char* role_name(Role r);  // "qubit", "ancilla", "borrow" (the .wq declaration keywords)

/// A declared register. `scalar` registers were declared without a size (`qubit flag`) and print
/// as a bare name; they are still registers of size 1 (OpenQASM export keeps the name).
struct Register {
    std::string name;
    uint32_t first = 0;  // first wire index
    uint32_t size = 0;
    Role role = Role::Data;
    bool scalar = false;
    SourceLoc loc;  ///< the declaration, when the register came from a source file
};

struct Qubit {
    uint32_t reg = 0;    // index into Circuit::registers
    uint32_t index = 0;  // index inside the register
    Role role = Role::Data;
};

/// A classical register (measurement results). `measure w as m` makes a scalar register `m`.
struct ClassicalRegister {
    std::string name;
    uint32_t first = 0;  // first bit index
    uint32_t size = 0;
    bool scalar = false;
};

enum class OpKind : uint8_t {
    X,        ///< target ^= AND(controls): X, CNOT, Toffoli, multi-controlled X
    Phase,    ///< e^{i*angle*AND(controls)}: Z, S, T, CZ, CCZ, ...; no target, `controls` is the product
    Parity,   ///< e^{i*angle*(w1 xor w2 xor ...)}; `controls` holds the wires (all positive)
    H,        ///< Hadamard on target (optional controls)
    Y,        ///< Pauli Y on target (optional controls)
    SX,       ///< sqrt(X) on target (optional controls)
    SXdg,     ///< inverse of sqrt(X)
    RX,       ///< exp(-i*angle/2*X) on target (optional controls)
    RY,       ///< exp(-i*angle/2*Y)
    RZ,       ///< exp(-i*angle/2*Z)
    U,        ///< U(theta, phi, lambda) = Rz(phi) Ry(theta) Rz(lambda) * e^{i(phi+lambda)/2} (OpenQASM u3)
    Swap,     ///< target <-> target2 (optional controls)
    ISwap,    ///< iSWAP on target, target2 (native two-qubit gate; no controls)
    XX,       ///< exp(-i*angle/2*X(x)X) on target, target2 (native; no controls)
    R,        ///< R(theta, phi) = exp(-i*theta/2*(cos(phi) X + sin(phi) Y)) (native; no controls)
    Measure,  ///< measure target (Z basis) into classical bit `cbit`
    Reset,    ///< target to |0>
    Barrier,  ///< no effect; `controls` holds the wires it spans (all positive)
};

const char* op_kind_name(OpKind k);

/// Which half of a compute/uncompute pair an op belongs to.
enum class PairHalf : uint8_t { None, Compute, Uncompute };

constexpr uint32_t kNoWire = 0xffffffffu;

/// The parts of an op that few ops use, kept out of line so that ir::Op stays at 64 bytes: the
/// second and third angles (U and R only), the classical condition, and a measurement's bit.
struct OpRareFields {
    Angle phi;                ///< U phi, R phi
    Angle lambda;             ///< U lambda
    uint64_t cond_value = 0;  ///< see Op::cond_value
    int32_t cond_reg = -1;    ///< see Op::cond_reg
    int32_t cbit = -1;        ///< see Op::cbit
};

/// An owned OpRareFields that is copied with the op; empty (null) until a field is set to a value
/// other than its default, so that most ops carry no heap block.
class OpRareBox {
public:
    OpRareBox() noexcept = default;
    OpRareBox(const OpRareBox& o) : p_(o.p_ ? std::make_unique<OpRareFields>(*o.p_) : nullptr) {}
    OpRareBox(OpRareBox&&) noexcept = default;
    OpRareBox& operator=(const OpRareBox& o) {
        if (this != &o) p_ = o.p_ ? std::make_unique<OpRareFields>(*o.p_) : nullptr;
        return *this;
    }
    OpRareBox& operator=(OpRareBox&&) noexcept = default;

    const OpRareFields* get() const noexcept { return p_.get(); }
    OpRareFields& make() {
        if (!p_) p_ = std::make_unique<OpRareFields>();
        return *p_;
    }

private:
    std::unique_ptr<OpRareFields> p_;
};

/// One operation. Fields are ordered without padding and the rare ones live in `rare_` (the op
/// vector is most of the memory at 10^7 ops; sizeof(Op) is checked below).
struct Op {
    OpKind kind = OpKind::X;
    PairHalf half = PairHalf::None;
    SourceLoc loc;               ///< 10 bytes (packed), so kind, half and loc fill 12
    uint32_t target = kNoWire;
    uint32_t target2 = kNoWire;  ///< Swap, ISwap, XX
    uint32_t pair = 0;           ///< compute/uncompute pair id (0 = none)
    /// Phase/Parity/RX/RY/RZ/XX angle, U theta, R theta (U phi and lambda, R phi: phi(), lambda()).
    Angle angle;
    LitVec controls;             ///< control literals (sorted by wire after normalize); see OpKind for Parity/Barrier

    /// U phi, R phi (0 for other kinds unless set).
    Angle phi() const { return rare_.get() ? rare_.get()->phi : Angle(); }
    /// U lambda.
    Angle lambda() const { return rare_.get() ? rare_.get()->lambda : Angle(); }
    void set_phi(Angle a) {
        if (rare_.get() || !a.identical(Angle())) rare_.make().phi = a;
    }
    void set_lambda(Angle a) {
        if (rare_.get() || !a.identical(Angle())) rare_.make().lambda = a;
    }
    /// Measure: the classical bit written (-1 otherwise).
    int32_t cbit() const { return rare_.get() ? rare_.get()->cbit : -1; }
    void set_cbit(int32_t bit) {
        if (rare_.get() || bit != -1) rare_.make().cbit = bit;
    }
    /// Classically conditioned: index of the classical register (-1 = unconditioned).
    int32_t cond_reg() const { return rare_.get() ? rare_.get()->cond_reg : -1; }
    /// The op runs when that register's value equals cond_value.
    uint64_t cond_value() const { return rare_.get() ? rare_.get()->cond_value : 0; }
    void set_condition(int32_t reg, uint64_t value) {
        if (!rare_.get() && reg == -1 && value == 0) return;
        OpRareFields& r = rare_.make();
        r.cond_reg = reg;
        r.cond_value = value;
    }
    /// Takes `o`'s classical condition (or its absence).
    void copy_condition(const Op& o) { set_condition(o.cond_reg(), o.cond_value()); }

    static Op x(uint32_t target, LitVec controls = {});
    static Op phase(Angle a, LitVec product);
    static Op parity(Angle a, const std::vector<uint32_t>& wires);
    static Op one(OpKind k, uint32_t target, Angle a = {}, LitVec controls = {});
    static Op u(uint32_t target, Angle theta, Angle phi, Angle lambda);
    static Op swap(uint32_t a, uint32_t b, LitVec controls = {});
    static Op two(OpKind k, uint32_t a, uint32_t b, Angle angle = {});
    static Op measure(uint32_t target, int32_t cbit);
    static Op reset(uint32_t target);

    bool is_conditioned() const { return cond_reg() >= 0; }
    /// Diagonal in the computational basis (Phase, Parity, RZ, and controlled versions of those).
    bool is_diagonal() const;
    /// Permutation of basis states (X-type: X/CNOT/Toffoli/MCX and swaps, unconditioned).
    bool is_xtype() const;
    /// Every wire the op touches (target(s), controls, parity or barrier wires), appended in the
    /// order target, target2, controls (inline: every pass calls it once per op).
    void wires(std::vector<uint32_t>& out) const {
        if (target != kNoWire) out.push_back(target);
        if (target2 != kNoWire) out.push_back(target2);
        for (Lit l : controls) out.push_back(l.wire());
    }
    std::vector<uint32_t> wires() const;

private:
    OpRareBox rare_;
};

static_assert(sizeof(Op) == 64, "ir::Op: 64 bytes (kind, half, loc 12; targets and pair 12; angle 16; controls 16; rare 8)");
static_assert(std::is_nothrow_move_constructible_v<Op> && std::is_nothrow_move_assignable_v<Op>,
              "vector growth must move ops, not copy them");

class Circuit {
public:
    std::vector<Register> registers;
    std::vector<Qubit> qubits;
    std::vector<ClassicalRegister> cregs;
    uint32_t num_cbits = 0;
    std::vector<Op> ops;
    Angle global_phase;             ///< the circuit's unitary is e^{i*global_phase} times the product of ops
    std::vector<std::string> files; ///< source files named by SourceLoc::file
    uint32_t next_pair_id = 1;

    /// Declares a register and returns the index of its first wire.
    uint32_t add_register(const std::string& name, uint32_t size, Role role, bool scalar = false);
    /// Declares a classical register and returns its index.
    uint32_t add_creg(const std::string& name, uint32_t size, bool scalar = false);
    uint32_t num_qubits() const { return uint32_t(qubits.size()); }
    /// "a[3]" or, for a scalar register, "flag".
    std::string wire_name(uint32_t wire) const;
    /// Index of the register with this name, or -1.
    int find_register(std::string_view name) const;
    int find_creg(std::string_view name) const;
    /// A fresh compute/uncompute pair id.
    uint32_t new_pair_id() { return next_pair_id++; }
    /// Same qubits, registers and files, no ops.
    Circuit empty_copy() const;
};

/// Appends the inverse of `op` (one or more ops) to `out`. Throws UserError for Measure/Reset.
void append_inverse(const Op& op, std::vector<Op>& out);

/// Checks the IR invariants (wires and bits in range, no wire twice in one op, a target never among
/// its own controls, kind-specific shapes). Throws InternalError naming the op on a violation.
void verify(const Circuit& c);

}  // namespace whittle::ir
