//! A vertical section along a straight line: the water level from the superposition sampled
//! along it, and where the line crosses excavations, neighbours and passes wells, so that a
//! drawing only formats what is found here.

use crate::check::run::CheckRun;
use crate::field::checkpoints::DesignTarget;
use crate::physics::potential::Level;
use geo::{Centroid, Contains, Point};

/// Samples along the section line.
pub const SAMPLES: usize = 241;

/// One sample along the line.
#[derive(Debug, Clone)]
pub struct SectionSample {
    /// Distance from the start of the line, m.
    pub chainage: f64,
    /// Position, m.
    pub position: [f64; 2],
    /// Lowered water level, m (`None`: pumped dry to the aquifer base).
    pub level: Option<f64>,
}

/// A well near the line, projected onto it.
#[derive(Debug, Clone)]
pub struct SectionWell {
    /// Name.
    pub name: String,
    /// Chainage of its foot on the line, m.
    pub chainage: f64,
    /// Distance off the line, m.
    pub offset: f64,
    /// Screen top and base, pump intake, m.
    pub screen_top: f64,
    /// Screen base, m.
    pub screen_base: f64,
    /// Pump intake, m.
    pub pump_intake: f64,
}

/// A stretch of line inside a polygon (excavation, neighbour footprint).
#[derive(Debug, Clone)]
pub struct Crossing {
    /// Name.
    pub name: String,
    /// First and last chainage inside, m.
    pub from: f64,
    /// Last chainage inside, m.
    pub to: f64,
    /// Formation level (excavation) or foundation level (neighbour), m.
    pub level: Option<f64>,
    /// Target level (excavation), m: the relief head for a relief excavation.
    pub target: Option<f64>,
    /// The target is the relief head against base uplift, not formation − margin.
    pub relief: bool,
}

/// The section: line, levels along it and what it crosses.
#[derive(Debug, Clone)]
pub struct Section {
    /// Start and end, m.
    pub line: [[f64; 2]; 2],
    /// How the line was chosen, in words.
    pub basis: String,
    /// Levels along the line.
    pub samples: Vec<SectionSample>,
    /// Wells within [`well_band`] of the line.
    pub wells: Vec<SectionWell>,
    /// Excavations crossed.
    pub excavations: Vec<Crossing>,
    /// Neighbours crossed.
    pub neighbours: Vec<Crossing>,
    /// Cut-off walls crossed, along the line.
    pub walls: Vec<crate::check::section_ground::SectionWall>,
    /// Layered ground: the level in each aquifer where they differ (else empty).
    pub aquifer_levels: Vec<crate::check::section_ground::AquiferLevels>,
}

/// Wells this close to a line of length `l` (m) are drawn on it: max(3 m, l/30).
pub fn well_band(length: f64) -> f64 {
    (length / 30.0).max(3.0)
}

/// The section across the first excavation, a trench, at its worst check point (the lowest
/// margin, else the middle of the centre line): square to the centre line through the foot of
/// the perpendicular from that point, reaching half the width plus the larger of the radius of
/// influence, four times the distance to the nearest well and 10 m to each side.
pub fn across_trench(run: &CheckRun) -> Option<([[f64; 2]; 2], String)> {
    use crate::field::centre_line;
    let e = &run.model.excavations[0];
    let line = centre_line::of_excavation(e);
    if line.len() < 2 {
        return None;
    }
    let ev = &run.evaluation;
    let worst = ev
        .points
        .iter()
        .filter(|p| p.point.excavation == Some(0) && p.margin_m.is_some_and(f64::is_finite))
        .min_by(|a, b| {
            a.margin_m
                .unwrap_or(0.0)
                .total_cmp(&b.margin_m.unwrap_or(0.0))
        });
    let (at, what) = match worst {
        Some(p) => (
            p.point.position,
            format!("at its worst check point ({})", p.point.name),
        ),
        None => {
            let half = centre_line::length(&line) / 2.0;
            let mut left = half;
            let mut mid = line[0];
            for w in line.windows(2) {
                let l = (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]);
                if left <= l && l > 0.0 {
                    let t = left / l;
                    mid = [
                        w[0][0] + t * (w[1][0] - w[0][0]),
                        w[0][1] + t * (w[1][1] - w[0][1]),
                    ];
                    break;
                }
                left -= l;
            }
            (mid, "at the middle of its centre line".to_string())
        }
    };
    let (_, chainage, foot, dir) = centre_line::nearest(&line, at);
    let across = [-dir[1], dir[0]];
    let (_, width) = crate::field::shape::length_and_width(e);
    let nearest_well = run
        .placement
        .wells
        .iter()
        .map(|w| (w.position[0] - foot[0]).hypot(w.position[1] - foot[1]))
        .fold(f64::INFINITY, f64::min);
    let reach = width / 2.0
        + ev.radius_of_influence_m
            .max(if nearest_well.is_finite() {
                4.0 * nearest_well
            } else {
                0.0
            })
            .max(10.0);
    Some((
        [
            [foot[0] - reach * across[0], foot[1] - reach * across[1]],
            [foot[0] + reach * across[0], foot[1] + reach * across[1]],
        ],
        format!(
            "across the trench {what}, {} along its centre line",
            run.model.units.length_words(chainage, 1)
        ),
    ))
}

/// The default section line (a trench: [`across_trench`]): from beyond the far side of the first excavation, through its
/// centroid, to beyond `toward` (the worst neighbour's centroid); without one, along the
/// outline's longest axis (its longest vertex-to-vertex chord). Ends reach 30 % of the
/// excavation's length past the outline (and past the neighbour).
pub fn default_line(run: &CheckRun, toward: Option<[f64; 2]>) -> ([[f64; 2]; 2], String) {
    let e = &run.model.excavations[0];
    if crate::field::shape::is_trench(run.model, e) {
        if let Some(across) = across_trench(run) {
            return across;
        }
    }
    let ring: Vec<[f64; 2]> = e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect();
    let c = e.outline.centroid().map_or(ring[0], |p| [p.x(), p.y()]);
    let mut longest = (0.0, [1.0, 0.0]);
    for a in &ring {
        for b in &ring {
            let d = (b[0] - a[0]).hypot(b[1] - a[1]);
            if d > longest.0 {
                longest = (d, [(b[0] - a[0]) / d, (b[1] - a[1]) / d]);
            }
        }
    }
    let (size, axis) = longest;
    let (dir, basis, far) = match toward {
        Some(t) if (t[0] - c[0]).hypot(t[1] - c[1]) > 1e-6 => {
            let d = (t[0] - c[0]).hypot(t[1] - c[1]);
            (
                [(t[0] - c[0]) / d, (t[1] - c[1]) / d],
                "through the excavation towards the neighbour with the largest drawdown"
                    .to_string(),
                d,
            )
        }
        _ => (axis, "along the excavation's longest axis".to_string(), 0.0),
    };
    // Extent of the outline along the direction.
    let along: Vec<f64> = ring
        .iter()
        .map(|p| (p[0] - c[0]) * dir[0] + (p[1] - c[1]) * dir[1])
        .collect();
    let lo = along.iter().cloned().fold(f64::INFINITY, f64::min);
    let hi = along.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
    let pad = 0.3 * size.max(1.0);
    let t0 = lo - pad;
    let t1 = hi.max(far + 0.2 * size) + pad;
    (
        [
            [c[0] + t0 * dir[0], c[1] + t0 * dir[1]],
            [c[0] + t1 * dir[0], c[1] + t1 * dir[1]],
        ],
        basis,
    )
}

fn crossings<'a>(
    items: impl Iterator<Item = (&'a str, &'a geo::Polygon<f64>, Option<f64>, DesignTarget)>,
    samples: &[SectionSample],
) -> Vec<Crossing> {
    let mut out = Vec::new();
    for (name, poly, level, design) in items {
        let (target, relief) = (design.level, design.relief);
        let mut run: Option<(f64, f64)> = None;
        for s in samples {
            let inside = poly.contains(&Point::new(s.position[0], s.position[1]));
            match (inside, run) {
                (true, None) => run = Some((s.chainage, s.chainage)),
                (true, Some((a, _))) => run = Some((a, s.chainage)),
                (false, Some((a, b))) => {
                    out.push(Crossing {
                        name: name.to_string(),
                        from: a,
                        to: b,
                        level,
                        target,
                        relief,
                    });
                    run = None;
                }
                (false, None) => {}
            }
        }
        if let Some((a, b)) = run {
            out.push(Crossing {
                name: name.to_string(),
                from: a,
                to: b,
                level,
                target,
                relief,
            });
        }
    }
    out
}

/// The section along `line` for the run's wells and rates: levels h(x) from
/// [`crate::field::influence::Field::levels`] (the superposition of every well and image) at
/// [`SAMPLES`] equally spaced points, wells within [`well_band`] projected onto the line, the
/// stretches inside excavations and neighbour footprints, the walls crossed and, in layered
/// ground, the level in each aquifer ([`crate::check::section_ground`]).
pub fn section(run: &CheckRun, line: [[f64; 2]; 2], basis: &str) -> Section {
    let [a, b] = line;
    let length = (b[0] - a[0]).hypot(b[1] - a[1]);
    let positions: Vec<[f64; 2]> = (0..SAMPLES)
        .map(|i| {
            let t = i as f64 / (SAMPLES - 1) as f64;
            [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
        })
        .collect();
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    let levels = run.field.levels(&positions, &rates);
    let samples: Vec<SectionSample> = positions
        .iter()
        .zip(levels)
        .enumerate()
        .map(|(i, (p, lv))| SectionSample {
            chainage: length * i as f64 / (SAMPLES - 1) as f64,
            position: *p,
            level: match lv {
                Level::Wet(z) => Some(z),
                Level::Dry => None,
            },
        })
        .collect();
    let band = well_band(length);
    let u = [(b[0] - a[0]) / length, (b[1] - a[1]) / length];
    let wells = run
        .placement
        .wells
        .iter()
        .filter_map(|w| {
            let d = [w.position[0] - a[0], w.position[1] - a[1]];
            let ch = d[0] * u[0] + d[1] * u[1];
            let off = (d[1] * u[0] - d[0] * u[1]).abs();
            (off <= band && (0.0..=length).contains(&ch)).then(|| SectionWell {
                name: w.name.clone(),
                chainage: ch,
                offset: off,
                screen_top: w.screen_top,
                screen_base: w.screen_base,
                pump_intake: w.pump_intake,
            })
        })
        .collect();
    let m = run.model;
    let excavations = crossings(
        m.excavations.iter().map(|e| {
            (
                e.name.as_str(),
                &e.outline,
                Some(e.formation_level),
                crate::field::checkpoints::design_target(m, e),
            )
        }),
        &samples,
    );
    let neighbours = crossings(
        m.neighbours.iter().map(|n| {
            let none = DesignTarget {
                level: None,
                relief: false,
            };
            (n.name.as_str(), &n.footprint, n.foundation_level, none)
        }),
        &samples,
    );
    Section {
        line,
        basis: basis.to_string(),
        walls: crate::check::section_ground::walls_crossed(run, line),
        aquifer_levels: crate::check::section_ground::aquifer_levels(run, &positions),
        samples,
        wells,
        excavations,
        neighbours,
    }
}
