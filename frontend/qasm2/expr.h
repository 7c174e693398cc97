// OpenQASM 2.0 parameter expressions: parsed into a small arena, evaluated once the gate's
// parameters are bound (+ - * / ^, unary minus, pi, sin cos tan exp ln sqrt).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "frontend/qasm2/lexer.h"
#include "frontend/qasm2/value.h"

namespace whittle::frontend::qasm2 {

struct ExprNode {
    enum class Kind : uint8_t { Num, Param, Neg, Add, Sub, Mul, Div, Pow, Sin, Cos, Tan, Exp, Ln, Sqrt };
    Kind kind = Kind::Num;
    Value num;          ///< Num
    uint32_t param = 0; ///< Param: index into the gate's parameter list
    uint32_t a = 0;     ///< first operand (node index)
    uint32_t b = 0;     ///< second operand
    ir::SourceLoc loc;
};

/// The nodes of the expressions of one gate definition (or one top-level statement).
struct ExprArena {
    std::vector<ExprNode> nodes;
};

/// Parses one expression at the lexer's position and returns its root. Identifiers are `pi`, the
/// function names, or entries of `params` (a gate's parameter names). Nesting deeper than
/// `max_depth` is a located UserError.
uint32_t parse_expr(Lexer& lx, ExprArena& arena, const std::vector<std::string>& params, uint32_t max_depth);

/// Evaluates the expression `root` with the parameters bound to `args`. Division by zero, ln or
/// sqrt out of their domain and non-finite results are located UserErrors.
Value eval_expr(const ExprArena& arena, uint32_t root, const std::vector<Value>& args);

}  // namespace whittle::frontend::qasm2
