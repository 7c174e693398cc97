// The JSON report of one compile (`whittle compile --report`, the Python module's count()).
// The schema is documented in docs/report-schema.md; change both together and bump kReportSchema.
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"
#include "output/report.h"
#include "passes/pass.h"
#include "passes/pipeline.h"

namespace whittle::lowering {

/// Everything the compile report says besides the output circuit's resources.
struct CompileReportInput {
    std::string input;                   ///< input file as given on the command line
    const ir::Circuit* source = nullptr; ///< the circuit as read (before any pass)
    const ir::Circuit* output = nullptr; ///< the circuit as emitted
    passes::PassOptions options;
    std::string explicit_passes;         ///< the --passes list when given ("" = the -O pipeline)
    std::string emit;                    ///< output format: wq, qasm2, qasm3
    bool verify = false;                 ///< --verify was on
    std::string kept_run;                ///< the alternative run whose result was kept ("" = the run asked for)
    std::vector<passes::PassRecord> records;
};

/// `whittle compile --report FILE.json`: the output's resource fields at the top level, plus
/// "input_resources", "target", "level", "options", "passes", "constructions" and
/// "approximation_error_bound" (the sum of the passes' error bounds; 0 when nothing was approximated).
Json compile_report(const CompileReportInput& in);

}  // namespace whittle::lowering
