"""iSWAP counts of two-qubit synthesis on the iswap+rz+rx target, cross-checked by numpy: every output is
rebuilt from the gate definitions (lowering_numpy_test's OpenQASM 2.0 reader, nothing from whittle's
simulator) and compared with the input up to global phase.

Counts checked: a CNOT needs 2 iSWAPs, iSWAP 1, SWAP 3, one-qubit gates 0, and any two-qubit unitary
at most 3 (Schuch & Siewert 2003, quant-ph/0209035, from memory; CNOT = 2 iSWAPs is also common
practice). The numpy part checks independently that the input programs are what their names say."""
import os
import random
import re
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from lowering_numpy_test import WHITTLE, unitary  # noqa: E402


def distance(a, b):
    """Operator-norm distance up to global phase (phase from tr(b^dagger a))."""
    inner = np.trace(b.conj().T @ a)
    ph = inner / abs(inner) if abs(inner) > 1e-300 else 1
    return np.linalg.norm(a - ph * b, 2)

HEADER = 'OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg yard[2];\n'
ISWAP = np.array([[1, 0, 0, 0], [0, 0, 1j, 0], [0, 1j, 0, 0], [0, 0, 0, 1]])
CNOT_01 = np.array([[1, 0, 0, 0], [0, 0, 0, 1], [0, 0, 1, 0], [0, 1, 0, 0]])  # control yard[0] = bit 0
SWAP = np.array([[1, 0, 0, 0], [0, 0, 1, 0], [0, 1, 0, 0], [0, 0, 0, 1]])


def compile_iswap(src, tmp):
    path = os.path.join(tmp, "block.qasm")
    with open(path, "w") as f:
        f.write(src)
    out = subprocess.run([WHITTLE, "compile", path, "--target", "iswap+rz+rx", "--emit", "qasm2", "-q"],
                         capture_output=True, text=True)
    if out.returncode != 0:
        raise RuntimeError("whittle failed:\n%s\n%s" % (out.stderr, src))
    return out.stdout


def iswap_count(text):
    body = re.sub(r"gate\s+\w+[^{]*\{[^}]*\}", "", text)
    return len(re.findall(r"^\s*iswap\b", body, re.M))


def random_block(rng):
    lines = [HEADER]
    for _ in range(rng.randint(6, 14)):
        a = rng.randint(0, 1)
        if rng.random() < 0.4:
            lines.append("cx yard[%d],yard[%d];\n" % (a, 1 - a))
        else:
            lines.append("u3(%.6f,%.6f,%.6f) yard[%d];\n" % (rng.uniform(-3, 3), rng.uniform(-3, 3),
                                                            rng.uniform(-3, 3), a))
    return "".join(lines)


def main():
    rng = random.Random(34)
    failures = []
    # The iSWAP input is the textbook form (S x S)(H x I) CX CX (I x H); numpy confirms it below.
    named = [
        ("CNOT", HEADER + "cx yard[0],yard[1];\n", CNOT_01, 2),
        ("iSWAP", HEADER + "s yard[0]; s yard[1]; h yard[0]; cx yard[0],yard[1]; cx yard[1],yard[0]; h yard[1];\n",
         ISWAP, 1),
        ("SWAP", HEADER + "swap yard[0],yard[1];\n", SWAP, 3),
        ("locals", HEADER + "u3(0.3,1.1,-0.4) yard[0]; u3(2.0,0.2,0.9) yard[1];\n", None, 0),
    ]
    with tempfile.TemporaryDirectory() as tmp:
        for name, src, expect, count in named:
            ref, _ = unitary(src)
            if expect is not None and distance(ref, expect) > 1e-12:
                failures.append("%s: the input is not %s (distance %g)" % (name, name, distance(ref, expect)))
            text = compile_iswap(src, tmp)
            got, _ = unitary(text)
            n = iswap_count(text)
            d = distance(ref, got)
            print("%-7s %d iSWAP, distance %.2e" % (name, n, d))
            if n != count or d > 1e-10:
                failures.append("%s: %d iSWAPs (want %d), distance %g" % (name, n, count, d))
        worst, most = 0.0, 0
        for trial in range(40):
            src = random_block(rng)
            ref, _ = unitary(src)
            text = compile_iswap(src, tmp)
            got, _ = unitary(text)
            n = iswap_count(text)
            d = distance(ref, got)
            worst, most = max(worst, d), max(most, n)
            if n > 3 or d > 1e-10:
                failures.append("random block %d: %d iSWAPs, distance %g\n%s" % (trial, n, d, src))
        print("40 random two-qubit blocks: at most %d iSWAPs, worst distance %.2e" % (most, worst))
    for f in failures:
        print("FAIL " + f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
