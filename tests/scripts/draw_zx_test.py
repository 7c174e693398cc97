# `whittle draw --zx`: the simplified ZX diagram as text. H H is the identity (Nielsen & Chuang
# ch. 4) and leaves a bare wire; T is one Z spider of phase pi/4 on its wire (the spider's definition,
# Coecke & Duncan 2011, arXiv:0906.4725); a measurement has no diagram and is refused with its place.
import os
import subprocess
import sys
import tempfile

WHITTLE = os.environ["WHITTLE_BIN"]
ok = True


def fail(msg):
    global ok
    print(msg)
    ok = False


def draw(text, extra=()):
    with tempfile.TemporaryDirectory() as tmp:
        src = os.path.join(tmp, "harbor_crane.wq")
        with open(src, "w") as f:
            f.write(text)
        res = subprocess.run([WHITTLE, "draw", src, "--zx", "-o", "-", *extra], capture_output=True, text=True)
        # spacing aside: one space between words
        out = "\n".join(" ".join(line.split()) for line in res.stdout.split("\n"))
        return res.returncode, out, res.stderr.replace(tmp + "/", "")


code, out, err = draw("qubit crane[2]\nh crane[0]\nh crane[0]\ncrane[1] ^= crane[0]\ncrane[1] ^= crane[0]\n")
if code != 0 or "0 spiders" not in out or "in crane[0] = out crane[0]" not in out:
    fail(f"H H and CNOT CNOT should leave bare wires (exit {code}):\n{out}{err}")

code, out, err = draw("qubit crane\nt crane\n")
if code != 0 or "1 spiders" not in out or "s1 pi/4" not in out or "= in crane" not in out or "= out crane" not in out:
    fail(f"T should be one spider of phase pi/4 between the wire's ends (exit {code}):\n{out}{err}")

code, out, err = draw("qubit crane\nh crane\nmeasure crane as m\n")
if code != 2 or "harbor_crane.wq:3:1: error: a measure has no ZX diagram here" not in err:
    fail(f"a measurement should be refused at its line (exit {code}):\n{out}{err}")

with tempfile.TemporaryDirectory() as tmp:
    src = os.path.join(tmp, "p.wq")
    with open(src, "w") as f:
        f.write("qubit crane\n")
    res = subprocess.run([WHITTLE, "draw", src, "--zx", "-o", os.path.join(tmp, "p.svg")], capture_output=True, text=True)
    if res.returncode != 2 or "--zx draws text only" not in res.stderr or os.path.exists(os.path.join(tmp, "p.svg")):
        fail(f"--zx with an .svg output should be refused: {res.returncode} {res.stderr}")

print("draw --zx: ok" if ok else "draw --zx: FAILED")
sys.exit(0 if ok else 1)
