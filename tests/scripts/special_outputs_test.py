#!/usr/bin/env python3
"""`-o` naming something other than a plain file: a named pipe (like /dev/null or /dev/stdout, a
file the system provides) is written as it is and stays a pipe (a finished file renamed over it
would replace it with a regular file), a symbolic link stays a link and the file it names gets the
text, and a folder gets the output under the input's name. The text that arrives must equal
what the same compile writes to a plain file."""
import os
import pathlib
import stat
import subprocess
import sys
import tempfile
import threading

SRC = pathlib.Path(os.environ.get("WHITTLE_SOURCE_DIR", pathlib.Path(__file__).resolve().parents[2]))
BIN = os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))
SAMPLE = SRC / "samples" / "crane_collision.wq"

failures = []


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def run(*args):
    return subprocess.run([BIN, *args], capture_output=True, text=True, timeout=300)


with tempfile.TemporaryDirectory() as tmp:
    tmp = pathlib.Path(tmp)
    plain = tmp / "plain.wq"
    p = run("compile", str(SAMPLE), "-O2", "-o", str(plain), "-q")
    check(p.returncode == 0, f"plain compile exit {p.returncode}: {p.stderr}")
    expected = plain.read_text()

    # A named pipe: a reader thread takes what whittle writes.
    fifo = tmp / "pipe.wq"
    os.mkfifo(fifo)
    got = {}

    def reader():
        with open(fifo) as f:
            got["text"] = f.read()

    t = threading.Thread(target=reader, daemon=True)
    t.start()
    p = run("compile", str(SAMPLE), "-O2", "-o", str(fifo), "-q")
    t.join(timeout=20)
    check(p.returncode == 0, f"compile into a pipe exit {p.returncode}: {p.stderr}")
    check(stat.S_ISFIFO(os.lstat(fifo).st_mode), "the named pipe is still a pipe")
    check(got.get("text") == expected, "the pipe's reader got the same text as the plain file")
    check(sorted(x.name for x in tmp.iterdir()) == ["pipe.wq", "plain.wq"], "no temporary file left")

    # A symbolic link to a file in another folder.
    other = tmp / "other"
    other.mkdir()
    real = other / "real.wq"
    real.write_text("old\n")
    link = tmp / "link.wq"
    link.symlink_to(real)
    p = run("compile", str(SAMPLE), "-O2", "-o", str(link), "-q")
    check(p.returncode == 0, f"compile through a link exit {p.returncode}: {p.stderr}")
    check(link.is_symlink(), "the link is still a link")
    check(real.read_text() == expected, "the linked file got the text")
    check(sorted(x.name for x in other.iterdir()) == ["real.wq"], "no temporary file next to the linked file")

    # A folder: the output goes into it under the input's name (as for a batch), and stays a folder.
    folder = tmp / "folder.wq"
    folder.mkdir()
    p = run("compile", str(SAMPLE), "-O2", "-o", str(folder), "-q")
    check(p.returncode == 0, f"compile into a folder exit {p.returncode}: {p.stderr}")
    check(folder.is_dir(), "the folder is still a folder")
    inside = folder / "crane_collision.wq"
    check(inside.is_file() and inside.read_text() == expected, "the folder holds the output under the input's name")

if failures:
    print(f"{len(failures)} check(s) failed")
    sys.exit(1)
print("special outputs: all checks passed")
