//! The quantities of the cut-off walls (`[[wall]]`): length, toe, depth below ground level and
//! area (length × depth), and the aquifers each cuts; for the outputs and the bid (no prices).

use crate::input::model::Model;

/// One wall's quantities.
#[derive(Debug, Clone, serde::Serialize)]
pub struct WallQuantity {
    /// Name from `[[wall]]`.
    pub name: String,
    /// Length along the wall, m.
    pub length_m: f64,
    /// Level of the toe, m (down to the lowest aquifer's base when not given).
    pub toe_level_m: f64,
    /// Whether the toe was given (else the wall reaches the impermeable base).
    pub toe_given: bool,
    /// Depth from ground level to the toe, m.
    pub depth_m: f64,
    /// Area = length × depth, m².
    pub area_m2: f64,
    /// Resistance of a leaky wall, s (`None`: impermeable).
    pub resistance_s: Option<f64>,
    /// Names of the aquifers it cuts (top down).
    pub cuts: Vec<String>,
}

/// The wall quantities of `model` (no solve size).
pub fn wall_quantities(model: &Model) -> Vec<WallQuantity> {
    let base = model
        .layers
        .as_ref()
        .map_or(model.aquifer.base_level, |g| g.lowest_base());
    model
        .walls
        .iter()
        .map(|w| {
            let toe = w.toe_level.unwrap_or(base);
            let depth = (model.ground_level - toe).max(0.0);
            let cuts = match &model.layers {
                Some(g) => g
                    .cut_by_wall(w.toe_level)
                    .iter()
                    .map(|&i| g.aquifers[i].name.clone())
                    .collect(),
                None => vec!["the aquifer".to_string()],
            };
            WallQuantity {
                name: w.name.clone(),
                length_m: w.length(),
                toe_level_m: toe,
                toe_given: w.toe_level.is_some(),
                depth_m: depth,
                area_m2: w.length() * depth,
                resistance_s: w.resistance,
                cuts,
            }
        })
        .collect()
}
