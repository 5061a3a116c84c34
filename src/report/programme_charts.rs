//! Charts of the programme: `hydrographs.svg` (water level against day at the named points and
//! neighbour corners, with the formation level of each stage as a step line), `wells.svg` (levels
//! in the wells) and `flow.svg` (total flow and cumulative volume against day). Stage starts and
//! the switch-off are marked by vertical lines. Levels, flows and volumes in the model's units.

use super::format::Fmt;
use crate::input::model::Model;
use crate::input::units::UnitSystem;
use crate::report::plot_kit::{
    caution_block, legend, line, r1, text, ticks, white_page, Frame, LegendRow,
};
use crate::transient::answers::{ProgrammeAnswers, SeriesKind};
use crate::transient::programme::DAY;
use svg::node::element::{Group, Path};

const WIDTH: f64 = 960.0;
const HEIGHT: f64 = 620.0;
const LEFT: f64 = 80.0;
const RIGHT: f64 = 250.0;
const TOP: f64 = 60.0;
const PLOT_H: f64 = 420.0;
const COLOURS: [&str; 10] = [
    "#1f4e79", "#d1495b", "#2a9d8f", "#e9c46a", "#6a4c93", "#f4a261", "#264653", "#8ab17d",
    "#b5838d", "#577590",
];

struct Series {
    name: String,
    values: Vec<f64>,
    dashed: bool,
}

/// Lowest and highest finite value of the series and the steps, padded by 5 %.
fn value_range(series: &[Series], steps: &[(f64, f64, String)]) -> (f64, f64) {
    let all = series
        .iter()
        .flat_map(|s| s.values.iter().copied())
        .chain(steps.iter().map(|s| s.1))
        .filter(|v| v.is_finite());
    let (mut lo, mut hi) = all.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
        (a.min(v), b.max(v))
    });
    if !(lo.is_finite() && hi.is_finite()) {
        (lo, hi) = (0.0, 1.0);
    }
    if hi - lo < 1e-6 {
        hi = lo + 1.0;
    }
    let pad = 0.05 * (hi - lo);
    (lo - pad, hi + pad)
}

/// Vertical dashed lines at the stage starts, switch-off and t*, each named at its top; a name
/// too close to the one before drops a line so the two do not print over each other.
fn mark_lines(fr: &Frame, marks: &[(f64, String)]) -> Group {
    let mut g = Group::new();
    let mut sorted: Vec<&(f64, String)> = marks.iter().collect();
    sorted.sort_by(|a, b| a.0.total_cmp(&b.0));
    let (mut last_x, mut row) = (f64::NEG_INFINITY, 0.0);
    for (d, name) in sorted {
        let x = fr.px(*d);
        row = if x - last_x < 130.0 { row + 12.0 } else { 0.0 };
        last_x = x;
        g = g
            .add(
                line(x, fr.top, x, fr.bottom())
                    .set("stroke", "#888888")
                    .set("stroke-dasharray", "4 3"),
            )
            .add(text(
                x + 3.0,
                fr.top + 12.0 + row,
                10.0,
                "start",
                name.clone(),
            ));
    }
    g
}

/// The formation level of each stage as a dashed step line.
fn step_line(fr: &Frame, steps: &[(f64, f64, String)]) -> Option<Path> {
    if steps.is_empty() {
        return None;
    }
    let mut dpath = String::new();
    for (k, (d0, v, _)) in steps.iter().enumerate() {
        let d1 = steps.get(k + 1).map_or(fr.x.1, |s| s.0);
        dpath.push_str(&format!(
            "{}{} {} L{} {} ",
            if k == 0 { "M" } else { "L" },
            r1(fr.px(*d0)),
            r1(fr.py(*v)),
            r1(fr.px(d1)),
            r1(fr.py(*v))
        ));
    }
    Some(
        Path::new()
            .set("d", dpath)
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", 1.4)
            .set("stroke-dasharray", "7 4"),
    )
}

/// One series as a path, broken where a value is not finite.
fn series_path(fr: &Frame, days: &[f64], s: &Series, colour: &str) -> Path {
    let mut dpath = String::new();
    let mut pen = false;
    for (d, v) in days.iter().zip(&s.values) {
        if v.is_finite() {
            let cmd = if pen { "L" } else { "M" };
            dpath.push_str(&format!("{cmd}{} {} ", r1(fr.px(*d)), r1(fr.py(*v))));
            pen = true;
        } else {
            pen = false;
        }
    }
    let mut p = Path::new()
        .set("d", dpath)
        .set("fill", "none")
        .set("stroke", colour)
        .set("stroke-width", 1.6);
    if s.dashed {
        p = p.set("stroke-dasharray", "3 2");
    }
    p
}

/// The legend on the right: up to 24 series, the rest counted, and the formation step line.
fn legend_of(fr: &Frame, series: &[Series], with_steps: bool) -> Group {
    let shown = series.len().min(24);
    let mut rows: Vec<LegendRow> = series
        .iter()
        .take(shown)
        .enumerate()
        .map(|(i, s)| LegendRow {
            colour: COLOURS[i % COLOURS.len()].into(),
            dash: s.dashed.then(|| "3 2".into()),
            label: s.name.clone(),
        })
        .collect();
    if series.len() > shown {
        rows.push(LegendRow {
            colour: "none".into(),
            dash: None,
            label: format!("… and {} more (see programme.csv)", series.len() - shown),
        });
    }
    if with_steps {
        rows.push(LegendRow {
            colour: "#000000".into(),
            dash: Some("7 4".into()),
            label: "formation level".into(),
        });
    }
    legend(fr.right() + 16.0, fr.top + 6.0, 16.0, &rows)
}

/// A line chart of `series` against day with a legend on the right. `steps` (day, level, name)
/// are drawn as a step line; `marks` (day, name) as vertical lines.
fn chart(
    title: &str,
    y_label: &str,
    days: &[f64],
    series: &[Series],
    steps: &[(f64, f64, String)],
    marks: &[(f64, String)],
) -> String {
    let x_max = days.last().copied().unwrap_or(1.0).max(1e-6);
    let fr = Frame {
        left: LEFT,
        top: TOP,
        width: WIDTH - LEFT - RIGHT,
        height: PLOT_H,
        x: (0.0, x_max),
        y: value_range(series, steps),
    };
    let mut doc = white_page(WIDTH, HEIGHT)
        .add(title_text(title))
        .add(fr.grid(&ticks(0.0, x_max, 10), &ticks(fr.y.0, fr.y.1, 8)))
        .add(fr.x_title("days from the start of pumping"))
        .add(fr.y_title(y_label, 18.0))
        .add(mark_lines(&fr, marks));
    if let Some(p) = step_line(&fr, steps) {
        doc = doc.add(p);
    }
    for (i, s) in series.iter().enumerate() {
        doc = doc.add(series_path(&fr, days, s, COLOURS[i % COLOURS.len()]));
    }
    doc = doc.add(legend_of(&fr, series, !steps.is_empty()));
    doc = doc.add(caution_block(LEFT, TOP + PLOT_H + 60.0, 10.0, 13.0, 150));
    doc.to_string()
}

/// The chart's title, centred over the plot; a title too long for that (about 0.56 em a
/// character, sans-serif) starts at the page's left margin instead of running off the page.
fn title_text(title: &str) -> svg::node::element::Text {
    let centre = WIDTH / 2.0 - RIGHT / 2.0;
    let half_width = 0.5 * 0.56 * 16.0 * title.chars().count() as f64;
    if half_width > centre - 20.0 {
        text(20.0, 30.0, 16.0, "start", title)
    } else {
        text(centre, 30.0, 16.0, "middle", title)
    }
}

fn marks(model: &Model, a: &ProgrammeAnswers) -> Vec<(f64, String)> {
    let mut m: Vec<(f64, String)> = model
        .programme
        .iter()
        .flat_map(|p| &p.stages)
        .map(|s| (s.start / DAY, s.name.clone()))
        .collect();
    m.push((a.duration / DAY, "pumps off".into()));
    if let Some(l) = &a.steady {
        let end = a.times.last().copied().unwrap_or(a.duration);
        if l.t_star <= end {
            m.push((l.t_star / DAY, "t*: R(t) = steady R".into()));
        }
    }
    m
}

/// The flow chart: total flow (rate unit) and the volume so far (thousands of the volume
/// unit) against day.
fn flow_chart(
    model: &Model,
    a: &ProgrammeAnswers,
    f: &Fmt,
    days: &[f64],
    marks: &[(f64, String)],
) -> String {
    let (ru, vu) = (f.rate_unit(), f.volume_unit());
    // thousands of m³ or of US gallons (1 m³ = 264.172 gal, NIST SP 811 App. B)
    let per_m3 = match f.units {
        UnitSystem::Si => 1.0,
        UnitSystem::Us => 1e3 / 3.785_411_784,
    };
    chart(
        &format!(
            "{} — flow ({ru}) and volume pumped (thousand {vu})",
            model.name
        ),
        &format!("{ru}   |   thousand {vu}"),
        days,
        &[
            Series {
                name: format!("total flow, {ru}"),
                values: a.flows.iter().map(|q| f.rate_number(*q)).collect(),
                dashed: false,
            },
            Series {
                name: format!("volume so far, thousand {vu}"),
                values: a.volumes.iter().map(|v| v * per_m3 / 1e3).collect(),
                dashed: true,
            },
        ],
        &[],
        marks,
    )
}

/// The three charts in the model's units: (file name, SVG text).
pub fn charts(model: &Model, a: &ProgrammeAnswers) -> Vec<(String, Vec<u8>)> {
    let f = Fmt::new(model.units, model.ground_level);
    let lu = f.lu();
    let days: Vec<f64> = a.times.iter().map(|t| t / DAY).collect();
    let steps: Vec<(f64, f64, String)> = model
        .programme
        .iter()
        .flat_map(|p| &p.stages)
        .map(|s| {
            (
                s.start / DAY,
                f.length_number(s.formation_level),
                s.name.clone(),
            )
        })
        .collect();
    let mk = |kinds: &[SeriesKind]| -> Vec<Series> {
        a.hydrographs
            .iter()
            .filter(|h| kinds.contains(&h.kind))
            .map(|h| Series {
                name: h.name.clone(),
                values: h.levels.iter().map(|z| f.length_number(*z)).collect(),
                dashed: h.kind == SeriesKind::Neighbour,
            })
            .collect()
    };
    let marks = marks(model, a);
    let hyd = chart(
        &format!("{} — water level against time", model.name),
        &format!("water level, {lu} above datum"),
        &days,
        &mk(&[SeriesKind::Point, SeriesKind::Neighbour]),
        &steps,
        &marks,
    );
    let mut floors: Vec<f64> = a.well_floors.clone();
    floors.sort_by(f64::total_cmp);
    floors.dedup_by(|x, y| (*x - *y).abs() < 1e-6);
    let mut well_series = mk(&[SeriesKind::Well]);
    for z in &floors {
        well_series.push(Series {
            name: format!("lowest allowed {}", f.length(*z)),
            values: vec![f.length_number(*z); days.len()],
            dashed: true,
        });
    }
    let warning = match a
        .well_breaches
        .iter()
        .min_by(|x, y| x.time.total_cmp(&y.time))
    {
        Some(b) => format!(
            " — WARNING: {} below the lowest allowed level while pumping (first {} on day {:.1})",
            crate::plural::count(a.well_breaches.len(), "well", "wells"),
            b.well,
            b.time / DAY
        ),
        None => String::new(),
    };
    let wells = chart(
        &format!(
            "{} — water level in the wells (after well loss){warning}",
            model.name
        ),
        &format!("water level in well, {lu} above datum"),
        &days,
        &well_series,
        &steps,
        &marks,
    );
    let flow = flow_chart(model, a, &f, &days, &marks);
    vec![
        ("hydrographs.svg".into(), hyd.into_bytes()),
        ("wells.svg".into(), wells.into_bytes()),
        ("flow.svg".into(), flow.into_bytes()),
    ]
}
