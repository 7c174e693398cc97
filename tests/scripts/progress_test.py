# The progress line: shown on a terminal stderr (a pty here) once the run passes the threshold, never
# on a pipe or in output files, never with --quiet, and not for runs shorter than the default 1 s.
import os
import pty
import select
import subprocess
import sys
import tempfile

WHITTLE = os.environ["WHITTLE_BIN"]
SRC = os.environ["WHITTLE_SOURCE_DIR"]
SAMPLE = os.path.join(SRC, "samples", "crane_collision.wq")
MARK = "whittle: ["
ok = True


def on_pty(args, env):
    """Runs with stderr on a pseudo-terminal; returns (exit code, what reached the terminal)."""
    master, slave = pty.openpty()
    p = subprocess.Popen([WHITTLE] + args, stdout=subprocess.DEVNULL, stderr=slave, env=env)
    os.close(slave)
    seen = b""
    while True:
        r, _, _ = select.select([master], [], [], 10)
        if not r:
            break
        try:
            chunk = os.read(master, 4096)
        except OSError:  # the child closed the terminal
            break
        if not chunk:
            break
        seen += chunk
    rc = p.wait()
    os.close(master)
    return rc, seen.decode("utf-8", "replace")


with tempfile.TemporaryDirectory() as tmp:
    out = os.path.join(tmp, "out.wq")
    args = ["compile", SAMPLE, "--target", "clifford+t", "-o", out]
    now = dict(os.environ, WHITTLE_PROGRESS_AFTER_MS="0")  # show at once: the run need not last a second

    rc, seen = on_pty(args, now)
    if rc != 0 or MARK not in seen or "%" not in seen:
        print(f"terminal stderr: no progress line (rc {rc}): {seen!r}")
        ok = False
    if "\x1b[K" not in seen:
        print(f"the progress line is not erased at the end: {seen!r}")
        ok = False
    if MARK in open(out, encoding="utf-8").read():
        print("progress text reached the output file")
        ok = False

    rc, seen = on_pty(args + ["--quiet"], now)
    if MARK in seen:
        print(f"--quiet still shows progress: {seen!r}")
        ok = False

    default = {k: v for k, v in os.environ.items() if k != "WHITTLE_PROGRESS_AFTER_MS"}
    rc, seen = on_pty(args, default)
    if MARK in seen:
        print(f"a run under a second showed progress: {seen!r}")
        ok = False

    r = subprocess.run([WHITTLE] + args, capture_output=True, text=True, env=now)
    if r.returncode != 0 or MARK in r.stderr or "\r" in r.stderr or MARK in r.stdout:
        print(f"progress reached a pipe: {r.stderr!r}")
        ok = False
    r = subprocess.run([WHITTLE] + args[:-2], capture_output=True, text=True, env=now)  # output on stdout
    if MARK in r.stdout or MARK in r.stderr:
        print("progress reached stdout or a piped stderr")
        ok = False
sys.exit(0 if ok else 1)
