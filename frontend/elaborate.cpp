// Elaboration of .wq statements: declarations, gates, `^=`, phases, `when`, loops, `if`, measurement.
#include <algorithm>
#include <cmath>
#include <filesystem>

#include <fmt/format.h>

#include "frontend/elaborator.h"
#include "frontend/esop_minimize.h"
#include "frontend/wq_grammar.h"

namespace whittle::frontend {

using ir::Angle;
using ir::Lit;
using ir::LitVec;
using ir::Op;
using ir::OpKind;

Elaborator::Elaborator(SourceManager& sm, const LoadOptions& opts) : sm_(sm), opts_(opts), limits_(opts.limits) {}

ir::Circuit Elaborator::run(uint32_t file_id) {
    std::error_code ec;
    std::string canon = std::filesystem::weakly_canonical(sm_.name(file_id), ec).string();
    if (!ec && !canon.empty()) {
        loaded_[canon] = file_id;
        use_stack_.push_back(canon);
    }
    const File& f = load(file_id);
    c_.ops.reserve(f.stmts.size());
    exec_file(f);
    c_.files.clear();
    for (uint32_t i = 0; i < sm_.size(); ++i) c_.files.push_back(sm_.name(i));
    return std::move(c_);
}

const File& Elaborator::load(uint32_t file_id) {
    files_.push_back(parse_wq_syntax(sm_, file_id, symbols_, limits_));
    const File& f = files_.back();
    // Routines are visible in the whole program once their file is read (calls may come first).
    for (const Routine& r : f.routines) {
        ir::SourceLoc loc = f.loc(r.line, r.col);
        if (routines_.count(r.sym)) throw UserError(fmt::format("routine '{}' is already defined", name(r.sym)), loc);
        if (r.sym < globals_.size() && globals_[r.sym].kind != Binding::None)
            throw UserError(fmt::format("'{}' is already defined", name(r.sym)), loc);
        for (size_t i = 0; i < r.params.size(); ++i)
            for (size_t j = 0; j < i; ++j)
                if (r.params[i].sym == r.params[j].sym)
                    throw UserError(fmt::format("parameter '{}' appears twice", name(r.params[i].sym)),
                                    f.loc(r.params[i].line, r.params[i].col));
        routines_[r.sym] = RoutineRef{&f, &r};
    }
    return f;
}

void Elaborator::exec_file(const File& f) { exec_block(f, 0, false); }

void Elaborator::exec_block(const File& f, uint32_t block, bool new_scope) {
    size_t mark = locals_.size();
    if (new_scope) ++scope_depth_;
    for (uint32_t si : f.blocks[block]) exec_stmt(f, f.stmts[si]);
    if (new_scope) --scope_depth_;
    locals_.resize(mark);
}

void Elaborator::emit(Op op, ir::SourceLoc loc) {
    if (c_.ops.size() >= limits_.max_ops)
        throw UserError(fmt::format("the program elaborates to more than {} ops (the op limit)", limits_.max_ops), loc);
    op.loc = loc;
    op.set_condition(ctx_.cond_reg, ctx_.cond_value);
    c_.ops.push_back(std::move(op));
}

void Elaborator::check_not_controlled(ir::SourceLoc loc, const char* what) const {
    if (!ctx_.controls.empty())
        throw UserError(fmt::format("{} cannot be quantum-controlled: it is inside 'when'", what), loc);
}

void Elaborator::check_target_free(uint32_t wire, ir::SourceLoc loc) const {
    for (const ir::LitVec* controls : {&ctx_.controls, &lifted_controls_})
      for (Lit l : *controls)
        if (l.wire() == wire)
            throw UserError(fmt::format("'{}' is a control of the enclosing 'when' and cannot also be a target",
                                        c_.wire_name(wire)),
                            loc);
}

/// Replaces the ops from `start` on by their inverse (reversed, each inverted); the global phase they
/// added is negated too.
void Elaborator::invert_tail(size_t start, Angle phase_before) {
    std::vector<Op> body(std::make_move_iterator(c_.ops.begin() + long(start)), std::make_move_iterator(c_.ops.end()));
    c_.ops.resize(start);
    for (size_t i = body.size(); i-- > 0;) ir::append_inverse(body[i], c_.ops);
    if (c_.ops.size() > limits_.max_ops)
        throw UserError(fmt::format("the program elaborates to more than {} ops (the op limit)", limits_.max_ops),
                        body.empty() ? ir::SourceLoc{} : body.back().loc);
    Angle added = c_.global_phase - phase_before;
    c_.global_phase = phase_before - added;
}

void Elaborator::exec_stmt(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    if (++steps_ > limits_.max_ops)
        throw UserError(fmt::format("elaboration ran more than {} statements (the op limit; a loop nest too large?)",
                                    limits_.max_ops),
                        loc);
    switch (s.kind) {
    case StmtKind::Let: {
        Binding b;
        const Expr& value = f.exprs[s.expr];
        const Binding* named = value.kind == ExprKind::Name ? lookup(value.sym) : nullptr;
        if (value.kind == ExprKind::Table || (named && named->kind == Binding::Table)) {
            b.kind = Binding::Table;
            b.table = eval_table(f, s.expr);
        } else {
            b.kind = Binding::Num;
            b.num = eval_number(f, s.expr);
        }
        bind(s.sym, b, loc);
        return;
    }
    case StmtKind::Decl: return exec_decl(f, s);
    case StmtKind::Bits: return exec_bits(f, s);
    case StmtKind::Gate: return exec_gate(f, s);
    case StmtKind::XorAssign: return exec_xor(f, s);
    case StmtKind::Swap: {
        uint32_t a = resolve_wire(f, s.expr2), b = resolve_wire(f, s.expr3);
        if (a == b) throw UserError(fmt::format("'{}' is swapped with itself", c_.wire_name(a)), f.loc_of(f.exprs[s.expr3]));
        check_target_free(a, f.loc_of(f.exprs[s.expr2]));
        check_target_free(b, f.loc_of(f.exprs[s.expr3]));
        emit(Op::swap(a, b, ctx_.controls), loc);
        return;
    }
    case StmtKind::Phase: return exec_phase(f, s);
    case StmtKind::When: return exec_when(f, s);
    case StmtKind::Call: return exec_call(f, s);
    case StmtKind::Compute: return exec_compute(f, s);
    case StmtKind::For:
    case StmtKind::Repeat: return exec_loop(f, s);
    case StmtKind::Use: return exec_use(f, s);
    case StmtKind::Measure: return exec_measure(f, s);
    case StmtKind::If: return exec_if(f, s);
    case StmtKind::Reset: {
        check_not_controlled(loc, "'reset'");
        std::vector<uint32_t> ws;
        for (uint32_t t : s.targets) resolve_wires(f, t, ws);
        for (uint32_t w : ws) emit(Op::reset(w), loc);
        return;
    }
    case StmtKind::Barrier: {
        std::vector<uint32_t> ws;
        for (uint32_t t : s.targets) resolve_wires(f, t, ws);
        Op op;
        op.kind = OpKind::Barrier;
        for (uint32_t w : ws) {
            for (Lit l : op.controls)
                if (l.wire() == w) throw UserError(fmt::format("'{}' appears twice in the barrier", c_.wire_name(w)), loc);
            op.controls.push_back(Lit::pos(w));
        }
        emit(std::move(op), loc);
        return;
    }
    case StmtKind::Tagged: return exec_tagged(f, s);
    case StmtKind::Block: return exec_block(f, s.body);
    }
}

void Elaborator::exec_decl(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    const bool in_routine = !call_stack_.empty();
    if (in_routine && s.role == ir::Role::Data)
        throw UserError("a routine cannot declare data qubits: declare them at the top level, or use 'ancilla' or 'borrow'", loc);
    if (!in_routine && scope_depth_ > 0)
        throw UserError(fmt::format("declare '{}' wires at the top level of the program (or inside a routine)",
                                    ir::role_name(s.role)),
                        loc);
    for (uint32_t t : s.targets) {
        const Expr& e = f.exprs[t];
        ir::SourceLoc eloc = f.loc_of(e);
        int64_t size = 1;
        if (e.kind == ExprKind::Index) {
            size = eval_int(f, e.lhs, "a register size");
            if (size < 1) fail(f, f.exprs[e.lhs], fmt::format("a register size must be at least 1, found {}", size));
        }
        if (uint64_t(size) + c_.num_qubits() > limits_.max_qubits)
            throw UserError(fmt::format("the program declares more than {} qubits (the qubit limit)", limits_.max_qubits), eloc);
        const bool scalar = e.kind == ExprKind::Name;
        if (in_routine && s.role == ir::Role::Clean && !call_ancillas_.empty() && opts_.reuse_work_wires) {
            const std::pair<uint32_t, bool> shape{uint32_t(size), scalar};
            std::vector<uint32_t>& pool = free_ancillas_[shape];
            if (!pool.empty()) {  // a returned call's work wires, back at |0>
                Binding b;
                b.kind = Binding::Register;
                b.first = pool.back();
                b.size = uint32_t(size);
                b.scalar = scalar;
                pool.pop_back();
                call_ancillas_.back().emplace_back(shape, b.first);
                bind(e.sym, b, eloc);
                continue;
            }
        }
        std::string reg_name = name(e.sym);
        if (in_routine) {
            uint32_t r = call_stack_.back();
            do {
                reg_name = fmt::format("{}_{}_{}", name(r), name(e.sym), ++fresh_counter_[r]);
            } while (register_names_.count(reg_name));
        } else if (register_names_.count(reg_name) || lookup(e.sym)) {
            throw UserError(fmt::format("'{}' is already defined", reg_name), eloc);
        }
        register_names_.insert(reg_name);
        Binding b;
        b.kind = Binding::Register;
        b.first = c_.add_register(reg_name, uint32_t(size), s.role, scalar);
        c_.registers.back().loc = eloc;
        if (in_routine && s.role == ir::Role::Clean && !call_ancillas_.empty())
            call_ancillas_.back().emplace_back(std::make_pair(uint32_t(size), scalar), b.first);
        b.size = uint32_t(size);
        b.scalar = scalar;
        bind(e.sym, b, eloc);
    }
}

void Elaborator::exec_bits(const File& f, const Stmt& s) {
    for (uint32_t t : s.targets) {
        const Expr& e = f.exprs[t];
        int64_t size = 1;
        if (e.kind == ExprKind::Index) {
            size = eval_int(f, e.lhs, "a bit-register size");
            if (size < 1 || size > 64) fail(f, f.exprs[e.lhs], fmt::format("a bit register has 1 to 64 bits, found {}", size));
        }
        if (lookup(e.sym)) fail(f, e, fmt::format("'{}' is already defined", name(e.sym)));
        Binding b;
        b.kind = Binding::Bits;
        b.scalar = e.kind == ExprKind::Name;
        b.size = uint32_t(size);
        b.first = c_.add_creg(name(e.sym), uint32_t(size), b.scalar);
        bind(e.sym, b, f.loc_of(e));
    }
}

namespace {

/// True when reducing theta into [0, 2*pi) moves it by an odd number of whole turns.
bool reduction_flips_sign(const Number& n) {
    if (n.kind == Number::PiRat || n.kind == Number::Rat) {
        if (n.kind == Number::Rat && n.num == 0) return false;
        if (n.kind == Number::Rat) return int64_t(std::floor(n.to_double() / (2 * M_PI))) % 2 != 0;
        // theta = (num/den)*pi: whole turns = floor(num / (2*den)).
        const __int128 num = n.num, two_den = __int128(2) * n.den;
        __int128 turns = num / two_den;
        if (num % two_den != 0 && num < 0) --turns;
        return turns % 2 != 0;
    }
    if (!std::isfinite(n.real)) return false;
    return std::fmod(std::floor(n.real / (2 * M_PI)), 2.0) != 0.0;
}

}  // namespace

void Elaborator::exec_gate(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    Angle a[3];
    for (size_t i = 0; i < s.args.size(); ++i) a[i] = eval_angle(f, s.args[i]);
    std::vector<uint32_t>& ws = gate_wires_;
    ws.clear();
    for (uint32_t t : s.targets) resolve_wires(f, t, ws);
    std::vector<Op>& ops = gate_ops_;
    ops.clear();
    auto controlled = [&](OpKind k, uint32_t w) {
        check_target_free(w, loc);
        return Op::one(k, w, a[0], ctx_.controls);
    };
    auto phase_gate = [&](Angle ang, uint32_t w) {
        LitVec product = ctx_.controls;
        check_target_free(w, loc);
        product.push_back(Lit::pos(w));
        return Op::phase(ang, product);
    };
    if (s.gate == Gate::XX || s.gate == Gate::ISwap) {
        const char* g = s.gate == Gate::XX ? "xx" : "iswap";
        if (ws.size() != 2) throw UserError(fmt::format("'{}' acts on two wires, found {}", g, ws.size()), loc);
        if (ws[0] == ws[1]) throw UserError(fmt::format("'{}' is given the wire '{}' twice", g, c_.wire_name(ws[0])), loc);
        check_not_controlled(loc, s.gate == Gate::XX ? "'xx'" : "'iswap'");
        ops.push_back(Op::two(s.gate == Gate::XX ? OpKind::XX : OpKind::ISwap, ws[0], ws[1], a[0]));
    } else {
        for (uint32_t w : ws) {
            switch (s.gate) {
            case Gate::H: ops.push_back(controlled(OpKind::H, w)); break;
            case Gate::X:
                check_target_free(w, loc);
                ops.push_back(Op::x(w, ctx_.controls));
                break;
            case Gate::Y: ops.push_back(controlled(OpKind::Y, w)); break;
            case Gate::SX: ops.push_back(controlled(OpKind::SX, w)); break;
            case Gate::Z: ops.push_back(phase_gate(Angle::pi_times(1), w)); break;
            case Gate::S: ops.push_back(phase_gate(Angle::pi_times(1, 2), w)); break;
            case Gate::T: ops.push_back(phase_gate(Angle::pi_times(1, 4), w)); break;
            case Gate::RX: ops.push_back(controlled(OpKind::RX, w)); break;
            case Gate::RY: ops.push_back(controlled(OpKind::RY, w)); break;
            case Gate::RZ: ops.push_back(controlled(OpKind::RZ, w)); break;
            case Gate::U: {
                Op op = controlled(OpKind::U, w);
                op.set_phi(a[1]);
                op.set_lambda(a[2]);
                ops.push_back(op);
                break;
            }
            case Gate::R: {
                check_not_controlled(loc, "'r'");
                Op op = Op::one(OpKind::R, w, a[0]);
                op.set_phi(a[1]);
                ops.push_back(op);
                break;
            }
            case Gate::XX:
            case Gate::ISwap: break;
            }
        }
    }
    // exp(-i*theta/2*P) has period 4*pi but an ir::Angle is kept mod 2*pi: when that reduction
    // changes theta by an odd multiple of 2*pi (e.g. rz(-pi/4) stored as rz(7*pi/4)), the stored
    // gate is minus the written one. The sign is a phase of pi on the enclosing controls (a global
    // phase without them), emitted beside each such op so `when` keeps the written meaning.
    const bool half_period_gate = s.gate == Gate::RX || s.gate == Gate::RY || s.gate == Gate::RZ ||
                                  s.gate == Gate::U || s.gate == Gate::R || s.gate == Gate::XX;
    const bool sign_flipped = half_period_gate && !s.args.empty() && reduction_flips_sign(eval_number(f, s.args[0]));
    for (Op& op : ops) {
        if (sign_flipped) {
            if (!ctx_.controls.empty()) emit(Op::phase(Angle::pi_times(1), ctx_.controls), loc);
            else if (ctx_.cond_reg < 0) c_.global_phase += Angle::pi_times(1);
        }
        if (!s.inverse) {
            emit(std::move(op), loc);
            continue;
        }
        std::vector<Op> inv;
        ir::append_inverse(op, inv);
        for (Op& o : inv) emit(std::move(o), loc);
    }
}

void Elaborator::exec_xor(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    uint32_t target = resolve_wire(f, s.expr2);
    check_target_free(target, f.loc_of(f.exprs[s.expr2]));
    BoolExpr& e = scratch_;
    build_bool(f, s.expr, e, false);
    for (const BoolNode& n : e.nodes)
        if (n.kind == BoolNode::Var && n.wire == target)
            throw UserError(fmt::format("the target '{}' appears in its own expression: 't ^= f' needs f not to read t",
                                        c_.wire_name(target)),
                            n.loc);
    LitVec product;
    bool zero = false;
    auto emit_cube = [&](const LitVec& cube) {
        LitVec controls = ctx_.controls;
        for (Lit l : cube)
            if (!and_literal(controls, l)) return;
        emit(Op::x(target, std::move(controls)), loc);
    };
    if (as_conjunction(e, product, zero)) {
        if (!zero) emit_cube(product);
        return;
    }
    if (emit_register_equality(f, s, target)) return;
    for (const LitVec& cube : minimize_esop(esop(e, limits_.max_expansion_terms, loc))) emit_cube(cube);
}

bool Elaborator::emit_register_equality(const File& f, const Stmt& s, uint32_t target) {
    // t ^= (x == y) on registers: y ^= x bit by bit, t ^= (y == 0), y ^= x again: 2n CNOTs and one
    // n-control X, where the exact ESOP has 2^n cubes.
    const Expr& e = f.exprs[s.expr];
    if (e.kind != ExprKind::Eq && e.kind != ExprKind::Ne) return false;
    std::vector<uint32_t> x, y;
    if (!comparison_wires(f, e.lhs, x) || !comparison_wires(f, e.rhs, y)) return false;
    if (x.size() > y.size()) std::swap(x, y);  // y is the longer; its extra bits must be 0
    std::vector<uint32_t> all = x;
    all.insert(all.end(), y.begin(), y.end());
    std::sort(all.begin(), all.end());
    if (std::adjacent_find(all.begin(), all.end()) != all.end()) return false;  // a wire on both sides
    for (Lit l : ctx_.controls)
        if (std::binary_search(all.begin(), all.end(), l.wire())) return false;
    const ir::SourceLoc loc = f.loc_of(s);
    for (size_t i = 0; i < x.size(); ++i) emit(Op::x(y[i], {Lit::pos(x[i])}), loc);
    LitVec controls = ctx_.controls;
    for (uint32_t w : y) and_literal(controls, Lit::neg(w));
    emit(Op::x(target, std::move(controls)), loc);
    if (e.kind == ExprKind::Ne) emit(Op::x(target, ctx_.controls), loc);
    for (size_t i = 0; i < x.size(); ++i) emit(Op::x(y[i], {Lit::pos(x[i])}), loc);
    return true;
}

void Elaborator::exec_phase(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    Angle theta = eval_angle(f, s.args[0]);
    BoolExpr& e = scratch_;
    build_bool(f, s.expr, e, false);
    auto global = [&](Angle a) {
        if (ctx_.cond_reg < 0) c_.global_phase += a;  // a classically conditioned global phase is unobservable
    };
    LitVec product;
    bool zero = false;
    if (as_conjunction(e, product, zero)) {
        if (zero) return;
        LitVec full = ctx_.controls;
        for (Lit l : product)
            if (!and_literal(full, l)) return;
        if (full.empty()) global(theta);
        else emit(Op::phase(theta, std::move(full)), loc);
        return;
    }
    std::vector<uint32_t> wires;
    bool constant = false;
    if (ctx_.controls.empty() && as_parity(e, wires, constant)) {
        // e^{i t (1 ^ p)} = e^{i t} e^{-i t p}
        Angle a = theta;
        if (constant) {
            global(theta);
            a = -theta;
        }
        if (!wires.empty()) emit(Op::parity(a, wires), loc);
        return;
    }
    if (theta == Angle::pi_times(1)) {
        // e^{i pi f} = product over the cubes of f's ESOP of e^{i pi cube}: one phase per minimized cube
        for (const LitVec& cube : minimize_esop(esop(e, limits_.max_expansion_terms, loc))) {
            LitVec full = ctx_.controls;
            bool live = true;
            for (Lit l : cube) live = live && and_literal(full, l);
            if (!live) continue;
            if (full.empty()) global(theta);
            else emit(Op::phase(theta, std::move(full)), loc);
        }
        return;
    }
    build_bool(f, s.expr, e, true);
    for (const Monomial& m : multilinear(e, limits_.max_expansion_terms, loc)) {
        Angle a = theta * m.coeff;
        if (m.wires.empty()) {
            global(a);
            continue;
        }
        if (a.is_zero() && a.is_exact()) continue;
        LitVec lits;
        for (uint32_t w : m.wires) lits.push_back(Lit::pos(w));
        emit(Op::phase(a, std::move(lits)), loc);
    }
}

void Elaborator::exec_when(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    BoolExpr& e = scratch_;
    build_bool(f, s.expr, e, false);
    LitVec product;
    bool zero = false;
    if (!as_conjunction(e, product, zero))
        throw UserError("the condition of 'when' must be a conjunction of wires and negated wires (like a & !b); "
                        "compute other conditions into an ancilla first",
                        f.loc_of(f.exprs[s.expr]));
    if (zero) return;  // the block never acts
    Ctx saved = ctx_;
    for (Lit l : product)
        if (!and_literal(ctx_.controls, l)) {
            ctx_ = saved;
            return;
        }
    (void)loc;
    exec_block(f, s.body);
    ctx_ = saved;
}

void Elaborator::exec_loop(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    int64_t first = 0, last = 0;
    if (s.kind == StmtKind::For) {
        first = eval_int(f, s.expr, "a loop bound");
        last = eval_int(f, s.expr2, "a loop bound");
    } else {
        last = eval_int(f, s.expr, "a repeat count") - 1;
        if (last < -1) fail(f, f.exprs[s.expr], fmt::format("a repeat count cannot be negative, found {}", last + 1));
    }
    if (last >= first) {
        __int128 trips = __int128(last) - first + 1;
        if (trips > __int128(limits_.max_loop_trips))
            throw UserError(fmt::format("the loop runs {} times, over the limit of {} iterations", int64_t(trips > INT64_MAX ? INT64_MAX : trips),
                                        limits_.max_loop_trips),
                            loc);
    }
    for (int64_t i = first; i <= last; ++i) {
        if (++steps_ > limits_.max_ops)
            throw UserError(fmt::format("elaboration ran more than {} statements and loop iterations (the op limit; "
                                        "a loop nest too large?)",
                                        limits_.max_ops),
                            loc);
        size_t mark = locals_.size();
        if (s.kind == StmtKind::For) {
            Binding b;
            b.kind = Binding::Num;
            b.num = Number{Number::Rat, i, 1, 0.0};
            locals_.emplace_back(s.sym, b);
        }
        ++scope_depth_;
        exec_block(f, s.body, false);
        --scope_depth_;
        locals_.resize(mark);
        if (i == INT64_MAX) break;
    }
}

void Elaborator::exec_measure(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    check_not_controlled(loc, "'measure'");
    uint32_t w = resolve_wire(f, s.targets[0]);
    const Expr& be = f.exprs[s.expr];
    if (be.kind == ExprKind::Slice) fail(f, be, "a measurement writes one bit: expected a bit name or name[i], not a slice");
    const Binding* b = lookup(be.sym);
    if (!b) {
        if (be.kind == ExprKind::Index)
            fail(f, be, fmt::format("unknown bit register '{}' (declare it with 'bit {}[size]')", name(be.sym), name(be.sym)));
        Binding nb;
        nb.kind = Binding::Bits;
        nb.scalar = true;
        nb.size = 1;
        nb.first = c_.add_creg(name(be.sym), 1, true);
        size_t saved = scope_depth_;
        scope_depth_ = 0;  // measurement results are program-wide
        bind(be.sym, nb, f.loc_of(be));
        scope_depth_ = uint32_t(saved);
        b = lookup(be.sym);
    }
    if (b->kind != Binding::Bits) fail(f, be, fmt::format("'{}' is not a classical bit", name(be.sym)));
    const ir::ClassicalRegister& r = c_.cregs[b->first];
    uint32_t bit = r.first;
    if (be.kind == ExprKind::Index) {
        if (b->scalar) fail(f, be, fmt::format("'{}' is a single bit and takes no index", name(be.sym)));
        int64_t i = eval_int(f, be.lhs, "a bit index");
        if (i < 0 || i >= int64_t(r.size))
            fail(f, f.exprs[be.lhs], fmt::format("bit index {} is out of range for '{}' (bits 0..{})", i, name(be.sym), r.size - 1));
        bit += uint32_t(i);
    } else if (!b->scalar) {
        fail(f, be, fmt::format("'{}' has {} bits: pick one with {}[i]", name(be.sym), r.size, name(be.sym)));
    }
    emit(Op::measure(w, int32_t(bit)), loc);
}

void Elaborator::exec_if(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    const Binding* named = s.sym != kNone ? lookup(s.sym) : nullptr;
    if (s.sym == kNone || (named && named->kind != Binding::Bits)) {  // a compile-time condition
        if (eval_int(f, s.expr, "an 'if' condition") != 0)
            exec_block(f, s.body);
        else if (s.body2 != kNone)
            exec_block(f, s.body2);
        return;
    }
    if (s.body2 != kNone)
        throw UserError("'else' needs a compile-time condition: a classical bit's 'if' has no 'else' branch", loc);
    if (ctx_.cond_reg >= 0) throw UserError("'if' inside 'if' is not supported: an op has one classical condition", loc);
    int reg = find_bits(f, s.sym, f.loc_of(f.exprs[s.expr]));
    const ir::ClassicalRegister& r = c_.cregs[size_t(reg)];
    uint64_t value = s.inverse ? 0 : 1;
    if (s.has_value) {
        value = s.value;
        if (r.size < 64 && value >> r.size)
            throw UserError(fmt::format("'{}' has {} bit{}: it never equals {}", r.name, r.size, r.size == 1 ? "" : "s", value), loc);
    } else if (!r.scalar && r.size != 1) {
        throw UserError(fmt::format("'{}' has {} bits: compare it with a value, as in 'if {} == 3 {{ ... }}'", r.name, r.size, r.name), loc);
    }
    Ctx saved = ctx_;
    ctx_.cond_reg = reg;
    ctx_.cond_value = value;
    exec_block(f, s.body);
    ctx_ = saved;
}

void Elaborator::exec_tagged(const File& f, const Stmt& s) {
    size_t start = c_.ops.size();
    exec_block(f, s.body);
    for (size_t i = start; i < c_.ops.size(); ++i) {
        c_.ops[i].pair = uint32_t(s.value);
        c_.ops[i].half = s.half;
    }
    c_.next_pair_id = std::max<uint32_t>(c_.next_pair_id, uint32_t(s.value) + 1);
}

}  // namespace whittle::frontend
