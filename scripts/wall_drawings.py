#!/usr/bin/env python3
"""Cut-off walls drawn in a DXF (written by ezdxf, the way CAD programs write them) and in a
GeoJSON file, and where outside libraries put them: ezdxf for the DXF's world coordinates,
shapely for every wall's length, GDAL's ogrinfo for the GeoJSON's grid (gdal-bin).

Usage: python3 scripts/wall_drawings.py OUT_DIR
Writes OUT_DIR/walls.dxf, OUT_DIR/walls.geojson and OUT_DIR/walls_expected.csv. The committed
copies are tests/dxf/walls.dxf, tests/dxf/walls.geojson and tests/reference/walls_expected.csv
(tests/import_walls.rs); scripts/check_references.sh regenerates them and fails on any
difference (ezdxf writes fixed header dates and GUIDs here).

The walls (invented): the sheet-pile wall of layouts/walled_basement.toml, north of the dig and
down its east side, [[-30, 48], [61, 48], [61, -20]] m, open; and a closed cofferdam round a
shaft, a rectangle 12 m x 8 m turned 30 degrees about (100, 10) m.
In the DXF (millimetres) the sheet-pile wall is drawn on the other side of x = 0 and mirrored
as a CAD user would (ezdxf stores the mirrored LWPOLYLINE with extrusion (0, 0, -1)); the
cofferdam is a closed 2D POLYLINE. In the GeoJSON (metres, a local grid named in a top-level
"crs" member, as drydig writes it; ogrinfo must read it as a local grid) the first is a LineString, the second a Polygon (counter-clockwise).

Rows: fixture, selector, kind, index, x, y
  vertex   vertex `index` of the wall in metres (DXF: ezdxf's OCS -> WCS of the entity);
  length   the wall's length in metres by shapely (LineString.length, or the polygon's
           exterior length for a closed wall), in x (y 0).
"""
import csv
import json
import math
import subprocess
import sys
from pathlib import Path

import ezdxf
from ezdxf import path as ezpath
from ezdxf.math import Matrix44
from shapely.geometry import LineString, Polygon, shape

ezdxf.options.write_fixed_meta_data_for_testing = True

SHEET_PILES = [(-30.0, 48.0), (61.0, 48.0), (61.0, -20.0)]


def cofferdam():
    """Corners of the 12 m x 8 m rectangle turned 30 degrees about (100, 10), counter-clockwise."""
    c, s = math.cos(math.radians(30)), math.sin(math.radians(30))
    out = []
    for dx, dy in [(-6, -4), (6, -4), (6, 4), (-6, 4)]:
        out.append((round(100 + c * dx - s * dy, 6), round(10 + s * dx + c * dy, 6)))
    return out


def fmt(v):
    return f"{v:.9f}"


def write_dxf(out):
    doc = ezdxf.new("R2000", units=4)  # millimetres
    msp = doc.modelspace()
    drawn = [(-1000 * x, 1000 * y) for x, y in SHEET_PILES]
    wall = msp.add_lwpolyline(drawn, dxfattribs={"layer": "SHEET PILES"})
    wall.transform(Matrix44.scale(-1, 1, 1))  # MIRROR in x = 0
    msp.add_polyline2d(
        [(1000 * x, 1000 * y) for x, y in cofferdam()], close=True, dxfattribs={"layer": "COFFERDAM"}
    )
    doc.saveas(out / "walls.dxf")
    rows = []
    for e in msp:
        pts = [(q.x / 1000, q.y / 1000) for q in ezpath.make_path(e).control_vertices()]
        closed = e.is_closed if e.dxftype() == "POLYLINE" else e.closed
        if closed and len(pts) > 1 and math.isclose(pts[0][0], pts[-1][0]) and math.isclose(pts[0][1], pts[-1][1]):
            pts.pop()
        layer = e.dxf.layer
        for i, (x, y) in enumerate(pts):
            rows.append(["dxf", layer, "vertex", i, fmt(x), fmt(y)])
        length = Polygon(pts).exterior.length if closed else LineString(pts).length
        rows.append(["dxf", layer, "length", 0, fmt(length), fmt(0)])
    return rows


def write_geojson(out):
    ring = cofferdam()
    fc = {
        "type": "FeatureCollection",
        # the local grid as drydig writes it in layout.geojson (GDAL reads it as an ENGCRS)
        "crs": {
            "type": "name",
            "properties": {
                "name": 'LOCAL_CS["local site grid (metres)",LOCAL_DATUM["site grid",0],'
                'UNIT["metre",1],AXIS["x",EAST],AXIS["y",NORTH]]'
            },
        },
        "features": [
            {
                "type": "Feature",
                "properties": {"layer": "wall", "name": "Terrace sheet piles"},
                "geometry": {"type": "LineString", "coordinates": [list(p) for p in SHEET_PILES]},
            },
            {
                "type": "Feature",
                "properties": {"layer": "wall", "name": "Shaft cofferdam"},
                "geometry": {"type": "Polygon", "coordinates": [[list(p) for p in ring + ring[:1]]]},
            },
            {
                "type": "Feature",
                "properties": {"layer": "excavation", "name": "Shaft"},
                "geometry": {"type": "Point", "coordinates": [100.0, 10.0]},
            },
        ],
    }
    (out / "walls.geojson").write_text(json.dumps(fc, indent=1) + "\n")
    # GDAL opens the file and reads the local grid, not longitude/latitude.
    info = subprocess.run(
        ["ogrinfo", "-ro", "-so", "-al", str(out / "walls.geojson")],
        capture_output=True, text=True, check=True,
    ).stdout
    assert "ENGCRS" in info and "Feature Count: 3" in info, info
    rows = []
    for f in json.loads((out / "walls.geojson").read_text())["features"]:
        if f["properties"]["layer"] != "wall":
            continue
        g = shape(f["geometry"])
        name = f["properties"]["name"]
        if g.geom_type == "Polygon":
            assert g.is_valid and g.exterior.is_ccw, name
            pts, length = list(g.exterior.coords)[:-1], g.exterior.length
        else:
            pts, length = list(g.coords), g.length
        for i, (x, y) in enumerate(pts):
            rows.append(["geojson", name, "vertex", i, fmt(x), fmt(y)])
        rows.append(["geojson", name, "length", 0, fmt(length), fmt(0)])
    return rows


def main():
    out = Path(sys.argv[1])
    out.mkdir(parents=True, exist_ok=True)
    rows = write_dxf(out) + write_geojson(out)
    with open(out / "walls_expected.csv", "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["fixture", "selector", "kind", "index", "x", "y"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
