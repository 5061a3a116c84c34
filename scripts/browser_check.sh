#!/usr/bin/env bash
# Browser check of report.html: installs Debian's Chromium where missing (needs root, as in CI),
# runs every demo in layouts/ through `drydig check` (and `design` for the basement), renders each
# report headless to PNG and PDF, and checks:
#   - the DOM (--dump-dom): every section id present, no <img> (all drawings are inline SVG, so
#     nothing can be a broken image), no <script>, no external reference (http:, src=);
#   - the layout: a copy of the report with a measuring script added (the report itself has
#     none) is loaded and dumped; the script records every table or figure wider than the text
#     block and every <img> that did not load; the PDF page box must stay A4/Letter wide;
#   - the PDF page count (counted "/Type /Page" objects): at least 3, at most 40.
# Outputs in target/browser_check/<demo>/ (report.png, report.pdf, dom.html).
set -euo pipefail
cd "$(dirname "$0")/.."

if ! command -v chromium >/dev/null 2>&1; then
    echo "== installing Debian's chromium =="
    apt-get update && apt-get install -y chromium
fi

cargo build --quiet
BIN=target/debug/drydig
OUT=target/browser_check
rm -rf "$OUT"
mkdir -p "$OUT"

chrome() {
    local profile
    profile=$(mktemp -d)
    timeout 120 chromium --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
        --disable-background-networking --disable-component-update --disable-sync \
        --user-data-dir="$profile" "$@" 2>/dev/null
    rm -rf "$profile"
}

runs=()
for f in layouts/*.toml; do
    name=$(basename "$f" .toml)
    set +e
    "$BIN" check "$f" -o "$OUT/$name" >/dev/null
    rc=$?
    set -e
    if [ "$rc" -ne 0 ] && [ "$rc" -ne 3 ]; then
        echo "FAIL: drydig check $f exited $rc"
        exit 1
    fi
    runs+=("$name")
done
set +e
"$BIN" design layouts/riverside_basement.toml -o "$OUT/riverside_basement_design" >/dev/null
rc=$?
set -e
if [ "$rc" -ne 0 ] && [ "$rc" -ne 3 ]; then
    echo "FAIL: drydig design exited $rc"
    exit 1
fi
runs+=("riverside_basement_design")

fail=0
for name in "${runs[@]}"; do
    dir="$(pwd)/$OUT/$name"
    url="file://$dir/report.html"
    chrome --screenshot="$dir/report.png" --window-size=1240,1754 "$url" >/dev/null
    chrome --print-to-pdf="$dir/report.pdf" --no-pdf-header-footer "$url" >/dev/null
    chrome --dump-dom "$url" >"$dir/dom.html"
    # The measuring copy: the report plus a script that writes what it found into the DOM.
    python3 - "$dir" <<'PY'
import pathlib, sys
d = pathlib.Path(sys.argv[1])
probe = '''<script>
window.addEventListener("load", function () {
  var body = document.body.getBoundingClientRect();
  var wide = [];
  document.querySelectorAll("table, figure, svg, pre").forEach(function (e, i) {
    var r = e.getBoundingClientRect();
    if (r.right > body.right + 1 || e.scrollWidth > e.clientWidth + 1) {
      var s = e.closest("section");
      wide.push((s ? s.id : "?") + ":" + e.tagName + ":" + Math.round(r.width) + "px");
    }
  });
  var broken = [];
  document.querySelectorAll("img").forEach(function (e) { if (!e.complete || e.naturalWidth === 0) broken.push(e.src); });
  var m = document.createElement("meta");
  m.setAttribute("name", "probe");
  m.setAttribute("content", "bodywidth=" + Math.round(body.width) + ";wide=" + wide.join(",") + ";broken=" + broken.join(","));
  document.head.appendChild(m);
});
</script>'''
html = (d / "report.html").read_text(encoding="utf-8")
(d / "probe.html").write_text(html.replace("</body>", probe + "</body>"), encoding="utf-8")
PY
    chrome --dump-dom --virtual-time-budget=5000 --window-size=794,1123 "file://$dir/probe.html" >"$dir/probe_dom.html"
    python3 - "$dir" "$name" <<'PY' || fail=1
import re, sys, pathlib
d = pathlib.Path(sys.argv[1]); name = sys.argv[2]
dom = (d / "dom.html").read_text(encoding="utf-8")
src = (d / "report.html").read_text(encoding="utf-8")
ids = ["summary", "inputs", "methods", "estimate", "map", "section", "wells",
       "checkpoints", "neighbours", "uplift", "bid", "cautions"]
problems = [f"section #{i} missing" for i in ids if f'<section id="{i}"' not in dom]
if "<img" in dom:
    problems.append("an <img> element (drawings must be inline SVG)")
if "<script" in src:
    problems.append("a <script> element")
if re.search(r'(src|href)="https?:', src) or "@import" in src or "url(http" in src:
    problems.append("an external reference")
if dom.count("<svg") < 2:
    problems.append("map and section drawings not both present")
# Tables must be set to the page width (table-layout: fixed, width 100 %) so none overflows.
if "table-layout: fixed" not in src:
    problems.append("tables are not fixed to the page width")
pdf = (d / "report.pdf").read_bytes()
pages = len(re.findall(rb"/Type\s*/Page(?!s)", pdf))
if not 3 <= pages <= 40:
    problems.append(f"PDF has {pages} pages (expected 3 to 40)")
for m in re.finditer(rb"/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)", pdf):
    w = float(m.group(1))
    if w > 613:  # US Letter is 612 pt wide, A4 595 pt
        problems.append(f"PDF page {w} pt wide")
        break
png = (d / "report.png").read_bytes()
if png[:8] != b"\x89PNG\r\n\x1a\n":
    problems.append("no PNG screenshot")
probe = (d / "probe_dom.html").read_text(encoding="utf-8")
m = re.search(r'name="probe" content="([^"]*)"', probe)
if not m:
    problems.append("the layout probe did not run")
else:
    found = dict(kv.split("=", 1) for kv in m.group(1).split(";"))
    if found.get("wide"):
        problems.append("wider than the page: " + found["wide"])
    if found.get("broken"):
        problems.append("broken images: " + found["broken"])
if problems:
    print(f"FAIL {name}: " + "; ".join(problems))
    sys.exit(1)
print(f"ok   {name}: {len(ids)} sections, {pages} PDF pages")
PY
done
exit "$fail"
