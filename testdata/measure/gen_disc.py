#!/usr/bin/env python3
"""Synthetic sweeps of a cavity empty and with a dielectric disc on one end plate.

An invented bench scenario: a stainless-steel TE01p test cavity (walls of
2.5 % IACS, smooth; a lossy ring behind the end-plate gap damps every mode
but TE0mp, common practice for this kind of cavity), drawn D = 36 mm,
L = 26 mm, built D = 36.03 mm, L = 25.97 mm, measured empty and then with
a 2.00 mm ceramic disc of the full diameter lying on the lower end plate
(eps_r 9.9, tan delta 5e-4, invented values of an alumina-like ceramic).

The TE0mp fields of the layered cavity are E_phi = J1(kc r) e(z),
kc = j'_0m/a, with e'' = -(k0^2 eps_r - kc^2) e in each layer, e and e'
continuous at the disc's face and e = 0 on both end plates (the
transverse-resonance condition; R. E. Collin, Field Theory of Guided
Waves, 2nd ed., recalled). The resonances are the roots of e(L; k0) = 0,
found here with scipy.optimize.brentq after a scan; e(z) is integrated
with scipy.integrate.quad. The wall Q follows from the wall loss
P = (Rs/2) int |H_t|^2 dS with H_z = kc J0(kc r) e/(omega mu0),
H_r = J1(kc r) e'/(omega mu0) (Maxwell's curl equations), Rs = sqrt(omega
mu0/(2 sigma)) (Pozar, Microwave Engineering, 4th ed., eq. 1.131), and the
disc's loss by its electric filling factor: 1/Q0 = 1/Q_wall + p_e tan
delta. The empty cavity is the same model with eps_r = 1, which is the
closed form of Pozar sec. 6.4 (checked below). The resonator model,
cable delay and noise of the sweeps are those of gen_modes.py.
disc_truth.json holds the truth.

Run: /usr/bin/python3 gen_disc.py   (Debian python3-numpy, python3-scipy)
"""
import json

import numpy as np
from scipy.integrate import quad
from scipy.optimize import brentq
from scipy.special import j0, jnp_zeros

rng = np.random.default_rng(7310)
c0 = 299792458.0
mu0 = 4e-7 * np.pi
eps0 = 1 / (mu0 * c0**2)
sigma_wall = 0.025 * 58e6  # 2.5 % IACS
a, L = 36.03e-3 / 2, 25.97e-3
t, eps_disc, tand_disc = 2.00e-3, 9.9, 5e-4


def shoot(layers, kc, k0, z):
    """e(z) and e'(z) from e(0) = 0, e'(0) = 1 through the layers."""
    e, de, z0 = 0.0, 1.0, 0.0
    for d_layer, eps in layers:
        d = min(z - z0, d_layer)
        if d <= 0:
            break
        b2 = k0 * k0 * eps - kc * kc
        if b2 > 0:
            b = np.sqrt(b2)
            c, s, q = np.cos(b * d), np.sin(b * d) / b, -b * np.sin(b * d)
        elif b2 < 0:
            al = np.sqrt(-b2)
            c, s, q = np.cosh(al * d), np.sinh(al * d) / al, al * np.sinh(al * d)
        else:
            c, s, q = 1.0, d, 0.0
        e, de = c * e + s * de, q * e + c * de
        z0 += d_layer
    return e, de


def resonance(m, p, eps):
    """f, Q_wall and disc filling factor of TE0mp with a disc of eps."""
    x = jnp_zeros(0, m)[-1]
    kc = x / a
    layers = [(t, eps), (L - t, 1.0)]
    g = lambda k: shoot(layers, kc, k, L)[0]
    ks = np.linspace(kc / np.sqrt(eps) * (1 + 1e-12), np.hypot(kc, p * np.pi / L) * (1 + 1e-9), 4000)
    vals = [g(k) for k in ks]
    roots = [brentq(g, ks[i], ks[i + 1], xtol=1e-14, rtol=1e-15) for i in range(len(ks) - 1) if vals[i] * vals[i + 1] < 0]
    k0 = roots[p - 1]
    e2 = lambda z: shoot(layers, kc, k0, z)[0] ** 2
    i_disc = quad(e2, 0, t, epsabs=0, epsrel=1e-13, limit=200)[0]
    i_air = quad(e2, t, L, epsabs=0, epsrel=1e-13, limit=200)[0]
    _, d1 = shoot(layers, kc, k0, L)
    omega = k0 * c0
    rs = np.sqrt(omega * mu0 / (2 * sigma_wall))
    # radial factors (DLMF 10.22.5; J1(x) = 0): int_0^a J1^2 r dr = a^2/2 J0(x)^2
    rad = a * a / 2 * j0(x) ** 2
    w = 0.5 * eps0 * 2 * np.pi * rad * (eps * i_disc + i_air)  # W = 2 W_e
    side = 2 * np.pi * a * kc**2 * j0(x) ** 2 * (i_disc + i_air)
    ends = 2 * np.pi * rad * (1 + d1 * d1)
    p_wall = rs / 2 * (side + ends) / (omega * mu0) ** 2
    return omega / (2 * np.pi), omega * w / p_wall, eps * i_disc / (eps * i_disc + i_air)


res_e, res_f = [], []
for m, p in ((1, 1), (1, 2)):
    label = "TE0%d%d" % (m, p)
    fe, qe, _ = resonance(m, p, 1.0)
    x = jnp_zeros(0, m)[-1]
    assert abs(fe / (c0 / (2 * np.pi) * np.hypot(x / a, p * np.pi / L)) - 1) < 1e-12
    ff, qw, pe = resonance(m, p, eps_disc)
    qf = 1 / (1 / qw + pe * tand_disc)
    b1, b2 = float(rng.uniform(0.03, 0.1)), float(rng.uniform(0.03, 0.1))
    res_e.append(dict(label=label, f0_hz=fe, q0=qe, beta1=b1, beta2=b2))
    res_f.append(dict(label=label, f0_hz=ff, q0=qf, q_wall=qw, fill_e=pe, beta1=b1, beta2=b2))


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
        fh.write("! synthetic sweep from testdata/measure/gen_disc.py\n# HZ S RI R 50\n")
        for k in range(n):
            vals = [f[k], s11[k].real, s11[k].imag, s21[k].real, s21[k].imag, s21[k].real, s21[k].imag, s22[k].real, s22[k].imag]
            fh.write(" ".join("%.9e" % v for v in vals) + "\n")


lo_e, hi_e = min(r["f0_hz"] for r in res_e), max(r["f0_hz"] for r in res_e)
lo_f, hi_f = min(r["f0_hz"] for r in res_f), max(r["f0_hz"] for r in res_f)
write_sweep("disc_empty.s2p", res_e, np.floor(lo_e / 1e9 - 1) * 1e9, np.ceil(hi_e / 1e9 + 1) * 1e9, 12001,
            "invented stainless TE01p test cavity, empty; drawn D 36 mm L 26 mm, built D 36.03 mm L 25.97 mm")
write_sweep("disc_loaded.s2p", res_f, np.floor(lo_f / 1e9 - 1) * 1e9, np.ceil(hi_f / 1e9 + 1) * 1e9, 12001,
            "the same cavity with a 2.00 mm ceramic disc (eps_r 9.9, tan delta 5e-4) on one end plate")
with open("disc_truth.json", "w") as fh:
    json.dump(dict(diameter_m=2 * a, length_m=L, nominal_diameter_m=36e-3, nominal_length_m=26e-3,
                   disc_thickness_m=t, disc_eps_r=eps_disc, disc_tan_delta=tand_disc, wall_iacs_fraction=sigma_wall / 58e6,
                   empty=res_e, loaded=res_f), fh, indent=1)
for e, f in zip(res_e, res_f):
    print(e["label"], "%.6f GHz Q0 %.0f -> %.6f GHz Q0 %.0f (Q wall %.0f, p_e %.4f)" % (e["f0_hz"] / 1e9, e["q0"], f["f0_hz"] / 1e9, f["q0"], f["q_wall"], f["fill_e"]))
