// Reading a program: picks the reader by extension (.wq own language, .qasm OpenQASM 2.0).
#pragma once

#include <string>
#include <vector>

#include "frontend/diagnostics.h"
#include "frontend/limits.h"
#include "ir/circuit.h"

namespace whittle::frontend {

struct LoadOptions {
    std::vector<std::string> include_dirs;  ///< searched by `use` after the including file's folder
    Limits limits;
    /// A routine call's `ancilla` wires come back at |0>, so a later call's `ancilla` of the same
    /// shape takes them (fewer qubits); false gives every call fresh wires (what the lowering may
    /// prefer for T: compiler::compile_file tries both on small programs).
    bool reuse_work_wires = true;
    /// Every op and work register an outermost routine call makes is located at the call, not
    /// inside the routine (`compile --cost-by-line` attributes the cost of a call to its line).
    bool locate_at_call_site = false;
};

enum class InputFormat { Wq, Qasm2 };

/// The format for a path by its extension; UserError for an unknown extension.
InputFormat format_for_path(const std::string& path);

/// Reads and elaborates a file. Throws UserError (located) on bad input.
ir::Circuit load_file(const std::string& path, SourceManager& sm, const LoadOptions& opts = {});

/// Same for text already in memory; `name` is used in diagnostics and for `use` paths. The text is
/// kept for diagnostics (pass an rvalue to hand it over without a copy).
ir::Circuit load_text(std::string text, const std::string& name, InputFormat format, SourceManager& sm,
                      const LoadOptions& opts = {});

/// The standard library folder (frontend/stdlib in a build tree, share/whittle/stdlib installed).
std::string stdlib_dir();

}  // namespace whittle::frontend
