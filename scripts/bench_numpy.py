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

Transient cases (case.json "kind": "transient", from `bench_kernel transient|programme`): the
Theis sum in space and time of drawdowns_numpy, timed once (it runs for tens of seconds), against
drydig's drawdowns.npy.
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


def drawdowns_numpy(case, steps):
    """Theis superposition in time: for every node, time and rate change (well at x, y,
    change dq at t_k): s' += dq/(4 pi T) * E1(r^2 S/(4 T (t - t_k))) for t > t_k, r at least the
    well radius (scipy.special.exp1); unconfined s = H - sqrt(H^2 - 2 H s') (Jacob's correction
    undone, written 2 H s'/(H + sqrt(H^2 - 2 H s')) as drydig does), H where 2 s' > H."""
    from scipy.special import exp1
    tr = case["transmissivity_m2_per_s"]
    st = case["storage"]
    big_h = case["saturated_thickness_m"]
    g = case["grid"]
    xs = g["x0"] + np.arange(g["nx"]) * g["dx"]
    ys = g["y0"] + np.arange(g["ny"]) * g["dy"]
    px, py = np.meshgrid(xs, ys)
    px = px.ravel()
    py = py.ravel()
    wx, wy, rw, tk, dq = (steps[:, i] for i in range(5))
    out = np.empty((len(case["times_s"]), px.size))
    chunk = max(1, 2_000_000 // max(1, wx.size))
    for k, t in enumerate(case["times_s"]):
        live = tk < t
        if not live.any():
            out[k] = 0.0
            continue
        lx, ly, lr, lt, lq = wx[live], wy[live], rw[live], tk[live], dq[live]
        for s in range(0, px.size, chunk):
            r2 = np.maximum((px[s:s + chunk, None] - lx[None, :]) ** 2
                            + (py[s:s + chunk, None] - ly[None, :]) ** 2, lr[None, :] ** 2)
            u = r2 * st / (4.0 * tr * (t - lt)[None, :])
            w = np.where(u > 700.0, 0.0, exp1(np.minimum(u, 700.0)))
            out[k, s:s + chunk] = (w / (4.0 * np.pi * tr)) @ lq
    if case.get("unconfined"):
        disc = big_h * big_h - 2.0 * big_h * out
        with np.errstate(invalid="ignore"):
            out = np.where(disc <= 0.0, big_h, 2.0 * big_h * out / (big_h + np.sqrt(np.maximum(disc, 0.0))))
    return out.reshape(len(case["times_s"]), g["ny"], g["nx"])


def main_transient(d, case):
    with open(f"{d}/schedules.csv") as f:
        rows = list(csv.DictReader(f))
    steps = np.array([[float(r["x"]), float(r["y"]), float(r["radius_m"]), float(r["t_s"]),
                       float(r["dq_m3_per_s"])] for r in rows])
    t = time.perf_counter()
    z = drawdowns_numpy(case, steps)
    best = time.perf_counter() - t
    ours = np.load(f"{d}/drawdowns.npy")
    diff = float(np.max(np.abs(z - ours)))
    print(json.dumps({
        "case": case["case"],
        "numpy_seconds": best,
        "max_abs_difference_m": diff,
        "agree_to_1e-9": bool(diff <= 1e-9),
        "numpy_version": np.__version__,
    }))


def main():
    d = sys.argv[1]
    with open(f"{d}/case.json") as f:
        case = json.load(f)
    if case.get("kind") == "transient":
        main_transient(d, case)
        return
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
