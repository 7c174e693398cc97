// The .wq syntax tree: flat arenas of expressions, statements and blocks, indexed by uint32_t.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

#include <boost/container/small_vector.hpp>

#include "ir/circuit.h"

namespace whittle::frontend {

constexpr uint32_t kNone = 0xffffffffu;

/// Identifiers interned once per elaboration (shared by every file a program `use`s).
class SymbolTable {
public:
    uint32_t intern(std::string_view s);
    const std::string& name(uint32_t id) const { return names_[id]; }
    uint32_t size() const { return uint32_t(names_.size()); }

private:
    struct Hash {
        using is_transparent = void;
        size_t operator()(std::string_view s) const { return std::hash<std::string_view>{}(s); }
    };
    std::unordered_map<std::string, uint32_t, Hash, std::equal_to<>> ids_;
    std::vector<std::string> names_;
};

enum class ExprKind : uint8_t {
    Int,     ///< integer literal (ival)
    Real,    ///< decimal literal (dval), radians when used as an angle
    Pi,      ///< the constant pi
    Name,    ///< sym
    Index,   ///< sym[lhs]
    Slice,   ///< sym[lhs..rhs]: wires lhs to rhs of a register (both included), only as a routine's register argument
    Call,    ///< sym(lhs): built-in functions on registers, e.g. size(a)
    Neg,     ///< -lhs
    Not,     ///< !lhs
    Add, Sub, Mul, Div, Mod,
    And, Xor, Or,  ///< on wires: Boolean; on compile-time integers: bitwise
    Shl, Shr,      ///< compile-time integers only
    Eq, Ne, Lt, Le, Gt, Ge,  ///< compile-time comparisons, 0 or 1
    Table,   ///< [e0, e1, ...]: a compile-time table of integers; its entries are File::tables[ival]
};

struct Expr {
    ExprKind kind = ExprKind::Int;
    uint32_t line = 0, col = 0;
    uint32_t lhs = kNone, rhs = kNone;
    uint32_t sym = kNone;
    uint32_t depth = 1;  ///< height of the subtree (bounded by Limits::max_expr_depth)
    int64_t ival = 0;
    double dval = 0.0;
};

enum class StmtKind : uint8_t {
    Let,       ///< let sym = expr
    Decl,      ///< qubit/ancilla/borrow names[sizes]
    Bits,      ///< bit names[sizes]
    Gate,      ///< [~]gate(angles) targets
    XorAssign, ///< target ^= expr
    Swap,      ///< target <-> target2
    Phase,     ///< phase(angles[0]) expr
    When,      ///< when expr { body }
    Call,      ///< [~]sym(args)
    Compute,   ///< compute { body } then { body2 }
    For,       ///< for sym in expr..expr2 { body }
    Repeat,    ///< repeat expr { body }
    Use,       ///< use "path"
    Measure,   ///< measure target as bit (bit: Name or Index expression)
    If,        ///< if [!]sym [== value] { body } on a classical bit, or if EXPR { body } else { body2 } on a compile-time integer
    Reset,     ///< reset targets
    Barrier,   ///< barrier targets
    Tagged,    ///< @compute(N) / @uncompute(N) statement-or-block (printer's pair tags)
    Block,     ///< { body } (the body of a tag)
};

/// Built-in gates (the statement form `name(angles) targets`).
enum class Gate : uint8_t { H, X, Y, Z, S, T, SX, RX, RY, RZ, U, R, XX, ISwap };

using IndexVec = boost::container::small_vector<uint32_t, 3>;

struct Stmt {
    StmtKind kind = StmtKind::Let;
    bool inverse = false;          ///< `~` in front of a gate or call; `!` in `if !m`
    ir::Role role = ir::Role::Data;
    Gate gate = Gate::H;
    ir::PairHalf half = ir::PairHalf::None;  ///< Tagged
    uint32_t line = 0, col = 0;
    uint32_t sym = kNone;          ///< let/loop/routine/call/if name
    uint32_t expr = kNone;         ///< main expression (let value, ^= right side, phase function, when, loop start, count, measure bit)
    uint32_t expr2 = kNone;        ///< loop end; the target of ^= and <->
    uint32_t expr3 = kNone;        ///< second target of <->
    uint64_t value = 0;            ///< If: compared value (`if m == 5`); Tagged: pair id
    bool has_value = false;
    IndexVec args;                 ///< gate angles, call arguments, phase angle
    IndexVec targets;              ///< gate/reset/barrier targets; Decl/Bits names (as Name/Index exprs)
    uint32_t body = kNone, body2 = kNone;  ///< block indices
    uint32_t path = kNone;         ///< Use: index into File::strings
};

enum class ParamKind : uint8_t { Qubit, Register, Int, Angle, IntTable };  ///< IntTable: `int name[]`

struct Param {
    uint32_t sym = kNone;
    ParamKind kind = ParamKind::Qubit;
    uint32_t line = 0, col = 0;
};

struct Routine {
    uint32_t sym = kNone;
    std::vector<Param> params;
    uint32_t body = kNone;
    uint32_t line = 0, col = 0;
};

/// One parsed file.
struct File {
    uint32_t file_id = 0;  ///< SourceManager id
    std::vector<Expr> exprs;
    std::vector<Stmt> stmts;
    std::vector<std::vector<uint32_t>> blocks;  ///< statement indices; blocks[0] is the file's top level
    std::vector<std::vector<uint32_t>> tables;  ///< the entries (expressions) of each `[...]` table literal
    std::vector<Routine> routines;
    std::vector<std::string> strings;

    /// (SourceManager::add keeps ids below ir::kMaxSourceFiles, so the id fits SourceLoc's 16 bits.)
    ir::SourceLoc loc(uint32_t line, uint32_t col) const { return ir::SourceLoc{uint16_t(file_id), line, col}; }
    ir::SourceLoc loc_of(const Expr& e) const { return loc(e.line, e.col); }
    ir::SourceLoc loc_of(const Stmt& s) const { return loc(s.line, s.col); }
};

}  // namespace whittle::frontend
