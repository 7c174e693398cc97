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

/// The counts a fault-tolerant resource estimate is made of, beside the lowered circuit's gates.
struct LogicalCounts {
    uint64_t toffoli = 0;                 ///< Toffolis and CCZs: lowered exactly (7 T each) or left in the output
    uint64_t relative_phase_toffoli = 0;  ///< compute/uncompute halves lowered to relative-phase forms (4 T each)
    uint64_t temporary_and = 0;           ///< compute halves lowered to the temporary AND (4 T)
    uint64_t measured_uncompute = 0;      ///< uncompute halves erased by measurement (no T)
    uint64_t mcx = 0;                     ///< multi-controlled X ops left in the output (3+ controls)
    /// Arbitrary rotations (angles that are not multiples of pi/4): those the Clifford+T synthesis
    /// approximated, or on other targets those in the output; and their layers (ASAP).
    uint64_t rotations = 0, rotation_depth = 0;
    uint32_t peak_live_qubits = 0;        ///< see ir::Resources::peak_live_qubits
};

/// The logical counts of a compile: from the lowering passes' records and the output.
LogicalCounts logical_counts(const std::vector<passes::PassRecord>& records, const ir::Circuit& output);

/// `whittle compile --report FILE.json`: the output's resource fields at the top level, plus
/// "input_resources", "target", "level", "options", "passes", "constructions" and
/// "approximation_error_bound" (the sum of the passes' error bounds; 0 when nothing was approximated).
Json compile_report(const CompileReportInput& in);

}  // namespace whittle::lowering
