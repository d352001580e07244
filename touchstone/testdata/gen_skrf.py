#!/usr/bin/env python3
"""Cross-check data for cylcav/touchstone.

filter.s2p was written by `cylcav filter --touchstone` (see README in this
directory). This script writes variants of the same data in the other
formats and units the Touchstone 1.1 and 2.0 specifications allow, then has
an independent reader, scikit-rf (Debian python3-scikit-rf 0.15.4), read every
file and stores what it read in skrf_read.json. The Go tests read the same
files with touchstone.Read and compare with that JSON.

Run with Debian's interpreter: /usr/bin/python3 gen_skrf.py
"""
import json

import numpy as np
import skrf

src = skrf.Network("filter.s2p")
f = src.f
s = src.s  # shape (n, 2, 2), s[:, i, j] = S_(i+1)(j+1)


def g(x):
    return "%.17g" % x


def write(name, lines):
    with open(name, "w") as fh:
        fh.write("\n".join(lines) + "\n")


# Two-port, MHz, magnitude/angle, reference 75 ohm, comments inline and between lines.
lines = ["! variant of filter.s2p: MA, MHz, R 75", "#  mhz s ma r 75  ! option line comment", ""]
for k in range(len(f)):
    vals = [f[k] / 1e6]
    for i, j in ((0, 0), (1, 0), (0, 1), (1, 1)):
        vals += [abs(s[k, i, j]), np.degrees(np.angle(s[k, i, j]))]
    lines.append(" ".join(g(v) for v in vals))
    if k == 3:
        lines.append("! a comment between data lines")
write("variant_ma_mhz.s2p", lines)

# Two-port, GHz, dB/angle, default reference (no R field).
lines = ["# GHz S DB"]
for k in range(len(f)):
    vals = [f[k] / 1e9]
    for i, j in ((0, 0), (1, 0), (0, 1), (1, 1)):
        vals += [20 * np.log10(abs(s[k, i, j])), np.degrees(np.angle(s[k, i, j]))]
    lines.append("\t".join(g(v) for v in vals))
write("variant_db_ghz.s2p", lines)

# One-port, kHz, RI: S11 of the filter.
lines = ["! one-port variant: S11 of filter.s2p", "# KHZ S RI R 50"]
for k in range(len(f)):
    lines.append(" ".join(g(v) for v in (f[k] / 1e3, s[k, 0, 0].real, s[k, 0, 0].imag)))
write("variant_ri_khz.s1p", lines)

# Version 2.0, 12_21 order, per-port reference impedances, information block.
lines = [
    "! version 2.0 variant of filter.s2p",
    "[Version] 2.0",
    "# Hz S RI R 50",
    "[Number of Ports] 2",
    "[Two-Port Data Order] 12_21",
    "[Number of Frequencies] %d" % len(f),
    "[Reference] 50",
    "50",
    "[Begin Information]",
    "anything here is ignored",
    "[End Information]",
    "[Network Data]",
]
for k in range(len(f)):
    vals = [f[k]]
    for i, j in ((0, 0), (0, 1), (1, 0), (1, 1)):
        vals += [s[k, i, j].real, s[k, i, j].imag]
    lines.append(" ".join(g(v) for v in vals[:5]))
    lines.append("  " + " ".join(g(v) for v in vals[5:]))
lines.append("[End]")
write("variant_v2.s2p", lines)

out = {}
for name in ("filter.s2p", "variant_ma_mhz.s2p", "variant_db_ghz.s2p", "variant_ri_khz.s1p", "variant_v2.s2p"):
    try:
        n = skrf.Network(name)
    except Exception as e:  # scikit-rf 0.15 does not read every version 2.0 keyword
        print("scikit-rf cannot read", name, ":", e)
        continue
    nports = n.s.shape[1]
    out[name] = {
        "ports": nports,
        "z0_ohm": [float(z) for z in n.z0[0].real],
        "f_hz": [float(x) for x in n.f],
        # s[p] with p = i*ports + j, as [re, im] pairs per frequency
        "s": [[[float(n.s[k, i, j].real), float(n.s[k, i, j].imag)] for k in range(len(n.f))]
              for i in range(nports) for j in range(nports)],
    }
with open("skrf_read.json", "w") as fh:
    json.dump({"reader": "scikit-rf " + skrf.__version__, "files": out}, fh, indent=0)
print("wrote", ", ".join(out))
