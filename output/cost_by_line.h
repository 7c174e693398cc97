// Where the cost went: the compiled circuit's T, two-qubit gates, rotations and qubits summed by the
// source line each op came from (`compile --cost-by-line`, the report's "cost_by_line").
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "ir/circuit.h"
#include "ir/target.h"
#include "output/report.h"
#include "passes/pipeline.h"

namespace whittle::lowering {

/// One source line's share of the output. `line` 0 collects the ops no single line made (merged
/// phases, rebuilt regions, compiler-added wires).
struct LineCost {
    uint16_t file = 0;  ///< index into the circuit's files
    uint32_t line = 0;
    uint64_t t_count = 0, two_qubit = 0, rotations = 0, ops = 0;
    uint32_t qubits = 0;  ///< wires of the registers the line declared (a call's work registers, at the call)
    /// The constructions the lowering chose for the line's multi-controlled ops ("clean-ladder x2").
    std::vector<std::string> constructions;
};

/// The output's cost by line, largest first under `metric` (T; two-qubit; ops for depth), the
/// line-0 row last. The sums of each column over the rows equal the whole circuit's.
std::vector<LineCost> cost_by_line(const ir::Circuit& output, const std::vector<passes::PassRecord>& records,
                                   ir::Metric metric);

/// The rows as a JSON array of {file, line, t_count, two_qubit_count, rotations, ops, qubits, constructions}.
Json cost_by_line_json(const std::vector<LineCost>& rows, const ir::Circuit& output);

}  // namespace whittle::lowering
