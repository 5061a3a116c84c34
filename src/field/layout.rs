//! Well layouts: a ring around an excavation, a line of wellpoints along a trench, or wells the
//! user lists (in the design file or a CSV file). Generated wells that fall in a keep-out zone
//! are moved along their ring or line to the nearest free place, and the move is reported.

use crate::field::centre_line;
use crate::field::layout_notes::LayoutNote;
use crate::field::shape::length_and_width;
use crate::field::wells::Well;
use crate::field::wells_csv::read_csv;
use crate::input::error::InputError;
use crate::input::model::{Excavation, LayoutKind, LayoutSpec, Model, NamedPolygon, RingCount};
use geo::algorithm::buffer::{BufferStyle, LineJoin};
use geo::{Area, Buffer, Contains, Point, Polygon};
use std::path::Path;

/// Turn angle (degrees) above which a ring vertex counts as a corner for corner wells.
const CORNER_ANGLE_DEG: f64 = 20.0;
/// Step (m) in the search along the ring for a free place outside keep-out zones.
pub const KEEP_OUT_STEP: f64 = 0.25;
/// Most trial positions tried when moving one well out of a keep-out zone; on a long path the
/// step grows past [`KEEP_OUT_STEP`] so the search stays within this bound.
const MAX_MOVE_STEPS: usize = 4_000;
/// Most wells a layout or a CSV file may hold (the same bound as for listed wells).
pub const MAX_WELLS: usize = crate::input::validate::ranges::MAX_WELLS;

/// Wells placed by a layout, with notes on anything moved or skipped.
#[derive(Debug, Clone)]
pub struct Placement {
    /// The wells.
    pub wells: Vec<Well>,
    /// What an engineer should know about the placement (SI numbers; worded with
    /// [`LayoutNote::words`] in the run's units where shown).
    pub notes: Vec<LayoutNote>,
    /// The path the wells were placed along (ring or lines), for maps.
    pub paths: Vec<Vec<[f64; 2]>>,
}

/// A closed or open path with cumulative arc length, to place points by distance along it.
struct Path2 {
    points: Vec<[f64; 2]>,
    cumulative: Vec<f64>,
}

impl Path2 {
    fn new(points: Vec<[f64; 2]>, closed: bool) -> Path2 {
        let mut pts = points;
        if closed && pts.first() != pts.last() {
            pts.push(pts[0]);
        }
        let mut cumulative = vec![0.0];
        for w in pts.windows(2) {
            let d = (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]);
            cumulative.push(cumulative.last().unwrap_or(&0.0) + d);
        }
        Path2 {
            points: pts,
            cumulative,
        }
    }

    fn length(&self) -> f64 {
        *self.cumulative.last().unwrap_or(&0.0)
    }

    /// Point at arc length `s` (wrapped for closed paths by the caller).
    fn at(&self, s: f64) -> [f64; 2] {
        let s = s.clamp(0.0, self.length());
        let i = match self.cumulative.binary_search_by(|c| c.total_cmp(&s)) {
            Ok(i) => return self.points[i],
            Err(i) => i.max(1) - 1,
        };
        let i = i.min(self.points.len() - 2);
        let seg = self.cumulative[i + 1] - self.cumulative[i];
        let t = if seg > 0.0 {
            (s - self.cumulative[i]) / seg
        } else {
            0.0
        };
        let (a, b) = (self.points[i], self.points[i + 1]);
        [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
    }
}

/// The ring at `offset` outside the outline (mitred corners, so corners stay corners).
pub fn offset_ring(outline: &Polygon<f64>, offset: f64) -> Vec<[f64; 2]> {
    let ring: Vec<[f64; 2]> = if offset <= 0.0 {
        outline.exterior().0.iter().map(|c| [c.x, c.y]).collect()
    } else {
        // i_overlay's Miter takes the sharpest corner angle (radians) still mitred, not a
        // length ratio: π/3 mitres every corner whose mitre is at most 2 × offset long.
        let join = LineJoin::Miter(std::f64::consts::FRAC_PI_3);
        let grown = outline.buffer_with_style(BufferStyle::new(offset).line_join(join));
        let biggest = grown
            .0
            .iter()
            .max_by(|a, b| a.unsigned_area().total_cmp(&b.unsigned_area()))
            .cloned()
            .unwrap_or_else(|| outline.clone());
        biggest.exterior().0.iter().map(|c| [c.x, c.y]).collect()
    };
    let mut pts = ring;
    if pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
    pts
}

/// Indices of ring vertices where the direction turns by more than [`CORNER_ANGLE_DEG`].
fn corner_indices(pts: &[[f64; 2]]) -> Vec<usize> {
    let n = pts.len();
    (0..n)
        .filter(|&i| {
            let a = pts[(i + n - 1) % n];
            let b = pts[i];
            let c = pts[(i + 1) % n];
            let (u, v) = ([b[0] - a[0], b[1] - a[1]], [c[0] - b[0], c[1] - b[1]]);
            let cross = u[0] * v[1] - u[1] * v[0];
            let dot = u[0] * v[0] + u[1] * v[1];
            cross.atan2(dot).abs().to_degrees() > CORNER_ANGLE_DEG
        })
        .collect()
}

/// The offset clips sharp corners into short bevels with two vertices; one well stands at the
/// middle of each bevel, the point of the ring nearest the excavation's corner.
fn merge_bevels(corners: Vec<f64>, within: f64) -> Vec<f64> {
    let mut out: Vec<(f64, usize)> = Vec::new();
    for c in corners {
        match out.last_mut() {
            Some((sum, n)) if c - *sum / *n as f64 <= within => {
                *sum += c;
                *n += 1;
            }
            _ => out.push((c, 1)),
        }
    }
    out.into_iter().map(|(sum, n)| sum / n as f64).collect()
}

/// Arc-length positions of `n` wells on a closed ring, evenly spaced; with corners, one well at
/// each corner and the rest shared among the stretches between corners by length.
fn ring_positions(path: &Path2, corners: &[f64], n: usize) -> Vec<f64> {
    let total = path.length();
    if corners.is_empty() || n < corners.len() {
        return (0..n).map(|i| total * i as f64 / n as f64).collect();
    }
    let k = corners.len();
    let stretches: Vec<f64> = (0..k)
        .map(|i| {
            let next = if i + 1 < k {
                corners[i + 1]
            } else {
                corners[0] + total
            };
            next - corners[i]
        })
        .collect();
    // Largest-remainder share of the n − k extra wells, by stretch length.
    let extra = n - k;
    let mut share: Vec<usize> = stretches
        .iter()
        .map(|l| (l / total * extra as f64).floor() as usize)
        .collect();
    let mut left = extra - share.iter().sum::<usize>();
    let mut order: Vec<usize> = (0..k).collect();
    order.sort_by(|&a, &b| {
        let ra = stretches[a] / (share[a] + 1) as f64;
        let rb = stretches[b] / (share[b] + 1) as f64;
        rb.total_cmp(&ra)
    });
    for &i in order.iter().cycle().take(k * 2) {
        if left == 0 {
            break;
        }
        share[i] += 1;
        left -= 1;
    }
    let mut out = Vec::with_capacity(n);
    for i in 0..k {
        let m = share[i] + 1;
        for j in 0..m {
            out.push((corners[i] + stretches[i] * j as f64 / m as f64) % total);
        }
    }
    out
}

/// Number of wells that keeps every gap on the ring at most `spacing`.
fn count_for_spacing(path: &Path2, corners: &[f64], spacing: f64) -> usize {
    let total = path.length();
    if corners.is_empty() {
        return ((total / spacing).ceil() as usize).max(3);
    }
    let k = corners.len();
    (0..k)
        .map(|i| {
            let next = if i + 1 < k {
                corners[i + 1]
            } else {
                corners[0] + total
            };
            ((next - corners[i]) / spacing).ceil().max(1.0) as usize
        })
        .sum::<usize>()
        .max(3)
}

fn blocked(p: [f64; 2], zones: &[&Polygon<f64>]) -> bool {
    let pt = Point::new(p[0], p[1]);
    zones.iter().any(|z| z.contains(&pt))
}

/// Move position `s` along a closed path to the nearest place outside every zone.
fn free_position(path: &Path2, s: f64, zones: &[&Polygon<f64>], closed: bool) -> Option<f64> {
    let total = path.length();
    let wrap = |x: f64| if closed { x.rem_euclid(total) } else { x };
    let step = KEEP_OUT_STEP.max(total / MAX_MOVE_STEPS as f64);
    let steps = ((total / step).ceil() as usize).min(MAX_MOVE_STEPS);
    for i in 0..=steps {
        for sign in [1.0, -1.0] {
            let cand = wrap(s + sign * i as f64 * step);
            if !(0.0..=total).contains(&cand) {
                continue;
            }
            if !blocked(path.at(cand), zones) {
                return Some(cand);
            }
        }
    }
    None
}

fn keep_out_zones(model: &Model) -> Vec<(&str, &Polygon<f64>)> {
    let mut zones: Vec<(&str, &Polygon<f64>)> = model
        .keep_outs
        .iter()
        .map(|k: &NamedPolygon| (k.name.as_str(), &k.polygon))
        .collect();
    zones.extend(
        model
            .neighbours
            .iter()
            .map(|n| (n.name.as_str(), &n.footprint)),
    );
    zones.extend(
        model
            .excavations
            .iter()
            .map(|e| (e.name.as_str(), &e.outline)),
    );
    zones
}

/// Place wells on `path` at arc positions, moving any that fall in a keep-out zone.
#[allow(clippy::too_many_arguments)]
fn place(
    model: &Model,
    path: &Path2,
    positions: &[f64],
    closed: bool,
    prefix: &str,
    rate: f64,
    notes: &mut Vec<LayoutNote>,
) -> Vec<Well> {
    let zones = keep_out_zones(model);
    let polys: Vec<&Polygon<f64>> = zones.iter().map(|z| z.1).collect();
    let mut wells = Vec::new();
    for (i, &s) in positions.iter().enumerate() {
        let name = format!("{prefix}{:02}", i + 1);
        let at = |s: f64| path.at(s);
        let p = at(s);
        let mut well = Well::from_spec(name.clone(), p, rate, &model.wells);
        if let Some((zone, _)) = zones.iter().find(|z| blocked(p, &[z.1])) {
            match free_position(path, s, &polys, closed) {
                Some(s2) => {
                    let moved = (s2 - s).abs().min(path.length() - (s2 - s).abs());
                    well.position = at(s2);
                    let note = LayoutNote::Moved {
                        well: name.clone(),
                        distance_m: moved,
                        zone: zone.to_string(),
                    };
                    well.note = Some(note.words(model.units));
                    notes.push(note);
                }
                None => {
                    notes.push(LayoutNote::Said(format!("{name} dropped: no free place on its line outside keep-out zone \"{zone}\"")));
                    continue;
                }
            }
        }
        wells.push(well);
    }
    wells
}

/// A ring of `n` wells (or by spacing) at `offset` outside the excavation outline.
pub fn ring(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    count: RingCount,
    corner_wells: bool,
    rate: f64,
) -> Placement {
    ring_from(model, excavation, offset, count, corner_wells, rate, 0.0)
}

/// As [`ring`], with the first well `start` m along the ring from its first vertex (without
/// corner wells; corner wells fix the positions).
pub fn ring_from(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    count: RingCount,
    corner_wells: bool,
    rate: f64,
    start: f64,
) -> Placement {
    let pts = offset_ring(&excavation.outline, offset);
    let path = Path2::new(pts.clone(), true);
    let corners: Vec<f64> = if corner_wells {
        merge_bevels(
            corner_indices(&pts)
                .into_iter()
                .map(|i| path.cumulative[i])
                .collect(),
            1.5 * offset + 0.01,
        )
    } else {
        Vec::new()
    };
    let n = match count {
        RingCount::Count(n) => n as usize,
        RingCount::MaxSpacing(s) => count_for_spacing(&path, &corners, s),
    };
    let mut notes = Vec::new();
    // `generate` refuses counts past MAX_WELLS before this is reached; callers that build rings
    // of their own (the count search) are held to the same bound here.
    let n = if n > MAX_WELLS {
        notes.push(LayoutNote::Said(format!(
            "{n} wells is more than {MAX_WELLS}: {MAX_WELLS} placed"
        )));
        MAX_WELLS
    } else {
        n
    };
    if corner_wells && n < corners.len() {
        notes.push(LayoutNote::Said(format!(
            "{n} wells are fewer than the {} corners: spaced evenly instead",
            corners.len()
        )));
    }
    let mut positions = ring_positions(&path, &corners, n);
    if corners.is_empty() && start != 0.0 {
        let total = path.length();
        positions
            .iter_mut()
            .for_each(|s| *s = (*s + start).rem_euclid(total));
    }
    let wells = place(model, &path, &positions, true, "W", rate, &mut notes);
    let mut closed = pts.clone();
    closed.push(pts[0]);
    Placement {
        wells,
        notes,
        paths: vec![closed],
    }
}

/// The trench centre line: the layout's own, else the excavation's
/// ([`centre_line::of_excavation`]: given, derived along a bend, or the long axis of the
/// enclosing rectangle).
pub fn centre_line(excavation: &Excavation, given: Option<&Vec<[f64; 2]>>) -> Vec<[f64; 2]> {
    match given {
        Some(c) => c.clone(),
        None => centre_line::of_excavation(excavation),
    }
}

/// How far wellpoint lines run past each end of a trench, m: the user's value, or by default
/// half the trench width plus the offset (so the two lines and the ends form a closed fence).
pub fn end_extension(excavation: &Excavation, offset: f64, given: Option<f64>) -> f64 {
    given.unwrap_or_else(|| length_and_width(excavation).1 / 2.0 + offset)
}

/// Wellpoints along a trench at `spacing`, `offset` outside each edge, on one side or both.
/// The line runs past each end of the trench by the same distance as the edge, so the ends are
/// covered too.
pub fn line(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    spacing: f64,
    both_sides: bool,
    given: Option<&Vec<[f64; 2]>>,
    rate: f64,
) -> Placement {
    line_with_ends(
        model, excavation, offset, spacing, both_sides, given, None, rate,
    )
}

/// As [`line()`], with the lines run `end_extension` metres past each end of the trench
/// (`None`: the default of [`end_extension`]).
#[allow(clippy::too_many_arguments)]
pub fn line_with_ends(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    spacing: f64,
    both_sides: bool,
    given: Option<&Vec<[f64; 2]>>,
    end_ext: Option<f64>,
    rate: f64,
) -> Placement {
    line_from(
        model, excavation, offset, spacing, both_sides, given, end_ext, rate, 0.0,
    )
}

/// As [`line_with_ends`], with the end wellpoints `start` m inside each end of the line (the
/// wellpoints between spread evenly at most `spacing` apart).
#[allow(clippy::too_many_arguments)]
pub fn line_from(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    spacing: f64,
    both_sides: bool,
    given: Option<&Vec<[f64; 2]>>,
    end_ext: Option<f64>,
    rate: f64,
    start: f64,
) -> Placement {
    let mut centre = centre_line(excavation, given);
    let (_, width) = length_and_width(excavation);
    let side = width / 2.0 + offset;
    let extension = end_extension(excavation, offset, end_ext);
    // Extend both ends.
    if centre.len() >= 2 {
        let ext = |a: [f64; 2], b: [f64; 2]| {
            let l = (a[0] - b[0]).hypot(a[1] - b[1]).max(1e-12);
            [
                a[0] + (a[0] - b[0]) / l * extension,
                a[1] + (a[1] - b[1]) / l * extension,
            ]
        };
        let n = centre.len();
        let first = ext(centre[0], centre[1]);
        let last = ext(centre[n - 1], centre[n - 2]);
        centre[0] = first;
        centre[n - 1] = last;
    }
    let total = centre_line::length(&centre);
    let mut notes = Vec::new();
    let sides: &[(f64, &str)] = if both_sides {
        &[(1.0, "L"), (-1.0, "R")]
    } else {
        &[(1.0, "L")]
    };
    let mut wells = Vec::new();
    let mut paths = Vec::new();
    let mut spacings = Vec::new();
    for (sign, tag) in sides {
        // Each line is the centre line offset to its side (mitred at bends), and its wellpoints
        // are spaced along its own length: the outside of a bend is longer than the inside.
        let line_points = centre_line::offset(&centre, sign * side);
        let path = Path2::new(line_points.clone(), false);
        let length = path.length();
        let start = start.clamp(0.0, 0.49 * length);
        let inner = length - 2.0 * start;
        let wanted = (inner / spacing).ceil();
        // Held to MAX_WELLS per side (`generate` refuses more before this is reached).
        let count = if wanted.is_finite() && wanted < MAX_WELLS as f64 {
            (wanted as usize).max(1) + 1
        } else {
            MAX_WELLS
        };
        let positions: Vec<f64> = (0..count)
            .map(|i| start + inner * i as f64 / (count - 1) as f64)
            .collect();
        spacings.push(inner / (count - 1) as f64);
        wells.extend(place(
            model,
            &path,
            &positions,
            false,
            &format!("{tag}-"),
            rate,
            &mut notes,
        ));
        paths.push(line_points);
    }
    let (lo, hi) = spacings
        .iter()
        .fold((f64::INFINITY, 0.0f64), |(a, b), s| (a.min(*s), b.max(*s)));
    notes.push(LayoutNote::Wellpoints {
        count: wells.len(),
        spacing_m: (lo, hi),
        length_m: total,
        both_sides,
    });
    Placement {
        wells,
        notes,
        paths,
    }
}

/// Estimated number of wells a layout places, before any is built: the ring's count, or the
/// path length over the spacing (per side for a line). Used to refuse huge layouts with a
/// message naming the setting.
pub fn estimated_count(model: &Model, spec: &LayoutSpec) -> f64 {
    use geo::BoundingRect;
    let exc = &model.excavations[spec.excavation];
    let perimeter: f64 = exc
        .outline
        .exterior()
        .lines()
        .map(|l| l.dx().hypot(l.dy()))
        .sum();
    match &spec.kind {
        LayoutKind::Ring { count, .. } => match count {
            RingCount::Count(n) => *n as f64,
            RingCount::MaxSpacing(s) => {
                (perimeter + std::f64::consts::TAU * spec.offset) / s
                    + exc.outline.exterior().0.len() as f64
            }
        },
        LayoutKind::Line {
            spacing,
            both_sides,
            centre_line,
            end_extension,
        } => {
            // The line outside a bend is longer than the centre line by 2·d·tan(θ/2) per bend
            // of turn θ: the bounding box's diagonal bounds both for the count check.
            let length = match centre_line {
                Some(c) => centre_line::length(c),
                None => centre_line::length(&centre_line::of_excavation(exc)),
            }
            .max(
                exc.outline
                    .bounding_rect()
                    .map_or(0.0, |b| b.width().hypot(b.height())),
            );
            let ext = end_extension.unwrap_or(length_and_width(exc).1 / 2.0 + spec.offset);
            let sides = if *both_sides { 2.0 } else { 1.0 };
            sides * ((length + 2.0 * ext) / spacing + 1.0)
        }
        LayoutKind::Listed => model.listed_wells.len() as f64,
        LayoutKind::Csv { .. } => 0.0,
    }
}

/// The layout of the design file, with every generated well at `rate` when given (else the
/// layout's own rate, else zero).
pub fn from_model(model: &Model, wells_csv: Option<&Path>) -> Result<Placement, InputError> {
    if let Some(p) = wells_csv {
        return Ok(Placement {
            wells: read_csv(model, p)?,
            notes: vec![LayoutNote::Said(format!("wells read from {}", p.display()))],
            paths: vec![],
        });
    }
    let Some(spec) = &model.layout else {
        if !model.listed_wells.is_empty() {
            return Ok(listed(model));
        }
        return Err(InputError {
            file: model.file.clone(),
            field: "layout".into(),
            line: None,
            message: "no wells to check: add a [layout] (kind = \"ring\", \"line\", \"listed\" or \"csv\"), [[well]] entries, or pass --wells FILE.csv".into(),
        });
    };
    generate(model, spec, spec.rate.unwrap_or(0.0))
}

fn listed(model: &Model) -> Placement {
    let wells = model
        .listed_wells
        .iter()
        .map(|w| {
            let mut well = Well::from_spec(w.name.clone(), w.position, w.rate, &model.wells);
            well.radius = w.radius;
            well
        })
        .collect();
    Placement {
        wells,
        notes: vec![],
        paths: vec![],
    }
}

/// Generate the layout `spec` with every generated well at `rate`.
pub fn generate(model: &Model, spec: &LayoutSpec, rate: f64) -> Result<Placement, InputError> {
    let exc = &model.excavations[spec.excavation];
    let n = estimated_count(model, spec);
    if n.is_nan() || n > MAX_WELLS as f64 {
        let setting = match spec.kind {
            LayoutKind::Ring { .. } => "layout.max_spacing",
            _ => "layout.spacing",
        };
        return Err(InputError {
            file: model.file.clone(),
            field: setting.into(),
            line: None,
            message: format!("the layout would place about {n:.0} wells, more than the {MAX_WELLS} drydig builds; give a larger {setting}"),
        });
    }
    Ok(match &spec.kind {
        LayoutKind::Ring {
            count,
            corner_wells,
        } => ring_from(
            model,
            exc,
            spec.offset,
            *count,
            *corner_wells,
            rate,
            spec.start,
        ),
        LayoutKind::Line {
            spacing,
            both_sides,
            centre_line,
            end_extension,
        } => {
            let mut p = line_from(
                model,
                exc,
                spec.offset,
                *spacing,
                *both_sides,
                centre_line.as_ref(),
                *end_extension,
                rate,
                spec.start,
            );
            p.notes.extend(
                model
                    .rolling
                    .as_ref()
                    .map(|r| LayoutNote::Rolling(Box::new(r.clone()))),
            );
            p
        }
        LayoutKind::Listed => listed(model),
        LayoutKind::Csv { path } => Placement {
            wells: read_csv(model, path)?,
            notes: vec![],
            paths: vec![],
        },
    })
}

/// Whether `p` lies in a keep-out zone (the design file's keep-outs, the neighbours'
/// footprints, the excavations).
pub fn in_keep_out(model: &Model, p: [f64; 2]) -> bool {
    let zones = keep_out_zones(model);
    let polys: Vec<&Polygon<f64>> = zones.iter().map(|z| z.1).collect();
    blocked(p, &polys)
}

/// Candidate positions every `step` m along the ring at `offset` outside the excavation,
/// those in a keep-out zone left out, with the closed ring they stand on.
pub fn ring_candidates(
    model: &Model,
    excavation: &Excavation,
    offset: f64,
    step: f64,
) -> (Vec<[f64; 2]>, Vec<[f64; 2]>) {
    let pts = offset_ring(&excavation.outline, offset);
    let path = Path2::new(pts.clone(), true);
    let n = ((path.length() / step.max(1e-3)).ceil() as usize).clamp(3, MAX_WELLS);
    let each = path.length() / n as f64;
    let cands = (0..n)
        .map(|i| path.at(i as f64 * each))
        .filter(|p| !in_keep_out(model, *p))
        .collect();
    let mut closed = pts.clone();
    closed.push(pts[0]);
    (cands, closed)
}

/// The free position on the closed `ring` nearest to `p`: the foot of `p` on the ring, moved
/// along it (both ways, in steps of [`KEEP_OUT_STEP`]) until it is out of every keep-out zone
/// and at least `min_spacing` m from every point of `taken`. `None` when the ring has no such
/// place.
pub fn free_on_ring(
    model: &Model,
    ring: &[[f64; 2]],
    p: [f64; 2],
    taken: &[[f64; 2]],
    min_spacing: f64,
) -> Option<[f64; 2]> {
    let path = Path2::new(ring.to_vec(), true);
    let total = path.length();
    if total <= 0.0 {
        return None;
    }
    // Arc length of the foot of p on the ring.
    let mut best = (f64::INFINITY, 0.0);
    for (i, w) in path.points.windows(2).enumerate() {
        let (a, b) = (w[0], w[1]);
        let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
        let len2 = dx * dx + dy * dy;
        let t = if len2 > 0.0 {
            (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2).clamp(0.0, 1.0)
        } else {
            0.0
        };
        let f = [a[0] + t * dx, a[1] + t * dy];
        let d = (f[0] - p[0]).hypot(f[1] - p[1]);
        if d < best.0 {
            best = (d, path.cumulative[i] + t * len2.sqrt());
        }
    }
    let zones = keep_out_zones(model);
    let polys: Vec<&Polygon<f64>> = zones.iter().map(|z| z.1).collect();
    let free = |q: [f64; 2]| {
        !blocked(q, &polys)
            && taken
                .iter()
                .all(|t| (t[0] - q[0]).hypot(t[1] - q[1]) >= min_spacing - 1e-9)
    };
    let step = KEEP_OUT_STEP.max(total / MAX_MOVE_STEPS as f64);
    let steps = ((0.5 * total / step).ceil() as usize).min(MAX_MOVE_STEPS);
    (0..=steps)
        .flat_map(|i| [1.0, -1.0].map(|sign| (best.1 + sign * i as f64 * step).rem_euclid(total)))
        .map(|s| path.at(s))
        .find(|q| free(*q))
}
