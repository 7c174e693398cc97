// `whittle equiv A B`: exit 0 equivalent, 1 not equivalent, 2 error or inconclusive.
#include <cmath>
#include <iostream>
#include <memory>
#include <optional>

#include <fmt/format.h>

#include "cli/commands.h"
#include "cli/driver.h"
#include "frontend/load.h"
#include "ir/error.h"
#include "verify/ancilla_contract.h"
#include "verify/equivalence.h"

namespace whittle::cli {
namespace {

struct EquivArgs {
    std::vector<std::string> files;
    double time_budget = 10;
    bool exact_only = false;
    uint64_t seed = 1;
    int states = 6;
    bool explain = false;
    std::vector<std::string> include_dirs;
    std::vector<std::string> maps;  // FIRST=SECOND
};

/// A program that does not return a declared ancilla to |0> breaks the comparison's assumption:
/// returns the located error for it (empty when it keeps it), and a note when it is undecided.
struct ContractFinding {
    std::optional<UserError> violation;
    std::string note;
};

ContractFinding check_contract(const ir::Circuit& c, const std::string& file, const char* side, double seconds) {
    const passes::AncillaContract r = passes::check_ancilla_contract(c, seconds);
    if (r.status == passes::AncillaContract::Status::Undecided)
        return {std::nullopt, fmt::format("  ancillas:       not decided for the {} program ({})\n", side, r.method)};
    if (r.status == passes::AncillaContract::Status::Ok) return {};
    const UserError e = passes::contract_violation(c, r);
    const std::string note = fmt::format("  ancillas:       the {} program ('{}'): {}\n", side, file, e.what());
    if (e.loc().known()) return {e, note};
    return {UserError(fmt::format("{} (the {} program, '{}')", e.what(), side, file)), note};
}

int run_equiv(const EquivArgs& args) {
    frontend::SourceManager sm;
    return guarded(sm, [&]() -> int {
        frontend::LoadOptions lo;
        lo.include_dirs = args.include_dirs;
        const ir::Circuit a = frontend::load_file(args.files[0], sm, lo);
        const ir::Circuit b = frontend::load_file(args.files[1], sm, lo);
        passes::EquivOptions opts;
        for (const std::string& m : args.maps) {
            const size_t eq = m.find('=');
            if (eq == std::string::npos || eq == 0 || eq + 1 == m.size())
                throw UserError(fmt::format("--map '{}': expected FIRST=SECOND (register names)", m));
            opts.register_map.emplace_back(m.substr(0, eq), m.substr(eq + 1));
        }
        const ContractFinding ca = check_contract(a, args.files[0], "first", args.time_budget / 10);
        const ContractFinding cb = check_contract(b, args.files[1], "second", args.time_budget / 10);
        const std::string notes = ca.note + cb.note;
        opts.time_budget_seconds = args.time_budget;
        opts.allow_probabilistic = !args.exact_only;
        opts.seed = args.seed;
        opts.random_states = args.states;
        const passes::EquivResult r = passes::check_equivalence(a, b, opts);
        // A side that leaves a declared ancilla dirty: a difference found anyway is reported as
        // usual (exit 1, the violation as a note); otherwise the answer would rest on a broken
        // promise, so it is refused.
        if (r.verdict != passes::Verdict::NotEquivalent) {
            if (ca.violation) throw *ca.violation;
            if (cb.violation) throw *cb.violation;
        }
        std::cout << passes::verdict_name(r.verdict) << "\n";
        std::cout << fmt::format("  engine:         {}\n  confidence:     {}\n", r.engine, r.confidence);
        if (!r.counterexample.empty()) std::cout << fmt::format("  counterexample: {}\n", r.counterexample);
        std::cout << notes;
        if (args.explain) std::cout << "  engines tried:\n" << [&] {
            std::string s;
            size_t start = 0;
            while (start < r.detail.size()) {
                size_t end = r.detail.find('\n', start);
                if (end == std::string::npos) end = r.detail.size();
                s += "    " + r.detail.substr(start, end - start) + "\n";
                start = end + 1;
            }
            return s;
        }();
        switch (r.verdict) {
        case passes::Verdict::Equivalent: return kOk;
        case passes::Verdict::NotEquivalent: return kCheckFailed;
        case passes::Verdict::Inconclusive:
            std::cerr << fmt::format("error: could not decide whether '{}' and '{}' are equivalent: {}\n", args.files[0],
                                     args.files[1], r.confidence);
            return kInputError;
        }
        return kInputError;
    });
}

}  // namespace

void add_equiv_command(CLI::App& app, int& exit_code) {
    auto args = std::make_shared<EquivArgs>();
    CLI::App* cmd = app.add_subcommand("equiv", "check that two programs are equivalent (up to global phase)");
    cmd->add_option("programs", args->files, "the two programs (.wq or .qasm)")->required()->expected(2);
    cmd->add_option("--time-budget", args->time_budget, "seconds each check may take before it gives up (> 0)")
        ->capture_default_str()
        ->check(CLI::Validator(
            [](std::string& v) -> std::string {
                // A budget of zero, a negative one or nan would skip every engine and say nothing decided.
                double d = 0;
                try {
                    d = std::stod(v);
                } catch (const std::exception&) {
                    return "--time-budget takes a number of seconds, not '" + v + "'";
                }
                if (!(d > 0) || !std::isfinite(d)) return "--time-budget must be a positive number of seconds, got " + v;
                return {};
            },
            "SECONDS > 0"));
    cmd->add_flag("--exact-only", args->exact_only, "treat sampled and random-state answers as inconclusive");
    cmd->add_option("--seed", args->seed, "seed for random inputs and states")->capture_default_str();
    cmd->add_option("--states", args->states, "random input states for the simulation fallback")->capture_default_str();
    cmd->add_flag("--explain", args->explain, "list every engine tried and why it did or did not decide");
    cmd->add_option("-I,--include", args->include_dirs, "extra folder searched by `use`");
    cmd->add_option("--map", args->maps,
                    "FIRST=SECOND: the first program's register FIRST is the second's SECOND (repeatable)");
    cmd->callback([args, &exit_code]() { exit_code = run_equiv(*args); });
}

}  // namespace whittle::cli
