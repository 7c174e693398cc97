# Installs whittle into a temporary prefix and builds tests/consumer against it with find_package.
import json
import os
import shutil
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from build_config import is_on  # noqa: E402

if is_on("WHITTLE_SANITIZE"):
    # The sanitized static library needs the sanitizer runtime linked into every consumer.
    print("skipped: a WHITTLE_SANITIZE build is not installed for consumers")
    sys.exit(77)

bin_path = os.environ["WHITTLE_BIN"]
source = os.environ["WHITTLE_SOURCE_DIR"]
build = os.path.dirname(os.path.abspath(bin_path))


def run(args, **kw):
    r = subprocess.run(args, capture_output=True, text=True, **kw)
    if r.returncode != 0:
        print("command failed:", " ".join(args), "\n", r.stdout[-4000:], r.stderr[-4000:])
        sys.exit(1)
    return r


with tempfile.TemporaryDirectory() as tmp:
    prefix = os.path.join(tmp, "prefix")
    run(["cmake", "--install", build, "--prefix", prefix])
    expected = [
        "bin/whittle",
        "include/whittle/whittle.h",
        "include/whittle/compiler/compile.h",
        "include/whittle/ir/circuit.h",
        "include/whittle/frontend/load.h",
        "include/whittle/passes/pipeline.h",
        "include/whittle/output/report.h",
        "lib/cmake/whittle/whittleConfig.cmake",
        "lib/cmake/whittle/whittleTargets.cmake",
    ]
    libdirs = [d for d in ("lib", "lib64") if os.path.exists(os.path.join(prefix, d, "libwhittle_ir.a"))]
    ok = bool(libdirs)
    if not ok:
        print("libwhittle_ir.a not installed")
    for rel in expected:
        if not os.path.exists(os.path.join(prefix, rel)):
            print("not installed:", rel)
            ok = False
    stdlib_src = os.path.join(source, "frontend", "stdlib")
    if os.path.isdir(stdlib_src):
        for f in os.listdir(stdlib_src):
            if f.endswith(".wq") and not os.path.exists(os.path.join(prefix, "share/whittle/stdlib", f)):
                print("stdlib file not installed:", f)
                ok = False
    # Only the public headers (cmake/install.cmake): the library's own folders stay out.
    for private in ("cli", "lowering", "synthesis", "verify", "passes/registry.h", "output/emit_qasm.h"):
        if os.path.exists(os.path.join(prefix, "include/whittle", private)):
            print("a private header or folder was installed:", private)
            ok = False
    # The installed CLI runs.
    r = run([os.path.join(prefix, "bin/whittle"), "--version"])
    if "whittle" not in r.stdout:
        print("installed CLI printed", r.stdout)
        ok = False

    cbuild = os.path.join(tmp, "consumer")
    run(["cmake", "-S", os.path.join(source, "tests/consumer"), "-B", cbuild, "-DCMAKE_PREFIX_PATH=" + prefix,
         "-DCMAKE_BUILD_TYPE=Release"])
    run(["cmake", "--build", cbuild, "-j2"])
    r = run([os.path.join(cbuild, "consumer")])
    report = json.loads(r.stdout.splitlines()[0])
    # The consumer's circuit: one Toffoli and one T (a pi/4 phase on one wire).
    if report["qubits"] != 3 or report["t_count"] != 1 or report["toffoli_count"] != 1 or report["gates"] != {"ccx": 1, "t": 1}:
        print("consumer report wrong:", report)
        ok = False
    # The one compile entry point, through the installed headers: the Toffoli is lowered to Clifford+T.
    compiled = json.loads(r.stdout.splitlines()[2])
    if compiled["target"] != "clifford+t" or compiled["toffoli_count"] != 0 or compiled["t_count"] == 0 \
            or compiled["input_resources"]["toffoli_count"] != 1:
        print("consumer compile report wrong:", compiled)
        ok = False
    sys.exit(0 if ok else 1)
