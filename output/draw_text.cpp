// The text diagram: paints a Layout onto a character grid, one block of lines per row of columns.
#include <algorithm>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "output/draw.h"
#include "output/draw_layout.h"

namespace whittle::lowering {
namespace {

struct TextSymbols {
    const char *wire, *cwire, *vert, *cross, *ccross, *dvert, *dcross_q, *dcross_c, *bar, *bar_cross, *control,
        *neg_control, *target, *swap, *parity, *readout, *barrier, *open, *close, *dash, *region_open, *region_close,
        *header_sep;
};

constexpr TextSymbols kUtf8{"─", "═", "│", "┼", "╪", "║", "╫", "╬", "┃", "╂", "●", "○", "⊕", "×",
                            "◆", "▼", "┊", "[", "]", "─", "┌", "┐", " · "};
constexpr TextSymbols kAsciiSyms{"-", "=", "|", "+", "+", "|", "+", "+", "#", "#", "*", "o", "X", "x",
                                 "@", "v", ":", "[", "]", "-", "+", "+", " : "};

/// Splits UTF-8 text into one string per code point (one cell each).
std::vector<std::string> cells_of(const std::string& s) {
    std::vector<std::string> out;
    for (size_t i = 0; i < s.size();) {
        size_t n = 1;
        unsigned char ch = static_cast<unsigned char>(s[i]);
        if (ch >= 0xF0) n = 4;
        else if (ch >= 0xE0) n = 3;
        else if (ch >= 0xC0) n = 2;
        out.push_back(s.substr(i, n));
        i += n;
    }
    return out;
}

class Grid {
public:
    Grid(size_t lines, size_t width) : cells_(lines, std::vector<std::string>(width, " ")) {}
    void put(size_t line, size_t x, const std::string& cell) {
        if (line < cells_.size() && x < cells_[line].size()) cells_[line][x] = cell;
    }
    const std::string& at(size_t line, size_t x) const { return cells_[line][x]; }
    void text(size_t line, size_t x, const std::string& s) {
        for (const std::string& c : cells_of(s)) put(line, x++, c);
    }
    void centered(size_t line, size_t cx, const std::string& s) {
        size_t w = display_width(s);
        text(line, cx >= w / 2 ? cx - w / 2 : 0, s);
    }
    std::string str() const {
        std::string out;
        for (const auto& row : cells_) {
            std::string line;
            for (const std::string& c : row) line += c;
            while (!line.empty() && line.back() == ' ') line.pop_back();
            out += line + "\n";
        }
        return out;
    }

private:
    std::vector<std::vector<std::string>> cells_;
};

size_t wire_line(size_t lane) { return 2 + 2 * lane; }

void draw_row(const Layout& L, uint32_t c0, uint32_t c1, const TextSymbols& S, std::string& out) {
    size_t label_w = 0;
    for (const Lane& lane : L.lanes) {
        label_w = std::max(label_w, display_width(lane.label) + 3);
        if (lane.group_start) label_w = std::max(label_w, display_width(lane.group + S.header_sep + lane.badge) + 2);
    }
    std::vector<size_t> col_x(c1 - c0 + 1);
    col_x[0] = label_w;
    for (uint32_t c = c0; c < c1; ++c) col_x[c - c0 + 1] = col_x[c - c0] + L.column_chars[c] + 4;
    auto center = [&](uint32_t c) { return col_x[c - c0] + (L.column_chars[c] + 4) / 2; };
    const size_t width = col_x.back() + 1;
    Grid g(L.lanes.empty() ? 1 : wire_line(L.lanes.size() - 1) + 1, width);

    for (size_t i = 0; i < L.lanes.size(); ++i) {
        const Lane& lane = L.lanes[i];
        const std::string header = lane.group + S.header_sep + lane.badge;
        if (lane.label == lane.group) g.text(wire_line(i), 0, header);  // scalars: the header is the label
        else if (lane.group_start) g.text(wire_line(i) - 1, 0, header);
        if (lane.label != lane.group) g.text(wire_line(i), label_w - 2 - display_width(lane.label), lane.label);
        for (size_t x = label_w - 1; x < width; ++x) g.put(wire_line(i), x, lane.classical ? S.cwire : S.wire);
    }

    for (const Region& r : L.regions) {
        if (r.last_col < c0 || r.first_col >= c1) continue;
        uint32_t a = std::max(r.first_col, c0), b = std::min(r.last_col, c1 - 1);
        size_t x0 = col_x[a - c0], x1 = col_x[b - c0 + 1] - 1;
        for (size_t x = x0; x <= x1; ++x) g.put(0, x, S.dash);
        if (r.first_col >= c0) g.put(0, x0, S.region_open);
        if (r.last_col < c1) g.put(0, x1, S.region_close);
        g.text(0, x0 + 1, r.label());
    }

    for (const Glyph& gl : L.glyphs) {
        if (gl.column < c0 || gl.column >= c1) continue;
        const size_t cx = center(gl.column);
        uint32_t qlo = gl.hi, qhi = gl.lo;
        for (const Mark& m : gl.marks)
            if (!L.lanes[m.lane].classical) qlo = std::min(qlo, m.lane), qhi = std::max(qhi, m.lane);
        if (gl.kind == GlyphKind::Barrier) qlo = gl.lo, qhi = gl.hi;
        const bool bar = gl.kind == GlyphKind::PhaseBar || gl.kind == GlyphKind::ParityBar;
        for (size_t line = wire_line(qlo); line < wire_line(qhi); ++line) {
            bool on_wire = line % 2 == 0;
            if (gl.kind == GlyphKind::Barrier) g.put(line, cx, S.barrier);
            else if (!on_wire) g.put(line, cx, bar ? S.bar : S.vert);
            else g.put(line, cx, bar ? S.bar_cross : L.lanes[line / 2 - 1].classical ? S.ccross : S.cross);
        }
        if (gl.kind == GlyphKind::Barrier) g.put(wire_line(qhi), cx, S.barrier);
        if (gl.classical >= 0) {
            size_t from = wire_line(std::min<uint32_t>(qhi, uint32_t(gl.classical)));
            size_t to = wire_line(std::max<uint32_t>(qhi, uint32_t(gl.classical)));
            for (size_t line = from + 1; line < to; ++line) {
                bool on_wire = line % 2 == 0;
                if (!on_wire) g.put(line, cx, S.dvert);
                else g.put(line, cx, L.lanes[line / 2 - 1].classical ? S.dcross_c : S.dcross_q);
            }
        }
        if (bar) g.centered(wire_line(qlo) - 1, cx, gl.label);
        for (const Mark& m : gl.marks) {
            const size_t line = wire_line(m.lane);
            switch (m.kind) {
            case MarkKind::Control: g.put(line, cx, S.control); break;
            case MarkKind::NegControl: g.put(line, cx, S.neg_control); break;
            case MarkKind::XTarget: g.put(line, cx, S.target); break;
            case MarkKind::SwapEnd: g.put(line, cx, S.swap); break;
            case MarkKind::ParityWire: g.put(line, cx, S.parity); break;
            case MarkKind::Box:
                g.centered(line, cx, std::string(S.open) + (m.label.empty() ? gl.label : m.label) + S.close);
                break;
            case MarkKind::Readout:
                g.put(line, cx, S.readout);
                g.text(line - 1, cx + 1, m.label);
                break;
            case MarkKind::CondTap: g.centered(line, cx, m.label); break;
            }
        }
    }
    out += g.str();
}

}  // namespace

std::string draw_text(const std::vector<DrawPanel>& panels, const DrawOptions& opts) {
    const TextSymbols& S = opts.ascii ? kAsciiSyms : kUtf8;
    LayoutOptions lo;
    lo.ascii = opts.ascii;
    lo.hide_idle = opts.hide_idle;
    lo.by_line = opts.by_line;
    std::string out;
    for (size_t p = 0; p < panels.size(); ++p) {
        const ir::Circuit& c = *panels[p].circuit;
        if (p) out += "\n";
        if (!panels[p].title.empty()) out += panels[p].title + "\n";
        if (opts.counts) out += counts_line(c, opts.ascii) + "\n";
        Layout L = layout_circuit(c, lo);
        const uint32_t step = opts.width == 0 ? std::max<uint32_t>(L.columns, 1) : opts.width;
        if (L.columns == 0) {
            draw_row(L, 0, 0, S, out);
            continue;
        }
        for (uint32_t c0 = 0; c0 < L.columns; c0 += step) {
            uint32_t c1 = std::min(L.columns, c0 + step);
            if (c0 && c1 == c0 + 1) out += fmt::format("{}{} column {}\n", S.dash, S.dash, c1);
            else if (c0) out += fmt::format("{}{} columns {}-{}\n", S.dash, S.dash, c0 + 1, c1);
            draw_row(L, c0, c1, S, out);
        }
    }
    return out;
}

}  // namespace whittle::lowering
