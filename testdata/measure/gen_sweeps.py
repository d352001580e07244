#!/usr/bin/env python3
"""Synthetic network-analyser sweeps for cylcav/measure, with known truth.

Each resonance is a lumped resonator (series RLC seen through ideal
couplings): with u = f/f0 - f0/f and Q0 the unloaded Q,
  reflection, one port:  Gamma = (1 - beta + j Q0 u) / (1 + beta + j Q0 u)
  two port:              S21 = 2 sqrt(b1 b2) / (1 + b1 + b2 + j Q0 u)
                         S11 = (1 + b2 - b1 + j Q0 u) / (1 + b1 + b2 + j Q0 u)
                         S22 likewise with b1 and b2 swapped
(Kajfez, Q Factor Measurements Using MATLAB, Artech House 2011, ch. 1-2;
the u form is the exact lumped one, not the linearised t of the fit).
Each measured trace is multiplied by a coupling-loss factor, a constant
phase and the cable delay exp(-j 2 pi f tau), and gets complex Gaussian
noise of standard deviation sigma per component (numpy default_rng, fixed
seed). Files are Touchstone 1.1, RI, 10 significant digits; truth.json
holds the parameters.

Run: /usr/bin/python3 gen_sweeps.py   (Debian python3-numpy)
"""
import json

import numpy as np

rng = np.random.default_rng(20261204)
truth = {}


def fmt(x):
    return "%.9e" % x


def write(name, f, traces, comment):
    with open(name, "w") as fh:
        fh.write("! %s\n! synthetic sweep from testdata/measure/gen_sweeps.py\n# HZ S RI R 50\n" % comment)
        for k in range(len(f)):
            vals = [f[k]]
            for s in traces:
                vals += [s[k].real, s[k].imag]
            fh.write(" ".join(fmt(v) for v in vals) + "\n")


def noise(n, sigma):
    return sigma * (rng.standard_normal(n) + 1j * rng.standard_normal(n))


# --- single resonances, one port (reflection) ---
cases = [
    # name, f0, Q0, beta, loss |Gamma_d|, phase deg, delay s (round trip), sigma, points, span in bandwidths
    ("refl_under", 5.0e9, 12000.0, 0.45, 0.92, 30.0, 4e-9, 2e-3, 201, 10),
    ("refl_over", 9.3e9, 8000.0, 2.6, 0.85, -110.0, 12e-9, 2e-3, 301, 12),
    ("refl_clean", 2.45e9, 20000.0, 1.0, 1.0, 0.0, 0.0, 1e-6, 401, 10),
]
for name, f0, q0, beta, loss, ph, tau, sigma, n, span in cases:
    ql = q0 / (1 + beta)
    f = np.linspace(f0 * (1 - span / ql / 2), f0 * (1 + span / ql / 2), n)
    u = f / f0 - f0 / f
    g = (1 - beta + 1j * q0 * u) / (1 + beta + 1j * q0 * u)
    g = loss * np.exp(1j * np.radians(ph)) * np.exp(-2j * np.pi * f * tau) * g + noise(n, sigma)
    write(name + ".s1p", f, [g], name)
    truth[name + ".s1p"] = dict(f0_hz=f0, q0=q0, ql=ql, beta=beta, delay_s=tau, sigma=sigma)

# --- single resonances, two port (transmission) ---
cases = [
    # name, f0, Q0, b1, b2, delay s (one way), sigma, points, span
    ("trans_weak", 7.2e9, 15000.0, 0.08, 0.05, 6e-9, 1e-4, 301, 10),
    ("trans_strong", 3.1e9, 9000.0, 0.9, 0.6, 9e-9, 2e-3, 301, 10),
]
for name, f0, q0, b1, b2, tau, sigma, n, span in cases:
    ql = q0 / (1 + b1 + b2)
    f = np.linspace(f0 * (1 - span / ql / 2), f0 * (1 + span / ql / 2), n)
    u = f / f0 - f0 / f
    den = 1 + b1 + b2 + 1j * q0 * u
    d = np.exp(-2j * np.pi * f * tau)
    s21 = 0.95 * d * 2 * np.sqrt(b1 * b2) / den + noise(n, sigma)
    s11 = 0.97 * d * d * (1 + b2 - b1 + 1j * q0 * u) / den + noise(n, sigma)
    s22 = 0.96 * d * d * (1 + b1 - b2 + 1j * q0 * u) / den + noise(n, sigma)
    write(name + ".s2p", f, [s11, s21, s21, s22], name)
    truth[name + ".s2p"] = dict(f0_hz=f0, q0=q0, ql=ql, beta1=b1, beta2=b2, delay_s=tau, sigma=sigma)

# --- a wide two-port sweep: five resonances on a sloping leakage background ---
fa, fb, n = 4.0e9, 6.0e9, 4001
f = np.linspace(fa, fb, n)
res = [  # f0, Q0, b1, b2
    (4.31e9, 2400.0, 0.05, 0.04),
    (4.77e9, 3000.0, 0.10, 0.08),
    (4.80e9, 2800.0, 0.06, 0.06),
    (5.42e9, 2000.0, 0.02, 0.03),
    (5.83e9, 3500.0, 0.12, 0.10),
]
tau = 5e-9
d = np.exp(-2j * np.pi * f * tau)
s21 = 10 ** ((-75 + 15 * (f - fa) / (fb - fa)) / 20) * np.exp(-2j * np.pi * f * 0.7e-9)
s11 = np.ones(n, complex)
s22 = np.ones(n, complex)
for f0, q0, b1, b2 in res:
    u = f / f0 - f0 / f
    den = 1 + b1 + b2 + 1j * q0 * u
    s21 = s21 + d * 2 * np.sqrt(b1 * b2) / den
    s11 = s11 - 2 * b1 / den
    s22 = s22 - 2 * b2 / den
sigma = 2e-5
s21 = s21 + noise(n, sigma)
s11 = 0.97 * d * d * s11 + noise(n, sigma)
s22 = 0.97 * d * d * s22 + noise(n, sigma)
write("wide.s2p", f, [s11, s21, s21, s22], "wide sweep, five resonances")
truth["wide.s2p"] = dict(
    resonances=[dict(f0_hz=a, q0=b, ql=b / (1 + c + e), beta1=c, beta2=e) for a, b, c, e in res],
    delay_s=tau, sigma=sigma)

with open("truth.json", "w") as fh:
    json.dump(truth, fh, indent=1)
print("numpy", np.__version__, "wrote", ", ".join(truth))
