// Circuit to ZX diagram: each op as Z phases, Hadamards, CZs and phase gadgets, laid out graph-like.
#include "zx/from_circuit.h"

#include <algorithm>

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::zx {
namespace {

const ir::Angle kPi = ir::Angle::pi_times(1);
const ir::Angle kHalfPi = ir::Angle::pi_times(1, 2);

class Lowerer {
public:
    Lowerer(uint32_t source, std::vector<Step>& out) : source_(source), out_(out) {}

    void h(uint32_t w) { out_.push_back(Step{Step::Kind::H, {}, {w}, kNoSource}); }
    void z(uint32_t w, const ir::Angle& a, bool tagged = true) {
        if (!a.identical(ir::Angle())) out_.push_back(Step{Step::Kind::Z, a, {w}, tagged ? source_ : kNoSource});
    }
    void x(uint32_t w) {
        h(w);
        z(w, kPi, false);  // not the op's own phase
        h(w);
    }
    void cz(uint32_t a, uint32_t b) { out_.push_back(Step{Step::Kind::CZ, {}, {a, b}, kNoSource}); }
    void gadget(std::vector<uint32_t> wires, const ir::Angle& a) {
        if (a.identical(ir::Angle())) return;
        if (wires.size() == 1) return z(wires[0], a);
        out_.push_back(Step{Step::Kind::Gadget, a, std::move(wires), source_});
    }
    /// e^{i a AND(wires)} for positive wires (at most kMaxProductWires).
    void product_phase(const std::vector<uint32_t>& wires, const ir::Angle& a) {
        const size_t k = wires.size();
        if (k == 0) return;  // a global phase
        if (k == 1) return z(wires[0], a);
        if (k == 2 && a == kPi && a.is_exact()) return cz(wires[0], wires[1]);
        const ir::Angle part = a.divided_by(int64_t(1) << (k - 1));
        for (uint32_t mask = 1; mask < (1u << k); ++mask) {
            std::vector<uint32_t> s;
            for (size_t i = 0; i < k; ++i)
                if (mask >> i & 1) s.push_back(wires[i]);
            const ir::Angle a_s = s.size() % 2 ? part : -part;
            gadget(std::move(s), a_s);
        }
    }
    /// e^{i a AND(literals)}: negative literals by X before and after.
    void literal_phase(const ir::LitVec& lits, const ir::Angle& a) {
        std::vector<uint32_t> wires;
        for (ir::Lit l : lits) {
            wires.push_back(l.wire());
            if (!l.positive()) x(l.wire());
        }
        product_phase(wires, a);
        for (ir::Lit l : lits)
            if (!l.positive()) x(l.wire());
    }
    /// target ^= AND(controls).
    void mcx(uint32_t t, const ir::LitVec& controls) {
        if (controls.empty()) return x(t);
        if (controls.size() == 1 && controls[0].positive()) {
            h(t);
            cz(controls[0].wire(), t);
            return h(t);
        }
        ir::LitVec lits = controls;
        lits.push_back(ir::Lit::pos(t));
        h(t);
        literal_phase(lits, kPi);
        h(t);
    }
    void rx(uint32_t w, const ir::Angle& a) {
        h(w);
        z(w, a);
        h(w);
    }
    /// RY(a) = S RX(a) S^dagger.
    void ry(uint32_t w, const ir::Angle& a) {
        z(w, -kHalfPi);
        rx(w, a);
        z(w, kHalfPi);
    }

private:
    uint32_t source_;
    std::vector<Step>& out_;
};

}  // namespace

std::optional<std::string> lower_op(const ir::Op& op, uint32_t source, std::vector<Step>& out) {
    if (op.is_conditioned()) return std::string("a classically conditioned op");
    Lowerer l(source, out);
    const uint32_t t = op.target, t2 = op.target2;
    const bool controlled = !op.controls.empty();
    auto uncontrolled_only = [&]() -> std::optional<std::string> {
        return fmt::format("a controlled {}", ir::op_kind_name(op.kind));
    };
    {
        // AND(x, x) = x and x xor x = 0 would need their own expansions; the IR never writes them
        std::vector<uint32_t> wires = op.wires();
        std::sort(wires.begin(), wires.end());
        if (op.kind != ir::OpKind::Barrier && std::adjacent_find(wires.begin(), wires.end()) != wires.end())
            return std::string("an op naming a wire twice");
    }
    switch (op.kind) {
    case ir::OpKind::Barrier: return std::nullopt;
    case ir::OpKind::Measure:
    case ir::OpKind::Reset: return fmt::format("a {}", ir::op_kind_name(op.kind));
    case ir::OpKind::X:
        if (op.controls.size() + 1 > kMaxProductWires) return std::string("an X with too many controls");
        l.mcx(t, op.controls);
        return std::nullopt;
    case ir::OpKind::Phase:
        if (op.controls.size() > kMaxProductWires) return std::string("a phase on too many literals");
        l.literal_phase(op.controls, op.angle);
        return std::nullopt;
    case ir::OpKind::Parity: {
        std::vector<uint32_t> wires;
        for (ir::Lit x : op.controls) wires.push_back(x.wire());
        if (!wires.empty()) l.gadget(std::move(wires), op.angle);
        return std::nullopt;
    }
    case ir::OpKind::RZ: {
        // exp(-i a/2 Z) = e^{-i a/2} diag(1, e^{i a}); under controls C the first factor is a phase on C
        if (op.controls.size() + 1 > kMaxProductWires) return std::string("an RZ with too many controls");
        if (!controlled) {
            l.z(t, op.angle);
            return std::nullopt;
        }
        l.literal_phase(op.controls, -op.angle.divided_by(2));
        ir::LitVec lits = op.controls;
        lits.push_back(ir::Lit::pos(t));
        l.literal_phase(lits, op.angle);
        return std::nullopt;
    }
    case ir::OpKind::Swap:
        if (!controlled) {
            out.push_back(Step{Step::Kind::Swap, {}, {t, t2}, kNoSource});
            return std::nullopt;
        }
        if (op.controls.size() + 2 > kMaxProductWires) return std::string("a swap with too many controls");
        {
            // controlled swap = CX(t2 -> t) CCX(C, t -> t2) CX(t2 -> t)
            ir::LitVec c2 = op.controls;
            c2.push_back(ir::Lit::pos(t));
            l.mcx(t, {ir::Lit::pos(t2)});
            l.mcx(t2, c2);
            l.mcx(t, {ir::Lit::pos(t2)});
        }
        return std::nullopt;
    case ir::OpKind::H:
        if (controlled) return uncontrolled_only();
        l.h(t);
        return std::nullopt;
    case ir::OpKind::Y:  // Y = i X Z
        if (controlled) return uncontrolled_only();
        l.z(t, kPi);
        l.x(t);
        return std::nullopt;
    case ir::OpKind::SX:  // SX = e^{i pi/4} RX(pi/2)
    case ir::OpKind::SXdg:
        if (controlled) return uncontrolled_only();
        l.rx(t, op.kind == ir::OpKind::SX ? kHalfPi : -kHalfPi);
        return std::nullopt;
    case ir::OpKind::RX:
        if (controlled) return uncontrolled_only();
        l.rx(t, op.angle);
        return std::nullopt;
    case ir::OpKind::RY:
        if (controlled) return uncontrolled_only();
        l.ry(t, op.angle);
        return std::nullopt;
    case ir::OpKind::U:  // Rz(phi) Ry(theta) Rz(lambda) up to a global phase
        if (controlled) return uncontrolled_only();
        l.z(t, op.lambda());
        l.ry(t, op.angle);
        l.z(t, op.phi());
        return std::nullopt;
    case ir::OpKind::R:  // R(theta, phi) = Rz(phi) RX(theta) Rz(-phi)
        l.z(t, -op.phi());
        l.rx(t, op.angle);
        l.z(t, op.phi());
        return std::nullopt;
    case ir::OpKind::ISwap:  // iSWAP = SWAP CZ (S x S)
        l.z(t, kHalfPi);
        l.z(t2, kHalfPi);
        l.cz(t, t2);
        out.push_back(Step{Step::Kind::Swap, {}, {t, t2}, kNoSource});
        return std::nullopt;
    case ir::OpKind::XX:  // exp(-i a/2 X x X) = (H x H) e^{i a (t xor t2)} (H x H) up to a global phase
        l.h(t);
        l.h(t2);
        l.gadget({t, t2}, op.angle);
        l.h(t);
        l.h(t2);
        return std::nullopt;
    }
    return std::string("an unknown op");
}

void invert_steps(std::vector<Step>& steps) {
    std::reverse(steps.begin(), steps.end());
    for (Step& s : steps)
        if (s.kind == Step::Kind::Z || s.kind == Step::Kind::Gadget) s.angle = -s.angle;
}

DiagramBuilder::DiagramBuilder(Graph& g, uint32_t num_wires, const std::vector<uint8_t>& zero_inputs,
                               bool track_sources)
    : g_(g), track_(track_sources), front_(num_wires), open_(num_wires, EdgeKind::Plain) {
    g_.inputs.assign(num_wires, kNoVertex);
    g_.outputs.assign(num_wires, kNoVertex);
    for (uint32_t w = 0; w < num_wires; ++w) {
        if (!zero_inputs.empty() && zero_inputs[w]) {
            front_[w] = g_.add_vertex(VertexKind::Z, {}, w);  // |+>, and the Hadamard after it makes |0>
            open_[w] = EdgeKind::Hadamard;
            continue;
        }
        front_[w] = g_.inputs[w] = g_.add_vertex(VertexKind::Boundary, {}, w);
    }
}

Vertex DiagramBuilder::spider_on(uint32_t w) {
    const Vertex f = front_[w];
    if (!g_.is_boundary(f) && open_[w] == EdgeKind::Plain) return f;
    const Vertex s = g_.add_vertex(VertexKind::Z, {}, w);
    g_.add_edge(f, s, open_[w]);
    front_[w] = s;
    open_[w] = EdgeKind::Plain;
    return s;
}

void DiagramBuilder::apply(const Step& s) {
    switch (s.kind) {
    case Step::Kind::H:
        open_[s.wires[0]] = compose(open_[s.wires[0]], EdgeKind::Hadamard);
        return;
    case Step::Kind::Z: {
        const Vertex v = spider_on(s.wires[0]);
        g_.add_to_phase(v, s.angle);
        if (s.source != kNoSource) placements_.push_back({s.source, v});
        if (track_ && s.source != kNoSource) g_.add_source(v, s.source);
        return;
    }
    case Step::Kind::CZ: {
        WHITTLE_ASSERT(s.wires[0] != s.wires[1] && "CZ on two distinct wires");
        const Vertex a = spider_on(s.wires[0]), b = spider_on(s.wires[1]);
        g_.toggle_hadamard(a, b);
        return;
    }
    case Step::Kind::Gadget: {
        const Vertex hub = g_.add_vertex(VertexKind::Z, {}, s.wires[0]);
        for (uint32_t w : s.wires) g_.add_edge(hub, spider_on(w), EdgeKind::Hadamard);
        const Vertex leaf = g_.add_vertex(VertexKind::Z, s.angle, s.wires[0]);
        g_.add_edge(hub, leaf, EdgeKind::Hadamard);
        if (s.source != kNoSource) placements_.push_back({s.source, leaf});
        if (track_ && s.source != kNoSource) g_.add_source(leaf, s.source);
        return;
    }
    case Step::Kind::Swap:
        std::swap(front_[s.wires[0]], front_[s.wires[1]]);
        std::swap(open_[s.wires[0]], open_[s.wires[1]]);
        return;
    }
}

void DiagramBuilder::cut(uint32_t w) {
    const Vertex out = g_.add_vertex(VertexKind::Boundary, {}, w);
    g_.add_edge(front_[w], out, open_[w]);
    front_[w] = g_.add_vertex(VertexKind::Boundary, {}, w);
    open_[w] = EdgeKind::Plain;
}

void DiagramBuilder::finish() {
    for (uint32_t w = 0; w < front_.size(); ++w) {
        const Vertex out = g_.outputs[w] = g_.add_vertex(VertexKind::Boundary, {}, w);
        g_.add_edge(front_[w], out, open_[w]);
    }
}

std::optional<std::string> circuit_to_graph(const ir::Circuit& c, Graph& out) {
    DiagramBuilder b(out, c.num_qubits());
    std::vector<Step> steps;
    for (size_t i = 0; i < c.ops.size(); ++i) {
        steps.clear();
        if (auto why = lower_op(c.ops[i], uint32_t(i), steps)) return why;
        for (const Step& s : steps) b.apply(s);
    }
    b.finish();
    return std::nullopt;
}

}  // namespace whittle::zx
