#!/usr/bin/python3
"""Generate reference tables for the tests of cylcav/filter.

Reference library: SciPy (Debian package python3-scipy 1.10.1, with
python3-numpy 1.24.2), analog filter design in scipy.signal. Every value is
written with 17 significant digits (repr of a float64).

Tables written next to this script:

  cheby1_poles.tsv  poles of scipy.signal.cheby1(N, rp, 1.0, analog=True,
                    output='zpk') -- the classical Chebyshev lowpass with
                    ripple rp dB and ripple-band edge 1 rad/s.
  ellip_zpk.tsv     zeros and poles of scipy.signal.ellip(N, rp, rs, 1.0,
                    analog=True, output='zpk'). An elliptic (Cauer) response
                    is the generalised Chebyshev response whose prescribed
                    transmission zeros are the elliptic ones, so it is an
                    independent reference for the synthesis with zeros
                    (N-1 finite zeros for odd N, N -- fully canonical -- for
                    even N).
  order.tsv         minimum orders from scipy.signal.buttord and cheb1ord
                    (analog=True, wp = 1): Butterworth with gpass =
                    10 log10(2) dB (3.01 dB band edge), Chebyshev with
                    gpass = ripple.
  mag.tsv           |H(j w)|^2 from scipy.signal.freqs_zpk of some of the
                    filters above.

Usage (from the repository root, takes about a second):

  /usr/bin/python3 filter/testdata/gen_scipy.py
"""

import math
import os

import numpy
import scipy
import scipy.signal as sig

HERE = os.path.dirname(os.path.abspath(__file__))
HEADER = ("# computed with scipy %s (Debian python3-scipy), numpy %s\n"
          "# command: /usr/bin/python3 filter/testdata/gen_scipy.py\n"
          % (scipy.__version__, numpy.__version__))


def write(name, comment, columns, rows):
    with open(os.path.join(HERE, name), "w") as f:
        f.write(comment)
        f.write(HEADER)
        f.write("# columns: " + "\t".join(columns) + "\n")
        for r in rows:
            f.write("\t".join(repr(x) if isinstance(x, float) else str(x) for x in r) + "\n")


def cheby1_poles():
    rows = []
    for rp in (0.01, 0.1, 0.5, 1.0):
        for n in list(range(1, 13)) + [20, 30]:
            z, p, k = sig.cheby1(n, rp, 1.0, analog=True, output="zpk")
            for q in sorted(p, key=lambda c: (c.imag, c.real)):
                rows.append((n, rp, float(q.real), float(q.imag)))
    write("cheby1_poles.tsv",
          "# Poles of scipy.signal.cheby1(N, rp, 1.0, analog=True, output='zpk')\n",
          ["N", "ripple_db", "pole_re", "pole_im"], rows)


ELLIP_CASES = [(3, 0.1, 30.0), (4, 0.1, 40.0), (5, 0.0436, 50.0), (6, 0.0436, 60.0),
               (7, 0.01, 70.0), (8, 0.1, 80.0)]


def ellip_zpk():
    rows = []
    for n, rp, rs in ELLIP_CASES:
        z, p, k = sig.ellip(n, rp, rs, 1.0, analog=True, output="zpk")
        for q in sorted(z, key=lambda c: (c.imag, c.real)):
            rows.append((n, rp, rs, "z", float(q.real), float(q.imag)))
        for q in sorted(p, key=lambda c: (c.imag, c.real)):
            rows.append((n, rp, rs, "p", float(q.real), float(q.imag)))
    write("ellip_zpk.tsv",
          "# Zeros (z) and poles (p) of scipy.signal.ellip(N, rp, rs, 1.0, analog=True, output='zpk')\n",
          ["N", "rp_db", "rs_db", "kind", "re", "im"], rows)


def orders():
    rows = []
    g3 = 10 * math.log10(2)
    for ws in (1.2, 1.5, 2.0, 3.0, 5.0):
        for gstop in (20.0, 40.0, 60.0):
            n, _ = sig.buttord(1.0, ws, g3, gstop, analog=True)
            rows.append(("butterworth", ws, g3, gstop, int(n)))
            for rp in (0.01, 0.1, 0.5):
                n, _ = sig.cheb1ord(1.0, ws, rp, gstop, analog=True)
                rows.append(("chebyshev", ws, rp, gstop, int(n)))
    write("order.tsv",
          "# Minimum orders from scipy.signal.buttord / cheb1ord (wp = 1, ws, gpass, gstop, analog=True)\n",
          ["family", "ws", "gpass_db", "gstop_db", "order"], rows)


def mags():
    rows = []
    w = numpy.array([0.0, 0.3, 0.7, 0.95, 1.0, 1.05, 1.3, 2.0, 4.0])
    for n, rp in ((5, 0.1), (6, 0.5)):
        z, p, k = sig.cheby1(n, rp, 1.0, analog=True, output="zpk")
        _, h = sig.freqs_zpk(z, p, k, worN=w)
        for wi, hi in zip(w, h):
            rows.append(("cheby1", n, rp, 0.0, float(wi), float(abs(hi) ** 2)))
    for n, rp, rs in ELLIP_CASES:
        z, p, k = sig.ellip(n, rp, rs, 1.0, analog=True, output="zpk")
        _, h = sig.freqs_zpk(z, p, k, worN=w)
        for wi, hi in zip(w, h):
            rows.append(("ellip", n, rp, rs, float(wi), float(abs(hi) ** 2)))
    write("mag.tsv",
          "# |H(jw)|^2 from scipy.signal.freqs_zpk of cheby1(N, rp, 1, analog=True) and ellip(N, rp, rs, 1, analog=True)\n",
          ["filter", "N", "rp_db", "rs_db", "w", "mag2"], rows)


if __name__ == "__main__":
    cheby1_poles()
    ellip_zpk()
    orders()
    mags()
