#!/usr/bin/env python3
"""Golden tests: compile every sample with each variant of tests/golden/variants.txt and compare the
output with the checked-in expectation tests/golden/<sample>.<variant>.out. On a mismatch, prints the
input, the output and the expectation. `tests/update-golden` regenerates the expectations."""
import difflib
import os
import pathlib
import subprocess
import sys

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))
GOLDEN = SRC / "tests" / "golden"


def variants():
    for line in (GOLDEN / "variants.txt").read_text().splitlines():
        line = line.strip()
        if not line or line.startswith("#"):
            continue
        name, opts = (part.strip() for part in line.split("|", 1))
        yield name, opts.split()


def run(sample, opts):
    p = subprocess.run([BIN, "compile", str(sample), *opts], capture_output=True, text=True, timeout=120)
    return p.returncode, p.stdout, p.stderr


def main(update=False):
    passed = failed = 0
    for sample in sorted((SRC / "samples").glob("*.wq")):
        for name, opts in variants():
            expect_file = GOLDEN / f"{sample.stem}.{name}.out"
            rc, out, err = run(sample, opts)
            got = out if rc == 0 else f"exit {rc}\n{err}"
            if update:
                expect_file.write_text(got)
                continue
            if not expect_file.exists():
                print(f"FAIL {sample.name} [{name}]: no expectation {expect_file.name} (run tests/update-golden)")
                failed += 1
                continue
            expect = expect_file.read_text()
            if got == expect:
                passed += 1
                continue
            failed += 1
            print(f"FAIL {sample.name} [{name}] options: {' '.join(opts)}")
            print("--- input ---\n" + sample.read_text())
            print("--- diff (expected -> got) ---")
            sys.stdout.writelines(difflib.unified_diff(expect.splitlines(True), got.splitlines(True), "expected", "got"))
    if update:
        print("golden expectations regenerated")
        return 0
    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main(update="--update" in sys.argv))
