// The .wq elaborator (internal): runs the syntax tree's statements and appends ops to an ir::Circuit.
#pragma once

#include <deque>
#include <memory>
#include <map>
#include <string>
#include <unordered_map>
#include <unordered_set>
#include <vector>

#include "frontend/ast.h"
#include "frontend/boolean_expr.h"
#include "frontend/diagnostics.h"
#include "frontend/load.h"
#include "ir/circuit.h"

namespace whittle::frontend {

/// A compile-time number: an exact rational, an exact rational multiple of pi, or radians.
struct Number {
    enum Kind : uint8_t { Rat, PiRat, Real };
    Kind kind = Rat;
    int64_t num = 0, den = 1;
    double real = 0.0;
    double to_double() const;
};

/// What a name stands for in a scope.
struct Binding {
    enum Kind : uint8_t { None, Num, Wire, Register, Bits, Table };
    Kind kind = None;
    Number num;
    std::shared_ptr<const std::vector<int64_t>> table;  ///< Table: the integers, shared by every copy of the binding
    uint32_t first = 0, size = 0;  ///< Wire: first; Register: first wire and size; Bits: creg index
    bool scalar = false;
};

/// The message for a slice `reg[i..j]` used where a wire or a number is expected.
std::string slice_misuse(const std::string& reg);

class Elaborator {
public:
    Elaborator(SourceManager& sm, const LoadOptions& opts);
    /// Elaborates the main file (already in `sm`) and returns the circuit.
    ir::Circuit run(uint32_t file_id);

private:
    struct RoutineRef {
        const File* file;
        const Routine* routine;
    };
    struct Ctx {
        ir::LitVec controls;          ///< from enclosing `when`s, outermost first
        int32_t cond_reg = -1;
        uint64_t cond_value = 0;
    };

    // statements (elaborate.cpp)
    const File& load(uint32_t file_id);
    void exec_file(const File& f);
    void exec_block(const File& f, uint32_t block, bool new_scope = true);
    void exec_stmt(const File& f, const Stmt& s);
    void exec_decl(const File& f, const Stmt& s);
    void exec_bits(const File& f, const Stmt& s);
    void exec_gate(const File& f, const Stmt& s);
    void exec_xor(const File& f, const Stmt& s);
    void exec_phase(const File& f, const Stmt& s);
    void exec_when(const File& f, const Stmt& s);
    void exec_call(const File& f, const Stmt& s);
    void exec_compute(const File& f, const Stmt& s);
    void exec_loop(const File& f, const Stmt& s);
    void exec_use(const File& f, const Stmt& s);
    void exec_measure(const File& f, const Stmt& s);
    void exec_if(const File& f, const Stmt& s);
    void exec_tagged(const File& f, const Stmt& s);
    void emit(ir::Op op, ir::SourceLoc loc);
    void invert_tail(size_t start, ir::Angle phase_before);
    void check_not_controlled(ir::SourceLoc loc, const char* what) const;
    void check_target_free(uint32_t wire, ir::SourceLoc loc) const;

    // names and expressions (elaborate_expr.cpp)
    const Binding* lookup(uint32_t sym) const;
    void bind(uint32_t sym, const Binding& b, ir::SourceLoc loc);
    Number eval_number(const File& f, uint32_t e) const;
    Number eval_integer_op(const File& f, const Expr& e) const;  ///< & ^ | << >> and comparisons
    Number eval_function(const File& f, const Expr& e) const;    ///< sqrt exp log asin acos atan
    int64_t eval_int(const File& f, uint32_t e, const char* what) const;
    /// A table of integers: a `[...]` literal or the name of one (`let t = [...]`, an `int t[]` parameter).
    std::shared_ptr<const std::vector<int64_t>> eval_table(const File& f, uint32_t e) const;
    ir::Angle eval_angle(const File& f, uint32_t e) const;
    uint32_t resolve_wire(const File& f, uint32_t e) const;
    /// `r[i..j]`: the register binding of wires i..j of register r (bounds checked, i <= j).
    Binding resolve_slice(const File& f, uint32_t e) const;
    void resolve_wires(const File& f, uint32_t e, std::vector<uint32_t>& out) const;
    /// Builds `out` from an expression; `with_controls` puts the `when` controls in front (AND).
    void build_bool(const File& f, uint32_t e, BoolExpr& out, bool with_controls) const;
    uint32_t build_bool_node(const File& f, uint32_t e, BoolExpr& out) const;
    /// `x == 5`, `x < y`, ... on registers (unsigned, bit 0 least significant) as a Boolean expression.
    uint32_t build_comparison(const File& f, const Expr& e, BoolExpr& out) const;
    /// The wires of a comparison operand when it names wires (a register, a wire, r[i]); false for a number.
    /// `t ^= x == y` / `x != y` on two registers by the in-place difference; false when it does not apply.
    bool emit_register_equality(const File& f, const Stmt& s, uint32_t target);
    bool comparison_wires(const File& f, uint32_t e, std::vector<uint32_t>& wires) const;
    int find_bits(const File& f, uint32_t sym, ir::SourceLoc loc) const;
    [[noreturn]] void fail(const File& f, const Expr& e, const std::string& msg) const;
    std::string name(uint32_t sym) const { return symbols_.name(sym); }

    SourceManager& sm_;
    const LoadOptions& opts_;
    const Limits& limits_;
    SymbolTable symbols_;
    ir::Circuit c_;
    std::deque<File> files_;
    std::unordered_map<std::string, uint32_t> loaded_;  ///< canonical path -> sm id, for `use` once
    std::vector<std::string> use_stack_;                ///< canonical paths being elaborated (cycle check)
    std::vector<Binding> globals_;                      ///< by symbol id
    std::vector<std::pair<uint32_t, Binding>> locals_;  ///< scopes stack (routine frames, loops, blocks)
    size_t frame_base_ = 0;                             ///< first local visible in the current routine
    uint32_t scope_depth_ = 0;                          ///< 0 = the program's top level
    std::unordered_map<uint32_t, RoutineRef> routines_;
    std::vector<uint32_t> call_stack_;                  ///< routine symbols being called
    std::unordered_set<std::string> register_names_;
    std::unordered_map<uint32_t, uint32_t> fresh_counter_;  ///< per routine symbol
    /// Work wires of routine calls that have returned: an `ancilla` comes back at |0> from its
    /// call, so the next call's `ancilla` of the same shape takes it instead of a new register.
    /// Key: (size, scalar); value: the registers' first wires.
    std::map<std::pair<uint32_t, bool>, std::vector<uint32_t>> free_ancillas_;
    /// Per active call: the ancilla registers it declared ((size, scalar), first wire).
    std::vector<std::vector<std::pair<std::pair<uint32_t, bool>, uint32_t>>> call_ancillas_;
    Ctx ctx_;
    ir::LitVec lifted_controls_;  ///< `when` controls not applied inside a compute block; still not targets
    uint64_t steps_ = 0;
    mutable BoolExpr scratch_;
    std::vector<uint32_t> gate_wires_;  ///< exec_gate's buffers (it does not nest): no allocation per gate
    std::vector<ir::Op> gate_ops_;
};

}  // namespace whittle::frontend
