#!/usr/bin/python3
"""The kickback identity and cancel's use of it, checked by numpy independently of whittle.

(1) numpy builds the matrices of multi-controlled gates itself and checks, for several instances,
    A ; B = B ; A ; E  and  B ; A = A ; B ; E  (in time order), where A = X(t; C) with controls C,
    B an involution controlled on t, and E = B with its control on t replaced by C: B's control
    reads t xor C after A (Nielsen & Chuang ch. 4, CNOT identities; practice).
(2) `whittle compile --passes=normalize,cancel --emit qasm2` on OpenQASM programs with the pattern
    A ; B ; A must return fewer gates, and numpy's unitary of the output must equal the input's
    (up to global phase; the gates' matrices as in numpy_crosscheck_test.py).
"""
import os
import re
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from numpy_crosscheck_test import H, X, Y, Z, distance_up_to_phase, unitary  # noqa: E402

WHITTLE = os.environ.get("WHITTLE_BIN", "whittle")


def controlled(n, m, target, controls):
    """The 2^n matrix of the one-qubit `m` on `target` when every (wire, polarity) in `controls` holds."""
    dim = 2 ** n
    u = np.zeros((dim, dim), dtype=complex)
    for i in range(dim):
        if all(((i >> w) & 1) == p for w, p in controls):
            b = (i >> target) & 1
            for out in (0, 1):
                u[i & ~(1 << target) | (out << target), i] += m[out, b]
        else:
            u[i, i] = 1
    return u


def phase_pi(n, literals):
    """(-1) on the basis states where every (wire, polarity) literal holds."""
    return np.diag([-1.0 if all(((i >> w) & 1) == p for w, p in literals) else 1.0 for i in range(2 ** n)])


def replace_t(controls, t, c):
    """B's controls with the literal on t replaced by A's controls C."""
    return sorted(set([l for l in controls if l[0] != t] + c))


def check_identity(n, t, c, b_kind, b_target, b_controls):
    a = controlled(n, X, t, c)
    mats = {"x": X, "y": Y, "h": H, "z": Z}
    if b_kind == "phase":
        b = phase_pi(n, b_controls)
        e = phase_pi(n, replace_t(b_controls, t, c))
    else:
        b = controlled(n, mats[b_kind], b_target, b_controls)
        e = controlled(n, mats[b_kind], b_target, replace_t(b_controls, t, c))
    # Time order A ; B is the matrix B @ A.
    ok1 = np.allclose(b @ a, e @ a @ b)  # A ; B = B ; A ; E
    ok2 = np.allclose(a @ b, e @ b @ a)  # B ; A = A ; B ; E
    wrong = np.allclose(b @ a, a @ b)    # the two do not simply commute (else the case shows nothing)
    return ok1 and ok2 and not wrong


CASES = [
    # (n, t, C, kind of B, B's target, B's controls): CNOT/CNOT, Toffoli/CNOT, negative controls,
    # a shared control, Y, H, CZ and a CCZ-like phase.
    (3, 1, [(0, 1)], "x", 2, [(1, 1)]),
    (4, 2, [(0, 1), (1, 1)], "x", 3, [(2, 1)]),
    (4, 2, [(0, 1), (1, 0)], "x", 3, [(2, 0), (0, 1)]),
    (3, 1, [(0, 1)], "y", 2, [(1, 1)]),
    (3, 1, [(0, 0)], "h", 2, [(1, 0)]),
    (3, 1, [(0, 1)], "phase", None, [(1, 1), (2, 1)]),
    (4, 1, [(0, 1), (3, 1)], "phase", None, [(1, 1), (2, 0)]),
]

PROGRAMS = [
    # (gates, expected gate count after cancel)
    ([("cx", [], [0, 1]), ("cx", [], [1, 2]), ("cx", [], [0, 1])], 2),
    ([("ccx", [], [0, 1, 2]), ("cx", [], [2, 3]), ("ccx", [], [0, 1, 2])], 2),
    ([("cz", [], [1, 2]), ("cx", [], [0, 1]), ("cz", [], [1, 2])], 2),
    ([("cx", [], [1, 2]), ("h", [], [3]), ("cx", [], [0, 1]), ("cx", [], [1, 2])], 3),
]

GATE = re.compile(r"^(\w+)(\(([^)]*)\))?\s+(.*);$")


def read_qasm(text):
    """Gates and wire count of whittle's OpenQASM 2.0 output (qregs in order, wires numbered across them)."""
    offset, base, gates = 0, {}, []
    for line in text.splitlines():
        line = line.strip()
        m = re.match(r"^qreg\s+(\w+)\[(\d+)\];$", line)
        if m:
            base[m.group(1)] = offset
            offset += int(m.group(2))
            continue
        if not line or line.startswith(("OPENQASM", "include", "//", "creg")):
            continue
        g = GATE.match(line)
        if not g:
            raise ValueError(f"unexpected line: {line}")
        name, param = g.group(1), g.group(3)
        if name == "cu1" and param == "pi":
            name, param = "cz", None  # diag(1, 1, 1, e^{i pi}), arXiv:1707.03429
        if param is not None:
            raise ValueError(f"unexpected gate with parameters: {line}")
        ws = [base[r] + int(i) for r, i in re.findall(r"(\w+)\[(\d+)\]", g.group(4))]
        gates.append((name, [], ws))
    return offset, gates


def qasm(n, gates):
    lines = ["OPENQASM 2.0;", 'include "qelib1.inc";', f"qreg q[{n}];"]
    lines += [f"{name} " + ",".join(f"q[{w}]" for w in ws) + ";" for name, _, ws in gates]
    return "\n".join(lines) + "\n"


def main():
    failures = []
    for case in CASES:
        if not check_identity(*case):
            failures.append(f"identity fails in numpy: {case}")
    with tempfile.TemporaryDirectory() as tmp:
        for k, (gates, expected) in enumerate(PROGRAMS):
            n = 1 + max(w for _, _, ws in gates for w in ws)
            path = os.path.join(tmp, f"k{k}.qasm")
            with open(path, "w") as f:
                f.write(qasm(n, gates))
            r = subprocess.run([WHITTLE, "compile", path, "--passes=normalize,cancel", "--emit", "qasm2"],
                               capture_output=True, text=True, timeout=120)
            if r.returncode != 0:
                failures.append(f"program {k}: exit {r.returncode}: {r.stderr.strip()}")
                continue
            m, out = read_qasm(r.stdout)
            if m != n:
                failures.append(f"program {k}: {m} wires out, {n} in")
                continue
            if len(out) != expected:
                failures.append(f"program {k}: {len(out)} gates out, expected {expected}:\n{r.stdout}")
            d = distance_up_to_phase(unitary(n, gates), unitary(n, out))
            if d > 1e-9:
                failures.append(f"program {k}: numpy unitaries differ by {d}:\n{r.stdout}")
    for f in failures:
        print("FAIL:", f)
    print(f"{len(CASES)} identities, {len(PROGRAMS)} programs, {len(failures)} failures")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
