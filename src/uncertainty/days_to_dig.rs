//! Days to dig on one sampled ground: for a file with a `[programme]`, the earliest time each
//! stage can be dug — every check point of its excavation (grid, corners, edges) at or below the
//! stage's target — computed as `drydig programme` computes it, on the sample's T and S.
//!
//! Method: the programme's own set-up ([`crate::transient::programme::setup`]: the wells, their
//! step schedules, images, the partial-penetration term), built once on the file's model; each
//! sample gets its own transient aquifer (T = K·b or K·H, S or S_y) and image reach, and the
//! partial-penetration rows (ΔΦ per unit rate, free of K) are shared, with the sample's T. A
//! sampled groundwater level or K_v/K_h would change those rows a little (the saturated thickness
//! and the vertical term near each well): they are kept at the file's values, an approximation
//! confined to about 1.5·D of each well (Kruseman & de Ridder 1994, §10). Then its own rule
//! ([`crate::transient::answers`]): the first output time (below the end of pumping) with every
//! point met brackets the crossing, found by bisection to 1 s. Drawdowns are the Theis
//! superposition in space and time (Theis 1935; Kruseman & de Ridder 1994, §12). Only the
//! stages' answers are computed (no hydrographs, maps or flood), and at each time the point that
//! failed last is tried first, so a time that is not yet met costs one drawdown evaluation.
//! A stage not ready within the programme gives `None`.

use crate::field::checkpoints::check_points;
use crate::input::model::Model;
use crate::transient::answers::{output_times, points_in_excavation, stage_levels};
use crate::transient::programme::{
    build_model, image_reach, setup, transient_aquifer, well_images, ProgrammeSetup, FLOOD_SEARCH,
};
use crate::transient::well_levels::first_true;
use crate::transient::NearTerm;
use crate::transient::TransientModel;
use std::cell::Cell;

/// The programme's stages and the check points that decide them, found once from the file.
pub struct DigStages {
    /// Check point positions, m.
    positions: Vec<[f64; 2]>,
    /// Each stage's name and the indices of its excavation's deciding points.
    stages: Vec<(String, Vec<usize>)>,
    /// The programme set up on the file's ground.
    base: ProgrammeSetup,
}

impl DigStages {
    /// The stages of `model`'s programme (`None`: no `[programme]`, or the programme cannot be
    /// set up on this file — walls, layered ground, no rates).
    pub fn new(model: &Model) -> Option<DigStages> {
        let prog = model.programme.as_ref()?;
        let base = setup(model).ok()?;
        let points = check_points(model);
        let stages = prog
            .stages
            .iter()
            .map(|st| {
                (
                    st.name.clone(),
                    points_in_excavation(&points, st.excavation),
                )
            })
            .collect();
        Some(DigStages {
            positions: points.iter().map(|p| p.position).collect(),
            stages,
            base,
        })
    }

    /// The stage names, in the programme's order.
    pub fn names(&self) -> Vec<String> {
        self.stages.iter().map(|s| s.0.clone()).collect()
    }

    /// The earliest time (s from the start of pumping) each stage can be dug on the ground of
    /// `sample` (`None` for a stage not ready within the programme); `None` altogether when the
    /// programme cannot be set up on that ground.
    pub fn earliest(&self, sample: &Model) -> Option<Vec<Option<f64>>> {
        let prog = sample.programme.as_ref()?;
        let tm = self.transient_model(sample)?;
        let starts: Vec<f64> = prog.stages.iter().map(|s| s.start).collect();
        let times = output_times(&starts, prog.duration, prog.recovery, prog.output_step);
        let h0 = sample.aquifer.initial_level;
        Some(
            prog.stages
                .iter()
                .zip(&self.stages)
                .map(|(st, (_, idx))| {
                    let need = h0 - stage_levels(sample, st.excavation, st.formation_level).target;
                    stage_earliest(&tm, &self.positions, idx, need, &times, prog.duration)
                })
                .collect(),
        )
    }
}

impl DigStages {
    /// The file's wells and schedules on the ground of `sample`: its transient aquifer, the
    /// images out to its reach, the shared partial-penetration rows with its T.
    fn transient_model(&self, sample: &Model) -> Option<TransientModel> {
        let prog = sample.programme.as_ref()?;
        let aquifer = transient_aquifer(sample).ok()?;
        let reach = image_reach(&aquifer, prog.duration + prog.recovery.max(FLOOD_SEARCH));
        let lines: Vec<_> = sample
            .boundaries
            .iter()
            .map(|b| (b.line[0], b.line[1], b.kind))
            .collect();
        let images: Vec<_> = self
            .base
            .wells
            .iter()
            .map(|w| well_images(w.position, &lines, reach).0)
            .collect();
        let near = self.base.near.as_ref().map(|n| NearTerm {
            rows: n.rows.clone(),
            transmissivity: sample.aquifer.transmissivity(),
        });
        build_model(
            &aquifer,
            self.base.well_radius,
            &self.base.wells,
            &self.base.schedules,
            &images,
            near,
        )
        .ok()
    }
}

/// The earliest time every point `idx` of `positions` has a drawdown of at least `need` (m):
/// the first output time before `duration` with all met, refined by bisection to 1 s (the rule
/// of `drydig programme`).
pub fn stage_earliest(
    tm: &TransientModel,
    positions: &[[f64; 2]],
    idx: &[usize],
    need: f64,
    times: &[f64],
    duration: f64,
) -> Option<f64> {
    if need <= 0.0 {
        return Some(0.0);
    }
    let last_failed = Cell::new(idx.first().copied()?);
    let all_met = |t: f64| {
        let met = |i: usize| tm.drawdown_at(positions[i], t) >= need;
        if !met(last_failed.get()) {
            return false;
        }
        match idx.iter().find(|&&i| !met(i)) {
            Some(&i) => {
                last_failed.set(i);
                false
            }
            None => true,
        }
    };
    let k = times
        .iter()
        .take_while(|t| **t < duration)
        .position(|t| all_met(*t))?;
    if k == 0 {
        return Some(times[0]);
    }
    Some(first_true(times[k - 1], times[k], all_met))
}
