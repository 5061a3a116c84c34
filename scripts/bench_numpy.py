#!/usr/bin/env python3
"""The same superposition drydig's kernel does, written plainly with NumPy, timed, and compared
with drydig's levels.

Usage: bench_numpy.py DIR   (DIR written by `cargo run --release --example bench_kernel`)

For every map node and every well: r = distance (at least the well radius); the change in
Strack's discharge potential is -Q/(2*pi)*ln(R/r) for r < R and 0 beyond (Thiem with a radius of
influence R); Phi = Phi0 + sum; the level follows from Phi (unconfined h = sqrt(2*Phi/K); confined
above the top h = (Phi + K*b^2/2)/(K*b)); NaN where Phi <= 0 (pumped dry). The sum runs over all
wells (no spatial index), in chunks of rows to bound memory.

Prints one JSON line: numpy time (best of 3), the largest difference from drydig's levels, and
whether it is within 1e-9 m.
"""
import csv
import json
import sys
import time

import numpy as np


def levels_numpy(case, wells):
    k = case["conductivity_m_per_s"]
    base = case["base_level_m"]
    top = case["top_level_m"]
    h0 = case["initial_level_m"] - base
    big_r = case["radius_of_influence_m"]
    g = case["grid"]
    xs = g["x0"] + np.arange(g["nx"]) * g["dx"]
    ys = g["y0"] + np.arange(g["ny"]) * g["dy"]
    px, py = np.meshgrid(xs, ys)  # (ny, nx), row-major like drydig's grid
    px = px.ravel()
    py = py.ravel()
    wx, wy, q, rw = (wells[:, i] for i in range(4))

    def potential(h):
        if top is None:
            return 0.5 * k * h * h
        b = top - base
        return np.where(h >= b, k * b * h - 0.5 * k * b * b, 0.5 * k * h * h)

    phi0 = float(potential(np.array(h0)))
    phi = np.empty(px.size)
    chunk = max(1, 4_000_000 // max(1, wx.size))
    for s in range(0, px.size, chunk):
        dxm = px[s:s + chunk, None] - wx[None, :]
        dym = py[s:s + chunk, None] - wy[None, :]
        r = np.maximum(np.hypot(dxm, dym), rw[None, :])
        unit = np.where(r < big_r, -np.log(big_r / r) / (2.0 * np.pi), 0.0)
        phi[s:s + chunk] = phi0 + unit @ q
    with np.errstate(invalid="ignore"):
        if top is None:
            h = np.sqrt(2.0 * phi / k)
        else:
            b = top - base
            h = np.where(phi >= 0.5 * k * b * b, (phi + 0.5 * k * b * b) / (k * b),
                         np.sqrt(2.0 * phi / k))
    z = base + h
    z[phi <= 0.0] = np.nan
    return z.reshape(g["ny"], g["nx"])


def main():
    d = sys.argv[1]
    with open(f"{d}/case.json") as f:
        case = json.load(f)
    with open(f"{d}/wells.csv") as f:
        rows = list(csv.DictReader(f))
    wells = np.array([[float(r["x"]), float(r["y"]), float(r["rate_m3_per_s"]),
                       float(r["radius_m"])] for r in rows])
    best = float("inf")
    z = None
    for _ in range(3):
        t = time.perf_counter()
        z = levels_numpy(case, wells)
        best = min(best, time.perf_counter() - t)
    ours = np.load(f"{d}/levels.npy")
    both = ~np.isnan(z) & ~np.isnan(ours)
    same_dry = bool(np.array_equal(np.isnan(z), np.isnan(ours)))
    diff = float(np.max(np.abs(z[both] - ours[both]))) if both.any() else 0.0
    print(json.dumps({
        "case": case["case"],
        "numpy_seconds": best,
        "max_abs_difference_m": diff,
        "dry_cells_agree": same_dry,
        "agree_to_1e-9": bool(diff <= 1e-9 and same_dry),
        "numpy_version": np.__version__,
    }))


if __name__ == "__main__":
    main()
