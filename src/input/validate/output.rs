//! `[output]` settings beyond units (map extent, contour interval, section line).

use crate::input::error::{InputError, Reporter};
use crate::input::model::OutputSettings;
use crate::input::schema::Output;
use crate::input::validate::shapes::check_positive;

/// Map extent, contour interval and section line, checked: positive lengths, a section of two
/// distinct finite points.
pub fn output_settings(
    rep: &Reporter,
    output: Option<&Output>,
) -> Result<OutputSettings, InputError> {
    let Some(o) = output else {
        return Ok(OutputSettings::default());
    };
    let map_extent = match &o.map_extent {
        Some(q) => Some(check_positive(
            rep,
            "output.map_extent",
            q,
            "distance the map reaches beyond the site, e.g. \"150 m\"",
        )?),
        None => None,
    };
    let contour_interval = match &o.contour_interval {
        Some(q) => Some(check_positive(
            rep,
            "output.contour_interval",
            q,
            "contour step, e.g. \"0.5 m\"",
        )?),
        None => None,
    };
    let section = match &o.section {
        None => None,
        Some(raw) => {
            let span = Some(raw.span());
            let v = raw.get_ref();
            let ok = v.len() == 2
                && v.iter()
                    .all(|p| p.len() == 2 && p.iter().all(|c| c.is_finite()));
            if !ok {
                return Err(rep.error(
                    "output.section",
                    span,
                    "a section line is two points [[x1, y1], [x2, y2]] in metres on the site grid",
                ));
            }
            let (a, b) = ([v[0][0], v[0][1]], [v[1][0], v[1][1]]);
            if (b[0] - a[0]).hypot(b[1] - a[1]) < 1.0 {
                return Err(rep.error(
                    "output.section",
                    span,
                    "the two points of the section line must be at least 1 m apart",
                ));
            }
            Some([a, b])
        }
    };
    Ok(OutputSettings {
        map_extent,
        contour_interval,
        section,
    })
}
