//! Site coordinates to longitude/latitude, for maps that need a geographic position (web maps,
//! report location lines). Pure Rust: EPSG codes through `crs-definitions`, projection and datum
//! shift through `proj4rs`.
//!
//! The site itself is always worked in metres on a projected or local grid (design.md §4): a
//! geographic site CRS is refused here.

use std::fmt;

use proj4rs::proj::Proj;

/// WGS84 longitude/latitude, the target of [`Reprojector::to_wgs84`].
const WGS84: &str = "+proj=longlat +datum=WGS84 +no_defs";
/// Semi-major axis of WGS84 / GRS80, m; an ellipsoid within 1 m of it needs no datum shift at
/// site-map accuracy.
const WGS84_A: f64 = 6_378_137.0;

/// A site CRS that cannot be used, or a point that would not convert.
#[derive(Debug, Clone, PartialEq)]
pub struct CrsError {
    /// The CRS as given (`EPSG:27700`, a proj string).
    pub crs: String,
    /// What is wrong and what would be valid.
    pub message: String,
}

impl fmt::Display for CrsError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "crs \"{}\": {}", self.crs, self.message)
    }
}

impl std::error::Error for CrsError {}

/// Converts site grid coordinates (x east, y north, m) to longitude/latitude.
#[derive(Debug)]
pub struct Reprojector {
    given: String,
    source: Proj,
    wgs84: Proj,
    /// The definition carries a datum (`+datum`, `+towgs84` or `+nadgrids`).
    has_datum: bool,
    /// Semi-major and semi-minor axes of the source ellipsoid, m.
    ellipsoid: (f64, f64),
}

impl Reprojector {
    /// A reprojector for `crs`: `"EPSG:27700"`-style codes (looked up in `crs-definitions`) or a
    /// raw proj string (`"+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs"`).
    ///
    /// Refused: unknown codes, strings proj4rs cannot parse, and geographic CRSs
    /// (`+proj=longlat`, EPSG:4326 …), with a message asking for a projected or local grid.
    pub fn new(crs: &str) -> Result<Reprojector, CrsError> {
        let given = crs.trim().to_string();
        let err = |message: String| CrsError {
            crs: given.clone(),
            message,
        };
        let definition = if given.starts_with('+') {
            given.clone()
        } else {
            let code = given
                .strip_prefix("EPSG:")
                .or_else(|| given.strip_prefix("epsg:"))
                .ok_or_else(|| {
                    err(
                        "give an EPSG code as \"EPSG:27700\" or a proj string starting with \
                         \"+proj=\""
                            .into(),
                    )
                })?;
            let code: u16 = code.trim().parse().map_err(|_| {
                err(format!(
                    "\"{code}\" is not an EPSG number (e.g. EPSG:27700)"
                ))
            })?;
            crs_definitions::from_code(code)
                .ok_or_else(|| {
                    err(format!(
                        "EPSG:{code} is not in the built-in list; give its proj string instead"
                    ))
                })?
                .proj4
                .to_string()
        };
        let source = Proj::from_proj_string(&definition).map_err(|e| {
            err(format!(
                "the definition \"{definition}\" does not parse: {e}"
            ))
        })?;
        if source.is_latlong() || source.is_geocent() {
            return Err(err(
                "this is a geographic (longitude/latitude) CRS; the site must be drawn on a \
                 projected or local grid in metres (e.g. a national grid or UTM zone)"
                    .into(),
            ));
        }
        let wgs84 = Proj::from_proj_string(WGS84)
            .map_err(|e| err(format!("internal: WGS84 definition does not parse: {e}")))?;
        let has_datum = ["+datum=", "+towgs84=", "+nadgrids="]
            .iter()
            .any(|k| definition.contains(k));
        let ellipsoid = source.ellipse_parameters();
        Ok(Reprojector {
            given,
            source,
            wgs84,
            has_datum,
            ellipsoid,
        })
    }

    fn error(&self, message: String) -> CrsError {
        CrsError {
            crs: self.given.clone(),
            message,
        }
    }

    fn inverse(&self, target: &Proj, x: f64, y: f64) -> Result<(f64, f64), CrsError> {
        if !x.is_finite() || !y.is_finite() {
            return Err(self.error(format!("the point ({x}, {y}) is not a pair of numbers")));
        }
        let mut p = (x, y, 0.0);
        proj4rs::transform::transform(&self.source, target, &mut p)
            .map_err(|e| self.error(format!("the point ({x}, {y}) does not convert: {e}")))?;
        let (lon, lat) = (p.0.to_degrees(), p.1.to_degrees());
        if !lon.is_finite() || !lat.is_finite() || lat.abs() > 90.0 {
            return Err(self.error(format!(
                "the point ({x}, {y}) is outside the area this CRS can convert"
            )));
        }
        Ok((lon, lat))
    }

    /// WGS84 longitude and latitude, degrees, of the grid point (x east, y north, m).
    ///
    /// Inverse projection on the CRS's own ellipsoid, then the datum shift of its definition
    /// (a 7-parameter Helmert for `+towgs84`, accurate to a few metres for OSGB36 — Ordnance
    /// Survey, *A guide to coordinate systems in Great Britain*, §6.6). A CRS on another
    /// ellipsoid than WGS84/GRS80 whose definition gives no datum shift is refused rather than
    /// silently placed some hundred metres off.
    pub fn to_wgs84(&self, x: f64, y: f64) -> Result<(f64, f64), CrsError> {
        if !self.has_datum && (self.ellipsoid.0 - WGS84_A).abs() > 1.0 {
            return Err(self.error(
                "the definition gives no datum shift to WGS84 (+towgs84=… or +datum=…) and its \
                 ellipsoid is not WGS84/GRS80; add one to place the site on a map"
                    .into(),
            ));
        }
        self.inverse(&self.wgs84, x, y)
    }

    /// Longitude and latitude, degrees, of the grid point on the CRS's own ellipsoid and datum
    /// (the inverse projection alone, no datum shift): OSGB36 latitudes for the British National
    /// Grid, NAD27 for a Clarke 1866 UTM zone.
    pub fn to_geographic_own_datum(&self, x: f64, y: f64) -> Result<(f64, f64), CrsError> {
        let (a, b) = self.ellipsoid;
        let own = Proj::from_proj_string(&format!("+proj=longlat +a={a} +b={b} +no_defs"))
            .map_err(|e| self.error(format!("internal: own-ellipsoid definition: {e}")))?;
        // Without datum information on the target, proj4rs does no datum shift.
        let source = Proj::from_proj_string(&strip_datum(&self.source_definition()))
            .map_err(|e| self.error(format!("internal: {e}")))?;
        let r = Reprojector {
            given: self.given.clone(),
            source,
            wgs84: own,
            has_datum: false,
            ellipsoid: self.ellipsoid,
        };
        r.inverse(&r.wgs84, x, y)
    }

    fn source_definition(&self) -> String {
        if self.given.starts_with('+') {
            self.given.clone()
        } else {
            self.given
                .trim_start_matches("EPSG:")
                .trim_start_matches("epsg:")
                .trim()
                .parse::<u16>()
                .ok()
                .and_then(crs_definitions::from_code)
                .map(|d| d.proj4.to_string())
                .unwrap_or_default()
        }
    }
}

/// The proj string without `+towgs84`, `+nadgrids` and `+datum` (a datum name is replaced by
/// nothing: its ellipsoid must then be given by `+ellps`, as in every EPSG definition used
/// here, or it falls back to the proj4rs default).
fn strip_datum(definition: &str) -> String {
    let mut out: Vec<String> = Vec::new();
    for part in definition.split_whitespace() {
        if let Some(name) = part.strip_prefix("+datum=") {
            // Keep the datum's ellipsoid.
            let ellps = match name {
                "WGS84" => "WGS84",
                "NAD83" | "GGRS87" => "GRS80",
                "NAD27" => "clrk66",
                "OSGB36" => "airy",
                "potsdam" => "bessel",
                _ => continue,
            };
            if !definition.contains("+ellps=") {
                out.push(format!("+ellps={ellps}"));
            }
            continue;
        }
        if part.starts_with("+towgs84=") || part.starts_with("+nadgrids=") {
            continue;
        }
        out.push(part.to_string());
    }
    out.join(" ")
}

#[cfg(test)]
mod tests {
    use super::*;

    fn dms(d: f64, m: f64, s: f64) -> f64 {
        d + m / 60.0 + s / 3600.0
    }

    // Ordnance Survey, "A guide to coordinate systems in Great Britain", Annexe C worked example
    // (Airy 1830, National Grid): E 651409.903, N 313177.270 ↔ OSGB36 latitude 52°39′27.2531″N,
    // longitude 1°43′4.5177″E. Tolerance 1e-6° (≈ 0.1 m; the guide's series and proj4rs's
    // Poder/Engsager series agree to well under that).
    #[test]
    fn crs_os_national_grid_worked_example() {
        let r = Reprojector::new("EPSG:27700").unwrap();
        let (lon, lat) = r.to_geographic_own_datum(651_409.903, 313_177.270).unwrap();
        assert!((lat - dms(52.0, 39.0, 27.2531)).abs() < 1e-6, "{lat}");
        assert!((lon - dms(1.0, 43.0, 4.5177)).abs() < 1e-6, "{lon}");
        // The same point on WGS84 through the EPSG:27700 Helmert (+towgs84). Library value:
        // Movable Type Scripts geodesy (C. Veness), OsGridRef(651409.903, 313177.270).toLatLon()
        // documentation example, 52°39′28.723″N, 001°42′57.787″E, computed with the OS guide's
        // Helmert parameters. Given to 0.001″ (≈ 3 cm); tolerance 0.1 m. The Helmert itself is
        // good to a few metres against OSTN15 (OS guide §6.6), and moves the point ~100 m here.
        let (wlon, wlat) = r.to_wgs84(651_409.903, 313_177.270).unwrap();
        let m_per_deg = 111_195.0;
        let dy = (wlat - dms(52.0, 39.0, 28.723)) * m_per_deg;
        let dx = (wlon - dms(1.0, 42.0, 57.787)) * m_per_deg * wlat.to_radians().cos();
        assert!(dx.hypot(dy) < 0.1, "{wlon} {wlat}: {dx} m, {dy} m");
        let shift =
            ((wlon - lon) * m_per_deg * lat.to_radians().cos()).hypot((wlat - lat) * m_per_deg);
        assert!((50.0..200.0).contains(&shift), "datum shift {shift} m");
    }

    // EPSG Guidance Note 7-2 (IOGP), Transverse Mercator example for OSGB 1936 / British
    // National Grid: E 577274.99, N 69740.50 ↔ 50°30′00″N, 0°30′00″E (OSGB36). Tolerance 1e-6°.
    #[test]
    fn crs_epsg_guidance_note_tm_example() {
        let r = Reprojector::new("EPSG:27700").unwrap();
        let (lon, lat) = r.to_geographic_own_datum(577_274.99, 69_740.50).unwrap();
        assert!((lat - 50.5).abs() < 1e-6, "{lat}");
        assert!((lon - 0.5).abs() < 1e-6, "{lon}");
    }

    // Snyder, "Map Projections — A Working Manual", USGS Professional Paper 1395 (1987),
    // numerical example p. 269: UTM on Clarke 1866, central meridian 75°W, k0 = 0.9996,
    // 40°30′N 73°30′W → x = 127 106.5 m, y = 4 484 124.4 m (before the 500 000 m false
    // easting: zone 18N E = 627 106.5 m). Given to 0.1 m; tolerance 2e-6° (≈ 0.2 m).
    #[test]
    fn crs_snyder_utm_example() {
        let r = Reprojector::new("+proj=utm +zone=18 +ellps=clrk66 +units=m +no_defs").unwrap();
        let (lon, lat) = r.to_geographic_own_datum(627_106.5, 4_484_124.4).unwrap();
        assert!((lat - 40.5).abs() < 2e-6, "{lat}");
        assert!((lon + 73.5).abs() < 2e-6, "{lon}");
        // No datum shift given and not a WGS84 ellipsoid: to_wgs84 refuses.
        let e = r.to_wgs84(627_106.5, 4_484_124.4).unwrap_err();
        assert!(e.message.contains("datum"), "{e}");
    }

    // The same Snyder point on WGS84 / UTM zone 18N (EPSG:32618): the Clarke 1866 and WGS84
    // ellipsoids differ, so the point lands elsewhere, but the central-meridian relation holds
    // on any ellipsoid (common practice (no source): UTM zone 18 has central meridian 75°W and
    // false easting 500 000 m, so E = 500 000 lies on 75°W).
    #[test]
    fn crs_utm_central_meridian_and_epsg_32633() {
        let r = Reprojector::new("EPSG:32618").unwrap();
        let (lon, _) = r.to_wgs84(500_000.0, 4_484_124.4).unwrap();
        assert!((lon + 75.0).abs() < 1e-9, "{lon}");
        let r = Reprojector::new("EPSG:32633").unwrap();
        let (lon, lat) = r.to_wgs84(500_000.0, 0.0).unwrap();
        assert!((lon - 15.0).abs() < 1e-9 && lat.abs() < 1e-9, "{lon} {lat}");
    }

    #[test]
    fn crs_refuses_geographic_and_bad_codes() {
        let e = Reprojector::new("EPSG:4326").unwrap_err();
        assert!(e.message.contains("geographic"), "{e}");
        let e = Reprojector::new("+proj=longlat +datum=WGS84 +no_defs").unwrap_err();
        assert!(e.message.contains("projected or local grid"), "{e}");
        assert!(Reprojector::new("EPSG:99999").is_err());
        assert!(Reprojector::new("27700").is_err());
        let r = Reprojector::new("EPSG:27700").unwrap();
        assert!(r.to_wgs84(f64::NAN, 0.0).is_err());
    }
}
