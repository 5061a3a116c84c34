#!/usr/bin/env bash
# Regenerate the special-function reference table into a temporary file and compare it with the
# committed tests/reference/special_functions.csv. Exit 1 (and print the diff) if they differ.
# Likewise for the superposition table tests/reference/superposition.csv
# (scripts/reference_superposition.py, numpy and scipy).
# Needs python3 with the versions pinned in scripts/requirements.txt.
set -euo pipefail

root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
committed="$root/tests/reference/special_functions.csv"
tmp="$(mktemp "${TMPDIR:-/tmp}/drydig-special.XXXXXX.csv")"
tmp_sup="$(mktemp "${TMPDIR:-/tmp}/drydig-superposition.XXXXXX.csv")"
trap 'rm -f "$tmp" "$tmp_sup"' EXIT
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

# partial penetration (scripts/reference_partial_penetration.py, scipy and mpmath; ~4 min)
tmp_pp="$(mktemp "${TMPDIR:-/tmp}/drydig-pp.XXXXXX.csv")"; python3 "$root/scripts/reference_partial_penetration.py" "$tmp_pp"; if diff -u "$root/tests/reference/partial_penetration.csv" "$tmp_pp"; then echo "reference table up to date: $root/tests/reference/partial_penetration.csv"; else echo "partial_penetration.csv differs from a fresh run" >&2; status=1; fi; rm -f "$tmp_pp"

exit "$status"
