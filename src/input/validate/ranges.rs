//! Bounds a real site can have, checked on the design file as written before anything is built:
//! levels, bare coordinates and numbers, counts of listed things, and names.
//!
//! Every quantity with a unit is already bounded by its kind when it is parsed
//! ([`crate::input::units`]); this file adds what a kind cannot know: that a level lies within
//! ±[`MAX_LEVEL`] m of the datum, that a coordinate lies within ±[`MAX_COORD`] m of the grid's
//! origin, that a list is short enough to build, and that a name prints safely. The bounds are
//! common practice (no source): generous limits of the trade chosen to keep every computation
//! finite and every allocation small, not to judge a design.

use crate::input::error::{InputError, Reporter};
use crate::input::schema::DesignFile;
use crate::input::units::Length;

/// Largest |level|, m: no site lies 10 km above or below its datum.
pub const MAX_LEVEL: f64 = 1e4;
/// Largest |x| or |y|, m: projected grids (UTM, national grids) stay within 10 000 km; there the
/// spacing of doubles is under 2 nm, so no result depends on where the origin is.
pub const MAX_COORD: f64 = 1e7;
/// Most vertices in one outline or footprint.
pub const MAX_VERTICES: usize = 100_000;
/// Most wells listed one by one, or in a CSV file, or placed by a layout.
pub const MAX_WELLS: usize = 20_000;
/// Most named check points.
pub const MAX_NAMED_POINTS: usize = 10_000;
/// Most neighbours, boundaries, keep-out zones or excavations.
pub const MAX_ITEMS: usize = 1_000;
/// Most soil layers under one neighbour, or pumping-test observations.
pub const MAX_LAYERS: usize = 200;
/// Longest name, characters.
pub const MAX_NAME: usize = 200;

/// Check the levels, counts, bare numbers and names of `raw`.
pub fn check(rep: &Reporter, raw: &DesignFile) -> Result<(), InputError> {
    names(rep, raw)?;
    levels(rep, raw)?;
    counts(rep, raw)?;
    bare_numbers(rep, raw)
}

/// A name that is printed to the terminal, SVG, CSV and JSON: no control characters (they would
/// move the cursor or break a file), not too long, and without the words `NaN` or `inf`, which
/// the output guard reserves for numbers that went wrong. The one name rule: every surface a
/// name enters by (design file, drawings, `--wells`, programme, prices, pumping tests) applies
/// [`name_problem`].
pub fn name(rep: &Reporter, field: &str, text: &str) -> Result<(), InputError> {
    match name_problem(text) {
        Some(message) => Err(rep.error(field, None, message)),
        None => Ok(()),
    }
}

/// What is wrong with `text` as a name (see [`name`]), or `None` when it is a good name. The
/// message does not repeat the name (it may be a line of some unrelated file).
pub fn name_problem(text: &str) -> Option<String> {
    if let Some(c) = text.chars().find(|c| c.is_control()) {
        return Some(format!(
            "the name holds a control character (U+{:04X}); use letters, digits, spaces and punctuation only",
            c as u32
        ));
    }
    if text.chars().count() > MAX_NAME {
        return Some(format!(
            "the name is longer than {MAX_NAME} characters; shorten it"
        ));
    }
    if has_non_finite_word(text) {
        return Some("the name holds the word \"NaN\" or \"inf\", which drydig reserves for numbers that are not finite; choose another name".into());
    }
    None
}

/// Whether `text` holds `NaN`, `inf` or `Infinity` as a word (not inside a longer word).
pub fn has_non_finite_word(text: &str) -> bool {
    let b = text.as_bytes();
    for word in ["NaN", "inf", "Infinity"] {
        let w = word.as_bytes();
        let mut i = 0;
        while let Some(pos) = text[i..].find(word) {
            let s = i + pos;
            let e = s + w.len();
            let before = s == 0 || !b[s - 1].is_ascii_alphanumeric();
            let after = e >= b.len() || !b[e].is_ascii_alphanumeric();
            if before && after {
                return true;
            }
            i = s + 1;
        }
    }
    false
}

fn names(rep: &Reporter, raw: &DesignFile) -> Result<(), InputError> {
    name(rep, "site.name", &raw.site.name)?;
    if let Some(d) = &raw.site.datum {
        name(rep, "site.datum", d)?;
    }
    if let Some(g) = &raw.site.grid {
        name(rep, "site.grid", g)?;
    }
    for (i, e) in raw.excavation.iter().enumerate() {
        name(rep, &format!("excavation[{}].name", i + 1), &e.name)?;
    }
    for (i, w) in raw.well.iter().enumerate() {
        name(rep, &format!("well[{}].name", i + 1), &w.name)?;
    }
    for (i, b) in raw.boundary.iter().enumerate() {
        name(rep, &format!("boundary[{}].name", i + 1), &b.name)?;
    }
    for (i, k) in raw.keep_out.iter().enumerate() {
        name(rep, &format!("keep_out[{}].name", i + 1), &k.name)?;
    }
    for (i, n) in raw.neighbour.iter().enumerate() {
        name(rep, &format!("neighbour[{}].name", i + 1), &n.name)?;
        for (j, l) in n.layer.iter().enumerate() {
            name(
                rep,
                &format!("neighbour[{}].layer[{}].name", i + 1, j + 1),
                &l.name,
            )?;
        }
    }
    if let Some(c) = &raw.checks {
        for (i, p) in c.point.iter().enumerate() {
            name(rep, &format!("checks.point[{}].name", i + 1), &p.name)?;
        }
    }
    if let Some(l) = &raw.layout {
        if let Some(e) = &l.excavation {
            name(rep, "layout.excavation", e)?;
        }
        if let Some(c) = l
            .file
            .as_ref()
            .and_then(|f| f.chars().find(|c| c.is_control()))
        {
            return Err(rep.error(
                "layout.file",
                None,
                format!(
                    "the file name holds a control character (U+{:04X})",
                    c as u32
                ),
            ));
        }
    }
    Ok(())
}

fn level(rep: &Reporter, field: &str, q: Option<&Length>) -> Result<(), InputError> {
    match q {
        Some(q) if q.si.abs() > MAX_LEVEL => Err(rep.error(
            field,
            q.span.clone(),
            format!(
                "{:e} m is outside ±{MAX_LEVEL:e} m of the datum; give the level in metres (or with its unit) relative to the site datum",
                q.si
            ),
        )),
        _ => Ok(()),
    }
}

fn levels(rep: &Reporter, raw: &DesignFile) -> Result<(), InputError> {
    let a = &raw.aquifer;
    level(rep, "site.ground_level", Some(&raw.site.ground_level))?;
    level(rep, "aquifer.base_level", Some(&a.base_level))?;
    level(rep, "aquifer.top_level", a.top_level.as_ref())?;
    level(rep, "aquifer.groundwater_level", Some(&a.groundwater_level))?;
    for (i, e) in raw.excavation.iter().enumerate() {
        let f = format!("excavation[{}].formation_level", i + 1);
        level(rep, &f, Some(&e.formation_level))?;
    }
    if let Some(w) = &raw.wells {
        level(rep, "wells.screen_top", w.screen_top.as_ref())?;
        level(rep, "wells.screen_base", w.screen_base.as_ref())?;
        level(rep, "wells.filter_top", w.filter_top.as_ref())?;
        level(rep, "wells.filter_base", w.filter_base.as_ref())?;
        level(rep, "wells.pump_intake", w.pump_intake.as_ref())?;
    }
    for (i, n) in raw.neighbour.iter().enumerate() {
        let f = format!("neighbour[{}].foundation_level", i + 1);
        level(rep, &f, n.foundation_level.as_ref())?;
    }
    if let Some(c) = &raw.checks {
        for (i, p) in c.point.iter().enumerate() {
            let f = format!("checks.point[{}].target_level", i + 1);
            level(rep, &f, p.target_level.as_ref())?;
        }
    }
    if let Some(u) = &raw.uplift {
        level(rep, "uplift.layer_top", Some(&u.layer_top))?;
        level(rep, "uplift.piezometric_level", Some(&u.piezometric_level))?;
    }
    Ok(())
}

fn too_many(
    rep: &Reporter,
    field: &str,
    n: usize,
    max: usize,
    what: &str,
) -> Result<(), InputError> {
    if n > max {
        return Err(rep.error(
            field,
            None,
            format!("{n} {what} is more than the {max} drydig builds; give fewer {what}"),
        ));
    }
    Ok(())
}

fn counts(rep: &Reporter, raw: &DesignFile) -> Result<(), InputError> {
    too_many(
        rep,
        "excavation",
        raw.excavation.len(),
        MAX_ITEMS,
        "excavations",
    )?;
    too_many(rep, "well", raw.well.len(), MAX_WELLS, "listed wells")?;
    too_many(rep, "boundary", raw.boundary.len(), MAX_ITEMS, "boundaries")?;
    too_many(
        rep,
        "keep_out",
        raw.keep_out.len(),
        MAX_ITEMS,
        "keep-out zones",
    )?;
    too_many(
        rep,
        "neighbour",
        raw.neighbour.len(),
        MAX_ITEMS,
        "neighbours",
    )?;
    for (i, n) in raw.neighbour.iter().enumerate() {
        let f = format!("neighbour[{}].layer", i + 1);
        too_many(rep, &f, n.layer.len(), MAX_LAYERS, "soil layers")?;
    }
    if let Some(c) = &raw.checks {
        let n = c.point.len();
        too_many(rep, "checks.point", n, MAX_NAMED_POINTS, "named points")?;
    }
    if let Some(t) = raw.influence.test.as_ref() {
        let n = t.observation.len();
        too_many(
            rep,
            "influence.test.observation",
            n,
            MAX_LAYERS,
            "observations",
        )?;
    }
    if let Some(l) = &raw.layout {
        if let Some(n) = l.count {
            if n as usize > MAX_WELLS {
                return Err(rep.error(
                    "layout.count",
                    None,
                    format!("a ring of {n} wells is more than the {MAX_WELLS} drydig builds; give a smaller count (usual 4 … 200)"),
                ));
            }
        }
    }
    if let Some(s) = raw.wells.as_ref().and_then(|w| w.standby) {
        if s as usize > MAX_WELLS {
            return Err(rep.error(
                "wells.standby",
                None,
                format!("{s} standby wells is more than {MAX_WELLS}; usual 1 … 3"),
            ));
        }
    }
    Ok(())
}

fn coordinate(rep: &Reporter, field: &str, x: f64, y: f64) -> Result<(), InputError> {
    if !(x.is_finite() && y.is_finite()) {
        return Err(rep.error(field, None, "x and y must be finite numbers in metres"));
    }
    if x.abs() > MAX_COORD || y.abs() > MAX_COORD {
        return Err(rep.error(
            field,
            None,
            format!("({x:e}, {y:e}) lies beyond ±{MAX_COORD:e} m of the grid origin; give projected coordinates in metres (UTM or a national grid)"),
        ));
    }
    Ok(())
}

/// Bare numbers: listed coordinates, and dimensionless parameters within the bounds any site
/// has (outline points are checked where they are read, in `shapes::points`).
fn bare_numbers(rep: &Reporter, raw: &DesignFile) -> Result<(), InputError> {
    for (i, w) in raw.well.iter().enumerate() {
        coordinate(rep, &format!("well[{}].x", i + 1), w.x, w.y)?;
    }
    if let Some(c) = &raw.checks {
        for (i, p) in c.point.iter().enumerate() {
            coordinate(rep, &format!("checks.point[{}].x", i + 1), p.x, p.y)?;
        }
    }
    let mut bare: Vec<(String, f64, f64, f64)> = Vec::new();
    if let Some(v) = raw.aquifer.storativity {
        bare.push(("aquifer.storativity".into(), v, 0.0, 1.0));
    }
    if let Some(v) = raw.aquifer.specific_yield {
        bare.push(("aquifer.specific_yield".into(), v, 0.0, 1.0));
    }
    if let Some(v) = raw.influence.sichardt_c {
        bare.push(("influence.sichardt_c".into(), v, 0.0, 1e5));
    }
    if let Some(v) = raw.influence.sichardt_c_line {
        bare.push(("influence.sichardt_c_line".into(), v, 0.0, 1e5));
    }
    if let Some(v) = raw.allowances.as_ref().and_then(|a| a.trench_aspect_ratio) {
        bare.push(("allowances.trench_aspect_ratio".into(), v, 0.0, 1e6));
    }
    if let Some(v) = raw.uplift.as_ref().and_then(|u| u.factor_of_safety) {
        bare.push(("uplift.factor_of_safety".into(), v, 0.0, 100.0));
    }
    for (i, n) in raw.neighbour.iter().enumerate() {
        for (j, l) in n.layer.iter().enumerate() {
            let f = format!("neighbour[{}].layer[{}]", i + 1, j + 1);
            if let Some(v) = l.c_c {
                bare.push((format!("{f}.c_c"), v, 0.0, 10.0));
            }
            if let Some(v) = l.e0 {
                bare.push((format!("{f}.e0"), v, 0.0, 20.0));
            }
        }
    }
    for (field, v, lo, hi) in bare {
        if !(v.is_finite() && (lo..=hi).contains(&v.abs())) {
            return Err(rep.error(
                field,
                None,
                format!("{v} is outside what a site can have (magnitude {lo} … {hi})"),
            ));
        }
    }
    Ok(())
}
