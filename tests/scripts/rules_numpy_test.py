#!/usr/bin/env python3
"""Every rule of the checked-in identity libraries (rules/library/*.rules), checked by numpy.

Independent of the project's code: the rule text is read here, each side built from textbook gate
matrices (common practice: Rz(t) = diag(e^{-it/2}, e^{it/2}), Rx(t) = exp(-i t/2 X), sqrt(X),
H, S, T, CNOT, CZ, iSWAP = |00><00| + i|01><10| + i|10><01| + |11><11|, XX(t) = exp(-i t/2 X(x)X),
R(t, p) = exp(-i t/2 (cos p X + sin p Y)) as in Molmer and Sorensen 1999, quant-ph/9810039, for the
trapped-ion gates), and both sides compared up to global phase at random parameter values. The
generator's own proof is exact; this is a second, numerical opinion on every rule."""
import os
import re
import sys

import numpy as np

SRC = os.environ.get("WHITTLE_SOURCE_DIR", os.path.join(os.path.dirname(__file__), "..", ".."))
LIB = os.path.join(SRC, "rules", "library")

I2 = np.eye(2, dtype=complex)
X = np.array([[0, 1], [1, 0]], dtype=complex)
Y = np.array([[0, -1j], [1j, 0]], dtype=complex)
Z = np.diag([1, -1]).astype(complex)


def expm_pauli(theta, p):  # exp(-i theta/2 P) for P with P^2 = I
    return np.cos(theta / 2) * np.eye(p.shape[0]) - 1j * np.sin(theta / 2) * p


def one(name, a):
    if name == "x": return X
    if name == "sx": return 0.5 * np.array([[1 + 1j, 1 - 1j], [1 - 1j, 1 + 1j]])
    if name == "rz": return np.diag([np.exp(-0.5j * a[0]), np.exp(0.5j * a[0])])
    if name == "rx": return expm_pauli(a[0], X)
    if name == "h": return np.array([[1, 1], [1, -1]]) / np.sqrt(2)
    if name == "s": return np.diag([1, 1j])
    if name == "sdg": return np.diag([1, -1j])
    if name == "t": return np.diag([1, np.exp(0.25j * np.pi)])
    if name == "tdg": return np.diag([1, np.exp(-0.25j * np.pi)])
    if name == "r": return expm_pauli(a[0], np.cos(a[1]) * X + np.sin(a[1]) * Y)
    raise ValueError(name)


def two(name, a):  # on (first wire, second wire), index 2*bit(first) + bit(second)
    if name == "cx": return np.array([[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 0, 1], [0, 0, 1, 0]], dtype=complex)
    if name == "cz": return np.diag([1, 1, 1, -1]).astype(complex)
    if name == "iswap": return np.array([[1, 0, 0, 0], [0, 0, 1j, 0], [0, 1j, 0, 0], [0, 0, 0, 1]])
    if name == "xx": return expm_pauli(a[0], np.kron(X, X))
    raise ValueError(name)


def embed(m, wires, n):
    """The n-wire matrix of m acting on `wires` (wire w is bit w of the basis index)."""
    dim = 2 ** n
    out = np.zeros((dim, dim), dtype=complex)
    k = len(wires)
    for col in range(dim):
        local = 0
        for w in wires:
            local = local * 2 + ((col >> w) & 1)
        for r in range(2 ** k):
            row = col
            for idx, w in enumerate(wires):
                bit = (r >> (k - 1 - idx)) & 1
                row = (row & ~(1 << w)) | (bit << w)
            out[row, col] += m[r, local]
    return out


def form_value(text, params):
    total, sign = 0.0, 1
    for ch in text:
        if ch == "-": sign = -1
        elif ch == "+": sign = 1
        else:
            total += sign * params["ab".index(ch)]
            sign = 1
    return total


GATE = re.compile(r"^([a-z]+)(?:\(([^)]*)\))?\s+(\d)(?:\s+(\d))?$")


def side(text, n, params):
    u = np.eye(2 ** n, dtype=complex)
    if text.strip() == "()":
        return u
    for g in text.split(";"):
        m = GATE.match(g.strip())
        assert m, g
        name, angles, w0, w1 = m.groups()
        a = [form_value(f, params) for f in angles.split(",")] if angles else []
        g_m = one(name, a) if w1 is None else two(name, a)
        wires = [int(w0)] if w1 is None else [int(w0), int(w1)]
        u = embed(g_m, wires, n) @ u
    return u


def main():
    rng = np.random.default_rng(2026)
    files = sorted(f for f in os.listdir(LIB) if f.endswith(".rules"))
    if not files:
        print("no libraries in", LIB)
        return 1
    checked = bad = 0
    for f in files:
        n = None
        for line in open(os.path.join(LIB, f)):
            if line.startswith("set "):
                n = int(line.split()[3])
            if not line.startswith("rule "):
                continue
            body = line.split("]", 1)[1]
            lhs, rhs = body.split("=")
            for _ in range(3):
                params = rng.uniform(-np.pi, np.pi, 2)
                l, r = side(lhs, n, params), side(rhs, n, params)
                overlap = np.trace(r.conj().T @ l) / l.shape[0]
                if abs(abs(overlap) - 1) > 1e-9 or np.linalg.norm(l - overlap * r) > 1e-8:
                    print(f"{f}: not equal at a={params[0]:.6f} b={params[1]:.6f}: {line.strip()}")
                    bad += 1
                    break
            checked += 1
    print(f"{checked} rules in {len(files)} libraries checked, {bad} wrong")
    return 1 if bad or checked == 0 else 0


if __name__ == "__main__":
    sys.exit(main())
