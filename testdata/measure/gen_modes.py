#!/usr/bin/env python3
"""A synthetic two-port sweep of a whole cavity, for mode identification.

An invented bench scenario: an air-filled copper test cavity drawn as
D = 40 mm, L = 31 mm, as built D = 40.08 mm, L = 30.85 mm. Its modes between
5 and 11 GHz are computed here from the built dimensions (Pozar, Microwave
Engineering, 4th ed., sec. 6.4: f = c/(2 pi) sqrt((x/a)^2 + (p pi/d)^2),
x = j_nm for TM and j'_nm for TE, from scipy.special.jn_zeros and
jnp_zeros), each moved by a random 150 ppm (probe loading, machining) and
given a coupling and an unloaded Q. The TE011/TM111 pair is split by a
tuning screw: TE011 12 MHz above, TM111 8 MHz below their common frequency,
and TM111 has the lower Q. One resonance of the coupling loop itself sits
at 7.3 GHz, far from every cavity mode. The resonator model, cable delay
and noise are those of gen_sweeps.py. modes_truth.json holds the truth.

Run: /usr/bin/python3 gen_modes.py   (Debian python3-numpy, python3-scipy)
"""
import json

import numpy as np
from scipy.special import jn_zeros, jnp_zeros

rng = np.random.default_rng(4051)
c0 = 299792458.0
a, d = 40.08e-3 / 2, 30.85e-3
fa, fb, n = 5.0e9, 11.0e9, 6001

modes = []
for nn in range(0, 8):
    for m in range(1, 4):
        for fam, x in (("TE", jnp_zeros(nn, m)[-1]), ("TM", jn_zeros(nn, m)[-1])):
            for p in range(0 if fam == "TM" else 1, 5):
                f = c0 / (2 * np.pi) * np.sqrt((x / a) ** 2 + (p * np.pi / d) ** 2)
                if fa + 0.1e9 < f < fb - 0.1e9:
                    label = "%s%d%d%d" % (fam, nn, m, p)
                    modes.append((f, label))
modes.sort()

res = []
for f, label in modes:
    f = f * (1 + 150e-6 * rng.standard_normal())
    q0 = 2500.0 if label.startswith("TE0") else 1500.0
    res.append(dict(label=label, f0_hz=f, q0=q0, beta1=float(rng.uniform(0.03, 0.1)), beta2=float(rng.uniform(0.03, 0.1))))
# TM111 and TE011 coincide in the ideal cylinder: split them about TE011's
# (scattered) frequency.
te = [r for r in res if r["label"] == "TE011"][0]
tm = [r for r in res if r["label"] == "TM111"][0]
mid = te["f0_hz"]
te["f0_hz"], tm["f0_hz"] = mid + 12e6, mid - 8e6
res.append(dict(label="loop", f0_hz=7.3e9, q0=400.0, beta1=0.2, beta2=0.2))
res.sort(key=lambda r: r["f0_hz"])

f = np.linspace(fa, fb, n)
tau = 4e-9
dl = np.exp(-2j * np.pi * f * tau)
s21 = 10 ** (-70 / 20) * np.exp(-2j * np.pi * f * 0.5e-9)
s11 = np.ones(n, complex)
s22 = np.ones(n, complex)
for r in res:
    u = f / r["f0_hz"] - r["f0_hz"] / f
    den = 1 + r["beta1"] + r["beta2"] + 1j * r["q0"] * u
    s21 = s21 + dl * 2 * np.sqrt(r["beta1"] * r["beta2"]) / den
    s11 = s11 - 2 * r["beta1"] / den
    s22 = s22 - 2 * r["beta2"] / den
sigma = 2e-5
noise = lambda: sigma * (rng.standard_normal(n) + 1j * rng.standard_normal(n))
s21 = s21 + noise()
s11 = 0.97 * dl * dl * s11 + noise()
s22 = 0.97 * dl * dl * s22 + noise()
with open("modes.s2p", "w") as fh:
    fh.write("! invented test cavity, drawn D 40 mm L 31 mm, built D 40.08 mm L 30.85 mm\n")
    fh.write("! synthetic sweep from testdata/measure/gen_modes.py\n# HZ S RI R 50\n")
    for k in range(n):
        vals = [f[k], s11[k].real, s11[k].imag, s21[k].real, s21[k].imag, s21[k].real, s21[k].imag, s22[k].real, s22[k].imag]
        fh.write(" ".join("%.9e" % v for v in vals) + "\n")
with open("modes_truth.json", "w") as fh:
    json.dump(dict(diameter_m=2 * a, length_m=d, nominal_diameter_m=40e-3, nominal_length_m=31e-3,
                   per_mode_scatter=150e-6, resonances=res), fh, indent=1)
print(len(res), "resonances:", " ".join(r["label"] for r in res))
