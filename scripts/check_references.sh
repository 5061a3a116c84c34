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
# time: worst flood moment, strip images, well floor (scripts/reference_flood.py, reference_time.py; mpmath)
for pair in "reference_flood.py programme_flood.csv" "reference_time.py programme_time.csv"; do
    set -- $pair
    tmp_t="$(mktemp "${TMPDIR:-/tmp}/drydig-time.XXXXXX.csv")"
    python3 "$root/scripts/$1" "$tmp_t"
    if diff -u "$root/tests/reference/$2" "$tmp_t"; then echo "reference table up to date: $root/tests/reference/$2"; else echo "$2 differs from a fresh run" >&2; status=1; fi
    rm -f "$tmp_t"
done

exit "$status"
