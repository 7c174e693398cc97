// ZX diagram back to a circuit, while the diagram is still circuit-shaped.
#pragma once

#include <optional>

#include "ir/circuit.h"
#include "zx/graph.h"

namespace whittle::zx {

/// The circuit of a circuit-shaped diagram, equal to it up to a global phase, on the wires of
/// `shape` (its registers are copied; it must have as many wires as the diagram has inputs).
/// Circuit-shaped: each wire's input boundary leads through spiders created on that wire
/// (Graph::qubit) to its output boundary, each step a plain edge or a Hadamard (an H gate), every
/// spider is on one such path, every other edge is a Hadamard edge between spiders of two wires (a
/// CZ), and the CZs can be placed in time order: the spiders they join are on their wires at one
/// time. The diagram of a circuit without swaps (DiagramBuilder) is circuit-shaped, and stays so
/// under spider fusion along a wire; phase gadgets and most simplified diagrams are not, and give
/// nullopt. Phases become Phase ops on one wire, CZs Phase(pi) on two.
std::optional<ir::Circuit> graph_to_circuit(const Graph& g, const ir::Circuit& shape);

}  // namespace whittle::zx
