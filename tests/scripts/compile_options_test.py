#!/usr/bin/env python3
"""Options and outputs that must not mislead: each case is refused with exit 2 and a message that
names the option (not the input), or, for the accepted ones, works as documented. Every refusal
leaves no output file behind."""
import os
import pathlib
import subprocess
import sys
import tempfile

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))
SAMPLE = SRC / "samples" / "crane_collision.wq"

failures = []


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def run(*args, timeout=120, **kw):
    return subprocess.run([BIN, *map(str, args)], capture_output=True, text=True, timeout=timeout, **kw)


def refused(args, needle, what, forbidden=None):
    """The command exits 2 and its message contains `needle` (and not `forbidden`)."""
    try:
        p = run(*args)
    except subprocess.TimeoutExpired:
        check(False, f"{what}: did not end within the timeout")
        return
    check(p.returncode == 2, f"{what}: exit {p.returncode} (want 2); stderr: {p.stderr.strip()[:300]}")
    check(needle in p.stderr, f"{what}: message {p.stderr.strip()[:300]!r} does not contain {needle!r}")
    if forbidden:
        check(forbidden not in p.stderr, f"{what}: message {p.stderr.strip()[:300]!r} names {forbidden!r}")


with tempfile.TemporaryDirectory() as tmp:
    tmp = pathlib.Path(tmp)

    # --passes with --target: the listed passes do not lower, so the output would not be in the target.
    refused(["compile", SAMPLE, "--passes", "normalize,cancel", "--target", "clifford+t", "-q"], "--passes",
            "--passes without to-target under --target")
    # A list that lowers is accepted, and its output is in the target (the report says so truthfully).
    lowering = "normalize,pair-uncompute,plan-ancillas,lower-controls,pair-uncompute,lower-toffoli,to-target"
    p = run("compile", SAMPLE, "--passes", lowering, "--target", "clifford+t", "--emit", "qasm2", "-q")
    check(p.returncode == 0, f"--passes with the lowering passes: exit {p.returncode}: {p.stderr[:300]}")
    check("ccx" not in p.stdout, "--passes with the lowering passes writes Clifford+T (no ccx)")

    # --dump-after must name a pass that runs.
    refused(["compile", SAMPLE, "--dump-after", "NOSUCH", "-q"], "--dump-after 'NOSUCH'", "--dump-after NOSUCH")
    refused(["compile", SAMPLE, "-O0", "--dump-after", "cancel", "-q"], "--dump-after 'cancel'",
            "--dump-after of a pass the -O0 pipeline does not run")
    p = run("compile", SAMPLE, "--dump-after", "cancel", "-q")
    check(p.returncode == 0 and "# after cancel" in p.stderr, f"--dump-after cancel at -O2 works: {p.stderr[:200]}")

    # Unknown and empty --target: refused before any pass runs, the message names the option.
    refused(["compile", SAMPLE, "--target", "clifford+q", "-q", "--stats"], "--target 'clifford+q'",
            "unknown --target", forbidden=str(SAMPLE.name))
    refused(["compile", SAMPLE, "--target", "", "-q"], "--target", "empty --target")
    refused(["compile", SAMPLE, "--target", "", "-q"], "known targets", "empty --target lists the targets")

    # --epsilon: a documented range, checked whether or not a rotation needs it.
    for eps in ["-1", "0", "1", "2", "1e-16", "1e-30", "1e-60", "nan", "inf"]:
        refused(["compile", SAMPLE, "--target", "clifford+t", "--epsilon", eps, "-q"], "--epsilon",
                f"--epsilon {eps}")
    refused(["compile", SAMPLE, "--epsilon", "-1", "-q"], "--epsilon", "--epsilon -1 without a target")
    rot = tmp / "rot.wq"
    rot.write_text("# one rotation the synthesis must approximate\nqubit q\nrz(0.3) q\n")
    for eps in ["1e-15", "0.5"]:
        p = run("compile", rot, "--target", "clifford+t", "--epsilon", eps, "-q", timeout=60)
        check(p.returncode == 0, f"--epsilon {eps} (an end of the range) compiles: exit {p.returncode} {p.stderr[:200]}")

    # -o with an extension that names no format writes nothing (unless --emit says the format).
    out = tmp / "x.foo"
    refused(["compile", SAMPLE, "-o", out, "-q"], "-o", "-o x.foo")
    check(not out.exists(), "-o x.foo: no file written")
    p = run("compile", SAMPLE, "-o", out, "--emit", "qasm3", "-q")
    check(p.returncode == 0 and out.read_text().startswith("OPENQASM 3"), "-o x.foo --emit qasm3 writes 3.0")
    refused(["compile", SAMPLE, "-o", tmp / "noext", "-q"], "-o", "-o without an extension")
    refused(["compile", SAMPLE, "--emit", "qasm4", "-q"], "--emit", "--emit qasm4")

    # -o f --report f: the report would replace the output (or the other way round).
    same = tmp / "same.wq"
    refused(["compile", SAMPLE, "-o", same, "--report", same, "-q"], "--report", "-o f --report f")
    refused(["compile", SAMPLE, "-o", same, "--report", tmp / "." / "same.wq", "-q"], "--report",
            "-o f --report ./f")
    refused(["compile", SAMPLE, "--report", "-", "-q"], "--report", "--report - with the output on stdout")
    check(not same.exists(), "-o f --report f: nothing written")

    # equiv --time-budget must be a positive number of seconds.
    for budget in ["-1", "0", "nan"]:
        refused(["equiv", SAMPLE, SAMPLE, "--time-budget", budget], "--time-budget", f"equiv --time-budget {budget}")
    p = run("equiv", SAMPLE, SAMPLE, "--time-budget", "5")
    check(p.returncode == 0, f"equiv --time-budget 5 works: {p.returncode} {p.stderr[:200]}")

    # A failed write to stdout is an error (exit 2), for compile and for a subcommand that prints.
    if os.path.exists("/dev/full"):
        for args in (["compile", SAMPLE, "-q"], ["count", SAMPLE]):
            with open("/dev/full", "w") as full:
                p = subprocess.run([BIN, *map(str, args)], stdout=full, stderr=subprocess.PIPE, text=True, timeout=120)
            check(p.returncode == 2, f"{args[0]} > /dev/full: exit {p.returncode} (want 2)")
            check("standard output" in p.stderr, f"{args[0]} > /dev/full: message {p.stderr[:200]!r}")

    # A UTF-8 byte order mark at the start of a .wq or .qasm file is accepted and changes nothing.
    for name, text in [("bom.wq", "# a Harbor Logistics check\nqubit q[2]\nh q[0]\nq[1] ^= q[0]\n"),
                       ("bom.qasm", 'OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\nh q[0];\ncx q[0],q[1];\n')]:
        plain, marked = tmp / ("plain_" + name), tmp / name
        plain.write_text(text)
        marked.write_bytes(b"\xef\xbb\xbf" + text.encode())
        a, b = run("compile", plain, "-q", "--emit", "wq"), run("compile", marked, "-q", "--emit", "wq")
        check(b.returncode == 0, f"{name} with a byte order mark: exit {b.returncode} {b.stderr[:200]}")
        check(a.stdout.replace("plain_", "") == b.stdout, f"{name}: the mark changes the output")
    # An error on the first line of a marked file is located after the mark.
    bad = tmp / "bad.wq"
    bad.write_bytes(b"\xef\xbb\xbfqubit q[2] $\n")
    p = run("compile", bad, "-q")
    check(p.returncode == 2 and "bad.wq:1:12:" in p.stderr and "\n  qubit q[2] $\n             ^" in p.stderr,
          f"error in a marked file is located and shown after the mark: {p.stderr[:200]}")

sys.exit(1 if failures else 0)
