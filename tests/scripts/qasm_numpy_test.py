#!/usr/bin/python3
"""Independent numpy cross-check of OpenQASM import and export.

For each OpenQASM 2.0 file written here, numpy computes the unitary itself from the standard
header's gate bodies (built from the builtins U and CX only), then compares it, up to global phase,
with the unitary of `$WHITTLE_BIN compile X.qasm --emit qasm2` (read back with the same header) and
of `--emit qasm3` (read with textbook matrices for the stdgates.inc names), and of the 2.0 export of
the circuit lowered to each target.

Sources: OpenQASM 2.0 and its header qelib1.inc, Cross, Bishop, Smolin, Gambetta 2017,
arXiv:1707.03429 (U(theta,phi,lambda) = Rz(phi) Ry(theta) Rz(lambda), CX; the header bodies below
are written from memory, not re-read, and are themselves checked against textbook matrices first);
the gates added in later versions of the header (u, p, sx, sxdg, cp, crx, cry, csx, cu, rxx, rzz),
also from memory; OpenQASM 3.0, Cross et al. 2022, arXiv:2104.14722 (U is the u3 matrix with
e^{i(phi+lambda)/2}, ctrl/negctrl/inv modifiers, gphase; stdgates.inc names, matrices from memory:
Nielsen & Chuang ch. 4 conventions, rz(t) = exp(-i t/2 Z), p(l) = diag(1, e^{il})).
"""
import math
import os
import random
import re
import subprocess
import sys
import tempfile

import numpy as np

WHITTLE = os.environ.get("WHITTLE_BIN", "whittle")

QELIB1 = """
gate u3(theta,phi,lambda) q { U(theta,phi,lambda) q; }
gate u2(phi,lambda) q { U(pi/2,phi,lambda) q; }
gate u1(lambda) q { U(0,0,lambda) q; }
gate cx c,t { CX c,t; }
gate id a { U(0,0,0) a; }
gate u0(gamma) q { U(0,0,0) q; }
gate u(theta,phi,lambda) q { U(theta,phi,lambda) q; }
gate p(lambda) q { U(0,0,lambda) q; }
gate x a { u3(pi,0,pi) a; }
gate y a { u3(pi,pi/2,pi/2) a; }
gate z a { u1(pi) a; }
gate h a { u2(0,pi) a; }
gate s a { u1(pi/2) a; }
gate sdg a { u1(-pi/2) a; }
gate t a { u1(pi/4) a; }
gate tdg a { u1(-pi/4) a; }
gate sx a { sdg a; h a; sdg a; }
gate sxdg a { s a; h a; s a; }
gate rx(theta) a { u3(theta,-pi/2,pi/2) a; }
gate ry(theta) a { u3(theta,0,0) a; }
gate rz(phi) a { u1(phi) a; }
gate cz a,b { h b; cx a,b; h b; }
gate cy a,b { sdg b; cx a,b; s b; }
gate swap a,b { cx a,b; cx b,a; cx a,b; }
gate ch a,b { h b; sdg b; cx a,b; h b; t b; cx a,b; t b; h b; s b; x b; s a; }
gate ccx a,b,c { h c; cx b,c; tdg c; cx a,c; t c; cx b,c; tdg c; cx a,c; t b; t c; h c; cx a,b; t a; tdg b; cx a,b; }
gate cswap a,b,c { cx c,b; ccx a,b,c; cx c,b; }
gate crz(lambda) a,b { u1(lambda/2) b; cx a,b; u1(-lambda/2) b; cx a,b; }
gate cu1(lambda) a,b { u1(lambda/2) a; cx a,b; u1(-lambda/2) b; cx a,b; u1(lambda/2) b; }
gate cp(lambda) a,b { p(lambda/2) a; cx a,b; p(-lambda/2) b; cx a,b; p(lambda/2) b; }
gate cu3(theta,phi,lambda) c,t { u1((lambda-phi)/2) t; cx c,t; u3(-theta/2,0,-(phi+lambda)/2) t; cx c,t; u3(theta/2,phi,0) t; }
gate crx(lambda) a,b { u1(pi/2) b; cx a,b; u3(-lambda/2,0,0) b; cx a,b; u3(lambda/2,-pi/2,0) b; }
gate cry(lambda) a,b { ry(lambda/2) b; cx a,b; ry(-lambda/2) b; cx a,b; }
gate csx a,b { h b; cu1(pi/2) a,b; h b; }
gate cu(theta,phi,lambda,gamma) c,t { p(gamma) c; p((lambda+phi)/2) c; p((lambda-phi)/2) t; cx c,t; u(-theta/2,0,-(phi+lambda)/2) t; cx c,t; u(theta/2,phi,0) t; }
gate rxx(theta) a,b { u3(pi/2,theta,0) a; h b; cx a,b; u1(-theta) b; cx a,b; h b; u2(-pi,pi-theta) a; }
gate rzz(theta) a,b { cx a,b; u1(theta) b; cx a,b; }
"""

I2 = np.eye(2, dtype=complex)
X = np.array([[0, 1], [1, 0]], dtype=complex)
Y = np.array([[0, -1j], [1j, 0]], dtype=complex)
Z = np.diag([1, -1]).astype(complex)
H = np.array([[1, 1], [1, -1]], dtype=complex) / math.sqrt(2)
SX = np.array([[1 + 1j, 1 - 1j], [1 - 1j, 1 + 1j]]) / 2


def rz(t):
    return np.diag([np.exp(-0.5j * t), np.exp(0.5j * t)])


def ry(t):
    return np.array([[math.cos(t / 2), -math.sin(t / 2)], [math.sin(t / 2), math.cos(t / 2)]], dtype=complex)


def rx(t):
    return np.array([[math.cos(t / 2), -1j * math.sin(t / 2)], [-1j * math.sin(t / 2), math.cos(t / 2)]])


def u_qasm2(theta, phi, lam):
    """OpenQASM 2.0's builtin U: Rz(phi) Ry(theta) Rz(lambda) (arXiv:1707.03429)."""
    return rz(phi) @ ry(theta) @ rz(lam)


def u_qasm3(theta, phi, lam):
    """OpenQASM 3.0's builtin U: the u3 matrix (arXiv:2104.14722)."""
    c, s = math.cos(theta / 2), math.sin(theta / 2)
    return np.array([[c, -np.exp(1j * lam) * s], [np.exp(1j * phi) * s, np.exp(1j * (phi + lam)) * c]])


def controlled(m, k=1, negative=False):
    """k controls (the first k arguments) on matrix m; negative controls act on |0...0>."""
    d = m.shape[0]
    full = np.eye(d * 2**k, dtype=complex)
    block = 0 if negative else 2**k - 1
    full[block * d:(block + 1) * d, block * d:(block + 1) * d] = m
    return full


def mcx(k):
    return controlled(X, k)


# ---- a small OpenQASM reader (the subset the tests write and whittle emits) ----------------------

TOKEN = re.compile(r"\s*(?:(//[^\n]*)|(\d+\.\d*(?:[eE][-+]?\d+)?|\d*\.\d+(?:[eE][-+]?\d+)?|\d+(?:[eE][-+]?\d+)?)"
                   r"|([A-Za-z_][A-Za-z0-9_]*)|(\"[^\"]*\")|(->|==|[;,()\[\]{}+\-*/^@=]))")


def tokenize(text):
    out, pos = [], 0
    text = re.sub(r"/\*.*?\*/", " ", text, flags=re.S)
    while pos < len(text):
        m = TOKEN.match(text, pos)
        if not m:
            if text[pos:].strip() == "":
                break
            raise ValueError("cannot read %r" % text[pos:pos + 20])
        pos = m.end()
        if m.group(1):
            continue
        tok = next(g for g in m.groups()[1:] if g is not None)
        out.append(tok)
    return out


def eval_expr(tokens, env):
    """Evaluates with Python arithmetic; names get a prefix so `lambda` is not a Python keyword."""
    src = " ".join("v_" + t if re.match(r"[A-Za-z_]", t) else t for t in tokens).replace("^", "**")
    names = {"pi": math.pi, "sin": math.sin, "cos": math.cos, "tan": math.tan, "exp": math.exp,
             "ln": math.log, "sqrt": math.sqrt}
    names.update(env)
    return float(eval(src, {"__builtins__": {}}, {"v_" + k: v for k, v in names.items()}))


def split_args(tokens):
    """Split a token list at top-level commas."""
    parts, depth, cur = [], 0, []
    for t in tokens:
        if t in "([":
            depth += 1
        elif t in ")]":
            depth -= 1
        if t == "," and depth == 0:
            parts.append(cur)
            cur = []
        else:
            cur.append(t)
    if cur:
        parts.append(cur)
    return parts


class Reader:
    """Reads OpenQASM 2.0 (dialect 2: header bodies down to U and CX) or the 3.0 subset (dialect 3:
    textbook matrices for stdgates.inc names, ctrl/negctrl/inv modifiers, gphase)."""

    def __init__(self, dialect):
        self.dialect = dialect
        self.regs = {}  # name -> (first wire, size, scalar)
        self.n = 0
        self.gates = {}  # name -> (params, qubits, body statements)
        self.ops = []  # (matrix, wires)
        self.phase = 0.0

    def read(self, text):
        toks = tokenize(text)
        i = 0
        while i < len(toks):
            i = self.statement(toks, i)
        return self

    def statement(self, toks, i):
        t = toks[i]
        if t in ("OPENQASM", "include"):
            if t == "include" and toks[i + 1] == '"qelib1.inc"':
                self.read(QELIB1)
            return toks.index(";", i) + 1
        if t in ("qreg", "creg"):
            name, size = toks[i + 1], int(toks[i + 3])
            if t == "qreg":
                self.regs[name] = (self.n, size, False)
                self.n += size
            return toks.index(";", i) + 1
        if t in ("qubit", "bit"):
            if toks[i + 1] == "[":
                size, name = int(toks[i + 2]), toks[i + 4]
                scalar = False
            else:
                size, name, scalar = 1, toks[i + 1], True
            if t == "qubit":
                self.regs[name] = (self.n, size, scalar)
                self.n += size
            return toks.index(";", i) + 1
        if t == "gate":
            j = i + 2
            params = []
            if toks[j] == "(":
                k = toks.index(")", j)
                params = [p for p in toks[j + 1:k] if p != ","]
                j = k + 1
            k = toks.index("{", j)
            qubits = [q for q in toks[j:k] if q != ","]
            depth, e = 1, k + 1
            while depth:
                depth += {"{": 1, "}": -1}.get(toks[e], 0)
                e += 1
            body, s = [], k + 1
            while s < e - 1:
                f = toks.index(";", s)
                body.append(toks[s:f])
                s = f + 1
            self.gates[toks[i + 1]] = (params, qubits, body)
            return e
        j = toks.index(";", i)
        self.call(toks[i:j], {}, None)
        return j + 1

    def wires_of(self, arg, binding):
        if binding is not None:
            return [binding[arg[0]]]
        first, size, _ = self.regs[arg[0]]
        if len(arg) > 1:
            return [first + int(arg[2])]
        return list(range(first, first + size))

    def call(self, stmt, env, binding):
        if stmt[0] in ("barrier", "measure", "reset"):
            return
        if stmt[0] == "gphase":
            self.phase += eval_expr(stmt[2:-1], env)
            return
        mods = []
        while "@" in stmt:
            at = stmt.index("@")
            mods.append(stmt[:at])
            stmt = stmt[at + 1:]
        name, rest = stmt[0], stmt[1:]
        params = []
        if rest and rest[0] == "(":
            depth, k = 0, 0
            for k, t in enumerate(rest):
                depth += {"(": 1, ")": -1}.get(t, 0)
                if depth == 0:
                    break
            params = [eval_expr(p, env) for p in split_args(rest[1:k])]
            rest = rest[k + 1:]
        args = [self.wires_of(a, binding) for a in split_args(rest)]
        width = max(len(a) for a in args)
        for b in range(width):  # broadcasting over whole registers
            wires = [a[b] if len(a) > 1 else a[0] for a in args]
            self.apply(name, params, wires, mods)

    def apply(self, name, params, wires, mods):
        if mods:
            m = self.matrix(name, params, wires[len(wires) - self.arity(name):])
            nctl = 0
            for mod in reversed(mods):
                if mod[0] == "inv":
                    m = m.conj().T
                    continue
                k = int(mod[2]) if len(mod) > 1 else 1
                m = controlled(m, k, negative=mod[0] == "negctrl")
                nctl += k
            self.ops.append((m, wires))
            return
        if name in self.gates:
            pnames, qnames, body = self.gates[name]
            env = dict(zip(pnames, params))
            binding = dict(zip(qnames, wires))
            for st in body:
                self.call(st, env, binding)
            return
        self.ops.append((self.matrix(name, params, wires), wires))

    def arity(self, name):
        if name in self.gates:
            return len(self.gates[name][1])
        return int(math.log2(self.matrix(name, [0.1, 0.2, 0.3, 0.4], None).shape[0]))

    def matrix(self, name, p, wires):
        if name in self.gates:  # a defined gate under a modifier: its matrix on its own wires
            sub = Reader(self.dialect)
            sub.gates = self.gates
            sub.n = len(self.gates[name][1])
            sub.apply(name, p, list(range(sub.n)), [])
            return sub.unitary_msb_first()
        if name == "U":
            return u_qasm2(*p) if self.dialect == 2 else u_qasm3(*p)
        if name in ("CX",):
            return controlled(X)
        if name == "c3x":  # the header's body is not recalled: the textbook 3-controlled X
            return mcx(3)
        if name == "c4x":
            return mcx(4)
        if self.dialect == 2:
            raise KeyError("unknown gate " + name)
        table = {
            "x": lambda: X, "y": lambda: Y, "z": lambda: Z, "h": lambda: H,
            "s": lambda: np.diag([1, 1j]), "sdg": lambda: np.diag([1, -1j]),
            "t": lambda: np.diag([1, np.exp(0.25j * math.pi)]), "tdg": lambda: np.diag([1, np.exp(-0.25j * math.pi)]),
            "sx": lambda: SX, "rx": lambda: rx(p[0]), "ry": lambda: ry(p[0]), "rz": lambda: rz(p[0]),
            "p": lambda: np.diag([1, np.exp(1j * p[0])]),
            "cx": lambda: controlled(X), "cy": lambda: controlled(Y), "cz": lambda: controlled(Z),
            "ch": lambda: controlled(H), "cp": lambda: controlled(np.diag([1, np.exp(1j * p[0])])),
            "crx": lambda: controlled(rx(p[0])), "cry": lambda: controlled(ry(p[0])), "crz": lambda: controlled(rz(p[0])),
            "swap": lambda: np.eye(4)[[0, 2, 1, 3]].astype(complex), "ccx": lambda: mcx(2),
            "cswap": lambda: controlled(np.eye(4)[[0, 2, 1, 3]].astype(complex)),
            "cu": lambda: controlled(np.exp(1j * p[3]) * u_qasm3(p[0], p[1], p[2])),
        }
        return np.asarray(table[name](), dtype=complex)

    def unitary_msb_first(self):
        """The unitary with wire 0 as the most significant bit (for defined gates under modifiers)."""
        u = self.unitary()
        n = self.n
        perm = [int(format(i, "0%db" % n)[::-1], 2) if n else 0 for i in range(2**n)]
        return u[np.ix_(perm, perm)]

    def unitary(self):
        """Wire w is bit w of the basis index."""
        n = self.n
        u = np.eye(2**n, dtype=complex).reshape([2] * n + [2**n])
        for m, wires in self.ops:
            k = len(wires)
            g = m.reshape([2] * (2 * k))
            axes = [n - 1 - w for w in wires]
            u = np.tensordot(g, u, axes=(list(range(k, 2 * k)), axes))
            u = np.moveaxis(u, list(range(k)), axes)
        return np.exp(1j * self.phase) * u.reshape(2**n, 2**n)


def unitary(text, dialect):
    return Reader(dialect).read(text).unitary()


def distance_up_to_phase(a, b):
    if a.shape != b.shape:
        return float("inf")
    idx = np.unravel_index(np.argmax(np.abs(b)), b.shape)
    ratio = a[idx] / b[idx]
    if abs(ratio) < 1e-12:
        return float("inf")
    return float(np.max(np.abs(a - ratio / abs(ratio) * b)))


# ---- the checks ------------------------------------------------------------------------------------

passed = 0
failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL:", what)


def one_gate(text_call, n):
    return unitary('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[%d];\n%s\n' % (n, text_call), 2)


def msb(u):
    """Re-index a wire-0-is-bit-0 unitary so that wire 0 is the most significant bit."""
    n = int(math.log2(u.shape[0]))
    perm = [int(format(i, "0%db" % n)[::-1], 2) for i in range(2**n)]
    return u[np.ix_(perm, perm)]


def header_self_check():
    """The recalled header bodies against textbook matrices (first argument = most significant)."""
    cases = [
        ("x q[0];", 1, X), ("y q[0];", 1, Y), ("z q[0];", 1, Z), ("h q[0];", 1, H),
        ("s q[0];", 1, np.diag([1, 1j])), ("t q[0];", 1, np.diag([1, np.exp(0.25j * math.pi)])),
        ("sx q[0];", 1, SX), ("rx(0.7) q[0];", 1, rx(0.7)), ("ry(0.7) q[0];", 1, ry(0.7)), ("rz(0.7) q[0];", 1, rz(0.7)),
        ("cx q[0],q[1];", 2, controlled(X)), ("cz q[0],q[1];", 2, controlled(Z)), ("cy q[0],q[1];", 2, controlled(Y)),
        ("ch q[0],q[1];", 2, controlled(H)), ("swap q[0],q[1];", 2, np.eye(4)[[0, 2, 1, 3]]),
        ("ccx q[0],q[1],q[2];", 3, mcx(2)), ("cswap q[0],q[1],q[2];", 3, controlled(np.eye(4)[[0, 2, 1, 3]])),
        ("crz(0.9) q[0],q[1];", 2, controlled(rz(0.9))), ("cu1(0.9) q[0],q[1];", 2, controlled(np.diag([1, np.exp(0.9j)]))),
        ("crx(0.9) q[0],q[1];", 2, controlled(rx(0.9))), ("cry(0.9) q[0],q[1];", 2, controlled(ry(0.9))),
        ("cu3(0.9,0.3,-1.2) q[0],q[1];", 2, controlled(u_qasm2(0.9, 0.3, -1.2))),
        ("rzz(0.9) q[0],q[1];", 2, np.diag(np.exp(-0.45j * np.array([1, -1, -1, 1])))),
        ("rxx(0.9) q[0],q[1];", 2, math.cos(0.45) * np.eye(4) - 1j * math.sin(0.45) * np.kron(X, X)),
    ]
    for call, n, want in cases:
        got = msb(one_gate(call, n))
        check(distance_up_to_phase(got, np.asarray(want, dtype=complex)) < 1e-9, "header body of " + call)


def compile_with(path, emit, target=None):
    cmd = [WHITTLE, "compile", path, "--emit", emit] + (["--target", target] if target else [])
    r = subprocess.run(cmd, capture_output=True, text=True)
    return r.returncode, r.stdout, r.stderr


# Targets whose lowering is exact (no rotation approximation): every lowered circuit's OpenQASM 2.0
# export must read back, in numpy, as the input's unitary.
EXACT_TARGETS = ["cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r", "u+cx"]


def lowered(path, text, targets):
    ref = unitary(text, 2)
    for target in targets:
        code, out, err = compile_with(path, "qasm2", target)
        check(code == 0, "%s --target %s: exit %d: %s" % (path, target, code, err.strip()))
        if code == 0:
            d = distance_up_to_phase(unitary(out, 2), ref)
            check(d < 1e-8, "%s --target %s: qasm2 output differs by %g" % (path, target, d))


def round_trip(path, text, expect_qasm2=True):
    ref = unitary(text, 2)
    code, out, err = compile_with(path, "qasm2")
    if expect_qasm2:
        check(code == 0, "%s: --emit qasm2 exit %d: %s" % (path, code, err.strip()))
        if code == 0:
            d = distance_up_to_phase(unitary(out, 2), ref)
            check(d < 1e-8, "%s: qasm2 output differs by %g" % (path, d))
    else:
        check(code == 2 and "--target" in err, "%s: qasm2 refusal (exit %d: %s)" % (path, code, err.strip()))
    code, out, err = compile_with(path, "qasm3")
    check(code == 0, "%s: --emit qasm3 exit %d: %s" % (path, code, err.strip()))
    if code == 0:
        d = distance_up_to_phase(unitary(out, 3), ref)
        check(d < 1e-8, "%s: qasm3 output differs by %g" % (path, d))


HEADER_TOUR = """OPENQASM 2.0;
include "qelib1.inc";
// Harbor Logistics: every header gate once, on the crane (3) and berth (2) registers
qreg crane[3];
qreg berth[2];
u3(0.3,-1.1,2.5) crane[0]; u2(pi/4,-pi/8) crane[1]; u1(3*pi/4) crane[2]; cx crane[0],berth[1];
id berth[0]; u0(0.2) berth[0]; u(1,2,3) berth[0]; p(-pi/8) berth[1]; x crane[1]; y crane[2]; z berth[0];
h crane; s crane[0]; sdg crane[1]; t crane[2]; tdg berth[0]; sx berth[1]; sxdg crane[0];
rx(0.4) crane[1]; ry(-2.2) crane[2]; rz(5*pi/3) berth[0]; cz crane[0],crane[2]; cy berth[1],crane[0];
swap crane[1],berth[0]; ch crane[2],crane[1]; ccx berth[0],crane[2],crane[0]; cswap crane[1],berth[1],crane[2];
crz(-pi/2) crane[0],berth[0]; cu1(pi/8) berth[1],crane[1]; cp(1.3) crane[2],berth[1];
cu3(1.1,-0.3,2.9) berth[0],crane[2]; crx(7*pi/4) crane[1],berth[1]; cry(-3.5) berth[1],crane[0];
csx crane[0],crane[1]; cu(0.4,1.9,-2.1,0.6) crane[2],berth[0]; rxx(pi/3) crane[0],berth[1]; rzz(-0.8) berth[0],berth[1];
"""

BERTH_GATES = """OPENQASM 2.0;
include "qelib1.inc";
// Harbor Logistics: a berth comparator step written with parameterised user gates and broadcasting
gate ccx_like a, b { h b; cx a, b; tdg b; cx a, b; t b; h b; }
gate load_step(theta, k) a, b { crz(theta*k/2) a, b; u1(-theta/k^2) b; ccx_like a, b; }
gate compare(w) hi, lo, flag { load_step(w, 2) hi, flag; load_step(-w/3 + pi/4, 3) lo, flag; cswap flag, hi, lo; }
qreg ship[2];
qreg slot[2];
qreg alarm[1];
h ship;
cx ship, slot;
compare(pi/3) ship[0], slot[1], alarm[0];
compare(sqrt(2)*pi - ln(3)) slot[0], ship[1], alarm[0];
rzz(exp(0.5)) ship[1], slot[0];
"""

CRANE_CHECK = """OPENQASM 2.0;
include "qelib1.inc";
// Harbor Logistics: crane collision check, three-lane conflict flags a fourth wire
qreg lane[4];
qreg alarm[1];
h lane;
c3x lane[0], lane[1], lane[2], alarm[0];
c4x lane[0], lane[1], lane[2], lane[3], alarm[0];
cu1(pi/4) lane[3], alarm[0];
"""

CLIFFORD_T = """OPENQASM 2.0;
include "qelib1.inc";
// Harbor Logistics: a berth-occupancy check in gates that clifford+t takes without approximation
qreg berth[3];
qreg flag[1];
h berth;
ccx berth[0], berth[1], flag[0];
cswap flag[0], berth[1], berth[2];
cz berth[2], berth[0];
t berth[1]; s flag[0]; cx flag[0], berth[0]; tdg berth[2]; y berth[1];
ccx berth[2], flag[0], berth[1];
"""

CLASSICAL = """OPENQASM 2.0;
include "qelib1.inc";
// Harbor Logistics: a load counter step, reversible logic only (the nct target)
qreg load[3];
qreg carry[2];
x load[0];
ccx load[0], load[1], carry[0];
cx load[0], load[1];
ccx carry[0], load[2], carry[1];
cswap carry[1], load[0], load[2];
swap carry[0], load[1];
c3x load[0], load[1], load[2], carry[1];
"""

GATES_1Q = ["x", "y", "z", "h", "s", "sdg", "t", "tdg", "sx", "sxdg"]
GATES_1P = ["rx", "ry", "rz", "u1", "p"]
GATES_2Q = ["cx", "cz", "cy", "swap", "ch", "csx"]
GATES_2P = ["crz", "crx", "cry", "cu1", "cp", "rxx", "rzz"]


def random_angle(rng):
    if rng.random() < 0.5:
        return "%d*pi/%d" % (rng.randint(-12, 12), 2 ** rng.randint(0, 3))
    return repr(rng.uniform(-7, 7))


def random_program(seed):
    rng = random.Random(seed)
    lines = ['OPENQASM 2.0;', 'include "qelib1.inc";', "qreg yard[3];", "qreg gate_[1];"]
    wires = ["yard[0]", "yard[1]", "yard[2]", "gate_[0]"]
    for _ in range(30):
        w = rng.sample(wires, 3)
        kind = rng.randint(0, 6)
        if kind == 0:
            lines.append("%s %s;" % (rng.choice(GATES_1Q), w[0]))
        elif kind == 1:
            lines.append("%s(%s) %s;" % (rng.choice(GATES_1P), random_angle(rng), w[0]))
        elif kind == 2:
            lines.append("%s %s,%s;" % (rng.choice(GATES_2Q), w[0], w[1]))
        elif kind == 3:
            lines.append("%s(%s) %s,%s;" % (rng.choice(GATES_2P), random_angle(rng), w[0], w[1]))
        elif kind == 4:
            lines.append("%s %s,%s,%s;" % (rng.choice(["ccx", "cswap"]), w[0], w[1], w[2]))
        elif kind == 5:
            lines.append("u3(%s,%s,%s) %s;" % (random_angle(rng), random_angle(rng), random_angle(rng), w[0]))
        else:
            g = rng.choice(["cu3(%s,%s,%s)", "cu(%s,%s,%s,%s)"])
            args = tuple(random_angle(rng) for _ in range(g.count("%s")))
            lines.append("%s %s,%s;" % (g % args, w[0], w[1]))
    return "\n".join(lines) + "\n"


def main():
    header_self_check()
    with tempfile.TemporaryDirectory() as tmp:
        files = [("header_tour.qasm", HEADER_TOUR, True), ("berth_gates.qasm", BERTH_GATES, True),
                 ("crane_check.qasm", CRANE_CHECK, False)]
        files += [("random_%d.qasm" % k, random_program(1000 + k), True) for k in range(12)]
        for name, text, qasm2_ok in files:
            path = os.path.join(tmp, name)
            with open(path, "w") as f:
                f.write(text)
            round_trip(path, text, qasm2_ok)
            lowered(path, text, EXACT_TARGETS)
        for name, text, target in [("clifford_t.qasm", CLIFFORD_T, "clifford+t"), ("classical.qasm", CLASSICAL, "nct")]:
            path = os.path.join(tmp, name)
            with open(path, "w") as f:
                f.write(text)
            lowered(path, text, [target])
    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
