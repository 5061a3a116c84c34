//! `drydig programme`: the terminal summary (days to dig each stage, volumes, time to flood,
//! recovery) and `programme.csv` (times, flows, volumes, levels at every hydrograph place).

use super::{thousands, wrap, CAUTION};
use crate::input::model::Model;
use crate::transient::answers::{ProgrammeAnswers, SeriesKind};
use crate::transient::programme::DAY;

fn days(t: f64) -> String {
    format!("{:.1}", t / DAY)
}

fn duration_words(t: f64) -> String {
    if t < 3600.0 {
        format!("{:.0} min", t / 60.0)
    } else if t < 2.0 * DAY {
        format!("{:.1} h", t / 3600.0)
    } else {
        format!("{:.1} days", t / DAY)
    }
}

/// Calendar date of a time (s after day 0) when the programme has a start date.
fn date_of(model: &Model, t: f64) -> String {
    let Some(d0) = model.programme.as_ref().and_then(|p| p.start_day) else {
        return String::new();
    };
    let z = d0 + (t / DAY).floor() as i64 + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = doy - (153 * mp + 2) / 5 + 1;
    let m = if mp < 10 { mp + 3 } else { mp - 9 };
    let y = yoe + era * 400 + i64::from(m <= 2);
    format!(" ({y:04}-{m:02}-{d:02})")
}

/// The terminal summary.
pub fn to_text(model: &Model, a: &ProgrammeAnswers) -> String {
    let mut s = format!(
        "PROGRAMME  {}\n  pumping {} days, then {} days of recovery followed; {} output times\n\n",
        model.name,
        days(a.duration),
        days(a.times.last().copied().unwrap_or(a.duration) - a.duration),
        a.times.len()
    );
    s.push_str("  stage                        planned day   can dig from day   target m   flow L/s   volume m³   \n");
    for st in &a.stages {
        let earliest = match st.earliest {
            Some(t) => format!("{}{}", days(t), date_of(model, t)),
            None => "not within the programme".into(),
        };
        s.push_str(&format!(
            "  {:<28} {:>11} {:>18} {:>10.2} {:>10.1} {:>11}   {}\n",
            st.name,
            days(st.planned_start),
            earliest,
            st.target_level,
            st.flow * 1e3,
            thousands(st.volume, 0),
            if st.ready() {
                "ready".to_string()
            } else if let Some(t) = st.earliest {
                format!(
                    "waits {} days for the water (last point: {})",
                    days(t - st.planned_start),
                    st.critical_point
                )
            } else {
                format!("NOT REACHED (furthest: {})", st.critical_point)
            }
        ));
    }
    s.push_str(&format!(
        "\n  volume pumped in total: {} m³ over {} days\n",
        thousands(a.total_volume, 0),
        days(a.duration)
    ));
    let reached = a.point_times.iter().filter(|p| p.time.is_some()).count();
    let last = a
        .point_times
        .iter()
        .filter_map(|p| p.time.map(|t| (t, &p.name)))
        .max_by(|x, y| x.0.total_cmp(&y.0));
    s.push_str(&format!(
        "  check points meeting their final target: {reached} of {}",
        a.point_times.len()
    ));
    if let Some((t, n)) = last {
        s.push_str(&format!("; the last is {n} on day {}", days(t)));
    }
    s.push('\n');
    match &a.flood {
        Some(f) => {
            s.push_str(&format!(
                "\n  TIME TO FLOOD (worst moment: day {}, stage \"{}\", {} with {:.2} m below formation {:.2} m)\n",
                days(f.moment),
                f.stage,
                f.point,
                f.margin,
                f.formation_level
            ));
            s.push_str(&format!(
                "    every pump off:      {}\n",
                f.all_off
                    .map_or("water stays below formation for a year".into(), |t| {
                        format!("water above formation after {}", duration_words(t))
                    })
            ));
            s.push_str(&format!(
                "    well {} off alone: {}\n",
                f.well,
                f.well_off.map_or(
                    "the other wells keep the water below formation".into(),
                    |t| format!("water above formation after {}", duration_words(t))
                )
            ));
        }
        None => s.push_str(
            "\n  time to flood: no moment in the programme with a stage dry below its formation\n",
        ),
    }
    if let Some(r) = &a.recovery {
        s.push_str(&format!(
            "\n  RECOVERY at {} after the pumps stop on day {}: drawdown {:.2} m at switch-off, {:.2} m left after {} days; 90 % recovered {}; water above the last formation {}\n",
            r.point,
            days(a.duration),
            r.drawdown_at_stop,
            r.residual_at_end,
            days(a.times.last().copied().unwrap_or(a.duration) - a.duration),
            r.to_90_percent.map_or("not within the recovery followed".into(), |t| format!("after {}", duration_words(t))),
            r.above_formation.map_or("not within a year".into(), |t| format!("after {}", duration_words(t)))
        ));
    }
    s.push_str("\n  Assumptions: wells at constant rate within each stage (the flow is the scheduled one); wells taken as fully penetrating in time (see transient::programme); unconfined flow linearised with T = K·H and Jacob's correction.\n");
    s.push('\n');
    s.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, "  "));
    s
}

fn csv_field(name: &str) -> String {
    if name.contains([',', '"', '\n']) {
        format!("\"{}\"", name.replace('"', "\"\""))
    } else {
        name.to_string()
    }
}

/// `programme.csv`: one row per output time: time s, day, stage, total flow L/s, volume m³ so
/// far, and the water level (m above datum) at every hydrograph place.
pub fn to_csv(model: &Model, a: &ProgrammeAnswers) -> Vec<u8> {
    let prog = model.programme.as_ref();
    let mut s = String::from("time_s,day,stage,total_flow_l_per_s,volume_m3");
    for h in &a.hydrographs {
        let prefix = match h.kind {
            SeriesKind::Point => "level_m",
            SeriesKind::Neighbour => "level_m",
            SeriesKind::Well => "level_in_well_m",
        };
        s.push(',');
        s.push_str(&csv_field(&format!("{prefix} {}", h.name)));
    }
    s.push('\n');
    for (j, t) in a.times.iter().enumerate() {
        let stage = a.stage_at[j]
            .and_then(|k| prog.map(|p| p.stages[k].name.clone()))
            .unwrap_or_else(|| "recovery".into());
        s.push_str(&format!(
            "{:.0},{:.4},{},{:.4},{:.2}",
            t,
            t / DAY,
            csv_field(&stage),
            a.flows[j] * 1e3,
            a.volumes[j]
        ));
        for h in &a.hydrographs {
            s.push_str(&format!(",{:.4}", h.levels[j]));
        }
        s.push('\n');
    }
    s.into_bytes()
}
