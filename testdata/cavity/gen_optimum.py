#!/usr/bin/env python3
"""Reference values for cavity/optimize_test.go, computed with mpmath.

Run from the repository root: python3 testdata/cavity/gen_optimum.py
(mpmath 1.3.0, 30 digits; prints the values pasted into the test)

The air-filled TE011 optimum over D/L in 0.5..3 lies where the rising chart
line of TE112 meets the falling one of TE311 (both above TE011); with
s = (D/L)^2 the lines 4 x^2 + (p pi)^2 s cross at
s = 4 (j'_31^2 - j'_11^2) / (3 pi^2). mpmath's besseljzero(0, 1,
derivative=1) is the trivial zero x = 0, so j'_01 is besseljzero(0, 2,
derivative=1).
"""
from mpmath import mp, besseljzero, sqrt, pi

mp.dps = 30
jp01 = besseljzero(0, 2, derivative=1)
jp11 = besseljzero(1, 1, derivative=1)
jp31 = besseljzero(3, 1, derivative=1)
j21 = besseljzero(2, 1)
s = 4 * (jp31**2 - jp11**2) / (3 * pi**2)
print("te011_opt_ratio", sqrt(s))
print("te011_opt_clearance", sqrt((4 * jp31**2 + pi**2 * s) / (4 * jp01**2 + pi**2 * s)) - 1)
# TE011 crossings on the mode chart: TE112 (4 jp11^2 + 4 pi^2 s = 4 jp01^2 + pi^2 s)
print("te112_cross_ratio", sqrt(4 * (jp01**2 - jp11**2) / (3 * pi**2)))
# TM210 (4 j21^2 = 4 jp01^2 + pi^2 s)
print("tm210_cross_ratio", sqrt(4 * (j21**2 - jp01**2) / pi**2))
# TM012 (4 j01^2 + 4 pi^2 s = 4 jp01^2 + pi^2 s)
j01 = besseljzero(0, 1)
print("tm012_cross_ratio", sqrt(4 * (jp01**2 - j01**2) / (3 * pi**2)))
