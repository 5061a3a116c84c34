#!/usr/bin/env python3
"""Write tests/reference/uncertainty_thiem_lognormal.csv, used by tests/uncertainty.rs.

A single equivalent well in a confined aquifer with a fixed radius of influence: Thiem's flow
(Thiem 1906; Kruseman & de Ridder, Analysis and Evaluation of Pumping Test Data, 2nd ed. 1990,
eq. 3.1)

    Q = 2 pi K D s / ln(R / r)

is proportional to K. With K lognormal of median K50 and factor f (geometric standard deviation,
sigma_ln = ln f), Q is lognormal with the same sigma_ln and median Q(K50), so its percentiles are
scipy.stats.lognorm(s=ln f, scale=Q(K50)).ppf(p). Inputs are fixed decimals; every number is
printed as %.12e.

Usage: scripts/reference_uncertainty.py OUT.csv
"""
import math
import sys

from scipy.stats import lognorm

CASES = [
    # name, K median m/s, factor, D m, s m, R m, r m
    ("sand_factor_3", 2e-4, 3.0, 12.0, 4.0, 300.0, 15.0),
    ("gravel_factor_2", 1.5e-3, 2.0, 20.0, 3.0, 800.0, 25.0),
    ("silty_factor_5", 1e-5, 5.0, 8.0, 5.0, 60.0, 10.0),
]
PS = [0.1, 0.5, 0.9]


def main(out):
    with open(out, "w") as f:
        f.write("case,k_median_m_per_s,factor,thickness_m,drawdown_m,radius_of_influence_m,well_radius_m,p,flow_m3_per_s\n")
        for name, k, fac, d, s, big_r, r in CASES:
            q50 = 2.0 * math.pi * k * d * s / math.log(big_r / r)
            dist = lognorm(s=math.log(fac), scale=q50)
            for p in PS:
                f.write(f"{name},{k:.12e},{fac:.12e},{d:.12e},{s:.12e},{big_r:.12e},{r:.12e},{p:.12e},{dist.ppf(p):.12e}\n")


if __name__ == "__main__":
    main(sys.argv[1])
