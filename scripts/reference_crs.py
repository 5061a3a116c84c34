#!/usr/bin/env python3
"""Reference table for the site CRS checks: WGS84 longitude/latitude and the point scale factor
of grid points on several projected grids, computed with pyproj (PROJ).

Writes tests/reference/crs_scale_factors.csv (or the path given). Each grid is given by the same
proj string drydig uses (the crs-definitions proj4 text for the EPSG codes), so both sides apply
the same datum shift (+towgs84 Helmert) and PROJ picks no grid file. The scale factors are
pyproj's Proj.get_factors at the point's latitude/longitude on the grid's own ellipsoid
(meridional and parallel scale; equal on the conformal grids listed).
Versions pinned in scripts/requirements.txt.
"""
import csv
import sys

import pyproj

# (label, proj string, [grid points x, y in metres])
GRIDS = [
    ("EPSG:27700",
     "+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy "
     "+towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m +no_defs",
     [(530000.0, 180000.0), (651409.903, 313177.270), (200000.0, 800000.0)]),
    ("EPSG:32633", "+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs",
     [(500000.0, 5800000.0), (800000.0, 5800000.0), (250000.0, 4500000.0)]),
    ("EPSG:3857",
     "+proj=merc +a=6378137 +b=6378137 +lat_ts=0.0 +lon_0=0.0 +x_0=0.0 +y_0=0 +k=1.0 +units=m "
     "+nadgrids=@null +wktext  +no_defs",
     [(1000000.0, 6800125.454), (0.0, 0.0)]),
    ("EPSG:2154",
     "+proj=lcc +lat_1=49 +lat_2=44 +lat_0=46.5 +lon_0=3 +x_0=700000 +y_0=6600000 +ellps=GRS80 "
     "+towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
     [(652000.0, 6862000.0), (1000000.0, 6200000.0)]),
    ("EPSG:28355", "+proj=utm +zone=55 +south +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
     [(320000.0, 5810000.0)]),
    ("EPSG:31370",
     "+proj=lcc +lat_1=51.16666723333333 +lat_2=49.8333339 +lat_0=90 +lon_0=4.367486666666666 "
     "+x_0=150000.013 +y_0=5400088.438 +ellps=intl "
     "+towgs84=-106.869,52.2978,-103.724,0.3366,-0.457,1.8422,-1.2747 +units=m +no_defs",
     [(150000.0, 170000.0)]),
    ("local tmerc",
     "+proj=tmerc +lat_0=52.2 +lon_0=-1.6 +k=1 +x_0=1000 +y_0=2000 +ellps=WGS84 +units=m +no_defs",
     [(1000.0, 2000.0), (201000.0, 2000.0)]),
]


def main(out_path: str) -> None:
    rows = []
    for label, definition, points in GRIDS:
        crs = pyproj.CRS.from_proj4(definition)
        to_wgs84 = pyproj.Transformer.from_crs(crs, "EPSG:4326", always_xy=True)
        to_own = pyproj.Transformer.from_crs(crs, crs.geodetic_crs, always_xy=True)
        proj = pyproj.Proj(crs)
        for x, y in points:
            lon, lat = to_wgs84.transform(x, y)
            olon, olat = to_own.transform(x, y)
            f = proj.get_factors(olon, olat)
            rows.append([label, definition, f"{x:.3f}", f"{y:.3f}", f"{lon:.10f}", f"{lat:.10f}",
                         f"{f.meridional_scale:.10f}", f"{f.parallel_scale:.10f}"])
    with open(out_path, "w", newline="") as fh:
        fh.write(f"# pyproj {pyproj.__version__}, PROJ {pyproj.proj_version_str}\n")
        w = csv.writer(fh, lineterminator="\n")
        w.writerow(["grid", "definition", "x_m", "y_m", "lon_deg", "lat_deg",
                    "meridional_scale", "parallel_scale"])
        w.writerows(rows)


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else "tests/reference/crs_scale_factors.csv")
