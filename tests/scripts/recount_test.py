# Recounts emitted OpenQASM 2.0 independently (tests/scripts/qasm_recount.py) and compares with
# `whittle count --json` of that file and with the `--report` written by the compile that emitted it.
import json
import os
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from qasm_recount import recount  # noqa: E402

WHITTLE = os.environ["WHITTLE_BIN"]
SRC = os.environ["WHITTLE_SOURCE_DIR"]
ONE_LINE_GATES = {"x", "y", "z", "h", "s", "sdg", "t", "tdg", "p", "sx", "sxdg", "rx", "ry", "rz", "u", "cx",
                  "cz", "cp", "ch", "crz", "ccx", "swap", "cswap", "measure", "reset"}
FIELDS = ("qubits", "ops", "t_count", "cnot_count", "two_qubit_count", "depth", "gates")

# Hand-written OpenQASM 2.0 inputs: the textbook 7-T Toffoli (Nielsen & Chuang Fig. 4.9, from
# memory) on a Harbor berth comparator's wires, and a small crane-check with CZ, swap and a measurement.
INPUTS = {
    "toffoli.qasm": """OPENQASM 2.0;
include "qelib1.inc";
qreg berth[3];
h berth[2];
cx berth[1], berth[2];
tdg berth[2];
cx berth[0], berth[2];
t berth[2];
cx berth[1], berth[2];
tdg berth[2];
cx berth[0], berth[2];
t berth[1];
t berth[2];
h berth[2];
cx berth[0], berth[1];
t berth[0];
tdg berth[1];
cx berth[0], berth[1];
""",
    "crane.qasm": """OPENQASM 2.0;
include "qelib1.inc";
qreg crane[3];
qreg flag[1];
creg m[1];
h crane[0];
ccx crane[0], crane[1], flag[0];
cz crane[1], crane[2];
swap crane[0], crane[2];
s flag[0];
t crane[1];
measure flag[0] -> m[0];
""",
}


def run(args):
    r = subprocess.run([WHITTLE] + args, capture_output=True, text=True)
    return r.returncode, r.stdout, r.stderr


def compare(label, ours, theirs):
    bad = [f for f in FIELDS if ours[f] != theirs[f]]
    for f in bad:
        print(f"{label}: {f}: recount {ours[f]} != whittle {theirs[f]}")
    return not bad


ok = True
compared = 0
reports = 0
with tempfile.TemporaryDirectory() as tmp:
    sources = []
    for name, text in INPUTS.items():
        path = os.path.join(tmp, name)
        with open(path, "w") as f:
            f.write(text)
        sources.append(path)
    sources += [os.path.join(SRC, "samples", s) for s in sorted(os.listdir(os.path.join(SRC, "samples")))
                if s.endswith(".wq")]
    for src in sources:
        stem = os.path.splitext(os.path.basename(src))[0]
        out = os.path.join(tmp, stem + ".out.qasm")
        report = os.path.join(tmp, stem + ".json")
        for target in (["--target", "clifford+t"], []):
            rc, _, err = run(["compile", src, *target, "-o", out, "--report", report])
            if rc == 0:
                break
        if rc != 0:
            # Only the samples may need a lowering that is not there; the hand-written inputs must pass.
            if src.startswith(tmp):
                print(f"{stem}: compile failed: {err}")
                ok = False
            continue
        with open(out) as f:
            ours = recount(f.read())
        rc, js, err = run(["count", out, "--json"])
        if rc != 0:
            print(f"{stem}: count of the emitted file failed: {err}")
            ok = False
            continue
        ok &= compare(stem + " (count --json)", ours, json.loads(js))
        with open(report) as f:
            rep = json.load(f)
        # The report counts the circuit as compiled; the file is that circuit one gate per line only
        # when every op has an OpenQASM 2.0 gate of its own (always so after lowering to a target).
        if set(rep["gates"]) <= ONE_LINE_GATES:
            ok &= compare(stem + " (--report)", ours, rep)
            reports += 1
        compared += 1
    # The hand-written inputs themselves: recount vs `whittle count --json` of the input, and the
    # Toffoli's counts are also the book's: 7 T, 6 CNOT, 2 H, 15 gates.
    for name, text in INPUTS.items():
        rc, js, err = run(["count", os.path.join(tmp, name), "--json"])
        if rc != 0:
            print(f"{name}: count failed: {err}")
            ok = False
            continue
        ok &= compare(name + " (input)", recount(text), json.loads(js))
    t = json.loads(run(["count", os.path.join(tmp, "toffoli.qasm"), "--json"])[1] or "{}")
    if (t.get("t_count"), t.get("cnot_count"), t.get("gates", {}).get("h"), t.get("ops")) != (7, 6, 2, 15):
        print("textbook Toffoli counts:", t)
        ok = False
print(f"compared {compared} emitted files, {reports} reports")
if compared < len(INPUTS) or reports < len(INPUTS):
    ok = False
sys.exit(0 if ok else 1)
