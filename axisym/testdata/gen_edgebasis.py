#!/usr/bin/python3
"""Reference values for axisym/edgebasis_test.go (mpmath, 40 digits).

1. J_(2/3 + j)(z) for the fractional-order Bessel sequence (fracJ).
2. The finite Hankel integral of the edge-conditioned basis,
   int_0^1 x^2 (1-x^2)^nu P_k^(1,nu)(1-2x^2) J_1(z x) dx
     = 2^nu Gamma(k+nu+1)/k! z^(-nu-1) J_(2k+nu+2)(z),
   checked by quadrature for nu = -1/3, 2/3 and the dielectric-wedge
   exponent -0.39545 (the script prints the largest relative difference).
"""
from mpmath import mp, mpf, besselj, quad, jacobi, gamma

mp.dps = 40
for z in ["0.3", "2", "17", "150", "900"]:
    print(z, [float(besselj(mpf(2) / 3 + j, mpf(z))) for j in (0, 1, 5, 20)])

worst = 0
for nu in (mpf(-1) / 3, mpf(2) / 3, mpf("-0.3954496479500669")):
    for k in (0, 1, 3, 5):
        for z in (mpf("0.7"), mpf(5), mpf("13.3"), mpf(40)):
            f = lambda x: x**2 * (1 - x**2)**nu * jacobi(k, 1, nu, 1 - 2 * x**2) * besselj(1, z * x)
            i = quad(f, [0, 0.25, 0.5, 0.75, 0.9, 0.99, 1])
            c = 2**nu * gamma(k + nu + 1) / gamma(k + 1) * z**(-nu - 1) * besselj(2 * k + nu + 2, z)
            worst = max(worst, abs(i - c) / abs(c))
print("largest relative difference of the Hankel integral:", float(worst))
