// Elaboration of names and expressions: numbers and angles, wires, Boolean expressions over wires.
#include <cmath>
#include <numeric>

#include <fmt/format.h>

#include "frontend/elaborator.h"

namespace whittle::frontend {
namespace {

constexpr double kPi = 3.14159265358979323846;
/// Two registers compared by `<` expand exactly into about 2^n cubes; wider ones go to the library.
constexpr size_t kMaxOrderedComparisonWires = 8;

bool reduce(int64_t& num, int64_t& den) {
    if (den == 0) return false;
    if (den < 0) {
        if (num == INT64_MIN || den == INT64_MIN) return false;
        num = -num;
        den = -den;
    }
    int64_t g = std::gcd(num < 0 ? -num : num, den);
    if (g > 1) {
        num /= g;
        den /= g;
    }
    return true;
}

}  // namespace

double Number::to_double() const {
    switch (kind) {
    case Rat: return double(num) / double(den);
    case PiRat: return double(num) / double(den) * kPi;
    case Real: return real;
    }
    return 0.0;
}

void Elaborator::fail(const File& f, const Expr& e, const std::string& msg) const {
    throw UserError(msg, f.loc_of(e));
}

const Binding* Elaborator::lookup(uint32_t sym) const {
    for (size_t i = locals_.size(); i > frame_base_; --i)
        if (locals_[i - 1].first == sym) return &locals_[i - 1].second;
    if (sym < globals_.size() && globals_[sym].kind != Binding::None) return &globals_[sym];
    return nullptr;
}

void Elaborator::bind(uint32_t sym, const Binding& b, ir::SourceLoc loc) {
    if (scope_depth_ == 0) {
        if (globals_.size() <= sym) globals_.resize(symbols_.size());
        if (globals_[sym].kind != Binding::None)
            throw UserError(fmt::format("'{}' is already defined", name(sym)), loc);
        if (routines_.count(sym)) throw UserError(fmt::format("'{}' is already defined as a routine", name(sym)), loc);
        globals_[sym] = b;
        return;
    }
    locals_.emplace_back(sym, b);
}

Number Elaborator::eval_number(const File& f, uint32_t ei) const {
    const Expr& e = f.exprs[ei];
    auto bad_op = [&](const char* op) -> Number {
        fail(f, e, fmt::format("'{}' applies to wires in a Boolean expression, not to numbers", op));
    };
    switch (e.kind) {
    case ExprKind::Int: return Number{Number::Rat, e.ival, 1, 0.0};
    case ExprKind::Real: return Number{Number::Real, 0, 1, e.dval};
    case ExprKind::Pi: return Number{Number::PiRat, 1, 1, 0.0};
    case ExprKind::Name: {
        const Binding* b = lookup(e.sym);
        if (!b) fail(f, e, fmt::format("unknown name '{}'", name(e.sym)));
        if (b->kind == Binding::Num) return b->num;
        if (b->kind == Binding::Table)
            fail(f, e, fmt::format("expected a number, but '{}' is a table of {} integers: pick one with {}[i]", name(e.sym),
                                   b->table->size(), name(e.sym)));
        fail(f, e, fmt::format("expected a number, but '{}' is a {}", name(e.sym),
                               b->kind == Binding::Bits ? "classical bit" : "wire or register"));
    }
    case ExprKind::Index: {
        const Binding* b = lookup(e.sym);
        if (!b || b->kind != Binding::Table) fail(f, e, fmt::format("expected a number, but '{}[...]' is a wire", name(e.sym)));
        const int64_t i = eval_int(f, e.lhs, "an index");
        if (i < 0 || i >= int64_t(b->table->size()))
            fail(f, f.exprs[e.lhs], b->table->empty() ? fmt::format("index {} is out of range for '{}' (an empty table)", i, name(e.sym))
                                                      : fmt::format("index {} is out of range for '{}' (entries 0..{})", i,
                                                                    name(e.sym), b->table->size() - 1));
        return Number{Number::Rat, (*b->table)[size_t(i)], 1, 0.0};
    }
    case ExprKind::Slice: fail(f, e, slice_misuse(name(e.sym)));
    case ExprKind::Table: fail(f, e, "expected a number, found a table [...] (bind it with `let` or pass it as an `int name[]`)");
    case ExprKind::Call: {
        if (name(e.sym) != "size") return eval_function(f, e);
        const Expr& arg = f.exprs[e.lhs];
        const Binding* b = arg.kind == ExprKind::Name ? lookup(arg.sym) : nullptr;
        if (b && b->kind == Binding::Table) return Number{Number::Rat, int64_t(b->table->size()), 1, 0.0};
        if (!b || (b->kind != Binding::Register && b->kind != Binding::Wire && b->kind != Binding::Bits))
            fail(f, arg, "expected a register or table name inside size(...)");
        return Number{Number::Rat, b->kind == Binding::Wire ? 1 : int64_t(b->size), 1, 0.0};
    }
    case ExprKind::Neg: {
        Number a = eval_number(f, e.lhs);
        if (a.kind == Number::Real) a.real = -a.real;
        else if (a.num == INT64_MIN) fail(f, e, "integer overflow in the expression");
        else a.num = -a.num;
        return a;
    }
    case ExprKind::Not: {
        Number a = eval_number(f, e.lhs);
        if (a.kind != Number::Rat || a.den != 1) return bad_op("!");
        return Number{Number::Rat, a.num == 0 ? 1 : 0, 1, 0.0};
    }
    case ExprKind::And:
    case ExprKind::Xor:
    case ExprKind::Or:
    case ExprKind::Shl:
    case ExprKind::Shr:
    case ExprKind::Eq:
    case ExprKind::Ne:
    case ExprKind::Lt:
    case ExprKind::Le:
    case ExprKind::Gt:
    case ExprKind::Ge: return eval_integer_op(f, e);
    case ExprKind::Add:
    case ExprKind::Sub:
    case ExprKind::Mul:
    case ExprKind::Div:
    case ExprKind::Mod: break;
    }
    Number a = eval_number(f, e.lhs);
    Number b = eval_number(f, e.rhs);
    auto real = [&](double v) { return Number{Number::Real, 0, 1, v}; };
    auto exact = [&](Number::Kind k, __int128 n, __int128 d) -> Number {
        if (d < 0) {
            n = -n;
            d = -d;
        }
        __int128 g = 1;
        {
            __int128 x = n < 0 ? -n : n, y = d;
            while (y != 0) {
                __int128 t = x % y;
                x = y;
                y = t;
            }
            g = x == 0 ? 1 : x;
        }
        n /= g;
        d /= g;
        if (n > INT64_MAX || n < -INT64_MAX || d > INT64_MAX) {
            if (k == Number::Rat && e.kind != ExprKind::Div) fail(f, e, "integer overflow in the expression");
            return real(double(n) / double(d) * (k == Number::PiRat ? kPi : 1.0));
        }
        Number r{k, int64_t(n), int64_t(d), 0.0};
        reduce(r.num, r.den);
        return r;
    };
    if (e.kind == ExprKind::Mod) {
        if (a.kind != Number::Rat || b.kind != Number::Rat || a.den != 1 || b.den != 1)
            fail(f, e, "'%' needs two integers");
        if (b.num == 0) fail(f, e, "remainder by zero");
        if (b.num == -1) return Number{Number::Rat, 0, 1, 0.0};
        int64_t m = a.num % b.num;
        if (m < 0) m += b.num < 0 ? -b.num : b.num;  // floor-style: the result has the divisor's size range
        return Number{Number::Rat, m, 1, 0.0};
    }
    const bool exact_operands = a.kind != Number::Real && b.kind != Number::Real;
    switch (e.kind) {
    case ExprKind::Add:
    case ExprKind::Sub: {
        // Adding an exact 0 keeps the other side as it is (pi + log(1) stays a multiple of pi).
        if (b.kind == Number::Rat && b.num == 0) return a;
        if (a.kind == Number::Rat && a.num == 0 && b.kind != Number::Real && e.kind == ExprKind::Add) return b;
        __int128 bn = e.kind == ExprKind::Sub ? -__int128(b.num) : __int128(b.num);
        if (exact_operands && a.kind == b.kind)
            return exact(a.kind, __int128(a.num) * b.den + bn * a.den, __int128(a.den) * b.den);
        double bv = b.to_double();
        return real(e.kind == ExprKind::Sub ? a.to_double() - bv : a.to_double() + bv);
    }
    case ExprKind::Mul:
        if (exact_operands && (a.kind == Number::Rat || b.kind == Number::Rat))
            return exact(a.kind == Number::Rat ? b.kind : a.kind, __int128(a.num) * b.num, __int128(a.den) * b.den);
        return real(a.to_double() * b.to_double());
    case ExprKind::Div:
        if (b.kind != Number::Real ? b.num == 0 : b.real == 0.0) fail(f, e, "division by zero");
        if (exact_operands && b.kind == Number::Rat)
            return exact(a.kind, __int128(a.num) * b.den, __int128(a.den) * b.num);
        if (exact_operands && a.kind == Number::PiRat && b.kind == Number::PiRat)
            return exact(Number::Rat, __int128(a.num) * b.den, __int128(a.den) * b.num);
        return real(a.to_double() / b.to_double());
    default: break;
    }
    fail(f, e, "not a number");
}

Number Elaborator::eval_function(const File& f, const Expr& e) const {
    const std::string fn = name(e.sym);
    const bool known = fn == "sqrt" || fn == "exp" || fn == "log" || fn == "asin" || fn == "acos" || fn == "atan";
    if (!known)
        fail(f, e, fmt::format("unknown function '{}' (the built-in functions are size(register), sqrt, exp, log, "
                               "asin, acos, atan)",
                               fn));
    const Number x = eval_number(f, e.lhs);
    const double v = x.to_double();
    if (!std::isfinite(v)) fail(f, e, fmt::format("the argument of {} is not a finite number", fn));
    auto real = [&](double r) {
        if (!std::isfinite(r)) fail(f, e, fmt::format("{}({}) is not a finite number", fn, v));
        return Number{Number::Real, 0, 1, r};
    };
    auto pi_times = [](int64_t num, int64_t den) { return Number{Number::PiRat, num, den, 0.0}; };
    auto rat = [](int64_t num, int64_t den) { return Number{Number::Rat, num, den, 0.0}; };
    // Exact values where the result is rational or a rational multiple of pi (x rational, reduced).
    const bool exact_rat = x.kind == Number::Rat;
    auto is = [&](int64_t num, int64_t den) { return exact_rat && x.num == num && x.den == den; };
    auto exact_root = [](int64_t n) -> int64_t {  // floor(sqrt(n)) when it is exact, else -1
        if (n < 0) return -1;
        int64_t r = int64_t(std::llround(std::sqrt(double(n))));
        for (int64_t c = std::max<int64_t>(0, r - 2); c <= r + 2; ++c)
            if (__int128(c) * c == n) return c;
        return -1;
    };
    if (fn == "sqrt") {
        if (v < 0) fail(f, e, fmt::format("sqrt of a negative number ({})", v));
        if (exact_rat) {
            const int64_t rn = exact_root(x.num), rd = exact_root(x.den);
            if (rn >= 0 && rd > 0) return rat(rn, rd);
        }
        return real(std::sqrt(v));
    }
    if (fn == "exp") {
        if (is(0, 1)) return rat(1, 1);
        return real(std::exp(v));
    }
    if (fn == "log") {
        if (v <= 0) fail(f, e, fmt::format("log of a number that is not positive ({})", v));
        if (is(1, 1)) return rat(0, 1);
        return real(std::log(v));
    }
    if (fn == "atan") {
        if (is(0, 1)) return rat(0, 1);
        if (is(1, 1)) return pi_times(1, 4);
        if (is(-1, 1)) return pi_times(-1, 4);
        return real(std::atan(v));
    }
    if (v < -1 || v > 1) fail(f, e, fmt::format("{} takes a number in [-1, 1], found {}", fn, v));
    if (fn == "asin") {
        if (is(0, 1)) return rat(0, 1);
        if (is(1, 2)) return pi_times(1, 6);
        if (is(-1, 2)) return pi_times(-1, 6);
        if (is(1, 1)) return pi_times(1, 2);
        if (is(-1, 1)) return pi_times(-1, 2);
        return real(std::asin(v));
    }
    // acos
    if (is(1, 1)) return rat(0, 1);
    if (is(1, 2)) return pi_times(1, 3);
    if (is(0, 1)) return pi_times(1, 2);
    if (is(-1, 2)) return pi_times(2, 3);
    if (is(-1, 1)) return pi_times(1, 1);
    return real(std::acos(v));
}

Number Elaborator::eval_integer_op(const File& f, const Expr& e) const {
    Number a = eval_number(f, e.lhs);
    Number b = eval_number(f, e.rhs);
    auto integer = [](int64_t v) { return Number{Number::Rat, v, 1, 0.0}; };
    const bool ints = a.kind == Number::Rat && a.den == 1 && b.kind == Number::Rat && b.den == 1;
    switch (e.kind) {
    case ExprKind::Eq:
    case ExprKind::Ne:
    case ExprKind::Lt:
    case ExprKind::Le:
    case ExprKind::Gt:
    case ExprKind::Ge: {
        int cmp = 0;  // sign of a - b
        if (a.kind != Number::Real && a.kind == b.kind) {
            __int128 l = __int128(a.num) * b.den, r = __int128(b.num) * a.den;
            cmp = l < r ? -1 : l > r ? 1 : 0;
        } else {
            double l = a.to_double(), r = b.to_double();
            cmp = l < r ? -1 : l > r ? 1 : 0;
        }
        bool v = e.kind == ExprKind::Eq ? cmp == 0 : e.kind == ExprKind::Ne ? cmp != 0 : e.kind == ExprKind::Lt ? cmp < 0
               : e.kind == ExprKind::Le ? cmp <= 0 : e.kind == ExprKind::Gt ? cmp > 0 : cmp >= 0;
        return integer(v ? 1 : 0);
    }
    default: break;
    }
    const char* op = e.kind == ExprKind::And ? "&" : e.kind == ExprKind::Xor ? "^" : e.kind == ExprKind::Or ? "|"
                   : e.kind == ExprKind::Shl ? "<<" : ">>";
    if (!ints) {
        if (e.kind == ExprKind::And || e.kind == ExprKind::Xor || e.kind == ExprKind::Or)
            fail(f, e, fmt::format("'{}' applies to wires in a Boolean expression, not to numbers", op));
        fail(f, e, fmt::format("'{}' needs two integers", op));
    }
    switch (e.kind) {
    case ExprKind::And: return integer(a.num & b.num);
    case ExprKind::Xor: return integer(a.num ^ b.num);
    case ExprKind::Or: return integer(a.num | b.num);
    case ExprKind::Shl: {
        if (b.num < 0) fail(f, e, fmt::format("a shift count cannot be negative, found {}", b.num));
        __int128 v = b.num >= 64 ? (a.num == 0 ? 0 : __int128(INT64_MAX) + 1) : __int128(a.num) * (__int128(1) << b.num);
        if (v > INT64_MAX || v < INT64_MIN) fail(f, e, "integer overflow in the expression");
        return integer(int64_t(v));
    }
    case ExprKind::Shr:
        if (b.num < 0) fail(f, e, fmt::format("a shift count cannot be negative, found {}", b.num));
        return integer(b.num >= 64 ? (a.num < 0 ? -1 : 0) : a.num >> b.num);  // arithmetic: two's complement bits
    default: break;
    }
    fail(f, e, "not an integer operation");
}

std::shared_ptr<const std::vector<int64_t>> Elaborator::eval_table(const File& f, uint32_t ei) const {
    const Expr& e = f.exprs[ei];
    if (e.kind == ExprKind::Name) {
        const Binding* b = lookup(e.sym);
        if (b && b->kind == Binding::Table) return b->table;
    }
    if (e.kind != ExprKind::Table) fail(f, e, "expected a table of integers: [a, b, ...] or the name of one");
    const std::vector<uint32_t>& entries = f.tables[size_t(e.ival)];
    auto t = std::make_shared<std::vector<int64_t>>();
    t->reserve(entries.size());
    for (uint32_t x : entries) t->push_back(eval_int(f, x, "a table entry"));
    return t;
}

int64_t Elaborator::eval_int(const File& f, uint32_t e, const char* what) const {
    Number n = eval_number(f, e);
    if (n.kind == Number::Rat && n.den == 1) return n.num;
    if (n.kind == Number::Rat) fail(f, f.exprs[e], fmt::format("{} must be an integer, found {}/{}", what, n.num, n.den));
    fail(f, f.exprs[e], fmt::format("{} must be an integer, found an angle", what));
}

ir::Angle Elaborator::eval_angle(const File& f, uint32_t e) const {
    Number n = eval_number(f, e);
    switch (n.kind) {
    case Number::PiRat: return ir::Angle::pi_times(n.num, n.den);
    case Number::Rat:
        if (n.num == 0) return ir::Angle();
        return ir::Angle::radians(n.to_double());
    case Number::Real:
        if (!std::isfinite(n.real)) fail(f, f.exprs[e], "the angle is not a finite number");
        return ir::Angle::radians(n.real);
    }
    return {};
}

std::string slice_misuse(const std::string& reg) {
    return fmt::format("a slice {}[i..j] is a register argument of a routine call; here a wire or a number is expected", reg);
}

Binding Elaborator::resolve_slice(const File& f, uint32_t ei) const {
    const Expr& e = f.exprs[ei];
    const Binding* b = lookup(e.sym);
    if (!b) fail(f, e, fmt::format("unknown register '{}'", name(e.sym)));
    if (b->kind != Binding::Register || b->scalar)
        fail(f, e, fmt::format("'{}' is not a register of wires, so it has no slice {}[i..j]", name(e.sym), name(e.sym)));
    const int64_t first = eval_int(f, e.lhs, "a slice bound"), last = eval_int(f, e.rhs, "a slice bound");
    for (uint32_t bound : {e.lhs, e.rhs}) {
        const int64_t v = bound == e.lhs ? first : last;
        if (v < 0 || v >= int64_t(b->size))
            fail(f, f.exprs[bound], fmt::format("slice bound {} is out of range for '{}' (wires 0..{})", v, name(e.sym), b->size - 1));
    }
    if (first > last)
        fail(f, e, fmt::format("slice {}[{}..{}] is reversed: the first index must not exceed the last", name(e.sym), first, last));
    Binding s = *b;
    s.first = b->first + uint32_t(first);
    s.size = uint32_t(last - first + 1);
    return s;
}

uint32_t Elaborator::resolve_wire(const File& f, uint32_t ei) const {
    const Expr& e = f.exprs[ei];
    if (e.kind == ExprKind::Slice) fail(f, e, slice_misuse(name(e.sym)));
    if (e.kind != ExprKind::Name && e.kind != ExprKind::Index)
        fail(f, e, "expected a wire (a name or name[index])");
    const Binding* b = lookup(e.sym);
    if (!b) fail(f, e, fmt::format("unknown wire '{}'", name(e.sym)));
    if (b->kind == Binding::Num) fail(f, e, fmt::format("expected a wire, but '{}' is a number", name(e.sym)));
    if (b->kind == Binding::Table) fail(f, e, fmt::format("expected a wire, but '{}' is a table of integers", name(e.sym)));
    if (b->kind == Binding::Bits)
        fail(f, e, fmt::format("expected a wire, but '{}' is a classical bit (use it in 'if')", name(e.sym)));
    const bool single = b->kind == Binding::Wire || b->scalar;
    if (e.kind == ExprKind::Name) {
        if (single) return b->first;
        fail(f, e, fmt::format("'{}' is a register of {} wires: pick one with {}[i]", name(e.sym), b->size, name(e.sym)));
    }
    if (single) fail(f, e, fmt::format("'{}' is a single wire and takes no index", name(e.sym)));
    int64_t i = eval_int(f, e.lhs, "an index");
    if (i < 0 || i >= int64_t(b->size))
        fail(f, f.exprs[e.lhs], fmt::format("index {} is out of range for '{}' (wires 0..{})", i, name(e.sym), b->size - 1));
    return b->first + uint32_t(i);
}

void Elaborator::resolve_wires(const File& f, uint32_t ei, std::vector<uint32_t>& out) const {
    const Expr& e = f.exprs[ei];
    if (e.kind == ExprKind::Name) {
        const Binding* b = lookup(e.sym);
        if (b && b->kind == Binding::Register && !b->scalar) {
            for (uint32_t i = 0; i < b->size; ++i) out.push_back(b->first + i);
            return;
        }
    }
    out.push_back(resolve_wire(f, ei));
}

uint32_t Elaborator::build_bool_node(const File& f, uint32_t ei, BoolExpr& out) const {
    const Expr& e = f.exprs[ei];
    ir::SourceLoc loc = f.loc_of(e);
    switch (e.kind) {
    case ExprKind::Int:
        if (e.ival != 0 && e.ival != 1) fail(f, e, "only 0 and 1 are Boolean constants");
        return out.constant(e.ival == 1, loc);
    case ExprKind::Name: {
        const Binding* b = lookup(e.sym);
        if (b && b->kind == Binding::Num) {
            if (b->num.kind == Number::Rat && b->num.den == 1 && (b->num.num == 0 || b->num.num == 1))
                return out.constant(b->num.num == 1, loc);
            fail(f, e, fmt::format("expected a wire or 0/1, but '{}' is a number", name(e.sym)));
        }
        return out.var(resolve_wire(f, ei), loc);
    }
    case ExprKind::Index: {
        const Binding* b = lookup(e.sym);
        if (b && b->kind == Binding::Table) {  // a table entry is a constant: 0 or 1 here
            const int64_t v = eval_int(f, ei, "a table entry");
            if (v != 0 && v != 1) fail(f, e, fmt::format("expected a wire or 0/1, but '{}[...]' is {}", name(e.sym), v));
            return out.constant(v == 1, loc);
        }
        return out.var(resolve_wire(f, ei), loc);
    }
    case ExprKind::Not: {
        uint32_t a = build_bool_node(f, e.lhs, out);
        return out.op(BoolNode::Not, a, 0, loc);
    }
    case ExprKind::And:
    case ExprKind::Xor:
    case ExprKind::Or: {
        uint32_t a = build_bool_node(f, e.lhs, out);
        uint32_t b = build_bool_node(f, e.rhs, out);
        auto k = e.kind == ExprKind::And ? BoolNode::And : e.kind == ExprKind::Xor ? BoolNode::Xor : BoolNode::Or;
        return out.op(k, a, b, loc);
    }
    case ExprKind::Eq:
    case ExprKind::Ne:
    case ExprKind::Lt:
    case ExprKind::Le:
    case ExprKind::Gt:
    case ExprKind::Ge: return build_comparison(f, e, out);
    case ExprKind::Neg:
    case ExprKind::Add:
    case ExprKind::Sub:
    case ExprKind::Mul:
    case ExprKind::Div:
    case ExprKind::Mod:
    case ExprKind::Shl:
    case ExprKind::Shr:
        fail(f, e, "expected a Boolean expression over wires (& ^ | ! parentheses, 0, 1, comparisons of registers), "
                   "found arithmetic");
    case ExprKind::Slice: fail(f, e, slice_misuse(name(e.sym)));
    case ExprKind::Real:
    case ExprKind::Pi:
    case ExprKind::Table:
    case ExprKind::Call: break;
    }
    fail(f, e, "expected a Boolean expression over wires (& ^ | ! parentheses, 0, 1)");
}

bool Elaborator::comparison_wires(const File& f, uint32_t ei, std::vector<uint32_t>& wires) const {
    const Expr& e = f.exprs[ei];
    if (e.kind == ExprKind::Index) {
        const Binding* b = lookup(e.sym);
        if (!b || b->kind == Binding::Num || b->kind == Binding::Table) return false;
        wires.push_back(resolve_wire(f, ei));
        return true;
    }
    if (e.kind != ExprKind::Name) return false;
    const Binding* b = lookup(e.sym);
    if (!b || (b->kind != Binding::Register && b->kind != Binding::Wire)) return false;
    resolve_wires(f, ei, wires);
    return true;
}

uint32_t Elaborator::build_comparison(const File& f, const Expr& e, BoolExpr& out) const {
    const ir::SourceLoc loc = f.loc_of(e);
    std::vector<uint32_t> x, y;
    const bool left = comparison_wires(f, e.lhs, x), right = comparison_wires(f, e.rhs, y);
    if (!left && !right)
        fail(f, e, "a comparison in a Boolean expression needs a register on one side (`x == 5`, `x < y`); "
                   "comparisons of numbers belong in `if` conditions");
    ExprKind op = e.kind;
    if (!left) {  // k OP x  ==  x OP' k
        std::swap(x, y);
        op = op == ExprKind::Lt ? ExprKind::Gt : op == ExprKind::Gt ? ExprKind::Lt
           : op == ExprKind::Le ? ExprKind::Ge : op == ExprKind::Ge ? ExprKind::Le : op;
    }
    // Le, Ge and Ne are the negations of Gt, Lt and Eq.
    const bool negate = op == ExprKind::Le || op == ExprKind::Ge || op == ExprKind::Ne;
    const ExprKind base = op == ExprKind::Le ? ExprKind::Gt : op == ExprKind::Ge ? ExprKind::Lt
                        : op == ExprKind::Ne ? ExprKind::Eq : op;
    auto finish = [&](uint32_t node) { return negate ? out.op(BoolNode::Not, node, 0, loc) : node; };
    auto neg = [&](uint32_t a) { return out.op(BoolNode::Not, a, 0, loc); };
    auto conj = [&](uint32_t a, uint32_t b) { return out.op(BoolNode::And, a, b, loc); };
    auto xr = [&](uint32_t a, uint32_t b) { return out.op(BoolNode::Xor, a, b, loc); };

    // Bits from the most significant down: eq_i says bit i agrees, lt_i / gt_i that bit i decides
    // x < other / x > other. x < other = XOR over i of lt_i & (all bits above i agree); the terms are
    // disjoint, so their exclusive-or is their disjunction.
    std::vector<uint32_t> eq_bit, lt_bit, gt_bit;
    const bool both = left && right;
    if (both) {
        const size_t n = std::max(x.size(), y.size());
        if (base != ExprKind::Eq && n > kMaxOrderedComparisonWires)
            fail(f, e, fmt::format("an ordered comparison of two registers of {} wires expands into about 2^{} terms; "
                                   "use less_than(a, b, f) from the standard library (`use \"arith\"`)",
                                   n, n));
        for (size_t i = 0; i < n; ++i) {
            const uint32_t xi = i < x.size() ? out.var(x[i], loc) : out.constant(false, loc);  // zero-extended
            const uint32_t yi = i < y.size() ? out.var(y[i], loc) : out.constant(false, loc);
            eq_bit.push_back(neg(xr(xi, yi)));
            lt_bit.push_back(conj(neg(xi), yi));
            gt_bit.push_back(conj(xi, neg(yi)));
        }
    } else {
        const int64_t k = eval_int(f, left ? e.rhs : e.lhs, "the number compared with a register");
        const size_t n = x.size();
        // k outside [0, 2^n): every value of x is above (k < 0) or below (k >= 2^n) it.
        const bool below_all = k < 0, above_all = n < 63 && k >= (int64_t(1) << n);
        if (below_all || above_all) {
            const bool v = base == ExprKind::Eq ? false : base == ExprKind::Lt ? above_all : below_all;
            return finish(out.constant(v, loc));
        }
        for (size_t i = 0; i < n; ++i) {
            const bool bit = i < 63 && ((uint64_t(k) >> i) & 1);
            const uint32_t xi = out.var(x[i], loc);
            eq_bit.push_back(bit ? xi : neg(xi));
            lt_bit.push_back(bit ? neg(xi) : out.constant(false, loc));
            gt_bit.push_back(bit ? out.constant(false, loc) : xi);
        }
    }
    uint32_t agree = out.constant(true, loc), result = out.constant(false, loc);
    for (size_t i = eq_bit.size(); i-- > 0;) {
        if (base == ExprKind::Lt) result = xr(result, conj(lt_bit[i], agree));
        if (base == ExprKind::Gt) result = xr(result, conj(gt_bit[i], agree));
        agree = conj(agree, eq_bit[i]);
    }
    return finish(base == ExprKind::Eq ? agree : result);
}

void Elaborator::build_bool(const File& f, uint32_t e, BoolExpr& out, bool with_controls) const {
    out.clear();
    uint32_t root = build_bool_node(f, e, out);
    if (with_controls && !ctx_.controls.empty()) {
        ir::SourceLoc loc = out.nodes[root].loc;
        uint32_t conj = kNone;
        for (ir::Lit l : ctx_.controls) {
            uint32_t v = out.var(l.wire(), loc);
            if (!l.positive()) v = out.op(BoolNode::Not, v, 0, loc);
            conj = conj == kNone ? v : out.op(BoolNode::And, conj, v, loc);
        }
        out.op(BoolNode::And, conj, root, loc);
        return;
    }
    out.root = root;
}

int Elaborator::find_bits(const File& f, uint32_t sym, ir::SourceLoc loc) const {
    (void)f;
    const Binding* b = lookup(sym);
    if (!b) throw UserError(fmt::format("unknown classical bit '{}' (bits come from 'measure ... as {}')", name(sym), name(sym)), loc);
    if (b->kind != Binding::Bits) throw UserError(fmt::format("'{}' is not a classical bit", name(sym)), loc);
    return int(b->first);
}

}  // namespace whittle::frontend
