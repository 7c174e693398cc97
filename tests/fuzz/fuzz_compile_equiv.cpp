// libFuzzer target: parse -> the -O3 pipeline -> equivalence check; a pass that changes the meaning aborts.
#include <cstdio>
#include <cstdlib>

#include "ir/error.h"
#include "ir/printer.h"
#include "verify/equivalence.h"
#include "passes/pipeline.h"
#include "tests/fuzz/fuzz_input.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
    using namespace whittle;
    const std::string text = fuzz::as_text(data, size);
    const bool qasm = text.rfind("OPENQASM", 0) == 0;
    frontend::SourceManager sm;
    ir::Circuit input;
    try {
        frontend::LoadOptions lo = fuzz::fuzz_load_options();
        lo.limits.max_qubits = 16;
        lo.limits.max_ops = 400;
        input = frontend::load_text(text, qasm ? "fuzz.qasm" : "fuzz.wq",
                                    qasm ? frontend::InputFormat::Qasm2 : frontend::InputFormat::Wq, sm, lo);
    } catch (const UserError&) {
        return 0;
    }
    static const char* const targets[] = {"", "clifford+t", "nct", "u+cx", "cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r"};
    passes::PassOptions po;
    po.level = 3;
    po.target = ir::parse_optional_target(targets[size % 8]);
    po.allow_measurement = (size / 8) % 2 == 1;
    ir::Circuit output = input;
    try {
        passes::run_passes(output, passes::pipeline_for(po), po);
    } catch (const UserError&) {
        return 0;  // e.g. an op the target cannot express: refused with a message
    }
    passes::EquivOptions eo;
    eo.time_budget_seconds = 2;
    const passes::EquivResult r = passes::check_equivalence(input, output, eo);
    if (r.verdict == passes::Verdict::NotEquivalent) {
        std::fprintf(stderr, "-O3 (target '%s') changed the meaning: %s by %s\ncounterexample: %s\ninput:\n%s\noutput:\n%s\n",
                     ir::target_label(po.target).c_str(), r.confidence.c_str(), r.engine.c_str(), r.counterexample.c_str(),
                     ir::print_wq(input).c_str(), ir::print_wq(output).c_str());
        std::abort();
    }
    return 0;
}
