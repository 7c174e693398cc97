// Benchmark input generators (text built with fmt into one reserved string; no iostreams).
#include "generators.h"

#include <random>

#include <fmt/format.h>

namespace whittle::bench {

namespace {

/// Spelling of the Clifford+T+Toffoli generator's gates in one input language.
struct GateSpelling {
    const char* header;               // before the gates; {} = the number of qubits
    const char* one[6];               // h s sdg t tdg x, each followed by the qubit
    const char* cx;                   // {0} control, {1} target
    const char* ccx;                  // {0} {1} controls, {2} target
};

const GateSpelling kQasm = {"OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[{}];\n",
                            {"h", "s", "sdg", "t", "tdg", "x"},
                            "cx q[{}],q[{}];\n",
                            "ccx q[{}],q[{}],q[{}];\n"};
const GateSpelling kWq = {"qubit q[{}]\n", {"h", "s", "~s", "t", "~t", "x"}, "q[{1}] ^= q[{0}]\n",
                          "q[{2}] ^= q[{0}] & q[{1}]\n"};

std::string random_clifford_t(const GateSpelling& sp, uint32_t qubits, uint64_t gates, uint64_t seed) {
    std::mt19937_64 rng(seed);
    std::string s;
    s.reserve(gates * 22 + 64);
    s += fmt::format(fmt::runtime(sp.header), qubits);
    const bool qasm = &sp == &kQasm;
    std::uniform_int_distribution<uint32_t> wire(0, qubits - 1), kind(0, 9);
    for (uint64_t g = 0; g < gates; ++g) {
        uint32_t k = kind(rng), a = wire(rng);
        if (k < 6) {
            fmt::format_to(std::back_inserter(s), fmt::runtime(qasm ? "{} q[{}];\n" : "{} q[{}]\n"), sp.one[k], a);
            continue;
        }
        uint32_t b = wire(rng);
        while (b == a) b = wire(rng);
        if (k < 9) {
            fmt::format_to(std::back_inserter(s), fmt::runtime(sp.cx), a, b);
            continue;
        }
        uint32_t c = wire(rng);
        while (c == a || c == b) c = wire(rng);
        fmt::format_to(std::back_inserter(s), fmt::runtime(sp.ccx), a, b, c);
    }
    return s;
}

}  // namespace

std::string random_clifford_t_qasm(uint32_t qubits, uint64_t gates, uint64_t seed) {
    return random_clifford_t(kQasm, qubits, gates, seed);
}

std::string random_clifford_t_wq(uint32_t qubits, uint64_t gates, uint64_t seed) {
    return random_clifford_t(kWq, qubits, gates, seed);
}

std::string random_high_level_wq(uint32_t qubits, uint64_t ops, uint64_t seed) {
    std::mt19937_64 rng(seed);
    std::string s;
    s.reserve(ops * 40 + 64);
    s += fmt::format("qubit q[{}]\n", qubits);
    std::uniform_int_distribution<uint32_t> wire(0, qubits - 1), kind(0, 9), ncontrols(1, 5), coin(0, 1);
    std::vector<uint32_t> picked;
    for (uint64_t i = 0; i < ops; ++i) {
        uint32_t k = kind(rng);
        if (k == 0) {
            fmt::format_to(std::back_inserter(s), "h q[{}]\n", wire(rng));
            continue;
        }
        uint32_t nc = ncontrols(rng);
        picked.clear();
        while (picked.size() < nc + 1) {
            uint32_t w = wire(rng);
            bool dup = false;
            for (uint32_t p : picked) dup |= p == w;
            if (!dup) picked.push_back(w);
        }
        if (k <= 5) {
            fmt::format_to(std::back_inserter(s), "q[{}] ^=", picked[0]);
            for (uint32_t j = 1; j < picked.size(); ++j)
                fmt::format_to(std::back_inserter(s), "{} {}q[{}]", j == 1 ? "" : " &", coin(rng) ? "!" : "", picked[j]);
            s += '\n';
        } else {
            static const char* angles[] = {"pi", "pi/2", "pi/4", "-pi/4"};
            fmt::format_to(std::back_inserter(s), "phase({})", angles[k % 4]);
            for (uint32_t j = 1; j < picked.size(); ++j)
                fmt::format_to(std::back_inserter(s), "{} {}q[{}]", j == 1 ? "" : " &", coin(rng) ? "!" : "", picked[j]);
            s += '\n';
        }
    }
    return s;
}

namespace {

/// The Cuccaro adder's gates in either language (`qasm` picks OpenQASM 2.0, else .wq).
std::string cuccaro_adder(uint32_t n, bool qasm) {
    // Wires: c (carry in, clean), a[n], b[n], z (carry out). MAJ(x,y,z): cx z,y; cx z,x; ccx x,y,z.
    // UMA(x,y,z): ccx x,y,z; cx z,x; cx x,y.
    std::string s;
    s.reserve(size_t(n) * 120 + 128);
    if (qasm) s += fmt::format("OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg c[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg z[1];\n", n);
    else s += fmt::format("qubit c[1], a[{0}], b[{0}], z[1]\n", n);
    const char* cx = qasm ? "cx {0},{1};\n" : "{1} ^= {0}\n";
    const char* ccx = qasm ? "ccx {0},{1},{2};\n" : "{2} ^= {0} & {1}\n";
    auto gate2 = [&](const std::string& x, const std::string& y) { fmt::format_to(std::back_inserter(s), fmt::runtime(cx), x, y); };
    auto gate3 = [&](const std::string& x, const std::string& y, const std::string& z) {
        fmt::format_to(std::back_inserter(s), fmt::runtime(ccx), x, y, z);
    };
    auto maj = [&](const std::string& x, const std::string& y, const std::string& z) {
        gate2(z, y);
        gate2(z, x);
        gate3(x, y, z);
    };
    auto uma = [&](const std::string& x, const std::string& y, const std::string& z) {
        gate3(x, y, z);
        gate2(z, x);
        gate2(x, y);
    };
    auto A = [](uint32_t i) { return fmt::format("a[{}]", i); };
    auto B = [](uint32_t i) { return fmt::format("b[{}]", i); };
    maj("c[0]", B(0), A(0));
    for (uint32_t i = 1; i < n; ++i) maj(A(i - 1), B(i), A(i));
    gate2(A(n - 1), "z[0]");
    for (uint32_t i = n - 1; i >= 1; --i) uma(A(i - 1), B(i), A(i));
    uma("c[0]", B(0), A(0));
    return s;
}

}  // namespace

std::string cuccaro_adder_qasm(uint32_t n) { return cuccaro_adder(n, true); }

std::string cuccaro_adder_wq(uint32_t n) { return cuccaro_adder(n, false); }

std::string schoolbook_multiplier_wq(uint32_t n) {
    // p[0..2n) = a*b for p starting at 0: for each bit b[j], add a (shifted by j) into p under control b[j], with a
    // Cuccaro adder whose Toffolis and CNOTs all carry the extra control b[j].
    std::string s;
    s.reserve(size_t(n) * n * 200 + 256);
    s += fmt::format("qubit a[{0}], b[{0}], p[{1}]\nancilla c\n", n, 2 * n);
    for (uint32_t j = 0; j < n; ++j) {
        std::string ctl = fmt::format("b[{}]", j);
        auto cx = [&](const std::string& from, const std::string& to) {
            fmt::format_to(std::back_inserter(s), "{} ^= {} & {}\n", to, from, ctl);
        };
        auto ccx = [&](const std::string& x, const std::string& y, const std::string& to) {
            fmt::format_to(std::back_inserter(s), "{} ^= {} & {} & {}\n", to, x, y, ctl);
        };
        auto A = [](uint32_t i) { return fmt::format("a[{}]", i); };
        auto P = [&](uint32_t i) { return fmt::format("p[{}]", i + j); };
        // MAJ / UMA over (carry, p[i+j], a[i]); the carry out goes into p[n+j].
        auto maj = [&](const std::string& x, const std::string& y, const std::string& z) { cx(z, y); cx(z, x); ccx(x, y, z); };
        auto uma = [&](const std::string& x, const std::string& y, const std::string& z) { ccx(x, y, z); cx(z, x); cx(x, y); };
        maj("c", P(0), A(0));
        for (uint32_t i = 1; i < n; ++i) maj(A(i - 1), P(i), A(i));
        cx(A(n - 1), P(n));
        for (uint32_t i = n - 1; i >= 1; --i) uma(A(i - 1), P(i), A(i));
        uma("c", P(0), A(0));
    }
    return s;
}

}  // namespace whittle::bench
