#!/usr/bin/env python3
"""Coefficients of the fast Theis well function W(u) = E1(u) for 1 < u < 32 in
src/transient/well_function.rs.

f(u) = u·e^u·E1(u) is smooth and slowly varying (0.596 at u = 1, 0.97 at u = 32); it is fitted
on 4 equal pieces of x = ln u over [0, ln 32] by Chebyshev interpolation of degree 12 at the
Chebyshev nodes, with f evaluated by mpmath to 30 digits (mpmath.e1). Then
W(u) = f(u)·e^(−u)/u. The fit is checked in the Rust tests against scipy.special.exp1 on the
dense table tests/reference/theis_w.csv (scripts/reference_theis_w.py), to 1e-12 relative.

Usage: python3 scripts/fit_theis_w.py   (prints the Rust constant)
"""
import math

import mpmath as mp

mp.mp.dps = 30
PIECES = 4
DEGREE = 12
X_MAX = math.log(32.0)


def f(u):
    u = mp.mpf(u)
    return u * mp.e**u * mp.e1(u)


def chebyshev_coefficients(lo, hi):
    n = DEGREE + 1
    nodes = [mp.cos(mp.pi * (k + mp.mpf(1) / 2) / n) for k in range(n)]
    values = [f(mp.e ** (lo + (hi - lo) * (t + 1) / 2)) for t in nodes]
    coef = []
    for j in range(n):
        s = sum(values[k] * mp.cos(mp.pi * j * (k + mp.mpf(1) / 2) / n) for k in range(n))
        coef.append(2 * s / n * (mp.mpf(1) / 2 if j == 0 else 1))
    return coef


def main():
    width = mp.mpf(X_MAX) / PIECES
    print(f"const PIECES: usize = {PIECES};")
    print(f"const DEGREE: usize = {DEGREE};")
    print("const CHEB: [[f64; DEGREE + 1]; PIECES] = [")
    for p in range(PIECES):
        c = chebyshev_coefficients(p * width, (p + 1) * width)
        print("    [")
        for v in c:
            print(f"        {float(v)!r},")
        print("    ],")
    print("];")


if __name__ == "__main__":
    main()
