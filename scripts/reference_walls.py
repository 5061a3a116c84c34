#!/usr/bin/env python3
"""Reference drawdowns with cut-off walls from timml (steady multi-aquifer analytic elements:
line doublets for walls, Bakker & Strack 2003).

Writes tests/reference/walls_timml.csv: case, aquifer (0 = top), x, y, drawdown (m). Read by
tests/walls.rs, which builds the same cases from design files. Conventions: timml gives heads;
the table holds drawdown = h0 - head, h0 = 5 m the level at rest. timml holds the head at one
point (R, 0) (timml.Constant, R = 2000 m); drydig holds the zero mode on the circle of radius R,
and a wall adds a dipole there, so the test compares drawdowns relative to the point (R, 0)
(the last row of each case is that point, drawdown 0 in timml). The case with the river has no
Constant: timml models the river by its image (a recharge well and the mirrored wall, each wall
solved by timml's own line doublets), which is what drydig's image method claims for a straight
constant-head line; its far field is then 0 on both sides.

Walls in timml are strings of elements of at most 2 m, each of order 3 (a cubic jump): a
converged reference for drydig's constant-jump elements.

Cases (all invented, SI units, wells of radius 0.15 m):
  closed_in_sand    sand 10 m (K 2e-4) / clay 4 m (c 50 days) / gravel 8 m (K 1e-3), a closed
                    impermeable wall 40 x 30 m through the sand (toe in the clay), two wells
                    inside screened in the sand (0.4 and 0.3 l/s): water comes through the clay
  toe_above_base    one confined sand 20 m (K 5e-4, K_v/K_h 0.1), closed wall 30 x 30 m with its
                    toe 8 m down (timml Model3D with the sand split at the toe), a well of 10 l/s
                    inside screened in the upper 8 m
  leaky_closed      one confined sand 20 m (K 2e-4), a closed leaky wall 40 x 30 m through it
                    (resistance 20 days), a well of 4 l/s inside
  wall_and_river    one confined sand 20 m (K 2e-4), a river 60 m south (constant head), a wall
                    25 m north from x = -40 to 40, a well of 10 l/s at the origin
  one_side          one confined sand 20 m (K 2e-4), a wall along one side (y = 15 m, x = -30 to
                    30 m), wells at (0, 0) 10 l/s and (10, -5) 5 l/s
Usage: reference_walls.py OUT.csv   (versions pinned in scripts/requirements.txt)
"""
import sys

import numpy as np
import timml

R = 2000.0
RW = 0.15
H0 = 5.0
DAY = 86400.0
POINTS = [(0.0, 5.0), (5.0, -5.0), (12.0, 8.0), (-12.0, -8.0), (0.0, 30.0), (0.0, -30.0),
          (35.0, 0.0), (-40.0, 20.0), (60.0, 45.0), (150.0, 0.0), (0.0, 400.0)]


def refine(xy, closed, step=2.0):
    """Vertices of a wall cut into pieces of at most `step` m (closed: back to the start)."""
    pts = list(xy) + ([xy[0]] if closed else [])
    out = [pts[0]]
    for a, b in zip(pts[:-1], pts[1:]):
        n = int(np.ceil(np.hypot(b[0] - a[0], b[1] - a[1]) / step))
        for i in range(1, n + 1):
            out.append((a[0] + (b[0] - a[0]) * i / n, a[1] + (b[1] - a[1]) * i / n))
    return out


def well(ml, x, y, q, layers):
    w = timml.Well(ml, x, y, Qw=q, rw=RW, layers=layers)
    w.Qw = float(q)  # timml 6.9 keeps a 1-element array; the scalar is the same value
    return w


def box(w, h):
    return [(-w / 2, -h / 2), (w / 2, -h / 2), (w / 2, h / 2), (-w / 2, h / 2)]


def closed_in_sand():
    ml = timml.ModelMaq(kaq=[2e-4, 1e-3], z=[0.0, -10.0, -14.0, -22.0], c=[50 * DAY],
                        topboundary="conf", hstar=None)
    timml.ImpLineDoubletString(ml, xy=refine(box(40, 30), True), layers=[0], order=3)
    well(ml, -6.0, 0.0, 0.0004, [0])
    well(ml, 8.0, 4.0, 0.0003, [0])
    timml.Constant(ml, R, 0.0, H0, layer=0)
    return ml


def toe_above_base():
    ml = timml.Model3D(kaq=5e-4, z=[0.0, -8.0, -20.0], kzoverkh=0.1, topboundary="conf")
    timml.ImpLineDoubletString(ml, xy=refine(box(30, 30), True), layers=[0], order=3)
    well(ml, 0.0, 0.0, 0.010, [0])
    timml.Constant(ml, R, 0.0, H0, layer=0)
    return ml


def leaky_closed():
    ml = timml.ModelMaq(kaq=[2e-4], z=[0.0, -20.0], topboundary="conf")
    timml.LeakyLineDoubletString(ml, xy=refine(box(40, 30), True), res=20 * DAY, layers=[0],
                                 order=3)
    well(ml, 0.0, 0.0, 0.004, [0])
    timml.Constant(ml, R, 0.0, H0, layer=0)
    return ml


def wall_and_river():
    ml = timml.ModelMaq(kaq=[2e-4], z=[0.0, -20.0], topboundary="conf")
    wall = [(-40.0, 25.0), (40.0, 25.0)]
    mirrored = [(x, -120.0 - y) for x, y in wall]
    timml.ImpLineDoubletString(ml, xy=refine(wall, False), layers=[0], order=3)
    timml.ImpLineDoubletString(ml, xy=refine(mirrored, False), layers=[0], order=3)
    well(ml, 0.0, 0.0, 0.010, [0])
    well(ml, 0.0, -120.0, -0.010, [0])
    # no Constant: well and image sum to nothing, so timml's head is the drawdown's negative
    return ml


def one_side():
    ml = timml.ModelMaq(kaq=[2e-4], z=[0.0, -20.0], topboundary="conf")
    timml.ImpLineDoubletString(ml, xy=refine([(-30.0, 15.0), (30.0, 15.0)], False), layers=[0],
                               order=3)
    well(ml, 0.0, 0.0, 0.010, [0])
    well(ml, 10.0, -5.0, 0.005, [0])
    timml.Constant(ml, R, 0.0, H0, layer=0)
    return ml


def main(out):
    cases = [
        ("closed_in_sand", closed_in_sand, True),
        ("toe_above_base", toe_above_base, True),
        ("leaky_closed", leaky_closed, True),
        ("wall_and_river", wall_and_river, False),
        ("one_side", one_side, True),
    ]
    with open(out, "w") as f:
        f.write(f"# timml {timml.__version__}; R = {R} m, well radius {RW} m, h0 = {H0} m\n")
        f.write("case,aquifer,x,y,drawdown_m\n")
        for name, build, has_constant in cases:
            ml = build()
            ml.solve(silent=True)
            rest = H0 if has_constant else 0.0
            pts = POINTS + ([(R, 0.0)] if has_constant else [])
            for x, y in pts:
                h = np.atleast_1d(ml.head(x, y))
                for i, hi in enumerate(h):
                    f.write(f"{name},{i},{x},{y},{rest - hi:.9e}\n")


if __name__ == "__main__":
    main(sys.argv[1])
