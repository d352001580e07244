#!/usr/bin/python3
"""Generate reference zeros of Bessel cross products for cylcav/physics/bessel.

Writes crosszeros.tsv next to this script: for each radius ratio c, order n
and index m, the m-th positive root x of

  tm:  J_n(x) Y_n(c x) - J_n(c x) Y_n(x) = 0
  te:  J'_n(x) Y'_n(c x) - J'_n(c x) Y'_n(x) = 0

(the cutoffs k a = x of the TM_nm and TE_nm modes of a coaxial guide of
radii a and b = c a), each printed to 20 significant digits. The ratio c is
the float64 nearest to the decimal in the table, exactly, as the Go tests
use it.

Method, independent of the Go code: the roots are bracketed by sign changes
of the cross product on a grid in x whose step, pi/(40 c), is a small share
of the smallest possible root spacing (the phase of the cross product grows
by pi from root to root at a rate below about c), evaluated in double
precision with SciPy (python3-scipy 1.10.1, scipy.special.jv, yv, jvp, yvp);
each bracket is then refined with mpmath (python3-mpmath 1.2.1,
mpmath.findroot, solver 'anderson', on mpmath.besselj and mpmath.bessely)
at mp.dps = 30. The grid starts at n/c (0.9 n/c for safety), below which no
root lies (Rayleigh quotient of the radial eigenproblem; derived). The
script checks that each refined root lies in its bracket, that the cross
product changes sign across it at 30 digits, and that the roots increase.

Usage (from the repository root; about 30 CPU-minutes; --cache DIR keeps finished parts):

  /usr/bin/python3 physics/bessel/testdata/gen_cross.py [--jobs 2] [--cache DIR]
"""

import argparse
import multiprocessing
import os
import sys

import mpmath
import numpy as np
import scipy
from scipy import special

DPS = 30      # working precision of mpmath, decimal digits
DIGITS = 20   # significant digits written to the table
RATIOS = ["1.1", "1.5", "2", "3.5", "10", "100"]
ORDERS = [0, 1, 2, 3, 5, 10, 25, 50, 99]
INDICES = list(range(1, 9)) + [12, 20, 35, 60, 100]
# A thin line, c = 1.001, where the lowest TE root of each order is the
# hardest case: (kind, c, n) with the first THIN_COUNT roots.
THIN = [("te", "1.001", n) for n in (1, 2, 7, 40)] + [("tm", "1.001", n) for n in (0, 1, 7)]
THIN_COUNT = 3
GRID_SHARE = 40  # grid step pi/(GRID_SHARE c)


# Roots of an earlier run, keyed by (kind, c, n, m), that may narrow the
# first bracket (--hints FILE); the result does not depend on them.
HINTS = {}


def cross_fp(kind, n, c, x):
    if kind == "tm":
        return special.jv(n, x) * special.yv(n, c * x) - special.jv(n, c * x) * special.yv(n, x)
    return special.jvp(n, x) * special.yvp(n, c * x) - special.jvp(n, c * x) * special.yvp(n, x)


def cross_mp(kind, n, c, x):
    """The cross product divided by the moduli (|J| + |Y|) at x and c x,
    which has the same roots and is of order one near them (it is close to
    the sine of the phase difference)."""
    d = 0 if kind == "tm" else 1
    j1, y1 = mpmath.besselj(n, x, d), mpmath.bessely(n, x, d)
    j2, y2 = mpmath.besselj(n, c * x, d), mpmath.bessely(n, c * x, d)
    return (j1 * y2 - j2 * y1) / ((abs(j1) + abs(y1)) * (abs(j2) + abs(y2)))


def roots(task):
    kind, cs, n, cache, indices = task
    if cache:
        path = os.path.join(cache, "%s_%s_%d.tsv" % (kind, cs, n))
        if os.path.exists(path):
            with open(path) as f:
                return [tuple(int(v) if i in (2, 3) else v for i, v in enumerate(line.rstrip("\n").split("\t")))
                        for line in f]
    rows = compute(kind, cs, n, indices)
    if cache:
        with open(path + ".tmp", "w") as f:
            for r in rows:
                f.write("%s\t%s\t%d\t%d\t%s\n" % r)
        os.replace(path + ".tmp", path)
    print("done %s c=%s n=%d" % (kind, cs, n), file=sys.stderr, flush=True)
    return rows


def compute(kind, cs, n, indices):
    mpmath.mp.dps = DPS
    c = float(cs)
    # The ratio as the Go code sees it: the float64 nearest to the decimal
    # c, exactly. (Roots near m pi/(c-1) move by about ulp(c)/(c-1)
    # relative with c: 1e-13 at c = 1.001.)
    cm = mpmath.mpf(c)
    need = max(indices)
    h = np.pi / (GRID_SHARE * c)
    start = max(0.9 * n / c, h)
    found = []
    lo = start
    while len(found) < need:
        # Scan in chunks until enough sign changes are found.
        xs = lo + h * np.arange(20001)
        f = cross_fp(kind, n, c, xs)
        if not np.all(np.isfinite(f)):
            raise SystemExit("%s n=%d c=%s: non-finite cross product on the grid" % (kind, n, cs))
        idx = np.nonzero(np.sign(f[:-1]) * np.sign(f[1:]) < 0)[0]
        for i in idx:
            found.append((xs[i], xs[i + 1]))
        lo = xs[-1]
    rows = []
    prev = mpmath.mpf(0)
    for m in indices:
        a, b = found[m - 1]
        # Widen by one grid step on each side in case the double-precision
        # sign was wrong right next to the root.
        a, b = mpmath.mpf(a - h), mpmath.mpf(b + h)
        if m > 1:
            a = max(a, mpmath.mpf(found[m - 2][1]))
        if m < len(found):
            b = min(b, mpmath.mpf(found[m][0]))
        hint = HINTS.get((kind, cs, n, m))
        if hint is not None and a < hint < b:
            # A root from an earlier run (--hints): try a tight bracket
            # around it first; it is used only if it brackets a sign
            # change at 30 digits.
            ta, tb = hint * (1 - mpmath.mpf(10) ** -11), hint * (1 + mpmath.mpf(10) ** -11)
            if cross_mp(kind, n, cm, ta) * cross_mp(kind, n, cm, tb) < 0:
                a, b = ta, tb
        fa, fb = cross_mp(kind, n, cm, a), cross_mp(kind, n, cm, b)
        if fa * fb >= 0:
            raise SystemExit("%s n=%d c=%s m=%d: no sign change at 30 digits in [%s, %s]" % (kind, n, cs, m, a, b))
        x = mpmath.findroot(lambda t: cross_mp(kind, n, cm, t), (a, b), solver="anderson")
        if not (a < x < b) or x <= prev:
            raise SystemExit("%s n=%d c=%s m=%d: root %s outside its bracket" % (kind, n, cs, m, x))
        e = x * mpmath.mpf(10) ** (-25)
        if cross_mp(kind, n, cm, x - e) * cross_mp(kind, n, cm, x + e) >= 0:
            raise SystemExit("%s n=%d c=%s m=%d: no sign change across %s" % (kind, n, cs, m, x))
        prev = x
        rows.append((kind, cs, n, m, mpmath.nstr(x, DIGITS, strip_zeros=False)))
    # The grid must resolve every root: the smallest gap between
    # consecutive roots found must span several grid steps.
    gaps = [b[0] - a[1] for a, b in zip(found, found[1:])]
    if gaps and min(gaps) < 4 * h:
        raise SystemExit("%s n=%d c=%s: roots closer than 4 grid steps" % (kind, n, cs))
    return rows


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--jobs", type=int, default=2)
    ap.add_argument("--cache", default="", help="directory keeping finished (kind, c, n) parts between runs")
    ap.add_argument("--hints", default="", help="an earlier crosszeros.tsv whose roots may narrow the brackets")
    args = ap.parse_args()
    if args.cache:
        os.makedirs(args.cache, exist_ok=True)
    if args.hints:
        with open(args.hints) as f:
            for line in f:
                if line.startswith("#") or not line.strip():
                    continue
                k, c, n, m, x = line.split("\t")
                HINTS[(k, c, int(n), int(m))] = mpmath.mpf(x)
    here = os.path.dirname(os.path.abspath(__file__))
    work = [(k, c, n, args.cache, INDICES) for k in ("tm", "te") for c in RATIOS for n in reversed(ORDERS)]
    work += [(k, c, n, args.cache, list(range(1, THIN_COUNT + 1))) for k, c, n in THIN]
    with multiprocessing.Pool(args.jobs) as pool:
        parts = pool.map(roots, work, chunksize=1)
    order = {(k, c, n): i for i, (k, c, n) in enumerate(
        [(k, c, n) for k in ("tm", "te") for c in RATIOS for n in ORDERS] + THIN)}
    parts.sort(key=lambda rows: order[rows[0][:3]])
    path = os.path.join(here, "crosszeros.tsv")
    tmp = path + ".tmp"
    with open(tmp, "w") as f:
        f.write("# Roots x of the Bessel cross products, m-th positive root for ratio c and order n\n")
        f.write("# tm: J_n(x) Y_n(c x) - J_n(c x) Y_n(x) = 0; te: J'_n(x) Y'_n(c x) - J'_n(c x) Y'_n(x) = 0\n")
        f.write("# computed with mpmath %s (Debian python3-mpmath), mpmath.findroot on besselj/bessely, "
                "mp.dps = %d, brackets from a SciPy %s sign scan; printed to %d significant digits\n"
                % (mpmath.__version__, DPS, scipy.__version__, DIGITS))
        f.write("# the ratio c is the float64 nearest to the decimal in column 2, taken exactly\n")
        f.write("# command: /usr/bin/python3 physics/bessel/testdata/gen_cross.py\n")
        f.write("# columns: kind<TAB>c<TAB>n<TAB>m<TAB>root\n")
        for rows in parts:
            for r in rows:
                f.write("%s\t%s\t%d\t%d\t%s\n" % r)
    os.replace(tmp, path)
    print("wrote %d rows" % sum(len(p) for p in parts), file=sys.stderr)


if __name__ == "__main__":
    main()
