// The SVG diagram: paints a Layout with register badges, phase bars, shaded compute/uncompute bands.
#include <algorithm>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "output/draw.h"
#include "output/draw_layout.h"

namespace whittle::lowering {
namespace {

// Geometry (px). Text widths are estimated per character: every label is short, and the column
// widths leave slack for the estimate.
constexpr double kMargin = 18, kLanePitch = 42, kGroupHeader = 20, kRegionBand = 22, kCharW = 7.2;
constexpr double kRowGap = 30, kTitleH = 24, kCountsH = 18;
constexpr const char* kFont = "DejaVu Sans, Verdana, sans-serif";
constexpr const char* kInk = "#0f172a";

std::string esc(const std::string& s) {
    std::string out;
    for (char ch : s) {
        switch (ch) {
        case '&': out += "&amp;"; break;
        case '<': out += "&lt;"; break;
        case '>': out += "&gt;"; break;
        case '"': out += "&quot;"; break;
        default: out += ch;
        }
    }
    return out;
}

struct Badge {
    const char *fill, *ink;
};

Badge badge_colors(const std::string& badge) {
    if (badge == "data") return {"#dbeafe", "#1d4ed8"};
    if (badge == "ancilla") return {"#dcfce7", "#15803d"};
    if (badge == "borrow") return {"#ffedd5", "#c2410c"};
    return {"#f1f5f9", "#475569"};
}

class Svg {
public:
    std::string body;
    void line(double x1, double y1, double x2, double y2, const char* color, double w, const char* extra = "") {
        body += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" stroke=\"{}\" stroke-width=\"{}\"{}/>\n",
                            x1, y1, x2, y2, color, w, extra);
    }
    void rect(double x, double y, double w, double h, double r, const char* fill, const char* stroke, double sw,
              const char* extra = "") {
        body += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\" rx=\"{}\" fill=\"{}\" "
                            "stroke=\"{}\" stroke-width=\"{}\"{}/>\n",
                            x, y, w, h, r, fill, stroke, sw, extra);
    }
    void circle(double cx, double cy, double r, const char* fill, const char* stroke, double sw) {
        body += fmt::format("<circle cx=\"{:.1f}\" cy=\"{:.1f}\" r=\"{}\" fill=\"{}\" stroke=\"{}\" stroke-width=\"{}\"/>\n",
                            cx, cy, r, fill, stroke, sw);
    }
    void text(double x, double y, const std::string& s, double size, const char* color, const char* anchor = "middle",
              const char* weight = "normal", const char* style = "normal") {
        body += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-family=\"{}\" font-size=\"{}\" fill=\"{}\" "
                            "text-anchor=\"{}\" font-weight=\"{}\" font-style=\"{}\">{}</text>\n",
                            x, y, kFont, size, color, anchor, weight, style, esc(s));
    }
    void polygon(const std::string& points, const char* fill) {
        body += fmt::format("<polygon points=\"{}\" fill=\"{}\"/>\n", points, fill);
    }
};

double column_px(size_t chars) { return std::max(40.0, double(chars) * kCharW + 20); }

double label_area(const Layout& L) {
    double w = 60;
    for (const Lane& lane : L.lanes) {
        w = std::max(w, double(display_width(lane.label)) * kCharW + 30);
        if (lane.group_start)
            w = std::max(w, double(display_width(lane.group)) * 9.4 + double(lane.badge.size()) * 6.5 + 34);
    }
    return w;
}

/// Draws columns [c0, c1) of the layout with its top at `top`; returns the height used.
double draw_row(Svg& svg, const Layout& L, uint32_t c0, uint32_t c1, double top, double& max_width) {
    const double left = kMargin, label_w = label_area(L);
    std::vector<double> col_x(c1 - c0 + 1);
    col_x[0] = left + label_w;
    for (uint32_t c = c0; c < c1; ++c) col_x[c - c0 + 1] = col_x[c - c0] + column_px(L.column_chars[c]);
    auto cx_of = [&](uint32_t c) { return (col_x[c - c0] + col_x[c - c0 + 1]) / 2; };
    const double right = col_x.back() + 14;
    max_width = std::max(max_width, right + kMargin);

    std::vector<double> lane_y(L.lanes.size());
    double y = top + kRegionBand;
    for (size_t i = 0; i < L.lanes.size(); ++i) {
        if (L.lanes[i].group_start && L.lanes[i].label != L.lanes[i].group) y += kGroupHeader;
        y += kLanePitch / 2;
        lane_y[i] = y;
        y += kLanePitch / 2;
    }
    const double bottom = y;

    // Shaded compute/uncompute bands with a bracket on top.
    for (const Region& r : L.regions) {
        if (r.last_col < c0 || r.first_col >= c1) continue;
        uint32_t a = std::max(r.first_col, c0), b = std::min(r.last_col, c1 - 1);
        double x0 = col_x[a - c0] + 2, x1 = col_x[b - c0 + 1] - 2;
        const char* fill = r.compute ? "#e0f2fe" : "#fce7f3";
        const char* ink = r.compute ? "#0369a1" : "#be185d";
        svg.rect(x0, top + 14, x1 - x0, bottom - top - 14, 4, fill, "none", 0, " fill-opacity=\"0.75\"");
        svg.line(x0, top + 8, x1, top + 8, ink, 1.4);
        if (r.first_col >= c0) svg.line(x0, top + 8, x0, top + 15, ink, 1.4);
        if (r.last_col < c1) svg.line(x1, top + 8, x1, top + 15, ink, 1.4);
        svg.text(x0 + 4, top + 5, r.label(), 10.5, ink, "start", "bold");
    }

    // Register headers, lane labels, wires.
    for (size_t i = 0; i < L.lanes.size(); ++i) {
        const Lane& lane = L.lanes[i];
        const bool inline_header = lane.label == lane.group;  // scalars and classical registers
        if (lane.group_start) {
            double hy = inline_header ? lane_y[i] + 4.5 : lane_y[i] - kLanePitch / 2 - 4;
            svg.text(left, hy, lane.group, 12.5, kInk, "start", "bold");
            Badge b = badge_colors(lane.badge);
            double bx = left + double(display_width(lane.group)) * 9.4 + 6;
            double bw = double(lane.badge.size()) * 6.5 + 10;
            svg.rect(bx, hy - 11, bw, 14, 7, b.fill, b.ink, 0.8);
            svg.text(bx + bw / 2, hy - 0.5, lane.badge, 9.5, b.ink);
        }
        if (!inline_header) svg.text(left + label_w - 10, lane_y[i] + 4, lane.label, 11, "#475569", "end");
        double x0 = left + label_w - 4;
        if (lane.classical) {
            svg.line(x0, lane_y[i] - 1.6, right, lane_y[i] - 1.6, "#64748b", 1);
            svg.line(x0, lane_y[i] + 1.6, right, lane_y[i] + 1.6, "#64748b", 1);
        } else {
            svg.line(x0, lane_y[i], right, lane_y[i], "#94a3b8", 1.2);
        }
    }

    for (const Glyph& gl : L.glyphs) {
        if (gl.column < c0 || gl.column >= c1) continue;
        const double cx = cx_of(gl.column);
        uint32_t qlo = gl.hi, qhi = gl.lo;
        for (const Mark& m : gl.marks)
            if (!L.lanes[m.lane].classical) qlo = std::min(qlo, m.lane), qhi = std::max(qhi, m.lane);
        const double ylo = lane_y[qlo], yhi = lane_y[qhi];
        if (gl.classical >= 0) {
            double yc = lane_y[size_t(gl.classical)];
            svg.line(cx - 1.6, yhi, cx - 1.6, yc, "#475569", 1);
            svg.line(cx + 1.6, yhi, cx + 1.6, yc, "#475569", 1);
        }
        switch (gl.kind) {
        case GlyphKind::Barrier:
            svg.line(cx, lane_y[gl.lo] - 16, cx, lane_y[gl.hi] + 16, "#64748b", 1.4, " stroke-dasharray=\"4 3\"");
            continue;
        case GlyphKind::PhaseBar:
        case GlyphKind::ParityBar: {
            const bool phase = gl.kind == GlyphKind::PhaseBar;
            svg.rect(cx - 8, ylo - 14, 16, yhi - ylo + 28, 8, phase ? "#fef3c7" : "#ccfbf1", phase ? "#d97706" : "#0f766e",
                     1.4);
            svg.text(cx, ylo - 19, gl.label, 11, phase ? "#92400e" : "#115e59", "middle", "normal", "italic");
            break;
        }
        case GlyphKind::Block: {
            double w = double(display_width(gl.label)) * kCharW + 14;
            svg.rect(cx - w / 2, ylo - 13, w, yhi - ylo + 26, 5, "#ede9fe", "#6d28d9", 1.2);
            svg.text(cx, (ylo + yhi) / 2 + 4, gl.label, 12, "#3b0764");
            continue;
        }
        case GlyphKind::Gate:
            if (qhi > qlo) svg.line(cx, ylo, cx, yhi, kInk, 1.4);
            break;
        }
        for (const Mark& m : gl.marks) {
            const double my = lane_y[m.lane];
            switch (m.kind) {
            case MarkKind::Control: svg.circle(cx, my, 5, kInk, kInk, 1); break;
            case MarkKind::NegControl: svg.circle(cx, my, 4.6, "#ffffff", kInk, 1.8); break;
            case MarkKind::XTarget:
                svg.circle(cx, my, 10, "#ffffff", kInk, 1.6);
                svg.line(cx - 10, my, cx + 10, my, kInk, 1.6);
                svg.line(cx, my - 10, cx, my + 10, kInk, 1.6);
                break;
            case MarkKind::SwapEnd:
                svg.line(cx - 6, my - 6, cx + 6, my + 6, kInk, 2);
                svg.line(cx - 6, my + 6, cx + 6, my - 6, kInk, 2);
                break;
            case MarkKind::ParityWire:
                svg.polygon(fmt::format("{:.1f},{:.1f} {:.1f},{:.1f} {:.1f},{:.1f} {:.1f},{:.1f}", cx, my - 6, cx + 6, my,
                                        cx, my + 6, cx - 6, my),
                            "#0f766e");
                break;
            case MarkKind::Box: {
                const bool meter = m.label == "M";
                double w = std::max(24.0, double(display_width(m.label)) * kCharW + 12);
                svg.rect(cx - w / 2, my - 12, w, 24, 5, meter ? "#f1f5f9" : "#e0e7ff", meter ? "#334155" : "#4338ca",
                         1.2);
                svg.text(cx, my + 4.5, m.label, 12, meter ? "#0f172a" : "#1e1b4b");
                break;
            }
            case MarkKind::Readout:
                svg.polygon(fmt::format("{:.1f},{:.1f} {:.1f},{:.1f} {:.1f},{:.1f}", cx - 5, my - 7, cx + 5, my - 7, cx, my),
                            "#475569");
                if (!m.label.empty()) svg.text(cx + 8, my - 6, m.label, 9.5, "#475569", "start");
                break;
            case MarkKind::CondTap:
                svg.rect(cx - 4, my - 4, 8, 8, 1, "#475569", "#475569", 1);
                svg.text(cx + 7, my + 14, m.label, 10, "#475569", "start");
                break;
            }
        }
    }
    return bottom - top + 6;
}

}  // namespace

std::string draw_svg(const std::vector<DrawPanel>& panels, const DrawOptions& opts) {
    Svg svg;
    double y = kMargin, width = 200;
    for (size_t p = 0; p < panels.size(); ++p) {
        const ir::Circuit& c = *panels[p].circuit;
        if (p) {
            y += 10;
            svg.line(kMargin, y, kMargin + 120, y, "#cbd5e1", 1);
            y += 16;
        }
        if (!panels[p].title.empty()) {
            y += kTitleH - 6;
            svg.text(kMargin, y, panels[p].title, 16, kInk, "start", "bold");
            y += 6;
        }
        if (opts.counts) {
            y += kCountsH - 4;
            svg.text(kMargin, y, counts_line(c), 12, "#475569", "start");
            y += 4;
        }
        LayoutOptions lo;
        lo.hide_idle = opts.hide_idle;
        lo.by_line = opts.by_line;
        Layout L = layout_circuit(c, lo);
        const uint32_t step = opts.width == 0 ? std::max<uint32_t>(L.columns, 1) : opts.width;
        if (L.columns == 0) y += draw_row(svg, L, 0, 0, y, width);
        for (uint32_t c0 = 0; c0 < L.columns; c0 += step) {
            uint32_t c1 = std::min(L.columns, c0 + step);
            if (c0) {
                y += kRowGap / 2;
                svg.text(kMargin, y, c1 == c0 + 1 ? fmt::format("column {}", c1) : fmt::format("columns {}–{}", c0 + 1, c1), 10, "#94a3b8", "start", "normal", "italic");
            }
            y += draw_row(svg, L, c0, c1, y, width);
        }
    }
    y += kMargin;
    std::string out = fmt::format(
        "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0:.0f}\" height=\"{1:.0f}\" viewBox=\"0 0 {0:.0f} {1:.0f}\">\n"
        "<rect x=\"0\" y=\"0\" width=\"{0:.0f}\" height=\"{1:.0f}\" fill=\"#ffffff\"/>\n",
        width, y);
    out += svg.body;
    out += "</svg>\n";
    return out;
}

}  // namespace whittle::lowering
