#!/usr/bin/env python3
"""Write the pumping-test reference tables used by src/test_analysis (tests).

Everything here is computed with scipy, independently of the Rust code, from the published
formulas (Kruseman & de Ridder, *Analysis and Evaluation of Pumping Test Data*, 2nd ed. 1994):

- Theis (1935): s = Q/(4 pi T) W(u), u = r^2 S / (4 T t), W = scipy.special.exp1;
- Hantush & Jacob (1955): W(u, r/B) = int_u^inf exp(-y - (r/B)^2/(4y))/y dy, by scipy quad
  (substitution y = e^x, relative tolerance 1e-13);
- Theis recovery: residual drawdown after a constant rate for t_p, s' = Q/(4 pi T)
  [W(u(t_p + t')) - W(u(t'))], t' the time since the pump stopped.

Files (all under tests/reference/, every number printed as %.12e):
- pumping_test_synthetic.csv: "synthetic, scipy", exact Theis, two observation wells,
  header `well,distance [m],time [min],drawdown [m]`;
- pumping_test_noisy.csv: "synthetic, scipy + seeded normal noise" (numpy default_rng(1994),
  sigma 0.01 m), drawdowns written in feet, header `well,distance_m,time_min,drawdown_ft`;
- pumping_test_leaky.csv: "synthetic, scipy quad", exact Hantush, two observation wells;
- pumping_test_recovery.csv: "synthetic, scipy", residual drawdown after 1 day of pumping;
- pumping_test_fifty_wells.csv: "synthetic, scipy", exact Theis, 50 observation wells at
  5 ... 250 m with one reading each (a layout that once made the leaky fit panic);
- pumping_test_logger.csv: "synthetic, scipy", a smooth logger record: exact Theis at one well,
  2000 readings log-spaced from 6 s to 2 days, rounded to the logger's 1 mm (no leakage);
- pumping_test_fits.csv: scipy.optimize.least_squares Theis fits (on log10 T, log10 S) of the
  noisy set, of the logger record (all 2000 readings) and of the published Oude Korendijk data
  (pumping_test_oude_korendijk.csv, typed in from the published table, not written by this
  script): case,T_m2s,S,rms_m.

Usage: python3 scripts/reference_pumping_test.py [OUTPUT_DIR]  (default tests/reference)
"""

import math
import os
import sys

import numpy as np
import scipy
from scipy import integrate, optimize, special

FOOT = 0.3048

# synthetic confined test
Q = 0.02  # m3/s
T = 5.0e-3  # m2/s
S = 2.0e-4
WELLS = [("P1", 20.0), ("P2", 60.0)]
TIMES_MIN = np.geomspace(0.5, 1000.0, 30)

# synthetic leaky test
T_L = 2.0e-3
S_L = 5.0e-4
B_L = 300.0
WELLS_L = [("L1", 30.0), ("L2", 90.0)]

# recovery
T_P = 86400.0  # pumping time, s
R_REC = 20.0
TP_MIN = np.geomspace(1.0, 1440.0, 25)  # time since stop, min


def fmt(v):
    return "%.12e" % v


def exact(v):
    return float(fmt(v))


def theis(q, t_m2s, s, r, t):
    return q / (4.0 * math.pi * t_m2s) * special.exp1(r * r * s / (4.0 * t_m2s * t))


def hantush_w(u, beta):
    f = lambda x: math.exp(-math.exp(x) - beta * beta / (4.0 * math.exp(x)))
    lo = math.log(u)
    hi = math.log(u + beta + 60.0)
    v, _ = integrate.quad(f, lo, hi, epsabs=0.0, epsrel=1e-13, limit=400)
    return v


def write(path, header, rows):
    with open(path, "w", newline="\n") as fh:
        fh.write(header + "\n")
        for row in rows:
            fh.write(",".join(row) + "\n")


def theis_fit(q, r, t, s):
    def res(p):
        return theis(q, 10 ** p[0], 10 ** p[1], r, t) - s

    f = optimize.least_squares(res, [-2.5, -4.0], xtol=1e-15, ftol=1e-15, gtol=1e-15)
    return 10 ** f.x[0], 10 ** f.x[1], math.sqrt(np.mean(f.fun ** 2))


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(root, "tests", "reference")
    os.makedirs(out, exist_ok=True)

    rows = []
    for name, r in WELLS:
        for tm in TIMES_MIN:
            tm = exact(tm)
            rows.append([name, fmt(r), fmt(tm), fmt(theis(Q, T, S, r, tm * 60.0))])
    write(os.path.join(out, "pumping_test_synthetic.csv"),
          "well,distance [m],time [min],drawdown [m]", rows)

    rng = np.random.default_rng(1994)
    rows = []
    noisy_r, noisy_t, noisy_s = [], [], []
    for name, r in WELLS:
        for tm in TIMES_MIN:
            tm = exact(tm)
            s_m = theis(Q, T, S, r, tm * 60.0) + rng.normal(0.0, 0.01)
            s_ft = exact(s_m / FOOT)
            rows.append([name, fmt(r), fmt(tm), fmt(s_ft)])
            noisy_r.append(r)
            noisy_t.append(tm * 60.0)
            noisy_s.append(s_ft * FOOT)
    write(os.path.join(out, "pumping_test_noisy.csv"),
          "well,distance_m,time_min,drawdown_ft", rows)

    rows = []
    for name, r in WELLS_L:
        for tm in TIMES_MIN:
            tm = exact(tm)
            t = tm * 60.0
            u = r * r * S_L / (4.0 * T_L * t)
            s = Q / (4.0 * math.pi * T_L) * hantush_w(u, r / B_L)
            rows.append([name, fmt(r), fmt(tm), fmt(s)])
    write(os.path.join(out, "pumping_test_leaky.csv"),
          "well,distance [m],time [min],drawdown [m]", rows)

    rows = []
    for tm in TP_MIN:
        tm = exact(tm)
        tp = tm * 60.0
        s = theis(Q, T, S, R_REC, T_P + tp) - theis(Q, T, S, R_REC, tp)
        rows.append(["R1", fmt(R_REC), fmt(tm), fmt(s)])
    write(os.path.join(out, "pumping_test_recovery.csv"),
          "well,distance [m],time [min],drawdown [m]", rows)

    rows = []
    for k in range(50):
        r = 5.0 + 5.0 * k
        tm = 10.0 + 10.0 * k
        rows.append(["F%02d" % (k + 1), fmt(r), fmt(tm), fmt(theis(Q, T, S, r, tm * 60.0))])
    write(os.path.join(out, "pumping_test_fifty_wells.csv"),
          "well,distance [m],time [min],drawdown [m]", rows)

    rows = []
    log_t, log_s = [], []
    for ts in np.geomspace(6.0, 172800.0, 2000):
        ts = exact(ts)
        s_mm = round(theis(Q, T, S, 20.0, ts) * 1000.0)
        rows.append(["LOG1", fmt(20.0), fmt(ts), "%d" % s_mm])
        log_t.append(ts)
        log_s.append(s_mm / 1000.0)
    write(os.path.join(out, "pumping_test_logger.csv"),
          "well,distance [m],time [s],drawdown [mm]", rows)

    fits = []
    t_fit, s_fit, rms = theis_fit(Q, np.array(noisy_r), np.array(noisy_t), np.array(noisy_s))
    fits.append(["noisy", fmt(t_fit), fmt(s_fit), fmt(rms)])
    t_fit, s_fit, rms = theis_fit(Q, np.full(len(log_t), 20.0), np.array(log_t), np.array(log_s))
    fits.append(["logger", fmt(t_fit), fmt(s_fit), fmt(rms)])
    ok_r, ok_t, ok_s = [], [], []
    with open(os.path.join(root, "tests", "reference", "pumping_test_oude_korendijk.csv")) as fh:
        lines = [ln.strip() for ln in fh if ln.strip() and not ln.startswith("#")]
    for ln in lines[1:]:
        _, r, tm, s = ln.split(",")
        ok_r.append(float(r))
        ok_t.append(float(tm) * 60.0)
        ok_s.append(float(s))
    q_ok = 788.0 / 86400.0
    t_fit, s_fit, rms = theis_fit(q_ok, np.array(ok_r), np.array(ok_t), np.array(ok_s))
    fits.append(["oude_korendijk", fmt(t_fit), fmt(s_fit), fmt(rms)])
    write(os.path.join(out, "pumping_test_fits.csv"), "case,T_m2s,S,rms_m", fits)
    print("scipy", scipy.__version__, "numpy", np.__version__, "->", out)


if __name__ == "__main__":
    main()
