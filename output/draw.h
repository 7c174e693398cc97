// Circuit diagrams: text (UTF-8 or plain ASCII) and SVG, one or more circuits stacked (before/after).
#pragma once

#include <string>
#include <vector>

#include "ir/circuit.h"

namespace whittle::lowering {

/// One circuit of a drawing, with the title shown above it (e.g. the file name, "before", "after").
struct DrawPanel {
    const ir::Circuit* circuit = nullptr;
    std::string title;
};

struct DrawOptions {
    unsigned width = 24;  ///< columns per row; longer circuits wrap into several rows (0 = never wrap)
    bool ascii = false;   ///< text only: plain ASCII instead of UTF-8 box-drawing symbols
    bool counts = true;   ///< print the resource counts under each title
    bool hide_idle = false;  ///< leave out wires no op touches (LayoutOptions::hide_idle)
    bool by_line = false;    ///< bracket the ops of each source line (LayoutOptions::by_line)
};

/// The panels one above the other as text: register headers with role badges, wires, controls
/// (● positive, ○ negative), ⊕ targets, phase bars labelled with their Boolean function, parity
/// phases, compute/uncompute brackets, classical lanes as double lines.
std::string draw_text(const std::vector<DrawPanel>& panels, const DrawOptions& opts = {});

/// The same layout as a standalone SVG document.
std::string draw_svg(const std::vector<DrawPanel>& panels, const DrawOptions& opts = {});

}  // namespace whittle::lowering
