//! Validation of `[bid]`: the bid's durations and rules of thumb, each within a range a site
//! would recognise, else its labelled default ([`crate::input::model_bid`]).

use crate::input::error::{InputError, Reporter};
use crate::input::model_bid::BidSettings;
use crate::input::schema::BidTimes;
use crate::input::units::{Kind, Quantity};

const DAY: f64 = 86_400.0;

/// A quantity of `[bid]` within `lo … hi` (SI), else an error naming `bid.<field>` and the range
/// in words.
fn within<K: Kind>(
    rep: &Reporter,
    field: &str,
    q: Option<&Quantity<K>>,
    default: f64,
    (lo, hi): (f64, f64),
    range: &str,
) -> Result<f64, InputError> {
    let Some(q) = q else { return Ok(default) };
    if q.si.is_finite() && q.si >= lo && q.si <= hi {
        Ok(q.si)
    } else {
        Err(rep.error(
            format!("bid.{field}"),
            q.span.clone(),
            format!("must be {range}"),
        ))
    }
}

/// A plain number of `[bid]` within `lo … hi`, else an error naming `bid.<field>`.
fn number(
    rep: &Reporter,
    field: &str,
    v: Option<f64>,
    default: f64,
    (lo, hi): (f64, f64),
) -> Result<f64, InputError> {
    let Some(v) = v else { return Ok(default) };
    if v.is_finite() && v >= lo && v <= hi {
        Ok(v)
    } else {
        Err(rep.error(
            format!("bid.{field}"),
            None,
            format!("{v} must be a number from {lo} to {hi}"),
        ))
    }
}

/// The bid settings of the file, with their defaults for deep wells or wellpoints.
pub fn bid_settings(
    rep: &Reporter,
    raw: Option<&BidTimes>,
    wellpoints: bool,
) -> Result<BidSettings, InputError> {
    let d = BidSettings::defaults(wellpoints);
    let Some(b) = raw else { return Ok(d) };
    let pumping_duration_s = match &b.pumping_duration {
        Some(q) => Some(within(
            rep,
            "pumping_duration",
            Some(q),
            0.0,
            (DAY, 5.0 * 365.0 * DAY),
            "from 1 day to 5 years, e.g. \"12 weeks\"",
        )?),
        None => None,
    };
    Ok(BidSettings {
        pumping_duration_s,
        mobilise_s: within(
            rep,
            "mobilise",
            b.mobilise.as_ref(),
            d.mobilise_s,
            (0.0, 90.0 * DAY),
            "from 0 to 90 days, e.g. \"2 days\"",
        )?,
        wells_per_day: number(
            rep,
            "wells_per_day",
            b.wells_per_day,
            d.wells_per_day,
            (0.05, 50.0),
        )?,
        header_per_day_m: within(
            rep,
            "header_per_day",
            b.header_per_day.as_ref(),
            d.header_per_day_m,
            (1.0, 5000.0),
            "from 1 m to 5 km, e.g. \"50 m\"",
        )?,
        removal_wells_per_day: number(
            rep,
            "removal_wells_per_day",
            b.removal_wells_per_day,
            d.removal_wells_per_day,
            (0.05, 100.0),
        )?,
        removal_header_per_day_m: within(
            rep,
            "removal_header_per_day",
            b.removal_header_per_day.as_ref(),
            d.removal_header_per_day_m,
            (1.0, 5000.0),
            "from 1 m to 5 km, e.g. \"150 m\"",
        )?,
        retention_s: within(
            rep,
            "retention_time",
            b.retention_time.as_ref(),
            d.retention_s,
            (60.0, 86_400.0),
            "from 1 min to 1 day, e.g. \"15 min\"",
        )?,
        generators: number(
            rep,
            "generators",
            b.generators.map(f64::from),
            f64::from(d.generators),
            (0.0, 50.0),
        )? as u32,
        piezometer_spacing_m: within(
            rep,
            "piezometer_spacing",
            b.piezometer_spacing.as_ref(),
            d.piezometer_spacing_m,
            (5.0, 1000.0),
            "from 5 m to 1 km, e.g. \"50 m\"",
        )?,
    })
}
