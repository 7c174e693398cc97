// Test support for the arithmetic library: load a program using `use "arith"`, run it on many inputs.
#pragma once

#include <doctest/doctest.h>

#include <functional>
#include <map>
#include <random>
#include <string>
#include <vector>

#include "frontend/load.h"
#include "ir/circuit.h"
#include "ir/classical_sim.h"

namespace stdlib_test {

using u128 = unsigned __int128;
using Values = std::map<std::string, u128>;  // data register name -> value (little-endian)

inline u128 mask(unsigned n) { return n >= 128 ? ~u128(0) : (u128(1) << n) - 1; }

inline whittle::ir::Circuit load(const std::string& program) {
    whittle::frontend::SourceManager sm;
    return whittle::frontend::load_text(program, "stdlib_test.wq", whittle::frontend::InputFormat::Wq, sm);
}

/// Runs an X-type circuit on a batch of inputs (64 per simulation word). Work wires start at 0 and
/// must come back to 0 (checked). Returns the data registers' values after the circuit.
inline std::vector<Values> run(const whittle::ir::Circuit& c, const std::vector<Values>& inputs) {
    REQUIRE(whittle::ir::is_classical(c));
    std::vector<Values> outputs;
    for (size_t base = 0; base < inputs.size(); base += 64) {
        size_t lanes = std::min<size_t>(64, inputs.size() - base);
        std::vector<uint64_t> wires(c.num_qubits(), 0);
        for (size_t j = 0; j < lanes; ++j)
            for (const auto& [name, value] : inputs[base + j]) {
                int r = c.find_register(name);
                REQUIRE_MESSAGE(r >= 0, "no register " << name);
                const whittle::ir::Register& reg = c.registers[size_t(r)];
                for (uint32_t i = 0; i < reg.size && i < 128; ++i)
                    if ((value >> i) & 1) wires[reg.first + i] |= uint64_t(1) << j;
            }
        whittle::ir::simulate_bits(c, wires);
        for (uint32_t w = 0; w < c.num_qubits(); ++w)
            if (c.qubits[w].role == whittle::ir::Role::Clean) {
                uint64_t live = lanes == 64 ? ~uint64_t(0) : (uint64_t(1) << lanes) - 1;
                REQUIRE_MESSAGE((wires[w] & live) == 0, "work wire " << c.wire_name(w) << " not returned clean");
            }
        for (size_t j = 0; j < lanes; ++j) {
            Values out;
            for (const whittle::ir::Register& reg : c.registers) {
                if (reg.role != whittle::ir::Role::Data) continue;
                u128 v = 0;
                for (uint32_t i = 0; i < reg.size && i < 128; ++i)
                    if ((wires[reg.first + i] >> j) & 1) v |= u128(1) << i;
                out[reg.name] = v;
            }
            outputs.push_back(out);
        }
    }
    return outputs;
}

/// Every combination of values of the named registers of the given widths (exhaustive).
inline std::vector<Values> all_inputs(const std::vector<std::pair<std::string, unsigned>>& regs) {
    unsigned total = 0;
    for (auto& r : regs) total += r.second;
    std::vector<Values> out;
    for (uint64_t x = 0; x < (uint64_t(1) << total); ++x) {
        Values v;
        unsigned shift = 0;
        for (auto& [name, width] : regs) {
            v[name] = (x >> shift) & ((uint64_t(1) << width) - 1);
            shift += width;
        }
        out.push_back(v);
    }
    return out;
}

/// `count` random values for each register.
inline std::vector<Values> random_inputs(const std::vector<std::pair<std::string, unsigned>>& regs, size_t count,
                                         std::mt19937_64& rng) {
    std::vector<Values> out;
    for (size_t k = 0; k < count; ++k) {
        Values v;
        for (auto& [name, width] : regs) v[name] = ((u128(rng()) << 64) | rng()) & mask(width);
        out.push_back(v);
    }
    return out;
}

/// A decimal rendering of a 128-bit value (for messages).
inline std::string str(u128 v) {
    if (v == 0) return "0";
    std::string s;
    while (v) {
        s.insert(s.begin(), char('0' + int(v % 10)));
        v /= 10;
    }
    return s;
}

/// The widths tested exhaustively (every input) and by random inputs.
inline const std::vector<unsigned> kExhaustive = {1, 2, 3, 4, 5};
inline const std::vector<unsigned> kRandom = {32, 64};

}  // namespace stdlib_test

namespace stdlib_test {

using Expect = std::function<Values(const Values&)>;
using Regs = std::vector<std::pair<std::string, unsigned>>;

/// Checks `call` (a statement using the library) on registers `regs` against `expect`, computed by
/// integer arithmetic in the test: on every input when the registers total at most 16 bits, else on
/// 256 random inputs; and again under `when ctl { ... }` (ctl = 0 must leave everything unchanged).
inline void check_routine(const Regs& regs, const std::string& call, const Expect& expect, uint64_t seed = 1) {
    std::string decl;
    unsigned total = 0;
    for (auto& [name, width] : regs) {
        decl += "qubit " + name + "[" + std::to_string(width) + "]\n";
        total += width;
    }
    std::mt19937_64 rng(seed);
    for (bool controlled : {false, true}) {
        std::string program = "use \"arith\"\n" + decl;
        program += controlled ? "qubit ctl\nwhen ctl { " + call + " }\n" : call + "\n";
        INFO("program:\n" << program);
        whittle::ir::Circuit c = load(program);
        Regs all = regs;
        if (controlled) all.emplace_back("ctl", 1);
        std::vector<Values> inputs = total + controlled <= 16 ? all_inputs(all) : random_inputs(all, 256, rng);
        std::vector<Values> outputs = run(c, inputs);
        for (size_t k = 0; k < inputs.size(); ++k) {
            const Values& in = inputs[k];
            Values want = (controlled && in.at("ctl") == 0) ? in : expect(in);
            if (controlled) want["ctl"] = in.at("ctl");
            for (auto& [name, value] : want) {
                std::string shown;
                for (auto& [n, v] : in) shown += n + "=" + str(v) + " ";
                INFO("input " << shown << " register " << name);
                REQUIRE(str(outputs[k].at(name)) == str(value));
            }
        }
    }
}

}  // namespace stdlib_test
