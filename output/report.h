// The JSON resource report (`whittle count --json`, `whittle compile --report`) and the plain count table.
// The schema is documented in docs/report-schema.md; change both together and bump kReportSchema.
#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "ir/circuit.h"
#include "ir/resources.h"

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

/// The plain `whittle count` table: one "name  value" row per line, values aligned in one column,
/// then the gates by name, aligned likewise.
std::string resource_table(const ir::Resources& r);


}  // namespace whittle::lowering
