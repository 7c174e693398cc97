#!/usr/bin/env python3
"""SIGTERM while `compile -o` writes its temporary file leaves no file behind: the output is written
to a hidden temporary name and renamed, and a terminating signal in between must remove it. The
test waits for the temporary file to appear, stops the process there (SIGSTOP), checks the file is
still there, then sends SIGTERM and SIGCONT, so the signal lands inside the write every time."""
import os
import pathlib
import signal
import subprocess
import sys
import tempfile
import time

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))


def state(pid):
    try:
        with open(f"/proc/{pid}/stat") as f:
            return f.read().rsplit(")", 1)[1].split()[0]
    except OSError:
        return "gone"


with tempfile.TemporaryDirectory() as tmp:
    tmp = pathlib.Path(tmp)
    # A large input so that the output (about 9 MB) takes a while to write.
    src = tmp / "big.wq"
    with open(src, "w") as f:
        f.write("# Harbor Logistics load test: many gates, so the output file is large\nqubit crate[64]\n")
        for i in range(600000):
            f.write(f"h crate[{i % 64}]\ncrate[{(i + 1) % 64}] ^= crate[{i % 64}]\n")
    outdir = tmp / "out"
    outdir.mkdir()
    caught = 0
    leftovers = []
    for attempt in range(30):
        for p in outdir.iterdir():
            p.unlink()
        proc = subprocess.Popen([BIN, "compile", str(src), "-O0", "-q", "-o", str(outdir / "big.wq")],
                                stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        stopped = False
        while proc.poll() is None:
            if any(n.startswith(".") for n in os.listdir(outdir)):
                os.kill(proc.pid, signal.SIGSTOP)
                stopped = True
                break
        if not stopped:
            continue
        while state(proc.pid) not in ("T", "t", "gone", "Z"):
            time.sleep(0.001)
        hidden = [n for n in os.listdir(outdir) if n.startswith(".")]
        if hidden and state(proc.pid) in ("T", "t"):
            caught += 1
            os.kill(proc.pid, signal.SIGTERM)
            os.kill(proc.pid, signal.SIGCONT)
            rc = proc.wait(timeout=60)
            if rc != -signal.SIGTERM:
                print(f"attempt {attempt}: exit {rc}, want death by SIGTERM")
                leftovers.append(f"exit {rc}")
            left = sorted(os.listdir(outdir))
            if left:
                print(f"attempt {attempt}: left behind {left}")
                leftovers.append(left)
        else:
            os.kill(proc.pid, signal.SIGCONT)
            proc.wait(timeout=60)
        if caught >= 3:
            break
    print(f"SIGTERM delivered inside the write {caught} times; files left behind {len(leftovers)} times")
    if caught == 0:
        print("never stopped the process while its temporary file existed")
        sys.exit(1)
    sys.exit(1 if leftovers else 0)
