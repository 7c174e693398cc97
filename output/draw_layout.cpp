// Turns a circuit into lanes and glyphs in ASAP columns; the text and SVG drawers only paint this.
#include "output/draw_layout.h"

#include <algorithm>
#include <filesystem>

#include <fmt/format.h>

#include "ir/error.h"
#include "ir/resources.h"

namespace whittle::lowering {

size_t display_width(const std::string& s) {
    size_t n = 0;
    for (unsigned char ch : s)
        if ((ch & 0xC0) != 0x80) ++n;
    return n;
}

size_t Glyph::label_chars() const {
    size_t w = display_width(label);
    for (const Mark& m : marks) w = std::max(w, display_width(m.label));
    return w;
}

std::string Region::label() const {
    return text.empty() ? fmt::format("{} #{}", compute ? "compute" : "uncompute", pair) : text;
}

std::string angle_label(const ir::Angle& a, bool ascii) {
    if (!a.is_exact()) {
        double r = a.to_radians();
        if (r > 3.141592653589793) r -= 2 * 3.141592653589793;
        return fmt::format("{:.4g}", r);
    }
    std::string s = a.to_string();  // "0", "pi", "-3*pi/4"
    if (ascii) return s;
    std::string out;
    for (size_t i = 0; i < s.size(); ++i) {
        if (s.compare(i, 2, "pi") == 0) {
            out += "π";
            ++i;
        } else if (s[i] != '*') {
            out += s[i];
        }
    }
    return out;
}

std::string counts_line(const ir::Circuit& c, bool ascii) {
    ir::Resources r = ir::count_resources(c);
    const char* sep = ascii ? " | " : " · ";
    return fmt::format("qubits {}{}ops {}{}T {}{}CNOT {}{}2q {}{}depth {}", r.qubits, sep, r.ops, sep, r.t_count, sep,
                       r.cnot_count, sep, r.two_qubit_count, sep, r.depth);
}

namespace {

struct Symbols {
    const char* conj;
    const char* neg;
    const char* xor_;
    const char* dot;
    const char* dagger;
};

constexpr Symbols kUnicode{"∧", "¬", "⊕", " · ", "†"};
constexpr Symbols kAscii{"&", "!", "^", " * ", "dg"};

std::string literal_text(const ir::Circuit& c, ir::Lit l, const Symbols& sym) {
    return (l.positive() ? "" : sym.neg) + c.wire_name(l.wire());
}

std::string one_qubit_label(const ir::Op& op, const Symbols& sym, bool ascii) {
    auto a = [&](int i) { return angle_label(i == 0 ? op.angle : i == 1 ? op.phi() : op.lambda(), ascii); };
    switch (op.kind) {
    case ir::OpKind::H: return "H";
    case ir::OpKind::Y: return "Y";
    case ir::OpKind::SX: return ascii ? "SX" : "√X";
    case ir::OpKind::SXdg: return ascii ? "SXdg" : "√X†";
    case ir::OpKind::RX: return fmt::format("Rx({})", a(0));
    case ir::OpKind::RY: return fmt::format("Ry({})", a(0));
    case ir::OpKind::RZ: return fmt::format("Rz({})", a(0));
    case ir::OpKind::U: return fmt::format("U({},{},{})", a(0), a(1), a(2));
    case ir::OpKind::R: return fmt::format("R({},{})", a(0), a(1));
    case ir::OpKind::Reset: return ascii ? "|0>" : "|0⟩";
    case ir::OpKind::Phase:
        switch (op.angle.eighths()) {
        case 4: return "Z";
        case 2: return "S";
        case 6: return std::string("S") + sym.dagger;
        case 1: return "T";
        case 7: return std::string("T") + sym.dagger;
        default: return fmt::format("P({})", a(0));
        }
    default: return op_kind_name(op.kind);
    }
}

int32_t creg_of_bit(const ir::Circuit& c, int32_t bit) {
    for (size_t i = 0; i < c.cregs.size(); ++i) {
        const ir::ClassicalRegister& r = c.cregs[i];
        if (bit >= int32_t(r.first) && bit < int32_t(r.first + r.size)) return int32_t(i);
    }
    return -1;
}

void add_controls(Glyph& g, const ir::Op& op) {
    for (ir::Lit l : op.controls)
        g.marks.push_back({l.wire(), l.positive() ? MarkKind::Control : MarkKind::NegControl, ""});
}

/// The glyph of one op, without its column; false for ops that touch no wire (a global phase).
bool make_glyph(const ir::Circuit& c, const ir::Op& op, const LayoutOptions& opts, Glyph& g) {
    const Symbols& sym = opts.ascii ? kAscii : kUnicode;
    const uint32_t nq = c.num_qubits();
    switch (op.kind) {
    case ir::OpKind::X:
        add_controls(g, op);
        g.marks.push_back({op.target, MarkKind::XTarget, ""});
        break;
    case ir::OpKind::Phase:
        if (op.controls.empty()) return false;
        if (op.controls.size() == 1 && op.controls[0].positive()) {
            g.marks.push_back({op.controls[0].wire(), MarkKind::Box, one_qubit_label(op, sym, opts.ascii)});
            break;
        }
        g.kind = GlyphKind::PhaseBar;
        add_controls(g, op);
        g.label = angle_label(op.angle, opts.ascii) + sym.dot;
        for (size_t i = 0; i < op.controls.size(); ++i)
            g.label += (i ? sym.conj : "") + literal_text(c, op.controls[i], sym);
        break;
    case ir::OpKind::Parity:
        if (op.controls.empty()) return false;
        g.kind = GlyphKind::ParityBar;
        g.label = angle_label(op.angle, opts.ascii) + sym.dot;
        for (size_t i = 0; i < op.controls.size(); ++i) {
            g.marks.push_back({op.controls[i].wire(), MarkKind::ParityWire, ""});
            g.label += (i ? sym.xor_ : "") + c.wire_name(op.controls[i].wire());
        }
        break;
    case ir::OpKind::H:
    case ir::OpKind::Y:
    case ir::OpKind::SX:
    case ir::OpKind::SXdg:
    case ir::OpKind::RX:
    case ir::OpKind::RY:
    case ir::OpKind::RZ:
    case ir::OpKind::U:
    case ir::OpKind::R:
    case ir::OpKind::Reset:
        add_controls(g, op);
        g.marks.push_back({op.target, MarkKind::Box, one_qubit_label(op, sym, opts.ascii)});
        break;
    case ir::OpKind::Swap:
        add_controls(g, op);
        g.marks.push_back({op.target, MarkKind::SwapEnd, ""});
        g.marks.push_back({op.target2, MarkKind::SwapEnd, ""});
        break;
    case ir::OpKind::ISwap:
    case ir::OpKind::XX:
        g.kind = GlyphKind::Block;
        g.label = op.kind == ir::OpKind::ISwap ? "iSWAP" : fmt::format("XX({})", angle_label(op.angle, opts.ascii));
        g.marks.push_back({op.target, MarkKind::Box, ""});
        g.marks.push_back({op.target2, MarkKind::Box, ""});
        break;
    case ir::OpKind::Measure: {
        g.marks.push_back({op.target, MarkKind::Box, "M"});
        int32_t reg = creg_of_bit(c, op.cbit());
        WHITTLE_ASSERT(reg >= 0 && "a measured bit belongs to a classical register");
        const ir::ClassicalRegister& r = c.cregs[size_t(reg)];
        g.classical = int32_t(nq) + reg;
        g.marks.push_back({uint32_t(g.classical), MarkKind::Readout,
                           r.scalar ? "" : fmt::format("{}", uint32_t(op.cbit()) - r.first)});
        break;
    }
    case ir::OpKind::Barrier:
        if (op.controls.empty()) return false;
        g.kind = GlyphKind::Barrier;
        for (ir::Lit l : op.controls) g.marks.push_back({l.wire(), MarkKind::ParityWire, ""});
        break;
    }
    if (op.is_conditioned()) {
        g.classical = int32_t(nq) + op.cond_reg();
        g.marks.push_back({uint32_t(g.classical), MarkKind::CondTap, fmt::format("={}", op.cond_value())});
    }
    g.lo = g.marks.front().lane;
    g.hi = g.lo;
    for (const Mark& m : g.marks) {
        g.lo = std::min(g.lo, m.lane);
        g.hi = std::max(g.hi, m.lane);
    }
    if (g.kind == GlyphKind::Barrier) g.marks.clear();  // the marks only gave the span
    g.pair = op.pair;
    return true;
}

}  // namespace

Layout layout_circuit(const ir::Circuit& c, const LayoutOptions& opts) {
    Layout L;
    const uint32_t nq = c.num_qubits();
    for (uint32_t w = 0; w < nq; ++w) {
        const ir::Qubit& q = c.qubits[w];
        const ir::Register& r = c.registers[q.reg];
        Lane lane;
        lane.index = w;
        lane.group = r.name;
        lane.label = r.scalar ? r.name : fmt::format("{}", q.index);
        lane.group_start = w == 0 || c.qubits[w - 1].reg != q.reg;
        lane.badge = q.role == ir::Role::Data ? "data" : q.role == ir::Role::Clean ? "ancilla" : "borrow";
        L.lanes.push_back(lane);
    }
    for (uint32_t i = 0; i < c.cregs.size(); ++i) {
        Lane lane;
        lane.classical = true;
        lane.index = i;
        lane.group = c.cregs[i].name;
        lane.label = c.cregs[i].name;
        lane.group_start = true;
        lane.badge = "bits";
        L.lanes.push_back(lane);
    }

    // Idle lanes out: a lane no glyph marks or spans the end of is dropped, the others renumbered.
    std::vector<uint32_t> lane_of(L.lanes.size());
    for (uint32_t l = 0; l < lane_of.size(); ++l) lane_of[l] = l;
    if (opts.hide_idle) {
        std::vector<uint8_t> used(L.lanes.size(), 0);
        for (const ir::Op& op : c.ops) {
            Glyph g;
            if (!make_glyph(c, op, opts, g)) continue;
            used[g.lo] = used[g.hi] = 1;
            for (const Mark& m : g.marks) used[m.lane] = 1;
        }
        std::vector<Lane> kept;
        for (uint32_t l = 0; l < L.lanes.size(); ++l) {
            if (!used[l]) continue;
            lane_of[l] = uint32_t(kept.size());
            kept.push_back(L.lanes[l]);
            // a register's header goes over its first lane still drawn
            kept.back().group_start = kept.size() == 1 || kept[kept.size() - 2].group != kept.back().group ||
                                      kept[kept.size() - 2].classical != kept.back().classical;
        }
        L.lanes = std::move(kept);
    }

    // ASAP packing by lane span: an op's column is the first one after every op that covers any
    // lane of its span. Entering or leaving a compute/uncompute half (or with by_line a source
    // line) raises a floor over all lanes.
    std::vector<uint32_t> next_free(L.lanes.size(), 0);
    auto all_free = [&] { return next_free.empty() ? 0u : *std::max_element(next_free.begin(), next_free.end()); };
    uint32_t floor = 0;
    int64_t region_key = -1;  // pair * 2 + (uncompute ? 1 : 0), or file << 32 | line; -1 outside regions
    for (size_t i = 0; i < c.ops.size(); ++i) {
        const ir::Op& op = c.ops[i];
        int64_t key = -1;
        const uint32_t line = op.loc.line;  // copies: SourceLoc is packed
        const uint16_t file = op.loc.file;
        if (opts.by_line) {
            if (line != 0) key = int64_t(file) << 32 | line;
        } else if (op.half != ir::PairHalf::None && op.pair != 0) {
            key = int64_t(op.pair) * 2 + (op.half == ir::PairHalf::Uncompute ? 1 : 0);
        }
        if (key != region_key) {
            floor = all_free();
            if (key >= 0) {
                L.regions.push_back({floor, floor, op.half == ir::PairHalf::Compute, op.pair, ""});
                if (opts.by_line) {
                    const bool main_file = file == 0 || file >= c.files.size();
                    L.regions.back().text =
                        main_file ? fmt::format("line {}", line)
                                  : fmt::format("{}:{}", std::filesystem::path(c.files[file]).filename().string(), line);
                }
            }
            region_key = key;
        }
        Glyph g;
        g.op_index = i;
        if (!make_glyph(c, op, opts, g)) continue;
        if (opts.hide_idle) {
            for (Mark& m : g.marks) m.lane = lane_of[m.lane];
            g.lo = lane_of[g.lo];
            g.hi = lane_of[g.hi];
            if (g.classical >= 0) g.classical = int32_t(lane_of[size_t(g.classical)]);
        }
        uint32_t col = floor;
        for (uint32_t l = g.lo; l <= g.hi; ++l) col = std::max(col, next_free[l]);
        for (uint32_t l = g.lo; l <= g.hi; ++l) next_free[l] = col + 1;
        g.column = col;
        if (key >= 0) L.regions.back().last_col = std::max(L.regions.back().last_col, col);
        L.glyphs.push_back(std::move(g));
    }
    L.columns = all_free();
    std::stable_sort(L.glyphs.begin(), L.glyphs.end(),
                     [](const Glyph& a, const Glyph& b) { return a.column < b.column; });
    L.column_chars.assign(L.columns, 1);
    for (const Glyph& g : L.glyphs) L.column_chars[g.column] = std::max(L.column_chars[g.column], g.label_chars());
    // A region's bracket label must fit over its columns (each drawn at least 4 cells wider than its chars).
    std::erase_if(L.regions, [&](const Region& r) { return r.first_col >= L.columns; });
    for (const Region& r : L.regions) {
        size_t have = 0;
        for (uint32_t col = r.first_col; col <= r.last_col; ++col) have += L.column_chars[col] + 4;
        size_t need = display_width(r.label()) + 2;
        if (have < need) L.column_chars[r.last_col] += need - have;
    }
    return L;
}

}  // namespace whittle::lowering
