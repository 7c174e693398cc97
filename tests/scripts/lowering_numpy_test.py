"""Independent cross-check of every target: numpy builds the unitary of the OpenQASM 2.0 input and of
whittle's lowered OpenQASM 2.0 output from the gate definitions (Cross, Bishop, Smolin, Gambetta 2017,
arXiv:1707.03429 for u3/qelib1; iswap, rxx and r as whittle documents them), and compares them up
to global phase. Nothing here uses whittle's simulator."""
import os
import random
import re
import subprocess
import sys
import tempfile

import numpy as np

WHITTLE = os.environ["WHITTLE_BIN"]
TARGETS = ["clifford+t", "cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r", "u+cx", "nct"]

I2 = np.eye(2)
X = np.array([[0, 1], [1, 0]], dtype=complex)
Y = np.array([[0, -1j], [1j, 0]])
Z = np.diag([1, -1]).astype(complex)
H = np.array([[1, 1], [1, -1]]) / np.sqrt(2)


def u3(t, p, l):
    return np.array([[np.cos(t / 2), -np.exp(1j * l) * np.sin(t / 2)],
                     [np.exp(1j * p) * np.sin(t / 2), np.exp(1j * (p + l)) * np.cos(t / 2)]])


def rz(t):
    return np.diag([np.exp(-1j * t / 2), np.exp(1j * t / 2)])


def rx(t):
    return np.cos(t / 2) * I2 - 1j * np.sin(t / 2) * X


def ry(t):
    return np.cos(t / 2) * I2 - 1j * np.sin(t / 2) * Y


def p1(t):
    return np.diag([1, np.exp(1j * t)])


ONE = {
    "h": lambda a: H, "x": lambda a: X, "y": lambda a: Y, "z": lambda a: Z,
    "s": lambda a: p1(np.pi / 2), "sdg": lambda a: p1(-np.pi / 2),
    "t": lambda a: p1(np.pi / 4), "tdg": lambda a: p1(-np.pi / 4),
    "sx": lambda a: np.array([[1 + 1j, 1 - 1j], [1 - 1j, 1 + 1j]]) / 2,
    "sxdg": lambda a: np.array([[1 - 1j, 1 + 1j], [1 + 1j, 1 - 1j]]) / 2,
    "rz": lambda a: rz(a[0]), "rx": lambda a: rx(a[0]), "ry": lambda a: ry(a[0]),
    "u1": lambda a: p1(a[0]), "u3": lambda a: u3(*a), "u": lambda a: u3(*a),
    # R(theta, phi) = exp(-i theta/2 (cos phi X + sin phi Y))
    "r": lambda a: np.cos(a[0] / 2) * I2 - 1j * np.sin(a[0] / 2) * (np.cos(a[1]) * X + np.sin(a[1]) * Y),
}
# Controlled forms: (number of controls, base one-qubit gate)
CONTROLLED = {"cx": (1, "x"), "ccx": (2, "x"), "c3x": (3, "x"), "c4x": (4, "x"), "cy": (1, "y"),
              "cz": (1, "z"), "ch": (1, "h"), "crz": (1, "rz"), "cu1": (1, "u1")}


def apply(state_u, n, mat, wires):
    """Left-multiplies the 2^n unitary by `mat` acting on `wires` (qubit k = bit k of the index)."""
    k = len(wires)
    dim = 1 << n
    full = np.zeros((dim, dim), dtype=complex)
    for col in range(dim):
        sub = 0
        for j, w in enumerate(wires):
            sub |= ((col >> w) & 1) << (k - 1 - j)
        rest = col
        for w in wires:
            rest &= ~(1 << w)
        for r in range(1 << k):
            amp = mat[r, sub]
            if amp == 0:
                continue
            row = rest
            for j, w in enumerate(wires):
                if (r >> (k - 1 - j)) & 1:
                    row |= 1 << w
            full[row, col] += amp
    return full @ state_u


def controlled(ncontrols, base):
    dim = 1 << (ncontrols + 1)
    m = np.eye(dim, dtype=complex)
    m[dim - 2:, dim - 2:] = base
    return m


def cu3(a):
    """qelib1.inc's cu3 body (arXiv:1707.03429): controlled Rz(phi) Ry(theta) Rz(lambda), i.e. the
    controlled u3 without its (phi+lambda)/2 phase."""
    t, p, l = a
    return controlled(1, np.exp(-1j * (p + l) / 2) * u3(t, p, l))


def two_qubit(name, a):
    if name == "cu3":
        return cu3(a)
    if name == "swap":
        return np.array([[1, 0, 0, 0], [0, 0, 1, 0], [0, 1, 0, 0], [0, 0, 0, 1]], dtype=complex)
    if name == "iswap":
        return np.array([[1, 0, 0, 0], [0, 0, 1j, 0], [0, 1j, 0, 0], [0, 0, 0, 1]])
    if name == "rxx":
        xx = np.kron(X, X)
        return np.cos(a[0] / 2) * np.eye(4) - 1j * np.sin(a[0] / 2) * xx
    if name == "cswap":
        m = np.eye(8, dtype=complex)
        m[5, 5] = m[6, 6] = 0
        m[5, 6] = m[6, 5] = 1
        return m
    return None


def angle(text):
    return float(eval(text, {"pi": np.pi, "__builtins__": {}}))


def unitary(qasm):
    """Unitary of a straight-line OpenQASM 2.0 program (gate definitions in the file are skipped:
    every gate is taken from the definitions above)."""
    regs, n = {}, 0
    body = re.sub(r"//[^\n]*", "", qasm)
    body = re.sub(r"gate\s+\w+[^{]*\{[^}]*\}", "", body)
    stmts = [s.strip() for s in body.split(";") if s.strip()]
    for s in stmts:
        m = re.match(r"qreg\s+(\w+)\[(\d+)\]", s)
        if m:
            regs[m.group(1)] = (n, int(m.group(2)))
            n += int(m.group(2))
    u = np.eye(1 << n, dtype=complex)
    for s in stmts:
        if re.match(r"(OPENQASM|include|qreg|creg|barrier|//)", s):
            continue
        m = re.match(r"(\w+)\s*(\(([^)]*)\))?\s+(.*)$", s, re.S)
        assert m, s
        name, args = m.group(1), [angle(x) for x in m.group(3).split(",")] if m.group(3) else []
        wires = []
        for w in m.group(4).split(","):
            r, i = re.match(r"\s*(\w+)\[(\d+)\]", w).groups()
            wires.append(regs[r][0] + int(i))
        if name in ONE:
            mat = ONE[name](args)
        elif name in CONTROLLED:
            k, base = CONTROLLED[name]
            mat = controlled(k, ONE[base](args))
        else:
            mat = two_qubit(name, args)
            assert mat is not None, "unknown gate " + name
        u = apply(u, n, mat, wires)
    return u, n


def distance(a, b):
    inner = np.trace(b.conj().T @ a)
    ph = inner / abs(inner) if abs(inner) > 1e-300 else 1
    return np.linalg.norm(a - ph * b) / np.sqrt(a.shape[0])


def allowed(target):
    return {
        "clifford+t": {"h", "s", "sdg", "t", "tdg", "x", "y", "z", "cx"},
        "cx+rz+sx": {"cx", "rz", "sx", "x"},
        "cz+rx+rz": {"cu1", "cz", "rx", "rz"},
        "iswap+rz+rx": {"iswap", "rz", "rx"},
        "xx+r": {"rxx", "r", "rz"},
        "u+cx": {"u3", "cx"},
        "nct": {"x", "cx", "ccx"},
    }[target]


def random_program(rng, n, target):
    lines = ["OPENQASM 2.0;", 'include "qelib1.inc";', "qreg yard[%d];" % n]
    clifford = target == "clifford+t"
    classical = target == "nct"
    for _ in range(14):
        w = rng.sample(range(n), 5)
        q = ["yard[%d]" % i for i in w]
        ang = "%d*pi/4" % rng.randint(1, 7) if clifford else "%.6f" % rng.uniform(-3, 3)
        if classical:
            kind = rng.choice(["x", "cx", "ccx", "c3x", "c4x", "cswap", "swap"])
        elif clifford:
            kind = rng.choice(["h", "t", "s", "cx", "ccx", "c3x", "c4x", "cswap", "cz", "ch", "swap", "rz"])
        else:
            kind = rng.choice(["h", "t", "cx", "ccx", "c3x", "c4x", "cswap", "cu1", "crz", "ch", "swap",
                               "rz", "rx", "ry", "u3", "cu3"])
        arity = {"ccx": 3, "c3x": 4, "c4x": 5, "cswap": 3, "cx": 2, "cz": 2, "ch": 2, "swap": 2, "cu1": 2,
                 "crz": 2, "cu3": 2}.get(kind, 1)
        params = ""
        if kind in ("rz", "rx", "ry", "cu1", "crz"):
            params = "(%s)" % ang
        if kind in ("u3", "cu3"):
            params = "(%s,%s,%s)" % (ang, ang, "0.3")
        lines.append("%s%s %s;" % (kind, params, ",".join(q[:arity])))
    return "\n".join(lines) + "\n"


def compile_to(src, target, tmp, metric="t"):
    path = os.path.join(tmp, "in.qasm")
    with open(path, "w") as f:
        f.write(src)
    out = subprocess.run([WHITTLE, "compile", path, "--target", target, "--emit", "qasm2", "-q",
                          "--optimize-for", metric], capture_output=True, text=True)
    if out.returncode != 0:
        raise RuntimeError("whittle failed on %s:\n%s\n%s" % (target, out.stderr, src))
    return out.stdout


def main():
    rng = random.Random(4)
    failures = 0
    checked = 0
    with tempfile.TemporaryDirectory() as tmp:
        # Every target under the default metric; the rotation targets also under 2q and depth,
        # whose construction choices differ (phase polynomials, AND trees).
        runs = [(t, "t") for t in TARGETS] + [(t, m) for t in ("cx+rz+sx", "u+cx") for m in ("2q", "depth")]
        for target, metric in runs:
            for trial in range(6 if metric == "t" else 4):
                src = random_program(rng, 6, target)
                ref, n = unitary(src)
                text = compile_to(src, target, tmp, metric)
                got, m = unitary(text)
                names = set(re.findall(r"^(?:if\([^)]*\)\s*)?(\w+)", re.sub(r"gate\s+\w+[^{]*\{[^}]*\}", "", text), re.M))
                names -= {"OPENQASM", "include", "qreg", "creg", "barrier", "measure"}
                bad = names - allowed(target)
                d = distance(ref, got) if m == n else 1.0
                checked += 1
                if bad or d > 1e-8:
                    failures += 1
                    print("FAIL %s --optimize-for %s trial %d: distance %g, gates outside the target %s"
                          % (target, metric, trial, d, sorted(bad)))
    print("checked %d lowered circuits, %d failures" % (checked, failures))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
