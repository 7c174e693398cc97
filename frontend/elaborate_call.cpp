// Elaboration of routine calls, `compute { } then { }` pairs and `use` of other files.
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include <fmt/format.h>

#include "frontend/elaborator.h"
#include "frontend/load.h"

namespace whittle::frontend {

using ir::Op;

namespace {

/// The standard library file (e.g. "compare.wq") that defines a public routine `routine_name`, or ""
/// (names starting with `arith_` are the library's internals). Read only on the error path.
std::string standard_library_file_of(const std::string& routine_name) {
    namespace fs = std::filesystem;
    if (routine_name.rfind("arith_", 0) == 0) return "";
    std::error_code ec;
    const std::string prefix = "routine " + routine_name + "(";
    for (const fs::directory_entry& e : fs::directory_iterator(stdlib_dir(), ec)) {
        if (e.path().extension() != ".wq") continue;
        std::ifstream in(e.path());
        std::string line;
        while (std::getline(in, line))
            if (line.rfind(prefix, 0) == 0) return e.path().filename().string();
    }
    return "";
}

}  // namespace

void Elaborator::exec_call(const File& f, const Stmt& s) {
    ir::SourceLoc loc = f.loc_of(s);
    auto it = routines_.find(s.sym);
    if (it == routines_.end()) {
        const Binding* b = lookup(s.sym);
        if (b) throw UserError(fmt::format("'{}' is not a routine", name(s.sym)), loc);
        const std::string file = standard_library_file_of(name(s.sym));
        if (!file.empty())
            throw UserError(fmt::format("unknown routine '{}': the standard library defines it (in {}); add `use \"arith\"` "
                                        "at the top of the file",
                                        name(s.sym), file),
                            loc);
        throw UserError(fmt::format("unknown routine '{}' (expected a gate name or a routine defined with 'routine')", name(s.sym)), loc);
    }
    const File& rf = *it->second.file;
    const Routine& r = *it->second.routine;
    if (s.args.size() != r.params.size())
        throw UserError(fmt::format("routine '{}' takes {} argument{}, found {}", name(r.sym), r.params.size(),
                                    r.params.size() == 1 ? "" : "s", s.args.size()),
                        loc);
    if (call_stack_.size() >= limits_.max_recursion)
        throw UserError(fmt::format("routine calls nested deeper than the limit of {} (is '{}' recursive?)",
                                    limits_.max_recursion, name(r.sym)),
                        loc);
    // Bind arguments in the caller's scope, then open the routine's frame.
    std::vector<std::pair<uint32_t, Binding>> bound;
    std::vector<std::pair<uint32_t, uint32_t>> used;  // wire, argument index
    auto claim = [&](uint32_t w, size_t arg) {
        for (auto& [uw, ua] : used)
            if (uw == w)
                throw UserError(fmt::format("'{}' is passed twice to '{}' (arguments {} and {}): a routine's wires must differ",
                                            c_.wire_name(w), name(r.sym), ua + 1, arg + 1),
                                f.loc_of(f.exprs[s.args[arg]]));
        used.emplace_back(w, uint32_t(arg));
    };
    for (size_t i = 0; i < r.params.size(); ++i) {
        const Param& p = r.params[i];
        uint32_t ae = s.args[i];
        Binding b;
        switch (p.kind) {
        case ParamKind::Qubit:
            b.kind = Binding::Wire;
            b.first = resolve_wire(f, ae);
            b.size = 1;
            b.scalar = true;
            claim(b.first, i);
            break;
        case ParamKind::Register: {
            const Expr& e = f.exprs[ae];
            if (e.kind == ExprKind::Slice) {
                b = resolve_slice(f, ae);
            } else {
                const Binding* rb = e.kind == ExprKind::Name ? lookup(e.sym) : nullptr;
                if (!rb || rb->kind != Binding::Register)
                    fail(f, e, fmt::format("parameter '{}' of '{}' is a register: pass a register name or a slice name[i..j]",
                                           name(p.sym), name(r.sym)));
                b = *rb;
            }
            for (uint32_t k = 0; k < b.size; ++k) claim(b.first + k, i);
            break;
        }
        case ParamKind::Int:
            b.kind = Binding::Num;
            b.num = Number{Number::Rat, eval_int(f, ae, "an int argument"), 1, 0.0};
            break;
        case ParamKind::IntTable:
            b.kind = Binding::Table;
            b.table = eval_table(f, ae);
            break;
        case ParamKind::Angle: {
            b.kind = Binding::Num;
            ir::Angle a = eval_angle(f, ae);
            if (a.is_exact()) b.num = Number{Number::PiRat, a.num(), a.den(), 0.0};
            else b.num = Number{Number::Real, 0, 1, a.to_radians()};
            break;
        }
        }
        bound.emplace_back(p.sym, b);
    }
    size_t saved_base = frame_base_;
    uint32_t saved_depth = scope_depth_;
    size_t mark = locals_.size();
    frame_base_ = locals_.size();
    for (auto& pb : bound) locals_.push_back(pb);
    scope_depth_ = 1;
    call_stack_.push_back(r.sym);
    call_ancillas_.emplace_back();
    size_t start = c_.ops.size();
    const size_t registers_before = c_.registers.size();
    ir::Angle phase_before = c_.global_phase;
    try {
        exec_block(rf, r.body);
    } catch (const UserError& e) {
        // Name the call site once (the innermost call), so an error inside a routine can be traced.
        std::string msg = e.what();
        if (msg.find(" called at line ") != std::string::npos) throw;
        throw UserError(fmt::format("{} (in routine '{}' called at line {} of {})", msg, name(r.sym), s.line,
                                    std::filesystem::path(sm_.name(f.file_id)).filename().string()),
                        e.loc(), e.file_name());
    }
    call_stack_.pop_back();
    // The call's ancillas are back at |0> (the program's promise, checked on the whole program by
    // compile): later calls may take them.
    for (const auto& [shape, first] : call_ancillas_.back()) free_ancillas_[shape].push_back(first);
    call_ancillas_.pop_back();
    locals_.resize(mark);
    frame_base_ = saved_base;
    scope_depth_ = saved_depth;
    if (s.inverse) invert_tail(start, phase_before);
    if (opts_.locate_at_call_site && call_stack_.empty()) {
        // An outermost call: what it made is the calling line's (for cost by source line).
        for (size_t i = start; i < c_.ops.size(); ++i) c_.ops[i].loc = loc;
        for (size_t i = registers_before; i < c_.registers.size(); ++i) c_.registers[i].loc = loc;
    }
}

void Elaborator::exec_compute(const File& f, const Stmt& s) {
    uint32_t pair = c_.new_pair_id();
    size_t start = c_.ops.size();
    ir::Angle phase_before = c_.global_phase;
    // Under `when` (or a classical `if`) only the middle part is controlled: C(A B A^-1) = A C(B) A^-1,
    // since A^-1 undoes A whatever the control's value.
    Ctx outer = ctx_;
    ir::LitVec lifted_before = lifted_controls_;
    for (ir::Lit l : outer.controls) lifted_controls_.push_back(l);
    ctx_.controls.clear();
    ctx_.cond_reg = -1;
    ctx_.cond_value = 0;
    exec_block(f, s.body);
    ctx_ = outer;
    lifted_controls_ = lifted_before;
    size_t end_a = c_.ops.size();
    ir::Angle phase_a = c_.global_phase - phase_before;
    for (size_t i = start; i < end_a; ++i) {
        Op& op = c_.ops[i];
        if (op.pair != 0) continue;  // an inner pair keeps its own tag
        op.pair = pair;
        op.half = ir::PairHalf::Compute;
    }
    exec_block(f, s.body2);
    // The uncompute copy: inner pairs get fresh ids so every id names exactly one pair.
    std::map<uint32_t, uint32_t> renamed;
    std::vector<Op> inv;
    for (size_t i = end_a; i-- > start;) {
        inv.clear();
        Op op = c_.ops[i];
        ir::append_inverse(op, inv);
        for (Op& o : inv) {
            if (o.pair != 0 && o.pair != pair) {
                auto [it, fresh] = renamed.emplace(o.pair, 0);
                if (fresh) it->second = c_.new_pair_id();
                o.pair = it->second;
            }
            if (c_.ops.size() >= limits_.max_ops)
                throw UserError(fmt::format("the program elaborates to more than {} ops (the op limit)", limits_.max_ops), o.loc);
            c_.ops.push_back(std::move(o));
        }
    }
    c_.global_phase = c_.global_phase - phase_a;
}

namespace {

std::string read_file(const std::filesystem::path& p, uint64_t max_bytes, ir::SourceLoc loc) {
    std::error_code ec;
    auto size = std::filesystem::file_size(p, ec);
    if (!ec && size > max_bytes)
        throw UserError(fmt::format("'{}' is {} bytes, over the limit of {} bytes", p.string(), size, max_bytes), loc);
    std::ifstream in(p, std::ios::binary);
    if (!in) throw UserError(fmt::format("cannot read '{}'", p.string()), loc);
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

}  // namespace

void Elaborator::exec_use(const File& f, const Stmt& s) {
    namespace fs = std::filesystem;
    ir::SourceLoc loc = f.loc_of(s);
    if (scope_depth_ > 0 || !call_stack_.empty()) throw UserError("'use' must be at the top level of a file", loc);
    const std::string& wanted = f.strings[s.path];
    if (wanted.empty()) throw UserError("expected a file name in 'use \"...\"'", loc);
    std::vector<fs::path> dirs;
    fs::path here = fs::path(sm_.name(f.file_id)).parent_path();
    dirs.push_back(here.empty() ? fs::path(".") : here);
    for (const std::string& d : opts_.include_dirs) dirs.emplace_back(d);
    dirs.emplace_back(stdlib_dir());
    std::vector<std::string> names{wanted};
    if (fs::path(wanted).extension() != ".wq") names.push_back(wanted + ".wq");
    fs::path found;
    std::error_code ec;
    for (const std::string& n : names) {
        if (fs::path(n).is_absolute()) {
            if (fs::is_regular_file(n, ec)) found = n;
        } else {
            for (const fs::path& d : dirs)
                if (fs::is_regular_file(d / n, ec)) {
                    found = d / n;
                    break;
                }
        }
        if (!found.empty()) break;
    }
    if (found.empty()) {
        std::string searched;
        for (const fs::path& d : dirs) searched += (searched.empty() ? "" : ", ") + d.string();
        throw UserError(fmt::format("cannot find '{}' for 'use' (searched: {})", wanted, searched), loc);
    }
    std::string canon = fs::weakly_canonical(found, ec).string();
    if (canon.empty()) canon = found.string();
    for (size_t i = 0; i < use_stack_.size(); ++i)
        if (use_stack_[i] == canon) {
            std::string chain;
            for (size_t j = i; j < use_stack_.size(); ++j) chain += fs::path(use_stack_[j]).filename().string() + " -> ";
            chain += found.filename().string();
            throw UserError(fmt::format("include cycle: {}", chain), loc);
        }
    if (loaded_.count(canon)) return;  // each file is read once
    if (use_stack_.size() >= limits_.max_use_depth)
        throw UserError(fmt::format("'use' nested deeper than the limit of {}", limits_.max_use_depth), loc);
    std::string text = read_file(found, limits_.max_file_bytes, loc);
    uint32_t id = sm_.add(found.string(), std::move(text), loc);
    loaded_[canon] = id;
    use_stack_.push_back(canon);
    const File& used = load(id);
    exec_file(used);
    use_stack_.pop_back();
}

}  // namespace whittle::frontend
