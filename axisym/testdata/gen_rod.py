#!/usr/bin/python3
"""Resonances of a full-length dielectric rod in a closed metal can (rod
radius b, relative permittivity eps1, vacuum out to the wall at radius a,
length L), azimuthal order 0, for axisym/layered_test.go.

Independent of the Go solver: for beta = p pi / L the two-layer
characteristic equation D(f) = 0 is solved in f with mpmath at 30 digits.
Inside the rod u1 = J1(k1 r)/k1, outside the solution that meets the wall
condition, written with Bessel functions of the complex wavenumber
k = sqrt(k0^2 eps - beta^2) (imaginary where the field decays), so D is an
entire function of f and its sign changes on a fine scan are its roots:
  TE0 (u = E_phi): u2 = pi/2 [J1(kr)Y1(ka) - Y1(kr)J1(ka)] (u2(a) = 0),
                   D = u1 W2 - W1 u2 at r = b, W = (1/r) d(r u)/dr;
  TM0 (u = H_phi): u2 = pi a k/2 [J1(kr)Y0(ka) - Y1(kr)J0(ka)] (W2(a) = 0),
                   D = u1 W2/eps2 - W1/eps1 u2 at r = b.
Run: /usr/bin/python3 gen_rod.py > rod.tsv
"""
import mpmath as mp

mp.mp.dps = 30
C = mp.mpf(299792458)

CASES = [
    # name, a (m), b (m), eps1, L (m), fmax (Hz)
    ("rod10", mp.mpf("0.010"), mp.mpf("0.004"), mp.mpf(10), mp.mpf("0.008"), mp.mpf("3.0e10")),
    ("rod38", mp.mpf("0.012"), mp.mpf("0.003"), mp.mpf(38), mp.mpf("0.006"), mp.mpf("2.6e10")),
]


def D(fam, f, beta, a, b, eps1):
    k0 = 2 * mp.pi * f / C
    k1 = mp.sqrt(mp.mpc(k0 ** 2 * eps1 - beta ** 2))
    k = mp.sqrt(mp.mpc(k0 ** 2 - beta ** 2))
    if k1 == 0 or k == 0:
        k1 += mp.mpf("1e-25")
        k += mp.mpf("1e-25")
    u1 = mp.besselj(1, k1 * b) / k1
    W1 = mp.besselj(0, k1 * b)
    J, Y = mp.besselj, mp.bessely
    if fam == "TE":
        u2 = mp.pi / 2 * (J(1, k * b) * Y(1, k * a) - Y(1, k * b) * J(1, k * a))
        W2 = mp.pi / 2 * k * (J(0, k * b) * Y(1, k * a) - Y(0, k * b) * J(1, k * a))
        return mp.re(u1 * W2 - W1 * u2)
    u2 = mp.pi * a * k / 2 * (J(1, k * b) * Y(0, k * a) - Y(1, k * b) * J(0, k * a))
    W2 = mp.pi * a * k ** 2 / 2 * (J(0, k * b) * Y(0, k * a) - Y(0, k * b) * J(0, k * a))
    return mp.re(u1 * W2 - W1 / eps1 * u2)


print("# full-length dielectric rod in a can, n = 0; mpmath %s, mp.dps = %d" % (mp.__version__, mp.mp.dps))
print("# case\ta_m\tb_m\teps1\tL_m\tfmax_hz\tfamily\tp\tf_hz")
for name, a, b, eps1, L, fmax in CASES:
    for fam in ("TE", "TM"):
        p = 1 if fam == "TE" else 0
        while True:
            beta = p * mp.pi / L
            if beta * C / (2 * mp.pi * mp.sqrt(eps1)) >= fmax:
                break
            n = 3000
            fs = [fmax * (i + 1) / n for i in range(n)]
            vals = [D(fam, f, beta, a, b, eps1) for f in fs]
            for i in range(n - 1):
                if vals[i] == 0 or vals[i] * vals[i + 1] < 0:
                    r = mp.findroot(lambda f: D(fam, f, beta, a, b, eps1), (fs[i], fs[i + 1]), solver="anderson")
                    print("%s\t%s\t%s\t%s\t%s\t%s\t%s\t%d\t%s" % (name, a, b, eps1, L, mp.nstr(fmax, 6), fam, p, mp.nstr(r, 22)))
            p += 1
