#!/usr/bin/python3
"""Independent numpy cross-check of `whittle matrix` and of the `whittle equiv` checker.

numpy builds each OpenQASM 2.0 program's unitary itself from the gate matrices written below, then
(1) compares it, up to global phase, with `$WHITTLE_BIN matrix X.qasm`, and (2) decides whether two
programs are equal up to global phase and checks that `whittle equiv A B` exits 0 or 1 accordingly.

Sources: one- and two-qubit gates, CNOT, Toffoli, SWAP: Nielsen & Chuang ch. 4 (H, X, Y, Z, S, T,
R_x, R_y, R_z = exp(-i theta/2 P)); u3(theta, phi, lambda) = [[cos, -e^{i lambda} sin],
[e^{i phi} sin, e^{i(phi+lambda)} cos]] of theta/2 and u1(lambda) = diag(1, e^{i lambda}): OpenQASM 2.0,
Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429 (from memory). Gates without an exact textbook
matrix here (cu1, crz) are not used; rz is compared only up to global phase (qelib1 defines it as u1).
"""
import json
import math
import os
import random
import subprocess
import sys
import tempfile

import numpy as np

WHITTLE = os.environ.get("WHITTLE_BIN", "whittle")

I2 = np.eye(2, dtype=complex)
X = np.array([[0, 1], [1, 0]], dtype=complex)
Y = np.array([[0, -1j], [1j, 0]], dtype=complex)
Z = np.diag([1, -1]).astype(complex)
H = np.array([[1, 1], [1, -1]], dtype=complex) / math.sqrt(2)
S = np.diag([1, 1j])
T = np.diag([1, np.exp(1j * math.pi / 4)])


def rx(t):
    return np.array([[math.cos(t / 2), -1j * math.sin(t / 2)], [-1j * math.sin(t / 2), math.cos(t / 2)]])


def ry(t):
    return np.array([[math.cos(t / 2), -math.sin(t / 2)], [math.sin(t / 2), math.cos(t / 2)]], dtype=complex)


def rz(t):
    return np.diag([np.exp(-1j * t / 2), np.exp(1j * t / 2)])


def u3(t, p, l):
    c, s = math.cos(t / 2), math.sin(t / 2)
    return np.array([[c, -np.exp(1j * l) * s], [np.exp(1j * p) * s, np.exp(1j * (p + l)) * c]])


ONE = {"h": lambda a: H, "x": lambda a: X, "y": lambda a: Y, "z": lambda a: Z, "s": lambda a: S,
       "sdg": lambda a: S.conj().T, "t": lambda a: T, "tdg": lambda a: T.conj().T,
       "rx": lambda a: rx(a[0]), "ry": lambda a: ry(a[0]), "rz": lambda a: rz(a[0]),
       "u3": lambda a: u3(*a), "u1": lambda a: np.diag([1, np.exp(1j * a[0])])}


def apply_1q(u, m, w, n):
    """u <- (m on wire w) @ u; basis bit w of the index is wire w."""
    out = u.copy()
    for i in range(2 ** n):
        if (i >> w) & 1:
            continue
        j = i | (1 << w)
        out[i, :] = m[0, 0] * u[i, :] + m[0, 1] * u[j, :]
        out[j, :] = m[1, 0] * u[i, :] + m[1, 1] * u[j, :]
    return out


def permute(u, f, n):
    """u <- P u for the basis permutation i -> f(i)."""
    out = np.zeros_like(u)
    for i in range(2 ** n):
        out[f(i), :] = u[i, :]
    return out


def unitary(n, gates):
    u = np.eye(2 ** n, dtype=complex)
    for name, args, ws in gates:
        if name in ONE:
            u = apply_1q(u, ONE[name](args), ws[0], n)
        elif name == "cx":
            c, t = ws
            u = permute(u, lambda i: i ^ (((i >> c) & 1) << t), n)
        elif name == "ccx":
            a, b, t = ws
            u = permute(u, lambda i: i ^ (((i >> a) & (i >> b) & 1) << t), n)
        elif name == "swap":
            a, b = ws
            u = permute(u, lambda i: i if ((i >> a) & 1) == ((i >> b) & 1) else i ^ (1 << a) ^ (1 << b), n)
        elif name == "cz":
            a, b = ws
            d = np.array([-1 if ((i >> a) & (i >> b) & 1) else 1 for i in range(2 ** n)])
            u = d[:, None] * u
        else:
            raise ValueError(name)
    return u


def distance_up_to_phase(a, b):
    inner = np.vdot(b, a)
    ph = inner / abs(inner) if abs(inner) > 1e-300 else 1
    return np.linalg.norm(a - ph * b) / math.sqrt(a.shape[0])


def qasm_text(n, gates):
    lines = ["OPENQASM 2.0;", 'include "qelib1.inc";', f"qreg q[{n}];"]
    for name, args, ws in gates:
        a = "(" + ",".join(repr(x) for x in args) + ")" if args else ""
        lines.append(f"{name}{a} " + ",".join(f"q[{w}]" for w in ws) + ";")
    return "\n".join(lines) + "\n"


EXACT = [0, math.pi / 4, math.pi / 2, math.pi, -math.pi / 4, 3 * math.pi / 4, 0.3, 1.234]


def random_gate(rng, n):
    kinds = ["h", "x", "y", "z", "s", "sdg", "t", "tdg", "rx", "ry", "rz", "u3"]
    if n >= 2:
        kinds += ["cx", "cz", "swap"]
    if n >= 3:
        kinds.append("ccx")
    k = rng.choice(kinds)
    arity = {"cx": 2, "cz": 2, "swap": 2, "ccx": 3}.get(k, 1)
    ws = rng.sample(range(n), arity)
    args = [rng.choice(EXACT) for _ in range({"rx": 1, "ry": 1, "rz": 1, "u3": 3}.get(k, 0))]
    return (k, args, ws)


def inverse(g):
    name, args, ws = g
    inv = {"s": "sdg", "sdg": "s", "t": "tdg", "tdg": "t"}
    if name in inv:
        return (inv[name], args, ws)
    if name in ("rx", "ry", "rz"):
        return (name, [-args[0]], ws)
    if name == "u3":
        return ("u3", [-args[0], -args[2], -args[1]], ws)
    return g


def run(args, tmp):
    return subprocess.run([WHITTLE] + args, cwd=tmp, capture_output=True, text=True, timeout=120)


def main():
    rng = random.Random(20260)
    passed = failed = 0

    def check(ok, what):
        nonlocal passed, failed
        if ok:
            passed += 1
        else:
            failed += 1
            print("FAIL:", what)

    with tempfile.TemporaryDirectory() as tmp:
        # Hand-written identities first (Nielsen & Chuang ch. 4, practice), then random programs.
        fixed = [
            (3, [("ccx", [], [0, 1, 2])]),
            (3, [("h", [], [2]), ("cx", [], [1, 2]), ("tdg", [], [2]), ("cx", [], [0, 2]), ("t", [], [2]),
                 ("cx", [], [1, 2]), ("tdg", [], [2]), ("cx", [], [0, 2]), ("t", [], [1]), ("t", [], [2]),
                 ("h", [], [2]), ("cx", [], [0, 1]), ("t", [], [0]), ("tdg", [], [1]), ("cx", [], [0, 1])]),
            (2, [("swap", [], [0, 1])]),
            (2, [("cx", [], [0, 1]), ("cx", [], [1, 0]), ("cx", [], [0, 1])]),
            (1, [("h", [], [0]), ("x", [], [0]), ("h", [], [0])]),
            (1, [("z", [], [0])]),
        ]
        programs = list(fixed)
        for _ in range(30):
            n = rng.randint(1, 4)
            programs.append((n, [random_gate(rng, n) for _ in range(rng.randint(1, 12))]))

        # (1) whittle matrix against numpy.
        for idx, (n, gates) in enumerate(programs):
            path = os.path.join(tmp, f"p{idx}.qasm")
            with open(path, "w") as f:
                f.write(qasm_text(n, gates))
            r = run(["matrix", path], tmp)
            if r.returncode != 0:
                check(False, f"matrix p{idx}: exit {r.returncode}: {r.stderr.strip()}")
                continue
            j = json.loads(r.stdout)
            m = np.array(j["re"]) + 1j * np.array(j["im"])
            # whittle's basis bit w is wire w, named in j["wires"]; map q[k] -> bit position.
            pos = {name: w for w, name in enumerate(j["wires"])}
            perm_gates = [(g, a, [pos[f"q[{w}]"] for w in ws]) for g, a, ws in gates]
            ref = unitary(j["n"], perm_gates)
            d = distance_up_to_phase(m, ref)
            check(d < 1e-9, f"matrix p{idx} differs from numpy by {d}")

        # (2) whittle equiv against numpy's verdict, on equal and unequal pairs.
        pairs = [(0, 1, True), (2, 3, True), (4, 5, True), (0, 2, None)]
        for idx, (n, gates) in enumerate(programs[len(fixed):], start=len(fixed)):
            b = list(gates)
            choice = rng.randrange(3)
            if choice == 0:  # insert g, g^-1: equal
                g = random_gate(rng, n)
                at = rng.randint(0, len(b))
                b[at:at] = [g, inverse(g)]
            elif choice == 1 and b:  # drop one gate: usually different
                del b[rng.randrange(len(b))]
            else:  # replace one gate
                b[rng.randrange(len(b))] = random_gate(rng, n)
            programs.append((n, b))
            pairs.append((idx, len(programs) - 1, None))
        for a_idx, b_idx, expect in pairs:
            na, ga = programs[a_idx]
            nb, gb = programs[b_idx]
            pa, pb = os.path.join(tmp, f"p{a_idx}.qasm"), os.path.join(tmp, f"p{b_idx}.qasm")
            for p, (n, g) in ((pa, (na, ga)), (pb, (nb, gb))):
                with open(p, "w") as f:
                    f.write(qasm_text(n, g))
            if na != nb:
                continue
            truth = distance_up_to_phase(unitary(na, ga), unitary(nb, gb)) < 1e-9
            if expect is not None:
                check(truth == expect, f"numpy disagrees with the textbook identity p{a_idx} == p{b_idx}")
            r = run(["equiv", pa, pb], tmp)
            want = 0 if truth else 1
            check(r.returncode == want,
                  f"equiv p{a_idx} p{b_idx}: exit {r.returncode}, numpy says {'equal' if truth else 'different'}\n"
                  f"{r.stdout}{r.stderr}")

    print(f"{passed} passed, {failed} failed")
    return 0 if failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main())
