// A ZX diagram as text: boundaries and spiders with their phases and edges, for `whittle draw --zx`.
#pragma once

#include <string>

#include "ir/circuit.h"
#include "zx/graph.h"

namespace whittle::zx {

/// Lists the diagram: each wire's input and output boundary with the vertex it is joined to, then
/// each spider (numbered s1, s2, ... in id order) with its phase and its edges, "=" for a plain
/// edge and "~" for a Hadamard edge; a spider of degree one behind a Hadamard edge from a Pauli
/// spider is marked as a phase gadget's leaf. Wire names come from `shape` (as many wires as the
/// diagram has inputs). Numbers without boundary (scalar parts) are listed last.
std::string describe(const Graph& g, const ir::Circuit& shape);

}  // namespace whittle::zx
