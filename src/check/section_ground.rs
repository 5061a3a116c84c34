//! What the section line meets below ground: the cut-off walls it crosses (where, and down to
//! which toe) and, in layered ground, the water level in each aquifer along it where it differs
//! from the level drawn for the aquifer the excavation's target reads. Computed here so that the
//! drawing only formats.

use crate::check::run::CheckRun;
use crate::physics::potential::Level;

/// Aquifer lines closer than this to the drawn water level everywhere are not drawn, m.
pub const SAME_LEVEL_M: f64 = 0.01;

/// A cut-off wall where the section line crosses it.
#[derive(Debug, Clone)]
pub struct SectionWall {
    /// Name from `[[wall]]`.
    pub name: String,
    /// Chainage of the crossing along the line, m.
    pub chainage: f64,
    /// Level of the toe, m (the impermeable base when the wall has no toe level).
    pub toe: f64,
    /// Whether the toe level was given (else the wall reaches the base).
    pub toe_given: bool,
}

/// The water level in one aquifer of layered ground along the line.
#[derive(Debug, Clone)]
pub struct AquiferLevels {
    /// The aquifer's name.
    pub name: String,
    /// Level at each section sample, m (`None`: pumped dry).
    pub levels: Vec<Option<f64>>,
    /// Whether this is the aquifer whose level the section's main line shows.
    pub main: bool,
}

/// Chainage (m from `a`) where the segment `a`–`b` crosses the segment `p`–`q`, by the
/// parametric intersection of two segments (plain plane geometry; common practice (no
/// source)); `None` when parallel or missing each other.
pub fn crossing_chainage(a: [f64; 2], b: [f64; 2], p: [f64; 2], q: [f64; 2]) -> Option<f64> {
    let r = [b[0] - a[0], b[1] - a[1]];
    let s = [q[0] - p[0], q[1] - p[1]];
    let denom = r[0] * s[1] - r[1] * s[0];
    if denom.abs() < 1e-12 {
        return None;
    }
    let ap = [p[0] - a[0], p[1] - a[1]];
    let t = (ap[0] * s[1] - ap[1] * s[0]) / denom;
    let u = (ap[0] * r[1] - ap[1] * r[0]) / denom;
    ((0.0..=1.0).contains(&t) && (0.0..=1.0).contains(&u)).then(|| t * r[0].hypot(r[1]))
}

/// Every crossing of `line` with a wall of the run, along the line.
pub fn walls_crossed(run: &CheckRun, line: [[f64; 2]; 2]) -> Vec<SectionWall> {
    let m = run.model;
    let base = m
        .layers
        .as_ref()
        .map_or(m.aquifer.base_level, |l| l.lowest_base());
    let mut out: Vec<SectionWall> = Vec::new();
    for w in &m.walls {
        for (p, q) in w.pieces() {
            let Some(ch) = crossing_chainage(line[0], line[1], p, q) else {
                continue;
            };
            // a crossing through a vertex is found on both pieces
            if out
                .iter()
                .any(|o| o.name == w.name && (o.chainage - ch).abs() < 1e-6)
            {
                continue;
            }
            out.push(SectionWall {
                name: w.name.clone(),
                chainage: ch,
                toe: w.toe_level.unwrap_or(base),
                toe_given: w.toe_level.is_some(),
            });
        }
    }
    out.sort_by(|a, b| a.chainage.total_cmp(&b.chainage));
    out
}

/// The level in each aquifer at `positions` (layered ground only; empty otherwise), from
/// [`crate::field::influence::Field::levels_in_each_aquifer`]. The aquifer the main line shows
/// is kept (marked `main`) when any other is drawn; the others only where they differ from it
/// by more than [`SAME_LEVEL_M`] somewhere.
pub fn aquifer_levels(run: &CheckRun, positions: &[[f64; 2]]) -> Vec<AquiferLevels> {
    let (Some(ground), Some(_)) = (&run.model.layers, run.field.layered()) else {
        return Vec::new();
    };
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    let mut lines: Vec<AquiferLevels> = ground
        .aquifers
        .iter()
        .map(|a| AquiferLevels {
            name: a.name.clone(),
            levels: Vec::with_capacity(positions.len()),
            main: false,
        })
        .collect();
    for p in positions {
        let each = run.field.levels_in_each_aquifer(*p, &rates);
        for (line, lv) in lines.iter_mut().zip(each) {
            line.levels.push(match lv {
                Level::Wet(z) => Some(z),
                Level::Dry => None,
            });
        }
    }
    let main = run
        .field
        .default_aquifer()
        .min(lines.len().saturating_sub(1));
    lines[main].main = true;
    let reference = lines[main].levels.clone();
    let differs = |l: &AquiferLevels| {
        l.levels.iter().zip(&reference).any(|(a, b)| match (a, b) {
            (Some(a), Some(b)) => (a - b).abs() > SAME_LEVEL_M,
            (None, None) => false,
            _ => true,
        })
    };
    let keep: Vec<bool> = lines.iter().map(|l| !l.main && differs(l)).collect();
    if !keep.iter().any(|&k| k) {
        return Vec::new();
    }
    lines
        .into_iter()
        .zip(keep)
        .filter(|(l, k)| l.main || *k)
        .map(|(l, _)| l)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::crossing_chainage;

    #[test]
    fn crossing_of_two_segments() {
        // the x axis from 0 to 10 crosses the vertical x = 4 at chainage 4 (plain geometry)
        let ch = crossing_chainage([0.0, 0.0], [10.0, 0.0], [4.0, -1.0], [4.0, 1.0]).unwrap();
        assert!((ch - 4.0).abs() < 1e-12);
        assert!(crossing_chainage([0.0, 0.0], [10.0, 0.0], [12.0, -1.0], [12.0, 1.0]).is_none());
        assert!(crossing_chainage([0.0, 0.0], [10.0, 0.0], [0.0, 1.0], [10.0, 1.0]).is_none());
    }
}
