// whittle-derive-rules: regenerates the identity libraries (rules/library/*.rules) or checks them.
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "ir/error.h"
#include "rulegen/derive.h"

namespace {

namespace fs = std::filesystem;
using namespace whittle;

constexpr const char* kUsage =
    "usage: whittle-derive-rules (--write DIR | --check DIR) [--target NAME]...\n"
    "  --write DIR   derive every gate set's library and write DIR/<target>.rules\n"
    "  --check DIR   derive them and compare with DIR/<target>.rules (exit 1 on a difference)\n"
    "  --target NAME only this target's library (repeatable)\n";

std::string read_file(const fs::path& p, bool& ok) {
    std::ifstream in(p, std::ios::binary);
    ok = bool(in);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

int run(int argc, char** argv) {
    std::string mode, dir;
    std::vector<ir::Target> only;
    for (int i = 1; i < argc; ++i) {
        const std::string a = argv[i];
        if ((a == "--write" || a == "--check" || a == "--target") && i + 1 < argc) {
            const std::string v = argv[++i];
            if (a == "--target") only.push_back(ir::parse_target(v));
            else if (!mode.empty()) throw UserError("give one of --write and --check");
            else mode = a, dir = v;
            continue;
        }
        throw UserError(fmt::format("unknown or incomplete argument '{}'\n{}", a, kUsage));
    }
    if (mode.empty()) throw UserError(fmt::format("nothing to do\n{}", kUsage));
    int differences = 0;
    for (const rules::GateSet& set : rules::all_gate_sets()) {
        if (!only.empty() && std::find(only.begin(), only.end(), set.target) == only.end()) continue;
        const auto t0 = std::chrono::steady_clock::now();
        rulegen::DeriveStats st;
        const std::string text = rules::print_library(rulegen::derive_library(set, &st));
        const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        const fs::path file = fs::path(dir) / rules::library_file_name(set.target);
        std::fprintf(stderr,
                     "%-12s %zu sequences, %zu classes, %zu candidates, %zu implied, %zu unproved, %zu rules (%.1f s)\n",
                     ir::target_name(set.target), st.sequences, st.classes, st.candidates, st.implied, st.unproved,
                     st.rules, secs);
        if (mode == "--write") {
            const fs::path tmp = file.string() + ".tmp";
            {
                std::ofstream out(tmp, std::ios::binary);
                out << text;
                if (!out) throw UserError(fmt::format("cannot write '{}'", tmp.string()));
            }
            fs::rename(tmp, file);
            continue;
        }
        bool ok = false;
        const std::string old = read_file(file, ok);
        if (!ok) throw UserError(fmt::format("cannot read '{}'", file.string()));
        if (old == text) continue;
        ++differences;
        std::istringstream a(old), b(text);
        std::string la, lb;
        for (int line = 1;; ++line) {
            const bool ga = bool(std::getline(a, la)), gb = bool(std::getline(b, lb));
            if (!ga && !gb) break;
            if (ga && gb && la == lb) continue;
            std::fprintf(stderr, "%s:%d: checked in:  %s\n%s:%d: regenerated: %s\n", file.string().c_str(), line,
                         ga ? la.c_str() : "(end of file)", file.string().c_str(), line, gb ? lb.c_str() : "(end of file)");
            break;
        }
    }
    if (differences) {
        std::fprintf(stderr, "%d librar%s from the generator's; run whittle-derive-rules --write %s\n", differences,
                     differences == 1 ? "y differs" : "ies differ", dir.c_str());
        return 1;
    }
    return 0;
}

}  // namespace

int main(int argc, char** argv) {
    try {
        return run(argc, argv);
    } catch (const whittle::UserError& e) {
        std::fprintf(stderr, "whittle-derive-rules: error: %s\n", e.what());
        return 2;
    } catch (const std::exception& e) {
        std::fprintf(stderr, "whittle-derive-rules: internal error: %s\n", e.what());
        return 2;
    }
}
