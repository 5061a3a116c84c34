//! `drydig programme`: the terminal summary (days to dig each stage, volumes, time to flood,
//! recovery) and `programme.csv` (times, flows, volumes, levels at every hydrograph place).

use super::format::Fmt;
use crate::caution::CAUTION;
use crate::input::model::Model;
use crate::input::units::UnitSystem;
use crate::report::words::wrap;
use crate::transient::answers::{ProgrammeAnswers, SeriesKind};
use crate::transient::programme::DAY;

fn days(t: f64) -> String {
    format!("{:.1}", t / DAY)
}

/// A duration in words: seconds below two minutes (a relief well field can lose its safety
/// against uplift within seconds of the pumps stopping), then minutes, hours, days.
fn duration_words(t: f64) -> String {
    if t < 120.0 {
        format!("{:.0} s", t)
    } else if t < 3600.0 {
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

/// The terminal summary, in the model's unit system.
pub fn to_text(model: &Model, a: &ProgrammeAnswers) -> String {
    let f = Fmt::new(model.units, model.ground_level);
    let mut s = format!(
        "PROGRAMME  {}\n  pumping {} days, then {} days of recovery followed; {} output times\n\n",
        model.name,
        days(a.duration),
        days(a.times.last().copied().unwrap_or(a.duration) - a.duration),
        a.times.len()
    );
    s.push_str(&stages_table(model, a, &f));
    s.push_str(&totals_text(a, &f));
    s.push_str(&flood_text(a, &f));
    s.push_str(&recovery_text(a, &f));
    s.push_str(&wells_text(a, &f));
    s.push_str(&steady_text(a, &f));
    if !model.boundaries.is_empty() {
        s.push_str(&images_text(a, &f));
    }
    s.push_str("\n  Assumptions: wells at constant rate within each stage (the flow is the scheduled one, not reduced when a well runs low); partial penetration as in the steady check, taken as quasi-steady (it settles within hours); well losses at each well's rate of the time; unconfined flow linearised with T = K·H and Jacob's correction.\n");
    s.push('\n');
    s.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, "  "));
    s
}

/// The stages: planned day, the day each can be dug from (with its date), target, flow,
/// volume, and whether it is ready or waits.
fn stages_table(model: &Model, a: &ProgrammeAnswers, f: &Fmt) -> String {
    let mut s = String::new();
    s.push_str(&format!(
        "  stage                        planned day   can dig from day {:>10} {:>10} {:>11}   \n",
        format!("target {}", f.lu()),
        format!("flow {}", f.rate_unit()),
        format!("volume {}", f.volume_unit())
    ));
    for st in &a.stages {
        let earliest = match st.earliest {
            Some(t) => format!("{}{}", days(t), date_of(model, t)),
            None => "not within the programme".into(),
        };
        s.push_str(&format!(
            "  {:<28} {:>11} {:>18} {:>10} {:>10} {:>11}   {}\n",
            st.name,
            days(st.planned_start),
            earliest,
            f.length_value(st.target_level),
            f.rate_value(st.flow),
            f.volume_value(st.volume),
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
    s
}

/// Volume pumped in total, and how many check points meet their final target (the last when).
fn totals_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    let mut s = String::new();
    s.push_str(&format!(
        "\n  volume pumped in total: {} over {} days\n",
        f.volume(a.total_volume),
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
    s
}

/// Time to flood (or, under relief, to uplift factor of safety 1.0) with every pump off and
/// with the worst well off alone.
fn flood_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    let mut s = String::new();
    match &a.flood {
        Some(fl) if fl.relief => {
            s.push_str(&format!(
                "\n  TIME TO UPLIFT FACTOR OF SAFETY 1.0 (worst moment: day {}, stage \"{}\", {} with {} below the head {} at which the base would lift)\n",
                days(fl.moment),
                fl.stage,
                fl.point,
                f.length(fl.margin),
                f.length(fl.formation_level)
            ));
            let words = |t: Option<f64>, held: &str| {
                t.map_or(held.to_string(), |t| {
                    format!(
                        "factor of safety against uplift 1.0 after {}",
                        duration_words(t)
                    )
                })
            };
            s.push_str(&format!(
                "    every pump off:      {}\n",
                words(fl.all_off, "factor of safety stays above 1.0 for a year")
            ));
            s.push_str(&format!(
                "    well {} off alone: {}\n",
                fl.well,
                words(
                    fl.well_off,
                    "the other wells keep the factor of safety above 1.0"
                )
            ));
        }
        Some(fl) => {
            s.push_str(&format!(
                "\n  TIME TO FLOOD (worst moment: day {}, stage \"{}\", {} with {} below formation {})\n",
                days(fl.moment),
                fl.stage,
                fl.point,
                f.length(fl.margin),
                f.length(fl.formation_level)
            ));
            s.push_str(&format!(
                "    every pump off:      {}\n",
                fl.all_off
                    .map_or("water stays below formation for a year".into(), |t| {
                        format!("water above formation after {}", duration_words(t))
                    })
            ));
            s.push_str(&format!(
                "    well {} off alone: {}\n",
                fl.well,
                fl.well_off.map_or(
                    "the other wells keep the water below formation".into(),
                    |t| format!("water above formation after {}", duration_words(t))
                )
            ));
        }
        None => s.push_str(
            "\n  time to flood: no moment in the programme with a stage dry below its formation\n",
        ),
    }
    s
}

/// Recovery after the pumps stop, when the programme followed it.
fn recovery_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    let mut s = String::new();
    if let Some(r) = &a.recovery {
        s.push_str(&format!(
            "\n  RECOVERY at {} after the pumps stop on day {}: drawdown {} at switch-off, {} left after {} days; 90 % recovered {}; water above the last formation {}\n",
            r.point,
            days(a.duration),
            f.length(r.drawdown_at_stop),
            f.length(r.residual_at_end),
            days(a.times.last().copied().unwrap_or(a.duration) - a.duration),
            r.to_90_percent.map_or("not within the recovery followed".into(), |t| format!("after {}", duration_words(t))),
            r.above_formation.map_or("not within a year".into(), |t| format!("after {}", duration_words(t)))
        ));
    }
    s
}

/// How far the images of straight boundaries are kept, and a warning where the series was cut.
fn images_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    let mut s = String::new();
    s.push_str(&format!(
        "\n  Images of the straight boundaries are kept out to {:.0} {} from each well: every image beyond has u = r²S/(4T·t) > {:.0} at the last time followed, W(u) < 1.1e−19, so the omitted remainder is below 3e−15·Q/(4πT) (between two parallel boundaries the series is summed that far, not to a fixed count).\n",
        f.length_number(a.image_reach), f.lu(), crate::transient::programme::IMAGE_U_MIN
    ));
    if a.images_capped > 0 {
        s.push_str(&format!(
            "  WARNING: for {} the image series was cut at {} images before that distance: levels late in the programme may be off.\n",
            crate::plural::count(a.images_capped, "well", "wells"),
            crate::transient::programme::MAX_IMAGES_IN_TIME
        ));
    }
    s
}

/// Wells that fall below their lowest allowed level while scheduled to pump.
fn wells_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    if a.well_breaches.is_empty() {
        return "\n  wells: every pumped well stays above its lowest allowed level (level inside the well, after its loss) while it pumps\n".into();
    }
    let mut s = format!(
        "\n  WARNING — {} WELL(S) BELOW THEIR LOWEST ALLOWED LEVEL WHILE SCHEDULED TO PUMP:\n",
        a.well_breaches.len()
    );
    for b in &a.well_breaches {
        s.push_str(&format!(
            "    {} from day {}: {} scheduled, level falls to {} against {} ({})\n",
            b.well,
            days(b.time),
            f.rate(b.rate),
            f.length(b.lowest_reached),
            f.length(b.lowest),
            b.basis
        ));
    }
    let first = a
        .well_breaches
        .iter()
        .map(|b| b.time)
        .fold(f64::INFINITY, f64::min);
    s.push_str(&format!(
        "    From day {} these wells cannot deliver their scheduled rates: the levels, days to dig and volumes after it assume they do and are too optimistic. Lower their rates (the targets then take longer or are not met), lower the pumps, or add wells.\n",
        days(first)
    ));
    s
}

/// t* and how the programme compares with the steady check there.
fn steady_text(a: &ProgrammeAnswers, f: &Fmt) -> String {
    let Some(l) = &a.steady else {
        return "\n  steady design: no t* (leaky aquifer: the levels settle at the steady Hantush values; or no well rates)\n".into();
    };
    format!(
        "\n  STEADY DESIGN AND TIME: by Cooper–Jacob, Theis equals Thiem with R(t) = √(2.25·T·t/S). The steady check of these wells at their design rates uses R = {}{}, reached at t* = {} days. With every well at its design rate from day 0 the programme at t* gives the steady levels within {} at the check points (largest at {}, {} compared) and {} in the wells, losses included (largest in {}); the rest is the Cooper–Jacob remainder of the wells and of their boundary images (an image near R has u not small at t*: a constant-head line within R makes the programme approach the steady levels only as t grows) and the wells beyond R that Thiem cuts off. After t* an unbounded aquifer keeps drawing down (about Q/(4πT)·ln(t/t*) per well; a constant-head boundary or leakage slows it), so levels later in a long programme are lower than the steady design's.\n",
        f.length(l.radius),
        radius_basis(&l.radius_basis, f),
        days(l.t_star),
        f.length_fine(l.point_difference),
        l.point_name,
        l.points_compared,
        f.length_fine(l.well_difference),
        l.well_name
    )
}

/// The steady check's radius basis, in brackets: the engine states it in SI, so in US units
/// only the radius itself is given (the design's report explains its basis).
fn radius_basis(basis: &str, f: &Fmt) -> String {
    match f.units {
        UnitSystem::Si => format!(" ({basis})"),
        UnitSystem::Us => " (the steady check's radius of influence)".into(),
    }
}

fn csv_field(name: &str) -> String {
    if name.contains([',', '"', '\n']) {
        format!("\"{}\"", name.replace('"', "\"\""))
    } else {
        name.to_string()
    }
}

/// `programme.csv`: one row per output time: time s, day, stage, total flow L/s, volume m³ so
/// far, and the water level (m above datum) at every hydrograph place: the SI machine columns.
/// In US units the flow in gpm, the volume in US gallons and every level in ft follow.
pub fn to_csv(model: &Model, a: &ProgrammeAnswers) -> Vec<u8> {
    let prog = model.programme.as_ref();
    let us = model.units == UnitSystem::Us;
    let f = Fmt::new(model.units, model.ground_level);
    let mut s = String::from(
        "time_s,day,stage,total_flow_l_per_s,volume_m3,cooper_jacob_radius_m,wells_below_lowest_level",
    );
    for h in &a.hydrographs {
        let prefix = match h.kind {
            SeriesKind::Point => "level_m",
            SeriesKind::Neighbour => "level_m",
            SeriesKind::Well => "level_in_well_m",
        };
        s.push(',');
        s.push_str(&csv_field(&format!("{prefix} {}", h.name)));
    }
    if us {
        s.push_str(",total_flow_gpm,volume_gal");
        for h in &a.hydrographs {
            let prefix = match h.kind {
                SeriesKind::Point | SeriesKind::Neighbour => "level_ft",
                SeriesKind::Well => "level_in_well_ft",
            };
            s.push(',');
            s.push_str(&csv_field(&format!("{prefix} {}", h.name)));
        }
    }
    s.push('\n');
    for (j, t) in a.times.iter().enumerate() {
        let stage = a.stage_at[j]
            .and_then(|k| prog.map(|p| p.stages[k].name.clone()))
            .unwrap_or_else(|| "recovery".into());
        let below: Vec<&str> = a
            .well_breaches
            .iter()
            .filter(|b| {
                *t >= b.time - 1.0
                    && a.stage_at[j].is_some()
                    && a.hydrographs
                        .iter()
                        .find(|h| h.kind == SeriesKind::Well && h.name == b.well)
                        .is_some_and(|h| h.levels[j] < b.lowest - 1e-3)
            })
            .map(|b| b.well.as_str())
            .collect();
        s.push_str(&format!(
            "{:.0},{:.4},{},{:.4},{:.2},{:.1},{}",
            t,
            t / DAY,
            csv_field(&stage),
            a.flows[j] * 1e3,
            a.volumes[j],
            a.cooper_jacob_radius.get(j).copied().unwrap_or(0.0),
            csv_field(&below.join(" "))
        ));
        for h in &a.hydrographs {
            s.push_str(&format!(",{:.4}", h.levels[j]));
        }
        if us {
            s.push_str(&format!(
                ",{:.2},{:.0}",
                f.rate_number(a.flows[j]),
                a.volumes[j] * 1e3 / 3.785_411_784
            ));
            for h in &a.hydrographs {
                s.push_str(&format!(",{:.3}", f.length_number(h.levels[j])));
            }
        }
        s.push('\n');
    }
    s.into_bytes()
}

#[cfg(test)]
mod tests {
    use super::duration_words;

    #[test]
    fn short_durations_are_not_rounded_to_zero_minutes() {
        // 7 s is what a confined layer with S = 2e-4 can take to recover to uplift after the
        // pumps stop (tests/relief.rs); "0 min" would read as "at once" or as "no answer".
        assert_eq!(duration_words(6.7), "7 s");
        assert_eq!(duration_words(119.0), "119 s");
        assert_eq!(duration_words(150.0), "2 min");
        assert_eq!(duration_words(5400.0), "1.5 h");
    }
}
