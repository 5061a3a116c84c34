#!/usr/bin/env python3
"""Reference drawdowns in layered ground from timml (steady multi-aquifer analytic elements).

Writes tests/reference/layers_timml.csv: case, aquifer (0 = top), x, y, drawdown (m), each case
a well (or wells) of given rate in aquifers separated by aquitards, the head held at 0 at a point
at distance R (the radius of influence drydig uses for the zero mode). Read by tests/layers.rs.

Cases (all invented, SI units):
  two_aquifers_lower   sand 10 m (K 2e-4) / clay 4 m (c 50 days) / gravel 8 m (K 1e-3),
                       a well of 20 l/s screened in the gravel only
  two_aquifers_both    the same ground, the well screened in both aquifers (equal head at the well)
  split_aquifer        one 20 m sand (K 5e-4, K_v/K_h 0.1) split into 4 sublayers of 5 m (Model3D),
                       a well of 10 l/s screened in the top two (partial penetration)
Usage: reference_layers.py OUT.csv   (versions pinned in scripts/requirements.txt)
"""
import sys

import numpy as np
import timml

R = 2000.0  # radius of influence at which the head is held (m)
RW = 0.15
RADII = [0.15, 1.0, 5.0, 20.0, 50.0, 100.0, 300.0, 800.0]


def well(ml, q, layers):
    w = timml.Well(ml, 0.0, 0.0, Qw=q, rw=RW, layers=layers)
    # timml 6.9 keeps Qw as a 1-element array, which numpy 2.4 refuses to assign to one element
    # of the right-hand side of a multi-layer well's equations; the scalar is the same value
    w.Qw = float(q)
    return w


def two_aquifers(layers):
    ml = timml.ModelMaq(kaq=[2e-4, 1e-3], z=[0.0, -10.0, -14.0, -22.0], c=[50 * 86400.0],
                        topboundary="conf")
    well(ml, 0.020, layers)
    timml.Constant(ml, R, 0.0, 0.0, layer=0)
    ml.solve(silent=True)
    return ml


def split_aquifer():
    ml = timml.Model3D(kaq=5e-4, z=[0.0, -5.0, -10.0, -15.0, -20.0], kzoverkh=0.1,
                       topboundary="conf")
    well(ml, 0.010, [0, 1])
    timml.Constant(ml, R, 0.0, 0.0, layer=0)
    ml.solve(silent=True)
    return ml


def main(out):
    cases = [
        ("two_aquifers_lower", two_aquifers([1])),
        ("two_aquifers_both", two_aquifers([0, 1])),
        ("split_aquifer", split_aquifer()),
    ]
    with open(out, "w") as f:
        f.write(f"# timml {timml.__version__}; R = {R} m, well radius {RW} m\n")
        f.write("case,aquifer,x,y,drawdown_m\n")
        for name, ml in cases:
            for r in RADII:
                h = ml.head(r, 0.0)
                for i, hi in enumerate(np.atleast_1d(h)):
                    f.write(f"{name},{i},{r},0,{-hi:.9e}\n")


if __name__ == "__main__":
    main(sys.argv[1])
