#!/usr/bin/env python3
"""Reference values for tests/settlement_time.rs, computed with mpmath independently of drydig,
written to tests/reference/consolidation_u.csv.

Terzaghi's average degree of consolidation for a uniform initial excess pore pressure,
U(T_v) = 1 - sum_{m>=0} 2/M^2 exp(-M^2 T_v), M = pi (2m + 1)/2 (Terzaghi 1943), summed term by
term with mpmath at 30 digits, at T_v from 1e-6 to 3. Rows with kind "inverse" give the T_v at which U
reaches 0.1 ... 0.9, 0.95 and 0.99 (bisection in mpmath arithmetic), the form of the published U - T_v tables.
"""
import sys

import mpmath as mp

mp.mp.dps = 30


def U(tv):
    """The series summed term by term until exp(-M^2 T_v) < 1e-40."""
    tv = mp.mpf(tv)
    terms = []
    m = 0
    while True:
        M = mp.pi * (2 * m + 1) / 2
        terms.append(2 / M**2 * mp.exp(-(M**2) * tv))
        if M**2 * tv > 92:
            break
        m += 1
    return 1 - mp.fsum(terms)


def main(path):
    rows = ["kind,tv,u"]
    for tv in ["1e-6", "1e-5", "1e-4", "0.001", "0.005", "0.01", "0.02", "0.05", "0.1", "0.2",
               "0.3", "0.5", "0.7", "1.0", "1.5", "2.0", "3.0"]:
        rows.append(f"forward,{tv},{mp.nstr(U(tv), 15)}")
    for u in ["0.1", "0.2", "0.3", "0.4", "0.5", "0.6", "0.7", "0.8", "0.9", "0.95", "0.99"]:
        lo, hi = mp.mpf("1e-6"), mp.mpf(5)
        for _ in range(120):  # bisection: U rises with T_v
            mid = (lo + hi) / 2
            lo, hi = (mid, hi) if U(mid) < mp.mpf(u) else (lo, mid)
        tv = (lo + hi) / 2
        rows.append(f"inverse,{mp.nstr(tv, 15)},{u}")
    with open(path, "w") as f:
        f.write("\n".join(rows) + "\n")


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else "tests/reference/consolidation_u.csv")
