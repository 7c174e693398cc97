#!/usr/bin/env python3
"""The sources that drew GCC 12 false positives only at higher optimization (-Wrestrict on string
concatenation, -Wmaybe-uninitialized inside Boost.Multiprecision) compile warning-free under
-Werror at -O3 (Release) and -Os (MinSizeRel), whatever this build's own type is. Each file is
compiled again with its own command from compile_commands.json, the optimization flag replaced.
(The full check is a build of each CMake build type; this keeps the known cases in the suite.)"""
import json
import os
import pathlib
import shlex
import subprocess
import sys

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))
build = pathlib.Path(BIN).resolve().parent
db_path = build / "compile_commands.json"
if not db_path.exists():
    print("skipped: no compile_commands.json in", build)
    sys.exit(77)

FILES = ["ir/printer.cpp", "synthesis/norm_equation.cpp", "lowering/target_clifford_t.cpp"]
entries = {pathlib.Path(e["file"]).resolve(): e for e in json.loads(db_path.read_text())}
failures = 0
for rel in FILES:
    e = entries.get((SRC / rel).resolve())
    if e is None:
        print("not in compile_commands.json:", rel)
        failures += 1
        continue
    args = e["arguments"] if "arguments" in e else shlex.split(e["command"])
    if "-fsanitize=address,undefined" in args:
        print("skipped: a sanitizer build (its flags are not a release build's)")
        sys.exit(77)
    base, skip = [], False
    for a in args:
        if skip:
            skip = False
            continue
        if a == "-o":
            skip = True
            continue
        if a in ("-MD", "-MMD") or a.startswith(("-MF", "-MT", "-O", "-g")) or a == "-DNDEBUG":
            skip = a in ("-MF", "-MT")
            continue
        base.append(a)
    for level in ("-O3", "-Os"):
        cmd = base + [level, "-DNDEBUG", "-Wall", "-Wextra", "-Werror", "-o", os.devnull]
        r = subprocess.run(cmd, cwd=e["directory"], capture_output=True, text=True, timeout=900)
        if r.returncode != 0:
            failures += 1
            lines = [l for l in r.stderr.splitlines() if "error" in l or "warning" in l]
            print(f"FAIL: {rel} at {level}:", "\n  ".join(lines[:5]))
        else:
            print(f"ok: {rel} at {level}")
sys.exit(1 if failures else 0)
