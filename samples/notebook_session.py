# A notebook-style session with the whittle Python module: the Harbor Logistics quantum team checks
# what their crane-collision oracle costs before and after lowering, and exports it for the vendor.
#
# Run from the repository root after building (the module is in <build>/python):
#   PYTHONPATH=build/python /usr/bin/python3 samples/notebook_session.py
import os
import sys

import whittle

here = os.path.dirname(os.path.abspath(__file__))

# In [1]: read the oracle from its file (a path), or paste program text (anything with a newline).
oracle = whittle.load(os.path.join(here, "crane_collision.wq"))
print(oracle)

# In [2]: what it costs as written: the same JSON report as `whittle count --json`, as a dict.
before = oracle.count()
print(f"as written: {before['qubits']} qubits, {before['ops']} ops, gates {before['gates']}")

# In [3]: lower to Clifford+T for a fault-tolerant estimate; the loaded circuit stays as it was.
lowered = oracle.compile(target="clifford+t", level=2, allow_measurement=False)
after = lowered.count()
print(f"clifford+t: T-count {after['t_count']}, T-depth {after['t_depth']}, CNOT {after['cnot_count']}, "
      f"approximation error bound {after['approximation_error_bound']}")
for p in after["passes"]:
    print(f"  {p['name']:<18} ops {p['ops_before']} -> {p['ops_after']}, T {p['t_before']} -> {p['t_after']}")
for k in after["constructions"]:
    print(f"  {k['op']}: {k['method']} ({k['reason']})")

# In [4]: a quick sketch of a variant, typed in the notebook: a berth sensor flag.
sketch = whittle.load("""
qubit berth[2], crane
ancilla w
compute { w ^= berth[0] & berth[1] } then { crane ^= w }
""")
print(sketch.draw())  # the text diagram; in Jupyter the object itself renders as SVG

# In [5]: mistakes come back as whittle.Error with the line and a caret.
try:
    whittle.load("qubit a[2]\nb[0] ^= a[0]\n")
except whittle.Error as e:
    print(e)

# In [6]: hand the vendor OpenQASM (3.0 here; 2.0 with version=2) and keep the .wq form.
try:
    qasm = lowered.to_qasm(version=3)
    print(qasm.splitlines()[0], f"... {len(qasm.splitlines())} lines")
except whittle.Error as e:  # until the lowering is complete some ops have no OpenQASM form
    print("export:", e, file=sys.stderr)
print(lowered.to_wq().splitlines()[0])
