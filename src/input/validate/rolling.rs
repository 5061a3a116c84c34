//! `[rolling]`: a straight trench installed and dug in lengths (a rolling run of wellpoints).
//!
//! Only `open_length` m of trench is open at a time; the face advances `advance_per_day` m a
//! day. The wellpoint line is installed `run_in` m ahead of the open length (pumping before
//! the ground is dug) and kept `run_out` m behind it (while the pipe is laid and the trench
//! backfilled), and the set is moved along from behind to ahead as the face advances.
//!
//! The design is of one position of the set: the excavation becomes the open length, taken
//! where the whole set lies in the middle of the trench, with check points (and targets) on the
//! open length only; the line runs from `run_out` behind it to `run_in` ahead of it (no further
//! end extension). The whole trench is kept in [`Rolling`] for the bid (wellpoints installed
//! once along the whole route) and the digging time.
//!
//! Defaults (common practice (no source)): run-in = two days of advance (the ground drained for
//! two days before it is dug), run-out = one day of advance (the length being piped and
//! backfilled), each at least [`MIN_RUN`].

use crate::input::error::{InputError, Reporter};
use crate::input::model::{Excavation, LayoutKind, LayoutSpec, Rolling};
use crate::input::schema;
use crate::input::validate::shapes::check_positive;
use geo::{Area, Coord, LineString, MinimumRotatedRect, Polygon};

/// Days of advance the line is installed ahead of the open length, by default (common
/// practice (no source)).
pub const RUN_IN_DAYS: f64 = 2.0;
/// Days of advance the line is kept behind the open length, by default (common practice (no
/// source)).
pub const RUN_OUT_DAYS: f64 = 1.0;
/// Shortest default run-in or run-out, m (common practice (no source): about one pump set's
/// reach of drawdown past the end of an open length).
pub const MIN_RUN: f64 = 10.0;

/// `[rolling]` checked; the excavation it serves turned into its open length and the layout's
/// line into the installed length. `None` without `[rolling]`.
pub fn rolling(
    rep: &Reporter,
    raw: Option<&schema::Rolling>,
    excavations: &mut [Excavation],
    layout: Option<&mut LayoutSpec>,
) -> Result<Option<Rolling>, InputError> {
    let Some(r) = raw else {
        return Ok(None);
    };
    let Some(spec) = layout else {
        return Err(rep.error(
            "rolling",
            None,
            "a rolling run needs a [layout] with kind = \"line\" along the trench",
        ));
    };
    let LayoutKind::Line {
        centre_line,
        end_extension,
        ..
    } = &mut spec.kind
    else {
        return Err(rep.error(
            "rolling",
            None,
            "a rolling run needs layout.kind = \"line\" (wellpoints or wells along the trench); a ring is not moved along",
        ));
    };
    if end_extension.is_some() {
        return Err(rep.error(
            "layout.end_extension",
            None,
            "with [rolling] the line's ends are rolling.run_in and rolling.run_out; leave out layout.end_extension",
        ));
    }
    let exc = &mut excavations[spec.excavation];
    let axis = straight_axis(rep, exc, centre_line.as_ref())?;
    let length = dist(axis.0, axis.1);
    let width = exc.outline.unsigned_area() / length.max(1e-9);
    let open = check_positive(
        rep,
        "rolling.open_length",
        &r.open_length,
        "trench open at one time, e.g. \"30 m\"",
    )?;
    let advance = check_positive(
        rep,
        "rolling.advance_per_day",
        &r.advance_per_day,
        "length dug a day, e.g. \"15 m\"",
    )?;
    let run = |q: &Option<crate::input::units::Length>, field: &str, days: f64| match q {
        Some(q) if q.si >= 0.0 && q.si.is_finite() => Ok((q.si, false)),
        Some(q) => Err(rep.error(field, q.span.clone(), "must be zero or more, e.g. \"20 m\"")),
        None => Ok(((days * advance).max(MIN_RUN), true)),
    };
    let (run_in, run_in_default) = run(&r.run_in, "rolling.run_in", RUN_IN_DAYS)?;
    let (run_out, run_out_default) = run(&r.run_out, "rolling.run_out", RUN_OUT_DAYS)?;
    let installed = run_out + open + run_in;
    if installed > length + 1e-9 {
        return Err(rep.error(
            "rolling.open_length",
            r.open_length.span.clone(),
            format!("the open length plus run-in and run-out ({installed:.1} m) is longer than the trench ({length:.1} m): dig it in one open run (leave out [rolling]) or give shorter lengths"),
        ));
    }
    // The set in the middle of the trench: line from `from` to `from + installed`, open from
    // `from + run_out` to `from + run_out + open`.
    let from = 0.5 * (length - installed);
    let at = |s: f64| lerp(axis.0, axis.1, s / length);
    let (o0, o1) = (at(from + run_out), at(from + run_out + open));
    exc.outline = strip(o0, o1, 0.5 * width);
    exc.centre_line = Some(vec![o0, o1]);
    *centre_line = Some(vec![at(from), at(from + installed)]);
    *end_extension = Some(0.0);
    Ok(Some(Rolling {
        trench_length: length,
        trench_width: width,
        open_length: open,
        advance_per_day: advance,
        run_in,
        run_out,
        run_in_default,
        run_out_default,
        open_from: from + run_out,
    }))
}

/// The trench's straight axis end to end: the centre line given (two points), else the long
/// axis of the outline's enclosing rectangle, run from the end nearer the outline's first
/// vertex.
fn straight_axis(
    rep: &Reporter,
    exc: &Excavation,
    layout_line: Option<&Vec<[f64; 2]>>,
) -> Result<([f64; 2], [f64; 2]), InputError> {
    if let Some(line) = layout_line.or(exc.centre_line.as_ref()) {
        return match line.as_slice() {
            [a, b] => Ok((*a, *b)),
            _ => Err(rep.error(
                "rolling",
                None,
                "a rolling run needs a straight trench (a centre line of two points); split a bent trench into straight excavations",
            )),
        };
    }
    let Some(rect) = exc.outline.minimum_rotated_rect() else {
        return Err(rep.error("rolling", None, "the trench outline has no extent"));
    };
    let c: Vec<[f64; 2]> = rect.exterior().0.iter().map(|p| [p.x, p.y]).collect();
    let mid = |a: [f64; 2], b: [f64; 2]| lerp(a, b, 0.5);
    let (a, b) = if dist(c[0], c[1]) >= dist(c[1], c[2]) {
        (mid(c[1], c[2]), mid(c[3], c[0]))
    } else {
        (mid(c[0], c[1]), mid(c[2], c[3]))
    };
    let first = exc
        .outline
        .exterior()
        .0
        .first()
        .map_or([0.0, 0.0], |p| [p.x, p.y]);
    Ok(if dist(first, a) <= dist(first, b) {
        (a, b)
    } else {
        (b, a)
    })
}

/// The rectangle `half` m either side of the segment `a`–`b`.
fn strip(a: [f64; 2], b: [f64; 2], half: f64) -> Polygon<f64> {
    let l = dist(a, b).max(1e-12);
    let n = [-(b[1] - a[1]) / l * half, (b[0] - a[0]) / l * half];
    let c = |p: [f64; 2], s: f64| Coord {
        x: p[0] + s * n[0],
        y: p[1] + s * n[1],
    };
    Polygon::new(
        LineString::from(vec![
            c(a, -1.0),
            c(b, -1.0),
            c(b, 1.0),
            c(a, 1.0),
            c(a, -1.0),
        ]),
        vec![],
    )
}

fn lerp(a: [f64; 2], b: [f64; 2], t: f64) -> [f64; 2] {
    [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
}

fn dist(a: [f64; 2], b: [f64; 2]) -> f64 {
    (b[0] - a[0]).hypot(b[1] - a[1])
}
