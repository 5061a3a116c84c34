//! The well specification (kind, radius, screen, pump, suction) and the layout section.

use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema;
use crate::input::validate::shapes::{check_positive, points};
use crate::physics::potential::Aquifer;
use std::path::Path;

pub fn well_spec(
    rep: &Reporter,
    raw: Option<&schema::WellSpec>,
    aquifer: &Aquifer,
    ground: f64,
) -> Result<WellSpec, InputError> {
    let default_top = aquifer
        .top_level
        .unwrap_or(aquifer.initial_level)
        .min(ground);
    let Some(w) = raw else {
        return Ok(WellSpec {
            kind: WellKind::DeepWell,
            radius: DEFAULT_WELL_RADIUS,
            screen_top: default_top,
            screen_base: aquifer.base_level,
            filter_top: default_top,
            filter_base: aquifer.base_level,
            pump_intake: aquifer.base_level + 0.5,
            submergence: DEFAULT_SUBMERGENCE,
            pump_capacity: None,
            suction_limit: DEFAULT_SUCTION_LIMIT,
            standby: 0,
        });
    };
    let kind = match w.kind.as_deref().map(str::trim) {
        None | Some("deep-well") => WellKind::DeepWell,
        Some("wellpoint") => WellKind::Wellpoint,
        Some(other) => {
            return Err(rep.error(
                "wells.kind",
                None,
                format!("unknown well kind \"{other}\"; valid: \"deep-well\", \"wellpoint\""),
            ))
        }
    };
    let radius = check_positive(
        rep,
        "wells.radius",
        &w.radius,
        "well radius, e.g. \"0.15 m\"",
    )?;
    if radius > 2.0 {
        return Err(rep.error("wells.radius", w.radius.span.clone(), format!("{radius} m is not a well radius (usual 0.025 … 0.5 m); is it a diameter in mm written as m?")));
    }
    let screen_top = w.screen_top.as_ref().map_or(default_top, |q| q.si);
    if screen_top > ground + 1e-9 {
        return Err(rep.error(
            "wells.screen_top",
            w.screen_top.as_ref().and_then(|q| q.span.clone()),
            format!("the screen top ({screen_top} m) is above ground level ({ground} m); give a level at or below ground"),
        ));
    }
    let screen_base = w.screen_base.as_ref().map_or(aquifer.base_level, |q| q.si);
    if screen_base >= screen_top {
        return Err(rep.error(
            "wells.screen_base",
            w.screen_base.as_ref().and_then(|q| q.span.clone()),
            format!(
                "the screen base ({screen_base} m) must be below the screen top ({screen_top} m)"
            ),
        ));
    }
    if screen_base < aquifer.base_level - 1e-9 {
        return Err(rep.error(
            "wells.screen_base",
            w.screen_base.as_ref().and_then(|q| q.span.clone()),
            format!(
                "the screen base ({screen_base} m) is below the aquifer base ({} m)",
                aquifer.base_level
            ),
        ));
    }
    let (filter_top, filter_base) =
        filter_column(rep, w, screen_top, screen_base, aquifer, ground)?;
    let pump_intake = w.pump_intake.as_ref().map_or(screen_base + 0.5, |q| q.si);
    if pump_intake < aquifer.base_level - 5.0 || pump_intake > ground {
        return Err(rep.error("wells.pump_intake", w.pump_intake.as_ref().and_then(|q| q.span.clone()), format!("the pump intake ({pump_intake} m) must lie between the aquifer base and ground level")));
    }
    let submergence = w.submergence.as_ref().map_or(DEFAULT_SUBMERGENCE, |q| q.si);
    if !(0.0..=10.0).contains(&submergence) {
        return Err(rep.error(
            "wells.submergence",
            None,
            format!("{submergence} m is outside 0 … 10 m"),
        ));
    }
    let pump_capacity = match &w.pump_capacity {
        Some(q) => Some(check_positive(
            rep,
            "wells.pump_capacity",
            q,
            "pump capacity, e.g. \"5 L/s\"",
        )?),
        None => None,
    };
    let suction_limit = w
        .suction_limit
        .as_ref()
        .map_or(DEFAULT_SUCTION_LIMIT, |q| q.si);
    if !(0.5..=9.0).contains(&suction_limit) {
        return Err(rep.error("wells.suction_limit", None, format!("{suction_limit} m is outside 0.5 … 9 m (one stage lifts about 5–6 m; the vacuum limit is about 9.5 m)")));
    }
    Ok(WellSpec {
        kind,
        radius,
        screen_top,
        screen_base,
        filter_top,
        filter_base,
        pump_intake,
        submergence,
        pump_capacity,
        suction_limit,
        standby: w.standby.unwrap_or(0),
    })
}

/// The filter (sand) column round the screen: `filter_base` (default the screen base) and
/// `filter_top` or `filter_length` (default the screen top). It must enclose the screen and lie
/// between the aquifer base and ground level.
fn filter_column(
    rep: &Reporter,
    w: &schema::WellSpec,
    screen_top: f64,
    screen_base: f64,
    aquifer: &Aquifer,
    ground: f64,
) -> Result<(f64, f64), InputError> {
    let span = |q: &Option<crate::input::units::Length>| q.as_ref().and_then(|q| q.span.clone());
    let base = w.filter_base.as_ref().map_or(screen_base, |q| q.si);
    if !base.is_finite() || base > screen_base + 1e-9 || base < aquifer.base_level - 1e-9 {
        return Err(rep.error(
            "wells.filter_base",
            span(&w.filter_base),
            format!("the filter base ({base} m) must lie between the aquifer base ({} m) and the screen base ({screen_base} m): the filter column surrounds the screen", aquifer.base_level),
        ));
    }
    let top = match (&w.filter_top, &w.filter_length) {
        (Some(_), Some(_)) => {
            return Err(rep.error(
                "wells.filter_length",
                span(&w.filter_length),
                "give filter_top or filter_length, not both",
            ))
        }
        (Some(t), None) => t.si,
        (None, Some(l)) => {
            base + check_positive(
                rep,
                "wells.filter_length",
                l,
                "filter column length, e.g. \"3 m\"",
            )?
        }
        (None, None) => screen_top,
    };
    let field = if w.filter_length.is_some() {
        "wells.filter_length"
    } else {
        "wells.filter_top"
    };
    if !top.is_finite() || top < screen_top - 1e-9 || top > ground + 1e-9 {
        return Err(rep.error(
            field,
            span(&w.filter_top).or(span(&w.filter_length)),
            format!("the filter top ({top} m) must lie between the screen top ({screen_top} m) and ground level ({ground} m): the filter column surrounds the screen"),
        ));
    }
    Ok((top, base))
}

/// The excavation the layout is placed round: by name, else the first.
fn layout_excavation(
    rep: &Reporter,
    l: &schema::Layout,
    excavations: &[Excavation],
) -> Result<usize, InputError> {
    let excavation = match &l.excavation {
        None => 0,
        Some(name) => excavations
            .iter()
            .position(|e| e.name == *name)
            .ok_or_else(|| {
                rep.error(
                    "layout.excavation",
                    None,
                    format!(
                        "no excavation named \"{name}\"; valid: {}",
                        excavations
                            .iter()
                            .map(|e| format!("\"{}\"", e.name))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                )
            })?,
    };
    Ok(excavation)
}

/// A ring of wells round the excavation: a count (at least 3) or a largest gap, not both.
fn ring_layout(rep: &Reporter, l: &schema::Layout) -> Result<LayoutKind, InputError> {
    let count =
        match (l.count, &l.max_spacing) {
            (Some(n), None) if n >= 3 => RingCount::Count(n),
            (Some(n), None) => {
                return Err(rep.error(
                    "layout.count",
                    None,
                    format!("a ring needs at least 3 wells; got {n}"),
                ))
            }
            (None, Some(s)) => RingCount::MaxSpacing(check_positive(
                rep,
                "layout.max_spacing",
                s,
                "largest gap between wells",
            )?),
            (Some(_), Some(_)) => {
                return Err(rep.error("layout.count", None, "give count or max_spacing, not both"))
            }
            (None, None) => return Err(rep.error(
                "layout",
                None,
                "a ring needs count (number of wells) or max_spacing (largest gap, e.g. \"10 m\")",
            )),
        };
    Ok(LayoutKind::Ring {
        count,
        corner_wells: l.corner_wells.unwrap_or(false),
    })
}

/// A wellpoint line: spacing, one or both sides, end extension and an optional centre line.
fn line_layout(rep: &Reporter, l: &schema::Layout) -> Result<LayoutKind, InputError> {
    let Some(s) = &l.spacing else {
        return Err(rep.error(
            "layout.spacing",
            None,
            "a wellpoint line needs spacing, e.g. \"1.5 m\"",
        ));
    };
    let spacing = check_positive(rep, "layout.spacing", s, "spacing along the line")?;
    let both_sides = match l.sides.as_deref().map(str::trim) {
        None | Some("both") => true,
        Some("one") => false,
        Some(other) => {
            return Err(rep.error(
                "layout.sides",
                None,
                format!("unknown value \"{other}\"; valid: \"one\", \"both\""),
            ))
        }
    };
    let end_extension = match &l.end_extension {
        Some(q) if (0.0..=500.0).contains(&q.si) => Some(q.si),
        Some(q) => {
            return Err(rep.error(
                "layout.end_extension",
                q.span.clone(),
                format!("{} m is outside 0 … 500 m", q.si),
            ))
        }
        None => None,
    };
    let centre_line = match &l.centre_line {
        Some(c) => {
            let pts = points(rep, "layout.centre_line", c)?;
            if pts.len() < 2 {
                return Err(rep.error(
                    "layout.centre_line",
                    Some(c.span()),
                    "a centre line needs at least 2 points",
                ));
            }
            Some(pts)
        }
        None => None,
    };
    Ok(LayoutKind::Line {
        spacing,
        both_sides,
        centre_line,
        end_extension,
    })
}

/// The generated layout (`[layout]`): its excavation, offset, kind (ring, line, listed or CSV
/// wells), start and free placement.
pub fn layout_spec(
    rep: &Reporter,
    path: &Path,
    l: &schema::Layout,
    excavations: &[Excavation],
    no_listed_wells: bool,
) -> Result<LayoutSpec, InputError> {
    let excavation = layout_excavation(rep, l, excavations)?;
    let offset = l.offset.as_ref().map_or(2.0, |q| q.si);
    if !(0.0..=100.0).contains(&offset) {
        return Err(rep.error(
            "layout.offset",
            l.offset.as_ref().and_then(|q| q.span.clone()),
            format!("{offset} m is outside 0 … 100 m"),
        ));
    }
    let kind = match l.kind.trim() {
        "ring" => ring_layout(rep, l)?,
        "line" => line_layout(rep, l)?,
        "listed" => {
            if no_listed_wells {
                return Err(rep.error(
                    "layout.kind",
                    None,
                    "layout kind \"listed\" needs at least one [[well]] with name, x, y and rate",
                ));
            }
            LayoutKind::Listed
        }
        "csv" => {
            let Some(f) = &l.file else {
                return Err(rep.error(
                    "layout.file",
                    None,
                    "layout kind \"csv\" needs file, a CSV with columns name,x,y,rate_l_per_s",
                ));
            };
            let p = path.parent().unwrap_or(Path::new(".")).join(f);
            LayoutKind::Csv { path: p }
        }
        other => {
            return Err(rep.error(
                "layout.kind",
                None,
                format!(
                "unknown layout kind \"{other}\"; valid: \"ring\", \"line\", \"listed\", \"csv\""
            ),
            ))
        }
    };
    let start = match &l.start {
        Some(q) if q.si.is_finite() && (0.0..=10_000.0).contains(&q.si) => q.si,
        Some(q) => {
            return Err(rep.error(
                "layout.start",
                q.span.clone(),
                format!("{} m is outside 0 … 10 000 m (distance along the ring of the first well, or of the end wellpoints inside each end of the line)", q.si),
            ))
        }
        None => 0.0,
    };
    let free = if matches!(kind, LayoutKind::Ring { .. }) {
        free_placement(rep, l)?
    } else {
        None
    };
    Ok(LayoutSpec {
        kind,
        excavation,
        offset,
        rate: l.rate.as_ref().map(|q| q.si),
        start,
        free,
    })
}

/// `layout.placement` and its candidates (rings only): `None` for "even".
fn free_placement(
    rep: &Reporter,
    l: &schema::Layout,
) -> Result<Option<FreePlacementSpec>, InputError> {
    match l.placement.as_deref().map(str::trim) {
        None | Some("fewest") => {}
        Some("even") => return Ok(None),
        Some(other) => {
            return Err(rep.error(
                "layout.placement",
                None,
                format!("unknown value \"{other}\"; valid: \"fewest\" (the fewest wells on candidate positions, the default), \"even\" (evenly spaced rings only)"),
            ))
        }
    }
    let step = match &l.candidate_step {
        Some(q) if q.si.is_finite() && (0.1..=100.0).contains(&q.si) => Some(q.si),
        Some(q) => {
            return Err(rep.error(
                "layout.candidate_step",
                q.span.clone(),
                format!(
                    "{} m is outside 0.1 … 100 m (step between candidate positions along the ring)",
                    q.si
                ),
            ))
        }
        None => None,
    };
    let mut offsets = Vec::new();
    for q in l.candidate_offsets.iter().flatten() {
        if !(q.si.is_finite() && (0.0..=100.0).contains(&q.si)) {
            return Err(rep.error(
                "layout.candidate_offsets",
                q.span.clone(),
                format!(
                    "{} m is outside 0 … 100 m (offset of a candidate ring outside the outline)",
                    q.si
                ),
            ));
        }
        offsets.push(q.si);
    }
    let points = match &l.candidates {
        Some(c) => points(rep, "layout.candidates", c)?,
        None => Vec::new(),
    };
    Ok(Some(FreePlacementSpec {
        step,
        offsets,
        points,
    }))
}
