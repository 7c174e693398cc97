#!/usr/bin/env python3
"""For every target, the gates whittle writes are exactly within the target's documented set (docs/lowering.md,
the target table): several samples and random programs are compiled per target, emitted as OpenQASM 2.0,
OpenQASM 3.0 and .wq, and the gate names parsed out of each text are compared with a per-target
list written from the gate table of docs/lowering.md (not from the emitters)."""
import os
import pathlib
import random
import re
import subprocess
import sys
import tempfile

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))

# docs/lowering.md, the target table: the documented gate set of each target, as OpenQASM names (2.0: the header of
# arXiv:1707.03429 plus what 2.0 files then define, iswap and r; 3.0: stdgates.inc names) and as
# .wq spellings. X with one positive control is CNOT (cx, `t ^= c`), with two Toffoli (ccx,
# `t ^= a & b`); CZ is `phase(pi) a & b` in .wq.
DOC = {
    "clifford+t": {"h", "s", "sdg", "t", "tdg", "x", "y", "z", "cx"},
    "cx+rz+sx": {"cx", "rz", "sx", "x"},
    "cz+rx+rz": {"cz", "rx", "rz"},
    "iswap+rz+rx": {"iswap", "rz", "rx"},
    "xx+r": {"xx", "r", "rz"},
    "u+cx": {"u", "cx"},
    "nct": {"x", "cx", "ccx"},
}
# The OpenQASM spellings of the documented gates (XX(theta) is rxx; U is u3 in 2.0, u in 3.0).
QASM_NAME = {"xx": "rxx"}
QASM2_U = "u3"
# Allowed everywhere (not gates of the target): measurement, reset and barriers under
# --allow-measurement or as the input has them; nct allows no measurement.
NON_GATES = {"measure", "reset", "barrier"}

SAMPLES = ["crane_collision.wq", "tilt_rotations.wq", "parity_alarm.wq", "yard_search.wq", "berth_fit.wq"]

failures = []


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def allowed(target, fmt):
    names = set()
    for g in DOC[target]:
        if fmt == "wq":
            names.add(g)
        elif g == "u":
            names |= {QASM2_U} if fmt == "qasm2" else {"u", "U"}  # 3.0: stdgates' u or the builtin U
        else:
            names.add(QASM_NAME.get(g, g))
    return names


def qasm_gates(text):
    """Gate names called in an OpenQASM text (calls inside `gate` definitions are not counted: the
    definition's name is, where it is called)."""
    names = []
    depth = 0
    for raw in text.splitlines():
        line = raw.split("//")[0].strip()
        if not line:
            continue
        if line.startswith("gate "):
            depth += line.count("{") - line.count("}")
            continue
        if depth > 0:
            depth += line.count("{") - line.count("}")
            continue
        for stmt in line.split(";"):
            stmt = stmt.strip()
            stmt = re.sub(r"^if\s*\([^)]*\)\s*", "", stmt)
            if not stmt or re.match(r"^(OPENQASM|include|qreg|creg|qubit|bit|gphase)\b", stmt) or "=" in stmt.split("(")[0]:
                continue
            m = re.match(r"([A-Za-z_][A-Za-z0-9_]*)", stmt)
            if m:
                names.append(m.group(1))
    return names


def wq_gates(text):
    """Gate names of a .wq text as the printer writes lowered circuits."""
    names = []
    for raw in text.splitlines():
        line = raw.split("#")[0].strip()
        line = re.sub(r"^@\w+\(\d+\)\s*", "", line)
        if not line or re.match(r"^(qubit|ancilla|borrow|bit)\b", line):
            continue
        if line.startswith("if "):
            line = re.sub(r"^if [^{]*\{\s*", "", line).rstrip("}").strip()
        if line.startswith("when "):
            names.append("when")
            continue
        if "<->" in line:
            names.append("swap")
            continue
        if line.startswith("measure "):
            names.append("measure")
            continue
        m = re.match(r"^([^\s^]+(?:\[\d+\])?)\s*\^=\s*(.*)$", line)
        if m:
            lits = [x.strip() for x in m.group(2).split("&")]
            names.append({1: "cx", 2: "ccx"}.get(len(lits), f"x with {len(lits)} controls")
                         if not any(l.startswith("!") for l in lits) else "x with negative controls")
            continue
        m = re.match(r"^phase\(([^)]*)\)\s*(.*)$", line)
        if m:
            wires = m.group(2)
            if wires.strip() == "1":
                continue  # a global phase
            if "^" in wires:
                names.append("parity phase")
            elif m.group(1).strip() == "pi" and wires.count("&") == 1 and "!" not in wires:
                names.append("cz")
            else:
                names.append(f"phase on {wires.count('&') + 1} wires")
            continue
        m = re.match(r"^(~?)([a-z_]+)", line)
        if m:
            name = m.group(2)
            names.append(name + "dg" if m.group(1) else name)
    return names


def random_program(rng, n):
    lines = ["# Harbor Logistics random check program", f"qubit w[{n}]"]
    one = ["h", "x", "t", "s", "z", "y", "sx"]
    for _ in range(rng.randint(5, 25)):
        a, b, c = rng.sample(range(n), 3)
        kind = rng.randrange(9)
        if kind == 0:
            lines.append(f"{rng.choice(one)} w[{a}]")
        elif kind == 1:
            lines.append(f"{rng.choice(['rz', 'rx', 'ry'])}({rng.uniform(-3, 3):.4f}) w[{a}]")
        elif kind == 2:
            lines.append(f"w[{a}] ^= w[{b}] & !w[{c}]")
        elif kind == 3:
            lines.append(f"when w[{a}] {{ {rng.choice(['h', 'y', 'sx'])} w[{b}] }}")
        elif kind == 4:
            lines.append(f"phase(pi/{rng.choice([2, 4, 8, 3])}) w[{a}] & w[{b}]")
        elif kind == 5:
            lines.append(f"w[{a}] <-> w[{b}]")
        elif kind == 6:
            lines.append(f"when w[{a}] & w[{b}] {{ rz({rng.uniform(-3, 3):.3f}) w[{c}] }}")
        elif kind == 7:
            lines.append(f"phase(pi/4) w[{a}] ^ w[{b}]")
        else:
            lines.append(f"w[{c}] ^= w[{a}] & w[{b}]")
    return "\n".join(lines) + "\n"


def classical_program(rng, n):
    lines = ["# Harbor Logistics random reversible program", f"qubit w[{n}]"]
    for _ in range(rng.randint(5, 20)):
        a, b, c, d = rng.sample(range(n), 4)
        lines.append(rng.choice([f"x w[{a}]", f"w[{a}] ^= w[{b}]", f"w[{a}] ^= w[{b}] & w[{c}]",
                                 f"w[{a}] ^= w[{b}] & !w[{c}] & w[{d}]", f"w[{a}] <-> w[{b}]"]))
    return "\n".join(lines) + "\n"


rng = random.Random(20240611)
with tempfile.TemporaryDirectory() as tmp:
    tmp = pathlib.Path(tmp)
    inputs = {t: [SRC / "samples" / s for s in SAMPLES] for t in DOC}
    for t in DOC:
        for i in range(4):
            p = tmp / f"{t.replace('+', '_')}_{i}.wq"
            p.write_text(classical_program(rng, 6) if t == "nct" else random_program(rng, 5))
            inputs[t].append(p)
    checked = 0
    seen = {}
    for target, files in inputs.items():
        for f in files:
            for fmt in ("qasm2", "qasm3", "wq"):
                r = subprocess.run([BIN, "compile", str(f), "--target", target, "--emit", fmt, "-q"],
                                   capture_output=True, text=True, timeout=600)
                if r.returncode != 0:
                    # nct takes classical programs only; the samples with rotations are refused there.
                    ok = target == "nct" and f.parent.name == "samples" and "error:" in r.stderr
                    check(ok, f"{f.name} --target {target} --emit {fmt}: exit {r.returncode}: {r.stderr[:300]}")
                    continue
                names = qasm_gates(r.stdout) if fmt != "wq" else wq_gates(r.stdout)
                extra = sorted(set(names) - allowed(target, fmt) - (set() if target == "nct" else NON_GATES))
                check(not extra, f"{f.name} --target {target} --emit {fmt}: gates outside the target: {extra}")
                check(bool(names), f"{f.name} --target {target} --emit {fmt}: no gates parsed")
                checked += 1
                seen.setdefault((target, fmt), set()).update(names)
    print(f"{checked} outputs checked")
    for (target, fmt), names in sorted(seen.items()):
        print(f"  {target:12} {fmt:5} {' '.join(sorted(names))}")
    check(checked >= 7 * 9 * 3 - 3 * 5, "enough outputs were checked")

sys.exit(1 if failures else 0)
