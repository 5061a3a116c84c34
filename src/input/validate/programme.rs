//! Validation of `[programme]`: the pumping programme in time (duration, output step, recovery,
//! map times, stages of the dig, extra hydrograph points), checked in SI. Well names in the
//! stages are checked against the layout when the programme is run (the layout is placed then).

use crate::input::error::{InputError, Reporter};
use crate::input::model::{Excavation, Programme, Stage, StageRate};
use crate::input::schema;
use crate::input::units::{parse, FlowKind};
use crate::input::validate::ranges::{name_problem, MAX_COORD};
use crate::physics::potential::Aquifer;

/// Seconds in a day.
const DAY: f64 = 86_400.0;
/// Longest programme accepted, s (20 years: a dewatering job, not a water supply).
pub const MAX_DURATION: f64 = 20.0 * 365.25 * DAY;
/// Most output times (duration + recovery over the output step).
pub const MAX_OUTPUT_TIMES: usize = 20_000;
/// Most drawdown maps.
pub const MAX_MAPS: usize = 12;
/// Default recovery followed after switch-off, s (30 days).
pub const DEFAULT_RECOVERY: f64 = 30.0 * DAY;

/// Days since 1970-01-01 of a YYYY-MM-DD date (proleptic Gregorian; H. Hinnant, "chrono-compatible
/// low-level date algorithms"), or `None` if it is not such a date.
pub fn days_from_date(text: &str) -> Option<i64> {
    let parts: Vec<&str> = text.trim().split('-').collect();
    if parts.len() != 3 || parts[0].len() != 4 {
        return None;
    }
    let y: i64 = parts[0].parse().ok()?;
    let m: i64 = parts[1].parse().ok()?;
    let d: i64 = parts[2].parse().ok()?;
    let leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
    let days_in = [
        31,
        if leap { 29 } else { 28 },
        31,
        30,
        31,
        30,
        31,
        31,
        30,
        31,
        30,
        31,
    ];
    if !(1..=12).contains(&m) || d < 1 || d > days_in[(m - 1) as usize] {
        return None;
    }
    let y2 = if m <= 2 { y - 1 } else { y };
    let era = y2.div_euclid(400);
    let yoe = y2 - era * 400;
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + d - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    Some(era * 146_097 + doe - 719_468)
}

/// The file name of the drawdown map at `time_s` seconds: `map_day_7.0.svg`, the day to 0.1.
/// Two map times that give the same name are refused.
pub fn map_file_name(time_s: f64) -> String {
    format!("map_day_{:.1}.svg", time_s / DAY)
}

fn duration(
    rep: &Reporter,
    field: &str,
    q: &crate::input::units::Duration,
    allow_zero: bool,
) -> Result<f64, InputError> {
    let v = q.si;
    let ok = v.is_finite() && (v > 0.0 || (allow_zero && v == 0.0)) && v <= MAX_DURATION;
    if ok {
        Ok(v)
    } else {
        Err(rep.error(
            field,
            q.span.clone(),
            format!(
                "{v} s is outside {} … 20 years (write it like \"120 days\" or \"6 weeks\")",
                if allow_zero { "0" } else { "more than 0" }
            ),
        ))
    }
}

/// The validated programme, or `None` when the file has no `[programme]`. Checks: the aquifer
/// has a storage coefficient (storativity, or specific yield when unconfined); duration 0 … 20
/// years; output step > 0 with at most [`MAX_OUTPUT_TIMES`] output times; map times within the
/// pumping and recovery; at least one stage, starts (or dates) strictly increasing from day 0
/// and before the end; each stage's formation below ground and above the aquifer base, its
/// excavation known, its rate "as designed" or a flow > 0.
pub fn programme(
    rep: &Reporter,
    raw: Option<&schema::Programme>,
    excavations: &[Excavation],
    aquifer: &Aquifer,
    ground: f64,
) -> Result<Option<Programme>, InputError> {
    let Some(p) = raw else { return Ok(None) };
    storage_given(rep, aquifer)?;
    let dur = duration(rep, "programme.duration", &p.duration, false)?;
    let step = match &p.output_step {
        Some(q) => duration(rep, "programme.output_step", q, false)?,
        None => DAY.min(dur / 10.0),
    };
    let recovery = match &p.recovery {
        Some(q) => duration(rep, "programme.recovery", q, true)?,
        None => DEFAULT_RECOVERY,
    };
    if ((dur + recovery) / step).ceil() as usize > MAX_OUTPUT_TIMES {
        return Err(rep.error(
            "programme.output_step",
            p.output_step.as_ref().and_then(|q| q.span.clone()),
            format!(
                "{:.0} output times: make the step longer (at most {MAX_OUTPUT_TIMES} times over duration + recovery; usual \"1 day\")",
                (dur + recovery) / step
            ),
        ));
    }
    let map_times = map_times(rep, p, dur + recovery)?;
    let start_day = match &p.start_date {
        Some(d) => Some(days_from_date(d).ok_or_else(|| {
            rep.error(
                "programme.start_date",
                None,
                format!("\"{d}\" is not a date written YYYY-MM-DD (e.g. \"2027-03-01\")"),
            )
        })?),
        None => None,
    };
    if p.stage.is_empty() {
        return Err(rep.error(
            "programme.stage",
            None,
            "at least one [[programme.stage]] is needed (name, start or date, formation_level)",
        ));
    }
    let site = StageSite {
        rep,
        excavations,
        aquifer,
        ground,
        start_day,
        duration: dur,
    };
    let mut stages: Vec<Stage> = Vec::new();
    for (i, s) in p.stage.iter().enumerate() {
        let next = stage(&site, i, s, stages.last())?;
        stages.push(next);
    }
    Ok(Some(Programme {
        start_day,
        duration: dur,
        output_step: step,
        recovery,
        map_times,
        stages,
        points: points(rep, p)?,
    }))
}

/// The programme works in time, so the aquifer must give its storage coefficient (0 < S < 1).
fn storage_given(rep: &Reporter, aquifer: &Aquifer) -> Result<(), InputError> {
    if aquifer.storage().is_none_or(|s| !(s > 0.0 && s < 1.0)) {
        let field = match aquifer.kind {
            crate::physics::potential::AquiferKind::Unconfined => "aquifer.specific_yield",
            _ => "aquifer.storativity",
        };
        return Err(rep.error(
            field,
            None,
            "the programme works in time and needs the storage coefficient: specific_yield for an unconfined aquifer (usual 0.05 … 0.30), storativity when confined or leaky (usual 1e-5 … 1e-3), between 0 and 1",
        ));
    }
    Ok(())
}

/// Map times: at most `MAX_MAPS`, each within the programme plus recovery (`end`, s), and no two
/// on the same map file.
fn map_times(rep: &Reporter, p: &schema::Programme, end: f64) -> Result<Vec<f64>, InputError> {
    if p.map_times.len() > MAX_MAPS {
        return Err(rep.error(
            "programme.map_times",
            None,
            format!("{} map times: at most {MAX_MAPS}", p.map_times.len()),
        ));
    }
    let mut map_times = Vec::new();
    for (i, q) in p.map_times.iter().enumerate() {
        let t = duration(rep, &format!("programme.map_times[{}]", i + 1), q, false)?;
        if t > end {
            return Err(rep.error(
                format!("programme.map_times[{}]", i + 1),
                q.span.clone(),
                format!(
                    "{:.1} days is after the end of the recovery ({:.1} days after day 0)",
                    t / DAY,
                    end / DAY
                ),
            ));
        }
        let file = map_file_name(t);
        if let Some(j) = map_times.iter().position(|&u| map_file_name(u) == file) {
            return Err(rep.error(
                format!("programme.map_times[{}]", i + 1),
                q.span.clone(),
                format!(
                    "{:.3} days falls on the same map as map_times[{}] ({:.3} days): both would be {file}; give map times at least 0.1 day apart",
                    t / DAY,
                    j + 1,
                    map_times[j] / DAY
                ),
            ));
        }
        map_times.push(t);
    }
    Ok(map_times)
}

/// What every stage is checked against.
struct StageSite<'a> {
    rep: &'a Reporter<'a>,
    excavations: &'a [Excavation],
    aquifer: &'a Aquifer,
    ground: f64,
    /// Day number of `programme.start_date`, when given.
    start_day: Option<i64>,
    /// Programme duration (s).
    duration: f64,
}

/// One `[[programme.stage]]` (the `i`-th, 0-based): name, start in time order before the end,
/// excavation known, formation below ground and above the base, rate, wells.
fn stage(
    site: &StageSite,
    i: usize,
    s: &schema::Stage,
    prev: Option<&Stage>,
) -> Result<Stage, InputError> {
    let (rep, ground, aquifer, dur) = (site.rep, site.ground, site.aquifer, site.duration);
    let f = format!("programme.stage[{}]", i + 1);
    if s.name.trim().is_empty() {
        return Err(rep.error(format!("{f}.name"), None, "must not be empty"));
    }
    if let Some(m) = name_problem(&s.name) {
        return Err(rep.error(format!("{f}.name"), None, m));
    }
    let start = stage_start(site, i, s)?;
    if let Some(prev) = prev {
        if start <= prev.start {
            return Err(rep.error(
                format!("{f}.start"),
                s.start.as_ref().and_then(|q| q.span.clone()),
                format!(
                    "day {:.2} is not after the stage before (day {:.2}): stages are in time order",
                    start / DAY,
                    prev.start / DAY
                ),
            ));
        }
    }
    if start >= dur {
        return Err(rep.error(
            format!("{f}.start"),
            s.start.as_ref().and_then(|q| q.span.clone()),
            format!(
                "day {:.2} is not before the end of the programme (duration {:.2} days)",
                start / DAY,
                dur / DAY
            ),
        ));
    }
    let excavation = match &s.excavation {
        None => 0,
        Some(name) => site
            .excavations
            .iter()
            .position(|e| &e.name == name)
            .ok_or_else(|| {
                rep.error(
                    format!("{f}.excavation"),
                    None,
                    format!(
                        "no excavation named \"{name}\"; valid: {}",
                        site.excavations
                            .iter()
                            .map(|e| format!("\"{}\"", e.name))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                )
            })?,
    };
    let fl = s.formation_level.si;
    if !(fl.is_finite() && fl < ground && fl > aquifer.base_level) {
        return Err(rep.error(
            format!("{f}.formation_level"),
            s.formation_level.span.clone(),
            format!(
                "{fl} m must lie below ground ({ground} m) and above the aquifer base ({} m)",
                aquifer.base_level
            ),
        ));
    }
    if let Some(w) = &s.wells {
        if w.is_empty() {
            return Err(rep.error(
                format!("{f}.wells"),
                None,
                "an empty list: name the wells that run, or leave wells out for every well",
            ));
        }
    }
    Ok(Stage {
        name: s.name.trim().to_string(),
        start,
        excavation,
        formation_level: fl,
        wells: s.wells.clone(),
        rate: stage_rate(rep, &f, s)?,
    })
}

/// A stage's start (s after day 0): `start` as a duration, or `date` counted from
/// `programme.start_date`; the first stage may give neither (day 0).
fn stage_start(site: &StageSite, i: usize, s: &schema::Stage) -> Result<f64, InputError> {
    let rep = site.rep;
    let f = format!("programme.stage[{}]", i + 1);
    match (&s.start, &s.date) {
        (Some(q), None) => duration(rep, &format!("{f}.start"), q, true),
        (None, Some(d)) => {
            let day = days_from_date(d).ok_or_else(|| {
                rep.error(
                    format!("{f}.date"),
                    None,
                    format!("\"{d}\" is not a date written YYYY-MM-DD"),
                )
            })?;
            let Some(d0) = site.start_day else {
                return Err(rep.error(
                    format!("{f}.date"),
                    None,
                    "a stage given by date needs programme.start_date (day 0)",
                ));
            };
            if day < d0 {
                return Err(rep.error(
                    format!("{f}.date"),
                    None,
                    format!("{d} is before programme.start_date"),
                ));
            }
            Ok((day - d0) as f64 * DAY)
        }
        (None, None) if i == 0 => Ok(0.0),
        _ => Err(rep.error(
            format!("{f}.start"),
            None,
            "give either start (\"21 days\") or date (\"2027-03-22\"), not both or neither",
        )),
    }
}

/// A stage's rate: "as designed" (or absent), or a flow per well greater than zero.
fn stage_rate(rep: &Reporter, f: &str, s: &schema::Stage) -> Result<StageRate, InputError> {
    match s.rate.as_deref().map(str::trim) {
        None | Some("as designed") => Ok(StageRate::AsDesigned),
        Some(text) => {
            let q = parse::<FlowKind>(text).map_err(|e| {
                rep.error(
                    format!("{f}.rate"),
                    None,
                    format!("{e}; or write \"as designed\""),
                )
            })?;
            if q.is_nan() || q <= 0.0 {
                return Err(rep.error(
                    format!("{f}.rate"),
                    None,
                    "must be greater than zero, or \"as designed\"",
                ));
            }
            Ok(StageRate::Each(q))
        }
    }
}

/// Named output points: finite site-grid coordinates within range, names by the one name rule.
fn points(rep: &Reporter, p: &schema::Programme) -> Result<Vec<(String, [f64; 2])>, InputError> {
    let mut points = Vec::new();
    for (i, q) in p.point.iter().enumerate() {
        if !(q.x.is_finite() && q.y.is_finite()) || q.x.abs() > MAX_COORD || q.y.abs() > MAX_COORD {
            return Err(rep.error(
                format!("programme.point[{}].x", i + 1),
                None,
                format!("x and y must be finite numbers in metres within ±{MAX_COORD:e} m of the grid origin (the site grid's coordinates, as the outlines)"),
            ));
        }
        if let Some(m) = name_problem(&q.name) {
            return Err(rep.error(format!("programme.point[{}].name", i + 1), None, m));
        }
        points.push((q.name.clone(), [q.x, q.y]));
    }
    Ok(points)
}

#[cfg(test)]
mod tests {
    use super::days_from_date;

    #[test]
    fn dates() {
        // 1970-01-01 is day 0; 2000-03-01 is day 11 017; 2024-02-29 is day 19 782 (the same
        // values as report::map::date's test of the inverse; Hinnant's algorithm).
        assert_eq!(days_from_date("1970-01-01"), Some(0));
        assert_eq!(days_from_date("2000-03-01"), Some(11_017));
        assert_eq!(days_from_date("2024-02-29"), Some(19_782));
        assert_eq!(days_from_date("2023-02-29"), None);
        assert_eq!(days_from_date("2023-13-01"), None);
    }
}
