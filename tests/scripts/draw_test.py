# `whittle draw`: the SVG parses with a real XML parser (lxml) and renders to a non-blank PNG with
# rsvg-convert (librsvg); the text form holds the same content; --compare and wrapping work; PNG and
# PDF outputs, --hide-idle, and --by-line on a program compiled with --target.
import os
import struct
import subprocess
import sys
import tempfile
import zlib

from lxml import etree

WHITTLE = os.environ["WHITTLE_BIN"]
SRC = os.environ["WHITTLE_SOURCE_DIR"]
SVG_NS = "{http://www.w3.org/2000/svg}"
ok = True


def fail(msg):
    global ok
    print(msg)
    ok = False


def run(args):
    return subprocess.run([WHITTLE] + args, capture_output=True, text=True)


def png_pixels(path):
    """Decodes an 8-bit RGB/RGBA PNG with zlib (PNG spec filters 0-4); returns (w, h, channels, rows)."""
    data = open(path, "rb").read()
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
    pos, idat, w = 8, b"", 0
    while pos < len(data):
        n, kind = struct.unpack(">I4s", data[pos:pos + 8])
        chunk = data[pos + 8:pos + 8 + n]
        if kind == b"IHDR":
            w, h, depth, color = struct.unpack(">IIBB", chunk[:10])
            assert depth == 8 and color in (2, 6), f"unexpected PNG format {depth}/{color}"
            ch = 3 if color == 2 else 4
        elif kind == b"IDAT":
            idat += chunk
        pos += 12 + n
    raw = zlib.decompress(idat)
    stride = w * ch
    rows, prev = [], bytearray(stride)
    for y in range(h):
        f = raw[y * (stride + 1)]
        line = bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
        for i in range(stride):
            a = line[i - ch] if i >= ch else 0
            b = prev[i]
            c = prev[i - ch] if i >= ch else 0
            if f == 1:
                line[i] = (line[i] + a) & 255
            elif f == 2:
                line[i] = (line[i] + b) & 255
            elif f == 3:
                line[i] = (line[i] + (a + b) // 2) & 255
            elif f == 4:
                p = a + b - c
                pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                line[i] = (line[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
        rows.append(bytes(line))
        prev = line
    return w, h, ch, rows


def ink_share(path):
    """Share of pixels that are clearly not the white background (opaque and darker than 200)."""
    w, h, ch, rows = png_pixels(path)
    dark = 0
    for row in rows:
        for x in range(w):
            px = row[x * ch:(x + 1) * ch]
            if (ch == 3 or px[3] > 128) and min(px[:3]) < 200:
                dark += 1
    return dark / (w * h), w, h


samples = sorted(os.path.join(SRC, "samples", s) for s in os.listdir(os.path.join(SRC, "samples")) if s.endswith(".wq"))
with tempfile.TemporaryDirectory() as tmp:
    drawn = 0
    for sample in samples:
        stem = os.path.splitext(os.path.basename(sample))[0]
        svg = os.path.join(tmp, stem + ".svg")
        r = run(["draw", sample, "-o", svg])
        if r.returncode != 0:
            fail(f"{stem}: draw failed: {r.stderr}")
            continue
        root = etree.parse(svg).getroot()  # raises on a document that is not well-formed
        if root.tag != SVG_NS + "svg":
            fail(f"{stem}: root element is {root.tag}")
        texts = ["".join(t.itertext()) for t in root.iter(SVG_NS + "text")]
        # Every register declared in the sample is labelled (qubit/ancilla/borrow lines).
        for line in open(sample):
            words = line.split("#")[0].split()
            if words and words[0] in ("qubit", "ancilla", "borrow"):
                for decl in " ".join(words[1:]).split(","):
                    name = decl.strip().split("[")[0]
                    if name and name not in texts:
                        fail(f"{stem}: register {name} has no label in the SVG")
        png = os.path.join(tmp, stem + ".png")
        rr = subprocess.run(["rsvg-convert", svg, "-o", png], capture_output=True, text=True)
        if rr.returncode != 0:
            fail(f"{stem}: rsvg-convert failed: {rr.stderr}")
            continue
        if drawn >= 3:  # decoding in pure Python is slow: the pixel check runs on the first three
            drawn += 1
            if open(png, "rb").read(8) != b"\x89PNG\r\n\x1a\n":
                fail(f"{stem}: rsvg-convert wrote no PNG")
            continue
        share, w, h = ink_share(png)
        # A drawn circuit puts ink (wires, labels, glyphs) on a few percent of its pixels; a blank or
        # broken render has none, a solid fill would have nearly all.
        if not (0.005 < share < 0.6):
            fail(f"{stem}: {w}x{h} PNG has ink on {share:.4f} of its pixels")
        drawn += 1

    for sample in samples:
        stem = os.path.splitext(os.path.basename(sample))[0]
        txt = os.path.join(tmp, stem + ".txt")
        r = run(["draw", sample, "-o", txt])
        if r.returncode != 0:
            fail(f"{stem}: text draw failed: {r.stderr}")
            continue
        text = open(txt, encoding="utf-8").read()
        if "qubits " not in text or "depth " not in text:
            fail(f"{stem}: text diagram has no counts line")
        r = run(["draw", sample, "-o", txt, "--ascii"])
        if any(ord(ch) > 127 for ch in open(txt, encoding="utf-8").read()):
            fail(f"{stem}: --ascii output is not ASCII")
    if drawn < 3:
        fail(f"only {drawn} samples drawn")

    # --compare: two panels with their titles and counts, in SVG and text.
    a, b = samples[0], samples[1]
    out = os.path.join(tmp, "cmp.svg")
    r = run(["draw", a, "--compare", b, "-o", out])
    if r.returncode != 0:
        fail("compare failed: " + r.stderr)
    else:
        texts = ["".join(t.itertext()) for t in etree.parse(out).getroot().iter(SVG_NS + "text")]
        if "before: " + a not in texts or "after: " + b not in texts:
            fail("compare titles missing")
        if sum(1 for t in texts if t.startswith("qubits ")) != 2:
            fail("compare needs two counts lines")
        png = os.path.join(tmp, "cmp.png")
        subprocess.run(["rsvg-convert", out, "-o", png], check=True)
        if ink_share(png)[0] < 0.005:
            fail("compare PNG is blank")

    # Wrapping: at --width 2 a sample of more than 2 columns has more rows than at the default width.
    r1 = run(["draw", samples[0], "-o", "-", "--width", "2"])
    r2 = run(["draw", samples[0], "-o", "-", "--width", "0"])
    if r1.stdout.count("── column") < 1 or r2.stdout.count("── column") != 0:
        fail("--width does not wrap")

    # Bad output names: exit 2, a message, no file left behind.
    bad = os.path.join(tmp, "x.gif")
    r = run(["draw", samples[0], "-o", bad])
    if r.returncode != 2 or "svg" not in r.stderr or os.path.exists(bad):
        fail(f"draw -o x.gif: rc {r.returncode}, {r.stderr!r}")

    # PNG and PDF outputs (made by rsvg-convert): the PNG decodes and has ink, the PDF has its header.
    png = os.path.join(tmp, "direct.png")
    r = run(["draw", samples[0], "-o", png])
    if r.returncode != 0 or not os.path.exists(png) or ink_share(png)[0] < 0.005:
        fail(f"draw -o .png: rc {r.returncode}, {r.stderr!r}")
    pdf = os.path.join(tmp, "direct.pdf")
    r = run(["draw", samples[0], "-o", pdf])
    if r.returncode != 0 or open(pdf, "rb").read(5) != b"%PDF-":
        fail(f"draw -o .pdf: rc {r.returncode}, {r.stderr!r}")
    # Without rsvg-convert on the PATH: a message naming it, exit 2, no file.
    gone = os.path.join(tmp, "gone.png")
    r = subprocess.run([WHITTLE, "draw", samples[0], "-o", gone], capture_output=True, text=True,
                       env={**os.environ, "PATH": "/nonexistent"})
    if r.returncode != 2 or "rsvg-convert" not in r.stderr or os.path.exists(gone):
        fail(f"draw -o .png without rsvg-convert: rc {r.returncode}, {r.stderr!r}")

    # --hide-idle: the lanes of wires no op touches are left out (Harbor Logistics: a berth flag
    # computed from two sensors, three spare sensor wires and a work wire untouched).
    idle = os.path.join(tmp, "idle.wq")
    with open(idle, "w") as f:
        f.write("qubit sensor_a, sensor_b, spare[3], berth_flag\nancilla scratch\nberth_flag ^= sensor_a & sensor_b\n")
    full = run(["draw", idle, "-o", "-", "--ascii"])
    hidden = run(["draw", idle, "-o", "-", "--ascii", "--hide-idle"])
    if full.returncode != 0 or hidden.returncode != 0:
        fail(f"--hide-idle runs: {full.stderr!r} {hidden.stderr!r}")
    elif "spare" not in full.stdout or "scratch" not in full.stdout:
        fail("the full drawing shows the idle wires")
    elif "spare" in hidden.stdout or "scratch" in hidden.stdout or "berth_flag" not in hidden.stdout:
        fail(f"--hide-idle leaves out exactly the idle wires:\n{hidden.stdout}")

    # --by-line with --target: the compiled ops are bracketed by the source line that made them, and
    # the drawing is of the checked compile (its counts line equals `compile`'s output counts).
    adder = os.path.join(SRC, "samples", "load_adder.wq")
    r = run(["draw", adder, "-o", "-", "--target", "clifford+t", "--by-line", "--width", "0", "--ascii"])
    lines = open(adder).read().splitlines()
    call_lines = [i + 1 for i, l in enumerate(lines) if l.strip() and not l.strip().startswith(("#", "let", "qubit", "ancilla", "routine"))]
    if r.returncode != 0:
        fail(f"--by-line --target: {r.stderr!r}")
    else:
        shown = {int(x) for x in __import__("re").findall(r"line (\d+)", r.stdout)}
        if not shown or not shown <= set(call_lines):
            fail(f"--by-line brackets name source lines with statements: {sorted(shown)} vs {call_lines}")
        out = os.path.join(tmp, "adder.wq")
        c = run(["compile", adder, "--target", "clifford+t", "-o", out, "-q"])
        counts = run(["draw", out, "-o", "-", "--ascii", "--width", "0"])
        if c.returncode != 0 or r.stdout.splitlines()[1] != counts.stdout.splitlines()[1]:
            fail(f"--target draws the compiled program: {r.stdout.splitlines()[1]!r} vs {counts.stdout.splitlines()[1]!r}")
sys.exit(0 if ok else 1)
