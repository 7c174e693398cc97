#!/usr/bin/env python3
"""The pass options of `whittle compile` on a Harbor Logistics oracle: --passes runs exactly the
listed passes, --dump-after prints the circuit after a pass that changed it, --time-passes and
--stats print one line per pass, an unknown pass name is a usage error (exit 2), and the result
is equivalent to the input (`whittle equiv`)."""
import json
import os
import pathlib
import subprocess
import sys
import tempfile

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))

# Harbor Logistics, gate team: a truck-gate alarm with a check that was written twice (the second
# copy undoes the first), a T and its inverse around a CNOT on another wire, and two controlled
# flips that differ only in one control's polarity.
PROGRAM = """\
qubit lane[3], alarm, spare
alarm ^= lane[0] & lane[1]
spare ^= lane[2]
alarm ^= lane[0] & lane[1]
t lane[0]
spare ^= lane[1]
~t lane[0]
alarm ^= lane[2] & lane[1]
alarm ^= lane[2] & !lane[1]
"""

failures = []


def find_t(j):
    """The first "t_count" in a JSON report, wherever the schema nests it."""
    if isinstance(j, dict):
        if "t_count" in j:
            return j["t_count"]
        for v in j.values():
            t = find_t(v)
            if t is not None:
                return t
    return None


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def run(*args):
    return subprocess.run([BIN, *args], capture_output=True, text=True, timeout=60)


with tempfile.TemporaryDirectory() as tmp:
    src = pathlib.Path(tmp) / "gate_alarm.wq"
    src.write_text(PROGRAM)
    out = pathlib.Path(tmp) / "out.wq"
    p = run("compile", str(src), "-o", str(out), "--passes=normalize,cancel,merge-controls",
            "--dump-after=cancel", "--time-passes", "--stats", "-q")
    check(p.returncode == 0, f"compile exit {p.returncode}: {p.stderr}")
    err = p.stderr
    lines = [l for l in err.splitlines() if l.split() and l.split()[0] in ("normalize", "cancel", "merge-controls")]
    check([l.split()[0] for l in lines] == ["normalize", "cancel", "merge-controls"], f"one line per pass in order: {lines}")
    check(all(" ms" in l for l in lines), "--time-passes prints a time on every line")
    check(all(" MiB" in l for l in lines), "--time-passes prints the peak memory on every line")
    check(any("inverse-pairs=" in l for l in lines), "--stats prints the cancel counters")
    check(any("controls-merged=" in l for l in lines), "--stats prints the merge-controls counters")
    check("# after cancel" in err, "--dump-after=cancel prints the circuit after cancel")
    check("# after merge-controls" not in err, "--dump-after prints only the named pass")
    text = out.read_text() if out.exists() else ""
    body = [l for l in text.splitlines() if l.strip() and not l.startswith("#") and not l.startswith("qubit")]
    # Left: spare ^= lane[2]; spare ^= lane[1]; alarm ^= lane[2] (merged), nothing else.
    check(len(body) == 3, f"three ops left, got {body}")
    e = run("equiv", str(src), str(out))
    check(e.returncode == 0, f"equiv exit {e.returncode}: {e.stdout} {e.stderr}")

    p = run("compile", str(src), "--passes=normalize,no-such-pass")
    check(p.returncode == 2, f"unknown pass exits 2, got {p.returncode}")
    check("no-such-pass" in p.stderr, "the error names the unknown pass")

    # -O2 output compiled again at -O2 never gains T gates (and stays equivalent).
    for sample in sorted((SRC / "samples").glob("*.wq")):
        once = pathlib.Path(tmp) / (sample.stem + ".1.wq")
        twice = pathlib.Path(tmp) / (sample.stem + ".2.wq")
        p1 = run("compile", str(sample), "-O2", "-o", str(once), "-q")
        if p1.returncode != 0:
            check(False, f"{sample.name}: -O2 failed: {p1.stderr}")
            continue
        p2 = run("compile", str(once), "-O2", "-o", str(twice), "-q")
        check(p2.returncode == 0, f"{sample.name}: -O2 of -O2 failed: {p2.stderr}")
        c1 = run("count", str(once), "--json")
        c2 = run("count", str(twice), "--json")
        t1 = find_t(json.loads(c1.stdout)) if c1.returncode == 0 else None
        t2 = find_t(json.loads(c2.stdout)) if c2.returncode == 0 else None
        check(t1 is not None and t2 is not None and t2 <= t1, f"{sample.name}: T {t1} -> {t2}")
        e = run("equiv", str(sample), str(twice))
        check(e.returncode == 0, f"{sample.name}: -O2 twice not equivalent: {e.stdout} {e.stderr}")

if failures:
    print(f"{len(failures)} failure(s)")
    sys.exit(1)
print("ok")
