// The JSON resource report (`whittle count --json`, `whittle compile --report`) and the plain count table.
// The schema is documented in docs/report-schema.md; change both together and bump kReportSchema.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "ir/circuit.h"
#include "ir/resources.h"
#include "passes/pass.h"
#include "passes/pipeline.h"

namespace whittle::lowering {

/// The report's JSON type: keys keep the order they were written in (the schema's order).
using Json = nlohmann::ordered_json;

/// The value of the "schema" field; the number goes up when a field changes meaning or goes away.
inline constexpr const char* kReportSchema = "whittle-report/1";

/// The resource object (qubits, qubits_by_role, t_count, t_depth, cnot_count, two_qubit_count,
/// depth, gates, ...): the whole of `count --json` and the top level of the compile report.
Json resources_json(const ir::Resources& r);

/// `whittle count --json`: "schema", "input", then the resource fields of `c`.
Json count_json(const ir::Circuit& c, const std::string& input);

/// Everything the compile report says besides the output circuit's resources.
struct CompileReportInput {
    std::string input;                   ///< input file as given on the command line
    const ir::Circuit* source = nullptr; ///< the circuit as read (before any pass)
    const ir::Circuit* output = nullptr; ///< the circuit as emitted
    passes::PassOptions options;
    std::string explicit_passes;         ///< the --passes list when given ("" = the -O pipeline)
    std::string emit;                    ///< output format: wq, qasm2, qasm3
    bool verify = false;                 ///< --verify was on
    std::vector<passes::PassRecord> records;
};

/// `whittle compile --report FILE.json`: the output's resource fields at the top level, plus
/// "input_resources", "target", "level", "options", "passes", "constructions" and
/// "approximation_error_bound" (the sum of the passes' error bounds; 0 when nothing was approximated).
Json compile_report(const CompileReportInput& in);

/// The plain `whittle count` table: one "name  value" row per line, values aligned in one column,
/// then the gates by name, aligned likewise.
std::string resource_table(const ir::Resources& r);

/// The metric names used by --optimize-for and the report ("t", "2q", "depth").
const char* metric_name(passes::Metric m);

}  // namespace whittle::lowering
