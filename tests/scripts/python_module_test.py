# The Python module (<build>/python/whittle*.so) under the system python3: load, compile, count,
# export, errors as whittle.Error with the located message; counts recounted independently.
import json
import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from qasm_recount import recount  # noqa: E402

from build_config import cache_value, is_on  # noqa: E402

WHITTLE = os.environ["WHITTLE_BIN"]
SRC = os.environ["WHITTLE_SOURCE_DIR"]
if cache_value("WHITTLE_PYTHON") is not None and not is_on("WHITTLE_PYTHON"):
    print("skipped: this build was configured with WHITTLE_PYTHON=OFF")
    sys.exit(77)
# Built by default (pybind11 is a listed dependency): a missing module is a failure, not a skip.
sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(WHITTLE)), "python"))
import whittle  # noqa: E402

ok = True


def check(cond, msg):
    global ok
    if not cond:
        print("FAIL:", msg)
        ok = False


sample = os.path.join(SRC, "samples", "crane_collision.wq")

# From a path: the same counts as the CLI's `count --json`.
c = whittle.load(sample)
cli = json.loads(subprocess.run([WHITTLE, "count", sample, "--json"], capture_output=True, text=True, check=True).stdout)
d = c.count()
check(isinstance(d, dict), "count() returns a dict")
for key in ("qubits", "t_count", "t_depth", "cnot_count", "two_qubit_count", "depth", "gates", "qubits_by_role"):
    check(d.get(key) == cli.get(key), f"count()[{key}] {d.get(key)} != CLI {cli.get(key)}")
check(c.num_qubits == cli["qubits"], "num_qubits")

# Compile: a new circuit, the report fields of the CLI's --report. The program is one whose gates
# all have OpenQASM 2.0 forms even before lowering (lowering to the target is the lowering's job).
BERTH = """# Harbor Logistics: flag a crane when both berth sensors fire
qubit berth[2], crane
ancilla w
w ^= berth[0] & berth[1]
crane ^= w
t crane
h berth[0]
w ^= berth[0] & berth[1]
"""
c = whittle.load(BERTH)
cli_ops = c.count()["ops"]
low = c.compile(target="clifford+t", level=2, allow_measurement=False)
r = low.count()
check(r["target"] == "clifford+t" and r["level"] == 2, "report target/level")
check(r["options"]["allow_measurement"] is False, "report options")
check(isinstance(r["passes"], list) and "approximation_error_bound" in r, "report passes and error bound")
check(r["input_resources"]["qubits"] == 4, "report input_resources")
check(c.count()["ops"] == cli_ops, "compile() left the loaded circuit unchanged")

# The rule search's effort reaches the compile: the report names it, and effort 0 leaves the pass out.
for effort in (0, 2):
    rr = c.compile(target="cx+rz+sx", level=3, optimize_for="2q", rewrite_effort=effort).count()
    check(rr["options"]["rewrite_effort"] == effort, f"report options.rewrite_effort {effort}")
    ran = any(p["name"] == "rewrite-search" for p in rr["passes"])
    check(ran == (effort > 0), f"rewrite-search in the -O3 pipeline with effort {effort}")

# The block resynthesis' effort likewise: 0 (the default) leaves resynth-3q out, 1 puts it in.
for effort in (0, 1):
    rr = c.compile(target="cx+rz+sx", level=3, optimize_for="2q", resynth_effort=effort).count()
    check(rr["options"]["resynth_effort"] == effort, f"report options.resynth_effort {effort}")
    ran = any(p["name"] == "resynth-3q" for p in rr["passes"])
    check(ran == (effort > 0), f"resynth-3q in the -O3 pipeline with effort {effort}")

# OpenQASM 2.0 export, recounted by the independent reader; 3.0 export has its header.
q2 = low.to_qasm(2)
mine = recount(q2)
for key in ("qubits", "t_count", "cnot_count", "depth"):
    if set(r["gates"]) <= {"x", "cx", "ccx", "h", "s", "sdg", "t", "tdg", "z", "cz", "swap", "measure"}:
        check(mine[key] == r[key], f"to_qasm(2) recount {key} {mine[key]} != report {r[key]}")
check(low.to_qasm(version=3).startswith("OPENQASM 3"), "to_qasm(3) header")

# Text in: a newline or a non-existent path means program text; format='qasm' reads OpenQASM.
t = whittle.load("qubit yard[2]\nyard[1] ^= yard[0]\n")
check(t.count()["cnot_count"] == 1 and t.count()["input"] == "<text>", "load(text) .wq")
qa = whittle.load('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\nt q[0];\ncx q[0], q[1];\n', format="qasm")
check(qa.count()["t_count"] == 1 and qa.count()["cnot_count"] == 1, "load(text, format='qasm')")
# to_wq round trip: the printed program reads back with the same counts.
back = whittle.load(low.to_wq())
check(back.count()["gates"] == r["gates"], "to_wq() reads back to the same gates")

# Errors: whittle.Error carrying file:line:column, the line and a caret.
try:
    whittle.load("qubit a[2]\nb[0] ^= a[0]\n")
    check(False, "undeclared wire raised nothing")
except whittle.Error as e:
    msg = str(e)
    check(msg.startswith("<text>:2:") and "^" in msg and "b[0] ^= a[0]" in msg, f"located message: {msg!r}")
try:
    c.compile(target="clifford+t", level=7)
    check(False, "level 7 raised nothing")
except whittle.Error as e:
    check("level" in str(e), "bad level message")
try:
    low.to_qasm(4)
    check(False, "version 4 raised nothing")
except whittle.Error:
    pass
check(issubclass(whittle.Error, Exception), "whittle.Error is an Exception")

# whittle.equiv, bound when the library has the equivalence checker (verify/equivalence.h).
if os.path.exists(os.path.join(SRC, "verify", "equivalence.h")):
    check(hasattr(whittle, "equiv"), "whittle.equiv missing although verify/equivalence.h exists")
    # CNOT conjugated by H on both wires is the CNOT the other way round (Nielsen & Chuang, ch. 4; practice).
    flipped = whittle.load("qubit q[2]\nh q[0]; h q[1]\nq[1] ^= q[0]\nh q[0]; h q[1]\n")
    reversed_cx = whittle.load("qubit q[2]\nq[0] ^= q[1]\n")
    straight_cx = whittle.load("qubit q[2]\nq[1] ^= q[0]\n")
    e = whittle.equiv(flipped, reversed_cx)
    check(e["equivalent"] is True and e["verdict"] == "equivalent", f"equiv(HH CX HH, reversed CX): {e}")
    e = whittle.equiv(flipped, straight_cx)
    check(e["equivalent"] is False and e["verdict"] == "not equivalent", f"equiv(HH CX HH, CX): {e}")
    check(whittle.equiv(c, low)["verdict"] != "not equivalent", "a compiled circuit is equivalent to its source")
else:
    print("note: verify/equivalence.h is not in this tree; whittle.equiv is not bound")

# Diagrams from Python: the same SVG the CLI writes.
check(low.draw("svg").lstrip().startswith("<?xml"), "draw('svg')")
check("qubits " in c.draw(), "draw() text")
sys.exit(0 if ok else 1)
