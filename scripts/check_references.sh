#!/usr/bin/env bash
# Regenerate the special-function reference table into a temporary file and compare it with the
# committed tests/reference/special_functions.csv. Exit 1 (and print the diff) if they differ.
# Likewise for the superposition table tests/reference/superposition.csv
# (scripts/reference_superposition.py, numpy and scipy) and the LP table
# tests/reference/lp_reference.json (scripts/reference_lp.py, scipy linprog HiGHS).
# Needs python3 with the versions pinned in scripts/requirements.txt.
set -euo pipefail

root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
committed="$root/tests/reference/special_functions.csv"
tmp="$(mktemp "${TMPDIR:-/tmp}/drydig-special.XXXXXX.csv")"
tmp_sup="$(mktemp "${TMPDIR:-/tmp}/drydig-superposition.XXXXXX.csv")"
tmp_lp="$(mktemp "${TMPDIR:-/tmp}/drydig-lp.XXXXXX.json")"
trap 'rm -f "$tmp" "$tmp_sup" "$tmp_lp"' EXIT
status=0

python3 "$root/scripts/reference_special.py" "$tmp"

if diff -u "$committed" "$tmp"; then
    echo "reference table up to date: $committed"
else
    echo "reference table differs from a fresh run (diff above: - committed, + regenerated)" >&2
    status=1
fi

committed_sup="$root/tests/reference/superposition.csv"
python3 "$root/scripts/reference_superposition.py" "$tmp_sup"

if diff -u "$committed_sup" "$tmp_sup"; then
    echo "reference table up to date: $committed_sup"
else
    echo "reference table differs from a fresh run (diff above: - committed, + regenerated)" >&2
    status=1
fi

d="$(mktemp -d)"; python3 "$root/scripts/reference_pumping_test.py" "$d" >/dev/null && for f in "$d"/*.csv; do diff -u "$root/tests/reference/$(basename "$f")" "$f" || status=1; done; rm -rf "$d"  # pumping-test tables (scripts/reference_pumping_test.py)
d="$(mktemp -d)"; python3 "$root/scripts/reference_uncertainty.py" "$d/u.csv" && { diff -u "$root/tests/reference/uncertainty_thiem_lognormal.csv" "$d/u.csv" || status=1; }; rm -rf "$d"  # lognormal Thiem flow percentiles (scripts/reference_uncertainty.py, scipy.stats.lognorm)
d="$(mktemp -d)"; python3 "$root/scripts/reference_days_to_dig.py" "$d" && for f in "$d"/*.csv; do diff -u "$root/tests/reference/$(basename "$f")" "$f" || status=1; done; rm -rf "$d"  # Theis time to a drawdown (days to dig) and numpy.percentile (scripts/reference_days_to_dig.py)
committed_lp="$root/tests/reference/lp_reference.json"
python3 "$root/scripts/reference_lp.py" "$tmp_lp"

if diff -u "$committed_lp" "$tmp_lp"; then
    echo "reference table up to date: $committed_lp"
else
    echo "reference table differs from a fresh run (diff above: - committed, + regenerated)" >&2
    status=1
fi
# partial penetration (scripts/reference_partial_penetration.py, scipy and mpmath; ~4 min)
tmp_pp="$(mktemp "${TMPDIR:-/tmp}/drydig-pp.XXXXXX.csv")"; python3 "$root/scripts/reference_partial_penetration.py" "$tmp_pp"; if diff -u "$root/tests/reference/partial_penetration.csv" "$tmp_pp"; then echo "reference table up to date: $root/tests/reference/partial_penetration.csv"; else echo "partial_penetration.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_pp"
# Theis well function, dense table 1 <= u <= 40 (scripts/reference_theis_w.py, scipy exp1)
tmp_w="$(mktemp "${TMPDIR:-/tmp}/drydig-theis-w.XXXXXX.csv")"; python3 "$root/scripts/reference_theis_w.py" "$tmp_w"; if diff -u "$root/tests/reference/theis_w.csv" "$tmp_w"; then echo "reference table up to date: $root/tests/reference/theis_w.csv"; else echo "theis_w.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_w"

# screen-averaged partial penetration (scripts/reference_screen_average.py, scipy)
tmp_sa="$(mktemp "${TMPDIR:-/tmp}/drydig-sa.XXXXXX.csv")"; python3 "$root/scripts/reference_screen_average.py" "$tmp_sa"; if diff -u "$root/tests/reference/screen_average.csv" "$tmp_sa"; then echo "reference table up to date: $root/tests/reference/screen_average.csv"; else echo "screen_average.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_sa"

# DXF test drawings and where ezdxf places their entities (scripts/dxf_fixtures.py, ezdxf)
tmp_dxf="$(mktemp -d "${TMPDIR:-/tmp}/drydig-dxf.XXXXXX")"; python3 "$root/scripts/dxf_fixtures.py" "$tmp_dxf"; for f in mirrored.dxf inserts.dxf; do diff -q "$root/tests/dxf/$f" "$tmp_dxf/$f" || { echo "tests/dxf/$f differs from a fresh run" >&2; status=1; }; done; for f in "$tmp_dxf"/bad/*.dxf; do diff -q "$root/tests/bad_inputs/drawings/$(basename "$f")" "$f" || status=1; done; if diff -u "$root/tests/reference/dxf_expected.csv" "$tmp_dxf/dxf_expected.csv"; then echo "reference table up to date: $root/tests/reference/dxf_expected.csv"; else status=1; fi; rm -rf "$tmp_dxf"

# cut-off walls drawn in a DXF and a GeoJSON file (scripts/wall_drawings.py, ezdxf and shapely)
tmp_wd="$(mktemp -d "${TMPDIR:-/tmp}/drydig-walldrawings.XXXXXX")"; python3 "$root/scripts/wall_drawings.py" "$tmp_wd"; for f in walls.dxf walls.geojson; do diff -q "$root/tests/dxf/$f" "$tmp_wd/$f" || { echo "tests/dxf/$f differs from a fresh run" >&2; status=1; }; done; if diff -u "$root/tests/reference/walls_expected.csv" "$tmp_wd/walls_expected.csv"; then echo "reference table up to date: $root/tests/reference/walls_expected.csv"; else status=1; fi; rm -rf "$tmp_wd"

# site CRS positions and scale factors (scripts/reference_crs.py, pyproj)
tmp_crs="$(mktemp "${TMPDIR:-/tmp}/drydig-crs.XXXXXX.csv")"; python3 "$root/scripts/reference_crs.py" "$tmp_crs"; if diff -u "$root/tests/reference/crs_scale_factors.csv" "$tmp_crs"; then echo "reference table up to date: $root/tests/reference/crs_scale_factors.csv"; else echo "crs_scale_factors.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_crs"

# time: worst flood moment, strip images, well floor (scripts/reference_flood.py, reference_time.py; mpmath)
for pair in "reference_flood.py programme_flood.csv" "reference_time.py programme_time.csv"; do
    set -- $pair
    tmp_t="$(mktemp "${TMPDIR:-/tmp}/drydig-time.XXXXXX.csv")"
    python3 "$root/scripts/$1" "$tmp_t"
    if diff -u "$root/tests/reference/$2" "$tmp_t"; then echo "reference table up to date: $root/tests/reference/$2"; else echo "$2 differs from a fresh run" >&2; status=1; fi
    rm -f "$tmp_t"
done

# layered ground (scripts/reference_layers.py, timml)
tmp_ly="$(mktemp "${TMPDIR:-/tmp}/drydig-layers.XXXXXX.csv")"; python3 "$root/scripts/reference_layers.py" "$tmp_ly"; if diff -u "$root/tests/reference/layers_timml.csv" "$tmp_ly"; then echo "reference table up to date: $root/tests/reference/layers_timml.csv"; else echo "layers_timml.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_ly"
# cut-off walls (scripts/reference_walls.py, timml line doublets)
tmp_wl="$(mktemp "${TMPDIR:-/tmp}/drydig-walls.XXXXXX.csv")"; python3 "$root/scripts/reference_walls.py" "$tmp_wl"; if diff -u "$root/tests/reference/walls_timml.csv" "$tmp_wl"; then echo "reference table up to date: $root/tests/reference/walls_timml.csv"; else echo "walls_timml.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_wl"

# Terzaghi U(T_v) (scripts/reference_consolidation.py, mpmath)
tmp_u="$(mktemp "${TMPDIR:-/tmp}/drydig-consolidation.XXXXXX.csv")"; python3 "$root/scripts/reference_consolidation.py" "$tmp_u"; if diff -u "$root/tests/reference/consolidation_u.csv" "$tmp_u"; then echo "reference table up to date: $root/tests/reference/consolidation_u.csv"; else echo "consolidation_u.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_u"

exit "$status"
