// Limits that keep any input from hanging the compiler or exhausting memory; each has its own message.
#pragma once

#include <cstdint>

namespace whittle::frontend {

struct Limits {
    uint64_t max_loop_trips = 1'000'000;     ///< iterations of one `for` / `repeat`
    uint32_t max_recursion = 256;            ///< nesting of routine calls (the arithmetic library nests once per bit)
    uint32_t max_use_depth = 64;             ///< nesting of `use`
    uint32_t max_qubits = 1'000'000;         ///< wires in one circuit
    uint64_t max_ops = 10'000'000;           ///< ops after elaboration (64 bytes each), and elaboration steps
    uint32_t max_expr_depth = 10'000;        ///< nesting of one expression
    uint32_t max_block_depth = 1'000;        ///< nesting of `{ }` blocks
    uint32_t max_expansion_terms = 65'536;   ///< terms of one Boolean expression's exact expansion
    uint64_t max_file_bytes = 512ull << 20;  ///< size of one source file
};

}  // namespace whittle::frontend
