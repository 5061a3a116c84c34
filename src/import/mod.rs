//! Reading site drawings (GeoJSON, DXF) and site coordinates.
