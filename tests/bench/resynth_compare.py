#!/usr/bin/python3
"""Two-qubit counts and compile times of the benchmark suite at -O2 and -O3 per rotation target.

Usage: resynth_compare.py WHITTLE SUITE_DIR [TARGET ...]
O3_FLAGS (environment, default "--resynth-effort 1") are added to the -O3 compiles.
SUITE_DIR is written by `build/tests/bench/whittle_benchmarks --write SUITE_DIR`, whose output lines
(`FILE --role R=ROLE`) are read again from SUITE_DIR/list.txt when present, else each file is
compiled with no role. Every compile uses `--optimize-for 2q` and the default output check.
"""
import json, os, subprocess, sys, tempfile, time

whittle, suite = sys.argv[1], sys.argv[2]
targets = sys.argv[3:] or ["cx+rz+sx", "cz+rx+rz", "iswap+rz+rx", "xx+r"]
entries = []
listing = os.path.join(suite, "list.txt")
if os.path.exists(listing):
    for line in open(listing):
        parts = line.split()
        if parts:
            entries.append((parts[0], parts[1:]))
else:
    entries = [(os.path.join(suite, f), []) for f in sorted(os.listdir(suite)) if f.endswith(".qasm")]

rows, totals = {}, {}
with tempfile.TemporaryDirectory() as tmp:
    for t in targets:
        for level in (2, 3):
            total = 0.0
            for path, extra in entries:
                rep = os.path.join(tmp, "r.json")
                t0 = time.monotonic()
                subprocess.run([whittle, "compile", path, "--target", t, f"-O{level}", "--optimize-for", "2q", "-q",
                                "--report", rep, "-o", os.path.join(tmp, "o.qasm")] + extra +
                               (os.environ.get("O3_FLAGS", "--resynth-effort 1").split() if level == 3 else []), check=True)
                total += time.monotonic() - t0
                r = json.load(open(rep))
                rows.setdefault((os.path.basename(path), t), {})[level] = (r["two_qubit_count"], r["approximation_error_bound"])
            totals[(t, level)] = total

print("| circuit | target | -O2 2q | -O3 2q | change | -O3 error bound |")
print("|---|---|---:|---:|---:|---:|")
worse = 0
for (name, t), v in rows.items():
    a, b = v[2][0], v[3][0]
    worse += b > a
    print(f"| {name} | {t} | {a} | {b} | {100.0 * (b - a) / a if a else 0:+.1f}% | {v[3][1]:.1e} |")
print()
print("| target | -O2 2q total | -O3 2q total | change | -O2 s | -O3 s |")
print("|---|---:|---:|---:|---:|---:|")
for t in targets:
    a = sum(v[2][0] for (n, tt), v in rows.items() if tt == t)
    b = sum(v[3][0] for (n, tt), v in rows.items() if tt == t)
    print(f"| {t} | {a} | {b} | {100.0 * (b - a) / a if a else 0:+.1f}% | {totals[(t, 2)]:.1f} | {totals[(t, 3)]:.1f} |")
print(f"\nrows with -O3 above -O2: {worse}")
