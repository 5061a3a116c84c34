//! The site's coordinate system `[site] crs`, checked where the site is: the definition is
//! usable (a known EPSG code or a proj string that parses, projected, in metres, with parameters
//! a real grid has), converts the site to WGS84 and back to the same point, and keeps grid
//! distances close to ground distances there.
//!
//! The sums treat one unit of the grid as one metre on the ground. A projection's point scale
//! factor k says how far that holds: Web Mercator at 52° N has k = 1/cos 52° = 1.62, so a 30 m
//! edge drawn on it is 18.5 m on the ground (Snyder, *Map Projections — A Working Manual*, USGS
//! PP 1395, 1987, eq. 7-3: k = sec φ for the spherical Mercator). A grid meant for survey keeps k
//! within about 1 ± 0.0004 (UTM 0.9996 … 1.0004 inside its zone).

use crate::input::error::{InputError, Reporter};
use crate::input::import::crs::Reprojector;
use crate::input::model::Excavation;

/// |k − 1| above which the grid is refused: grid distances would be more than 1 % off the
/// ground, which moves wells and sizes the dig wrongly. Common practice (no source).
pub const MAX_SCALE_ERROR: f64 = 0.01;
/// |k − 1| above which a warning names the scale factor: 1 mm per metre, the order of a
/// set-out tolerance over a site. Common practice (no source).
pub const WARN_SCALE_ERROR: f64 = 0.001;
/// Largest round-trip error at the site, m (grid → WGS84 → grid): a consistent definition comes
/// back within about a millimetre (a 7-parameter datum shift is undone to first order), a
/// broken one metres to kilometres off. Common practice (no source).
pub const MAX_ROUND_TRIP_M: f64 = 0.05;
/// Site coordinates within this distance of the grid origin, m, with a false origin at least
/// [`FAR_FALSE_ORIGIN_M`] away, look like local coordinates given a national grid.
const NEAR_ORIGIN_M: f64 = 10_000.0;
/// See [`NEAR_ORIGIN_M`].
const FAR_FALSE_ORIGIN_M: f64 = 100_000.0;

/// The checked site CRS (as given, trimmed) and the warnings to print with every output, or
/// `None` when the design file names no CRS.
pub fn site_crs(
    rep: &Reporter,
    crs: Option<&str>,
    excavations: &[Excavation],
) -> Result<(Option<String>, Vec<String>), InputError> {
    let Some(c) = crs else {
        return Ok((None, Vec::new()));
    };
    let refuse = |message: String| {
        rep.error(
            "site.crs",
            None,
            format!(
                "{message} ([site] crs takes an EPSG code of a projected grid in metres, \
                 \"EPSG:27700\", \"EPSG:32633\", or a proj string, \"+proj=utm +zone=33 \
                 +datum=WGS84 +units=m\")"
            ),
        )
    };
    let r = Reprojector::new(c).map_err(|e| refuse(e.message))?;
    let Some((x, y)) = site_centre(excavations) else {
        return Ok((Some(c.trim().to_string()), Vec::new()));
    };
    let at = format!("at the site centre ({x:.1}, {y:.1})");
    let (lon, lat) = r
        .to_wgs84(x, y)
        .map_err(|e| refuse(format!("{at}: {}", e.message)))?;
    let trip = r
        .round_trip_error(x, y)
        .map_err(|e| refuse(format!("{at}: {}", e.message)))?;
    if trip > MAX_ROUND_TRIP_M {
        return Err(refuse(format!(
            "{at} the definition does not convert back to the same point (WGS84 and back moves \
             it {trip:.3} m); check its parameters (+k, +towgs84, +lat_0 …)"
        )));
    }
    let (ke, kn) = r.point_scale_factor(x, y).map_err(|e| refuse(e.message))?;
    let k = if (ke - 1.0).abs() >= (kn - 1.0).abs() {
        ke
    } else {
        kn
    };
    if (k - 1.0).abs() > MAX_SCALE_ERROR {
        return Err(refuse(format!(
            "{at} ({lon:.5}°, {lat:.5}°) the grid's point scale factor is {k:.4}: one metre of \
             the grid is {:.3} m on the ground, and drydig would size the dig and place the \
             wells wrongly; draw the site on a grid meant for survey, e.g. {}",
            1.0 / k,
            utm_hint(lon, lat)
        )));
    }
    let mut warnings = Vec::new();
    if (k - 1.0).abs() > WARN_SCALE_ERROR {
        warnings.push(format!(
            "site crs {}: the point scale factor at the site is {k:.5} (grid distances are \
             {:+.2} mm per metre off the ground); drydig takes grid distances as ground \
             distances",
            c.trim(),
            (k - 1.0) * 1e3
        ));
    }
    let (x0, y0) = r.false_origin();
    if x.abs() < NEAR_ORIGIN_M
        && y.abs() < NEAR_ORIGIN_M
        && x0.abs().max(y0.abs()) >= FAR_FALSE_ORIGIN_M
    {
        warnings.push(format!(
            "site crs {}: the site coordinates ({x:.0}, {y:.0}) lie within {} km of the grid's \
             origin, far from its false origin ({x0:.0}, {y0:.0}), at {lon:.4}°, {lat:.4}° — they \
             look like local site coordinates; give the coordinates in that grid or remove \
             [site] crs",
            c.trim(),
            NEAR_ORIGIN_M / 1e3
        ));
    }
    Ok((Some(c.trim().to_string()), warnings))
}

/// The centre of the box around every excavation outline, m.
fn site_centre(excavations: &[Excavation]) -> Option<(f64, f64)> {
    use geo::BoundingRect;
    let mut rects = excavations.iter().filter_map(|e| e.outline.bounding_rect());
    let first = rects.next()?;
    let (mut lo, mut hi) = (first.min(), first.max());
    for r in rects {
        lo.x = lo.x.min(r.min().x);
        lo.y = lo.y.min(r.min().y);
        hi.x = hi.x.max(r.max().x);
        hi.y = hi.y.max(r.max().y);
    }
    Some((0.5 * (lo.x + hi.x), 0.5 * (lo.y + hi.y)))
}

/// The WGS84 UTM zone of a longitude/latitude, as an EPSG code (326zz north, 327zz south; zones
/// of 6° from 180° W, common practice (no source)).
fn utm_hint(lon: f64, lat: f64) -> String {
    let zone = (((lon + 180.0) / 6.0).floor() as i64).clamp(0, 59) + 1;
    let code = if lat >= 0.0 { 32600 } else { 32700 } + zone;
    format!("UTM zone {zone} (EPSG:{code}) or the national grid")
}
