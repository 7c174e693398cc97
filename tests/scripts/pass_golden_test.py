# Golden test per pass: each tests/golden/passes/NAME[.VARIANT].wq runs pass NAME and carries the expected text inline.
#
# A golden file is a .wq program followed by its expectations, all in comments:
#   # run: --passes to-target,resynth-2q --target cx+rz+sx    (optional; default `--passes NAME`)
#   # expected output:        then one `# LINE` per line of the .wq text `compile` prints after the passes
#   # expected notes:         (optional) then one `# NOTE` per note the pass under test puts in the report
# The pass under test is the file name up to its first dot; the `--passes` list must name it. The compile
# runs in the file's folder with its default output check (so the output is proved equivalent to the
# input) and must exit 0; the pass must report a change, or (a pass that only reports, plan-ancillas)
# expect notes. Every pass `whittle passes` lists needs a golden file, and a file must name a listed pass.
# `--update` rewrites the expectations from the current build (tests/update-golden runs it; review the diff).
import json
import os
import re
import subprocess
import sys
import tempfile

BIN = os.path.abspath(os.environ["WHITTLE_BIN"])
SRC = os.environ["WHITTLE_SOURCE_DIR"]
GOLDEN_DIR = os.path.join(SRC, "tests", "golden", "passes")
RUN = re.compile(r"^#\s*run:\s*(.*?)\s*$")
HEADERS = {"# expected output:": "output", "# expected notes:": "notes"}

passed = failed = 0


def report(ok, name, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name}: {detail}")


def listed_passes():
    p = subprocess.run([BIN, "passes"], capture_output=True, text=True, timeout=60)
    if p.returncode != 0:
        print(f"FAIL `whittle passes` exited {p.returncode}: {p.stderr.strip()}")
        sys.exit(1)
    return [line.split()[0] for line in p.stdout.splitlines() if line.strip()]


def parse(text):
    """Splits a golden file into (program lines, run options or None, {block: [lines]})."""
    program, blocks, current, options = [], {}, None, None
    for line in text.split("\n"):
        header = HEADERS.get(line.rstrip())
        if header:
            current = header
            blocks[current] = []
            continue
        if current is None:
            m = RUN.match(line)
            if m and options is None:
                options = m.group(1).split()
            program.append(line)
            continue
        if line == "#":
            blocks[current].append("")
        elif line.startswith("# "):
            blocks[current].append(line[2:])
        elif line.strip() == "":
            continue
        else:
            raise ValueError(f"line {line!r} after '# expected ...:' is not a comment")
    while program and program[-1].strip() == "":
        program.pop()
    for lines in blocks.values():
        while lines and lines[-1] == "":
            lines.pop()
    return program, options, blocks


def pass_list(options):
    for i, o in enumerate(options):
        if o == "--passes" and i + 1 < len(options):
            return options[i + 1].split(",")
        if o.startswith("--passes="):
            return o.split("=", 1)[1].split(",")
    return []


def run_one(path, names, update):
    file = os.path.basename(path)
    pass_name = file.split(".")[0]
    if pass_name not in names:
        report(False, file, f"'{pass_name}' is not a pass `whittle passes` lists ({', '.join(names)})")
        return None
    text = open(path, encoding="utf-8").read()
    try:
        program, options, blocks = parse(text)
    except ValueError as e:
        report(False, file, str(e))
        return None
    if options is None:
        options = ["--passes", pass_name]
    if pass_name not in pass_list(options):
        report(False, file, f"the --passes list of '# run: {' '.join(options)}' does not run {pass_name}")
        return None
    if not update and "output" not in blocks:
        report(False, file, "no '# expected output:' block (tests/update-golden writes one)")
        return None
    with tempfile.TemporaryDirectory() as tmp:
        report_path = os.path.join(tmp, "report.json")
        cmd = [BIN, "compile", file, "-q", "--report", report_path] + options
        p = subprocess.run(cmd, capture_output=True, text=True, cwd=GOLDEN_DIR, timeout=300)
        if p.returncode != 0:
            report(False, file, f"`{' '.join(cmd)}` exited {p.returncode}: {p.stderr.strip()}")
            return None
        entries = [e for e in json.load(open(report_path))["passes"] if e["name"] == pass_name]
    if not entries:
        report(False, file, f"the report has no entry for {pass_name}")
        return None
    got_output = p.stdout.rstrip("\n").split("\n")
    got_notes = entries[-1]["notes"]
    if not entries[-1]["changed"] and not got_notes:
        report(False, file, f"{pass_name} changed nothing and noted nothing: the input does not show the pass at work")
        return None
    if update:
        out = "\n".join(program) + "\n# expected output:\n" + "".join(f"# {l}\n".replace("# \n", "#\n") for l in got_output)
        if got_notes or "notes" in blocks:
            out += "# expected notes:\n" + "".join(f"# {n}\n" for n in got_notes)
        if out != text:
            open(path, "w", encoding="utf-8").write(out)
            print(f"updated {file}")
        report(True, file)
        return pass_name
    ok = True
    if blocks["output"] != got_output:
        ok = False
        report(False, file, "output differs\n--- expected\n" + "\n".join(blocks["output"]) + "\n--- got\n" + "\n".join(got_output))
    if "notes" in blocks and blocks["notes"] != got_notes:
        ok = False
        report(False, file, "notes differ\n--- expected\n" + "\n".join(blocks["notes"]) + "\n--- got\n" + "\n".join(got_notes))
    if not entries[-1]["changed"] and "notes" not in blocks:
        ok = False
        report(False, file, f"{pass_name} changed nothing here and the file expects no notes")
    if ok:
        report(True, file)
    return pass_name


def main():
    update = "--update" in sys.argv[1:]
    names = listed_passes()
    if not names:
        print("FAIL `whittle passes` listed no pass")
        return 1
    covered = set()
    for f in sorted(os.listdir(GOLDEN_DIR)):
        if f.endswith(".wq"):
            name = run_one(os.path.join(GOLDEN_DIR, f), names, update)
            if name:
                covered.add(name)
    for name in names:
        report(name in covered, name, f"pass '{name}' has no passing golden file tests/golden/passes/{name}.wq")
    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
