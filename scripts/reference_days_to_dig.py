#!/usr/bin/env python3
"""Write the reference tables of tests/uncertainty.rs into OUTDIR (compared with tests/reference/).

1. uncertainty_days_to_dig.csv: one well pumping Q from day 0 in a confined aquifer (Theis 1935;
   Kruseman & de Ridder, Analysis and Evaluation of Pumping Test Data, 2nd ed. 1994, eq. 3.5):

       s(r, t) = Q / (4 pi T) * E1(r^2 S / (4 T t)),   T = K b

   scipy.special.exp1 and scipy.optimize.brentq give the time t at which s reaches the drawdown
   needed at the excavation's farthest corner (a single well's drawdown falls with distance, so
   the farthest point of a convex dig from a well outside it, one of its corners, is met last).
   Geometry (the design file in tests/uncertainty.rs): well at (0, 0); dig [20, 30] x [-5, 5] m;
   initial level 5.0 m, formation 2.5 m, margin 0.5 m: 3.0 m needed at r = sqrt(30^2 + 5^2);
   b = 10 m, S = 1e-3, Q = 5 L/s; programme of 60 days (no time when the need is not reached).
2. uncertainty_percentiles.csv: numpy.percentile (default method "linear", Hyndman & Fan 1996
   definition 7) of x_i = exp(sin(i) + i / n) for i = 0 .. n-1, several n and p.

Every number printed as %.12e. Usage: scripts/reference_days_to_dig.py OUTDIR
"""
import math
import os
import sys

import numpy as np
from scipy.optimize import brentq
from scipy.special import exp1

DAY = 86400.0
B, S, Q, NEED, DURATION = 10.0, 1e-3, 0.005, 3.0, 60 * DAY
R = math.hypot(30.0, 5.0)
KS = [1.0e-4, 1.1e-4, 1.25e-4, 2.0e-4]
NS = [5, 10, 101, 1000]
PS = [0.01, 0.1, 0.25, 0.5, 0.9, 0.99]


def drawdown(k, t):
    t_ = k * B
    return Q / (4 * math.pi * t_) * exp1(R * R * S / (4 * t_ * t))


def main(outdir):
    with open(os.path.join(outdir, "uncertainty_days_to_dig.csv"), "w") as f:
        f.write("k_m_per_s,time_s\n")
        for k in KS:
            if drawdown(k, DURATION) < NEED:
                f.write(f"{k:.12e},\n")
                continue
            t = brentq(lambda t: drawdown(k, t) - NEED, 1.0, DURATION, xtol=1e-6, rtol=1e-14)
            f.write(f"{k:.12e},{t:.12e}\n")
    with open(os.path.join(outdir, "uncertainty_percentiles.csv"), "w") as f:
        f.write("n,p,percentile\n")
        for n in NS:
            x = np.exp(np.sin(np.arange(n)) + np.arange(n) / n)
            for p in PS:
                f.write(f"{n},{p:.12e},{np.percentile(x, 100 * p):.12e}\n")


if __name__ == "__main__":
    main(sys.argv[1])
