#!/usr/bin/python3
"""`whittle compile --verify` on every sample at every -O level, high level and lowered to clifford+t.

Each run must exit 0 (every pass checked equivalent, or undecided with a warning) or 2 (the target
refuses an op, with a message); exit 1 means a pass broke equivalence, and the test prints the
checker's counterexample. Also checks `whittle equiv` on each sample against itself (exit 0) and
that the failure files are only written on a failure.
"""
import glob
import os
import subprocess
import sys
import tempfile

WHITTLE = os.environ.get("WHITTLE_BIN", "whittle")
ROOT = os.environ.get("WHITTLE_SOURCE_DIR", os.path.join(os.path.dirname(__file__), "..", ".."))


def main():
    passed = failed = 0
    samples = sorted(glob.glob(os.path.join(ROOT, "samples", "*.wq")))
    with tempfile.TemporaryDirectory() as tmp:
        for sample in samples:
            name = os.path.basename(sample)
            r = subprocess.run([WHITTLE, "equiv", sample, sample], capture_output=True, text=True, timeout=300)
            if r.returncode == 0:
                passed += 1
            else:
                failed += 1
                print(f"FAIL: equiv {name} {name}: exit {r.returncode}\n{r.stdout}{r.stderr}")
            for level in range(4):
                for target in ["", "clifford+t"]:
                    out = os.path.join(tmp, "out.wq")
                    args = [WHITTLE, "compile", sample, f"-O{level}", "--verify", "-q", "-o", out]
                    if target:
                        args += ["--target", target]
                    r = subprocess.run(args, capture_output=True, text=True, timeout=600, cwd=tmp)
                    leftovers = glob.glob(os.path.join(tmp, "whittle-verify-*"))
                    what = f"{name} -O{level} --target '{target}'"
                    if r.returncode in (0, 2) and not leftovers:
                        passed += 1
                    elif r.returncode == 1 and leftovers:
                        failed += 1
                        print(f"FAIL: {what}: a pass broke equivalence\n{r.stderr}")
                    else:
                        failed += 1
                        print(f"FAIL: {what}: exit {r.returncode}, failure files {leftovers}\n{r.stderr}")
                    for f in leftovers:
                        os.remove(f)
    print(f"{passed} passed, {failed} failed")
    return 0 if failed == 0 and passed > 0 else 1


if __name__ == "__main__":
    sys.exit(main())
