// Circuit to ZX diagram: ops as a few ZX steps, and a builder that lays them out graph-like.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "zx/graph.h"

namespace whittle::zx {

constexpr uint32_t kNoSource = 0xffffffffu;

/// One ZX step of a circuit. Z is the phase diag(1, e^{i angle}) on one wire; Gadget is
/// e^{i angle (w1 xor w2 xor ...)} (a phase gadget); CZ and Swap on two wires, H on one.
struct Step {
    enum class Kind : uint8_t { H, Z, CZ, Gadget, Swap };
    Kind kind = Kind::H;
    ir::Angle angle;
    std::vector<uint32_t> wires;
    uint32_t source = kNoSource;  ///< the op index a Z or Gadget step came from (phase teleportation)
};

/// Multi-literal phases expand into 2^k - 1 gadgets; products of more wires are refused.
constexpr size_t kMaxProductWires = 8;

/// Appends `op` as steps, equal to it up to a global phase (global phases are dropped: the diagram
/// is kept up to a scalar). Supported: X with any controls (negative ones by X conjugation), Phase
/// on up to kMaxProductWires literals (AND(x1..xk) = 2^{1-k} sum over non-empty S of
/// (-1)^{|S|+1} xor_S(x), so each product is a sum of gadgets), Parity, RZ with controls, Swap with
/// controls (two CNOTs around a controlled X), and uncontrolled H, Y, SX, SXdg, RX, RY, U, R, iSWAP,
/// XX, Barrier. Returns the reason when `op` is outside (a measurement, reset, classical condition,
/// another controlled gate, a product over kMaxProductWires); `out` is then unspecified.
std::optional<std::string> lower_op(const ir::Op& op, uint32_t source, std::vector<Step>& out);

/// The inverse of a list of steps from lower_op, in place (reversed, angles negated).
void invert_steps(std::vector<Step>& steps);

/// Lays steps out as a graph-like diagram as they come: each wire keeps its last spider and the
/// kind of the edge still open after it, so H only flips that kind, a phase on an open plain edge
/// adds to the spider (spider fusion on the fly), and CZ toggles a Hadamard edge (Hopf law).
class DiagramBuilder {
public:
    /// `zero_inputs[w]`: wire w starts in |0> (a phase-free Z spider behind a Hadamard) instead of
    /// an input boundary; empty means none does. `track_sources`: each Z or Gadget step with a
    /// source puts it into the spider that takes its phase (Graph::add_source).
    DiagramBuilder(Graph& g, uint32_t num_wires, const std::vector<uint8_t>& zero_inputs = {},
                   bool track_sources = false);
    void apply(const Step& s);
    /// Ends wire w in an output boundary and starts it again from a fresh input boundary: the
    /// diagram then holds the parts before and after separately (for an op it cannot draw, such
    /// as a measurement). The cut's boundaries are in neither `inputs` nor `outputs`.
    void cut(uint32_t w);
    /// Closes every wire with an output boundary.
    void finish();
    /// For each phase-carrying step with a source: the spider its phase went into (a gadget's leaf).
    struct PhasePlacement {
        uint32_t source;
        Vertex spider;
    };
    const std::vector<PhasePlacement>& placements() const { return placements_; }

private:
    /// The wire's last spider, made when the wire ends at a boundary or an open Hadamard edge.
    Vertex spider_on(uint32_t w);

    Graph& g_;
    bool track_;
    std::vector<Vertex> front_;
    std::vector<EdgeKind> open_;
    std::vector<PhasePlacement> placements_;
};

/// The diagram of a whole circuit (inputs and outputs by wire), or the reason it has none.
std::optional<std::string> circuit_to_graph(const ir::Circuit& c, Graph& out);

}  // namespace whittle::zx
