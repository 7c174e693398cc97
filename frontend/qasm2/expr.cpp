// Recursive-descent parsing and exact-where-possible evaluation of OpenQASM 2.0 expressions.
#include "frontend/qasm2/expr.h"

#include <cmath>

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::frontend::qasm2 {
namespace {

using K = ExprNode::Kind;

class ExprParser {
public:
    ExprParser(Lexer& lx, ExprArena& arena, const std::vector<std::string>& params, uint32_t max_depth)
        : lx_(lx), arena_(arena), params_(params), max_depth_(max_depth) {}

    uint32_t expr() {
        Depth d(*this);
        uint32_t left = term();
        while (lx_.peek().kind == Tok::Plus || lx_.peek().kind == Tok::Minus) {
            Token op = lx_.take();
            uint32_t right = term();
            left = binary(op.kind == Tok::Plus ? K::Add : K::Sub, left, right, op.loc);
        }
        return left;
    }

private:
    struct Depth {
        explicit Depth(ExprParser& p) : p_(p) {
            if (++p_.depth_ > p_.max_depth_)
                throw UserError(fmt::format("expression nested deeper than {} levels", p_.max_depth_), p_.lx_.peek().loc);
        }
        ~Depth() { --p_.depth_; }
        ExprParser& p_;
    };

    uint32_t add(ExprNode n) {
        arena_.nodes.push_back(n);
        return uint32_t(arena_.nodes.size() - 1);
    }
    uint32_t binary(K k, uint32_t a, uint32_t b, ir::SourceLoc loc) {
        ExprNode n;
        n.kind = k;
        n.a = a;
        n.b = b;
        n.loc = loc;
        return add(n);
    }

    uint32_t term() {
        uint32_t left = unary();
        while (lx_.peek().kind == Tok::Star || lx_.peek().kind == Tok::Slash) {
            Token op = lx_.take();
            uint32_t right = unary();
            left = binary(op.kind == Tok::Star ? K::Mul : K::Div, left, right, op.loc);
        }
        return left;
    }

    uint32_t unary() {
        Depth d(*this);
        if (lx_.peek().kind == Tok::Minus) {
            Token op = lx_.take();
            ExprNode n;
            n.kind = K::Neg;
            n.a = unary();
            n.loc = op.loc;
            return add(n);
        }
        if (lx_.peek().kind == Tok::Plus) {
            lx_.take();
            return unary();
        }
        uint32_t base = primary();
        if (lx_.peek().kind == Tok::Caret) {
            Token op = lx_.take();
            uint32_t exponent = unary();  // right associative: a^b^c = a^(b^c)
            return binary(K::Pow, base, exponent, op.loc);
        }
        return base;
    }

    uint32_t primary() {
        Token t = lx_.take();
        ExprNode n;
        n.loc = t.loc;
        switch (t.kind) {
        case Tok::Int:
        case Tok::Real:
            n.kind = K::Num;
            n.num = Value::parse_literal(std::string(t.text));
            if (!n.num.is_finite()) throw UserError(fmt::format("number {} is too large", t.text), t.loc);
            return add(n);
        case Tok::LParen: {
            uint32_t inner = expr();
            expect_close(t);
            return inner;
        }
        case Tok::Ident: {
            if (t.text == "pi") {
                n.kind = K::Num;
                n.num = Value::pi_times(1);
                return add(n);
            }
            for (size_t i = 0; i < params_.size(); ++i) {
                if (params_[i] == t.text) {
                    n.kind = K::Param;
                    n.param = uint32_t(i);
                    return add(n);
                }
            }
            static const std::pair<const char*, K> funcs[] = {{"sin", K::Sin}, {"cos", K::Cos}, {"tan", K::Tan},
                                                              {"exp", K::Exp}, {"ln", K::Ln},   {"sqrt", K::Sqrt}};
            for (const auto& [fname, kind] : funcs) {
                if (t.text != fname) continue;
                Token open = lx_.take();
                if (open.kind != Tok::LParen)
                    throw UserError(fmt::format("expected '(' after '{}'", fname), open.loc);
                n.kind = kind;
                n.a = expr();
                expect_close(open);
                return add(n);
            }
            if (params_.empty())
                throw UserError(fmt::format("unknown name '{}' in an expression (only pi and numbers are known here)", t.text),
                                t.loc);
            throw UserError(fmt::format("unknown name '{}' in an expression: not a parameter of this gate", t.text), t.loc);
        }
        default:
            throw UserError(fmt::format("expected a number, 'pi', a parameter or '(' but found {}", token_name(t.kind)),
                            t.loc);
        }
    }

    void expect_close(const Token& open) {
        Token c = lx_.take();
        if (c.kind != Tok::RParen)
            throw UserError(fmt::format("expected ')' to close the '(' at {}:{} but found {}", uint32_t(open.loc.line),
                                        uint32_t(open.loc.column), token_name(c.kind)),
                            c.loc);
    }

    Lexer& lx_;
    ExprArena& arena_;
    const std::vector<std::string>& params_;
    uint32_t max_depth_;
    uint32_t depth_ = 0;
};

Value checked(Value v, const ir::SourceLoc& loc) {
    if (!v.is_finite()) throw UserError("expression value is not a finite number", loc);
    return v;
}

}  // namespace

uint32_t parse_expr(Lexer& lx, ExprArena& arena, const std::vector<std::string>& params, uint32_t max_depth) {
    ExprParser p(lx, arena, params, max_depth);
    return p.expr();
}

Value eval_expr(const ExprArena& arena, uint32_t root, const std::vector<Value>& args) {
    const ExprNode& n = arena.nodes[root];
    auto sub = [&](uint32_t i) { return eval_expr(arena, i, args); };
    switch (n.kind) {
    case K::Num: return n.num;
    case K::Param: return args[n.param];
    case K::Neg: return -sub(n.a);
    case K::Add: return checked(sub(n.a) + sub(n.b), n.loc);
    case K::Sub: return checked(sub(n.a) - sub(n.b), n.loc);
    case K::Mul: return checked(sub(n.a) * sub(n.b), n.loc);
    case K::Div: {
        Value d = sub(n.b);
        if (d.is_zero()) throw UserError("division by zero", n.loc);
        return checked(sub(n.a) / d, n.loc);
    }
    case K::Pow: {
        Value base = sub(n.a), e = sub(n.b);
        if (base.is_zero() && e.to_double() < 0) throw UserError("zero raised to a negative power", n.loc);
        return checked(base.pow(e), n.loc);
    }
    case K::Sin: return checked(Value::real(std::sin(sub(n.a).to_double())), n.loc);
    case K::Cos: return checked(Value::real(std::cos(sub(n.a).to_double())), n.loc);
    case K::Tan: return checked(Value::real(std::tan(sub(n.a).to_double())), n.loc);
    case K::Exp: return checked(Value::real(std::exp(sub(n.a).to_double())), n.loc);
    case K::Ln: {
        double x = sub(n.a).to_double();
        if (x <= 0) throw UserError("ln of a number that is not positive", n.loc);
        return checked(Value::real(std::log(x)), n.loc);
    }
    case K::Sqrt: {
        Value v = sub(n.a);
        if (v.to_double() < 0) throw UserError("sqrt of a negative number", n.loc);
        return checked(Value::real(std::sqrt(v.to_double())), n.loc);
    }
    }
    return Value();
}

}  // namespace whittle::frontend::qasm2
