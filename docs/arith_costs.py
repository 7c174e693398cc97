#!/usr/bin/python3
"""Prints the cost table of the arithmetic library (docs/arith.md) for n = 4, 8, 16, 32 (the lookup:
n = 2, 4, 6, 8 address bits): Toffoli,
CNOT and work-wire counts measured by `whittle count --json` on the elaborated routine; T-counts
measured after `whittle compile --target clifford+t` when that target is built, otherwise marked
as not measured. Usage: docs/arith_costs.py [path/to/whittle]"""
import json
import os
import pathlib
import subprocess
import sys
import tempfile

SRC = pathlib.Path(__file__).resolve().parents[1]
BIN = sys.argv[1] if len(sys.argv) > 1 else os.environ.get("WHITTLE_BIN", str(SRC / "build" / "whittle"))
WIDTHS = [4, 8, 16, 32]

# routine -> (declarations, call) for width n
ROUTINES = {
    "add": ("qubit a[{n}], b[{n}]", "add(a, b)"),
    "add_and": ("qubit a[{n}], b[{n}]", "add_and(a, b)"),
    "sub": ("qubit a[{n}], b[{n}]", "sub(a, b)"),
    "add_const (k = 2^n - 3)": ("qubit b[{n}]", "add_const(b, {k})"),
    "less_than": ("qubit a[{n}], b[{n}], f", "less_than(a, b, f)"),
    "less_than_and": ("qubit a[{n}], b[{n}], f", "less_than_and(a, b, f)"),
    "less_than_const (k = 2^n - 3)": ("qubit a[{n}], f", "less_than_const(a, {k}, f)"),
    "equals_const (k = 2^n - 3)": ("qubit a[{n}], f", "equals_const(a, {k}, f)"),
    "mul (n x n -> n bits)": ("qubit a[{n}], b[{n}], p[{n}]", "mul(a, b, p)"),
    "square (n -> 2n bits)": ("qubit a[{n}], p[{n2}]", "square(a, p)"),
    "mod_add (N = 2^n - 1)": ("qubit a[{n}], b[{n}]", "mod_add(a, b, {N})", [4, 8, 16]),
    "mod_mul_const (x: 4 bits, N = 2^n - 1, k = 5)": ("qubit x[4], out[{n}]", "mod_mul_const(x, out, 5, {N})", [4, 8, 16]),
    "mod_add_const (N = 2^n - 1, k = 5)": ("qubit b[{n}]", "mod_add_const(b, 5, {N})"),
    "gf2_mul (trinomial / pentanomial)": ("qubit a[{n}], b[{n}], c[{n}]", "gf2_mul(a, b, c, {poly})"),
    "gf2_mul_karatsuba (trinomial / pentanomial)": ("qubit a[{n}], b[{n}], c[{n}]", "gf2_mul_karatsuba(a, b, c, {poly})"),
    "diffuse": ("qubit r[{n}]", "diffuse(r)"),
    "when ctl { add }": ("qubit a[{n}], b[{n}], ctl", "when ctl {{ add(a, b) }}"),
    "when ctl { add_and }": ("qubit a[{n}], b[{n}], ctl", "when ctl {{ add_and(a, b) }}"),
    "when ctl { less_than }": ("qubit a[{n}], b[{n}], f, ctl", "when ctl {{ less_than(a, b, f) }}"),
    "lookup (n address bits, L = 2^n entries, 8 out bits)": ("qubit addr[{n}], out[8]", "lookup(addr, out, {table})", [2, 4, 6, 8]),
}
# x^4+x+1, x^8+x^4+x^3+x+1, x^16+x^5+x^3+x+1, x^32+x^7+x^3+x^2+1 (bit n left implicit)
POLY = {4: 19, 8: 0x11B, 16: 0x1002B, 32: 0x1_0000_008D}


def run(*args):
    return subprocess.run([BIN, *args], capture_output=True, text=True, timeout=600)


def count(path):
    p = run("count", str(path), "--json")
    if p.returncode != 0:
        raise SystemExit(f"whittle count failed on {path}:\n{p.stderr}")
    return json.loads(p.stdout)


def t_count(path, tmp, measure):
    """(T, qubits, peak live qubits) of the clifford+t output, or None when not lowered."""
    out = pathlib.Path(tmp) / "lowered.wq"
    opts = ["compile", str(path), "--target", "clifford+t", "-O2", "-o", str(out)]
    if measure:
        opts.append("--allow-measurement")
    p = run(*opts)
    if p.returncode != 0:
        return None
    j = count(out)
    if j["toffoli_count"] or j["mcx_count"] or any(g.startswith("mc") or g == "ccz" for g in j["gates"]):
        return None  # the target is not lowered yet in this build
    return j["t_count"], j["qubits"], j.get("peak_live_qubits", j["qubits"])


def main():
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        for name, (decl, call, *widths) in ROUTINES.items():
            for n in (widths[0] if widths else WIDTHS):
                # the lookup's table: 2^n entries of 8 bits, a fixed pattern (built only for it)
                table = "[" + ", ".join(str((i * 37 + 11) % 256) for i in range(1 << n)) + "]" if "{table}" in call else ""
                fields = {"n": n, "k": (1 << n) - 3, "N": (1 << n) - 1, "poly": POLY.get(n, 0), "table": table, "n2": 2 * n}
                prog = pathlib.Path(tmp) / "p.wq"
                prog.write_text('use "arith"\n' + decl.format(**fields) + "\n" + call.format(**fields) + "\n")
                j = count(prog)
                t = t_count(prog, tmp, False)
                tm = t_count(prog, tmp, True)
                other = ", ".join(f"{v} {g}" for g, v in sorted(j["gates"].items())
                                  if g not in ("ccx", "cx", "x", "mcx"))
                rows.append((name, n, j["toffoli_count"], j["mcx_count"], j["cnot_count"],
                             j["qubits_by_role"]["ancilla"], other or "-", t, tm))
    print("| routine | n | Toffoli | MCX (3+ controls) | CNOT | other gates | work wires | T (-O2, clifford+t) | "
          "qubits / peak live (-O2) | T (with measurement) |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for name, n, tof, mcx, cnot, work, other, t, tm in rows:
        show = lambda v: "n/m" if v is None else str(v[0])
        width = "n/m" if t is None else f"{t[1]} / {t[2]}"
        print(f"| {name} | {n} | {tof} | {mcx} | {cnot} | {other} | {work} | {show(t)} | {width} | {show(tm)} |")


if __name__ == "__main__":
    main()
