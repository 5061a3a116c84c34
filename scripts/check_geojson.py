#!/usr/bin/env python3
"""Read every demo's GeoJSON with outside tools: GDAL's ogrinfo (the file opens, the layer's CRS
is the one the file names, the extent is the features' extent) and shapely (every polygon valid,
exterior rings counter-clockwise as RFC 7946 §3.1.6 asks).

Usage: check_geojson.py DRYDIG_BINARY [OUT_DIR]. Runs `drydig check` on each layouts/*.toml that
checks, then inspects layout.geojson and contours.geojson. Exit 1 on any problem.
Needs gdal-bin (ogrinfo) and shapely (scripts/requirements.txt).
"""
import json
import pathlib
import subprocess
import sys
import tempfile

import shapely
from shapely.geometry import shape

ROOT = pathlib.Path(__file__).resolve().parent.parent


def ogr_summary(path):
    out = subprocess.run(["ogrinfo", "-ro", "-so", "-al", str(path)], capture_output=True,
                         text=True, check=True).stdout
    return out, None


def check_file(path, problems):
    gj = json.loads(path.read_text())
    feats = gj["features"]
    if not feats:
        return
    geoms = [shape(f["geometry"]) for f in feats if f.get("geometry")]
    for f, g in zip(feats, geoms):
        if g.geom_type == "Polygon":
            if not g.is_valid:
                problems.append(f"{path}: invalid polygon {f['properties'].get('name')}")
            if not g.exterior.is_ccw:
                problems.append(f"{path}: exterior ring not counter-clockwise")
    text, _ = ogr_summary(path)
    minx, miny, maxx, maxy = shapely.GeometryCollection(geoms).bounds
    # ogrinfo prints the extent with its signs; compare via a second, plain parse.
    ext_line = next(l for l in text.splitlines() if l.startswith("Extent:"))
    a, b = ext_line[len("Extent: "):].split(" - ")
    x0, y0 = (float(v) for v in a.strip("()").split(","))
    x1, y1 = (float(v) for v in b.strip("()").split(","))
    tol = 1e-6 * max(1.0, abs(maxx), abs(maxy))
    if max(abs(x0 - minx), abs(y0 - miny), abs(x1 - maxx), abs(y1 - maxy)) > tol:
        problems.append(f"{path}: ogrinfo extent {ext_line} != shapely {minx, miny, maxx, maxy}")
    if "crs" in gj:
        if "ENGCRS" not in text and "PROJCRS" not in text:
            problems.append(f"{path}: ogrinfo does not read the named grid")
    elif 'ID["EPSG",4326]' not in text and "WGS 84" not in text:
        problems.append(f"{path}: no crs member and GDAL does not read WGS84")
    if "crs" not in gj and (abs(minx) > 180 or abs(maxx) > 180 or abs(miny) > 90 or abs(maxy) > 90):
        problems.append(f"{path}: coordinates outside lon/lat without a crs member")


def main():
    binary = sys.argv[1]
    base = pathlib.Path(sys.argv[2]) if len(sys.argv) > 2 else pathlib.Path(tempfile.mkdtemp())
    problems = []
    checked = 0
    for design in sorted((ROOT / "layouts").glob("*.toml")):
        out = base / design.stem
        r = subprocess.run([binary, "check", str(design), "-o", str(out)], capture_output=True)
        if r.returncode not in (0, 3):  # 3: targets not met, outputs written
            problems.append(f"{design.name}: drydig check exit {r.returncode}")
            continue
        for name in ["layout.geojson", "contours.geojson"]:
            if (out / name).exists():
                check_file(out / name, problems)
                checked += 1
    print(f"{checked} GeoJSON files read with ogrinfo and shapely")
    for p in problems:
        print(p, file=sys.stderr)
    sys.exit(1 if problems or checked == 0 else 0)


if __name__ == "__main__":
    main()
