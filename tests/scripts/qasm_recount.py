# Independent resource recount of an OpenQASM 2.0 file (helper for the script tests; not a test itself).
# Parses gate lines with its own regular expressions, counts gates by name, T-count (t + tdg),
# CNOT count (cx), two-qubit count and depth by its own ASAP layering. Shares no code with whittle.
import math
import re

GATE = re.compile(r"^\s*([a-z][a-z0-9_]*)\s*(\([^)]*\))?\s+(.+?)\s*;\s*$")
ARG = re.compile(r"([A-Za-z_][A-Za-z0-9_]*)\s*\[\s*(\d+)\s*\]|([A-Za-z_][A-Za-z0-9_]*)")
SKIP = {"OPENQASM", "include", "qreg", "creg", "gate", "opaque"}
# Names for one-wire phases by k*pi/4 (k mod 8), as the standard header's t, tdg, s, sdg, z gates.
PHASE_NAMES = {1: "t", 7: "tdg", 2: "s", 6: "sdg", 4: "z"}


def eighths(expr):
    """k in 0..7 when the angle expression is k*pi/4 (mod 2*pi), else None."""
    value = eval(expr.replace("pi", "(%r)" % math.pi), {"__builtins__": {}}, {})
    k = value / (math.pi / 4)
    if abs(k - round(k)) > 1e-9:
        return None
    return int(round(k)) % 8


def canonical(name, params):
    """The gate under the name whittle counts it: u1/p(k*pi/4) is t/tdg/s/sdg/z, cu1/cp(pi) is cz
    (OpenQASM 2.0 standard header: u1(lambda) = diag(1, e^{i lambda}); Cross et al. 2017, arXiv:1707.03429)."""
    if name in ("u1", "p") and params:
        return PHASE_NAMES.get(eighths(params), "p")
    if name in ("cu1", "cp") and params:
        return "cz" if eighths(params) == 4 else "cp"
    return name


def is_t_like(name, params):
    if name in ("t", "tdg"):
        return True
    if name in ("u1", "p", "rz") and params:
        k = eighths(params)
        return k is not None and k % 2 == 1
    return False


def recount(text):
    qregs = {}
    for m in re.finditer(r"qreg\s+([A-Za-z_][A-Za-z0-9_]*)\s*\[\s*(\d+)\s*\]\s*;", text):
        qregs[m.group(1)] = int(m.group(2))
    gates, layer = {}, {}
    depth = t_count = cnot = two_qubit = ops = 0
    body, in_gate_def = [], 0
    for raw in text.splitlines():
        line = raw.split("//")[0].strip()
        if not line:
            continue
        # Skip `gate name(...) a, b { ... }` definitions (possibly over several lines).
        if line.startswith("gate ") or in_gate_def:
            in_gate_def += line.count("{") - line.count("}")
            if line.startswith("gate ") and "{" not in line:
                in_gate_def = max(in_gate_def, 0)
            continue
        body.append(line)
    for line in body:
        head = line.split()[0].split("(")[0]
        if head in SKIP or head == "barrier":
            continue
        if line.startswith("if"):
            line = re.sub(r"^if\s*\([^)]*\)\s*", "", line)
            head = line.split()[0].split("(")[0]
        if head == "measure":
            wires = [w for w in re.findall(r"([A-Za-z_]\w*)\s*\[\s*(\d+)\s*\]", line.split("->")[0][len("measure"):])]
            name = "measure"
            t_like = False
        else:
            m = GATE.match(line)
            if not m:
                raise ValueError("cannot read gate line: " + line)
            name = m.group(1)
            params = m.group(2)[1:-1] if m.group(2) else ""
            t_like = is_t_like(name, params)
            name = canonical(name, params)
            wires = []
            for a in m.group(3).split(","):
                am = ARG.search(a.strip())
                if am.group(1):
                    wires.append((am.group(1), am.group(2)))
                else:  # a whole register: only size-1 registers are expected here
                    if qregs.get(am.group(3)) != 1:
                        raise ValueError("register-wide gate: " + line)
                    wires.append((am.group(3), "0"))
        wires = [(r, int(i)) for r, i in wires]
        ops += 1
        gates[name] = gates.get(name, 0) + 1
        if t_like:
            t_count += 1
        if name == "cx":
            cnot += 1
        if len(set(wires)) == 2:
            two_qubit += 1
        level = 1 + max(layer.get(w, 0) for w in wires)
        for w in wires:
            layer[w] = level
        depth = max(depth, level)
    return {"qubits": sum(qregs.values()), "ops": ops, "gates": gates, "t_count": t_count, "cnot_count": cnot,
            "two_qubit_count": two_qubit, "depth": depth}
