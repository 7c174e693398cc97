# Expected diagnostics: each tests/errors/*.wq names its error inline as
# `# expect-error: [FILE:]LINE:COL: text`; `whittle count` must exit 2 and print `FILE:LINE:COL: error: ...text...`.
# Also made here: binary junk files, an empty file (valid), a valid CRLF file and a `use` chain past the limit.
import os
import random
import re
import subprocess
import sys
import tempfile

BIN = os.environ["WHITTLE_BIN"]
SRC = os.environ["WHITTLE_SOURCE_DIR"]
ERR_DIR = os.path.join(SRC, "tests", "errors")
EXPECT = re.compile(rb"#\s*expect-error:\s*(?:([\w.\-]+\.wq):)?(\d+):(\d+):\s*(.*?)\s*$", re.M)

passed = failed = 0


def report(ok, name, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name}: {detail}")


def run(path, timeout=60):
    try:
        p = subprocess.run([BIN, "count", path], capture_output=True, timeout=timeout)
    except subprocess.TimeoutExpired:
        return None, b"", b"timed out"
    return p.returncode, p.stdout, p.stderr


def check_expected(path):
    name = os.path.basename(path)
    data = open(path, "rb").read()
    m = EXPECT.search(data)
    if not m:
        report(False, name, "no '# expect-error:' line")
        return
    file = (m.group(1) or b"").decode() or name
    line, col, text = m.group(2).decode(), m.group(3).decode(), m.group(4).decode()
    code, _, err = run(path)
    err_s = err.decode("utf-8", "replace")
    first = err_s.splitlines()[0] if err_s else ""
    want_loc = f"{file}:{line}:{col}: error: "
    prefix = f":{line}:{col}: error: "
    loc_ok = prefix in first and os.path.basename(first.split(prefix)[0]) == file
    ok = code == 2 and loc_ok and text in first and "^" in err_s
    report(ok, name, f"exit {code}, wanted {want_loc}...{text!r}; got {first!r}")


def main():
    for f in sorted(os.listdir(ERR_DIR)):
        if f.endswith(".wq"):
            check_expected(os.path.join(ERR_DIR, f))
    with tempfile.TemporaryDirectory() as tmp:
        # Binary junk: any bytes give a located error (exit 2), never a crash or a hang.
        rng = random.Random(1234)
        for i in range(20):
            p = os.path.join(tmp, f"junk{i}.wq")
            with open(p, "wb") as fh:
                head = b"qubit a[2]\nh a[0]\n" if i % 2 else b""
                fh.write(head + bytes(rng.randrange(256) for _ in range(rng.randrange(1, 3000))))
            code, _, err = run(p)
            report(code == 2 and b"junk" in err and b"error:" in err, f"junk{i}", f"exit {code}: {err[:200]!r}")
        p = os.path.join(tmp, "elf.wq")
        with open(p, "wb") as fh:
            fh.write(b"\x7fELF\x02\x01\x01\x00" + bytes(range(256)) * 4)
        code, _, err = run(p)
        report(code == 2 and b"elf.wq:1:1: error: unexpected character '\\x7f'" in err, "elf", f"{code} {err[:200]!r}")
        # An empty file is a valid, empty program.
        p = os.path.join(tmp, "empty.wq")
        open(p, "wb").close()
        code, out, err = run(p)
        report(code == 0 and re.search(rb"ops\s+0\b", out) is not None, "empty", f"{code} {out!r} {err!r}")
        # A valid program with CRLF line ends counts like its LF twin.
        prog = b"qubit crane[2], alarm\nalarm ^= crane[0] & !crane[1]\nt alarm\n"
        lf, crlf = os.path.join(tmp, "lf.wq"), os.path.join(tmp, "crlf.wq")
        open(lf, "wb").write(prog)
        open(crlf, "wb").write(prog.replace(b"\n", b"\r\n"))
        a, b = run(lf), run(crlf)
        report(a[0] == 0 and b[0] == 0 and a[1] == b[1], "crlf-valid", f"{a} {b}")
        # `use` nested past the recursion limit (64): a chain of 70 files.
        for i in range(70):
            with open(os.path.join(tmp, f"chain{i}.wq"), "w") as fh:
                fh.write(f'use "chain{i + 1}.wq"\n' if i < 69 else "qubit q\n")
        code, _, err = run(os.path.join(tmp, "chain0.wq"))
        report(code == 2 and b"'use' nested deeper than the limit of 64" in err, "use-depth", f"{code} {err[:300]!r}")
    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
