#!/usr/bin/env python3
"""DXF test drawings written by ezdxf (the way CAD programs write them), and where ezdxf itself
places every entity in world coordinates.

Usage: python3 scripts/dxf_fixtures.py OUT_DIR
Writes OUT_DIR/mirrored.dxf, OUT_DIR/inserts.dxf, OUT_DIR/dxf_expected.csv and the drawings
drydig must refuse in OUT_DIR/bad/. The committed copies are tests/dxf/*.dxf,
tests/reference/dxf_expected.csv and tests/bad_inputs/drawings/*.dxf; scripts/check_references.sh
regenerates them and fails on any difference (ezdxf writes fixed header dates and GUIDs here).

The expected positions are ezdxf's, not drydig's: OCS → WCS by `entity.ocs().to_wcs(...)`
(ezdxf's arbitrary axis algorithm), block references by `Insert.virtual_entities()` and
`Insert.multi_insert()` (ezdxf's block transform), outlines by `ezdxf.path.make_path`.
Rows: fixture, layer, kind, name, index, x, y (drawing units), kind one of
  well       a well centre (name: the name drydig must give, or empty when only the
             position is compared);
  vertex     vertex `index` of the outline on that layer (straight polylines);
  area       the outline's area by the shoelace formula on ezdxf's flattening to 1e-6 units
             (x holds the area, y 0).
"""
import csv
import math
import sys
from pathlib import Path

import ezdxf
from ezdxf import path as ezpath
from ezdxf.math import Matrix44

ezdxf.options.write_fixed_meta_data_for_testing = True


def mirror_x(at):
    """Mirror in the vertical line x = at (what CAD's MIRROR does)."""
    return Matrix44.chain(
        Matrix44.translate(-at, 0, 0), Matrix44.scale(-1, 1, 1), Matrix44.translate(at, 0, 0)
    )


def shoelace(pts):
    s = 0.0
    for (x1, y1), (x2, y2) in zip(pts, pts[1:] + pts[:1]):
        s += x1 * y2 - x2 * y1
    return abs(s) / 2


def fmt(v):
    return f"{v:.9f}"


def mirrored(out):
    """Metres. Entities drawn, then mirrored in x = 250 as a CAD user would: ezdxf stores the
    mirrored LWPOLYLINE, POLYLINE, CIRCLE and ARC with extrusion (0, 0, -1)."""
    doc = ezdxf.new("R2000", units=6)
    msp = doc.modelspace()
    pit = msp.add_lwpolyline(
        [(100, 180), (130, 180), (130, 200), (100, 200)], close=True, dxfattribs={"layer": "PIT"}
    )
    pit.transform(mirror_x(250))
    # An outline with two arc corners (bulges), mirrored.
    arcs = msp.add_lwpolyline(
        [(0, 0, 0), (20, 0, 0.4142135623730950), (25, 5, 0), (25, 15, -0.5), (0, 15, 0)],
        format="xyb",
        close=True,
        dxfattribs={"layer": "ARCPIT"},
    )
    arcs.transform(mirror_x(-40))
    poly2d = msp.add_polyline2d(
        [(200, 100), (215, 100), (215, 112), (200, 112)], close=True, dxfattribs={"layer": "OLD"}
    )
    poly2d.transform(mirror_x(0))
    for i, (x, y) in enumerate([(150, 195), (160, 195), (170, 205)]):
        c = msp.add_circle((x, y), 0.15, dxfattribs={"layer": "WELLS"})
        c.transform(mirror_x(0))
    msp.add_text("PW-2", height=0.5, dxfattribs={"layer": "WELLS"}).set_placement((-161, 195.6))
    arc = msp.add_arc((50, 50), 10, 0, 90, dxfattribs={"layer": "RIVER"})
    arc.transform(mirror_x(0))
    doc.saveas(out / "mirrored.dxf")
    return doc


def well_block(doc):
    """A well symbol as drawn in practice: a circle of the well radius on layer 0, a cross, and
    an attribute NAME."""
    b = doc.blocks.new("WELL", base_point=(0, 0))
    b.add_circle((0, 0), 150)
    b.add_line((-300, 0), (300, 0))
    b.add_line((0, -300), (0, 300))
    b.add_attdef("NAME", (200, 200), dxfattribs={"height": 250})
    cross = doc.blocks.new("CROSS", base_point=(10, 10))
    cross.add_line((-290, 10), (310, 10))
    cross.add_line((10, -290), (10, 310))
    pair = doc.blocks.new("PAIR", base_point=(0, 0))
    pair.add_blockref("WELL", (-2000, 0))
    pair.add_blockref("WELL", (2000, 0), dxfattribs={"xscale": -1})
    pit = doc.blocks.new("PITBLOCK", base_point=(1000, 1000))
    pit.add_lwpolyline(
        [(1000, 1000), (9000, 1000), (9000, 5000), (1000, 5000)], close=True
    )


def inserts(out):
    """Millimetres. One well symbol inserted eight times with scale, rotation and mirroring and
    a NAME attribute each; a block of two wells inserted twice (nested, named by the outer
    attribute); a cross symbol named by a text label; an array (MINSERT) of crosses; an outline
    in a block inserted with rotation and unequal scale."""
    doc = ezdxf.new("R2000", units=4)
    well_block(doc)
    msp = doc.modelspace()
    base = (512_000, 181_000)
    for i in range(8):
        x, y = base[0] + 12_000 * math.cos(i * math.pi / 4), base[1] + 12_000 * math.sin(i * math.pi / 4)
        attribs = {
            "xscale": [1, -1, 2, 1, 0.5, -1, 1, 1][i],
            "yscale": [1, 1, 2, -1, 0.5, -1, 1, 1][i],
            "rotation": [0, 30, 45, 90, 135, 200, 10, 0][i],
            "layer": "WELLS",
        }
        if i == 6:
            # A mirrored reference as CAD programs store it: extrusion (0, 0, -1), the
            # insertion point in its object coordinates (x negated).
            attribs["extrusion"] = (0, 0, -1)
            x = -x
        ref = msp.add_blockref("WELL", (x, y), dxfattribs=attribs)
        ref.add_auto_attribs({"NAME": f"W{i + 1}"})
    for j, (x, y, rot) in enumerate([(530_000, 181_000, 30), (530_000, 191_000, -60)]):
        ref = msp.add_blockref("PAIR", (x, y), dxfattribs={"layer": "WELLS", "rotation": rot, "xscale": 1.5, "yscale": 1.5})
        ref.add_attrib("NAME", f"P{j + 1}", (x, y))
    # The pair block mirrored by extrusion (0, 0, -1) and rotated: the insertion point and the
    # rotation are in the reference's object coordinates.
    ref = msp.add_blockref(
        "PAIR", (-545_000, 185_000), dxfattribs={"layer": "WELLS", "rotation": 25, "extrusion": (0, 0, -1)}
    )
    ref.add_attrib("NAME", "P3", (545_000, 185_000))
    msp.add_blockref("CROSS", (500_000, 170_000), dxfattribs={"layer": "WELLS", "rotation": 15})
    msp.add_text("PW-9", height=250, dxfattribs={"layer": "WELLS"}).set_placement((500_300, 170_300))
    arr = msp.add_blockref("CROSS", (490_000, 160_000), dxfattribs={"layer": "ARRAY", "rotation": 30})
    arr.grid(size=(2, 3), spacing=(4000, 5000))
    msp.add_blockref(
        "PITBLOCK",
        (520_000, 175_000),
        dxfattribs={"layer": "PIT", "rotation": 20, "xscale": 1.25, "yscale": -0.8},
    )
    doc.saveas(out / "inserts.dxf")
    return doc


def expected_rows(name, doc):
    rows = []
    msp = doc.modelspace()

    def wells_of(insert, outer_name, layer):
        """Well centres of a block reference (ezdxf's transform), with the name drydig gives."""
        found = []
        for e in insert.virtual_entities():
            if e.dxftype() == "CIRCLE":
                found.append(e.ocs().to_wcs(e.dxf.center))
            elif e.dxftype() == "INSERT":
                found.extend(p for p, _ in wells_of(e, None, layer))
        if not found:
            found = [insert.ocs().to_wcs(insert.dxf.insert)]
        own = insert.get_attrib_text("NAME") if insert.has_attrib("NAME") else None
        label = own or outer_name
        if label is None:
            return [(p, "") for p in found]
        if len(found) == 1:
            return [(found[0], label)]
        return [(p, f"{label} {k + 1}") for k, p in enumerate(found)]

    for e in msp:
        layer = e.dxf.layer
        t = e.dxftype()
        if t == "CIRCLE":
            p = e.ocs().to_wcs(e.dxf.center)
            rows.append([name, layer, "well", "", 0, fmt(p.x), fmt(p.y)])
        elif t == "INSERT":
            copies = list(e.multi_insert()) if e.mcount > 1 else [e]
            for c in copies:
                for p, n in wells_of(c, None, layer):
                    rows.append([name, layer, "well", n, 0, fmt(p.x), fmt(p.y)])
            if layer == "PIT":
                rows.pop()  # the outline block is read for its outline here
                for v in e.virtual_entities():
                    pts = list(ezpath.make_path(v).control_vertices())
                    for i, p in enumerate(pts[:4]):
                        rows.append([name, layer, "vertex", "", i, fmt(p.x), fmt(p.y)])
        elif t in ("LWPOLYLINE", "POLYLINE"):
            p = ezpath.make_path(e)
            has_arcs = t == "LWPOLYLINE" and e.has_arc
            if has_arcs:
                pts = [(q.x, q.y) for q in p.flattening(1e-6)]
                if pts[0] == pts[-1]:
                    pts.pop()
                rows.append([name, layer, "area", "", 0, fmt(shoelace(pts)), fmt(0)])
            else:
                pts = list(p.control_vertices())
                if len(pts) > 1 and pts[0].isclose(pts[-1]):
                    pts.pop()
                for i, q in enumerate(pts):
                    rows.append([name, layer, "vertex", "", i, fmt(q.x), fmt(q.y)])
        elif t == "ARC":
            s, m, f = e.start_point, e.construction_tool().center, e.end_point
            for i, q in enumerate([s, f]):
                rows.append([name, layer, "vertex", "", i, fmt(q.x), fmt(q.y)])
    # A well named by nothing else takes the nearest TEXT of its layer within five text heights
    # (each label going to the well nearest to it).
    for e in msp.query("TEXT"):
        at = e.ocs().to_wcs(e.dxf.insert)
        wells = [r for r in rows if r[2] == "well" and r[1] == e.dxf.layer]
        if not wells:
            continue
        near = min(wells, key=lambda r: math.hypot(float(r[5]) - at.x, float(r[6]) - at.y))
        if near[3] == "" and math.hypot(float(near[5]) - at.x, float(near[6]) - at.y) <= 5 * e.dxf.height:
            near[3] = e.dxf.text
    return rows


def bad(out):
    """Drawings drydig must refuse (tests/bad_inputs/drawings/, tests/bad_drawings.rs); each
    starts with a DXF comment (group 999) saying what is wrong."""
    out.mkdir(parents=True, exist_ok=True)

    def save(doc, name, what):
        doc.saveas(out / name)
        text = (out / name).read_text()
        (out / name).write_text(f"999\n{what}\n" + text)

    doc = ezdxf.new("R2000", units=6)
    doc.modelspace().add_lwpolyline(
        [(0, 0, 0), (10, 0, 0.7), (10, 5, 0)], format="xyb", close=True, dxfattribs={"layer": "PIT"}
    )
    save(doc, "nan_bulge.dxf", "a bulge that is not a number (NaN)")
    text = (out / "nan_bulge.dxf").read_text().replace("\n 42\n0.7\n", "\n 42\nnan\n")
    (out / "nan_bulge.dxf").write_text(text)

    doc = ezdxf.new("R2000", units=6)
    doc.modelspace().add_circle((5, 5), 0.2, dxfattribs={"layer": "WELLS", "extrusion": (0, 0.6, 0.8)})
    save(doc, "tilted_circle.dxf", "a circle drawn in a tilted plane (an ellipse in plan)")

    doc = ezdxf.new("R2000", units=4)
    well_block(doc)
    for x in (0, 10_000):
        ref = doc.modelspace().add_blockref("WELL", (x, 0), dxfattribs={"layer": "WELLS"})
        ref.add_auto_attribs({"NAME": "W1"})
    save(doc, "duplicate_well_names.dxf", "two well symbols whose NAME attribute is the same")

    doc = ezdxf.new("R2000", units=6)
    doc.modelspace().add_spline([(0, 0), (10, 0), (10, 10), (0, 10)], dxfattribs={"layer": "PIT"})
    save(doc, "spline_outline.dxf", "an outline drawn as a SPLINE")

    doc = ezdxf.new("R2000", units=6)
    loop = doc.blocks.new("LOOP")
    loop.add_circle((0, 0), 0.2)
    loop.add_blockref("LOOP", (1, 0))
    doc.modelspace().add_blockref("LOOP", (0, 0), dxfattribs={"layer": "WELLS"})
    save(doc, "block_inserts_itself.dxf", "a block that inserts itself")


def main():
    out = Path(sys.argv[1])
    out.mkdir(parents=True, exist_ok=True)
    bad(out / "bad")
    rows = expected_rows("mirrored", mirrored(out)) + expected_rows("inserts", inserts(out))
    with open(out / "dxf_expected.csv", "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["fixture", "layer", "kind", "name", "index", "x", "y"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
