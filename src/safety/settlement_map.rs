//! The numbers behind `settlement.svg`: the settlement on a fine grid over each neighbour with a
//! soil profile (the value checked: at the end of the works when a duration is known, else
//! final), and the drawdown on a coarser grid over the whole drawing for context.

use crate::check::run::CheckRun;
use crate::safety::neighbours::{column_at, works_duration};
use crate::safety::settlement;
use geo::BoundingRect;

/// Values on a regular grid: row-major from (x0, y0), spacing h, nx × ny points.
#[derive(Debug, Clone)]
pub struct GridValues {
    /// Lower-left x, m.
    pub x0: f64,
    /// Lower-left y, m.
    pub y0: f64,
    /// Spacing, m.
    pub h: f64,
    /// Points along x.
    pub nx: usize,
    /// Points along y.
    pub ny: usize,
    /// Values, m.
    pub values: Vec<f64>,
}

/// The grid points, row-major.
pub fn grid_points(x0: f64, y0: f64, h: f64, nx: usize, ny: usize) -> Vec<[f64; 2]> {
    let mut pts = Vec::with_capacity(nx * ny);
    for j in 0..ny {
        for i in 0..nx {
            pts.push([x0 + i as f64 * h, y0 + j as f64 * h]);
        }
    }
    pts
}

/// Everything the settlement drawing plots.
#[derive(Debug, Clone)]
pub struct SettlementMap {
    /// Drawing extent (x min, x max, y min, y max), m.
    pub extent: [f64; 4],
    /// Settlement grid (m) under each neighbour with a profile, with its index.
    pub under: Vec<(usize, GridValues)>,
    /// Drawdown (m) over the extent.
    pub drawdown: GridValues,
}

/// Extent of neighbours, excavations and wells, padded by 8 %.
fn extent(run: &CheckRun) -> [f64; 4] {
    let model = run.model;
    let mut pts: Vec<[f64; 2]> = Vec::new();
    for n in &model.neighbours {
        pts.extend(n.footprint.exterior().0.iter().map(|c| [c.x, c.y]));
    }
    for e in &model.excavations {
        pts.extend(e.outline.exterior().0.iter().map(|c| [c.x, c.y]));
    }
    pts.extend(run.placement.wells.iter().map(|w| w.position));
    let mut e = [
        f64::INFINITY,
        f64::NEG_INFINITY,
        f64::INFINITY,
        f64::NEG_INFINITY,
    ];
    for p in &pts {
        e = [
            e[0].min(p[0]),
            e[1].max(p[0]),
            e[2].min(p[1]),
            e[3].max(p[1]),
        ];
    }
    if !(e[0].is_finite() && e[2].is_finite()) {
        e = [0.0, 1.0, 0.0, 1.0];
    }
    let pad = 0.08 * (e[1] - e[0]).max(e[3] - e[2]).max(1.0);
    [e[0] - pad, e[1] + pad, e[2] - pad, e[3] + pad]
}

/// The settlement and drawdown grids of `run`.
pub fn settlement_map(run: &CheckRun) -> SettlementMap {
    let model = run.model;
    let aq = run.field.aquifer();
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    let mut under = Vec::new();
    for (i, n) in model.neighbours.iter().enumerate() {
        let Some(bb) = n.footprint.bounding_rect() else {
            continue;
        };
        if n.layers.is_empty() {
            continue;
        }
        let span = bb.width().max(bb.height());
        let h = (span / 60.0).max(0.1);
        let nx = (bb.width() / h).ceil() as usize + 3;
        let ny = (bb.height() / h).ceil() as usize + 3;
        let (x0, y0) = (bb.min().x - h, bb.min().y - h);
        let duration = works_duration(model, n).map(|w| w.0);
        let values = run
            .field
            .levels(&grid_points(x0, y0, h, nx, ny), &rates)
            .iter()
            .map(|lv| {
                let c = column_at(model, n, lv.or_base(aq.base_level));
                match duration {
                    Some(t) => settlement::at_time(&n.layers, &c.per_layer, t).0,
                    None => c.total,
                }
            })
            .collect();
        under.push((
            i,
            GridValues {
                x0,
                y0,
                h,
                nx,
                ny,
                values,
            },
        ));
    }
    let [xmin, xmax, ymin, ymax] = extent(run);
    let nx = 120usize;
    let h = (xmax - xmin) / (nx - 1) as f64;
    let ny = ((ymax - ymin) / h).ceil() as usize + 1;
    let values = run
        .field
        .levels(&grid_points(xmin, ymin, h, nx, ny), &rates)
        .iter()
        .map(|lv| aq.initial_level - lv.or_base(aq.base_level))
        .collect();
    SettlementMap {
        extent: [xmin, xmax, ymin, ymax],
        under,
        drawdown: GridValues {
            x0: xmin,
            y0: ymin,
            h,
            nx,
            ny,
            values,
        },
    }
}
