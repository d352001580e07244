#!/usr/bin/env python3
"""A synthetic two-port sweep of a whole cavity, for mode identification.

An invented bench scenario: an air-filled stainless-steel test cavity
(walls of 2.5 % IACS, smooth) drawn as D = 40 mm, L = 31 mm, as built
D = 40.08 mm, L = 30.85 mm, whose end plates make poor contact. Its modes
between 5.5 and 11 GHz are computed here from the built dimensions (Pozar,
Microwave Engineering, 4th ed., sec. 6.4: f = c/(2 pi) sqrt((x/a)^2 +
(p pi/d)^2), x = j_nm for TM and j'_nm for TE, from scipy.special.jn_zeros
and jnp_zeros), each moved by a random 150 ppm (probe loading, machining).
Each mode's unloaded Q is its wall Q from the closed forms of Harrington,
Time-Harmonic Electromagnetic Fields, 1961, sec. 5.3 (Q delta/lambda for
TE_nmp and TM_nmp; recalled from memory), times 0.75 for the TM modes,
whose wall currents cross the poor joint. The TE011/TM111 pair is split by
a tuning screw: TE011 24 MHz above, TM111 16 MHz below their common
frequency. One resonance of the coupling loop itself sits at 7.3 GHz, far
from every cavity mode. The resonator model, cable delay
and noise are those of gen_sweeps.py. modes_truth.json holds the truth.

Run: /usr/bin/python3 gen_modes.py   (Debian python3-numpy, python3-scipy)
"""
import json

import numpy as np
from scipy.special import jn_zeros, jnp_zeros

rng = np.random.default_rng(4051)
c0 = 299792458.0
a, d = 40.08e-3 / 2, 30.85e-3
fa, fb, n = 5.5e9, 11.0e9, 8251
mu0 = 4e-7 * np.pi
sigma_wall = 0.025 * 58e6  # 2.5 % IACS
tm_factor = 0.75  # Q of the TM modes, poor end-plate contact


def wall_q(fam, nn, x, p, f):
    """Harrington 1961, sec. 5.3: Q delta / lambda of TE_nmp and TM_nmp."""
    lam = c0 / f
    delta = np.sqrt(2 / (2 * np.pi * f * mu0 * sigma_wall))
    b = p * np.pi * a / d
    if fam == "TM":
        g = np.sqrt(x**2 + b**2) / (2 * np.pi * (1 + 2 * a / d)) if p > 0 else x / (2 * np.pi * (1 + a / d))
    else:
        g = (1 - (nn / x) ** 2) * (x**2 + b**2) ** 1.5 / (
            2 * np.pi * (x**2 + 2 * a / d * b**2 + (1 - 2 * a / d) * (nn * b / x) ** 2))
    return g * lam / delta



modes = []
for nn in range(0, 8):
    for m in range(1, 4):
        for fam, x in (("TE", jnp_zeros(nn, m)[-1]), ("TM", jn_zeros(nn, m)[-1])):
            for p in range(0 if fam == "TM" else 1, 5):
                f = c0 / (2 * np.pi) * np.sqrt((x / a) ** 2 + (p * np.pi / d) ** 2)
                if fa + 0.1e9 < f < fb - 0.1e9:
                    label = "%s%d%d%d" % (fam, nn, m, p)
                    q = wall_q(fam, nn, x, p, f) * (tm_factor if fam == "TM" else 1)
                    modes.append((f, label, q))
modes.sort()

res = []
for f, label, q0 in modes:
    f = f * (1 + 150e-6 * rng.standard_normal())
    res.append(dict(label=label, f0_hz=f, q0=q0, beta1=float(rng.uniform(0.03, 0.1)), beta2=float(rng.uniform(0.03, 0.1))))
# TM111 and TE011 coincide in the ideal cylinder: split them about TE011's
# (scattered) frequency.
te = [r for r in res if r["label"] == "TE011"][0]
tm = [r for r in res if r["label"] == "TM111"][0]
mid = te["f0_hz"]
te["f0_hz"], tm["f0_hz"] = mid + 24e6, mid - 16e6
res.append(dict(label="loop", f0_hz=7.3e9, q0=400.0, beta1=0.2, beta2=0.2))
res.sort(key=lambda r: r["f0_hz"])

def write_sweep(name, res, fa, fb, n, comment):
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
    with open(name, "w") as fh:
        fh.write("! %s\n" % comment)
        fh.write("! synthetic sweep from testdata/measure/gen_modes.py\n# HZ S RI R 50\n")
        for k in range(n):
            vals = [f[k], s11[k].real, s11[k].imag, s21[k].real, s21[k].imag, s21[k].real, s21[k].imag, s22[k].real, s22[k].imag]
            fh.write(" ".join("%.9e" % v for v in vals) + "\n")


write_sweep("modes.s2p", res, fa, fb, n,
            "invented stainless test cavity, drawn D 40 mm L 31 mm, built D 40.08 mm L 30.85 mm")

# The same cavity completely filled with a PTFE-like plastic: every
# frequency divided by sqrt(eps_r) (Pozar sec. 6.4), the wall Q scaled by
# eps_r^(-1/4) (derived: Q_wall ~ eta/Rs, eta = eta0/sqrt(eps_r),
# Rs ~ sqrt(f); the same scaling measure.MeasureDielectric assumes, whose
# own test checks it against package qfactor) and the fill's loss added:
# 1/Q0 = 1/Q_wall + tan(delta). The loop resonance stays where it is.
eps_fill, tand_fill = 2.08, 4e-4
filled = []
for r in res:
    if r["label"] == "loop":
        filled.append(dict(r, f0_hz=5.1e9))
        continue
    qw = r["q0"] * eps_fill ** -0.25
    filled.append(dict(r, f0_hz=r["f0_hz"] / np.sqrt(eps_fill), q0=1 / (1 / qw + tand_fill)))
filled.sort(key=lambda r: r["f0_hz"])
write_sweep("modes_filled.s2p", filled, 3.6e9, 7.8e9, 8401,
            "the same cavity completely filled, eps_r 2.08, tan(delta) 4e-4")

with open("modes_truth.json", "w") as fh:
    json.dump(dict(diameter_m=2 * a, length_m=d, nominal_diameter_m=40e-3, nominal_length_m=31e-3,
                   per_mode_scatter=150e-6, wall_iacs_fraction=sigma_wall / 58e6, tm_q_factor=tm_factor,
                   resonances=res, fill_eps_r=eps_fill, fill_tan_delta=tand_fill, filled_resonances=filled), fh, indent=1)
print(len(res), "resonances:", " ".join(r["label"] for r in res))
