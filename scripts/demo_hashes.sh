#!/usr/bin/env bash
# Behaviour fingerprint of every demo: runs `estimate --json`, `check` and `design` on each file in
# layouts/, masks the date/version lines (and drydig-run.json's folder, time and file hashes),
# and prints one SHA-256 per output file (and per terminal text). Two runs of the same code give
# the same list; a refactor that changes no result must too.  Usage: scripts/demo_hashes.sh [BIN] > hashes.txt   (default target/release/drydig)
set -uo pipefail
cd "$(dirname "$0")/.."
bin="${1:-target/release/drydig}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
mask() {
    case "$1" in
        # The run record: the output folder (a fresh temporary one), the time written and the
        # byte counts and hashes of files that carry a date are masked; the files themselves
        # are hashed below.
        */drydig-run.json) sed -E "s#$work#WORK#g; /\"(written_unix_s|sha256|bytes)\"/d" "$1" ;;
        *) sed -E 's/[0-9]{4}-[0-9]{2}-[0-9]{2}([T ][0-9:.]+Z?)?/DATE/g; s/drydig [0-9]+\.[0-9]+\.[0-9]+/drydig VERSION/g' "$1" ;;
    esac
}
for f in layouts/*.toml; do
    name="$(basename "$f" .toml)"
    for cmd in estimate check design; do
        out="$work/$name/$cmd"
        mkdir -p "$out"
        case "$cmd" in
            estimate) "$bin" estimate "$f" --json > "$out/terminal.txt" 2>&1; echo "exit $?" >> "$out/terminal.txt" ;;
            check) "$bin" check "$f" -o "$out/files" > "$out/terminal.txt" 2>&1; echo "exit $?" >> "$out/terminal.txt" ;;
            design) "$bin" design "$f" -o "$out/files" > "$out/terminal.txt" 2>&1; echo "exit $?" >> "$out/terminal.txt" ;;
        esac
        sed -i "s#$work#WORK#g" "$out/terminal.txt"
    done
done
cd "$work"
find . -type f | LC_ALL=C sort | while read -r p; do
    printf '%s  %s\n' "$(mask "$p" | sha256sum | cut -c1-16)" "$p"
done
