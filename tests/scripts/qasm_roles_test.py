# `compile --role REGISTER=ROLE`: an OpenQASM input declares its work register clean, so
# --allow-measurement can uncompute by measurement; the declaration is checked like a .wq `ancilla`.
"""The n-control Toffoli over a clean V-chain (n - 2 work wires, 2n - 3 Toffolis; common practice),
written as OpenQASM 2.0 with plain ccx gates, compiled to clifford+t with --allow-measurement:

- without a declaration nothing is known about the work wires, and measurement gains nothing;
- with `--role work=ancilla` the chain reaches 4n - 1 T: 4 T per temporary AND and 0 T to erase it
  by measurement and a classically controlled CZ (Gidney 2018, arXiv:1709.06648; Jones 2013,
  arXiv:1212.5069), so 4(n - 2) for the chain plus 7 for the Toffoli into the target: 11, 15, 19, 39
  for n = 3, 4, 5, 10 (derived from those papers; CHECKS.md);
- the output is right: for n <= 5 the compile's own check, `whittle equiv` against the input and
  the numpy simulator of tests/scripts/differential_test.py (textbook matrices, every measurement
  branch); for every n a sparse simulation written here (every measurement branch, random
  superpositions of basis inputs); both against the chain's action computed here on basis states
  (controls unchanged, the target flipped when every control is 1, the work wires back at |0>).
  For n = 10 the project's checker does not decide the measured output within its budget;
- the carry-lookahead adder of the benchmark table (Draper, Kutin, Rains, Svore 2004), 10 bits,
  compiled with `--role prop=ancilla --allow-measurement`: the sparse simulation checks every
  branch of the output against a + b (integer arithmetic);
- the same declaration written in the file (the `// whittle: qreg` annotation) does the same;
- a declaration that does not hold, an unknown register and an unknown role are refused (exit 2,
  no output file).
T-counts are recounted from the emitted text by tests/scripts/qasm_recount.py.
"""
import os
import re
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from differential_test import QasmOutput  # noqa: E402
from qasm_recount import recount  # noqa: E402

WHITTLE = os.environ["WHITTLE_BIN"]
STATES = 3


def chain_qasm(n, pragma=False, uncompute=True):
    """The V-chain over ctl[n], work[n-2], out[1], as plain ccx gates."""
    lines = ["OPENQASM 2.0;", 'include "qelib1.inc";']
    if pragma:
        lines.append("// whittle: qreg work source work role ancilla")
    lines += [f"qreg ctl[{n}];", f"qreg work[{n - 2}];", "qreg out[1];"]
    chain = ["ccx ctl[0], ctl[1], work[0];"]
    chain += [f"ccx ctl[{i + 1}], work[{i - 1}], work[{i}];" for i in range(1, n - 2)]
    lines += chain
    lines.append(f"ccx ctl[{n - 1}], work[{n - 3}], out[0];")
    if uncompute:
        lines += list(reversed(chain))
    return "\n".join(lines) + "\n"


def run(*args):
    return subprocess.run([WHITTLE, *args], capture_output=True, text=True)


SQ = 2 ** -0.5
PHASES = {"z": -1, "s": 1j, "sdg": -1j, "t": np.exp(1j * np.pi / 4), "tdg": np.exp(-1j * np.pi / 4)}


def sparse_run(q, state):
    """Every measurement branch of the parsed output `q` (differential_test.QasmOutput) run on a
    sparse state {basis integer (bit w = wire w): amplitude}, with textbook gates (Nielsen & Chuang
    ch. 4; common practice): a list of (state, classical values)."""
    branches = [(state, {})]
    for cond, name, args, w in q.ops:
        nxt = []
        for st, cv in branches:
            if cond is not None:
                reg, val = cond
                if sum(cv.get((reg, i), 0) << i for i in range(q.cregs[reg])) != val:
                    nxt.append((st, cv))
                    continue
            if name == "measure":
                for outcome in (0, 1):
                    part = {b: a for b, a in st.items() if (b >> w[0] & 1) == outcome}
                    if sum(abs(a) ** 2 for a in part.values()) > 1e-12:
                        nxt.append((part, {**cv, args: outcome}))
                continue
            out = {}
            for b, a in st.items():
                bit = [b >> x & 1 for x in w]
                if name == "h":
                    for v in (0, 1):
                        nb = (b & ~(1 << w[0])) | (v << w[0])
                        out[nb] = out.get(nb, 0) + a * SQ * (-1 if bit[0] and v else 1)
                    continue
                if name in PHASES:
                    a = a * (PHASES[name] if bit[0] else 1)
                elif name == "x" or (name == "cx" and bit[0]) or (name == "ccx" and bit[0] and bit[1]):
                    b ^= 1 << w[-1]
                elif name == "cz":
                    a = -a if bit[0] and bit[1] else a
                elif name not in ("cx", "ccx"):
                    raise ValueError(f"gate {name} is not known to the sparse simulator")
                out[b] = out.get(b, 0) + a
            nxt.append(({b: a for b, a in out.items() if abs(a) > 1e-12}, cv))
        branches = nxt
    return branches


def sparse_matches(q, rng, draw, image, trials=20, picks=4):
    """None when, for `trials` random superpositions of `picks` basis inputs draw(trial) (integers,
    bit w = wire w), every measurement branch of the output `q` is proportional to the superposition
    of image(input); else a message."""
    for trial in range(trials):
        inputs = [draw(trial) for _ in range(picks)]
        amps = rng.normal(size=picks) + 1j * rng.normal(size=picks)
        state, expect = {}, {}
        for b, a in zip(inputs, amps):
            state[b] = state.get(b, 0) + a
            expect[image(b)] = expect.get(image(b), 0) + a
        scale = np.sqrt(sum(abs(a) ** 2 for a in expect.values()))
        expect = {b: a / scale for b, a in expect.items()}
        state = {b: a / scale for b, a in state.items()}
        for got, cv in sparse_run(q, state):
            norm = np.sqrt(sum(abs(a) ** 2 for a in got.values()))
            overlap = abs(sum(np.conj(expect.get(b, 0)) * a for b, a in got.items()))
            if abs(overlap - norm) > 1e-9:
                return f"trial {trial}, branch {cv}: not the expected image"
    return None


def sparse_check(n, text, rng):
    """The chain's output on random superpositions of basis inputs of ctl and out (work at |0>)."""
    q = QasmOutput(text)
    ctl = [q.wire(f"ctl[{i}]") for i in range(n)]
    out = q.wire("out[0]")

    def draw(trial):
        bits = [1] * (n + 1) if trial == 0 else [int(v) for v in rng.integers(2, size=n + 1)]
        return sum(v << w for v, w in zip(bits, ctl + [out]))

    def image(b):  # the target flips when every control is 1; work and any added wire stay 0
        return b ^ (1 << out) if all(b >> w & 1 for w in ctl) else b

    return sparse_matches(q, rng, draw, image)


def cla_adder_qasm(n):
    """The out-of-place carry-lookahead adder of Draper, Kutin, Rains, Svore 2004 (quant-ph/0406142,
    Section 3) as ccx / cx over a[n], b[n], sum[n+1] and prop (the propagate tree's clean wires),
    written from the paper's rounds here, apart from the C++ rebuild (tests/support/families.h)."""
    logn = n.bit_length() - 1
    work = n - bin(n).count("1") - logn
    P = [[f"b[{i}]" for i in range(n)]]
    k = 0
    for t in range(1, logn):
        row = [None] * (n >> t)
        for m in range(1, n >> t):
            row[m] = f"prop[{k}]"
            k += 1
        P.append(row)
    G = [f"sum[{i}]" for i in range(n + 1)]
    ops, p_rounds = [], []
    for t in range(1, logn):
        for m in range(1, n >> t):
            p_rounds.append(f"ccx {P[t - 1][2 * m]},{P[t - 1][2 * m + 1]},{P[t][m]};")
    ops += [f"ccx a[{i}],b[{i}],{G[i + 1]};" for i in range(n)]
    ops += [f"cx a[{i}],b[{i}];" for i in range(1, n)]
    ops += p_rounds
    for t in range(1, logn + 1):
        for m in range(n >> t):
            ops.append(f"ccx {G[(m << t) + (1 << (t - 1))]},{P[t - 1][2 * m + 1]},{G[(m << t) + (1 << t)]};")
    for t in range((2 * n // 3).bit_length() - 1, 0, -1):
        for m in range(1, ((n - (1 << (t - 1))) >> t) + 1):
            ops.append(f"ccx {G[m << t]},{P[t - 1][2 * m]},{G[(m << t) + (1 << (t - 1))]};")
    ops += list(reversed(p_rounds))
    ops += [f"cx b[{i}],{G[i]};" for i in range(1, n)]
    ops += ["cx a[0],sum[0];", "cx b[0],sum[0];"]
    ops += [f"cx a[{i}],b[{i}];" for i in range(1, n)]
    head = ["OPENQASM 2.0;", 'include "qelib1.inc";', f"qreg a[{n}];", f"qreg b[{n}];", f"qreg sum[{n + 1}];"]
    if work:
        head.append(f"qreg prop[{work}];")
    return "\n".join(head + ops) + "\n"


def cla_check(n, text, rng):
    """The adder's output: sum = a + b with a, b unchanged and prop back at 0 (integer arithmetic)."""
    q = QasmOutput(text)
    a = [q.wire(f"a[{i}]") for i in range(n)]
    b = [q.wire(f"b[{i}]") for i in range(n)]
    s = [q.wire(f"sum[{i}]") for i in range(n + 1)]

    def value(x, wires):
        return sum((x >> w & 1) << i for i, w in enumerate(wires))

    def draw(trial):
        x, y = int(rng.integers(1 << n)), int(rng.integers(1 << n))
        if trial == 0:
            x, y = (1 << n) - 1, 1  # the carry runs through every bit
        return sum(((x >> i & 1) << a[i]) | ((y >> i & 1) << b[i]) for i in range(n))

    def image(x):
        total = value(x, a) + value(x, b)
        return x | sum((total >> i & 1) << w for i, w in enumerate(s))

    return sparse_matches(q, rng, draw, image, trials=30, picks=3)


def numpy_check(n, text):
    """None when every measurement branch of the output maps random states of ctl and out (work at
    |0>) to the chain's image, up to a phase per branch; else a message."""
    q = QasmOutput(text)
    ctl = [q.wire(f"ctl[{i}]") for i in range(n)]
    out = q.wire("out[0]")
    rng = np.random.default_rng(n)
    free = ctl + [out]
    amps = rng.normal(size=(2 ** len(free), STATES)) + 1j * rng.normal(size=(2 ** len(free), STATES))
    amps /= np.linalg.norm(amps, axis=0)
    psi = np.zeros([2] * q.n + [STATES], dtype=complex)
    expect = np.zeros_like(psi)
    for k in range(2 ** len(free)):
        bits = {w: (k >> j) & 1 for j, w in enumerate(free)}
        idx = [0] * q.n
        for w, b in bits.items():
            idx[w] = b
        psi[tuple(idx)] = amps[k]
        if all(bits[w] for w in ctl):
            idx[out] ^= 1  # the target flips when every control is 1; work and any added wire stay 0
        expect[tuple(idx)] = amps[k]
    branches = q.run(psi)
    total = 0.0
    for state, cv in branches:
        for s in range(STATES):
            got, want = state[..., s].ravel(), expect[..., s].ravel()
            norm = np.linalg.norm(got)
            total += norm ** 2
            if norm < 1e-9:
                continue
            if abs(abs(np.vdot(want, got)) - norm) > 1e-6:
                return f"branch {cv}: state {s} is not the chain's image"
    if abs(total - STATES) > 1e-6:
        return f"the branches' weights add up to {total}, not {STATES}"
    return None


def main():
    failures = []
    tmp = tempfile.mkdtemp(prefix="whittle-roles-")

    def fail(msg):
        failures.append(msg)
        print("FAIL", msg)

    for n in (3, 4, 5, 10):
        src = os.path.join(tmp, f"chain{n}.qasm")
        with open(src, "w") as f:
            f.write(chain_qasm(n))
        target = ["--target", "clifford+t"]
        outs = {}
        for label, extra in (("plain", []), ("measured", ["--allow-measurement"]),
                             ("declared", ["--allow-measurement", "--role", "work=ancilla"])):
            dst = os.path.join(tmp, f"chain{n}-{label}.qasm")
            # The compile's own check decides every run but n = 10 with measurements: eight
            # measurements on 19 wires, its branch simulation gives up after 15-60 s. That output
            # is compiled with --no-check and checked by the sparse simulation below.
            undecidable = n == 10 and label == "declared"
            r = run("compile", src, *target, *extra, "-o", dst, *(["--no-check"] if undecidable else []))
            checked = "verified" in r.stderr or undecidable
            if r.returncode != 0 or not checked:
                fail(f"n={n} {label}: exit {r.returncode}, {r.stderr.strip()}")
                continue
            with open(dst) as f:
                outs[label] = f.read()
        if len(outs) != 3:
            continue
        t = {k: recount(v)["t_count"] for k, v in outs.items()}
        print(f"n={n}: T without measurement {t['plain']}, with measurement {t['measured']}, "
              f"with measurement and --role work=ancilla {t['declared']} (expected {4 * n - 1})")
        if t["measured"] != t["plain"]:
            fail(f"n={n}: without a declaration, measurement changed T {t['plain']} -> {t['measured']}")
        if t["declared"] != 4 * n - 1:
            fail(f"n={n}: T {t['declared']} with the work register declared clean, expected 4n-1 = {4 * n - 1}")
        if "measure" not in outs["declared"]:
            fail(f"n={n}: the declared run has no measurement")
        dst = os.path.join(tmp, f"chain{n}-declared.qasm")
        r = run("equiv", src, dst) if n <= 5 else None
        if r is not None and r.returncode != 0:
            fail(f"n={n}: whittle equiv input output: exit {r.returncode} {r.stdout.strip()} {r.stderr.strip()}")
        msg = sparse_check(n, outs["declared"], np.random.default_rng(n))
        if msg:
            fail(f"n={n}: sparse simulation: {msg}")
        if n <= 5:
            msg = numpy_check(n, outs["declared"])
            if msg:
                fail(f"n={n}: numpy: {msg}")

    # The carry-lookahead adder (the benchmark table's cla-adder-10) with its propagate tree declared
    # clean: the compile's check does not decide this output (five measurements on 36 wires), the
    # sparse simulation checks it on integer arithmetic. First the text against integer arithmetic
    # itself: 34 Toffolis on 36 qubits, the published counts of the 10-bit adder (CHECKS.md).
    src = os.path.join(tmp, "cla10.qasm")
    with open(src, "w") as f:
        f.write(cla_adder_qasm(10))
    plain = recount(cla_adder_qasm(10))
    if plain["gates"].get("ccx") != 34 or plain["qubits"] != 36:
        fail(f"cla-adder-10 text: {plain['gates'].get('ccx')} ccx on {plain['qubits']} qubits, expected 34 on 36")
    msg = cla_check(10, cla_adder_qasm(10), np.random.default_rng(10))
    if msg:
        fail(f"cla-adder-10 as written: {msg}")
    dst = os.path.join(tmp, "cla10-declared.qasm")
    r = run("compile", src, "--target", "clifford+t", "--allow-measurement", "--role", "prop=ancilla", "-o", dst)
    if r.returncode != 0:
        fail(f"cla-adder-10: exit {r.returncode} {r.stderr.strip()}")
    else:
        text = open(dst).read()
        print(f"cla-adder-10 with --role prop=ancilla --allow-measurement: T {recount(text)['t_count']}, "
              f"{text.count('measure ')} measurements")
        if "measure" not in text:
            fail("cla-adder-10: the declared run has no measurement")
        msg = cla_check(10, text, np.random.default_rng(11))
        if msg:
            fail(f"cla-adder-10 output: sparse simulation: {msg}")

    # The declaration written in the file: the annotation line the OpenQASM writer emits.
    src = os.path.join(tmp, "chain4-pragma.qasm")
    with open(src, "w") as f:
        f.write(chain_qasm(4, pragma=True))
    dst = os.path.join(tmp, "chain4-pragma-out.qasm")
    r = run("compile", src, "--target", "clifford+t", "--allow-measurement", "-o", dst)
    if r.returncode != 0 or recount(open(dst).read())["t_count"] != 15:
        fail(f"in-file declaration: exit {r.returncode} {r.stderr.strip()}")

    # Refusals: exit 2, a message naming the file, no output written.
    good = os.path.join(tmp, "chain3.qasm")
    dirty = os.path.join(tmp, "dirty.qasm")
    with open(dirty, "w") as f:
        f.write(chain_qasm(4, uncompute=False))
    cases = [
        ([good, "--role", "scratch=ancilla"], r"chain3\.qasm: error: --role scratch=ancilla: the input has no quantum "
                                              r"register 'scratch' \(its registers: ctl, work, out\)"),
        ([good, "--role", "work=clean"], r"unknown role 'clean' \(expected qubit, ancilla or borrow\)"),
        ([good, "--role", "work"], r"needs REGISTER=ROLE"),
        ([good, "--role", "work=ancilla", "--role", "work=borrow"], r"names register 'work' twice"),
        # work[1] is left holding ctl0 & ctl1 & ctl2: located at the register's declaration.
        ([dirty, "--role", "work=ancilla"], r"dirty\.qasm:4:6: error: ancilla 'work\[\d\]' is not returned to \|0>"),
        # out is flipped when every control is 1.
        ([good, "--role", "out=ancilla"], r"chain3\.qasm:5:6: error: ancilla 'out\[0\]' is not returned to \|0>"),
    ]
    for args, pattern in cases:
        dst = os.path.join(tmp, "refused.qasm")
        r = run("compile", *args, "--target", "clifford+t", "-o", dst)
        if r.returncode != 2 or not re.search(pattern, r.stderr) or os.path.exists(dst):
            fail(f"{' '.join(args)}: exit {r.returncode}, stderr {r.stderr.strip()!r}, expected /{pattern}/")

    # A batch: the input without that register fails alone.
    outdir = os.path.join(tmp, "batch")
    os.mkdir(outdir)
    other = os.path.join(tmp, "other.qasm")
    with open(other, "w") as f:
        f.write('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\ncx q[0], q[1];\n')
    r = run("compile", "-j", "2", good, other, "--role", "work=ancilla", "-o", outdir)
    if r.returncode != 2 or not os.path.exists(os.path.join(outdir, "chain3.wq")) or \
            os.path.exists(os.path.join(outdir, "other.wq")) or "other.qasm: error: --role" not in r.stderr:
        fail(f"batch: exit {r.returncode}, {r.stderr.strip()!r}")

    print("ok" if not failures else f"{len(failures)} failures")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
