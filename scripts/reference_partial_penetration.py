#!/usr/bin/env python3
"""Write the partial-penetration reference table used by src/physics/partial_penetration.rs.

The screen-averaged correction at the well
    Dw = (2 D^2/(pi^2 l^2)) sum_n (1/n^2) [sin(n pi z2/D) - sin(n pi z1/D)]^2 K0(n pi rw sqrt(a)/D)
and the point correction
    D(r, z) = (2 D/(pi l)) sum_n (1/n) [sin(n pi z2/D) - sin(n pi z1/D)] cos(n pi z/D) K0(n pi r sqrt(a)/D)
(checks.md section 12) are summed directly with scipy.special.k0 over every n until K0
underflows (n pi r sqrt(a)/D > 745), with math.fsum. No extrapolation: mpmath.nsum extrapolates
this oscillating series wrongly. Each value is cross-checked against a direct mpmath sum at 20
digits (stopped once a rigorous bound on the rest, from K0(t) <= K0(y) exp(-(t - y)), is below
1e-17 of the sum);
the script stops with an error if they disagree beyond 1e-11 relative (or 1e-14 absolute).

Output is deterministic: inputs are fixed decimal strings, values are printed as %.12e.

Usage: python3 scripts/reference_partial_penetration.py [OUTPUT_CSV]
       (default: tests/reference/partial_penetration.csv, relative to the repository root)
"""

import math
import os
import sys

import mpmath
import numpy
import scipy
from scipy import special

mpmath.mp.dps = 20

# kind, z1, z2, D, a, r, z   (z unused for "well"; r is r_w there)
CASES = [
    # the rows of checks.md section 12
    ("well", "15", "20", "20", "1", "0.15", "0"),
    ("well", "15", "20", "20", "0.1", "0.15", "0"),
    ("well", "10", "20", "20", "1", "0.15", "0"),
    ("well", "6", "9", "9", "1", "0.05", "0"),
    ("well", "20", "30", "40", "1", "0.3", "0"),
    ("point", "15", "20", "20", "1", "1", "17.5"),
    ("point", "15", "20", "20", "1", "5", "17.5"),
    ("point", "15", "20", "20", "1", "10", "10"),
    ("point", "15", "20", "20", "1", "30", "17.5"),
    # more: screens at the base, in the middle, short, anisotropic, thick wells (large x)
    ("well", "0", "5", "20", "1", "0.15", "0"),
    ("well", "8", "12", "20", "1", "0.1", "0"),
    ("well", "0.5", "20", "20", "1", "0.15", "0"),
    ("well", "2", "3", "30", "0.2", "0.2", "0"),
    ("well", "15", "20", "20", "1", "0.5", "0"),
    ("well", "15", "20", "20", "1", "2", "0"),
    ("well", "4", "6", "10", "0.5", "1.5", "0"),
    ("point", "15", "20", "20", "1", "0.15", "17.5"),
    ("point", "15", "20", "20", "1", "0.15", "3"),
    ("point", "15", "20", "20", "0.1", "2", "20"),
    ("point", "15", "20", "20", "1", "50", "0"),
    ("point", "0", "5", "20", "1", "3", "0"),
    ("point", "8", "12", "20", "1", "0.5", "12"),
    ("point", "6", "9", "9", "1", "0.2", "7"),
]

ABS_TOL = 1e-14
REL_TOL = 1e-11


def sin_diff(n, z1, z2, d):
    return numpy.sin(n * math.pi * z2 / d) - numpy.sin(n * math.pi * z1 / d)


def scipy_value(kind, z1, z2, d, a, r, z):
    l = z2 - z1
    x = math.pi * r * math.sqrt(a) / d
    n = numpy.arange(1, int(745.0 / x) + 2, dtype=float)
    s = sin_diff(n, z1, z2, d)
    k = special.k0(n * x)
    if kind == "well":
        return 2 * d * d / (math.pi ** 2 * l * l) * math.fsum(s * s / n ** 2 * k)
    return 2 * d / (math.pi * l) * math.fsum(s / n * numpy.cos(n * math.pi * z / d) * k)


def mpmath_value(kind, z1s, z2s, ds, as_, rs, zs):
    z1, z2, d, a, r, z = (mpmath.mpf(v) for v in (z1s, z2s, ds, as_, rs, zs))
    l = z2 - z1
    x = mpmath.pi * r * mpmath.sqrt(a) / d
    rest = 1 / (1 - mpmath.exp(-x))
    total = mpmath.mpf(0)
    n = 0
    while True:
        n += 1
        k = mpmath.besselk(0, n * x)
        if 4 * k * rest / n < mpmath.mpf("1e-17") * (abs(total) + mpmath.mpf("1e-3")):
            break
        s = mpmath.sin(n * mpmath.pi * z2 / d) - mpmath.sin(n * mpmath.pi * z1 / d)
        if kind == "well":
            total += s * s / n ** 2 * k
        else:
            total += s / n * mpmath.cos(n * mpmath.pi * z / d) * k
    if kind == "well":
        return 2 * d * d / (mpmath.pi ** 2 * l * l) * total
    return 2 * d / (mpmath.pi * l) * total


def fmt(x):
    return "%.12e" % x


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(
        root, "tests", "reference", "partial_penetration.csv")
    lines = [
        "# drydig partial-penetration reference, written by "
        "scripts/reference_partial_penetration.py with "
        f"scipy {scipy.__version__}, mpmath {mpmath.__version__}, numpy {numpy.__version__}",
        "# value = dimensionless correction (multiply by Q/(2 pi T)); well = screen average at "
        "r = r_w, point = at (r, z); scipy.special.k0 summed directly until K0 underflows, "
        "cross-checked with a 20-digit mpmath direct sum to 1e-11",
        "kind,z1,z2,thickness,anisotropy,r,z,value",
    ]
    for kind, *args in CASES:
        vals = [float(v) for v in args]
        v = scipy_value(kind, *vals)
        ref = mpmath_value(kind, *args)
        if abs(v - ref) > max(REL_TOL * abs(ref), ABS_TOL):
            sys.exit(f"cross-check failed for {kind} {args}: scipy {v!r} vs mpmath {ref}")
        lines.append(",".join([kind] + [fmt(x) for x in vals] + [fmt(v)]))
    with open(out, "w", encoding="ascii", newline="\n") as fh:
        fh.write("\n".join(lines) + "\n")


if __name__ == "__main__":
    main()
