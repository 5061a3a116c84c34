#!/usr/bin/env python3
"""Read a design.dxf written by drydig with ezdxf and print what a CAD user would find, as JSON:
the $INSUNITS code, every POINT and CIRCLE (layer, x, y, radius), TEXT (layer, text, x, y),
LWPOLYLINE (layer, closed, elevation, vertices) and LINE (layer, ends). ezdxf's audit must find
no errors. Used by tests/dxf_out.rs.

Usage: python3 scripts/read_design_dxf.py design.dxf
"""
import json
import sys

import ezdxf

doc = ezdxf.readfile(sys.argv[1])
auditor = doc.audit()
out = {
    "insunits": doc.header.get("$INSUNITS", 0),
    "audit_errors": len(auditor.errors),
    "layers": sorted(layer.dxf.name for layer in doc.layers),
    "points": [],
    "circles": [],
    "texts": [],
    "polylines": [],
    "lines": [],
}
for e in doc.modelspace():
    t, layer = e.dxftype(), e.dxf.layer
    if t == "POINT":
        p = e.dxf.location
        out["points"].append({"layer": layer, "x": p.x, "y": p.y})
    elif t == "CIRCLE":
        p = e.ocs().to_wcs(e.dxf.center)
        out["circles"].append({"layer": layer, "x": p.x, "y": p.y, "r": e.dxf.radius})
    elif t == "TEXT":
        p = e.ocs().to_wcs(e.dxf.insert)
        out["texts"].append({"layer": layer, "text": e.dxf.text, "x": p.x, "y": p.y})
    elif t == "LWPOLYLINE":
        pts = [[p[0], p[1]] for p in e.vertices_in_wcs()]
        out["polylines"].append(
            {"layer": layer, "closed": e.closed, "elevation": e.dxf.elevation, "points": pts}
        )
    elif t == "LINE":
        out["lines"].append(
            {"layer": layer, "ends": [list(e.dxf.start)[:2], list(e.dxf.end)[:2]]}
        )
print(json.dumps(out))
