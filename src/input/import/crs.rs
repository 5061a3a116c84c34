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
                .ok_or_else(|| err(unknown_code(code)))?
                .proj4
                .to_string()
        };
        check_parameters(&definition).map_err(&err)?;
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
        let to_meter = source.to_meter();
        if (to_meter - 1.0).abs() > 1e-12 {
            return Err(err(not_metres(&definition, source.units(), to_meter)));
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

    /// Grid coordinates (m) of a WGS84 longitude/latitude (degrees): the forward conversion,
    /// the inverse of [`Reprojector::to_wgs84`].
    pub fn from_wgs84(&self, lon: f64, lat: f64) -> Result<(f64, f64), CrsError> {
        let bad = || {
            self.error(format!(
                "the point ({lon}°, {lat}°) does not convert to the grid"
            ))
        };
        if !lon.is_finite() || !lat.is_finite() || lat.abs() > 90.0 {
            return Err(bad());
        }
        let mut p = (lon.to_radians(), lat.to_radians(), 0.0);
        proj4rs::transform::transform(&self.wgs84, &self.source, &mut p).map_err(|_| bad())?;
        if p.0.is_finite() && p.1.is_finite() {
            Ok((p.0, p.1))
        } else {
            Err(bad())
        }
    }

    /// How far, m, the grid point (x, y) lands from itself after going to WGS84 and back: a
    /// consistent definition gives well under a millimetre.
    pub fn round_trip_error(&self, x: f64, y: f64) -> Result<f64, CrsError> {
        let (lon, lat) = self.to_wgs84(x, y)?;
        let (bx, by) = self.from_wgs84(lon, lat)?;
        Ok((bx - x).hypot(by - y))
    }

    /// The point scale factor at the grid point (x, y): grid distance ÷ distance on the CRS's
    /// own ellipsoid, east–west and north–south (equal for a conformal projection).
    ///
    /// Found by converting points 5 m either side to latitude/longitude and measuring the
    /// ellipsoid distance between them with the radii of curvature in the meridian,
    /// M = a(1 − e²)/(1 − e² sin²φ)^{3/2}, and in the prime vertical, N = a/(1 − e² sin²φ)^{1/2}:
    /// ds² = (M dφ)² + (N cos φ dλ)² (Snyder, *Map Projections — A Working Manual*, USGS
    /// Professional Paper 1395, 1987, eqs. 4-18 and 4-20).
    pub fn point_scale_factor(&self, x: f64, y: f64) -> Result<(f64, f64), CrsError> {
        const H: f64 = 5.0;
        let (a, b) = self.ellipsoid;
        let e2 = 1.0 - (b * b) / (a * a);
        let distance = |p: (f64, f64), q: (f64, f64)| {
            let phi = 0.5 * (p.1 + q.1).to_radians();
            let w = 1.0 - e2 * phi.sin().powi(2);
            let m = a * (1.0 - e2) / w.powf(1.5);
            let n = a / w.sqrt();
            let dphi = (q.1 - p.1).to_radians();
            let dlam = (q.0 - p.0).to_radians();
            (m * dphi).hypot(n * phi.cos() * dlam)
        };
        let g = |x: f64, y: f64| self.to_geographic_own_datum(x, y);
        let east = 2.0 * H / distance(g(x - H, y)?, g(x + H, y)?);
        let north = 2.0 * H / distance(g(x, y - H)?, g(x, y + H)?);
        if east.is_finite() && north.is_finite() && east > 0.0 && north > 0.0 {
            Ok((east, north))
        } else {
            Err(self.error(format!(
                "the scale of the grid at ({x}, {y}) cannot be found: the point is outside the \
                 area this CRS converts"
            )))
        }
    }

    /// The grid's false easting and northing, m.
    pub fn false_origin(&self) -> (f64, f64) {
        (self.source.false_easting(), self.source.false_northing())
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

/// Largest datum-shift translation accepted in `+towgs84`, m. Common practice (no source): the
/// published shifts of classical datums to WGS84 are at most about a kilometre (Tokyo datum
/// ≈ 0.9 km); 5 km leaves room and still refuses a typing slip of a few digits.
const MAX_SHIFT_M: f64 = 5_000.0;
/// Largest `+towgs84` rotation accepted, arc-seconds (published rotations are under 10″).
const MAX_ROTATION_ARCSEC: f64 = 60.0;
/// Largest `+towgs84` scale change accepted, ppm (published ones are under 30 ppm).
const MAX_SCALE_PPM: f64 = 500.0;

/// The message for an EPSG code `crs-definitions` does not hold, with the proj string of the
/// current Australian grids (GDA2020 / MGA zones 46–59 are EPSG:7846–7859: UTM south on GRS80,
/// GDA2020 taken equal to WGS84 at map accuracy).
fn unknown_code(code: u16) -> String {
    let mut m = format!(
        "EPSG:{code} is not among the EPSG codes drydig knows (the projected and geographic \
         codes with a proj4 definition in crs-definitions {}); give the grid's proj string \
         instead (epsg.io lists it under \"PROJ.4\")",
        CRS_DEFINITIONS_VERSION
    );
    if (7846..=7859).contains(&code) {
        m.push_str(&format!(
            ", for GDA2020 / MGA zone {}: \"+proj=utm +zone={} +south +ellps=GRS80 \
             +towgs84=0,0,0,0,0,0,0 +units=m +no_defs\"",
            code - 7800,
            code - 7800
        ));
    }
    m
}

/// The version of `crs-definitions` named in messages (Cargo.lock).
const CRS_DEFINITIONS_VERSION: &str = "0.3";

/// The message for a grid whose unit is not the metre, with the same grid in metres (in a proj
/// string `+x_0`/`+y_0` are metres whatever `+units` says, so only the unit changes).
fn not_metres(definition: &str, units: &str, to_meter: f64) -> String {
    let metric: Vec<&str> = definition
        .split_whitespace()
        .filter(|p| !p.starts_with("+units=") && !p.starts_with("+to_meter="))
        .collect();
    format!(
        "its coordinates are in {} (1 unit = {to_meter} m), drydig takes site coordinates in \
         metres; convert the drawing to metres and give the same grid in metres: \"{} \
         +units=m\"",
        if units.is_empty() {
            "a unit other than the metre"
        } else {
            units
        },
        metric.join(" ").replace(" +no_defs", "")
    )
}

/// The numeric value of `+key=…` in a proj string, if given and a plain number.
fn parameter(definition: &str, key: &str) -> Option<Result<Vec<f64>, String>> {
    let value = definition
        .split_whitespace()
        .find_map(|p| p.strip_prefix('+')?.strip_prefix(key)?.strip_prefix('='))?;
    Some(
        value
            .split(',')
            .map(|v| {
                v.trim()
                    .parse::<f64>()
                    .ok()
                    .filter(|x| x.is_finite())
                    .ok_or_else(|| format!("+{key}={value} is not a list of finite numbers"))
            })
            .collect(),
    )
}

/// Projection parameters a real grid can have: scale factor at the origin 0.5 … 2, latitudes
/// within ±90°, longitudes within ±360°, false easting/northing within ±10⁸ m, and a
/// `+towgs84` of 3 or 7 finite values within [`MAX_SHIFT_M`], [`MAX_ROTATION_ARCSEC`] and
/// [`MAX_SCALE_PPM`]. proj4rs accepts `+k=0`, `+k=-1` and `+lat_0=95` and then converts
/// nothing or nonsense.
fn check_parameters(definition: &str) -> Result<(), String> {
    let one = |key: &str, ok: &dyn Fn(f64) -> bool, valid: &str| -> Result<(), String> {
        match parameter(definition, key) {
            None => Ok(()),
            // Degrees–minutes–seconds forms (52d30'N) are left to proj4rs.
            Some(Err(_)) if key.starts_with("lat") || key.starts_with("lon") => Ok(()),
            Some(Err(e)) => Err(e),
            Some(Ok(v)) if v.len() == 1 && ok(v[0]) => Ok(()),
            Some(Ok(v)) => Err(format!(
                "+{key}={} is not a parameter a real grid has; valid: {valid}",
                v.iter()
                    .map(|x| x.to_string())
                    .collect::<Vec<_>>()
                    .join(",")
            )),
        }
    };
    for key in ["k", "k_0"] {
        one(
            key,
            &|k| (0.5..=2.0).contains(&k),
            "a scale factor at the origin between 0.5 and 2 (UTM 0.9996, most national grids 0.9996 … 1)",
        )?;
    }
    for key in ["lat_0", "lat_1", "lat_2", "lat_ts"] {
        one(key, &|v| v.abs() <= 90.0, "a latitude within ±90°")?;
    }
    for key in ["lon_0", "lonc"] {
        one(key, &|v| v.abs() <= 360.0, "a longitude within ±360°")?;
    }
    for key in ["x_0", "y_0"] {
        one(
            key,
            &|v| v.abs() <= 1e8,
            "a false easting/northing within ±10⁸ m",
        )?;
    }
    if let Some(v) = parameter(definition, "towgs84") {
        let v = v?;
        let ok = match v.len() {
            3 => v.iter().all(|t| t.abs() <= MAX_SHIFT_M),
            7 => {
                v[..3].iter().all(|t| t.abs() <= MAX_SHIFT_M)
                    && v[3..6].iter().all(|r| r.abs() <= MAX_ROTATION_ARCSEC)
                    && v[6].abs() <= MAX_SCALE_PPM
            }
            _ => false,
        };
        if !ok {
            return Err(format!(
                "+towgs84 ({} values) is not a datum shift a real datum has; valid: 3 shifts (m, each \
                 within ±{MAX_SHIFT_M} m) or 7 values (3 shifts, 3 rotations within \
                 ±{MAX_ROTATION_ARCSEC}″, a scale change within ±{MAX_SCALE_PPM} ppm), as \
                 the national mapping agency publishes them",
                v.len()
            ));
        }
    }
    Ok(())
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

    /// Rows of tests/reference/crs_scale_factors.csv (scripts/reference_crs.py, pyproj): grid,
    /// definition, x, y, lon, lat, meridional and parallel scale.
    fn pyproj_rows() -> Vec<(String, String, [f64; 6])> {
        let path = concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/tests/reference/crs_scale_factors.csv"
        );
        let mut r = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .from_path(path)
            .unwrap();
        r.records()
            .map(|rec| {
                let rec = rec.unwrap();
                let n = |i: usize| rec[i].parse::<f64>().unwrap();
                (
                    rec[0].to_string(),
                    rec[1].to_string(),
                    [n(2), n(3), n(4), n(5), n(6), n(7)],
                )
            })
            .collect()
    }

    // pyproj (PROJ) on seven grids: WGS84 position within 1e-8° (about 1 mm) through the same
    // +towgs84 Helmert, and the point scale factor within 1e-7 (0.1 mm per km).
    #[test]
    fn crs_scale_factor_and_position_match_pyproj() {
        let rows = pyproj_rows();
        assert!(rows.len() >= 14, "{}", rows.len());
        for (grid, def, [x, y, lon, lat, km, kp]) in rows {
            let r = Reprojector::new(&def).unwrap();
            let (glon, glat) = r.to_wgs84(x, y).unwrap();
            assert!(
                (glon - lon).abs() < 1e-8 && (glat - lat).abs() < 1e-8,
                "{grid} ({x}, {y}): {glon} {glat} vs {lon} {lat}"
            );
            let (ke, kn) = r.point_scale_factor(x, y).unwrap();
            assert!(
                (ke - kp).abs() < 1e-7 && (kn - km).abs() < 1e-7,
                "{grid} ({x}, {y}): k {ke} {kn} vs {kp} {km}"
            );
            // proj4rs undoes a 7-parameter Helmert with the signs flipped, which is exact to
            // first order only: about 1 mm for OSGB36 (20 ppm scale); 0 without a shift.
            let trip = r.round_trip_error(x, y).unwrap();
            assert!(trip < 0.005, "{grid}: round trip {trip} m");
        }
    }

    // Web Mercator at 52° N: k = sec φ = 1.6243 (Snyder 1987, eq. 7-3); the 30 m edge
    // drawn on it is 18.47 m on the ground.
    #[test]
    fn crs_web_mercator_scale_is_sec_latitude() {
        let r = Reprojector::new("EPSG:3857").unwrap();
        let (x, y) = r.from_wgs84(9.0, 52.0).unwrap();
        let (ke, kn) = r.point_scale_factor(x, y).unwrap();
        let sec = 1.0 / 52f64.to_radians().cos();
        assert!(
            (ke - sec).abs() < 1e-6 && (kn - sec).abs() < 1e-6,
            "{ke} {kn} {sec}"
        );
        assert!((30.0 / ke - 18.47).abs() < 0.01);
    }

    #[test]
    fn crs_refuses_feet_bad_parameters_and_says_what_is_missing() {
        // EPSG:2263 is in US survey feet (EPSG registry: unit 9003, 0.3048006096 m).
        let e = Reprojector::new("EPSG:2263").unwrap_err();
        assert!(
            e.message.contains("us-ft") && e.message.contains("+units=m"),
            "{e}"
        );
        assert!(e.message.contains("0.3048006096"), "{e}");
        for (def, hint) in [
            ("+proj=tmerc +k=0 +ellps=WGS84", "between 0.5 and 2"),
            ("+proj=tmerc +k=-1 +ellps=WGS84", "between 0.5 and 2"),
            ("+proj=tmerc +lat_0=95 +ellps=WGS84", "within ±90°"),
            (
                "+proj=tmerc +ellps=airy +towgs84=1e9,0,0",
                "not a datum shift",
            ),
            ("+proj=tmerc +ellps=airy +towgs84=1,2", "not a datum shift"),
            ("+proj=tmerc +ellps=airy +towgs84=1,2,nan", "finite numbers"),
        ] {
            let e = Reprojector::new(def).unwrap_err();
            assert!(e.message.contains(hint), "{def}: {e}");
        }
        // GDA2020 / MGA zone 56 (EPSG:7856) is not in crs-definitions; the message gives its proj
        // string (EPSG registry: UTM zone 56 south on GRS1980).
        let e = Reprojector::new("EPSG:7856").unwrap_err();
        assert!(
            e.message.contains("+proj=utm +zone=56 +south +ellps=GRS80"),
            "{e}"
        );
        let hint = e.message.split('"').nth(3).unwrap().to_string();
        assert!(hint.starts_with("+proj=utm"), "{hint}");
        // The proj string offered works: EPSG:28356 (GDA94 / MGA 56) has the same definition.
        let r = Reprojector::new(&hint).unwrap();
        let (lon, _) = r.to_wgs84(500_000.0, 6_250_000.0).unwrap();
        assert!((lon - 153.0).abs() < 1e-9, "{lon}");
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
