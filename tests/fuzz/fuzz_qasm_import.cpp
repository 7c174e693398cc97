// libFuzzer target: the OpenQASM 2.0 importer never crashes; bad input is a located UserError.
#include "ir/error.h"
#include "tests/fuzz/fuzz_input.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
    using namespace whittle;
    frontend::SourceManager sm;
    try {
        ir::Circuit c = frontend::load_text(fuzz::as_text(data, size), "fuzz.qasm", frontend::InputFormat::Qasm2, sm,
                                            fuzz::fuzz_load_options());
        ir::verify(c);
    } catch (const UserError&) {
    }
    return 0;
}
