// Diagram layout (ASAP columns, regions, wrapping) and the text and SVG drawers on IR-built circuits.
#include <doctest/doctest.h>

#include <cstdlib>
#include <fstream>
#include <set>
#include <sstream>

#include "support/harbor_circuits.h"
#include "output/draw.h"
#include "output/draw_layout.h"

using namespace whittle;
using lowering::Layout;

namespace {

std::vector<std::string> lines_of(const std::string& s) {
    std::vector<std::string> out;
    std::istringstream in(s);
    for (std::string line; std::getline(in, line);) out.push_back(line);
    return out;
}

size_t count_of(const std::string& hay, const std::string& needle) {
    size_t n = 0;
    for (size_t p = hay.find(needle); p != std::string::npos; p = hay.find(needle, p + needle.size())) ++n;
    return n;
}

}  // namespace

TEST_CASE("columns are ASAP over the lane span an op covers") {
    // Hand-computed: x a0 and x a2 share column 0; the CNOT a0 -> a2 covers lanes 0..2 (its
    // connector crosses a1) so it takes column 1; x a1 must then wait for column 2.
    ir::Circuit c;
    uint32_t a = c.add_register("a", 3, ir::Role::Data);
    c.ops.push_back(ir::Op::x(a));
    c.ops.push_back(ir::Op::x(a + 2));
    c.ops.push_back(ir::Op::x(a + 2, {ir::Lit::pos(a)}));
    c.ops.push_back(ir::Op::x(a + 1));
    Layout L = lowering::layout_circuit(c);
    REQUIRE(L.glyphs.size() == 4);
    std::vector<uint32_t> col(4);
    for (const auto& g : L.glyphs) col[g.op_index] = g.column;
    CHECK(col == std::vector<uint32_t>{0, 0, 1, 2});
    CHECK(L.columns == 3);
}

TEST_CASE("compute and uncompute halves get columns of their own") {
    ir::Circuit c = testing::crane_check();
    Layout L = lowering::layout_circuit(c);
    REQUIRE(L.regions.size() == 2);
    CHECK(L.regions[0].compute);
    CHECK_FALSE(L.regions[1].compute);
    CHECK(L.regions[0].label() == "compute #1");
    CHECK(L.regions[1].label() == "uncompute #1");
    for (const auto& g : L.glyphs) {
        for (const auto& r : L.regions) {
            bool inside = g.column >= r.first_col && g.column <= r.last_col;
            bool member = g.pair == r.pair && c.ops[g.op_index].half == (r.compute ? ir::PairHalf::Compute : ir::PairHalf::Uncompute);
            CHECK(inside == member);
        }
    }
    // Lanes: 8 wires grouped in 5 registers, then the classical register.
    REQUIRE(L.lanes.size() == 9);
    CHECK(L.lanes[8].classical);
    int groups = 0;
    for (const auto& lane : L.lanes) groups += lane.group_start;
    CHECK(groups == 6);
    CHECK(L.lanes[6].badge == "ancilla");
    CHECK(L.lanes[7].badge == "borrow");
}

TEST_CASE("text diagram shows polarity, phase functions, parities and regions") {
    ir::Circuit c = testing::crane_check();
    std::string t = lowering::draw_text({{&c, "crane check"}}, {});
    CHECK(t.find("crane check") != std::string::npos);
    CHECK(t.find("π/4 · w[0]∧berth[0]") != std::string::npos);
    CHECK(t.find("π/4 · crane[0]⊕berth[1]⊕flag") != std::string::npos);
    CHECK(t.find("π · crane[0]∧crane[1]") != std::string::npos);
    CHECK(t.find("compute #1") != std::string::npos);
    CHECK(t.find("uncompute #1") != std::string::npos);
    CHECK(t.find("w · ancilla") != std::string::npos);
    CHECK(t.find("d · borrow") != std::string::npos);
    CHECK(t.find("[Rz(π/8)]") != std::string::npos);
    CHECK(t.find("[T]") != std::string::npos);
    CHECK(t.find("=1") != std::string::npos);
    // Positive controls: 2 (compute/uncompute on crane[0]) + 2 (MCX) + 2 (phase w,berth) + 1 (cx on d)
    // + 2 (conditioned CZ) = 9; negative controls: 2 (crane[1] in the pair) + 1 (berth[0] in the MCX).
    CHECK(count_of(t, "●") == 9);
    CHECK(count_of(t, "○") == 3);
    CHECK(count_of(t, "⊕") == 4 + 2);  // 4 X targets + 2 in the parity label
    CHECK(count_of(t, "◆") == 3);
}

TEST_CASE("ascii text diagram is pure ASCII") {
    ir::Circuit c = testing::crane_check();
    lowering::DrawOptions o;
    o.ascii = true;
    std::string t = lowering::draw_text({{&c, "crane check"}}, o);
    for (unsigned char ch : t) CHECK(ch < 0x80);
    CHECK(t.find("pi/4 * w[0]&berth[0]") != std::string::npos);
    CHECK(t.find("compute #1") != std::string::npos);
}

TEST_CASE("long circuits wrap into rows of --width columns") {
    ir::Circuit c;
    uint32_t a = c.add_register("a", 2, ir::Role::Data);
    for (int i = 0; i < 10; ++i) c.ops.push_back(ir::Op::x(a + 1, {ir::Lit::pos(a)}));
    lowering::DrawOptions o;
    o.width = 4;
    o.counts = false;
    std::string t = lowering::draw_text({{&c, ""}}, o);
    // 10 columns in rows of 4: rows 1-4, 5-8, 9-10; every row repeats the register header.
    CHECK(count_of(t, "a · data") == 3);
    CHECK(t.find("columns 5-8") != std::string::npos);
    CHECK(t.find("columns 9-10") != std::string::npos);
    CHECK(count_of(t, "⊕") == 10);
    // Within one row every wire line ends in the same column (the wires run the whole row).
    auto ls = lines_of(t);
    CHECK(lowering::display_width(ls[2]) == lowering::display_width(ls[4]));
}

TEST_CASE("compare stacks two circuits with their titles and counts") {
    ir::Circuit before = testing::textbook_toffoli();
    ir::Circuit after = before.empty_copy();
    after.ops.push_back(ir::Op::x(2, {ir::Lit::pos(0), ir::Lit::pos(1)}));
    std::string t = lowering::draw_text({{&before, "before"}, {&after, "after"}}, {});
    CHECK(t.find("before\nqubits 3 · ops 15 · T 7 · CNOT 6 · 2q 6 · depth") != std::string::npos);
    CHECK(t.find("after\nqubits 3 · ops 1 · T 0 · CNOT 0 · 2q 0 · depth 1") != std::string::npos);
    std::string svg = lowering::draw_svg({{&before, "before"}, {&after, "after"}}, {});
    CHECK(svg.find(">before</text>") != std::string::npos);
    CHECK(svg.find(">after</text>") != std::string::npos);
}

TEST_CASE("svg escapes text and draws one element per mark") {
    ir::Circuit c = testing::crane_check();
    std::string svg = lowering::draw_svg({{&c, "a < b & c"}}, {});
    CHECK(svg.rfind("<?xml", 0) == 0);
    CHECK(svg.find("a &lt; b &amp; c") != std::string::npos);
    CHECK(svg.find("</svg>") != std::string::npos);
    CHECK(count_of(svg, "<polygon") == 3 + 1);  // 3 parity diamonds + 1 readout arrow
    if (const char* dir = std::getenv("WHITTLE_DRAW_DUMP")) {
        std::ofstream(std::string(dir) + "/crane.svg") << svg;
        std::ofstream(std::string(dir) + "/crane.txt") << lowering::draw_text({{&c, "crane check"}}, {});
    }
}
