#!/usr/bin/env bash
# Speed benchmark (not a test): drydig's superposition kernel against the same sum written plainly
# with NumPy, in the same run on the same machine, and the time of a full `drydig design`.
#
# Cases (built by examples/bench_kernel.rs):
#   basement — a ring of 60 deep wells around a 150 m × 100 m basement, levels on a 500 × 500 map;
#   trench   — wellpoints at 4 m on both sides of a 2 km trench (about 1 000), 500 × 500 map.
# For each case: drydig's kernel time (best of 5; all threads, then one thread), NumPy's time
# (best of 3), the largest level difference (must be ≤ 1e-9 m) and the ratio NumPy / drydig.
# Then `drydig check` and `drydig design -v` on the basement (best of 3) and on every demo in
# layouts/ (once each), wall clock including writing every output, side by side with the work the
# design did: LP solves, layouts tried, full evaluations, unit matrices built and reused.
# Transient cases (Theis superposition in space and time, NumPy with scipy.special.exp1, timed
# once): transient — the 60 wells at constant rates, 500 × 500 map, 10 output times (1 … 10 days);
# programme — the same basement in 3 stages (half the wells, then all, then all at 1.3×).
#
# Last, scripts/bench_uncertainty.sh: 1 000 samples of `drydig uncertainty` (check) on the
# riverside basement beside the naive loop, and 200 samples of design.
# Cut-off walls: `scripts/bench.sh walls` times only `check` and `design -v` (best of 3) on the
# riverside basement without and with its sheet-pile wall (layouts/riverside_basement.toml,
# layouts/walled_basement.toml), beside the targets (check < 1 s, design < 5 s on 2 cores) and
# the size of the wall system solved (collocation points × aquifers).
#
# Usage: scripts/bench.sh [GRID]   (GRID nodes per side, default 500). Needs python3 with numpy.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ "${1:-}" = "walls" ]; then
    cargo build --release --bin drydig >&2
    work="$(mktemp -d)"
    trap 'rm -rf "$work"' EXIT
    python3 - "$work" <<'PY'
import json, subprocess, sys, time
work = sys.argv[1]
def best(args, runs=3):
    out = None
    for _ in range(runs):
        t = time.perf_counter()
        p = subprocess.run(args, capture_output=True, text=True)
        t = time.perf_counter() - t
        if out is None or t < out[0]:
            out = (t, p)
    return out
print(f"{'design file':<26} {'check s':>8} {'design s':>9}  {'wall system':<28} result")
for demo in ["riverside_basement", "walled_basement"]:
    path = f"layouts/{demo}.toml"
    tc, _ = best(["./target/release/drydig", "check", path, "-o", f"{work}/c-{demo}"])
    td, p = best(["./target/release/drydig", "design", path, "-v", "-o", f"{work}/d-{demo}"])
    walls = json.load(open(f"{work}/c-{demo}/summary.json")).get("walls")
    size = f"{walls['collocation_points']} points x {walls['aquifers']} aquifer(s)" if walls else "none"
    result = next((l for l in p.stdout.splitlines() if l.startswith("RESULT")), "no result line")
    print(f"{demo:<26} {tc:>8.3f} {td:>9.3f}  {size:<28} {result[:60]}")
print("targets with walls: check < 1 s, design < 5 s (2 cores)")
PY
    exit 0
fi
grid="${1:-500}"
cargo build --release --bin drydig --example bench_kernel >&2
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
bin=./target/release/examples/bench_kernel

for case in basement trench transient programme; do
    "$bin" "$case" "$work/$case" "$grid" > "$work/$case.rust.json"
    RAYON_NUM_THREADS=1 "$bin" "$case" "$work/$case.one" "$grid" > "$work/$case.rust1.json"
    python3 scripts/bench_numpy.py "$work/$case" > "$work/$case.numpy.json"
done

python3 - "$work" <<'PY'
import json, subprocess, sys, time
work = sys.argv[1]
print(f"{'case':<10} {'wells':>6} {'nodes':>8} {'drydig s':>10} {'threads':>7} {'1 thread s':>10} "
      f"{'numpy s':>9} {'ratio':>7} {'ratio/1t':>8} {'max diff m':>11}  agree")
ok = True
for case in ["basement", "trench", "transient", "programme"]:
    r = json.load(open(f"{work}/{case}.rust.json"))
    r1 = json.load(open(f"{work}/{case}.rust1.json"))
    n = json.load(open(f"{work}/{case}.numpy.json"))
    ratio = n["numpy_seconds"] / r["kernel_seconds"]
    ratio1 = n["numpy_seconds"] / r1["kernel_seconds"]
    ok &= n["agree_to_1e-9"]
    print(f"{case:<10} {r['wells']:>6} {r['points']:>8} {r['kernel_seconds']:>10.4f} {r['threads']:>7} "
          f"{r1['kernel_seconds']:>10.4f} {n['numpy_seconds']:>9.4f} {ratio:>6.1f}x {ratio1:>7.1f}x "
          f"{n['max_abs_difference_m']:>11.2e}  {'yes' if n['agree_to_1e-9'] else 'NO'}")
def timed(args):
    t = time.perf_counter()
    p = subprocess.run(args, capture_output=True, text=True)
    return time.perf_counter() - t, p


def work_line(stderr):
    return next((l for l in stderr.splitlines() if l.startswith("work:")), "")


def reuse_count(line):
    import re
    m = re.search(r"built (\d+) times and reused (\d+) times", line)
    return (int(m.group(1)), int(m.group(2))) if m else (0, 0)


# `check` and `design` on the basement (best of 3) and on every demo (once each), side by side,
# with the work the design did (from `design -v`).
cases = [("bench basement", f"{work}/basement/design.toml", 3)]
cases += [(p.stem, str(p), 1) for p in sorted(__import__("pathlib").Path("layouts").glob("*.toml"))]
print(f"\n{'design file':<34} {'check s':>8} {'design s':>9} {'LP':>5} {'trials':>6} {'evals':>6} "
      f"{'unit built':>10} {'reused':>6}  result")
for name, path, runs in cases:
    tc = min(timed(["./target/release/drydig", "check", path, "-o", f"{work}/c-out"])[0]
             for _ in range(runs))
    best, p = None, None
    for _ in range(runs):
        t, q = timed(["./target/release/drydig", "design", path, "-v", "-o", f"{work}/d-out"])
        if best is None or t < best:
            best, p = t, q
    w = work_line(p.stderr)
    import re
    nums = dict((k, int(v)) for v, k in re.findall(r"(\d+) (LP solves|layouts tried|full evaluations)", w))
    built, reused = reuse_count(w)
    result = next((l for l in p.stdout.splitlines() if l.startswith("RESULT")), "no result line")
    print(f"{name:<34} {tc:>8.3f} {best:>9.3f} {nums.get('LP solves', 0):>5} "
          f"{nums.get('layouts tried', 0):>6} {nums.get('full evaluations', 0):>6} {built:>10} "
          f"{reused:>6}  {result[:60]}")
if not ok:
    print("the kernels DISAGREE beyond 1e-9 m", file=sys.stderr)
    sys.exit(1)
PY

# `drydig uncertainty`: 1 000 samples of check and 200 of design on the riverside basement.
scripts/bench_uncertainty.sh
