#!/usr/bin/env python3
"""`whittle compile -j N IN... -o DIR`: several inputs compiled in parallel, one output per input.
Checks that each batch output is byte-identical to compiling that input alone (the threads share
nothing that changes a result), that a bad input reports its own file:line:column and makes the
exit code 2 while the other inputs still get their outputs, that no partial or temporary file is
left, that output names are the input's stem plus the --emit extension, and that clashing names,
a missing folder and several inputs without -o are usage errors that write nothing; that a batch
closes with a table of every input's figures, and that --report FOLDER gets one report per input
with the figures of that input compiled alone."""
import json
import os
import pathlib
import shutil
import subprocess
import sys
import tempfile

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))

# Harbor Logistics, yard team: a crane interlock in OpenQASM 2.0, to mix input formats in a batch.
CRANE_QASM = """\
OPENQASM 2.0;
include "qelib1.inc";
qreg crane[3];
qreg lock[1];
h crane[0];
ccx crane[0], crane[1], lock[0];
t crane[2];
cx crane[2], lock[0];
rz(pi/5) crane[1];
ccx crane[0], crane[1], lock[0];
"""

# The third line has a ')' where a wire is expected: the error is at line 3, column 20.
BAD_WQ = """\
qubit berth[2], flag
flag ^= berth[0]
flag ^= berth[1] & )
"""

failures = []


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def run(*args, timeout=300):
    return subprocess.run([BIN, *args], capture_output=True, text=True, timeout=timeout)


def files_in(folder):
    return sorted(p.name for p in pathlib.Path(folder).iterdir())


with tempfile.TemporaryDirectory() as tmp:
    tmp = pathlib.Path(tmp)
    inputs = tmp / "in"
    inputs.mkdir()
    # Every sample (rotations among them, so the rotation-synthesis cache is shared by threads),
    # each twice under another name, plus the OpenQASM program.
    names = []
    for sample in sorted((SRC / "samples").glob("*.wq")):
        for copy in ("", "_again"):
            dst = inputs / f"{sample.stem}{copy}.wq"
            shutil.copy(sample, dst)
            names.append(dst)
    crane = inputs / "crane_lock.qasm"
    crane.write_text(CRANE_QASM)
    names.append(crane)
    check(len(names) >= 10, f"enough inputs for a parallel batch ({len(names)})")

    for emit, ext in (("wq", ".wq"), ("qasm2", ".qasm")):
        # Reference: each input compiled alone.
        alone = tmp / f"alone_{emit}"
        alone.mkdir()
        for src in names:
            out = alone / (src.stem + ext)
            p = run("compile", str(src), "-o", str(out), "--target", "clifford+t", "--emit", emit, "-q")
            check(p.returncode == 0, f"{src.name} alone ({emit}) compiles: {p.stderr}")
        batch = tmp / f"batch_{emit}"
        batch.mkdir()
        args = ["compile", "-j", "3", *map(str, names), "-o", str(batch), "--target", "clifford+t"]
        if emit != "wq":
            args += ["--emit", emit]
        p = run(*args)
        check(p.returncode == 0, f"batch -j 3 ({emit}) exits 0: {p.returncode} {p.stderr}")
        check(files_in(batch) == files_in(alone),
              f"batch ({emit}) writes one output per input named stem{ext}: {files_in(batch)}")
        for name in files_in(alone):
            a = (alone / name).read_bytes()
            b = (batch / name).read_bytes() if (batch / name).exists() else b""
            check(a == b, f"batch output {name} ({emit}) is identical to the input compiled alone")

    # The batch output is equivalent to its input (the project's checker, on two of them).
    for src in (inputs / "load_adder.wq", crane):
        out = tmp / "batch_wq" / (src.stem + ".wq")
        p = run("equiv", str(src), str(out))
        check(p.returncode == 0, f"equiv {src.name} and its batch output: {p.stdout} {p.stderr}")

    # One bad input: it reports its own location, the others still complete, exit code 2.
    bad = inputs / "bad_berth.wq"
    bad.write_text(BAD_WQ)
    mixed = tmp / "mixed"
    mixed.mkdir()
    good = [inputs / "load_adder.wq", crane, inputs / "parity_alarm.wq"]
    p = run("compile", "-j", "2", str(good[0]), str(bad), str(good[1]), str(good[2]), "-o", str(mixed))
    check(p.returncode == 2, f"a batch with one bad input exits 2 (got {p.returncode})")
    check(f"{bad}:3:20: error:" in p.stderr, f"the bad input's error names bad_berth.wq:3:20: {p.stderr!r}")
    check(p.stderr.count("error:") == 1, f"only the bad input reports an error: {p.stderr!r}")
    check(files_in(mixed) == sorted(g.stem + ".wq" for g in good),
          f"the good inputs get their outputs, the bad one none, no temporary file: {files_in(mixed)}")
    # The closing table: one row per input in the order given, the bad one marked failed, a total.
    lines = p.stderr.splitlines()
    header = next((i for i, l in enumerate(lines) if l.split()[:2] == ["input", "qubits"]), len(lines))
    rows = [l for l in lines[header + 1:] if not l.startswith("total")]
    check([r.split()[0] for r in rows] == [str(good[0]), str(bad), str(good[1]), str(good[2])],
          f"the batch table has one row per input, in order: {rows}")
    check(len(rows) == 4 and "failed" in rows[1], f"the bad input's row says it failed: {rows}")
    check("3 of 4 compiled" in p.stderr, f"the table's total counts the compiled inputs: {p.stderr!r}")
    quiet = run("compile", "-q", str(good[0]), str(good[2]), "-o", str(mixed))
    check(quiet.returncode == 0 and "two-qubit" not in quiet.stderr, f"-q prints no table: {quiet.stderr!r}")
    # The same message as compiling the bad file alone.
    alone_bad = run("compile", str(bad), "-o", str(tmp / "bad_alone.wq"))
    check(alone_bad.returncode == 2 and alone_bad.stderr in p.stderr,
          "the batch prints the bad input's error exactly as a single compile does")
    check(not (tmp / "bad_alone.wq").exists(), "a failed single compile leaves no file")

    # Usage errors that stop before anything is written.
    clash = tmp / "clash"
    clash.mkdir()
    other = tmp / "other"
    other.mkdir()
    shutil.copy(inputs / "load_adder.wq", other / "load_adder.wq")
    p = run("compile", str(inputs / "load_adder.wq"), str(other / "load_adder.wq"), "-o", str(clash))
    check(p.returncode == 2 and "would both write" in p.stderr, f"two inputs with one stem are refused: {p.stderr!r}")
    check(files_in(clash) == [], "a refused batch writes nothing")
    p = run("compile", str(good[0]), str(good[2]))
    check(p.returncode == 2 and "-o FOLDER" in p.stderr, f"several inputs without -o are refused: {p.stderr!r}")
    p = run("compile", str(good[0]), str(good[2]), "-o", str(tmp / "missing"))
    check(p.returncode == 2 and "existing folder" in p.stderr, f"a missing output folder is refused: {p.stderr!r}")
    check(not (tmp / "missing").exists(), "the missing folder is not created")
    p = run("compile", str(good[0]), str(good[2]), "-o", str(clash), "--report", str(tmp / "r.json"))
    check(p.returncode == 2 and "--report" in p.stderr and "existing folder" in p.stderr,
          f"--report naming no folder with several inputs is refused: {p.stderr!r}")
    check(not (tmp / "r.json").exists() and files_in(clash) == [], "the refused --report batch writes nothing")

    # --report FOLDER: one report per input, named stem.json, each with the figures of the input
    # compiled alone with --report FILE (the threads share nothing that changes a result).
    reports = tmp / "reports"
    reports.mkdir()
    outs = tmp / "report_outs"
    outs.mkdir()
    p = run("compile", "-j", "2", str(good[0]), str(good[1]), str(good[2]), "-o", str(outs), "--report", str(reports),
            "--target", "clifford+t")
    check(p.returncode == 0, f"a batch with --report FOLDER exits 0: {p.stderr!r}")
    check(files_in(reports) == sorted(g.stem + ".json" for g in good), f"one report per input: {files_in(reports)}")
    for g in good:
        single = tmp / f"{g.stem}_alone.json"
        q = run("compile", str(g), "-o", str(tmp / f"{g.stem}_alone.wq"), "--report", str(single), "--target", "clifford+t", "-q")
        check(q.returncode == 0, f"{g.name} alone with --report: {q.stderr!r}")
        if q.returncode == 0 and (reports / (g.stem + ".json")).exists():
            a = json.loads(single.read_text())
            b = json.loads((reports / (g.stem + ".json")).read_text())
            for key in ("qubits", "t_count", "two_qubit_count", "depth", "gates"):
                check(a[key] == b[key], f"{g.stem}: the batch report's {key} is the single compile's ({b[key]} vs {a[key]})")
        # the table's row shows the report's figures
        row = [l.split() for l in p.stderr.splitlines() if l.startswith(str(g) + " ")]
        if row and (reports / (g.stem + ".json")).exists():
            b = json.loads((reports / (g.stem + ".json")).read_text())
            check(row[0][1:5] == [str(b["qubits"]), str(b["t_count"]), str(b["two_qubit_count"]), str(b["depth"])],
                  f"{g.stem}: the table row {row[0][1:5]} shows the report's qubits, T, two-qubit, depth")
        else:
            check(False, f"{g.stem}: a table row and a report")

    # --verify in parallel: every pass of every input checked, exit 0.
    verified = tmp / "verified"
    verified.mkdir()
    p = run("compile", "-j", "2", str(good[0]), str(good[1]), str(good[2]), "-o", str(verified), "--verify",
            "--target", "clifford+t")
    check(p.returncode == 0, f"--verify in a parallel batch exits 0: {p.stderr!r}")
    check(files_in(verified) == sorted(g.stem + ".wq" for g in good), f"--verify batch outputs: {files_in(verified)}")

if failures:
    print(f"{len(failures)} failure(s)")
    sys.exit(1)
print("batch compile: all checks passed")
