# The house keeps its shape: every `#include "folder/..."` in a library folder names the folder
# itself or a folder it may use (the transitive closure of its `whittle_add_module(... USES ...)`
# line in CMakeLists.txt). The build enforces the same through include paths; this test also
# catches an include that would only fail in a clean build, and a folder missing from the table.
import os
import re
import sys

SRC = os.environ["WHITTLE_SOURCE_DIR"]
MODULE = re.compile(r"^whittle_add_module\((\w+)(?:\s+USES\s+([\w ]+?))?(?:\s+PUBLIC_LIBS[^)]*)?\)", re.M)
INCLUDE = re.compile(r'^\s*#\s*include\s+"([\w.+-]+)/', re.M)

text = open(os.path.join(SRC, "CMakeLists.txt"), encoding="utf-8").read()
uses = {}
for m in MODULE.finditer(text):
    uses[m.group(1)] = (m.group(2) or "").split()
if len(uses) < 8:
    print(f"FAIL only {len(uses)} whittle_add_module lines parsed from CMakeLists.txt")
    sys.exit(1)


def closure(folder, seen=None):
    seen = set() if seen is None else seen
    for u in uses.get(folder, []):
        if u not in seen:
            seen.add(u)
            closure(u, seen)
    return seen


failed = 0
checked = 0
for folder in sorted(uses):
    allowed = closure(folder) | {folder}
    root = os.path.join(SRC, folder)
    for dirpath, _, files in os.walk(root):
        for f in sorted(files):
            if not f.endswith((".h", ".cpp")):
                continue
            path = os.path.join(dirpath, f)
            body = open(path, encoding="utf-8").read()
            for m in INCLUDE.finditer(body):
                inc = m.group(1)
                if inc not in uses:
                    continue  # a system or third-party folder, e.g. "Eigen/..." is <...> anyway
                checked += 1
                if inc not in allowed:
                    line = body.count("\n", 0, m.start()) + 1
                    rel = os.path.relpath(path, SRC)
                    print(f"FAIL {rel}:{line}: includes {inc}/, but {folder}/ may use only "
                          f"{', '.join(sorted(allowed))}")
                    failed += 1

print(f"{checked} includes across {len(uses)} library folders checked; {failed} against the grain")
sys.exit(1 if failed else 0)
