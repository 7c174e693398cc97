// Per-pass translation validation for `compile --verify`, with the before/after files on failure.
#include "cli/verify_hook.h"

#include <filesystem>
#include <iostream>

#include <fmt/format.h>

#include "cli/driver.h"
#include "ir/printer.h"

namespace whittle::cli {

std::string verify_folder_for(const std::string& output) {
    if (output.empty() || output == "-") return ".";
    const std::filesystem::path p(output);
    return p.has_parent_path() ? p.parent_path().string() : ".";
}

std::string PassVerifier::operator()(const std::string& pass, const ir::Circuit& before,
                                     const ir::Circuit& after) const {
    const passes::EquivResult r = passes::check_equivalence(before, after, opts_);
    if (r.verdict == passes::Verdict::Equivalent) return r.engine;
    if (r.verdict == passes::Verdict::Inconclusive) {
        std::cerr << fmt::format("warning: --verify could not check pass '{}': {}\n", pass, r.confidence);
        return "inconclusive";
    }
    const std::filesystem::path dir(folder_);
    const std::string stem = (dir / fmt::format("whittle-verify-{}{}", tag_, pass)).string();
    write_output(stem + "-before.wq", ir::print_wq(before));
    write_output(stem + "-after.wq", ir::print_wq(after));
    write_output(stem + "-counterexample.txt",
                 fmt::format("pass: {}\nengine: {}\nconfidence: {}\ncounterexample: {}\n", pass, r.engine, r.confidence,
                             r.counterexample));
    throw VerifyFailure(fmt::format("error: --verify: pass '{}' changed the circuit's meaning ({}: {})\n"
                                    "  counterexample: {}\n  wrote {}-before.wq, {}-after.wq and {}-counterexample.txt\n",
                                    pass, r.engine, r.confidence, r.counterexample, stem, stem, stem));
}

}  // namespace whittle::cli
