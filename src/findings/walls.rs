//! The cut-off walls of an evaluated layout as the outputs show them: each wall's length and
//! area (length × depth from ground level to the toe) as quantities without prices, and the
//! size of the solved system (collocation points × aquifers).

use crate::check::run::CheckRun;
use crate::check::wall_quantities::{wall_quantities, WallQuantity};

/// The walls of a run and the system solved for them.
#[derive(Debug, Clone)]
pub struct WallFindings {
    /// Each wall, in the design file's order.
    pub walls: Vec<WallQuantity>,
    /// Collocation points (elements) of all walls.
    pub collocation_points: usize,
    /// Aquifers of the ground the walls are solved in.
    pub aquifers: usize,
    /// Unknown jumps solved for (collocation points × aquifers each cuts).
    pub unknowns: usize,
}

/// The walls of `run`, or `None` without walls.
pub fn walls_of(run: &CheckRun) -> Option<WallFindings> {
    let solved = run.field.walls()?;
    let (collocation_points, aquifers, unknowns) = solved.size();
    Some(WallFindings {
        walls: wall_quantities(run.model),
        collocation_points,
        aquifers,
        unknowns,
    })
}

impl WallFindings {
    /// One line per wall and one for the solve, in metres (SI; the text outputs convert).
    pub fn lines(
        &self,
        length: impl Fn(f64) -> String,
        area: impl Fn(f64) -> String,
    ) -> Vec<String> {
        let mut out: Vec<String> = self
            .walls
            .iter()
            .map(|w| {
                format!(
                    "wall \"{}\": {} long, toe at {}{}, area {} (length × depth below ground level), {}, cuts {}",
                    w.name,
                    length(w.length_m),
                    length(w.toe_level_m),
                    if w.toe_given { "" } else { " (the impermeable base)" },
                    area(w.area_m2),
                    match w.resistance_s {
                        Some(c) => format!("leaky (resistance {:.1} days)", c / 86_400.0),
                        None => "impermeable".into(),
                    },
                    w.cuts.join(", ")
                )
            })
            .collect();
        out.push(format!(
            "walls solved as line doublets: {} × {} = {} unknown jumps, one solve per well of unit rate",
            crate::plural::count(self.collocation_points, "collocation point", "collocation points"),
            crate::plural::count(self.aquifers, "aquifer", "aquifers"),
            self.unknowns
        ));
        out
    }
}
