#!/usr/bin/env bash
# Speed of `drydig uncertainty` (not a test; run by scripts/bench.sh, or alone): 1 000 samples of
# `check` on the riverside basement through the shortcut (target < 5 s on 2 cores) beside the
# naive loop (the whole check re-run per sample, timed on 20 samples and extrapolated), with the
# ratio; and 200 samples of `design` (target < 30 s; every sample a full fewest-wells search).
# Usage: scripts/bench_uncertainty.sh [PROFILE]   (release, the default, or debug).
set -euo pipefail
cd "$(dirname "$0")/.."
profile="${1:-release}"
if [ "$profile" = release ]; then
    cargo build --release --example bench_uncertainty >&2
else
    cargo build --example bench_uncertainty >&2
fi
out="$(./target/"$profile"/examples/bench_uncertainty layouts/riverside_basement_uncertainty.toml 1000 200 20)"
python3 - "$out" <<'PY'
import json, sys
r = json.loads(sys.argv[1])
print(f"\nuncertainty (riverside basement, {r['threads']} threads)")
h = r['check_hypercubes']
print(f"  check  {r['check_samples']:>5} samples {r['check_seconds']:>8.2f} s (target < 5 s; with {h - 1} repeats of "
      f"{r['check_samples']} samples for the convergence figure, {h * r['check_samples']} samples in all)")
print(f"         naive loop {r['naive_seconds_extrapolated']:>8.2f} s for {r['check_samples']} samples "
      f"(from {r['naive_samples_timed']} timed)   ratio per sample "
      f"{r['naive_seconds_extrapolated'] * h / r['check_seconds']:.1f}x")
print(f"  design {r['design_samples']:>5} samples {r['design_seconds']:>8.2f} s (target < 30 s; each sample a "
      f"full design, robust design {r['robust_wells']} wells)")
PY
