// The diagram layout shared by the text and SVG drawers: lanes, glyphs packed into columns, regions.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::lowering {

/// One horizontal line of the diagram: a qubit wire or a classical register (drawn doubled).
struct Lane {
    bool classical = false;
    uint32_t index = 0;        ///< wire number, or classical register number
    std::string label;         ///< "0", "1", ... inside a register; the name for scalars
    bool group_start = false;  ///< first lane of its register: the drawers put the register header above it
    std::string group;         ///< register name
    std::string badge;         ///< "data", "ancilla", "borrow" or "bits"
};

enum class MarkKind : uint8_t {
    Control,     ///< filled dot: acts when the wire is |1>
    NegControl,  ///< hollow ring: acts when the wire is |0>
    XTarget,     ///< circled plus
    Box,         ///< a labelled box on one wire (H, T, Rz(θ), M, |0>, ...)
    SwapEnd,     ///< one end of a swap
    ParityWire,  ///< a wire in a parity phase (diamond)
    Readout,     ///< where a measurement result lands on a classical lane
    CondTap,     ///< where a classical condition is read on a classical lane
};

struct Mark {
    uint32_t lane = 0;
    MarkKind kind = MarkKind::Box;
    std::string label;  ///< Box text, Readout bit, CondTap value
};

enum class GlyphKind : uint8_t {
    Gate,       ///< marks on wires joined by a thin vertical line (controls, targets, boxes, swaps)
    PhaseBar,   ///< multi-controlled phase: a tall rounded bar over its lanes, labelled with its function
    ParityBar,  ///< parity phase: a tall bar with diamonds on its wires, labelled with the ⊕ of the wires
    Block,      ///< a native two-wire gate (iSWAP, XX): one box over both lanes
    Barrier,    ///< dashed line over its lanes
};

/// One op as drawn. Lanes lo..hi are the vertical span it occupies in its column.
struct Glyph {
    GlyphKind kind = GlyphKind::Gate;
    uint32_t column = 0;
    uint32_t lo = 0, hi = 0;
    std::vector<Mark> marks;
    std::string label;        ///< PhaseBar/ParityBar function, Block name
    int32_t classical = -1;   ///< lane of the classical register read (condition) or written (measure)
    uint32_t pair = 0;        ///< compute/uncompute id of the op (0 = none)
    size_t op_index = 0;
    /// Widest label this glyph puts in its column, in characters (the drawers size columns by it).
    size_t label_chars() const;
};

/// A compute or uncompute region, or with LayoutOptions::by_line the ops of one source line: the
/// columns its ops occupy (contiguous by construction).
struct Region {
    uint32_t first_col = 0, last_col = 0;
    bool compute = true;
    uint32_t pair = 0;
    std::string text;           ///< the label of a source-line region ("line 12")
    std::string label() const;  ///< `text`, else "compute #3" or "uncompute #3"
};

struct Layout {
    std::vector<Lane> lanes;
    std::vector<Glyph> glyphs;  ///< sorted by column
    std::vector<Region> regions;
    uint32_t columns = 0;
    /// Per column, the widest label of its glyphs in characters.
    std::vector<size_t> column_chars;
};

struct LayoutOptions {
    bool ascii = false;      ///< labels in plain ASCII (pi, &, !, ^) instead of π ∧ ¬ ⊕
    bool hide_idle = false;  ///< leave out the lanes of wires and classical registers no op touches
    /// Bracket the ops of each source line (Op::loc) instead of compute/uncompute halves: the ops of
    /// one line keep a run of columns of their own, labelled "line N" ("file:N" for another file).
    bool by_line = false;
};

/// Lays the circuit out: one lane per wire grouped by register (in declaration order), one lane per
/// classical register, ops packed ASAP into columns by the lane span they cover; the ops of one
/// compute or uncompute half (with by_line: of one source line) stay together in a run of columns.
Layout layout_circuit(const ir::Circuit& c, const LayoutOptions& opts = {});

/// Display width of UTF-8 text (code points; every symbol the drawers use is one cell wide).
size_t display_width(const std::string& s);

/// "ops 12 · T 7 · CNOT 6 · depth 9 · qubits 5" (ASCII: "|" for "·"): the counts shown under a title.
std::string counts_line(const ir::Circuit& c, bool ascii = false);

/// Angle text for labels: "π/4", "3π/4", "-π/8", "0.3" (radians, 4 digits); ASCII writes "pi".
std::string angle_label(const ir::Angle& a, bool ascii = false);

}  // namespace whittle::lowering
