#!/usr/bin/python3
"""Differential test: random circuits rich in Toffoli pairs, compiled for every target and level,
each output checked by an independent numpy simulator (not the project's checker).

The generator writes each circuit as .wq text and, beside it, its meaning as a list of numpy
operations written here from textbook definitions (X-type gates flip the target when every control
literal holds; phase(θ) multiplies by e^{iθ} when the product holds, or by e^{iθ(x1 xor ...)} on a
parity; H, S, T, Rz(θ) = exp(-iθZ/2) as in Nielsen & Chuang ch. 4: common practice). It stresses what
relative-phase and measured-uncompute lowering rely on: compute/uncompute pairs with the controls in
either order, negative controls, shared controls, pair targets reused as controls, multi-controlled
ops and diagonal phases between the halves, nested and overlapping pairs, ops that disturb a pair's
wires between the halves (so the pair must not be treated as one), declared clean work wires used
inside `compute` blocks, work wires left idle or whose only use cancels (drop-idle-wires removes
them from the output), and `when` blocks.

Each circuit is compiled with `whittle compile` as a batch per (target, level, measurement)
configuration, emitted as OpenQASM 2.0 and simulated here with textbook matrices for the gates of
the 2.0 header (Cross, Bishop, Smolin, Gambetta 2017, arXiv:1707.03429; matrices from memory,
common practice) plus iswap, rxx and r (textbook definitions, common practice). The check: for random
input states on the data wires, with every clean work wire (declared or added by the compiler) at
|0>, every measurement branch of the output is proportional to the reference's output state with the
work wires back at |0> (up to a global phase per branch; a unitary output has one branch).

Beside them, Toffoli- and CCZ-rich networks for reduce-t (t_network_program) and phase networks
with H pairs, CZs and signed phases for zx-merge (teleport_program) are compiled for clifford+t at
-O2 and -O3, the levels that run them; those and networks with H gates between the Toffolis, on
their targets and on their controls (gadget_program), are also compiled there with
`--allow-measurement --gadget-wires 6`, where reduce-t may replace inner H gates by measured
Hadamard gadgets (the output then has measurements and conditioned corrections on fresh wires).

WHITTLE_DIFF_SEED picks the seed (default 1), WHITTLE_DIFF_CIRCUITS the number of circuits (default
80), WHITTLE_DIFF_T_CIRCUITS the number of T networks and of gadget networks and
WHITTLE_DIFF_ZX_CIRCUITS that of phase networks and WHITTLE_DIFF_R_CIRCUITS that of the CNOT-ladder
networks for rewrite-search (rule_program; compiled at every level of the rotation targets and at
-O3 with `--optimize-for 2q --rewrite-effort 3`) (default half of that each), and
WHITTLE_DIFF_B_CIRCUITS that of the three-wire block networks for resynth-3q (block_program; -O3 on
the rotation targets with `--optimize-for 2q --resynth-effort 1`; default an eighth), and
WHITTLE_DIFF_W_CIRCUITS that of the work-wire programs for split-work-lives and share-work-wires
(work_wire_program: many lives per clean wire, held constants; compiled like the random circuits;
default a fifth), and WHITTLE_DIFF_N_CIRCUITS that of the narrow programs compiled under
`--qubit-limit` set to their high-level qubit count (narrow_program: work-wire lives around ops with
3 to 5 controls; clifford+t and cx+rz+sx, and nct for classical ones, at -O2 and -O3; an output over
the limit is a failure, a located "no compile fits" is counted; default an eighth); a failure prints the .wq input, the configuration and a command that reproduces it.
"""
import math
import os
import random
import re
import shutil
import subprocess
import sys
import tempfile

import numpy as np

WHITTLE = os.environ.get("WHITTLE_BIN", "whittle")
SEED = int(os.environ.get("WHITTLE_DIFF_SEED", "1"))
CIRCUITS = int(os.environ.get("WHITTLE_DIFF_CIRCUITS", "80"))
T_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_T_CIRCUITS", str(max(1, CIRCUITS // 2))))
ZX_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_ZX_CIRCUITS", str(max(1, CIRCUITS // 2))))
R_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_R_CIRCUITS", str(max(1, CIRCUITS // 2))))
B_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_B_CIRCUITS", str(max(1, CIRCUITS // 8))))
W_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_W_CIRCUITS", str(max(1, CIRCUITS // 5))))
N_CIRCUITS = int(os.environ.get("WHITTLE_DIFF_N_CIRCUITS", str(max(1, CIRCUITS // 8))))
RULE_TARGETS = ["cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r"]
TARGETS = ["clifford+t", "cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r", "u+cx", "nct"]
LEVELS = ["-O0", "-O1", "-O2", "-O3"]
STATES = 3  # random input states per check


# ----------------------------------------------------------------------------------------------
# The generator: .wq text and the reference meaning, op by op.
#
# A reference op is one of
#   ("x", target, [(wire, polarity), ...])      target ^= AND of the literals
#   ("phase", theta, [(wire, polarity), ...])   e^{i theta} on the product (empty: global phase)
#   ("parity", theta, [wire, ...])              e^{i theta (x1 xor x2 ...)}
#   ("u1", matrix, wire, [(wire, polarity)...]) a one-qubit matrix under controls
#   ("swap", a, b)

H = np.array([[1, 1], [1, -1]], dtype=complex) / math.sqrt(2)
S = np.diag([1, 1j])
T = np.diag([1, np.exp(1j * math.pi / 4)])


def rz(t):
    return np.diag([np.exp(-0.5j * t), np.exp(0.5j * t)])


def ry(t):
    c, s = math.cos(t / 2), math.sin(t / 2)
    return np.array([[c, -s], [s, c]], dtype=complex)


class Program:
    def __init__(self, n_data, n_clean, classical):
        self.n_data, self.n_clean, self.classical = n_data, n_clean, classical
        self.lines = []
        self.ops = []

    def name(self, w):
        return f"q[{w}]" if w < self.n_data else f"w[{w - self.n_data}]"

    def lit(self, wire, pol):
        return ("" if pol else "!") + self.name(wire)

    def mcx(self, target, lits, ops=None, lines=None):
        (lines if lines is not None else self.lines).append(
            f"{self.name(target)} ^= " + " & ".join(self.lit(w, p) for w, p in lits) if lits else f"x {self.name(target)}")
        (ops if ops is not None else self.ops).append(("x", target, list(lits)))

    def text(self):
        head = f"qubit q[{self.n_data}]\n"
        if self.n_clean:
            head += f"ancilla w[{self.n_clean}]\n"
        return head + "\n".join(self.lines) + "\n"


def pick(rng, pool, k):
    return rng.sample(pool, k)


def lits_of(rng, wires, neg_rate=0.25):
    return [(w, rng.random() >= neg_rate) for w in wires]


def one_qubit_line(rng, prog, w, ops, lines):
    kind = "x" if prog.classical else rng.choice(["h", "s", "t", "~t", "~s", "rz", "x"])
    nm = prog.name(w)
    if kind == "h":
        lines.append(f"h {nm}")
        ops.append(("u1", H, w, []))
    elif kind == "s":
        lines.append(f"s {nm}")
        ops.append(("u1", S, w, []))
    elif kind == "~s":
        lines.append(f"~s {nm}")
        ops.append(("u1", S.conj().T, w, []))
    elif kind == "t":
        lines.append(f"t {nm}")
        ops.append(("u1", T, w, []))
    elif kind == "~t":
        lines.append(f"~t {nm}")
        ops.append(("u1", T.conj().T, w, []))
    elif kind == "x":
        lines.append(f"x {nm}")
        ops.append(("x", w, []))
    else:
        k = rng.choice([1, 3, 5, -1, -3, 7, 2])
        lines.append(f"rz({k}*pi/8) {nm}")
        ops.append(("u1", rz(k * math.pi / 8), w, []))


def quiet_middle(rng, prog, pair_wires, others, ops, lines):
    """Ops between two pair halves that leave the pair's wires' values alone: ops on other wires,
    ops using the pair's wires only as controls, diagonal phases on them."""
    for _ in range(rng.randint(0, 4)):
        r = rng.random()
        if r < 0.3 and others:
            one_qubit_line(rng, prog, rng.choice(others), ops, lines)
        elif r < 0.6 and others:
            tgt = rng.choice(others)
            pool = [w for w in pair_wires + others if w != tgt]
            k = min(len(pool), rng.choice([1, 2, 2, 3]))
            prog.mcx(tgt, lits_of(rng, pick(rng, pool, k)), ops, lines)
        elif prog.classical:
            continue
        elif r < 0.8:
            ws = pick(rng, pair_wires, rng.randint(1, min(3, len(pair_wires))))
            theta = rng.choice(["pi", "pi/2", "pi/4", "-pi/4", "3*pi/4"])
            lit = lits_of(rng, ws)
            lines.append(f"phase({theta}) " + " & ".join(prog.lit(w, p) for w, p in lit))
            ops.append(("phase", eval(theta.replace("pi", "math.pi")), lit))
        else:
            ws = pick(rng, pair_wires + others, min(len(pair_wires + others), rng.randint(1, 3)))
            theta = rng.choice(["pi/4", "-pi/4", "pi/2"])
            lines.append(f"phase({theta}) " + " ^ ".join(prog.name(w) for w in ws))
            ops.append(("parity", eval(theta.replace("pi", "math.pi")), list(ws)))


def toffoli_pair(rng, prog, wires):
    """A Toffoli or MCX, a middle, and the same op again with its controls in any order (the pair a
    compiler may lower with relative phases). Sometimes the middle disturbs a pair wire."""
    k = rng.choice([2, 2, 2, 3])
    chosen = pick(rng, wires, k + 1)
    target, ctrls = chosen[0], chosen[1:]
    lits = lits_of(rng, ctrls)
    prog.mcx(target, lits)
    others = [w for w in wires if w not in chosen]
    quiet_middle(rng, prog, chosen, others, prog.ops, prog.lines)
    if rng.random() < 0.15:  # a middle op that does disturb a pair wire: no longer a pair
        one_qubit_line(rng, prog, rng.choice(chosen), prog.ops, prog.lines)
    if rng.random() < 0.3:  # a nested pair that uses the outer target as a control
        inner_pool = [w for w in wires if w not in ctrls]
        if len(inner_pool) >= 3:
            it = rng.choice([w for w in inner_pool if w != target])
            ic = [target] + pick(rng, [w for w in inner_pool if w not in (target, it)], 1)
            il = lits_of(rng, ic)
            prog.mcx(it, il)
            quiet_middle(rng, prog, [it] + ic, [w for w in wires if w not in [it] + ic], prog.ops, prog.lines)
            rng.shuffle(il)
            prog.mcx(it, il)
    shuffled = list(lits)
    rng.shuffle(shuffled)
    prog.mcx(target, shuffled)


def compute_block(rng, prog, data):
    """compute { w ^= ... } then { ... } on a declared clean wire: the frontend keeps the pairing."""
    w = prog.n_data + rng.randrange(prog.n_clean)
    ctrls = pick(rng, data, rng.choice([2, 2, 3]))
    lits = lits_of(rng, ctrls)
    a_ops, a_lines = [], []
    prog.mcx(w, lits, a_ops, a_lines)
    b_ops, b_lines = [], []
    # The middle may read the compute's controls but not write them (else w would not come back).
    free = [d for d in data if d not in ctrls]
    tgt = rng.choice(free)
    pool = [x for x in data if x != tgt]
    prog.mcx(tgt, [(w, True)] + lits_of(rng, pick(rng, pool, rng.choice([0, 1]))), b_ops, b_lines)
    if rng.random() < 0.5 and not prog.classical:
        d = rng.choice(data)
        b_lines.append(f"phase(pi) {prog.name(w)} & {prog.name(d)}")
        b_ops.append(("phase", math.pi, [(w, True), (d, True)]))
    prog.lines.append("compute { " + "; ".join(a_lines) + " } then { " + "; ".join(b_lines) + " }")
    prog.ops += a_ops + b_ops + list(reversed(a_ops))


def when_block(rng, prog, data):
    c = rng.choice(data)
    others = [d for d in data if d != c]
    t = rng.choice(others)
    kind = rng.choice(["h", "t", "ry"])
    pol = rng.random() < 0.8
    if kind == "h":
        prog.lines.append(f"when {prog.lit(c, pol)} {{ h {prog.name(t)} }}")
        prog.ops.append(("u1", H, t, [(c, pol)]))
    elif kind == "t":
        prog.lines.append(f"when {prog.lit(c, pol)} {{ t {prog.name(t)} }}")
        prog.ops.append(("u1", T, t, [(c, pol)]))
    else:
        prog.lines.append(f"when {prog.lit(c, pol)} {{ ry(pi/4) {prog.name(t)} }}")
        prog.ops.append(("u1", ry(math.pi / 4), t, [(c, pol)]))


def reported_programs():
    """The two inputs of the trust issue that were compiled wrong with exit 0 (as .wq): a Toffoli pair
    whose uncompute writes the controls the other way round, and a Toffoli before a 3-control X on
    its target (the construction's own Toffolis then form such a pair)."""
    a = Program(4, 0, False)
    a.mcx(2, [(0, True), (1, True)])
    a.mcx(3, [(2, True)])
    a.mcx(2, [(1, True), (0, True)])
    b = Program(7, 0, False)
    b.mcx(5, [(2, True), (4, True)])
    b.mcx(5, [(0, True), (4, True), (1, True)])
    return [a, b]


def t_network_program(rng):
    """For reduce-t (tcount/): Toffoli- and CCZ-rich networks on few wires. A few product wires take
    stretches of Toffolis (the H-framed form the lowering gives them) with CNOTs, X and Z between
    them (what the frame exchange turns around), controls shared between many Toffolis and used as
    targets now and then, CCZ and controlled-S phases, T and S gates, parities, an occasional H or
    rotation that ends a Hadamard-free region in the middle."""
    n = rng.randint(4, 8)
    prog = Program(n, 0, False)
    data = list(range(n))
    products = pick(rng, data, rng.choice([1, 2, 2, 3]))
    # One in three is shaped like a GF(2^n) multiplier: Toffolis from the other wires into the
    # product wires and only CNOT, X and Z among the product wires between the stretches.
    factors = [w for w in data if w not in products]
    multiplier = rng.random() < 0.35 and len(products) >= 2 and len(factors) >= 2
    for _ in range(rng.randint(5, 16)):
        r = rng.random()
        if multiplier:
            r = 0.0 if r < 0.6 else 0.7
        if r < 0.4:  # a stretch of Toffolis into one product wire
            t = rng.choice(products if rng.random() < 0.85 or multiplier else data)
            for _ in range(rng.randint(1, 4)):
                c = pick(rng, factors if multiplier else [w for w in data if w != t], 2)
                prog.mcx(t, lits_of(rng, c, neg_rate=0.0 if multiplier else 0.1))
        elif r < 0.55:
            ws = pick(rng, data, 3)
            lit = lits_of(rng, ws, neg_rate=0.1)
            prog.lines.append("phase(pi) " + " & ".join(prog.lit(w, p) for w, p in lit))
            prog.ops.append(("phase", math.pi, lit))
        elif r < 0.62:
            ws = pick(rng, data, 2)
            theta = rng.choice(["pi/2", "-pi/2", "pi"])
            lit = lits_of(rng, ws, neg_rate=0.1)
            prog.lines.append(f"phase({theta}) " + " & ".join(prog.lit(w, p) for w, p in lit))
            prog.ops.append(("phase", eval(theta.replace("pi", "math.pi")), lit))
        elif r < 0.8:  # CNOTs between product wires (or from anywhere into one), X or Z on one
            a = rng.choice(products)
            b = rng.choice([w for w in (products if len(products) > 1 else data) if w != a])
            if rng.random() < 0.7:
                prog.mcx(b, [(a, True)])
            elif rng.random() < 0.5:
                prog.mcx(a, [])
            else:
                prog.lines.append(f"z {prog.name(a)}")
                prog.ops.append(("phase", math.pi, [(a, True)]))
        elif r < 0.9:
            ws = pick(rng, data, rng.randint(1, 3))
            theta = rng.choice(["pi/4", "-pi/4", "3*pi/4", "pi/2"])
            lines = " ^ ".join(prog.name(w) for w in ws)
            prog.lines.append(f"phase({theta}) {lines}")
            prog.ops.append(("parity", eval(theta.replace("pi", "math.pi")), list(ws)))
        else:
            one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
    return prog


def dense_phase_program(rng):
    """For reduce-t's TOHPE (tcount/tohpe.cpp): half of them multiplier-shaped Toffoli networks on 9
    or 12 wires (below), the others one Hadamard-free region on 5-7 wires with more odd
    phase terms than the n(n+1)/2 rows of its elimination (so its kernel is not empty and TOHPE
    steps and plateau moves happen): T-type phases on random parities and single wires, CNOTs and X
    between them, S-type phases and CZ, and an H on a wire at the start or the end now and then."""
    if rng.random() < 0.5:
        # Shaped like a GF(2^k) multiplier (k = 3, 4: 9 or 12 wires), where TOHPE's lists win over
        # TODD's: Toffolis a_i b_j -> c_l for most pairs, CNOTs among the c wires between them.
        k = rng.choice([3, 4])
        prog = Program(3 * k, 0, False)
        for _ in range(rng.randint(k * k, k * k + 6)):
            if rng.random() < 0.8:
                prog.mcx(2 * k + rng.randrange(k), [(rng.randrange(k), True), (k + rng.randrange(k), True)])
            else:
                a, b = pick(rng, list(range(2 * k, 3 * k)), 2)
                prog.mcx(b, [(a, True)])
        return prog
    n = rng.randint(5, 7)
    prog = Program(n, 0, False)
    data = list(range(n))
    if rng.random() < 0.3:
        one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
    for _ in range(rng.randint(n * (n + 1) // 2 + 2, n * (n + 1) // 2 + 20)):
        r = rng.random()
        if r < 0.6:  # an odd multiple of pi/4 on a parity of 1-4 wires
            ws = pick(rng, data, rng.randint(1, 4))
            theta = rng.choice(["pi/4", "-pi/4", "3*pi/4", "-3*pi/4"])
            prog.lines.append(f"phase({theta}) " + " ^ ".join(prog.name(w) for w in ws))
            prog.ops.append(("parity", eval(theta.replace("pi", "math.pi")), list(ws)))
        elif r < 0.8:
            a, b = pick(rng, data, 2)
            prog.mcx(b, [(a, rng.random() < 0.9)])
        elif r < 0.87:
            prog.mcx(rng.choice(data), [])
        else:
            ws = pick(rng, data, rng.randint(1, 2))
            theta = rng.choice(["pi/2", "pi"])
            lit = lits_of(rng, ws, neg_rate=0.1)
            prog.lines.append(f"phase({theta}) " + " & ".join(prog.lit(w, p) for w, p in lit))
            prog.ops.append(("phase", eval(theta.replace("pi", "math.pi")), lit))
    if rng.random() < 0.3:
        one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
    return prog


def gadget_program(rng):
    """For reduce-t's Hadamard gadgets: Toffolis on 3-6 wires with H gates between them on their
    targets and on their controls, negative controls, CNOTs (some on negative controls), T, S and
    their inverses and parities around the H gates (so each gadget's correction has T terms to push
    through), and CCZ phases."""
    n = rng.randint(3, 6)
    prog = Program(n, 0, False)
    data = list(range(n))
    for _ in range(rng.randint(5, 14)):
        r = rng.random()
        if r < 0.3:
            ws = pick(rng, data, 3)
            prog.mcx(ws[0], lits_of(rng, ws[1:], neg_rate=0.3))
        elif r < 0.5:
            w = rng.choice(data)
            prog.lines.append(f"h {prog.name(w)}")
            prog.ops.append(("u1", H, w, []))
        elif r < 0.65:
            a, b = pick(rng, data, 2)
            prog.mcx(b, [(a, rng.random() < 0.8)])
        elif r < 0.82:
            w = rng.choice(data)
            kind = rng.choice(["t", "~t", "s", "~s"])
            m = {"t": T, "~t": T.conj().T, "s": S, "~s": S.conj().T}[kind]
            prog.lines.append(f"{kind} {prog.name(w)}")
            prog.ops.append(("u1", m, w, []))
        elif r < 0.92:
            ws = pick(rng, data, rng.randint(2, min(3, n)))
            theta = rng.choice(["pi/4", "-pi/4", "3*pi/4"])
            prog.lines.append(f"phase({theta}) " + " ^ ".join(prog.name(w) for w in ws))
            prog.ops.append(("parity", eval(theta.replace("pi", "math.pi")), list(ws)))
        else:
            lit = lits_of(rng, pick(rng, data, 3), neg_rate=0.2)
            prog.lines.append("phase(pi) " + " & ".join(prog.lit(w, p) for w, p in lit))
            prog.ops.append(("phase", math.pi, lit))
    return prog


def teleport_program(rng):
    """For zx-merge (phase teleportation, zx/): one-wire T, T-dagger and S phases (on negative
    literals too, and right after X gates, so merged phases carry signs) on parities that CNOT
    stretches compute and later undo, with H pairs, H-CZ-H and CZ between them (what the ZX
    diagram's identity removal, local complementation and pivots see through), occasional Toffolis
    and lone H gates that make the merge depend on path variables, and a clean work wire that a
    parity is computed into and uncomputed from."""
    n = rng.randint(3, 6)
    prog = Program(n, rng.choice([0, 1]), False)
    data = list(range(n))
    wires = list(range(n + prog.n_clean))
    angles = [("t", T), ("~t", T.conj().T), ("s", S)]
    def phase_on(w, neg=False):
        name, m = rng.choice(angles)
        if neg:  # a phase on the negative literal: e^{i a (1 - w)}
            a = {"t": "pi/4", "~t": "-pi/4", "s": "pi/2"}[name]
            prog.lines.append(f"phase({a}) !{prog.name(w)}")
            prog.ops.append(("phase", eval(a.replace("pi", "math.pi")), [(w, False)]))
            return
        prog.lines.append(f"{name} {prog.name(w)}")
        prog.ops.append(("u1", m, w, []))
    for _ in range(rng.randint(6, 18)):
        r = rng.random()
        if r < 0.3:  # a parity computed into one wire, a phase on it, undone (sometimes later)
            t = rng.choice(wires)
            srcs = pick(rng, [w for w in data if w != t], rng.randint(1, min(3, n - 1)))
            for c in srcs:
                prog.mcx(t, [(c, True)])
            phase_on(t, rng.random() < 0.2)
            if t >= n or rng.random() < 0.7:  # a clean work wire is always given back
                for c in reversed(srcs):
                    prog.mcx(t, [(c, True)])
        elif r < 0.45:
            phase_on(rng.choice(data), rng.random() < 0.3)
        elif r < 0.55:  # H H: the identity, but a wall for folding without path variables
            w = rng.choice(data)
            for _ in range(2):
                prog.lines.append(f"h {prog.name(w)}")
                prog.ops.append(("u1", H, w, []))
        elif r < 0.65:  # a CZ, or a CNOT written as H CZ H
            a, b = pick(rng, data, 2)
            hz = rng.random() < 0.5
            if hz:
                prog.lines.append(f"h {prog.name(b)}")
                prog.ops.append(("u1", H, b, []))
            prog.lines.append(f"phase(pi) {prog.name(a)} & {prog.name(b)}")
            prog.ops.append(("phase", math.pi, [(a, True), (b, True)]))
            if hz:
                prog.lines.append(f"h {prog.name(b)}")
                prog.ops.append(("u1", H, b, []))
        elif r < 0.75:
            prog.mcx(rng.choice(data), [])
        elif r < 0.85:
            t = rng.choice(data)
            prog.mcx(t, lits_of(rng, pick(rng, [w for w in data if w != t], 2), neg_rate=0.1))
        else:
            w = rng.choice(data)
            prog.lines.append(f"h {prog.name(w)}")
            prog.ops.append(("u1", H, w, []))
    return prog


def rule_program(rng):
    """For rewrite-search (the identity libraries, rules/library): CNOT ladders on 3-5 wires that
    compute, reuse and undo parities (three-wire CNOT rules), Rz rotations by generic angles on
    controls and targets (commuting with some CNOTs, not others: matches across commuting gates),
    sqrt(X)-like H/S pairs and X gates between them, and CZs written as phases, so that after
    lowering to a rotation target the search has rules to apply and rotations to carry through."""
    n = rng.randint(3, 5)
    prog = Program(n, 0, False)
    data = list(range(n))
    for _ in range(rng.randint(8, 24)):
        r = rng.random()
        if r < 0.4:  # a short ladder, sometimes undone in the other order
            ws = pick(rng, data, rng.randint(2, min(3, n)))
            pairs = [(ws[i], ws[i + 1]) for i in range(len(ws) - 1)]
            for c, t in pairs:
                prog.mcx(t, [(c, True)])
            if rng.random() < 0.5:
                for c, t in reversed(pairs):
                    prog.mcx(t, [(c, True)])
        elif r < 0.65:
            w = rng.choice(data)
            k = rng.choice([1, 3, 5, -1, -3, 7, 2, 11])
            prog.lines.append(f"rz({k}*pi/12) {prog.name(w)}")
            prog.ops.append(("u1", rz(k * math.pi / 12), w, []))
        elif r < 0.75:
            a, b = pick(rng, data, 2)
            prog.lines.append(f"phase(pi) {prog.name(a)} & {prog.name(b)}")
            prog.ops.append(("phase", math.pi, [(a, True), (b, True)]))
        elif r < 0.85:
            one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
        else:
            t = rng.choice(data)
            c = rng.choice([w for w in data if w != t])
            prog.mcx(t, [(c, True)])
    return prog


def block_program(rng):
    """For resynth-3q (numerical three-wire block synthesis): Toffolis on three shared wires in every
    control order, CNOTs between their wires that make neighbouring Toffolis partly cancel,
    controlled phases by generic angles (controlled rotations) and doubly controlled ones, and a
    few one-qubit gates: blocks with many entanglers whose unitary needs fewer, where a wrong
    synthesized circuit (wire order, phase, a snapped angle) would show."""
    n = rng.randint(3, 4)
    prog = Program(n, 0, False)
    data = list(range(n))
    for _ in range(rng.randint(4, 10)):
        r = rng.random()
        ws = pick(rng, data, 3)
        if r < 0.4:
            prog.mcx(ws[2], [(ws[0], True), (ws[1], rng.random() < 0.8)])
        elif r < 0.6:
            t = rng.choice(ws)
            prog.mcx(t, [(rng.choice([w for w in ws if w != t]), True)])
        elif r < 0.8:
            k = rng.choice([1, 3, 5, -1, 7, 11])
            lits = [(w, True) for w in ws[:rng.randint(2, 3)]]
            prog.lines.append(f"phase({k}*pi/12) " + " & ".join(prog.name(w) for w, _ in lits))
            prog.ops.append(("phase", k * math.pi / 12, lits))
        else:
            one_qubit_line(rng, prog, rng.choice(ws), prog.ops, prog.lines)
    return prog


def work_wire_program(rng):
    """For split-work-lives and share-work-wires: several clean work wires, each with many lives one
    after another. Lives written by hand (w ^= a & b ... w ^= b & a, negative controls, an XOR of a
    parity and a product), compute blocks, a life whose controls change between its halves so the
    wire is not back at |0> after the second half (w then holds another product, undone later: a
    split there would be wrong), constants loaded with X and held idle over many ops (which
    split-work-lives may unload and reload), and data ops controlled by live work wires between the
    halves. Every work wire ends at |0>."""
    classical = rng.random() < 0.3
    n_data = rng.randint(4, 6)
    n_clean = rng.randint(2, 4)
    prog = Program(n_data, n_clean, classical)
    data = list(range(n_data))
    work = [n_data + i for i in range(n_clean)]
    loaded = []

    def middle(live):
        for _ in range(rng.randint(1, 4)):
            r = rng.random()
            free = [d for d in data if d not in live]
            if r < 0.6 and free:
                tgt = rng.choice(free)
                ctl = sorted(set(live + loaded + data) - {tgt})
                prog.mcx(tgt, lits_of(rng, pick(rng, ctl, min(len(ctl), rng.choice([1, 2])))))
            elif free:
                one_qubit_line(rng, prog, rng.choice(free), prog.ops, prog.lines)

    for _ in range(rng.randint(5, 12)):
        idle = [w for w in work if w not in loaded]
        r = rng.random()
        if r < 0.3 and idle:  # a product life, the halves' controls in any order
            w = rng.choice(idle)
            ctrls = pick(rng, data, rng.choice([1, 2, 2, 3]))
            lits = lits_of(rng, ctrls)
            prog.mcx(w, lits)
            middle([w] + ctrls)
            lits2 = list(lits)
            rng.shuffle(lits2)
            prog.mcx(w, lits2)
        elif r < 0.45 and idle:  # an ANF value: a parity plus a product, undone in the other order
            w = rng.choice(idle)
            a, b, c = pick(rng, data, 3)
            prod = [(b, True), (c, rng.random() < 0.7)]
            prog.mcx(w, [(a, True)])
            prog.mcx(w, prod)
            middle([w, a, b, c])
            prog.mcx(w, list(reversed(prod)))
            prog.mcx(w, [(a, True)])
        elif r < 0.6 and idle:  # controls changed between the halves: w holds c & b, undone later
            w = rng.choice(idle)
            a, b, c = pick(rng, data, 3)
            prog.mcx(w, [(a, True), (b, True)])
            prog.mcx(a, [(c, True)])
            middle([w, a, b, c])
            prog.mcx(w, [(b, True), (a, True)])
            prog.mcx(a, [(c, True)])
            middle([w, a, b, c])
            prog.mcx(w, [(c, True), (b, True)])
        elif r < 0.7 and idle and n_clean:  # a compute block on a work wire
            compute_block(rng, prog, data)
        elif r < 0.8 and idle:  # a constant loaded and held
            w = rng.choice(idle)
            prog.mcx(w, [])
            loaded.append(w)
        elif loaded and r < 0.9:  # a constant unloaded after many ops
            for _ in range(rng.randint(4, 10)):
                middle([])
            w = loaded.pop(rng.randrange(len(loaded)))
            prog.mcx(w, [])
        else:
            middle([])
    for w in loaded:
        prog.mcx(w, [])
    return prog


def narrow_program(rng):
    """For --qubit-limit (lower-controls taking work wires only inside their lives, reduce-t undoing
    a rebuild that lifts the peak): clean work wires with several lives each, and between them
    multi-controlled ops (3 to 5 controls, either polarity, on data wires, some controlled by a live
    work wire) whose constructions want clean wires, where a clean wire outside its life would add a
    qubit. Compiled with the limit set to the peak the high-level compile reaches."""
    classical = rng.random() < 0.3
    n_data = rng.randint(5, 7)
    n_clean = rng.randint(2, 3)
    prog = Program(n_data, n_clean, classical)
    data = list(range(n_data))
    work = [n_data + i for i in range(n_clean)]

    def wide_op(live):
        tgt = rng.choice(data)
        pool = sorted(set(data + live) - {tgt})
        lits = lits_of(rng, pick(rng, pool, min(len(pool), rng.randint(3, 5))))
        if not classical and rng.random() < 0.3:
            k = rng.choice([1, 2, 3, -1, 5])
            prog.lines.append(f"phase({k}*pi/4) " + " & ".join(prog.lit(w, p) for w, p in lits + [(tgt, True)]))
            prog.ops.append(("phase", k * math.pi / 4, list(lits) + [(tgt, True)]))
        else:
            prog.mcx(tgt, lits)

    for _ in range(rng.randint(3, 6)):
        r = rng.random()
        if r < 0.5:  # a product life with wide ops inside it
            w = rng.choice(work)
            ctrls = pick(rng, data, 2)
            lits = lits_of(rng, ctrls)
            prog.mcx(w, lits)
            for _ in range(rng.randint(1, 2)):
                wide = [w]
                tgt_pool = [d for d in data if d not in ctrls]
                tgt = rng.choice(tgt_pool)
                pool = sorted(set(data + wide) - {tgt})
                prog.mcx(tgt, lits_of(rng, pick(rng, pool, min(len(pool), rng.randint(3, 4)))))
            lits2 = list(lits)
            rng.shuffle(lits2)
            prog.mcx(w, lits2)
        elif r < 0.8:
            wide_op([])
        else:
            one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
    return prog


def random_program(rng, classical):
    """A random program; a classical one (X-type ops only) is one the nct target can take too."""
    n_data = rng.randint(4, 7)
    n_clean = rng.choice([0, 0, 1, 2])
    prog = Program(n_data, n_clean, classical)
    data = list(range(n_data))
    for _ in range(rng.randint(3, 9)):
        r = rng.random()
        if r < 0.45:
            toffoli_pair(rng, prog, data)
        elif r < 0.6 and n_clean:
            compute_block(rng, prog, data)
        elif r < 0.7 and not classical:
            when_block(rng, prog, data)
        elif r < 0.85:
            one_qubit_line(rng, prog, rng.choice(data), prog.ops, prog.lines)
        elif r < 0.95:
            k = rng.choice([1, 2, 3, 4])
            ws = pick(rng, data, min(n_data, k + 1))
            prog.mcx(ws[0], lits_of(rng, ws[1:]))
        else:
            a, b = pick(rng, data, 2)
            prog.lines.append(f"{prog.name(a)} <-> {prog.name(b)}")
            prog.ops.append(("swap", a, b))
    if n_clean and rng.random() < 0.4:
        # A work wire whose only use cancels (drop-idle-wires then removes it from the output,
        # and the check must still find every other wire where it belongs).
        w = n_data + rng.randrange(n_clean)
        lits = lits_of(rng, pick(rng, data, 2))
        prog.mcx(w, lits)
        prog.mcx(w, lits)
    return prog


# ----------------------------------------------------------------------------------------------
# State-vector simulation on a batch of states: psi has shape (2,)*n + (K,); wire i is axis i.

def apply_1q(psi, m, w, ctrls):
    n = psi.ndim - 1
    if not ctrls:
        return np.moveaxis(np.tensordot(m, psi, axes=([1], [w])), 0, w)
    idx = [slice(None)] * (n + 1)
    for c, pol in ctrls:
        idx[c] = 1 if pol else 0
    sub = psi[tuple(idx)]
    # the target's axis inside the sub-array: count the removed axes before it
    tw = w - sum(1 for c, _ in ctrls if c < w)
    out = psi.copy()
    out[tuple(idx)] = np.moveaxis(np.tensordot(m, sub, axes=([1], [tw])), 0, tw)
    return out


def mask(n, lits, k):
    shape = [1] * n + [1]
    m = np.ones([2] * n + [1], dtype=bool)
    for w, pol in lits:
        sel = np.zeros(2, dtype=bool)
        sel[1 if pol else 0] = True
        s = list(shape)
        s[w] = 2
        m = m & sel.reshape(s)
    return m


X = np.array([[0, 1], [1, 0]], dtype=complex)


def apply_ref(psi, op):
    n = psi.ndim - 1
    kind = op[0]
    if kind == "x":
        return apply_1q(psi, X, op[1], op[2])
    if kind == "phase":
        return np.where(mask(n, op[2], 1), psi * np.exp(1j * op[1]), psi)
    if kind == "parity":
        par = np.zeros([2] * n + [1], dtype=int)
        for w in op[2]:
            s = [1] * (n + 1)
            s[w] = 2
            par = par ^ np.arange(2).reshape(s)
        return psi * np.exp(1j * op[1] * par)
    if kind == "u1":
        return apply_1q(psi, op[1], op[2], op[3])
    if kind == "swap":
        return np.swapaxes(psi, op[1], op[2]).copy()
    raise ValueError(kind)


# ----------------------------------------------------------------------------------------------
# OpenQASM 2.0 output: registers, gates, measure, if.

def u3(theta, phi, lam):
    return np.array([[math.cos(theta / 2), -np.exp(1j * lam) * math.sin(theta / 2)],
                     [np.exp(1j * phi) * math.sin(theta / 2), np.exp(1j * (phi + lam)) * math.cos(theta / 2)]])


def rx(t):
    c, s = math.cos(t / 2), math.sin(t / 2)
    return np.array([[c, -1j * s], [-1j * s, c]])


def r_gate(theta, phi):
    # R(θ, φ) = exp(-iθ/2 (cos φ X + sin φ Y)) (common practice for trapped-ion native rotations)
    c, s = math.cos(theta / 2), math.sin(theta / 2)
    return np.array([[c, -1j * np.exp(-1j * phi) * s], [-1j * np.exp(1j * phi) * s, c]])


ONE_QUBIT = {
    "h": lambda: H, "x": lambda: X, "y": lambda: np.array([[0, -1j], [1j, 0]]), "z": lambda: np.diag([1, -1]),
    "s": lambda: S, "sdg": lambda: S.conj().T, "t": lambda: T, "tdg": lambda: T.conj().T,
    "sx": lambda: np.array([[1 + 1j, 1 - 1j], [1 - 1j, 1 + 1j]]) / 2,
    "sxdg": lambda: (np.array([[1 + 1j, 1 - 1j], [1 - 1j, 1 + 1j]]) / 2).conj().T,
    "id": lambda: np.eye(2),
}
PARAM_1Q = {
    "rz": lambda a: rz(a[0]), "rx": lambda a: rx(a[0]), "ry": lambda a: ry(a[0]),
    "u1": lambda a: np.diag([1, np.exp(1j * a[0])]), "p": lambda a: np.diag([1, np.exp(1j * a[0])]),
    "u3": lambda a: u3(*a), "u": lambda a: u3(*a), "U": lambda a: u3(*a), "u2": lambda a: u3(math.pi / 2, a[0], a[1]),
    "r": lambda a: r_gate(*a),
}


def eval_angle(text):
    text = text.strip()
    if not re.fullmatch(r"[0-9pi+\-*/(). e]*", text):
        raise ValueError(f"angle {text!r}")
    return float(eval(text, {"__builtins__": {}}, {"pi": math.pi}))


class QasmOutput:
    def __init__(self, text):
        self.qregs = {}  # name -> (first wire, size)
        self.cregs = {}  # name -> size
        self.n = 0
        self.ops = []  # (cond or None, name, args, wires)
        for raw in text.split("\n"):
            line = raw.split("//")[0].strip()
            if not line or line.startswith("OPENQASM") or line.startswith("include") or line.startswith("gate "):
                continue
            for stmt in filter(None, (s.strip() for s in line.split(";"))):
                self.parse(stmt)

    def wire(self, ref):
        m = re.fullmatch(r"(\w+)\[(\d+)\]", ref.strip())
        first, size = self.qregs[m.group(1)]
        assert int(m.group(2)) < size
        return first + int(m.group(2))

    def wire_or_none(self, ref):
        """The wire, or None when the output dropped it (an idle work wire: drop-idle-wires)."""
        m = re.fullmatch(r"(\w+)\[(\d+)\]", ref.strip())
        if m.group(1) not in self.qregs or int(m.group(2)) >= self.qregs[m.group(1)][1]:
            return None
        return self.wire(ref)

    def parse(self, stmt):
        m = re.fullmatch(r"qreg (\w+)\[(\d+)\]", stmt)
        if m:
            self.qregs[m.group(1)] = (self.n, int(m.group(2)))
            self.n += int(m.group(2))
            return
        m = re.fullmatch(r"creg (\w+)\[(\d+)\]", stmt)
        if m:
            self.cregs[m.group(1)] = int(m.group(2))
            return
        cond = None
        m = re.fullmatch(r"if\s*\((\w+)\s*==\s*(\d+)\)\s*(.*)", stmt)
        if m:
            cond = (m.group(1), int(m.group(2)))
            stmt = m.group(3)
        m = re.fullmatch(r"measure (\S+)\s*->\s*(\w+)\[(\d+)\]", stmt)
        if m:
            self.ops.append((cond, "measure", (m.group(2), int(m.group(3))), [self.wire(m.group(1))]))
            return
        if stmt.startswith("barrier"):
            return
        m = re.fullmatch(r"(\w+)(?:\((.*)\))?\s+(.*)", stmt)
        name, args, wires = m.group(1), m.group(2), m.group(3)
        vals = [eval_angle(a) for a in args.split(",")] if args else []
        self.ops.append((cond, name, vals, [self.wire(w) for w in wires.split(",")]))

    def run(self, psi):
        """Every measurement branch: a list of (unnormalized state, classical values)."""
        branches = [(psi, {})]
        for cond, name, args, wires in self.ops:
            nxt = []
            for state, cv in branches:
                if cond is not None:
                    reg, val = cond
                    bits = cv.get(reg, {})
                    value = sum((bits.get(i, 0) << i) for i in range(self.cregs[reg]))
                    if value != val:
                        nxt.append((state, cv))
                        continue
                if name == "measure":
                    w = wires[0]
                    for outcome in (0, 1):
                        idx = [slice(None)] * state.ndim
                        idx[w] = 1 - outcome
                        s2 = state.copy()
                        s2[tuple(idx)] = 0
                        if np.linalg.norm(s2) > 1e-9:
                            c2 = {k: dict(v) for k, v in cv.items()}
                            c2.setdefault(args[0], {})[args[1]] = outcome
                            nxt.append((s2, c2))
                    continue
                nxt.append((self.gate(state, name, args, wires), cv))
            branches = nxt
        return branches

    @staticmethod
    def gate(psi, name, args, w):
        if name in ONE_QUBIT:
            return apply_1q(psi, ONE_QUBIT[name](), w[0], [])
        if name in PARAM_1Q:
            return apply_1q(psi, PARAM_1Q[name](args), w[0], [])
        if name == "cx":
            return apply_1q(psi, X, w[1], [(w[0], True)])
        if name == "ccx":
            return apply_1q(psi, X, w[2], [(w[0], True), (w[1], True)])
        if name == "cz":
            return apply_1q(psi, np.diag([1, -1]), w[1], [(w[0], True)])
        if name in ("cu1", "cp"):
            return apply_1q(psi, np.diag([1, np.exp(1j * args[0])]), w[1], [(w[0], True)])
        if name == "swap":
            return np.swapaxes(psi, w[0], w[1]).copy()
        if name == "iswap":
            # iSWAP: |01> -> i|10>, |10> -> i|01> (common practice)
            out = psi.copy()
            idx = lambda a, b: tuple([a if k == w[0] else b if k == w[1] else slice(None) for k in range(psi.ndim)])
            out[idx(0, 1)] = 1j * psi[idx(1, 0)]
            out[idx(1, 0)] = 1j * psi[idx(0, 1)]
            return out
        if name == "rxx":
            # RXX(θ) = exp(-iθ/2 X⊗X) (common practice)
            theta = args[0]
            flipped = np.flip(np.flip(psi, axis=w[0]), axis=w[1])
            return math.cos(theta / 2) * psi - 1j * math.sin(theta / 2) * flipped
        raise ValueError(f"gate {name} is not known to the differential simulator")


# ----------------------------------------------------------------------------------------------

def reference_states(prog, rng_np):
    n = prog.n_data + prog.n_clean
    data = rng_np.normal(size=(2 ** prog.n_data, STATES)) + 1j * rng_np.normal(size=(2 ** prog.n_data, STATES))
    data /= np.linalg.norm(data, axis=0)
    psi = np.zeros((2 ** prog.n_data, 2 ** prog.n_clean, STATES), dtype=complex)
    psi[:, 0, :] = data
    psi = psi.reshape([2] * n + [STATES])
    out = psi
    for op in prog.ops:
        out = apply_ref(out, op)
    return data, out


def check_output(prog, text, data, ref_out):
    """None when the output is right, else a message."""
    q = QasmOutput(text)
    # A clean work wire the output dropped (drop-idle-wires) is taken at |0> in the source and in
    # the reference: where the reference leaves amplitude on it at 1, the expected state loses norm
    # and the overlap check below fails, as it should.
    found = [q.wire_or_none(prog.name(w)) for w in range(prog.n_data + prog.n_clean)]
    dropped = [w for w, o in enumerate(found) if o is None]
    if any(w < prog.n_data for w in dropped):
        return f"data wires dropped from the output: {[prog.name(w) for w in dropped if w < prog.n_data]}"
    src_full = np.zeros([2] * (prog.n_data + prog.n_clean) + [STATES], dtype=complex)
    src_full.reshape(2 ** prog.n_data, 2 ** prog.n_clean, STATES)[:, 0, :] = data
    take = tuple(0 if w in dropped else slice(None) for w in range(prog.n_data + prog.n_clean))
    src = src_full[take]
    ref_out = ref_out[take]
    order = [o for o in found if o is not None]
    extra = [w for w in range(q.n) if w not in order]
    # Input: data wires as given, declared and added clean wires at |0>.
    n = q.n
    psi = np.zeros([2] * n + [STATES], dtype=complex)
    # place src into psi at the output's wire positions, extra wires at 0
    idx = [slice(None)] * (n + 1)
    for w in extra:
        idx[w] = 0
    perm = order + [n]  # src axes -> psi axes
    psi_sub = np.zeros([2] * (n - len(extra)) + [STATES], dtype=complex)
    # psi_sub has the output's non-extra wires in increasing output order
    kept = sorted(order)
    axes = [kept.index(o) for o in order] + [len(kept)]
    psi_sub = np.moveaxis(src, list(range(len(axes))), axes)
    psi[tuple(idx)] = psi_sub
    expect = np.zeros_like(psi)
    exp_sub = np.moveaxis(ref_out, list(range(len(axes))), axes)
    expect[tuple(idx)] = exp_sub
    for state, cv in q.run(psi):
        for k in range(STATES):
            s, e = state[..., k].ravel(), expect[..., k].ravel()
            ns = np.linalg.norm(s)
            if ns < 1e-9:
                continue
            overlap = abs(np.vdot(e, s))
            if abs(overlap - ns) > 1e-6 * max(1.0, ns):
                return f"branch {cv or '(unitary)'} state {k}: |<expected|output>| = {overlap:.6f}, |output| = {ns:.6f}"
    return None


def main():
    if shutil.which(WHITTLE) is None and not os.path.exists(WHITTLE):
        print(f"whittle binary not found: {WHITTLE}")
        return 77
    rng = random.Random(SEED)
    rng_np = np.random.default_rng(SEED)
    tmp = tempfile.mkdtemp(prefix="whittle-diff-")
    progs = []
    t_paths = set()  # the reduce-t networks: compiled for clifford+t at -O2 and -O3 only
    for i, prog in enumerate(reported_programs()):
        path = os.path.join(tmp, f"reported{i}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
    for i in range(CIRCUITS):
        # One in four is classical (X-type only), so the nct target has inputs too.
        prog = random_program(rng, classical=i % 4 == 3)
        path = os.path.join(tmp, f"c{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
    rng_work = random.Random(SEED + 104729)  # its own stream, as rng_dense below
    for i in range(W_CIRCUITS):  # compiled like the random circuits (every target and level)
        prog = work_wire_program(rng_work)
        path = os.path.join(tmp, f"w{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
    for i in range(T_CIRCUITS):
        prog = t_network_program(rng)
        path = os.path.join(tmp, f"t{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        t_paths.add(path)
    rng_dense = random.Random(SEED + 7919)  # its own stream: the other generators' programs stay as they were
    for i in range(T_CIRCUITS):
        prog = dense_phase_program(rng_dense)
        path = os.path.join(tmp, f"d{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        t_paths.add(path)
    for i in range(ZX_CIRCUITS):  # zx-merge runs in the same configurations as reduce-t
        prog = teleport_program(rng)
        path = os.path.join(tmp, f"z{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        t_paths.add(path)
    g_paths = set()  # the gadget networks: compiled only with gadget wires
    for i in range(T_CIRCUITS):
        prog = gadget_program(rng)
        path = os.path.join(tmp, f"g{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        g_paths.add(path)
    r_paths = set()  # the rule networks: compiled for the rotation targets at -O3 with more search effort
    for i in range(R_CIRCUITS):
        prog = rule_program(rng)
        path = os.path.join(tmp, f"r{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        r_paths.add(path)
    b_paths = set()  # the block networks: compiled for the rotation targets at -O3 with resynth-3q
    for i in range(B_CIRCUITS):
        prog = block_program(rng)
        path = os.path.join(tmp, f"b{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        progs.append((path, prog) + reference_states(prog, rng_np))
        b_paths.add(path)
    configs = [(t, o, False) for t in TARGETS for o in LEVELS] + [("clifford+t", o, True) for o in LEVELS]
    configs += [(t, "-O3", "blocks") for t in RULE_TARGETS]
    configs += [(t, "-O3", "rules") for t in RULE_TARGETS]
    configs += [("clifford+t", o, "gadgets") for o in ("-O2", "-O3")]
    checked = failures = refused = gadget_outputs = limit_checked = 0
    all_progs = progs
    for target, level, meas in configs:
        progs = [p for p in all_progs if p[1].classical] if target == "nct" else all_progs
        if meas == "gadgets":
            progs = [p for p in progs if p[0] in t_paths or p[0] in g_paths]
        elif meas == "rules":
            progs = [p for p in progs if p[0] in r_paths or p[0] not in t_paths | g_paths | b_paths]
        elif meas == "blocks":
            progs = [p for p in progs if p[0] in b_paths]
        else:
            progs = [p for p in progs if p[0] not in b_paths]
            progs = [p for p in progs if p[0] not in r_paths or target in RULE_TARGETS]
            progs = [p for p in progs if p[0] not in g_paths]
            if not (target == "clifford+t" and level in ("-O2", "-O3") and not meas):
                progs = [p for p in progs if p[0] not in t_paths]
        flags = {False: "", True: " --allow-measurement", "gadgets": " --allow-measurement --gadget-wires 6",
                 "rules": " --optimize-for 2q --rewrite-effort 3",
                 "blocks": " --optimize-for 2q --resynth-effort 1"}[meas]
        suffix = {False: "", True: "-m", "gadgets": "-mg", "rules": "-r", "blocks": "-b"}[meas]
        outdir = os.path.join(tmp, f"{target}{level}{suffix}".replace("+", "_"))
        os.mkdir(outdir)
        cmd = [WHITTLE, "compile", "-q", "-j", "2", "--target", target, level, "--emit", "qasm2", "-o", outdir]
        cmd += flags.split()
        res = subprocess.run(cmd + [p[0] for p in progs], capture_output=True, text=True)
        for path, prog, data, ref_out in progs:
            out = os.path.join(outdir, os.path.basename(path)[:-3] + ".qasm")
            how = f"{WHITTLE} compile {path} --target {target} {level}{flags} --emit qasm2"
            if not os.path.exists(out):
                err = [l for l in res.stderr.split("\n") if l.startswith(path)]
                if target == "nct" and err and "has no NOT/CNOT/Toffoli form without a work wire" in err[0]:
                    refused += 1  # a legitimate refusal: an n-control X on all n+1 wires is an odd permutation
                    continue
                failures += 1
                err = [l for l in res.stderr.split("\n") if l.startswith(path)]
                print(f"FAIL (no output; exit {res.returncode}) {how}\n  {err[:1]}\n--- input\n{prog.text()}")
                continue
            with open(out) as f:
                text = f.read()
            msg = check_output(prog, text, data, ref_out)
            if meas == "gadgets" and "measure" in text:
                gadget_outputs += 1
            checked += 1
            if msg:
                failures += 1
                print(f"FAIL {how}\n  {msg}\n--- input\n{prog.text()}")

    # --qubit-limit: each narrow program compiled with the limit set to the qubits of its high-level
    # compile (-O2, no target: the peak of live qubits once work-wire lives are packed).
    rng_narrow = random.Random(SEED + 15485863)
    limit_missed = 0
    for i in range(N_CIRCUITS):
        prog = narrow_program(rng_narrow)
        path = os.path.join(tmp, f"n{i:04d}.wq")
        with open(path, "w") as f:
            f.write(prog.text())
        data, ref_out = reference_states(prog, rng_np)
        res = subprocess.run([WHITTLE, "compile", path, "-O2", "-o", os.devnull], capture_output=True, text=True)
        m = re.search(r": (\d+) qubits", res.stderr + res.stdout)
        if res.returncode != 0 or not m:
            failures += 1
            print(f"FAIL high-level compile of {path}: exit {res.returncode}\n{res.stderr[:400]}\n--- input\n{prog.text()}")
            continue
        limit = int(m.group(1))
        for target in (["nct"] if prog.classical else []) + ["clifford+t", "cx+rz+sx"]:
            for level in ("-O2", "-O3"):
                out = os.path.join(tmp, f"n{i:04d}_{target}{level}.qasm".replace("+", "_"))
                cmd = [WHITTLE, "compile", path, "--target", target, level, "--qubit-limit", str(limit),
                       "--emit", "qasm2", "-o", out]
                how = " ".join(cmd)
                res = subprocess.run(cmd, capture_output=True, text=True)
                if res.returncode != 0:
                    if "no compile of this input fits" in res.stderr and not os.path.exists(out):
                        limit_missed += 1  # a located refusal, not a wrong circuit; counted below
                        print(f"note: limit {limit} not reached: {how}\n  {res.stderr.strip()[:300]}")
                        continue
                    failures += 1
                    print(f"FAIL (exit {res.returncode}) {how}\n  {res.stderr[:400]}\n--- input\n{prog.text()}")
                    continue
                with open(out) as f:
                    text = f.read()
                q = QasmOutput(text)
                checked += 1
                limit_checked += 1
                msg = check_output(prog, text, data, ref_out)
                if q.n > limit:
                    msg = (msg + "; " if msg else "") + f"{q.n} qubits over --qubit-limit {limit}"
                if msg:
                    failures += 1
                    print(f"FAIL {how}\n  {msg}\n--- input\n{prog.text()}")
    shutil.rmtree(tmp) if failures == 0 else print(f"inputs and outputs kept in {tmp}")
    print(f"differential: seed {SEED}, {CIRCUITS} circuits and {W_CIRCUITS} work-wire circuits x {len(configs)} configurations, "
          f"{T_CIRCUITS} T networks x 4, {T_CIRCUITS} dense phase networks x 4, {ZX_CIRCUITS} phase networks x 4, {T_CIRCUITS} gadget networks x 2 "
          f"and {R_CIRCUITS} rule networks (every level of the rotation targets, and -O3 with --rewrite-effort 3) "
          f"and {B_CIRCUITS} block networks (-O3 with --resynth-effort 1 on the rotation targets) "
          f"(clifford+t -O2, -O3, with and without --gadget-wires 6): "
          f"{checked} outputs checked by numpy ({gadget_outputs} with Hadamard gadgets kept), {failures} failures, "
          f"{refused} refused with a located reason (nct); "
          f"{N_CIRCUITS} narrow programs under --qubit-limit (their high-level qubits): {limit_checked} outputs checked, "
          f"{limit_missed} runs found no compile within the limit")
    if T_CIRCUITS >= 10 and gadget_outputs == 0:
        failures += 1
        print("FAIL no output of the --gadget-wires runs kept a gadget: the gadget path went untested")
    print(f"{checked - failures} passed, {failures} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
