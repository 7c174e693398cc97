// The .wq grammar: recursive descent over the X3-scanned tokens, building the flat syntax tree.
#include "frontend/wq_grammar.h"

#include <cctype>

#include <fmt/format.h>

#include "frontend/wq_lexer.h"

namespace whittle::frontend {

uint32_t SymbolTable::intern(std::string_view s) {
    auto it = ids_.find(s);
    if (it != ids_.end()) return it->second;
    uint32_t id = uint32_t(names_.size());
    names_.emplace_back(s);
    ids_.emplace(std::string(s), id);
    return id;
}

namespace {

struct GateInfo {
    const char* name;
    Gate gate;
    int angles;
    int wires;
};

constexpr GateInfo kGates[] = {
    {"h", Gate::H, 0, 1},   {"x", Gate::X, 0, 1},   {"y", Gate::Y, 0, 1},   {"z", Gate::Z, 0, 1},
    {"s", Gate::S, 0, 1},   {"t", Gate::T, 0, 1},   {"sx", Gate::SX, 0, 1}, {"rx", Gate::RX, 1, 1},
    {"ry", Gate::RY, 1, 1}, {"rz", Gate::RZ, 1, 1}, {"u", Gate::U, 3, 1},   {"r", Gate::R, 2, 1},
    {"xx", Gate::XX, 1, 2}, {"iswap", Gate::ISwap, 0, 2},
};

/// The .wq spelling of gates other languages write as calls (`cx a, b`), for the error message.
const char* foreign_gate_hint(std::string_view word) {
    std::string w(word);
    for (char& ch : w) ch = char(std::tolower(static_cast<unsigned char>(ch)));
    if (w == "cx" || w == "cnot") return "a CNOT is written `b ^= a` (target ^= control)";
    if (w == "ccx" || w == "toffoli" || w == "ccnot") return "a Toffoli is written `c ^= a & b`";
    if (w == "mcx") return "a multi-controlled X is written `t ^= a & b & c` (or `when a & b & c { x t }`)";
    if (w == "cz") return "a CZ is written `phase(pi) a & b`";
    if (w == "ccz") return "a CCZ is written `phase(pi) a & b & c`";
    if (w == "swap") return "a swap is written `a <-> b`";
    if (w == "cswap" || w == "fredkin") return "a controlled swap is written `when c { a <-> b }`";
    if (w == "tdg" || w == "sdg") return "an inverse gate is written with '~' (`~t q`, `~s q`)";
    return nullptr;
}

const GateInfo* find_gate(std::string_view name) {
    for (const GateInfo& g : kGates)
        if (name == g.name) return &g;
    return nullptr;
}

std::string describe(const Token& t) {
    switch (t.kind) {
    case Tok::Ident: return fmt::format("'{}'", t.text);
    case Tok::Int:
    case Tok::Real: return fmt::format("'{}'", t.text);
    case Tok::String: return fmt::format("\"{}\"", t.text);
    case Tok::Bad: {
        std::string s;
        for (char ch : t.text) {
            auto u = static_cast<unsigned char>(ch);
            s += (u >= 32 && u < 127) ? std::string(1, ch) : fmt::format("\\x{:02x}", u);
        }
        return fmt::format("unexpected character '{}'", s);
    }
    default: return tok_name(t.kind);
    }
}

class Parser {
public:
    Parser(const SourceManager& sm, uint32_t file_id, SymbolTable& syms, const Limits& limits)
        : lex_(sm.text(file_id)), syms_(syms), limits_(limits) {
        file_.file_id = file_id;
        // Growth would copy the arenas several times on big inputs; untouched reserve costs no memory.
        const size_t n = sm.text(file_id).size();
        file_.exprs.reserve(n / 2 + 16);
        file_.stmts.reserve(n / 10 + 16);
        pi_ = syms_.intern("pi");
        advance();
    }

    File run() {
        file_.blocks.emplace_back();
        file_.blocks[0].reserve(file_.stmts.capacity());
        parse_statements(0, Tok::End);
        return std::move(file_);
    }

private:
    // ---- tokens ----
    void advance() {
        if (cur_.kind != Tok::Newline && cur_.kind != Tok::End) {
            // One past the token's last character: strings and quoted names carry their delimiters.
            const bool delimited = cur_.kind == Tok::String || (cur_.kind == Tok::Ident && cur_.quoted);
            last_line_ = cur_.line;
            last_end_col_ = cur_.col + uint32_t(cur_.text.size()) + (delimited ? 2 : 0);
        }
        if (has_peek_) {
            cur_ = peek_;
            has_peek_ = false;
            return;
        }
        cur_ = lex_.next(nest_ > 0);
    }
    const Token& peek() {
        if (!has_peek_) {
            peek_ = lex_.next(nest_ > 0);
            has_peek_ = true;
        }
        return peek_;
    }
    bool is(Tok k) const { return cur_.kind == k; }
    bool is_word(std::string_view w) const { return cur_.kind == Tok::Ident && !cur_.quoted && cur_.text == w; }

    [[noreturn]] void fail(const Token& t, const std::string& msg) const {
        throw UserError(msg, file_.loc(t.line, t.col));
    }
    /// A missing piece at a line end or the end of the file is located just after the last token
    /// read (where it belongs), not at the next line.
    [[noreturn]] void expected(const std::string& what) const {
        const std::string msg = fmt::format("expected {}, found {}", what, describe(cur_));
        if ((cur_.kind == Tok::End || cur_.kind == Tok::Newline) && last_line_ > 0)
            throw UserError(msg, file_.loc(last_line_, last_end_col_));
        fail(cur_, msg);
    }
    void check_bad() const {
        if (cur_.kind == Tok::Bad) {
            if (cur_.text == "\"") fail(cur_, "unterminated string: expected a closing '\"' on the same line");
            fail(cur_, describe(cur_));
        }
    }
    // Opening and closing brackets: inside ( ) and [ ] line ends are blanks.
    void open(Tok k, const char* what) {
        if (!is(k)) expected(what);
        ++nest_;
        advance();
    }
    void close(Tok k, const char* what) {
        if (!is(k)) expected(what);
        --nest_;
        advance();
    }
    void expect(Tok k, const char* what) {
        if (!is(k)) expected(what);
        advance();
    }
    uint32_t expect_ident(const char* what) {
        if (!is(Tok::Ident)) expected(what);
        uint32_t s = syms_.intern(cur_.text);
        advance();
        return s;
    }

    // ---- expressions ----
    struct DepthGuard {
        uint32_t& d;
        DepthGuard(Parser& p, const Token& at) : d(p.expr_nesting_) {
            if (++d > p.limits_.max_expr_depth)
                p.fail(at, fmt::format("expression nested deeper than the limit of {}", p.limits_.max_expr_depth));
        }
        ~DepthGuard() { --d; }
    };

    uint32_t node(ExprKind k, const Token& at, uint32_t lhs = kNone, uint32_t rhs = kNone) {
        Expr e;
        e.kind = k;
        e.line = at.line;
        e.col = at.col;
        e.lhs = lhs;
        e.rhs = rhs;
        uint32_t d = 0;
        if (lhs != kNone) d = file_.exprs[lhs].depth;
        if (rhs != kNone) d = std::max(d, file_.exprs[rhs].depth);
        e.depth = d + 1;
        if (e.depth > limits_.max_expr_depth)
            fail(at, fmt::format("expression nested deeper than the limit of {}", limits_.max_expr_depth));
        file_.exprs.push_back(e);
        return uint32_t(file_.exprs.size() - 1);
    }

    static int precedence(Tok k) {
        switch (k) {
        case Tok::EqEq:
        case Tok::NotEq:
        case Tok::Less:
        case Tok::LessEq:
        case Tok::Greater:
        case Tok::GreaterEq: return 1;
        case Tok::Bar: return 2;
        case Tok::Caret: return 3;
        case Tok::Amp: return 4;
        case Tok::Shl:
        case Tok::Shr: return 5;
        case Tok::Plus:
        case Tok::Minus: return 6;
        case Tok::Star:
        case Tok::Slash:
        case Tok::Percent: return 7;
        default: return 0;
        }
    }
    static ExprKind binary_kind(Tok k) {
        switch (k) {
        case Tok::Bar: return ExprKind::Or;
        case Tok::Caret: return ExprKind::Xor;
        case Tok::Amp: return ExprKind::And;
        case Tok::Plus: return ExprKind::Add;
        case Tok::Minus: return ExprKind::Sub;
        case Tok::Star: return ExprKind::Mul;
        case Tok::Slash: return ExprKind::Div;
        case Tok::Shl: return ExprKind::Shl;
        case Tok::Shr: return ExprKind::Shr;
        case Tok::EqEq: return ExprKind::Eq;
        case Tok::NotEq: return ExprKind::Ne;
        case Tok::Less: return ExprKind::Lt;
        case Tok::LessEq: return ExprKind::Le;
        case Tok::Greater: return ExprKind::Gt;
        case Tok::GreaterEq: return ExprKind::Ge;
        default: return ExprKind::Mod;
        }
    }

    /// Precedence climbing: iterative over operators of one level, recursive only for higher levels
    /// (at most seven deep) and for parentheses / unary operators (guarded).
    uint32_t parse_expr(int min_prec = 1) {
        uint32_t lhs = parse_unary();
        for (;;) {
            int p = precedence(cur_.kind);
            if (p < min_prec || p == 0) return lhs;
            Token op = cur_;
            advance();
            uint32_t rhs = parse_expr(p + 1);
            lhs = node(binary_kind(op.kind), op, lhs, rhs);
        }
    }

    uint32_t parse_unary() {
        if (is(Tok::Minus) || is(Tok::Bang)) {
            Token op = cur_;
            DepthGuard g(*this, op);
            advance();
            uint32_t inner = parse_unary();
            return node(op.kind == Tok::Minus ? ExprKind::Neg : ExprKind::Not, op, inner);
        }
        return parse_primary();
    }

    uint32_t parse_primary() {
        check_bad();
        Token t = cur_;
        switch (t.kind) {
        case Tok::Int: {
            if (t.overflow || t.ival > uint64_t(INT64_MAX)) fail(t, "integer literal is too large (the limit is 2^63-1)");
            advance();
            uint32_t n = node(ExprKind::Int, t);
            file_.exprs[n].ival = int64_t(t.ival);
            return n;
        }
        case Tok::Real: {
            advance();
            uint32_t n = node(ExprKind::Real, t);
            file_.exprs[n].dval = t.dval;
            return n;
        }
        case Tok::LParen: {
            DepthGuard g(*this, t);
            open(Tok::LParen, "'('");
            uint32_t inner = parse_expr();
            close(Tok::RParen, "')' to close the parenthesis");
            return inner;
        }
        case Tok::Ident: {
            uint32_t sym = syms_.intern(t.text);
            advance();
            if (sym == pi_ && !t.quoted) return node(ExprKind::Pi, t);
            return parse_name_tail(sym, t);
        }
        case Tok::LBracket: {  // a table of integers: [e0, e1, ...]
            DepthGuard g(*this, t);
            open(Tok::LBracket, "'['");
            std::vector<uint32_t> entries;
            if (!is(Tok::RBracket)) {
                entries.push_back(parse_expr());
                while (is(Tok::Comma)) {
                    advance();
                    entries.push_back(parse_expr());
                }
            }
            close(Tok::RBracket, "',' or ']' in the table");
            uint32_t n = node(ExprKind::Table, t);
            file_.exprs[n].ival = int64_t(file_.tables.size());
            file_.tables.push_back(std::move(entries));
            return n;
        }
        default: expected("an expression (a name, a number, 'pi' or '(')");
        }
    }

    uint32_t parse_name_tail(uint32_t sym, const Token& t) {
        if (is(Tok::LBracket)) {
            DepthGuard g(*this, t);
            open(Tok::LBracket, "'['");
            uint32_t idx = parse_expr();
            if (is(Tok::DotDot)) {  // a slice r[i..j]
                advance();
                uint32_t last = parse_expr();
                close(Tok::RBracket, "']' after the slice's last index");
                uint32_t n = node(ExprKind::Slice, t, idx, last);
                file_.exprs[n].sym = sym;
                return n;
            }
            close(Tok::RBracket, "']' after the index");
            uint32_t n = node(ExprKind::Index, t, idx);
            file_.exprs[n].sym = sym;
            return n;
        }
        if (is(Tok::LParen)) {
            DepthGuard g(*this, t);
            open(Tok::LParen, "'('");
            uint32_t arg = parse_expr();
            close(Tok::RParen, "')' after the argument");
            uint32_t n = node(ExprKind::Call, t, arg);
            file_.exprs[n].sym = sym;
            return n;
        }
        uint32_t n = node(ExprKind::Name, t);
        file_.exprs[n].sym = sym;
        return n;
    }

    /// A wire or register reference: `name` or `name[index]`.
    uint32_t parse_wire(const char* what) {
        if (!is(Tok::Ident)) expected(what);
        Token t = cur_;
        uint32_t sym = syms_.intern(t.text);
        if (sym == pi_ && !t.quoted) fail(t, fmt::format("expected {}, found 'pi'", what));
        advance();
        if (is(Tok::LParen)) expected(fmt::format("{} (not a call)", what));
        return parse_name_tail(sym, t);
    }

    /// `( expr, ... )` with exactly `n` entries (n < 0: any number).
    void parse_args(IndexVec& out, int n, const char* what) {
        open(Tok::LParen, "'('");
        if (!is(Tok::RParen)) {
            out.push_back(parse_expr());
            while (is(Tok::Comma)) {
                advance();
                out.push_back(parse_expr());
            }
        }
        Token at = cur_;
        close(Tok::RParen, n == 1 ? "')' after the angle" : "',' or ')' in the argument list");
        if (n >= 0 && int(out.size()) != n)
            fail(at, fmt::format("{} takes {} angle{}, found {}", what, n, n == 1 ? "" : "s", out.size()));
    }

    // ---- statements ----
    uint32_t new_stmt(StmtKind k, const Token& at) {
        Stmt s;
        s.kind = k;
        s.line = at.line;
        s.col = at.col;
        file_.stmts.push_back(std::move(s));
        return uint32_t(file_.stmts.size() - 1);
    }
    Stmt& st(uint32_t i) { return file_.stmts[i]; }

    /// Statements up to `close` (End or RBrace, not consumed) into block `b`.
    void parse_statements(uint32_t b, Tok close_tok) {
        for (;;) {
            while (is(Tok::Newline) || is(Tok::Semi)) advance();
            if (is(close_tok)) return;
            if (is(Tok::End)) expected("'}' to close the block");
            if (is(Tok::RBrace)) fail(cur_, "unexpected '}': no block is open here");
            uint32_t s = parse_statement();
            if (s != kNone) file_.blocks[b].push_back(s);
            if (is(Tok::Newline) || is(Tok::Semi) || is(Tok::RBrace) || is(Tok::End)) continue;
            check_bad();
            expected("a line end or ';' after the statement");
        }
    }

    uint32_t parse_block(const char* owner) {
        if (!is(Tok::LBrace)) expected(fmt::format("'{{' to open the block of '{}'", owner));
        if (++block_nesting_ > limits_.max_block_depth)
            fail(cur_, fmt::format("blocks nested deeper than the limit of {}", limits_.max_block_depth));
        advance();
        uint32_t b = uint32_t(file_.blocks.size());
        file_.blocks.emplace_back();
        parse_statements(b, Tok::RBrace);
        advance();  // '}'
        --block_nesting_;
        return b;
    }

    uint32_t parse_statement() {
        check_bad();
        Token t = cur_;
        if (is(Tok::Tilde)) {
            advance();
            if (!is(Tok::Ident)) expected("a gate or routine call after '~'");
            uint32_t s = parse_gate_or_call(true);
            st(s).line = t.line;
            st(s).col = t.col;
            return s;
        }
        if (is(Tok::At)) return parse_tag();
        if (is(Tok::LBrace)) fail(t, "a block needs an owner: expected 'when', 'compute', 'for', 'repeat' or 'if' before '{'");
        if (!is(Tok::Ident)) expected("a statement");
        Tok next = peek().kind;
        if (next == Tok::XorEq || next == Tok::LBracket || next == Tok::SwapArrow) return parse_assignment();
        if (t.quoted) return parse_gate_or_call(false);  // `name` is never a keyword
        std::string_view w = t.text;
        if (w == "let") return parse_let();
        if (w == "qubit" || w == "ancilla" || w == "borrow" || w == "bit") return parse_decl();
        if (w == "routine") return parse_routine();
        if (w == "when") {
            advance();
            uint32_t s = new_stmt(StmtKind::When, t);
            uint32_t e = parse_expr();
            st(s).expr = e;
            uint32_t b = parse_block("when");
            st(s).body = b;
            return s;
        }
        if (w == "compute") {
            advance();
            uint32_t s = new_stmt(StmtKind::Compute, t);
            uint32_t b = parse_block("compute");
            st(s).body = b;
            while (is(Tok::Newline)) advance();
            if (!is_word("then")) expected("'then' after the compute block");
            advance();
            uint32_t b2 = parse_block("then");
            st(s).body2 = b2;
            return s;
        }
        if (w == "for") return parse_for();
        if (w == "repeat") {
            advance();
            uint32_t s = new_stmt(StmtKind::Repeat, t);
            uint32_t e = parse_expr();
            st(s).expr = e;
            uint32_t b = parse_block("repeat");
            st(s).body = b;
            return s;
        }
        if (w == "use") {
            advance();
            check_bad();
            if (!is(Tok::String)) expected("a file name in double quotes after 'use'");
            uint32_t s = new_stmt(StmtKind::Use, t);
            st(s).path = uint32_t(file_.strings.size());
            file_.strings.emplace_back(cur_.text);
            advance();
            return s;
        }
        if (w == "measure") {
            advance();
            uint32_t s = new_stmt(StmtKind::Measure, t);
            uint32_t q = parse_wire("the wire to measure");
            st(s).targets.push_back(q);
            if (!is_word("as")) expected("'as' and a bit name after the measured wire");
            advance();
            uint32_t m = parse_wire("a classical bit name after 'as'");
            st(s).expr = m;
            return s;
        }
        if (w == "if") return parse_if();
        if (w == "reset" || w == "barrier") {
            advance();
            uint32_t s = new_stmt(w == "reset" ? StmtKind::Reset : StmtKind::Barrier, t);
            bool any = is(Tok::Ident);
            if (!any && w == "reset") expected("a wire to reset");
            if (any) parse_target_list(s);
            return s;
        }
        if (w == "phase") {
            advance();
            uint32_t s = new_stmt(StmtKind::Phase, t);
            IndexVec a;
            parse_args(a, 1, "phase");
            st(s).args = a;
            uint32_t e = parse_expr();
            st(s).expr = e;
            return s;
        }
        if (w == "then") fail(t, "'then' without 'compute': expected 'compute { ... } then { ... }'");
        if (w == "else") fail(t, "'else' without 'if': write it after the '}' of the 'if' block, on the same line");
        return parse_gate_or_call(false);
    }

    void parse_target_list(uint32_t s) {
        uint32_t q = parse_wire("a wire");
        st(s).targets.push_back(q);
        while (is(Tok::Comma)) {
            advance();
            q = parse_wire("a wire after ','");
            st(s).targets.push_back(q);
        }
    }

    uint32_t parse_gate_or_call(bool inverse) {
        Token t = cur_;
        if (const GateInfo* g = t.quoted ? nullptr : find_gate(t.text)) {
            advance();
            uint32_t s = new_stmt(StmtKind::Gate, t);
            st(s).gate = g->gate;
            st(s).inverse = inverse;
            if (g->angles > 0) {
                if (!is(Tok::LParen)) expected(fmt::format("'(' and {} angle{} after '{}'", g->angles, g->angles == 1 ? "" : "s", g->name));
                IndexVec a;
                parse_args(a, g->angles, g->name);
                st(s).args = a;
            } else if (is(Tok::LParen)) {
                fail(cur_, fmt::format("gate '{}' takes no angle", g->name));
            }
            if (!is(Tok::Ident)) expected(fmt::format("a wire after '{}'", g->name));
            parse_target_list(s);
            return s;
        }
        if (peek().kind != Tok::LParen) {
            if (is_word("as") || is_word("in") || is_word("int") || is_word("angle"))
                fail(t, fmt::format("'{}' cannot start a statement", t.text));
            if (const char* hint = foreign_gate_hint(t.text); hint && peek().kind == Tok::Ident)
                fail(t, fmt::format("'{}' is not a .wq gate: {}", t.text, hint));
            advance();
            fail(cur_, fmt::format("expected '^=' or '<->' after '{}' (or '(' to call a routine '{}'), found {}", t.text,
                                   t.text, describe(cur_)));
        }
        uint32_t s = new_stmt(StmtKind::Call, t);
        st(s).sym = syms_.intern(t.text);
        st(s).inverse = inverse;
        advance();
        IndexVec a;
        parse_args(a, -1, "call");
        st(s).args = a;
        return s;
    }

    uint32_t parse_assignment() {
        Token t = cur_;
        uint32_t target = parse_wire("a wire");
        if (is(Tok::XorEq)) {
            advance();
            uint32_t s = new_stmt(StmtKind::XorAssign, t);
            st(s).expr2 = target;
            uint32_t e = parse_expr();
            st(s).expr = e;
            return s;
        }
        if (is(Tok::SwapArrow)) {
            advance();
            uint32_t s = new_stmt(StmtKind::Swap, t);
            st(s).expr2 = target;
            uint32_t b = parse_wire("a wire after '<->'");
            st(s).expr3 = b;
            return s;
        }
        expected("'^=' or '<->' after the wire");
    }

    uint32_t parse_let() {
        Token t = cur_;
        advance();
        uint32_t s = new_stmt(StmtKind::Let, t);
        uint32_t sym = expect_ident("a name after 'let'");
        st(s).sym = sym;
        expect(Tok::Assign, "'=' after the name in 'let'");
        uint32_t e = parse_expr();
        st(s).expr = e;
        return s;
    }

    uint32_t parse_decl() {
        Token t = cur_;
        bool bits = t.text == "bit";
        uint32_t s = new_stmt(bits ? StmtKind::Bits : StmtKind::Decl, t);
        if (t.text == "ancilla") st(s).role = ir::Role::Clean;
        if (t.text == "borrow") st(s).role = ir::Role::Dirty;
        advance();
        for (;;) {
            if (!is(Tok::Ident)) expected(fmt::format("a name to declare after '{}'", t.text));
            uint32_t w = parse_wire("a name to declare");
            if (file_.exprs[w].kind == ExprKind::Call) fail(t, "expected a name to declare");
            if (file_.exprs[w].kind == ExprKind::Slice)
                throw UserError("a declaration takes a size, name[n], not a slice name[i..j]", file_.loc_of(file_.exprs[w]));
            st(s).targets.push_back(w);
            if (!is(Tok::Comma)) break;
            advance();
        }
        return s;
    }

    uint32_t parse_routine() {
        Token t = cur_;
        if (block_nesting_ > 0) fail(t, "routines must be defined at the top level of a file");
        advance();
        Routine r;
        r.line = t.line;
        r.col = t.col;
        Token name = cur_;
        r.sym = expect_ident("a routine name after 'routine'");
        if (find_gate(name.text)) fail(name, fmt::format("'{}' is a built-in gate and cannot name a routine", name.text));
        open(Tok::LParen, "'(' and the parameter list");
        while (!is(Tok::RParen)) {
            Param p;
            p.line = cur_.line;
            p.col = cur_.col;
            if (is_word("int") || is_word("angle")) {
                p.kind = cur_.text == "int" ? ParamKind::Int : ParamKind::Angle;
                advance();
            }
            p.sym = expect_ident("a parameter name");
            if (is(Tok::LBracket)) {
                if (p.kind == ParamKind::Angle) expected("',' or ')' (angle parameters take no '[]')");
                advance();
                expect(Tok::RBracket, p.kind == ParamKind::Int ? "']' right after '[' (a table parameter is written 'int name[]')"
                                                               : "']' right after '[' (a register parameter is written 'name[]')");
                p.kind = p.kind == ParamKind::Int ? ParamKind::IntTable : ParamKind::Register;
            }
            r.params.push_back(p);
            if (is(Tok::Comma)) {
                advance();
                continue;
            }
            if (!is(Tok::RParen)) expected("',' or ')' in the parameter list");
        }
        close(Tok::RParen, "')'");
        r.body = parse_block("routine");
        file_.routines.push_back(std::move(r));
        return kNone;
    }

    uint32_t parse_for() {
        Token t = cur_;
        advance();
        uint32_t s = new_stmt(StmtKind::For, t);
        uint32_t sym = expect_ident("a loop variable after 'for'");
        st(s).sym = sym;
        if (!is_word("in")) expected("'in' after the loop variable");
        advance();
        uint32_t a = parse_expr();
        st(s).expr = a;
        expect(Tok::DotDot, "'..' between the loop bounds (for i in first..last)");
        uint32_t b = parse_expr();
        st(s).expr2 = b;
        uint32_t body = parse_block("for");
        st(s).body = body;
        return s;
    }

    /// `if m { }`, `if !m { }`, `if m == 5 { }` on classical bits, or `if EXPR { } [else { }]` on a
    /// compile-time integer (nonzero = true). Which one a name means is decided at elaboration.
    uint32_t parse_if() {
        Token t = cur_;
        advance();
        uint32_t s = new_stmt(StmtKind::If, t);
        uint32_t cond = parse_expr();
        st(s).expr = cond;
        const Expr& c = file_.exprs[cond];
        auto name_of = [&](uint32_t e) { return file_.exprs[e].kind == ExprKind::Name ? file_.exprs[e].sym : kNone; };
        if (c.kind == ExprKind::Name) {
            st(s).sym = c.sym;
        } else if (c.kind == ExprKind::Not && name_of(c.lhs) != kNone) {
            st(s).sym = name_of(c.lhs);
            st(s).inverse = true;
        } else if (c.kind == ExprKind::Eq && name_of(c.lhs) != kNone && file_.exprs[c.rhs].kind == ExprKind::Int) {
            st(s).sym = name_of(c.lhs);
            st(s).value = uint64_t(file_.exprs[c.rhs].ival);
            st(s).has_value = true;
        }
        uint32_t b = parse_block("if");
        st(s).body = b;
        if (is_word("else")) {
            advance();
            if (is_word("if")) {
                uint32_t inner = parse_if();
                uint32_t eb = uint32_t(file_.blocks.size());
                file_.blocks.emplace_back(1, inner);
                st(s).body2 = eb;
            } else {
                uint32_t eb = parse_block("else");
                st(s).body2 = eb;
            }
        }
        return s;
    }

    uint32_t parse_tag() {
        Token t = cur_;
        advance();
        uint32_t s = new_stmt(StmtKind::Tagged, t);
        if (is_word("compute")) st(s).half = ir::PairHalf::Compute;
        else if (is_word("uncompute")) st(s).half = ir::PairHalf::Uncompute;
        else expected("'compute' or 'uncompute' after '@'");
        advance();
        open(Tok::LParen, "'(' and a pair number");
        if (!is(Tok::Int) || cur_.overflow || cur_.ival == 0 || cur_.ival > 0xfffffff0u)
            expected("a positive pair number");
        st(s).value = cur_.ival;
        advance();
        close(Tok::RParen, "')' after the pair number");
        if (is(Tok::LBrace)) {
            uint32_t b = parse_block("@tag");
            st(s).body = b;
            return s;
        }
        if (is(Tok::At)) fail(cur_, "an op carries one pair tag: expected a statement or a block after the tag");
        uint32_t inner = parse_statement();
        if (inner == kNone) fail(t, "a pair tag cannot be put on a routine definition");
        uint32_t b = uint32_t(file_.blocks.size());
        file_.blocks.emplace_back(1, inner);
        st(s).body = b;
        return s;
    }

    Lexer lex_;
    SymbolTable& syms_;
    const Limits& limits_;
    File file_;
    Token cur_, peek_;
    bool has_peek_ = false;
    uint32_t last_line_ = 0, last_end_col_ = 0;  ///< just after the last token read (for "expected")
    uint32_t nest_ = 0;
    uint32_t expr_nesting_ = 0;
    uint32_t block_nesting_ = 0;
    uint32_t pi_ = 0;
};

}  // namespace

File parse_wq_syntax(const SourceManager& sm, uint32_t file_id, SymbolTable& symbols, const Limits& limits) {
    Parser p(sm, file_id, symbols, limits);
    return p.run();
}

}  // namespace whittle::frontend
