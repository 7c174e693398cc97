// OpenQASM 2.0 import: a recursive-descent parser that elaborates as it reads (registers, gate
// definitions expanded inline, register-wide broadcasting, `if`), producing high-level IR ops.
#include "frontend/qasm2_import.h"

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string_view>
#include <unordered_map>

#include <fmt/format.h>

#include "frontend/qasm2/expr.h"
#include "frontend/qasm2/header_gates.h"
#include "frontend/qasm2/lexer.h"
#include "ir/qasm_annotation.h"

namespace whittle::frontend {
namespace {

using ir::SourceLoc;
using qasm2::ExprArena;
using qasm2::HeaderGate;
using qasm2::Lexer;
using qasm2::Tok;
using qasm2::Token;
using qasm2::Value;

constexpr uint32_t kMaxExprDepth = 500;  // well inside the stack even in sanitizer builds

/// One statement of a gate body: a call with its parameter expressions and formal-qubit indices,
/// or a barrier over formal qubits.
struct BodyOp {
    bool barrier = false;
    std::string name;
    SourceLoc loc;
    std::vector<uint32_t> params;  // expression roots in the gate's arena
    std::vector<uint32_t> qubits;  // indices into the gate's qubit formals
};

struct GateDef {
    std::string name;
    SourceLoc loc;
    bool opaque = false;
    uint32_t num_params = 0;
    uint32_t num_qubits = 0;
    ExprArena arena;
    std::vector<BodyOp> body;
};

/// A top-level qubit argument: one qubit, or a whole register (index < 0).
struct QArg {
    int reg = -1;
    int64_t index = -1;
    SourceLoc loc;
};

/// Hashes std::string and std::string_view alike, so maps keyed by name are searched with token views.
struct NameHash {
    using is_transparent = void;
    size_t operator()(std::string_view s) const { return std::hash<std::string_view>{}(s); }
};

/// The callee of a gate statement: a user definition or a header gate.
struct Callee {
    const GateDef* user = nullptr;
    const HeaderGate* header = nullptr;
    uint32_t num_params() const { return user ? user->num_params : header->num_params; }
    uint32_t num_qubits() const { return user ? user->num_qubits : header->num_qubits; }
};

class Importer {
public:
    Importer(SourceManager& sm, const LoadOptions& opts) : sm_(sm), opts_(opts) {}

    ir::Circuit run(uint32_t file_id) {
        parse_file(file_id, true);
        apply_annotations(file_id);
        for (size_t i = 0; i < sm_.size(); ++i) c_.files.push_back(sm_.name(uint32_t(i)));
        return std::move(c_);
    }

private:
    // ---- reading -------------------------------------------------------------------------------

    Token expect(Lexer& lx, Tok kind, const char* context) {
        Token t = lx.take();
        if (t.kind != kind)
            throw UserError(fmt::format("expected {} {} but found {}", qasm2::token_name(kind), context, describe(t)), t.loc);
        return t;
    }

    static std::string describe(const Token& t) {
        if (t.kind == Tok::Ident) return fmt::format("'{}'", t.text);
        if (t.kind == Tok::Int || t.kind == Tok::Real) return fmt::format("the number {}", t.text);
        return qasm2::token_name(t.kind);
    }

    uint64_t parse_uint(const Token& t, const char* what) {
        if (t.kind != Tok::Int) throw UserError(fmt::format("expected {} but found {}", what, describe(t)), t.loc);
        uint64_t v = 0;
        for (char ch : t.text) {
            if (v > (UINT64_MAX - 9) / 10) throw UserError(fmt::format("integer {} is too large", t.text), t.loc);
            v = v * 10 + uint64_t(ch - '0');
        }
        return v;
    }

    void parse_file(uint32_t file_id, bool main) {
        // A gate statement is at least ~8 bytes ("h q[0];\n"): reserving for that many ops up front
        // saves the copies of a growing vector (untouched reserved pages cost no memory).
        if (main) c_.ops.reserve(std::min<size_t>(sm_.text(file_id).size() / 8, opts_.limits.max_ops));
        Lexer lx(sm_.text(file_id), file_id);
        if (lx.peek().kind == Tok::Ident && lx.peek().text == "OPENQASM") {
            lx.take();
            Token ver = lx.take();
            if ((ver.kind != Tok::Real && ver.kind != Tok::Int) ||
                Value::parse_literal(std::string(ver.text)).to_double() != 2.0)
                throw UserError(fmt::format("only OpenQASM 2.0 is read here, not version {}", ver.text.empty() ? describe(ver) : ver.text),
                                ver.loc);
            expect(lx, Tok::Semi, "after the version");
        } else if (main) {
            throw UserError("expected 'OPENQASM 2.0;' at the start of the file", lx.peek().loc);
        }
        while (lx.peek().kind != Tok::End) statement(lx, file_id);
    }

    /// `// whittle: qreg WRITTEN source NAME role ROLE` lines (output/qasm_names.h) in the main file:
    /// the register written as WRITTEN is the source's NAME, a `qubit`, `ancilla` or `borrow`.
    void apply_annotations(uint32_t file_id) {
        const std::string& text = sm_.text(file_id);
        const std::string_view marker = ir::kQasmAnnotation;
        std::vector<std::pair<int, std::string>> renames;
        uint32_t line = 1;
        for (size_t pos = 0; pos < text.size(); ++line) {
            size_t end = text.find('\n', pos);
            if (end == std::string::npos) end = text.size();
            const std::string_view l(text.data() + pos, end - pos);
            const size_t start = l.find_first_not_of(" \t");
            if (start != std::string_view::npos && l.substr(start, marker.size()) == marker) {
                const SourceLoc loc{uint16_t(file_id), line, uint32_t(start + 1)};
                std::vector<std::string> words;
                for (size_t i = start + marker.size(); i < l.size();) {
                    while (i < l.size() && (l[i] == ' ' || l[i] == '\t' || l[i] == '\r')) ++i;
                    size_t j = i;
                    while (j < l.size() && l[j] != ' ' && l[j] != '\t' && l[j] != '\r') ++j;
                    if (j > i) words.emplace_back(l.substr(i, j - i));
                    i = j;
                }
                if (words.size() != 5 || words[1] != "source" || words[3] != "role")
                    throw UserError("expected 'REGISTER source NAME role ROLE' after 'whittle: qreg'", loc);
                const int r = c_.find_register(words[0]);
                if (r < 0) throw UserError(fmt::format("the annotation names no quantum register '{}'", words[0]), loc);
                ir::Role role;
                if (words[4] == "qubit") role = ir::Role::Data;
                else if (words[4] == "ancilla") role = ir::Role::Clean;
                else if (words[4] == "borrow") role = ir::Role::Dirty;
                else throw UserError(fmt::format("unknown role '{}' (expected qubit, ancilla or borrow)", words[4]), loc);
                ir::Register& reg = c_.registers[size_t(r)];
                reg.role = role;
                for (uint32_t i = 0; i < reg.size; ++i) c_.qubits[reg.first + i].role = role;
                if (words[2] != words[0]) {
                    if (c_.find_register(words[2]) >= 0 || c_.find_creg(words[2]) >= 0)
                        throw UserError(fmt::format("the annotation's source name '{}' is already a register", words[2]), loc);
                    for (const auto& [other, name] : renames)
                        if (name == words[2])
                            throw UserError(fmt::format("two registers have the source name '{}'", words[2]), loc);
                    renames.emplace_back(r, words[2]);
                }
            }
            pos = end + 1;
        }
        for (const auto& [r, name] : renames) c_.registers[size_t(r)].name = name;
    }

    void statement(Lexer& lx, uint32_t file_id) {
        const Token& t = lx.peek();
        if (t.kind != Tok::Ident)
            throw UserError(fmt::format("expected a statement but found {}", describe(t)), t.loc);
        const std::string_view w = t.text;
        if (w == "include") return include(lx, file_id);
        if (w == "qreg" || w == "creg") return declare_register(lx);
        if (w == "gate" || w == "opaque") return define_gate(lx);
        if (w == "OPENQASM") throw UserError("'OPENQASM' may appear only once, at the start of the file", t.loc);
        cond_reg_ = -1;
        cond_value_ = 0;
        stmt_loc_ = t.loc;
        if (w == "if") return conditioned(lx);
        if (w == "barrier") return barrier(lx);
        quantum_op(lx);
    }

    void include(Lexer& lx, uint32_t file_id) {
        lx.take();
        Token name = expect(lx, Tok::String, "after 'include'");
        expect(lx, Tok::Semi, "after the include");
        if (name.text == "qelib1.inc") {
            if (qelib1_) return;
            for (const HeaderGate& g : qasm2::header_gates()) {
                auto it = gates_.find(std::string_view(g.name));
                // A program's own gate of a name the later headers added keeps its definition.
                if (!g.builtin && qasm2::in_2017_header(g.id) && it != gates_.end())
                    throw UserError(fmt::format("qelib1.inc defines '{}', which is already defined at {}:{}", g.name,
                                                uint32_t(it->second.loc.line), uint32_t(it->second.loc.column)),
                                    name.loc);
            }
            qelib1_ = true;
            callees_.clear();
            return;
        }
        if (include_stack_.size() >= opts_.limits.max_recursion)
            throw UserError(fmt::format("includes nested deeper than {} levels", opts_.limits.max_recursion), name.loc);
        namespace fs = std::filesystem;
        std::vector<fs::path> candidates{fs::path(sm_.name(file_id)).parent_path() / fs::path(name.text)};
        for (const std::string& d : opts_.include_dirs) candidates.push_back(fs::path(d) / fs::path(name.text));
        std::error_code ec;
        for (const fs::path& p : candidates) {
            if (!fs::is_regular_file(p, ec)) continue;
            std::string canon = fs::weakly_canonical(p, ec).string();
            for (const std::string& open : include_stack_)
                if (open == canon) throw UserError(fmt::format("'{}' includes itself (an include cycle)", name.text), name.loc);
            std::ifstream in(p, std::ios::binary);
            std::ostringstream ss;
            ss << in.rdbuf();
            if (ss.str().size() > opts_.limits.max_file_bytes)
                throw UserError(fmt::format("included file '{}' is over the limit of {} bytes", name.text,
                                            opts_.limits.max_file_bytes),
                                name.loc);
            uint32_t id = sm_.add(p.string(), ss.str(), name.loc);
            include_stack_.push_back(canon);
            parse_file(id, false);
            include_stack_.pop_back();
            return;
        }
        throw UserError(fmt::format("cannot find the included file '{}'", name.text), name.loc);
    }

    void declare_register(Lexer& lx) {
        Token kw = lx.take();
        Token name = expect(lx, Tok::Ident, fmt::format("after '{}'", kw.text).c_str());
        check_new_name(name);
        expect(lx, Tok::LBracket, "after the register name");
        Token size_tok = lx.take();
        uint64_t size = parse_uint(size_tok, "the register size");
        expect(lx, Tok::RBracket, "after the register size");
        expect(lx, Tok::Semi, "after the register declaration");
        if (size == 0) throw UserError(fmt::format("register '{}' must have at least one element", name.text), size_tok.loc);
        const uint64_t limit = opts_.limits.max_qubits;
        if (kw.text == "qreg") {
            if (size + c_.num_qubits() > limit)
                throw UserError(fmt::format("the program declares more than {} qubits", limit), size_tok.loc);
            c_.add_register(std::string(name.text), uint32_t(size), ir::Role::Data);
            c_.registers.back().loc = name.loc;
        } else {
            if (size + c_.num_cbits > limit)
                throw UserError(fmt::format("the program declares more than {} classical bits", limit), size_tok.loc);
            c_.add_creg(std::string(name.text), uint32_t(size));
        }
    }

    void check_new_name(const Token& name) {
        if (c_.find_register(name.text) >= 0 || c_.find_creg(name.text) >= 0)
            throw UserError(fmt::format("register '{}' is already declared", name.text), name.loc);
    }

    std::vector<std::string> ident_list(Lexer& lx, Tok end, const char* what) {
        std::vector<std::string> out;
        if (lx.peek().kind == end) return out;
        for (;;) {
            Token id = expect(lx, Tok::Ident, fmt::format("in the {} list", what).c_str());
            for (const std::string& s : out)
                if (s == id.text) throw UserError(fmt::format("{} '{}' is listed twice", what, id.text), id.loc);
            out.emplace_back(id.text);
            if (lx.peek().kind != Tok::Comma) return out;
            lx.take();
        }
    }

    void define_gate(Lexer& lx) {
        Token kw = lx.take();
        Token name = expect(lx, Tok::Ident, fmt::format("after '{}'", kw.text).c_str());
        if (name.text == "U" || name.text == "CX")
            throw UserError(fmt::format("'{}' is a builtin gate and cannot be redefined", name.text), name.loc);
        // The 2.0 header (arXiv:1707.03429) has no cu, sx, rxx, ...: a program that defines one of the
        // later headers' gates itself is valid 2.0, and its definition shadows the built-in gate.
        const qasm2::HeaderGate* header = qasm2::find_header_gate(name.text);
        if (gates_.find(name.text) != gates_.end() || (qelib1_ && header && qasm2::in_2017_header(header->id)))
            throw UserError(fmt::format("gate '{}' is already defined", name.text), name.loc);
        GateDef def;
        def.name = std::string(name.text);
        def.loc = name.loc;
        def.opaque = kw.text == "opaque";
        std::vector<std::string> params;
        if (lx.peek().kind == Tok::LParen) {
            lx.take();
            params = ident_list(lx, Tok::RParen, "parameter");
            expect(lx, Tok::RParen, "after the gate parameters");
        }
        if (lx.peek().kind != Tok::Ident)
            throw UserError(fmt::format("expected the qubit arguments of gate '{}' but found {}", name.text, describe(lx.peek())),
                            lx.peek().loc);
        std::vector<std::string> qubits = ident_list(lx, Tok::LBrace, "qubit argument");
        for (const std::string& q : qubits)
            for (const std::string& p : params)
                if (p == q) throw UserError(fmt::format("'{}' is both a parameter and a qubit of gate '{}'", q, name.text), name.loc);
        def.num_params = uint32_t(params.size());
        def.num_qubits = uint32_t(qubits.size());
        if (def.opaque) {
            expect(lx, Tok::Semi, "after the opaque gate declaration");
            std::string key = def.name;
            gates_.emplace(std::move(key), std::move(def));
            callees_.clear();
            return;
        }
        expect(lx, Tok::LBrace, "to open the gate body");
        while (lx.peek().kind != Tok::RBrace) {
            if (lx.peek().kind == Tok::End) throw UserError(fmt::format("gate '{}' is not closed: expected '}}'", name.text), name.loc);
            def.body.push_back(body_op(lx, def, params, qubits));
        }
        lx.take();
        std::string key = def.name;
        gates_.emplace(std::move(key), std::move(def));
        callees_.clear();
    }

    BodyOp body_op(Lexer& lx, GateDef& def, const std::vector<std::string>& params, const std::vector<std::string>& qubits) {
        Token name = expect(lx, Tok::Ident, "in the gate body");
        BodyOp op;
        op.name = std::string(name.text);
        op.loc = name.loc;
        auto qubit_arg = [&]() {
            Token q = expect(lx, Tok::Ident, "as a qubit argument");
            if (lx.peek().kind == Tok::LBracket)
                throw UserError("qubits inside a gate body are the gate's arguments and take no index", lx.peek().loc);
            for (size_t i = 0; i < qubits.size(); ++i)
                if (qubits[i] == q.text) {
                    for (uint32_t prev : op.qubits)
                        if (prev == i) throw UserError(fmt::format("qubit '{}' is used twice in one gate", q.text), q.loc);
                    op.qubits.push_back(uint32_t(i));
                    return;
                }
            throw UserError(fmt::format("'{}' is not a qubit argument of gate '{}'", q.text, def.name), q.loc);
        };
        if (name.text == "barrier") {
            op.barrier = true;
            for (;;) {
                qubit_arg();
                if (lx.peek().kind != Tok::Comma) break;
                lx.take();
            }
            expect(lx, Tok::Semi, "after the barrier");
            return op;
        }
        if (name.text == "measure" || name.text == "reset" || name.text == "if")
            throw UserError(fmt::format("'{}' is not allowed inside a gate body", name.text), name.loc);
        Callee callee = find_callee(name);
        if (lx.peek().kind == Tok::LParen) {
            lx.take();
            if (lx.peek().kind != Tok::RParen) {
                for (;;) {
                    op.params.push_back(qasm2::parse_expr(lx, def.arena, params, kMaxExprDepth));
                    if (lx.peek().kind != Tok::Comma) break;
                    lx.take();
                }
            }
            expect(lx, Tok::RParen, "after the gate parameters");
        }
        check_param_count(callee, name, op.params.size());
        for (;;) {
            qubit_arg();
            if (lx.peek().kind != Tok::Comma) break;
            lx.take();
        }
        check_qubit_count(callee, name, op.qubits.size());
        expect(lx, Tok::Semi, "after the gate call");
        return op;
    }

    /// The callee named by a gate statement. Resolved names are remembered until a definition,
    /// the header or a register changes what a name means, so a long program looks each name up once.
    Callee find_callee(const Token& name) {
        auto hit = callees_.find(name.text);
        if (hit != callees_.end()) return hit->second;
        Callee c = resolve_callee(name);
        callees_.emplace(std::string(name.text), c);
        return c;
    }

    Callee resolve_callee(const Token& name) {
        Callee c;
        auto it = gates_.find(name.text);
        if (it != gates_.end()) {
            c.user = &it->second;
            return c;
        }
        const HeaderGate* h = qasm2::find_header_gate(name.text);
        if (h && (h->builtin || qelib1_)) {
            c.header = h;
            return c;
        }
        if (h) throw UserError(fmt::format("unknown gate '{}': it is in the standard header, add include \"qelib1.inc\";", name.text),
                               name.loc);
        if (c_.find_register(name.text) >= 0 || c_.find_creg(name.text) >= 0)
            throw UserError(fmt::format("'{}' is a register, not a gate", name.text), name.loc);
        throw UserError(fmt::format("unknown gate '{}'", name.text), name.loc);
    }

    void check_param_count(const Callee& c, const Token& name, size_t n) {
        if (n != c.num_params())
            throw UserError(fmt::format("gate '{}' takes {} parameter{} but {} {} given", name.text, c.num_params(),
                                        c.num_params() == 1 ? "" : "s", n, n == 1 ? "is" : "are"),
                            name.loc);
    }
    void check_qubit_count(const Callee& c, const Token& name, size_t n) {
        if (n != c.num_qubits())
            throw UserError(fmt::format("gate '{}' acts on {} qubit{} but {} {} given", name.text, c.num_qubits(),
                                        c.num_qubits() == 1 ? "" : "s", n, n == 1 ? "is" : "are"),
                            name.loc);
    }

    QArg qubit_arg(Lexer& lx) {
        Token id = expect(lx, Tok::Ident, "as a qubit argument");
        QArg a;
        a.loc = id.loc;
        a.reg = c_.find_register(id.text);
        if (a.reg < 0) {
            if (c_.find_creg(id.text) >= 0)
                throw UserError(fmt::format("'{}' is a classical register; a qubit is expected here", id.text), id.loc);
            throw UserError(fmt::format("unknown quantum register '{}'", id.text), id.loc);
        }
        a.index = index_suffix(lx, id.text, c_.registers[size_t(a.reg)].size);
        return a;
    }

    int64_t index_suffix(Lexer& lx, std::string_view reg, uint32_t size) {
        if (lx.peek().kind != Tok::LBracket) return -1;
        lx.take();
        Token idx = lx.take();
        uint64_t i = parse_uint(idx, "an index");
        expect(lx, Tok::RBracket, "after the index");
        if (i >= size)
            throw UserError(fmt::format("index {} is out of range for register '{}' of size {}", i, reg, size), idx.loc);
        return int64_t(i);
    }

    // ---- top-level operations ------------------------------------------------------------------

    void conditioned(Lexer& lx) {
        lx.take();
        expect(lx, Tok::LParen, "after 'if'");
        Token reg = expect(lx, Tok::Ident, "as the register of the condition");
        int r = c_.find_creg(reg.text);
        if (r < 0) {
            if (c_.find_register(reg.text) >= 0)
                throw UserError(fmt::format("'{}' is a quantum register; a condition needs a classical register", reg.text), reg.loc);
            throw UserError(fmt::format("unknown classical register '{}'", reg.text), reg.loc);
        }
        expect(lx, Tok::EqEq, "in the condition");
        Token value = lx.take();
        uint64_t v = parse_uint(value, "an integer value for the condition");
        expect(lx, Tok::RParen, "after the condition");
        const Token& next = lx.peek();
        if (next.kind == Tok::Ident && (next.text == "if" || next.text == "barrier" || next.text == "gate" ||
                                        next.text == "qreg" || next.text == "creg" || next.text == "opaque"))
            throw UserError(fmt::format("'{}' cannot be conditioned: expected a gate, measure or reset", next.text), next.loc);
        cond_reg_ = r;
        cond_value_ = v;
        quantum_op(lx);
    }

    void barrier(Lexer& lx) {
        lx.take();
        ir::Op op;
        op.kind = ir::OpKind::Barrier;
        std::vector<bool> seen(c_.num_qubits(), false);
        for (;;) {
            QArg a = qubit_arg(lx);
            const ir::Register& r = c_.registers[size_t(a.reg)];
            uint32_t lo = a.index < 0 ? r.first : r.first + uint32_t(a.index);
            uint32_t hi = a.index < 0 ? r.first + r.size : lo + 1;
            for (uint32_t w = lo; w < hi; ++w)
                if (!seen[w]) {
                    seen[w] = true;
                    op.controls.push_back(ir::Lit::pos(w));
                }
            if (lx.peek().kind != Tok::Comma) break;
            lx.take();
        }
        expect(lx, Tok::Semi, "after the barrier");
        push(std::move(op));
    }

    void quantum_op(Lexer& lx) {
        const Token& t = lx.peek();
        if (t.kind != Tok::Ident) throw UserError(fmt::format("expected a gate, measure or reset but found {}", describe(t)), t.loc);
        if (t.text == "measure") return measure(lx);
        if (t.text == "reset") return reset(lx);
        gate_statement(lx);
    }

    void measure(Lexer& lx) {
        lx.take();
        QArg q = qubit_arg(lx);
        expect(lx, Tok::Arrow, "after the measured qubit");
        Token id = expect(lx, Tok::Ident, "as the classical register of the measurement");
        int creg = c_.find_creg(id.text);
        if (creg < 0) {
            if (c_.find_register(id.text) >= 0)
                throw UserError(fmt::format("'{}' is a quantum register; a measurement writes a classical register", id.text),
                                id.loc);
            throw UserError(fmt::format("unknown classical register '{}'", id.text), id.loc);
        }
        const ir::ClassicalRegister& cr = c_.cregs[size_t(creg)];
        int64_t bit = index_suffix(lx, id.text, cr.size);
        expect(lx, Tok::Semi, "after the measurement");
        const ir::Register& qr = c_.registers[size_t(q.reg)];
        if ((q.index < 0) != (bit < 0))
            throw UserError("measure a whole register into a whole register, or one qubit into one bit", id.loc);
        if (q.index >= 0) {
            push(ir::Op::measure(qr.first + uint32_t(q.index), int32_t(cr.first + uint32_t(bit))));
            return;
        }
        if (qr.size != cr.size)
            throw UserError(fmt::format("register '{}' has {} qubits but '{}' has {} bits", qr.name, qr.size, cr.name, cr.size),
                            id.loc);
        for (uint32_t i = 0; i < qr.size; ++i) push(ir::Op::measure(qr.first + i, int32_t(cr.first + i)));
    }

    void reset(Lexer& lx) {
        lx.take();
        QArg q = qubit_arg(lx);
        expect(lx, Tok::Semi, "after reset");
        const ir::Register& r = c_.registers[size_t(q.reg)];
        if (q.index >= 0) return push(ir::Op::reset(r.first + uint32_t(q.index)));
        for (uint32_t i = 0; i < r.size; ++i) push(ir::Op::reset(r.first + i));
    }

    void gate_statement(Lexer& lx) {
        Token name = lx.take();
        Callee callee = find_callee(name);
        // Top-level statements do not nest, so their argument lists reuse the importer's buffers.
        std::vector<Value>& params = stmt_params_;
        params.clear();
        if (lx.peek().kind == Tok::LParen) {
            lx.take();
            if (lx.peek().kind != Tok::RParen) {
                static const std::vector<std::string> no_params;
                for (;;) {
                    scratch_.nodes.clear();
                    uint32_t root = qasm2::parse_expr(lx, scratch_, no_params, kMaxExprDepth);
                    params.push_back(qasm2::eval_expr(scratch_, root, {}));
                    if (lx.peek().kind != Tok::Comma) break;
                    lx.take();
                }
            }
            expect(lx, Tok::RParen, "after the gate parameters");
        }
        check_param_count(callee, name, params.size());
        std::vector<QArg>& args = stmt_args_;
        args.clear();
        if (lx.peek().kind != Tok::Ident)
            throw UserError(fmt::format("expected the qubits of gate '{}' but found {}", name.text, describe(lx.peek())), lx.peek().loc);
        for (;;) {
            args.push_back(qubit_arg(lx));
            if (lx.peek().kind != Tok::Comma) break;
            lx.take();
        }
        check_qubit_count(callee, name, args.size());
        expect(lx, Tok::Semi, "after the gate");

        // Broadcasting: whole registers of one size n give n calls; single qubits repeat.
        uint32_t n = 1;
        const QArg* first_whole = nullptr;
        for (const QArg& a : args) {
            if (a.index >= 0) continue;
            uint32_t size = c_.registers[size_t(a.reg)].size;
            if (first_whole && size != n)
                throw UserError(fmt::format("registers '{}' (size {}) and '{}' (size {}) in one gate must have the same size",
                                            c_.registers[size_t(first_whole->reg)].name, n, c_.registers[size_t(a.reg)].name, size),
                                a.loc);
            if (!first_whole) first_whole = &a;
            n = size;
        }
        std::vector<uint32_t>& wires = stmt_wires_;
        wires.assign(args.size(), 0);
        for (uint32_t k = 0; k < n; ++k) {
            for (size_t i = 0; i < args.size(); ++i) {
                const ir::Register& r = c_.registers[size_t(args[i].reg)];
                wires[i] = r.first + (args[i].index >= 0 ? uint32_t(args[i].index) : k);
                for (size_t j = 0; j < i; ++j)
                    if (wires[j] == wires[i])
                        throw UserError(fmt::format("qubit {} is used twice in one gate", c_.wire_name(wires[i])), args[i].loc);
            }
            call(callee, name.loc, params, wires, 0);
        }
    }

    // ---- expansion ------------------------------------------------------------------------------

    void call(const Callee& callee, const SourceLoc& loc, const std::vector<Value>& params,
              const std::vector<uint32_t>& wires, uint32_t depth) {
        if (callee.header) {
            const size_t first = c_.ops.size();
            if (first >= opts_.limits.max_ops) throw too_many_ops();
            ir::Angle gp = qasm2::append_header_gate(*callee.header, params, wires.data(), c_.ops);
            if (c_.ops.size() > opts_.limits.max_ops) throw too_many_ops();
            // A phase under a classical condition is unobservable; adding an exact 0 changes nothing.
            if (cond_reg_ < 0 && !(gp.is_exact() && gp.num() == 0)) c_.global_phase += gp;
            for (size_t i = first; i < c_.ops.size(); ++i) stamp(c_.ops[i]);  // header gates make no barriers
            return;
        }
        const GateDef& def = *callee.user;
        if (def.opaque)
            throw UserError(fmt::format("gate '{}' is opaque: it has no definition to compile", def.name), loc);
        if (depth >= opts_.limits.max_recursion)
            throw UserError(fmt::format("gate definitions nested deeper than {} levels", opts_.limits.max_recursion), loc);
        for (const BodyOp& b : def.body) {
            std::vector<uint32_t> inner(b.qubits.size());
            for (size_t i = 0; i < b.qubits.size(); ++i) inner[i] = wires[b.qubits[i]];
            if (b.barrier) {
                ir::Op op;
                op.kind = ir::OpKind::Barrier;
                for (uint32_t w : inner) op.controls.push_back(ir::Lit::pos(w));
                push(std::move(op));
                continue;
            }
            std::vector<Value> args(b.params.size());
            for (size_t i = 0; i < b.params.size(); ++i) args[i] = qasm2::eval_expr(def.arena, b.params[i], params);
            Callee inner_callee;
            auto it = gates_.find(b.name);
            if (it != gates_.end()) inner_callee.user = &it->second;
            else inner_callee.header = qasm2::find_header_gate(b.name);
            WHITTLE_ASSERT((inner_callee.user || inner_callee.header) && "gate body names were resolved when defined");
            call(inner_callee, b.loc, args, inner, depth + 1);
        }
    }

    UserError too_many_ops() const {
        return UserError(fmt::format("the program expands to more than {} operations", opts_.limits.max_ops), stmt_loc_);
    }

    /// Gives an op of the current statement its location and condition.
    void stamp(ir::Op& op) const {
        op.loc = stmt_loc_;
        if (cond_reg_ >= 0) op.set_condition(cond_reg_, cond_value_);
    }

    void push(ir::Op op) {
        if (c_.ops.size() >= opts_.limits.max_ops) throw too_many_ops();
        if (cond_reg_ >= 0 && op.kind == ir::OpKind::Barrier) return;  // a barrier under a condition orders nothing extra
        stamp(op);
        c_.ops.push_back(std::move(op));
    }

    SourceManager& sm_;
    const LoadOptions& opts_;
    ir::Circuit c_;
    std::unordered_map<std::string, GateDef, NameHash, std::equal_to<>> gates_;
    std::unordered_map<std::string, Callee, NameHash, std::equal_to<>> callees_;
    bool qelib1_ = false;
    std::vector<std::string> include_stack_;
    ExprArena scratch_;
    std::vector<Value> stmt_params_;
    std::vector<QArg> stmt_args_;
    std::vector<uint32_t> stmt_wires_;
    int cond_reg_ = -1;
    uint64_t cond_value_ = 0;
    SourceLoc stmt_loc_;
};

}  // namespace

ir::Circuit import_qasm2(SourceManager& sm, uint32_t file_id, const LoadOptions& opts) {
    Importer imp(sm, opts);
    return imp.run(file_id);
}

}  // namespace whittle::frontend
