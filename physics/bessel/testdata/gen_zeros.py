#!/usr/bin/python3
"""Generate reference tables of Bessel-function zeros for cylcav/physics/bessel.

Writes two tab-separated tables next to this script:

  jzeros.tsv   j_{n,m},  the m-th positive zero of J_n
  jpzeros.tsv  j'_{n,m}, the m-th positive zero of J'_n (x = 0 excluded)

for n = 0..NMAX and m = 1..MMAX, each value with 20 significant digits.

Reference library: mpmath (Debian package python3-mpmath 1.2.1), function
mpmath.besseljzero(n, m, derivative) evaluated with mp.dps = 30.
mpmath counts x = 0 as the first zero of J'_0, so for n = 0 the primed
table uses besseljzero(0, m+1, 1).

Usage (from the repository root; takes roughly 10 minutes on 2 cores):

  /usr/bin/python3 physics/bessel/testdata/gen_zeros.py [--nmax 200] [--mmax 200] [--jobs 2]
"""

import argparse
import multiprocessing
import os
import sys

import mpmath

DPS = 30     # working precision of mpmath, decimal digits
DIGITS = 20  # significant digits written to the tables


def order_rows(args):
    """Return (n, [j_{n,1..mmax}], [j'_{n,1..mmax}]) as strings."""
    n, mmax = args
    mpmath.mp.dps = DPS
    shift = 1 if n == 0 else 0  # skip mpmath's x = 0 zero of J'_0
    j = [mpmath.besseljzero(n, m) for m in range(1, mmax + 1)]
    jp = [mpmath.besseljzero(n, m + shift, 1) for m in range(1, mmax + 1)]
    # Sanity checks: strictly increasing, positive, j' < j for n >= 1.
    for seq in (j, jp):
        if seq[0] <= 0 or any(b <= a for a, b in zip(seq, seq[1:])):
            raise SystemExit("order %d: zeros not strictly increasing" % n)
    if n >= 1 and any(a >= b for a, b in zip(jp, j)):
        raise SystemExit("order %d: j' >= j" % n)
    return (n,
            [mpmath.nstr(z, DIGITS, strip_zeros=False) for z in j],
            [mpmath.nstr(z, DIGITS, strip_zeros=False) for z in jp])


def write_table(path, title, rows, mmax, nmax, which):
    tmp = path + ".tmp"
    with open(tmp, "w") as f:
        f.write("# %s for n = 0..%d, m = 1..%d\n" % (title, nmax, mmax))
        f.write("# computed with mpmath %s (Debian python3-mpmath), "
                "mpmath.besseljzero, mp.dps = %d, printed to %d significant digits\n"
                % (mpmath.__version__, DPS, DIGITS))
        f.write("# command: /usr/bin/python3 physics/bessel/testdata/gen_zeros.py "
                "--nmax %d --mmax %d\n" % (nmax, mmax))
        f.write("# columns: n<TAB>m<TAB>zero\n")
        for n, j, jp in rows:
            vals = j if which == 0 else jp
            for m, v in enumerate(vals, start=1):
                f.write("%d\t%d\t%s\n" % (n, m, v))
    os.replace(tmp, path)


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--nmax", type=int, default=200)
    ap.add_argument("--mmax", type=int, default=200)
    ap.add_argument("--jobs", type=int, default=2)
    args = ap.parse_args()
    here = os.path.dirname(os.path.abspath(__file__))
    # Largest orders first: they are the slowest (small m, large n).
    work = [(n, args.mmax) for n in range(args.nmax, -1, -1)]
    with multiprocessing.Pool(args.jobs) as pool:
        rows = sorted(pool.map(order_rows, work, chunksize=1))
    # Interlacing across orders: j_{n,m} < j_{n+1,m}, likewise for j' with
    # n >= 1 (j'_{0,m} = j_{1,m} lies above j'_{1,m} once x = 0 is excluded).
    for (n, j, jp), (_, j1, jp1) in zip(rows, rows[1:]):
        pairs = [(j, j1)] if n == 0 else [(j, j1), (jp, jp1)]
        for a, b in pairs:
            if any(mpmath.mpf(x) >= mpmath.mpf(y) for x, y in zip(a, b)):
                raise SystemExit("orders %d, %d: zeros do not interlace" % (n, n + 1))
    write_table(os.path.join(here, "jzeros.tsv"),
                "Zeros j_{n,m} of the Bessel function J_n", rows,
                args.mmax, args.nmax, 0)
    write_table(os.path.join(here, "jpzeros.tsv"),
                "Zeros j'_{n,m} of the derivative J'_n (x = 0 excluded)", rows,
                args.mmax, args.nmax, 1)
    print("wrote %d orders x %d zeros" % (len(rows), args.mmax), file=sys.stderr)


if __name__ == "__main__":
    main()
