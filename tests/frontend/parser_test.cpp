// The .wq grammar: statement shapes, expression precedence, separators, comments, CRLF, and located
// syntax errors that say what was expected.
#include <doctest/doctest.h>

#include <memory>
#include <random>
#include <string>

#include "frontend/ast.h"
#include "frontend/wq_grammar.h"
#include "frontend/wq_parser.h"

using namespace whittle;
using namespace whittle::frontend;

namespace {

struct Parsed {
    SourceManager sm;
    SymbolTable syms;
    File file;
};

std::unique_ptr<Parsed> parse(const std::string& text, Limits limits = {}) {
    auto p = std::make_unique<Parsed>();
    uint32_t id = p->sm.add("t.wq", text);
    p->file = parse_wq_syntax(p->sm, id, p->syms, limits);
    return p;
}

/// The error message and location for bad text ("" when it parses).
std::string error_of(const std::string& text, Limits limits = {}) {
    SourceManager sm;
    SymbolTable syms;
    uint32_t id = sm.add("t.wq", text);
    try {
        // On the parser's own large stack, as parse_wq runs it: the nesting tests go to the limits.
        run_on_parser_stack([&] { parse_wq_syntax(sm, id, syms, limits); });
    } catch (const UserError& e) {
        return std::to_string(e.loc().line) + ":" + std::to_string(e.loc().column) + ": " + e.what();
    }
    return "";
}

std::string show(const File& f, const SymbolTable& s, uint32_t e) {
    const Expr& x = f.exprs[e];
    auto bin = [&](const char* op) { return "(" + show(f, s, x.lhs) + op + show(f, s, x.rhs) + ")"; };
    switch (x.kind) {
    case ExprKind::Int: return std::to_string(x.ival);
    case ExprKind::Real: return std::to_string(x.dval);
    case ExprKind::Pi: return "pi";
    case ExprKind::Name: return s.name(x.sym);
    case ExprKind::Index: return s.name(x.sym) + "[" + show(f, s, x.lhs) + "]";
    case ExprKind::Slice: return s.name(x.sym) + "[" + show(f, s, x.lhs) + ".." + show(f, s, x.rhs) + "]";
    case ExprKind::Call: return s.name(x.sym) + "(" + show(f, s, x.lhs) + ")";
    case ExprKind::Neg: return "-" + show(f, s, x.lhs);
    case ExprKind::Not: return "!" + show(f, s, x.lhs);
    case ExprKind::Add: return bin("+");
    case ExprKind::Sub: return bin("-");
    case ExprKind::Mul: return bin("*");
    case ExprKind::Div: return bin("/");
    case ExprKind::Mod: return bin("%");
    case ExprKind::And: return bin("&");
    case ExprKind::Xor: return bin("^");
    case ExprKind::Or: return bin("|");
    case ExprKind::Shl: return bin("<<");
    case ExprKind::Shr: return bin(">>");
    case ExprKind::Eq: return bin("==");
    case ExprKind::Ne: return bin("!=");
    case ExprKind::Lt: return bin("<");
    case ExprKind::Le: return bin("<=");
    case ExprKind::Gt: return bin(">");
    case ExprKind::Ge: return bin(">=");
    case ExprKind::Table: {
        std::string t = "[";
        for (uint32_t entry : f.tables[size_t(x.ival)]) t += (t.size() > 1 ? ", " : "") + show(f, s, entry);
        return t + "]";
    }
    }
    return "?";
}

}  // namespace

TEST_CASE("statements end at newlines and semicolons; comments and blank lines are skipped") {
    auto p = parse("# header\n\nqubit a[2]; h a[0] # trailing\n\n;;x a[1]\n");
    REQUIRE(p->file.blocks[0].size() == 3);
    CHECK(p->file.stmts[p->file.blocks[0][0]].kind == StmtKind::Decl);
    CHECK(p->file.stmts[p->file.blocks[0][1]].kind == StmtKind::Gate);
    const Stmt& x = p->file.stmts[p->file.blocks[0][2]];
    CHECK(x.kind == StmtKind::Gate);
    CHECK(x.line == 5);
    CHECK(x.col == 3);
}

TEST_CASE("CRLF line ends read like LF") {
    auto p = parse("qubit a\r\nh a\r\nx a\r\n");
    CHECK(p->file.blocks[0].size() == 3);
    CHECK(error_of("qubit a\r\nh a b\r\n") == "2:5: expected a line end or ';' after the statement, found 'b'");
}

TEST_CASE("an empty file is an empty program") {
    CHECK(parse("")->file.blocks[0].empty());
    CHECK(parse("\n\n# only a comment")->file.blocks[0].empty());
}

TEST_CASE("expression precedence: | < ^ < & < + - < * / % < unary") {
    auto p = parse("t ^= a | b ^ c & !d\nlet k = -1 + 2 * 3 % 4 - n / 2\nrz(-pi/8) q\n");
    const File& f = p->file;
    CHECK(show(f, p->syms, f.stmts[0].expr) == "(a|(b^(c&!d)))");
    CHECK(show(f, p->syms, f.stmts[1].expr) == "((-1+((2*3)%4))-(n/2))");
    CHECK(show(f, p->syms, f.stmts[2].args[0]) == "(-pi/8)");
}

TEST_CASE("table literals: entries are expressions, may span lines, may be empty") {
    auto p = parse("let t = [1, 2 + 3, -k]\nlet u = [\n  4,\n  5\n]\nlet e = []\nroutine f(int w[], q) { x q }\n");
    const File& f = p->file;
    CHECK(show(f, p->syms, f.stmts[0].expr) == "[1, (2+3), -k]");
    CHECK(show(f, p->syms, f.stmts[1].expr) == "[4, 5]");
    CHECK(show(f, p->syms, f.stmts[2].expr) == "[]");
    REQUIRE(f.routines.size() == 1);
    CHECK(f.routines[0].params[0].kind == ParamKind::IntTable);
    CHECK(f.routines[0].params[1].kind == ParamKind::Qubit);
    CHECK(error_of("let t = [1 2]\n") == "1:12: expected ',' or ']' in the table, found '2'");
    CHECK(error_of("routine f(angle a[]) { }\n") == "1:18: expected ',' or ')' (angle parameters take no '[]'), found '['");
}

TEST_CASE("register slices: r[i..j] with expression bounds, as call arguments") {
    auto p = parse("f(a[0..n-1], b[2 * k..size(b) - 1], c[1])\n");
    const File& f = p->file;
    REQUIRE(f.stmts[0].args.size() == 3);
    CHECK(show(f, p->syms, f.stmts[0].args[0]) == "a[0..(n-1)]");
    CHECK(show(f, p->syms, f.stmts[0].args[1]) == "b[(2*k)..(size(b)-1)]");
    CHECK(show(f, p->syms, f.stmts[0].args[2]) == "c[1]");
    CHECK(error_of("f(a[0..])\n") == "1:8: expected an expression (a name, a number, 'pi' or '('), found ']'");
    CHECK(error_of("f(a[0..2)\n") == "1:9: expected ']' after the slice's last index, found ')'");
}

TEST_CASE("binary operators associate to the left") {
    auto p = parse("t ^= a & b & c\nlet k = 8 - 4 - 2\n");
    CHECK(show(p->file, p->syms, p->file.stmts[0].expr) == "((a&b)&c)");
    CHECK(show(p->file, p->syms, p->file.stmts[1].expr) == "((8-4)-2)");
}

TEST_CASE("every statement form parses") {
    auto p = parse(R"(let n = 4
qubit a[n], b[n], flag
ancilla w[2]
borrow d
bit c[3]
h a[0]; ~t flag; rz(pi/4) a[1]; u(0.1, 0.2, 0.3) a[2]; xx(pi/2) a[0], a[1]; iswap a[0], a[1]; r(pi, 0) a[0]
b[0] ^= a[0] & a[1]
a[0] <-> b[0]
phase(pi) a[0] & a[1]
when a[0] & !a[1] { h b[0] }
routine maj(x, y, z) { y ^= z }
routine rot(r[], int k, angle th) { rz(th) r[k] }
maj(a[0], b[0], w[0]); ~maj(a[0], b[0], w[0])
compute { w[0] ^= a[0] }
then { z w[0] }
for i in 0..n-1 { b[i] ^= a[i] }
repeat 3 { t flag }
use "arith"
measure w[0] as m
if m { x a[0] }
if !m { x a[0] }
if c == 5 { x a[0] }
reset a[0], a[1]
barrier a, b
@compute(7) x a[0]
@uncompute(7) { x a[0]; h a[1] }
)");
    const File& f = p->file;
    std::vector<StmtKind> kinds;
    for (uint32_t s : f.blocks[0]) kinds.push_back(f.stmts[s].kind);
    std::vector<StmtKind> want = {
        StmtKind::Let, StmtKind::Decl, StmtKind::Decl, StmtKind::Decl, StmtKind::Bits, StmtKind::Gate,
        StmtKind::Gate, StmtKind::Gate, StmtKind::Gate, StmtKind::Gate, StmtKind::Gate, StmtKind::Gate,
        StmtKind::XorAssign, StmtKind::Swap, StmtKind::Phase, StmtKind::When, StmtKind::Call, StmtKind::Call,
        StmtKind::Compute, StmtKind::For, StmtKind::Repeat, StmtKind::Use, StmtKind::Measure, StmtKind::If,
        StmtKind::If, StmtKind::If, StmtKind::Reset, StmtKind::Barrier, StmtKind::Tagged, StmtKind::Tagged};
    CHECK(kinds == want);
    REQUIRE(f.routines.size() == 2);
    CHECK(f.routines[1].params[0].kind == ParamKind::Register);
    CHECK(f.routines[1].params[1].kind == ParamKind::Int);
    CHECK(f.routines[1].params[2].kind == ParamKind::Angle);
    CHECK(f.strings[0] == "arith");
    const Stmt& inv = f.stmts[f.blocks[0][17]];
    CHECK(inv.inverse);
    const Stmt& tag = f.stmts[f.blocks[0][29]];
    CHECK(tag.value == 7);
    CHECK(tag.half == ir::PairHalf::Uncompute);
}

TEST_CASE("a register named like a gate still works as an assignment target") {
    auto p = parse("x ^= h\nx[0] <-> t\n");
    CHECK(p->file.stmts[0].kind == StmtKind::XorAssign);
    CHECK(p->file.stmts[1].kind == StmtKind::Swap);
}

TEST_CASE("newlines inside parentheses and brackets are blanks") {
    auto p = parse("t ^= (a &\n b)\nrz(\npi) q\n");
    CHECK(p->file.blocks[0].size() == 2);
}

TEST_CASE("syntax errors are located and say what was expected") {
    CHECK(error_of("h\n") == "1:2: expected a wire after 'h', found end of line");
    CHECK(error_of("qubit a[2\n") == "1:10: expected ']' after the index, found end of file");
    CHECK(error_of("rz q\n") == "1:4: expected '(' and 1 angle after 'rz', found 'q'");
    CHECK(error_of("rz(1, 2) q\n") == "1:8: rz takes 1 angle, found 2");
    CHECK(error_of("when a { h a\n") == "1:13: expected '}' to close the block, found end of file");
    CHECK(error_of("}\n") == "1:1: unexpected '}': no block is open here");
    CHECK(error_of("for i 0..3 { }\n") == "1:7: expected 'in' after the loop variable, found '0'");
    CHECK(error_of("for i in 0...3 { }\n").find("expected") != std::string::npos);
    CHECK(error_of("t ^= a &\n") == "1:9: expected an expression (a name, a number, 'pi' or '('), found end of line");
    CHECK(error_of("h a $\n") == "1:5: unexpected character '$'");
    CHECK(error_of("use \"x.wq\n") == "1:5: unterminated string: expected a closing '\"' on the same line");
    CHECK(error_of("let k = 99999999999999999999\n") == "1:9: integer literal is too large (the limit is 2^63-1)");
    CHECK(error_of("foo a\n") == "1:5: expected '^=' or '<->' after 'foo' (or '(' to call a routine 'foo'), found 'a'");
    CHECK(error_of("compute { x a } { x a }\n") == "1:17: expected 'then' after the compute block, found '{'");
    CHECK(error_of("when a { routine f() { } }\n") == "1:10: routines must be defined at the top level of a file");
}

TEST_CASE("deep nesting stops at the limit with a message, not a crash") {
    std::string deep = "t ^= " + std::string(20000, '(') + "a" + std::string(20000, ')') + "\n";
    CHECK(error_of(deep) == "1:10006: expression nested deeper than the limit of 10000");
    std::string nots = "t ^= " + std::string(20000, '!') + "a\n";
    CHECK(error_of(nots).find("expression nested deeper than the limit") != std::string::npos);
    std::string chain = "t ^= a";
    for (int i = 0; i < 20000; ++i) chain += " & a";
    CHECK(error_of(chain + "\n").find("expression nested deeper than the limit") != std::string::npos);
    std::string blocks;
    for (int i = 0; i < 5000; ++i) blocks += "when a { ";
    CHECK(error_of(blocks).find("blocks nested deeper than the limit of 1000") != std::string::npos);
    Limits small;
    small.max_expr_depth = 3;
    CHECK(error_of("t ^= (((a)))\n", small).empty());
    CHECK(error_of("t ^= ((((a))))\n", small) == "1:9: expression nested deeper than the limit of 3");
}

TEST_CASE("binary junk never crashes the parser") {
    std::mt19937_64 rng(3);
    for (int i = 0; i < 300; ++i) {
        std::string junk(size_t(rng() % 400), '\0');
        for (char& ch : junk) ch = char(rng() & 0xff);
        if (i % 2) junk = "qubit a[2]\nh a[0]\n" + junk;  // junk after a valid start
        std::string err = error_of(junk);
        (void)err;  // any outcome but a crash; most are errors
    }
    CHECK(!error_of(std::string("\x7f" "ELF\x02\x01\x01\0\0\0", 10)).empty());
}
