#!/usr/bin/env python3
"""Dense reference table of the Theis well function W(u) = E1(u) = scipy.special.exp1(u) for
1 <= u <= 40: 4001 points spaced evenly in ln u, plus the piece ends of the fast
approximation (u = 32^(k/4)) and the cut-off u = 32 itself. Written with 17 significant
figures. Used by src/transient/well_function.rs (1e-12 relative below u = 32, 1e-15
absolute beyond).

Usage: python3 scripts/reference_theis_w.py OUT.csv
"""
import sys

import numpy as np
from scipy.special import exp1


def main():
    out = sys.argv[1] if len(sys.argv) > 1 else "tests/reference/theis_w.csv"
    u = np.exp(np.linspace(0.0, np.log(40.0), 4001))
    ends = 32.0 ** (np.arange(5) / 4.0)
    u = np.unique(np.concatenate([u, ends, ends * (1 + 1e-12), ends * (1 - 1e-12)]))
    u = u[(u >= 1.0) & (u <= 40.0)]
    with open(out, "w") as f:
        f.write("u,w\n")
        for x in u:
            f.write(f"{x:.17g},{exp1(x):.17g}\n")


if __name__ == "__main__":
    main()
