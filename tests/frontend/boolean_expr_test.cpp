// Exactness of `t ^= f` (ESOP of multi-controlled X) and `phase(theta) f` (multilinear expansion) on
// every basis input, checked by an evaluator written here against random expression trees.
#include <doctest/doctest.h>

#include <memory>
#include <random>

#include "frontend/load.h"
#include "ir/circuit.h"

using namespace whittle;

namespace {

// A tiny expression tree independent of the compiler: generated, printed as .wq text, evaluated.
struct Tree {
    enum Kind { Var, Const, Not, And, Xor, Or } kind = Var;
    int var = 0;
    bool value = false;
    std::unique_ptr<Tree> a, b;

    std::string text() const {
        switch (kind) {
        case Var: return "x[" + std::to_string(var) + "]";
        case Const: return value ? "1" : "0";
        case Not: return "!(" + a->text() + ")";
        case And: return "(" + a->text() + " & " + b->text() + ")";
        case Xor: return "(" + a->text() + " ^ " + b->text() + ")";
        case Or: return "(" + a->text() + " | " + b->text() + ")";
        }
        return "";
    }
    bool eval(uint32_t input) const {
        switch (kind) {
        case Var: return (input >> var) & 1;
        case Const: return value;
        case Not: return !a->eval(input);
        case And: return a->eval(input) && b->eval(input);
        case Xor: return a->eval(input) != b->eval(input);
        case Or: return a->eval(input) || b->eval(input);
        }
        return false;
    }
};

std::unique_ptr<Tree> random_tree(std::mt19937_64& rng, int vars, int depth) {
    auto t = std::make_unique<Tree>();
    int pick = std::uniform_int_distribution<int>(0, depth <= 0 ? 1 : 9)(rng);
    if (pick <= 1) {
        if (std::uniform_int_distribution<int>(0, 9)(rng) == 0) {
            t->kind = Tree::Const;
            t->value = rng() & 1;
        } else {
            t->kind = Tree::Var;
            t->var = std::uniform_int_distribution<int>(0, vars - 1)(rng);
        }
        return t;
    }
    t->kind = pick == 2 ? Tree::Not : pick <= 4 ? Tree::And : pick <= 6 ? Tree::Xor : Tree::Or;
    t->a = random_tree(rng, vars, depth - 1);
    if (t->kind != Tree::Not) t->b = random_tree(rng, vars, depth - 1);
    return t;
}

ir::Circuit load(const std::string& text) {
    frontend::SourceManager sm;
    return frontend::load_text(text, "expr.wq", frontend::InputFormat::Wq, sm);
}

bool lit_true(ir::Lit l, uint64_t state) { return ((state >> l.wire()) & 1) == (l.positive() ? 1u : 0u); }

/// Runs X ops classically on a basis state (every op must be an X).
uint64_t run_classical(const ir::Circuit& c, uint64_t state) {
    for (const ir::Op& op : c.ops) {
        REQUIRE(op.kind == ir::OpKind::X);
        bool fire = true;
        for (ir::Lit l : op.controls) fire = fire && lit_true(l, state);
        if (fire) state ^= uint64_t(1) << op.target;
    }
    return state;
}

/// The phase the circuit's diagonal ops give a basis state (global phase included).
ir::Angle phase_of(const ir::Circuit& c, uint64_t state) {
    ir::Angle total = c.global_phase;
    for (const ir::Op& op : c.ops) {
        if (op.kind == ir::OpKind::Phase) {
            bool fire = true;
            for (ir::Lit l : op.controls) fire = fire && lit_true(l, state);
            if (fire) total += op.angle;
        } else {
            REQUIRE(op.kind == ir::OpKind::Parity);
            bool parity = false;
            for (ir::Lit l : op.controls) parity = parity != (((state >> l.wire()) & 1) == 1);
            if (parity) total += op.angle;
        }
    }
    return total;
}

}  // namespace

TEST_CASE("t ^= f is exact on every input for random expressions") {
    std::mt19937_64 rng(1);
    const int vars = 5;  // wires x[0..4], then t = wire 5, controls c = 6, d = 7
    for (int round = 0; round < 300; ++round) {
        auto f = random_tree(rng, vars, 4);
        bool controlled = round % 3 == 0;
        std::string prog = "qubit x[5], t, c, d\n";
        prog += controlled ? "when c & !d { t ^= " + f->text() + " }\n" : "t ^= " + f->text() + "\n";
        CAPTURE(prog);
        ir::Circuit circ = load(prog);
        for (uint64_t in = 0; in < (uint64_t(1) << 8); ++in) {
            uint64_t out = run_classical(circ, in);
            bool want = f->eval(uint32_t(in & 31));
            if (controlled) want = want && ((in >> 6) & 1) && !((in >> 7) & 1);
            CHECK(out == (in ^ (uint64_t(want) << 5)));
        }
    }
}

TEST_CASE("phase(theta) f gives e^{i theta f(x)} on every input for random expressions") {
    std::mt19937_64 rng(2);
    const ir::Angle thetas[] = {ir::Angle::pi_times(1), ir::Angle::pi_times(1, 4), ir::Angle::pi_times(-3, 8),
                                ir::Angle::pi_times(2, 3)};
    for (int round = 0; round < 300; ++round) {
        auto f = random_tree(rng, 5, 4);
        const ir::Angle& theta = thetas[round % 4];
        bool controlled = round % 5 == 0;
        std::string body = "phase(" + theta.to_string() + ") " + f->text();
        std::string prog = "qubit x[5], c\n" + (controlled ? "when !c { " + body + " }\n" : body + "\n");
        CAPTURE(prog);
        ir::Circuit circ = load(prog);
        for (uint64_t in = 0; in < 64; ++in) {
            bool fx = f->eval(uint32_t(in & 31)) && (!controlled || !((in >> 5) & 1));
            ir::Angle want = fx ? theta : ir::Angle();
            ir::Angle got = phase_of(circ, in);
            CHECK_MESSAGE(got == want, "input " << in << ": got " << got.to_string() << ", want " << want.to_string());
        }
    }
}

TEST_CASE("special forms stay one op") {
    ir::Circuit c = load("qubit a, b, c\nphase(pi/4) a & !b\nphase(pi/8) a ^ b ^ c\nc ^= a & !b\nphase(pi) !a ^ b\n");
    REQUIRE(c.ops.size() == 4);
    CHECK(c.ops[0].kind == ir::OpKind::Phase);
    CHECK(c.ops[0].controls.size() == 2);
    CHECK_FALSE(c.ops[0].controls[1].positive());
    CHECK(c.ops[1].kind == ir::OpKind::Parity);
    CHECK(c.ops[1].controls.size() == 3);
    CHECK(c.ops[2].kind == ir::OpKind::X);
    CHECK(c.ops[2].controls.size() == 2);
    // !a ^ b = 1 ^ (a ^ b): a global phase pi and a parity phase -pi (= pi).
    CHECK(c.ops[3].kind == ir::OpKind::Parity);
    CHECK(c.global_phase == ir::Angle::pi_times(1));
}

TEST_CASE("an or of literals becomes the shorter exact form") {
    // a | b = 1 ^ (!a & !b) = a ^ (!a & b): two ops, not the three of a ^ b ^ ab (exactness is
    // checked on every input above).
    ir::Circuit c = load("qubit a, b, t\nt ^= a | b\n");
    CHECK(c.ops.size() == 2);
}
