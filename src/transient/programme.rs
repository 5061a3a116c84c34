//! The pumping programme turned into rate schedules and a [`TransientModel`]: which wells run in
//! each stage at what rate, every pump off at the end of the programme, image wells for the
//! straight boundaries.
//!
//! Assumptions, stated once:
//! - wells run at constant rate within a stage (the flow is the scheduled one; a well held at a
//!   level instead would give more at first);
//! - the aquifer is the design file's, linearised as in [`crate::transient`]: confined and leaky
//!   with T = K·b and S, unconfined with T = K·H, S_y and Jacob's correction; a confined aquifer
//!   drawn below its top is treated as still confined (the steady check converts it);
//! - partial penetration: the steady check's term for a partly penetrating screen (the same
//!   kernel, [`crate::field::near_field`]) is added in time as quasi-steady, with each well's
//!   rate at that time (see [`crate::transient::NearTerm`]): a local extra drawdown within about
//!   1.5·D of the well (Kruseman & de Ridder 1994, §10) that settles within minutes to hours;
//! - well losses (Jacob's C·Q² or an efficiency) lower the level inside a pumped well only:
//!   [`crate::transient::well_levels`];
//! - images: each well's images as in the steady field ([`crate::physics::images::image_set`]),
//!   out to the distance where an image's share falls below a stated tolerance at the last time
//!   followed ([`image_reach`]).

use crate::check::field_build::field_with_radius;
use crate::field::layout;
use crate::field::radius::design_radius;
use crate::field::wells::Well;
use crate::geometry::mirror_point;
use crate::input::error::InputError;
use crate::input::model::{Model, Programme, StageRate};
use crate::physics::images::{image_set_up_to, image_sign};
use crate::physics::potential::AquiferKind;
use crate::transient::{NearTerm, RateSchedule, TransientAquifer, TransientModel, TransientSource};
use std::collections::HashMap;
use std::path::Path;
use std::sync::{Arc, RwLock};

/// Seconds in a day.
pub const DAY: f64 = 86_400.0;

/// The programme ready to compute on.
#[derive(Debug, Clone)]
pub struct ProgrammeSetup {
    /// The wells of the design file's layout (rates as designed).
    pub wells: Vec<Well>,
    /// Each well's rate schedule over the programme, ending at 0 at the end of pumping.
    pub schedules: Vec<RateSchedule>,
    /// Each well's images: (position m, sign).
    pub images: Vec<Vec<([f64; 2], f64)>>,
    /// The transient aquifer.
    pub aquifer: TransientAquifer,
    /// Well radius used for every source, m.
    pub well_radius: f64,
    /// The model with every well and image on its schedule.
    pub model: TransientModel,
    /// The partial-penetration term (when a screen does not span the layer).
    pub near: Option<NearTerm>,
    /// Wells whose image series was cut at [`MAX_IMAGES_IN_TIME`] before the tolerance was met.
    pub images_capped: usize,
    /// How far the images are kept, m.
    pub image_reach: f64,
}

fn err(model: &Model, field: &str, message: String) -> InputError {
    InputError {
        file: model.file.clone(),
        field: field.into(),
        line: None,
        message,
    }
}

/// The transient aquifer of a design file: confined/leaky T = K·b with S (and B), unconfined
/// T = K·H with S_y. Errors name the missing storage field.
pub fn transient_aquifer(model: &Model) -> Result<TransientAquifer, InputError> {
    let aq = &model.aquifer;
    let storage = aq.storage().ok_or_else(|| {
        err(
            model,
            match aq.kind {
                AquiferKind::Unconfined => "aquifer.specific_yield",
                _ => "aquifer.storativity",
            },
            "time-dependent work needs the storage coefficient (specific_yield when unconfined, storativity otherwise)".into(),
        )
    })?;
    let t = aq.transmissivity();
    let out = match aq.kind {
        AquiferKind::Unconfined => TransientAquifer::Unconfined {
            conductivity: aq.conductivity,
            saturated_thickness: aq.initial_saturated_thickness(),
            specific_yield: storage,
        },
        AquiferKind::Confined => TransientAquifer::Confined {
            transmissivity: t,
            storativity: storage,
        },
        AquiferKind::Leaky { leakage_factor } => TransientAquifer::Leaky {
            transmissivity: t,
            storativity: storage,
            leakage_factor,
        },
    };
    out.validate().map_err(|m| err(model, "aquifer", m))?;
    Ok(out)
}

/// Rate schedule of each well over the programme: in stage k a well listed in the stage (or every
/// well when the stage lists none) runs at the stage's rate ("as designed": its own); every well
/// stops at the end of pumping. Errors name an unknown well in `programme.stage[k].wells`.
pub fn schedules(
    model: &Model,
    prog: &Programme,
    wells: &[Well],
) -> Result<Vec<RateSchedule>, InputError> {
    for (k, st) in prog.stages.iter().enumerate() {
        if let Some(names) = &st.wells {
            for n in names {
                if !wells.iter().any(|w| &w.name == n) {
                    return Err(err(
                        model,
                        &format!("programme.stage[{}].wells", k + 1),
                        format!(
                            "no well named \"{n}\" in the layout; its wells are {}",
                            wells
                                .iter()
                                .take(8)
                                .map(|w| format!("\"{}\"", w.name))
                                .collect::<Vec<_>>()
                                .join(", ")
                                + if wells.len() > 8 { ", …" } else { "" }
                        ),
                    ));
                }
            }
        }
    }
    wells
        .iter()
        .map(|w| {
            let mut steps: Vec<(f64, f64)> = prog
                .stages
                .iter()
                .map(|st| {
                    let runs = st.wells.as_ref().is_none_or(|n| n.contains(&w.name));
                    let q = match (runs, st.rate) {
                        (false, _) => 0.0,
                        (true, StageRate::AsDesigned) => w.rate,
                        (true, StageRate::Each(q)) => q,
                    };
                    (st.start, q)
                })
                .collect();
            steps.push((prog.duration, 0.0));
            RateSchedule::new(steps).map_err(|m| err(model, "programme.stage", m))
        })
        .collect()
}

/// The schedule cut at `t_off` (s): the same steps before it, then 0 from `t_off` on.
pub fn switched_off(schedule: &RateSchedule, t_off: f64) -> RateSchedule {
    let mut steps: Vec<(f64, f64)> = schedule
        .steps()
        .iter()
        .copied()
        .filter(|(t, _)| *t < t_off)
        .collect();
    steps.push((t_off, 0.0));
    RateSchedule::new(steps).unwrap_or_else(|_| schedule.clone())
}

/// Longest time followed after a failure, s (365 days).
pub const FLOOD_SEARCH: f64 = 365.0 * DAY;

/// The programme set up on the design file's layout: wells, schedules, images, model.
/// Errors: no `[programme]`, no wells, a well rate missing ("as designed" with rate 0),
/// the aquifer's storage, unknown well names.
pub fn setup(model: &Model) -> Result<ProgrammeSetup, InputError> {
    setup_from(model, None)
}

/// As [`setup`], with the wells of a CSV file (`--wells`, as `check` reads it) in place of the
/// layout's when `wells_csv` is given.
pub fn setup_from(model: &Model, wells_csv: Option<&Path>) -> Result<ProgrammeSetup, InputError> {
    let prog = model.programme.as_ref().ok_or_else(|| {
        err(
            model,
            "programme",
            "the design file has no [programme]: add duration and [[programme.stage]] entries (see `drydig new FILE`)".into(),
        )
    })?;
    if !model.walls.is_empty() {
        return Err(err(
            model,
            "wall",
            "the programme in time does not take cut-off walls yet ([[wall]] entries): `check` and `design` (steady) do; for the programme, leave the walls out in a copy of the file (its drawdowns are then those without the walls)".into(),
        ));
    }
    if model.layers.is_some() {
        return Err(err(
            model,
            "layer",
            "the programme in time does not take layered ground yet ([[layer]] entries): `check` and `design` do; for the programme, describe the aquifer the wells pump as a single [aquifer] in a copy of the file".into(),
        ));
    }
    let wells = layout::from_model(model, wells_csv)?.wells;
    let field = if wells_csv.is_some() {
        "--wells"
    } else {
        "layout"
    };
    if wells.is_empty() {
        return Err(err(model, field, "the layout places no wells".into()));
    }
    let named: Vec<(&str, [f64; 2], f64)> = wells
        .iter()
        .map(|w| (w.name.as_str(), w.position, w.radius))
        .collect();
    crate::input::validate::sides::check_wells(model, &named, field)?;
    let as_designed = prog.stages.iter().any(|s| s.rate == StageRate::AsDesigned);
    if as_designed && wells.iter().all(|w| w.rate == 0.0) {
        return Err(err(
            model,
            if wells_csv.is_some() { "--wells" } else { "layout.rate" },
            "a stage runs the wells \"as designed\" but the wells have no rate: set layout.rate (e.g. \"4 L/s\"), a rate in each stage, or rates in the wells CSV".into(),
        ));
    }
    let aquifer = transient_aquifer(model)?;
    let schedules = schedules(model, prog, &wells)?;
    let last = prog.duration + prog.recovery.max(FLOOD_SEARCH);
    setup_with(model, &aquifer, wells, schedules, last)
}

/// Every image farther than the reach has u = r²S/(4T·t) above this at the last time followed.
pub const IMAGE_U_MIN: f64 = 40.0;
/// Most images kept per well in time (a strip between two parallel boundaries gives an endless
/// series); a well whose series is cut here is counted in [`ProgrammeSetup::images_capped`].
pub const MAX_IMAGES_IN_TIME: usize = 20_000;

/// (T m²/s, storage coefficient) of a transient aquifer (T = K·H when unconfined).
pub fn diffusion_parameters(aquifer: &TransientAquifer) -> (f64, f64) {
    match *aquifer {
        TransientAquifer::Confined {
            transmissivity,
            storativity,
        }
        | TransientAquifer::Leaky {
            transmissivity,
            storativity,
            ..
        } => (transmissivity, storativity),
        TransientAquifer::Unconfined {
            conductivity,
            saturated_thickness,
            specific_yield,
        } => (conductivity * saturated_thickness, specific_yield),
    }
}

/// How far images are kept, m: ρ = √(4·T·t_end·u_min/S) with u_min = [`IMAGE_U_MIN`] = 40.
///
/// Tolerance, stated: an image beyond ρ has u > 40 at every time up to `t_end`, so its term is
/// |ΔQ|/(4πT)·W(u) with W(u) < e^(−u)/u < 1.1e−19 (Abramowitz & Stegun 1964, 5.1.20; W(u, r/B) ≤
/// W(u) when leaky); even [`MAX_IMAGES_IN_TIME`] such images together stay below
/// 3e−15·|ΔQ|/(4πT), i.e. far below a micrometre for any rate a site pumps. The series between
/// two parallel boundaries is summed this far, not to a fixed number of images.
pub fn image_reach(aquifer: &TransientAquifer, t_end: f64) -> f64 {
    let (t, s) = diffusion_parameters(aquifer);
    (4.0 * t * t_end.max(DAY) * IMAGE_U_MIN / s).sqrt()
}

/// The images of a well at `position` for the straight boundaries `lines`, out to `reach` (m);
/// the flag is true when the series was cut at [`MAX_IMAGES_IN_TIME`].
pub fn well_images(
    position: [f64; 2],
    lines: &[([f64; 2], [f64; 2], crate::physics::images::BoundaryKind)],
    reach: f64,
) -> (Vec<([f64; 2], f64)>, bool) {
    image_set_up_to(position, lines, reach, MAX_IMAGES_IN_TIME).unwrap_or_else(|_| {
        (
            lines
                .iter()
                .map(|(a, c, k)| (mirror_point(position, *a, *c), image_sign(*k)))
                .collect(),
            false,
        )
    })
}

/// The partial-penetration term of the steady field for `wells` (`None` when every screen spans
/// the layer): the steady kernel with partial penetration less the same kernel fully
/// penetrating, per unit rate of each well, cached by position.
pub fn near_term(model: &Model, wells: &[Well]) -> Option<NearTerm> {
    let r = design_radius(model).0;
    let with = field_with_radius(model, wells, r);
    if !with.has_partial_penetration() {
        return None;
    }
    let without = field_with_radius(model, wells, r).fully_penetrating();
    type RowCache = RwLock<HashMap<(u64, u64), Arc<Vec<f64>>>>;
    let cache: RowCache = RwLock::new(HashMap::new());
    let rows = move |p: [f64; 2]| -> Vec<f64> {
        let key = (p[0].to_bits(), p[1].to_bits());
        if let Some(v) = cache.read().ok().and_then(|c| c.get(&key).cloned()) {
            return v.as_ref().clone();
        }
        let a = with.unit_row(p);
        let b = without.unit_row(p);
        let v: Vec<f64> = a.iter().zip(&b).map(|(x, y)| x - y).collect();
        if let Ok(mut c) = cache.write() {
            if c.len() < 1_000_000 {
                c.insert(key, Arc::new(v.clone()));
            }
        }
        v
    };
    Some(NearTerm {
        rows: Arc::new(rows),
        transmissivity: model.aquifer.transmissivity(),
    })
}

/// Images of every well and the model, for given wells and schedules; `t_end` (s) is the last
/// time followed and sets the reach of the image series ([`image_reach`]).
pub fn setup_with(
    model: &Model,
    aquifer: &TransientAquifer,
    wells: Vec<Well>,
    schedules: Vec<RateSchedule>,
    t_end: f64,
) -> Result<ProgrammeSetup, InputError> {
    let reach = image_reach(aquifer, t_end);
    let lines: Vec<_> = model
        .boundaries
        .iter()
        .map(|b| (b.line[0], b.line[1], b.kind))
        .collect();
    let mut images_capped = 0;
    let images: Vec<Vec<([f64; 2], f64)>> = wells
        .iter()
        .map(|w| {
            let (v, capped) = well_images(w.position, &lines, reach);
            images_capped += usize::from(capped);
            v
        })
        .collect();
    let well_radius = model.wells.radius;
    let near = near_term(model, &wells);
    let model_t = build_model(
        aquifer,
        well_radius,
        &wells,
        &schedules,
        &images,
        near.clone(),
    )
    .map_err(|m| err(model, "programme", m))?;
    Ok(ProgrammeSetup {
        wells,
        schedules,
        images,
        aquifer: *aquifer,
        well_radius,
        model: model_t,
        near,
        images_capped,
        image_reach: reach,
    })
}

/// A transient model of the wells with the given schedules and their images, grouped by well,
/// with the partial-penetration term `near`.
pub fn build_model(
    aquifer: &TransientAquifer,
    well_radius: f64,
    wells: &[Well],
    schedules: &[RateSchedule],
    images: &[Vec<([f64; 2], f64)>],
    near: Option<NearTerm>,
) -> Result<TransientModel, String> {
    let mut sources = Vec::new();
    let mut groups = Vec::new();
    for ((w, sch), imgs) in wells.iter().zip(schedules).zip(images) {
        let first = sources.len();
        sources.push(TransientSource {
            x: w.position[0],
            y: w.position[1],
            schedule: sch.clone(),
            sign: 1.0,
        });
        for (p, sign) in imgs {
            sources.push(TransientSource {
                x: p[0],
                y: p[1],
                schedule: sch.clone(),
                sign: *sign,
            });
        }
        groups.push(first..sources.len());
    }
    Ok(TransientModel::new(*aquifer, well_radius, sources)?.with_wells(groups, near))
}

impl ProgrammeSetup {
    /// The same wells with other schedules (a pump switched off, a failure).
    pub fn with_schedules(&self, schedules: Vec<RateSchedule>) -> Result<TransientModel, String> {
        build_model(
            &self.aquifer,
            self.well_radius,
            &self.wells,
            &schedules,
            &self.images,
            self.near.clone(),
        )
    }

    /// Total scheduled abstraction at time t, m³/s (recharge counts negative).
    pub fn flow_at(&self, t: f64) -> f64 {
        self.schedules.iter().map(|s| s.rate_at(t)).sum()
    }

    /// Volume pumped between times a and b (s), m³: ∫ Σ Q_j(t) dt, exact for step schedules.
    pub fn volume_between(&self, a: f64, b: f64) -> f64 {
        self.schedules
            .iter()
            .map(|s| schedule_volume(s, a, b))
            .sum()
    }
}

/// ∫ₐᵇ Q(t) dt of one step schedule, m³ (rate m³/s, times s).
pub fn schedule_volume(s: &RateSchedule, a: f64, b: f64) -> f64 {
    if b.is_nan() || a.is_nan() || b <= a {
        return 0.0;
    }
    let steps = s.steps();
    steps
        .iter()
        .enumerate()
        .map(|(i, &(t0, q))| {
            let t1 = steps.get(i + 1).map_or(f64::INFINITY, |n| n.0);
            let lo = t0.max(a);
            let hi = t1.min(b);
            if hi > lo {
                q * (hi - lo)
            } else {
                0.0
            }
        })
        .sum()
}
