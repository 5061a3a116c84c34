#!/usr/bin/env bash
# Regenerate the special-function reference table into a temporary file and compare it with the
# committed tests/reference/special_functions.csv. Exit 1 (and print the diff) if they differ.
# Needs python3 with the versions pinned in scripts/requirements.txt.
set -euo pipefail

root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
committed="$root/tests/reference/special_functions.csv"
tmp="$(mktemp "${TMPDIR:-/tmp}/drydig-special.XXXXXX.csv")"
trap 'rm -f "$tmp"' EXIT

python3 "$root/scripts/reference_special.py" "$tmp"

if diff -u "$committed" "$tmp"; then
    echo "reference table up to date: $committed"
else
    echo "reference table differs from a fresh run (diff above: - committed, + regenerated)" >&2
    exit 1
fi
