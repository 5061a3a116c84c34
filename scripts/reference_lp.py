#!/usr/bin/env python3
"""Write the linear-programme reference table used by src/optimise_clarabel.rs's tests.

Each problem has the shape of drydig's rate problem (src/lp.rs): minimise sum c_j q_j subject to
rows sum a_ij q_j >= b_i or <= b_i and bounds lo_j <= q_j <= hi_j, rates in m^3/s. The optimum
of each comes from scipy.optimize.linprog with method="highs" (library: scipy linprog HiGHS).
The well problems use Thiem steady drawdown coefficients a_ij = ln(R/r_ij)/(2 pi T) (Thiem 1906)
between invented wells and check points, so the numbers have the size of real well rates.

Output is deterministic JSON: problem data and the solver's answer (status "optimal" with x,
objective and whether the optimal point is unique, or "infeasible"). Floats are written with repr (round-trip exact).

Usage: python3 scripts/reference_lp.py [OUTPUT_JSON]
       (default: tests/reference/lp_reference.json, relative to the repository root)
"""

import json
import math
import os
import sys

import numpy
import scipy
from scipy.optimize import linprog


def thiem_problem(name, wells, points, targets, limits, q_max, costs=None, t=5e-3, r_inf=300.0):
    """Minimise sum of costs x rates (total rate by default) with drawdown >= target at `points`, <= limit at `limits`."""
    def coeff(w, p):
        r = math.hypot(w[0] - p[0], w[1] - p[1])
        return math.log(r_inf / r) / (2.0 * math.pi * t)
    rows = []
    for p, s in zip(points, targets):
        rows.append({"a": [coeff(w, p) for w in wells], "sense": ">=", "rhs": s})
    for p, s in limits:
        rows.append({"a": [coeff(w, p) for w in wells], "sense": "<=", "rhs": s})
    return {
        "name": name,
        "costs": costs if costs is not None else [1.0] * len(wells),
        "bounds": [[0.0, q_max]] * len(wells),
        "rows": rows,
    }


def problems():
    m = 1e-3
    out = [
        # The hand-solvable LP of src/lp.rs (optimum (1.6, 1.2) mL/s).
        {
            "name": "hand_two_rows",
            "costs": [1.0, 1.0],
            "bounds": [[0.0, 1.0], [0.0, 1.0]],
            "rows": [
                {"a": [1.0, 2.0], "sense": ">=", "rhs": 4.0 * m},
                {"a": [3.0, 1.0], "sense": ">=", "rhs": 6.0 * m},
            ],
        },
        # Unequal costs and an upper bound that binds: minimise 2x + y + 3z with
        # x + y + z >= 5 mL/s, y <= 2 mL/s (bound), x - z <= 1 mL/s.
        {
            "name": "costs_and_bounds",
            "costs": [2.0, 1.0, 3.0],
            "bounds": [[0.0, 10.0 * m], [0.0, 2.0 * m], [0.0, 10.0 * m]],
            "rows": [
                {"a": [1.0, 1.0, 1.0], "sense": ">=", "rhs": 5.0 * m},
                {"a": [1.0, 0.0, -1.0], "sense": "<=", "rhs": 1.0 * m},
            ],
        },
        # Four wells near the corners of a 30 m x 20 m pit (costs: deeper wells cost more to
        # run), drawdown >= 3 m at five points, <= 2.6 m at a neighbour 60 m away.
        thiem_problem(
            "four_wells_pit",
            wells=[(0.0, 0.0), (31.0, -1.0), (30.0, 20.0), (-2.0, 21.0)],
            costs=[1.0, 1.1, 1.25, 0.9],
            points=[(5.0, 5.0), (25.0, 5.0), (25.0, 15.0), (5.0, 15.0), (15.0, 10.0)],
            targets=[3.0, 3.0, 3.0, 3.0, 3.0],
            limits=[((90.0, 10.0), 2.6)],
            q_max=0.03,
        ),
        # Six wells in an L, unequal targets, rates capped at 8 L/s.
        thiem_problem(
            "six_wells_l_shape",
            wells=[(0.0, 0.0), (40.0, 0.0), (40.0, 15.0), (15.0, 15.0), (15.0, 40.0),
                   (0.0, 40.0)],
            points=[(5.0, 5.0), (35.0, 5.0), (10.0, 20.0), (10.0, 35.0), (20.0, 10.0)],
            targets=[2.5, 2.0, 2.5, 3.0, 2.2],
            limits=[((70.0, 70.0), 2.0)],
            q_max=0.008,
        ),
        # Infeasible: the rate cap is too small for the targets.
        thiem_problem(
            "infeasible_cap",
            wells=[(0.0, 0.0), (30.0, 0.0)],
            points=[(15.0, 0.0), (15.0, 10.0)],
            targets=[6.0, 6.0],
            limits=[],
            q_max=0.002,
        ),
    ]
    return out


def solve(p):
    a_ub, b_ub = [], []
    for r in p["rows"]:
        if r["sense"] == "<=":
            a_ub.append(r["a"])
            b_ub.append(r["rhs"])
        else:
            a_ub.append([-v for v in r["a"]])
            b_ub.append(-r["rhs"])
    res = linprog(p["costs"], A_ub=a_ub, b_ub=b_ub, bounds=[tuple(b) for b in p["bounds"]],
                  method="highs", options={"primal_feasibility_tolerance": 1e-10,
                                           "dual_feasibility_tolerance": 1e-10})
    if res.status == 0:
        return {"status": "optimal", "x": [float(v) for v in res.x], "objective": float(res.fun)}
    if res.status == 2:
        return {"status": "infeasible"}
    raise SystemExit(f"{p['name']}: linprog ended with status {res.status}: {res.message}")


def is_unique(p, base):
    """True when small, different cost changes leave the optimum where it is (a unique vertex);
    otherwise only the objective is a fair comparison."""
    for k in range(4):
        q = dict(p)
        q["costs"] = [c * (1.0 + 1e-4 * (((i * 0.618 + k * 0.3) % 1.0) - 0.5))
                      for i, c in enumerate(p["costs"])]
        s = solve(q)
        scale = max(abs(v) for v in base["x"]) or 1.0
        if max(abs(a - b) for a, b in zip(s["x"], base["x"])) > 1e-9 * scale:
            return False
    return True


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(root, "tests", "reference",
                                                              "lp_reference.json")
    table = {
        "source": "library: scipy linprog HiGHS",
        "generator": "scripts/reference_lp.py",
        "versions": {"scipy": scipy.__version__, "numpy": numpy.__version__},
        "problems": [],
    }
    for p in problems():
        q = dict(p)
        ref = solve(p)
        if ref["status"] == "optimal":
            ref["unique"] = is_unique(p, ref)
        q["reference"] = ref
        table["problems"].append(q)
    with open(path, "w", encoding="utf-8") as f:
        json.dump(table, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
