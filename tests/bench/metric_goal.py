#!/usr/bin/python3
"""Issue 20's goal on the arithmetic library (docs/arith_costs.py's routines at n = 4 and 8): the
default run of each metric (`--optimize-for t` on clifford+t, `2q` and `depth` on cx+rz+sx) is never
beaten in that metric by the tool's other option choices (the other two metrics, -O1). Runs with
`--allow-measurement` are printed beside it (they may use measurement, so fewer T there is no fault).
Usage: tests/bench/metric_goal.py [path/to/whittle]   (about 25 min on 2 cores)"""
import pathlib
import re
import subprocess
import sys
import tempfile

SRC = pathlib.Path(__file__).resolve().parents[2]
sys.path.insert(0, str(SRC / "docs"))
import arith_costs as ac  # noqa: E402

BIN = sys.argv[1] if len(sys.argv) > 1 else str(SRC / "build" / "whittle")


def res(path, opts):
    p = subprocess.run([BIN, "compile", str(path), "-o", "/dev/null"] + opts, capture_output=True, text=True,
                       timeout=900)
    m = re.search(r"(\d+) qubits, (?:T|non-Clifford rotations) (\d+), two-qubit (\d+), depth (\d+)", p.stderr)
    if not m:
        raise SystemExit(f"no summary line for {path} {opts}:\n{p.stderr}")
    return tuple(int(x) for x in m.groups())


def main():
    beaten = cases = 0
    with tempfile.TemporaryDirectory() as tmp:
        path = pathlib.Path(tmp) / "in.wq"
        for name, spec in ac.ROUTINES.items():
            decl, call = spec[0], spec[1]
            for n in [4, 8]:
                if len(spec) > 2 and n not in spec[2]:
                    continue
                kw = dict(n=n, n2=2 * n, k=2 ** n - 3, N=2 ** n - 1, poly=ac.POLY.get(n, 19),
                          table="[" + ",".join(str((7 * i + 3) % 256) for i in range(2 ** n)) + "]")
                path.write_text(f'use "arith"\n{decl.format(**kw)}\n{call.format(**kw)}\n')
                for target, metric, idx in [("clifford+t", "t", 1), ("cx+rz+sx", "2q", 2), ("cx+rz+sx", "depth", 3)]:
                    base = res(path, ["--target", target, "--optimize-for", metric])
                    others = {f"for {a}": res(path, ["--target", target, "--optimize-for", a])
                              for a in ("t", "2q", "depth") if a != metric}
                    others["-O1"] = res(path, ["--target", target, "-O1", "--optimize-for", metric])
                    better = {k: v[idx] for k, v in others.items() if v[idx] < base[idx]}
                    meas = ""
                    if target == "clifford+t":
                        meas = f" (with measurement {res(path, ['--target', target, '--allow-measurement'])[idx]})"
                    cases += 1
                    beaten += bool(better)
                    print(f"{'BEATEN' if better else 'ok':6} {name[:34]:34} n={n} {target:10} {metric:5} "
                          f"default {base[idx]}{meas} {better or ''}", flush=True)
    print(f"{cases} cases, {beaten} where another option choice beat the default")
    return 1 if beaten else 0


if __name__ == "__main__":
    sys.exit(main())
