//! Reading site drawings and site coordinates: GeoJSON ([`geojson_in`]) and DXF ([`dxf_in`])
//! outlines, lines and points in a projected or local grid, and reprojection of site
//! coordinates to WGS84 ([`crs`]).

pub mod crs;
