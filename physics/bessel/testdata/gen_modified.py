#!/usr/bin/python3
"""Reference values of the modified Bessel functions I0, I1, K0, K1 for
physics/bessel/modified_test.go, computed with mpmath at 40 digits.
Run: /usr/bin/python3 gen_modified.py > modified.tsv"""
import mpmath

mpmath.mp.dps = 40
xs = [1e-6, 1e-3, 0.01, 0.1, 0.5, 1, 1.5, 1.999, 2, 2.001, 2.5, 3, 4, 5, 7.5,
      10, 12, 15, 17.9, 18, 18.1, 19.99, 20, 20.01, 25, 30, 50, 100, 300]
print("# modified Bessel functions; mpmath %s, mp.dps = %d" % (mpmath.__version__, mpmath.mp.dps))
print("# x\tI0\tI1\tK0\tK1")
for x in xs:
    x = mpmath.mpf(x)
    row = [x, mpmath.besseli(0, x), mpmath.besseli(1, x), mpmath.besselk(0, x), mpmath.besselk(1, x)]
    print("\t".join(mpmath.nstr(v, 25, min_fixed=-1, max_fixed=-1) if i else mpmath.nstr(v, 17) for i, v in enumerate(row)))
