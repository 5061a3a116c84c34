#!/usr/bin/env python3
"""Write tests/reference/screen_average.csv, used by src/physics/screen_average.rs.

The partial-penetration correction of a source screen z1..z2 (layer thickness D, anisotropy
a = Kv/Kh) at horizontal distance r, averaged over another screen b..t:

    avg(r) = (2 D^2/(pi^2 l (t - b))) sum_n (1/n^2) [sin(n pi z2/D) - sin(n pi z1/D)]
                                         [sin(n pi t/D) - sin(n pi b/D)] K0(n pi r sqrt(a)/D)

(the cosine series of checks.md section 12 integrated term by term over z), summed directly with
scipy.special.k0 until K0 underflows, with math.fsum. Each value is cross-checked against
scipy.integrate.quad of the point series over b..t (divided by t - b); the script stops with an
error if they differ by more than 1e-9 absolute.

Columns: z1, z2, D, a, r, b, t, average. Deterministic output (%.12e).

Usage: python3 scripts/reference_screen_average.py [OUTPUT_CSV]
"""

import math
import os
import sys

import numpy
from scipy import integrate, special

# z1, z2, D, a, r, b, t
CASES = [
    ("15", "20", "20", "1", "2", "15", "20"),
    ("15", "20", "20", "1", "2", "10", "15"),
    ("15", "20", "20", "0.1", "2", "15", "20"),
    ("15", "20", "20", "1", "0.75", "15", "20"),
    ("15", "20", "20", "1", "1.5", "16", "20"),
    ("0", "5", "20", "1", "3", "0", "5"),
    ("8", "12", "20", "1", "0.5", "8", "12"),
    ("6", "9", "9", "1", "1.5", "6", "9"),
    ("6", "9", "9", "0.1", "1.5", "5", "9"),
    ("2", "3", "30", "0.2", "4", "2", "3"),
    ("4", "6", "10", "0.5", "10", "0", "10"),
    ("15", "20", "20", "1", "30", "15", "20"),
    ("10", "20", "20", "1", "5", "12", "18"),
]

TOL = 1e-9


def sin_diff(n, lo, hi, d):
    return numpy.sin(n * math.pi * hi / d) - numpy.sin(n * math.pi * lo / d)


def terms(r, a, d):
    x = math.pi * r * math.sqrt(a) / d
    n = numpy.arange(1, int(745.0 / x) + 2, dtype=float)
    return n, special.k0(n * x)


def series_average(z1, z2, d, a, r, b, t):
    n, k = terms(r, a, d)
    s = sin_diff(n, z1, z2, d) * sin_diff(n, b, t, d)
    return 2 * d * d / (math.pi ** 2 * (z2 - z1) * (t - b)) * math.fsum(s / n ** 2 * k)


def point(z1, z2, d, a, r, z):
    n, k = terms(r, a, d)
    s = sin_diff(n, z1, z2, d) * numpy.cos(n * math.pi * z / d)
    return 2 * d / (math.pi * (z2 - z1)) * math.fsum(s / n * k)


def quad_average(z1, z2, d, a, r, b, t):
    breaks = [z for z in (z1, z2) if b < z < t]
    val, _ = integrate.quad(
        lambda z: point(z1, z2, d, a, r, z), b, t, points=breaks or None,
        epsabs=1e-13, epsrel=1e-12, limit=200,
    )
    return val / (t - b)


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(
        root, "tests", "reference", "screen_average.csv")
    lines = [
        "# partial-penetration correction averaged over another screen: scipy.special.k0 series,",
        "# cross-checked with scipy.integrate.quad (scripts/reference_screen_average.py)",
        "z1,z2,D,a,r,b,t,average",
    ]
    for case in CASES:
        v = [float(c) for c in case]
        s = series_average(*v)
        q = quad_average(*v)
        if abs(s - q) > TOL:
            sys.exit(f"series {s} and quad {q} disagree for {case}")
        lines.append(",".join(case) + f",{s:.12e}")
    with open(out, "w") as f:
        f.write("\n".join(lines) + "\n")


if __name__ == "__main__":
    main()
