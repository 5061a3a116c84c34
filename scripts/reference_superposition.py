#!/usr/bin/env python3
"""Write the multi-well superposition reference table used by tests/superposition.rs.

Four fixed well fields, each of ten wells with varied rates (one of them a recharge well, negative
rate), evaluated at fifty points with numpy, written independently of the Rust code from the
published formulas:

- discharge potential (Strack 1989, *Groundwater Mechanics*, eqs. 8.7 and 8.13), with h the head
  above the aquifer base and b the confined thickness:
  confined (h >= b) Phi = K b h - K b^2 / 2; unconfined (h < b, or no top) Phi = K h^2 / 2;
- one well of rate Q at distance r (r clamped at the well radius): Thiem/Dupuit
  dPhi = -Q/(2 pi) ln(R/r) for r < R and 0 beyond; leaky (Hantush-Jacob, steady)
  dPhi = -Q/(2 pi) K0(r/B) with K0 from scipy.special.k0 (cut off at 25 B, where K0 < 4e-12);
- straight boundaries by images (Ferris et al. 1962, USGS Water-Supply Paper 1536-E): each real
  well has one image per boundary, mirrored across the line, of opposite sign for a constant
  head and the same sign for a barrier; an image is a well like any other (same radius, same R).
  With two boundaries only first-order images are used (no images of images): that is the model
  src/physics/images.rs and src/influence.rs document, and this table checks the arithmetic of
  the code against it. It is exact for one boundary only; with both lines the river is not held
  exactly at its level (the barrier images are not mirrored across it), so no point of the
  "images" case lies on a boundary line;
- heads summed in Phi, then turned back into a level (never summed as drawdowns).

The cases: "unconfined" (Dupuit, drawdown to about half the saturated thickness next to the
wells), "confined_to_unconfined" (the head falls below the confining top near the wells),
"leaky" (K0) and "images" (a constant-head line and a barrier line, both slightly oblique).
Inputs are fixed decimals from plain arithmetic sequences (no random generator), so the table is
the same on every machine; every number is printed as %.12e and the computation uses exactly the
printed inputs.

Columns: case,record,name,text,x1,y1,x2,y2,value
- record "param": name = kind (text = unconfined|confined|leaky), conductivity_m_per_s,
  base_level_m, top_level_m, initial_level_m, radius_of_influence_m, leakage_factor_m (value);
- record "well": name, x1 y1 = position (m), x2 = radius (m), value = rate (m3/s, < 0 recharge);
- record "boundary": name, text = constant-head|barrier, x1 y1 x2 y2 = two points on the line;
- record "point": name, x1 y1 = position (m), x2 = potential change dPhi (m3/s per m),
  value = level (m above datum).

Usage: python3 scripts/reference_superposition.py [OUTPUT_CSV]
       (default: tests/reference/superposition.csv, relative to the repository root)
"""

import math
import os
import sys

import numpy as np
import scipy
from scipy import special

LEAKY_CUTOFF_B = 25.0


def exact(v):
    """The double the Rust side reads back from the printed value."""
    return float("%.12e" % v)


def fmt(v):
    return "" if v is None else "%.12e" % v


def golden(i, k):
    """Fractional part of i * (k-th additive recurrence constant): a fixed, well-spread sequence."""
    alpha = [0.6180339887498949, 0.4142135623730951, 0.7320508075688772, 0.2360679774997898]
    return (0.5 + i * alpha[k]) % 1.0


def ring_wells(cx, cy, a, b, rates, radius):
    """Ten wells on an ellipse-like ring around an excavation, positions rounded to 1 cm."""
    wells = []
    n = len(rates)
    for i, q in enumerate(rates):
        t = 2 * math.pi * (i + 0.3 * golden(i, 0)) / n
        x = round(cx + a * math.cos(t), 2)
        y = round(cy + b * math.sin(t), 2)
        wells.append((f"W{i + 1:02d}", exact(x), exact(y), exact(radius), exact(q)))
    return wells


def points(wells, box, far, n=50):
    """Fifty points: three at well centres (level in the well), eight close to wells (0.4 to
    6 m), the rest spread over `box`, the last five out at `far` (beyond the radius of influence
    of some or all sources)."""
    pts = []
    for w in wells[:3]:
        pts.append((w[1], w[2]))
    for i, d in enumerate((0.4, 0.8, 1.5, 2.0, 3.0, 4.0, 5.0, 6.0)):
        w = wells[(3 + i) % len(wells)]
        t = 2 * math.pi * golden(i + 7, 0)
        pts.append((round(w[1] + d * math.cos(t), 2), round(w[2] + d * math.sin(t), 2)))
    x0, y0, x1, y1 = box
    n_far = 5
    for i in range(n - len(pts) - n_far):
        x = round(x0 + (x1 - x0) * golden(i + 1, 1), 2)
        y = round(y0 + (y1 - y0) * golden(i + 1, 2), 2)
        pts.append((x, y))
    for i in range(n_far):
        t = 2 * math.pi * golden(i + 1, 3)
        pts.append((round(far[0] * math.cos(t), 2), round(far[1] * math.sin(t) + far[2], 2)))
    return [(f"P{i + 1:02d}", exact(x), exact(y)) for i, (x, y) in enumerate(pts)]


def mirror(p, a, b):
    """Reflect points p (n x 2) across the line through a and b (plane geometry)."""
    a = np.asarray(a, dtype=float)
    d = np.asarray(b, dtype=float) - a
    d = d / np.hypot(d[0], d[1])
    rel = p - a
    along = rel @ d
    foot = np.outer(along, d)
    return a + 2 * foot - rel


def potential(aq, h_level):
    k = aq["conductivity_m_per_s"]
    h = h_level - aq["base_level_m"]
    if aq["kind"] != "unconfined":
        b = aq["top_level_m"] - aq["base_level_m"]
        if h >= b:
            return k * b * h - 0.5 * k * b * b
    return 0.5 * k * h * h


def level(aq, phi):
    k = aq["conductivity_m_per_s"]
    if phi <= 0:
        sys.exit(f"case {aq['case']}: a point is pumped dry; choose smaller rates")
    if aq["kind"] != "unconfined":
        b = aq["top_level_m"] - aq["base_level_m"]
        if phi >= 0.5 * k * b * b:
            return aq["base_level_m"] + (phi + 0.5 * k * b * b) / (k * b)
    return aq["base_level_m"] + math.sqrt(2 * phi / k)


def delta_potential(aq, wells, boundaries, pts):
    """dPhi at each point: sum over real wells and their first-order images."""
    wp = np.array([[w[1], w[2]] for w in wells])
    rw = np.array([w[3] for w in wells])
    q = np.array([w[4] for w in wells])
    sources = [(wp, q)]
    for _, kind, a, b in boundaries:
        sign = -1.0 if kind == "constant-head" else 1.0
        sources.append((mirror(wp, a, b), sign * q))
    p = np.array([[x, y] for _, x, y in pts])
    total = np.zeros(len(pts))
    for pos, rates in sources:
        r = np.hypot(p[:, None, 0] - pos[None, :, 0], p[:, None, 1] - pos[None, :, 1])
        r = np.maximum(r, rw[None, :])
        if aq["kind"] == "leaky":
            big_b = aq["leakage_factor_m"]
            if np.any(r >= LEAKY_CUTOFF_B * big_b):
                sys.exit(f"case {aq['case']}: keep every point within 25 B of every well")
            unit = special.k0(r / big_b)
        else:
            big_r = aq["radius_of_influence_m"]
            with np.errstate(divide="ignore"):
                unit = np.where(r < big_r, np.log(big_r / r), 0.0)
        total += -(unit * rates[None, :]).sum(axis=1) / (2 * math.pi)
    return total


def cases():
    out = []

    # Dupuit, unconfined: large drawdown (about half of H = 14 m next to the wells).
    aq = dict(case="unconfined", kind="unconfined", conductivity_m_per_s=2e-4, base_level_m=-10.0,
              top_level_m=None, initial_level_m=4.0, radius_of_influence_m=250.0,
              leakage_factor_m=None)
    rates = [4.2e-3, 3.2e-3, 4.8e-3, 2.4e-3, -1.6e-3, 3.8e-3, 4.4e-3, 2.8e-3, 3.5e-3, 4.1e-3]
    wells = ring_wells(0.0, 0.0, 26.0, 18.0, rates, 0.15)
    pts = points(wells, (-60.0, -50.0, 60.0, 50.0), (320.0, 280.0, 0.0))
    out.append((aq, wells, [], pts))

    # Confined, b = 12 m, head 8 m above the top: unconfined within some metres of the wells.
    aq = dict(case="confined_to_unconfined", kind="confined", conductivity_m_per_s=1e-4,
              base_level_m=-20.0, top_level_m=-8.0, initial_level_m=0.0,
              radius_of_influence_m=400.0, leakage_factor_m=None)
    rates = [3.6e-3, 3.1e-3, 2.5e-3, 4.0e-3, 3.4e-3, -1.5e-3, 2.8e-3, 3.8e-3, 2.1e-3, 3.2e-3]
    wells = ring_wells(5.0, -3.0, 30.0, 22.0, rates, 0.2)
    pts = points(wells, (-50.0, -45.0, 60.0, 40.0), (450.0, 420.0, -3.0))
    out.append((aq, wells, [], pts))

    # Leaky (Hantush-Jacob, steady), B = 150 m.
    aq = dict(case="leaky", kind="leaky", conductivity_m_per_s=5e-5, base_level_m=-30.0,
              top_level_m=-12.0, initial_level_m=2.0, radius_of_influence_m=300.0,
              leakage_factor_m=150.0)
    rates = [3.0e-3, 2.5e-3, -1.5e-3, 2.8e-3, 3.3e-3, 2.1e-3, 2.6e-3, 3.1e-3, 1.9e-3, 2.4e-3]
    wells = ring_wells(0.0, 0.0, 35.0, 25.0, rates, 0.15)
    pts = points(wells, (-80.0, -70.0, 80.0, 70.0), (900.0, 700.0, 0.0))
    out.append((aq, wells, [], pts))

    # Confined with a river (constant head) to the south and a cut-off wall (barrier) to the east.
    aq = dict(case="images", kind="confined", conductivity_m_per_s=2e-4, base_level_m=-25.0,
              top_level_m=-10.0, initial_level_m=3.0, radius_of_influence_m=600.0,
              leakage_factor_m=None)
    rates = [4.0e-3, 3.5e-3, 4.2e-3, 3.8e-3, 3.1e-3, 4.4e-3, -2.0e-3, 3.6e-3, 3.9e-3, 3.3e-3]
    wells = ring_wells(0.0, 0.0, 30.0, 20.0, rates, 0.15)
    boundaries = [
        ("River", "constant-head", (-300.0, -60.0), (300.0, -52.0)),
        ("Wall", "barrier", (90.0, -200.0), (96.0, 200.0)),
    ]
    pts = points(wells, (-70.0, -50.0, 80.0, 60.0), (60.0, 60.0, 250.0))
    out.append((aq, wells, boundaries, pts))
    return out


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(
        root, "tests", "reference", "superposition.csv")
    lines = [
        "# drydig superposition reference, written by scripts/reference_superposition.py with "
        f"numpy {np.__version__}, scipy {scipy.__version__}",
        "# Phi summed over wells and first-order images (Strack 1989; Ferris et al. 1962), "
        "Thiem/Dupuit ln(R/r) or Hantush-Jacob scipy.special.k0(r/B); level from the summed Phi",
        "# records: param (name, text or value); well (x1 y1 position, x2 radius, value rate "
        "m3/s); boundary (text kind, line x1 y1 x2 y2); point (x1 y1, x2 dPhi, value level m)",
        "case,record,name,text,x1,y1,x2,y2,value",
    ]
    for aq, wells, boundaries, pts in cases():
        for key in ("conductivity_m_per_s", "base_level_m", "top_level_m", "initial_level_m",
                    "radius_of_influence_m", "leakage_factor_m"):
            if aq[key] is not None:
                aq[key] = exact(aq[key])
        c = aq["case"]
        lines.append(f"{c},param,kind,{aq['kind']},,,,,")
        for key in ("conductivity_m_per_s", "base_level_m", "top_level_m", "initial_level_m",
                    "radius_of_influence_m", "leakage_factor_m"):
            if aq[key] is not None:
                lines.append(f"{c},param,{key},,,,,,{fmt(aq[key])}")
        for name, x, y, rw, q in wells:
            lines.append(f"{c},well,{name},,{fmt(x)},{fmt(y)},{fmt(rw)},,{fmt(q)}")
        for name, kind, a, b in boundaries:
            lines.append(
                f"{c},boundary,{name},{kind},{fmt(a[0])},{fmt(a[1])},{fmt(b[0])},{fmt(b[1])},")
        dphi = delta_potential(aq, wells, boundaries, pts)
        phi0 = potential(aq, aq["initial_level_m"])
        levels = [level(aq, phi0 + d) for d in dphi]
        if aq["case"] == "confined_to_unconfined":
            top = aq["top_level_m"]
            below = sum(1 for z in levels if z < top)
            if below < 3 or below > len(levels) - 10:
                sys.exit(f"confined_to_unconfined: {below} points below the top; want a mix")
        if aq["case"] == "unconfined":
            h0 = aq["initial_level_m"] - aq["base_level_m"]
            deepest = min(levels) - aq["base_level_m"]
            if deepest > 0.6 * h0:
                sys.exit(f"unconfined: deepest saturated thickness {deepest:.2f} m is not large")
        for (name, x, y), d, z in zip(pts, dphi, levels):
            lines.append(f"{c},point,{name},,{fmt(x)},{fmt(y)},{fmt(d)},,{fmt(z)}")
    with open(out, "w", encoding="ascii", newline="\n") as fh:
        fh.write("\n".join(lines) + "\n")


if __name__ == "__main__":
    main()
