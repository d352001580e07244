#!/usr/bin/python3
"""Stored energies and wall integrals of the resonances of a full-length
dielectric rod in a closed metal can (rod radius b, relative permittivity
eps1, vacuum out to the wall at radius a, length L, plates at both ends),
azimuthal order 0, for axisym/layered_loss_test.go.

Independent of the Go solver. The resonances of rod.tsv (gen_rod.py) below
FMAX are refined again here with mpmath at 30 digits (the two-layer
characteristic equation D of gen_rod.py, copied below). With
beta = p pi / L the fields are (derived from Maxwell's curl equations,
phases dropped; Pozar, Microwave Engineering, 4th ed., sec. 6.4 for the
z dependence):

  TE0: E_phi = u(r) sin(beta z), H_r = beta u cos(beta z)/(omega mu0),
       H_z = G(r) sin(beta z)/(omega mu0); u, G continuous at b, u(a) = 0;
  TM0: H_phi = u(r) cos(beta z), E_r = beta u sin(beta z)/(omega eps0 eps),
       E_z = G(r) cos(beta z)/(omega eps0 eps); u, G/eps continuous at b,
       G(a) = 0;

with G = (1/r) d(r u)/dr. In the rod u = J1(k1 r); outside u = B J1(k r) +
C Y1(k r) (k^2 = k0^2 - beta^2 > 0) or B I1(s r) + C K1(s r) (s^2 =
beta^2 - k0^2), with G = k (B J0 + C Y0) or s (B I0 - C K0). The radial
integrals are written out by Lommel's integrals (DLMF 10.22.5 and its
modified form, derived by differentiation: for x^2 y'' + x y' -
(x^2 + nu^2) y = 0, int x y^2 dx = ((x^2 + nu^2) y^2 - x^2 y'^2)/2; for
Bessel's equation, int x y^2 dx = (x^2 y'^2 + (x^2 - nu^2) y^2)/2), and
each is checked against mpmath.quad.

W_e = (1/4) int eps |E|^2 dV, W_m = (1/4) int mu0 |H|^2 dV (checked equal),
W = W_e + W_m, and for each metal part the geometry factor
G_part = omega W / ((1/2) int_part |H_t|^2 dS) (ohm). The rod's electric
and magnetic filling factors are W_e(rod)/W_e and W_m(rod)/W_m.

Run: /usr/bin/python3 gen_rodloss.py > rodloss.tsv
"""
import mpmath as mp

mp.mp.dps = 30
C = mp.mpf(299792458)
MU0 = mp.mpf("1.25663706212e-6")  # CODATA 2018, the project's physics.VacuumPermeability
EPS0 = 1 / (MU0 * C ** 2)  # so that k0 = omega/c exactly (W_e = W_m is checked)
FMAX = mp.mpf("1.6e10")
J, Y, I, K = mp.besselj, mp.bessely, mp.besseli, mp.besselk


def D(fam, f, beta, a, b, eps1):
    """gen_rod.py's characteristic function."""
    k0 = 2 * mp.pi * f / C
    k1 = mp.sqrt(mp.mpc(k0 ** 2 * eps1 - beta ** 2))
    k = mp.sqrt(mp.mpc(k0 ** 2 - beta ** 2))
    u1 = J(1, k1 * b) / k1
    W1 = J(0, k1 * b)
    if fam == "TE":
        u2 = mp.pi / 2 * (J(1, k * b) * Y(1, k * a) - Y(1, k * b) * J(1, k * a))
        W2 = mp.pi / 2 * k * (J(0, k * b) * Y(1, k * a) - Y(0, k * b) * J(1, k * a))
        return mp.re(u1 * W2 - W1 * u2)
    u2 = mp.pi * a * k / 2 * (J(1, k * b) * Y(0, k * a) - Y(1, k * b) * J(0, k * a))
    W2 = mp.pi * a * k ** 2 / 2 * (J(0, k * b) * Y(0, k * a) - Y(0, k * b) * J(0, k * a))
    return mp.re(u1 * W2 - W1 / eps1 * u2)


class Piece:
    """u = B F1(q r) + C F2(q r) on lo..hi, F = J, Y (mod False) or I, K."""

    def __init__(self, mod, q, B, Cc):
        self.mod, self.q, self.B, self.C = mod, q, B, Cc

    def y(self, x):  # order-1 combination at x = q r, and its x-derivative
        if self.mod:
            y = self.B * I(1, x) + self.C * K(1, x)
            yp = self.B * (I(0, x) - I(1, x) / x) + self.C * (-K(0, x) - K(1, x) / x)
        else:
            y = self.B * J(1, x) + self.C * Y(1, x)
            yp = self.B * (J(0, x) - J(1, x) / x) + self.C * (Y(0, x) - Y(1, x) / x)
        return y, yp

    def w(self, x):  # order-0 function with G = q w(q r), and w'
        if self.mod:
            return self.B * I(0, x) - self.C * K(0, x), self.y(x)[0]
        return self.B * J(0, x) + self.C * Y(0, x), -self.y(x)[0]

    def u(self, r):
        return self.y(self.q * r)[0]

    def G(self, r):
        return self.q * self.w(self.q * r)[0]

    def int_u2(self, lo, hi):
        """int_lo^hi r u^2 dr by Lommel (nu = 1)."""
        def F(r):
            if r == 0:
                return mp.mpf(0)
            x = self.q * r
            y, yp = self.y(x)
            if self.mod:
                return ((x ** 2 + 1) * y ** 2 - x ** 2 * yp ** 2) / 2
            return (x ** 2 * yp ** 2 + (x ** 2 - 1) * y ** 2) / 2
        return (F(hi) - F(lo)) / self.q ** 2

    def int_G2(self, lo, hi):
        """int_lo^hi r G^2 dr by Lommel (nu = 0): G = q w, int r G^2 dr = int x w^2 dx."""
        def F(r):
            if r == 0:
                return mp.mpf(0)
            x = self.q * r
            w, wp = self.w(x)
            if self.mod:
                return (x ** 2 * w ** 2 - x ** 2 * wp ** 2) / 2
            return (x ** 2 * wp ** 2 + x ** 2 * w ** 2) / 2
        return F(hi) - F(lo)


def check(v, lo, hi, fn):
    q = mp.quad(lambda r: r * fn(r) ** 2, [lo, hi])
    assert abs(v - q) <= mp.mpf("1e-20") * abs(q), (v, q)
    return v


def mode(fam, f, p, a, b, eps1, L):
    beta = p * mp.pi / L
    omega = 2 * mp.pi * f
    k0 = omega / C
    k1 = mp.sqrt(k0 ** 2 * eps1 - beta ** 2)
    rod = Piece(False, k1, mp.mpf(1), mp.mpf(0))
    k2 = k0 ** 2 - beta ** 2
    out = Piece(k2 < 0, mp.sqrt(abs(k2)), 1, 0)
    # Continuity at b: u and G (TE) or G/eps (TM).
    ub, Gb = rod.u(b), rod.G(b)
    if fam == "TM":
        Gb = Gb / eps1
    x = out.q * b
    if out.mod:
        f1, f2 = I(1, x), K(1, x)
        g1, g2 = out.q * I(0, x), -out.q * K(0, x)
    else:
        f1, f2 = J(1, x), Y(1, x)
        g1, g2 = out.q * J(0, x), out.q * Y(0, x)
    det = f1 * g2 - f2 * g1
    out.B = (ub * g2 - f2 * Gb) / det
    out.C = (f1 * Gb - g1 * ub) / det
    # Wall condition (the resonance): u(a) = 0 (TE) or G(a) = 0 (TM).
    wall = out.u(a) if fam == "TE" else out.G(a)
    scale = max(abs(out.B * (I(1, out.q * a) if out.mod else 1)), abs(ub))
    assert abs(wall) < mp.mpf("1e-18") * (scale + abs(out.G(a)) + abs(out.u(a))), (fam, f, wall)
    u2 = [check(rod.int_u2(0, b), 0, b, rod.u), check(out.int_u2(b, a), b, a, out.u)]
    G2 = [check(rod.int_G2(0, b), 0, b, rod.G), check(out.int_G2(b, a), b, a, out.G)]
    eps = [eps1, mp.mpf(1)]
    ss = L / 2 if p > 0 else mp.mpf(0)  # int sin^2(beta z) dz
    cc = L / 2 if p > 0 else L          # int cos^2(beta z) dz
    tp = 2 * mp.pi
    if fam == "TE":
        we = [EPS0 * eps[i] / 4 * tp * ss * u2[i] for i in range(2)]
        wm = [MU0 / 4 * tp / (omega * MU0) ** 2 * (beta ** 2 * cc * u2[i] + ss * G2[i]) for i in range(2)]
        side = tp * a * ss * out.G(a) ** 2 / (omega * MU0) ** 2 / 2
        end = tp * beta ** 2 * (u2[0] + u2[1]) / (omega * MU0) ** 2 / 2
    else:
        wm = [MU0 / 4 * tp * cc * u2[i] for i in range(2)]
        we = [EPS0 * eps[i] / 4 * tp / (omega * EPS0 * eps[i]) ** 2 * (beta ** 2 * ss * u2[i] + cc * G2[i]) for i in range(2)]
        side = tp * a * cc * out.u(a) ** 2 / 2
        end = tp * (u2[0] + u2[1]) / 2
    We, Wm = we[0] + we[1], wm[0] + wm[1]
    assert abs(We - Wm) < mp.mpf("1e-18") * We, (fam, f, We, Wm)
    W = We + Wm
    return we[0] / We, wm[0] / Wm, omega * W / side, omega * W / end


cases = []
with open("rod.tsv") as fh:
    for line in fh:
        if line.startswith("#"):
            continue
        fs = line.rstrip("\n").split("\t")
        cases.append(fs)
print("# full-length dielectric rod in a can, n = 0: rod filling factors and geometry factors; mpmath %s, mp.dps = %d" % (mp.__version__, mp.mp.dps))
print("# case\ta_m\tb_m\teps1\tL_m\tfamily\tp\tf_hz\tfill_e_rod\tfill_m_rod\tg_side_ohm\tg_end_ohm")
for fs in cases:
    name, a, b, eps1, L = fs[0], mp.mpf(fs[1]), mp.mpf(fs[2]), mp.mpf(fs[3]), mp.mpf(fs[4])
    fam, p, f0 = fs[6], int(fs[7]), mp.mpf(fs[8])
    if f0 > FMAX:
        continue
    beta = p * mp.pi / L
    f = mp.findroot(lambda x: D(fam, x, beta, a, b, eps1), f0)
    pe, pm, gs, ge = mode(fam, f, p, a, b, eps1, L)
    print("\t".join([name, fs[1], fs[2], fs[3], fs[4], fam, str(p), mp.nstr(f, 22)] + [mp.nstr(v, 20) for v in (pe, pm, gs, ge)]))
