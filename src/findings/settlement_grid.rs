//! Settlement over each neighbour's footprint on a regular grid, for `settlement.svg`: the
//! drawdown at each node from the superposition, turned into settlement by the neighbour's own
//! soil profile ([`crate::safety::neighbours::settlement_at`], one-dimensional consolidation).

use crate::check::run::CheckRun;
use crate::safety::neighbours::settlement_at;
use geo::BoundingRect;

/// Settlement at the nodes of a grid over one neighbour's bounding box (one cell beyond it).
#[derive(Debug, Clone)]
pub struct SettlementGrid {
    /// Index of the neighbour in the design file's order.
    pub neighbour: usize,
    /// First node, m.
    pub x0: f64,
    /// First node, m.
    pub y0: f64,
    /// Node spacing, m.
    pub h: f64,
    /// Nodes along x.
    pub nx: usize,
    /// Nodes along y.
    pub ny: usize,
    /// Settlement at node (i, j) at index j·nx + i, m (0 where none is computed).
    pub settlement_m: Vec<f64>,
}

/// A grid under each neighbour with a soil profile: about 60 cells across its larger side (at
/// least 0.1 m apart), one cell beyond the footprint on every side.
pub fn settlement_grids(run: &CheckRun) -> Vec<SettlementGrid> {
    let model = run.model;
    let aq = run.field.aquifer();
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    let mut grids = Vec::new();
    for (i, n) in model.neighbours.iter().enumerate() {
        if n.layers.is_empty() {
            continue;
        }
        let Some(bb) = n.footprint.bounding_rect() else {
            continue;
        };
        let span = bb.width().max(bb.height());
        let h = (span / 60.0).max(0.1);
        let nx = (bb.width() / h).ceil() as usize + 3;
        let ny = (bb.height() / h).ceil() as usize + 3;
        let (x0, y0) = (bb.min().x - h, bb.min().y - h);
        let mut pts = Vec::with_capacity(nx * ny);
        for j in 0..ny {
            for k in 0..nx {
                pts.push([x0 + k as f64 * h, y0 + j as f64 * h]);
            }
        }
        let h0 = aq.initial_level;
        let settlement_m = run
            .field
            .levels(&pts, &rates)
            .iter()
            .map(|lv| settlement_at(model, n, h0, lv.or_base(aq.base_level)).unwrap_or(0.0))
            .collect();
        grids.push(SettlementGrid {
            neighbour: i,
            x0,
            y0,
            h,
            nx,
            ny,
            settlement_m,
        });
    }
    grids
}
