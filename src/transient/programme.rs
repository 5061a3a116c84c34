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
//! - partial penetration: the wells are taken as fully penetrating here. The steady check's
//!   correction for a partly penetrating screen is a local extra drawdown within about 1.5·b of
//!   the well (Kruseman & de Ridder 1994, §10) that settles within hours; the water levels in
//!   the wells in the hydrographs are therefore those of a fully penetrating well and may sit
//!   higher than the steady check's; the check points between wells are not affected;
//! - images: each well's images as in the steady field ([`crate::physics::images::image_set`]),
//!   out to three Cooper–Jacob radii at the end of the programme.

use crate::field::layout;
use crate::field::wells::Well;
use crate::geometry::mirror_point;
use crate::input::error::InputError;
use crate::input::model::{Model, Programme, StageRate};
use crate::physics::images::{image_set, image_sign};
use crate::physics::potential::AquiferKind;
use crate::transient::{RateSchedule, TransientAquifer, TransientModel, TransientSource};

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

/// The programme set up on the design file's layout: wells, schedules, images, model.
/// Errors: no `[programme]`, no wells, a well rate missing ("as designed" with rate 0),
/// the aquifer's storage, unknown well names.
pub fn setup(model: &Model) -> Result<ProgrammeSetup, InputError> {
    let prog = model.programme.as_ref().ok_or_else(|| {
        err(
            model,
            "programme",
            "the design file has no [programme]: add duration and [[programme.stage]] entries (see `drydig new FILE`)".into(),
        )
    })?;
    let wells = layout::from_model(model, None)?.wells;
    if wells.is_empty() {
        return Err(err(model, "layout", "the layout places no wells".into()));
    }
    let as_designed = prog.stages.iter().any(|s| s.rate == StageRate::AsDesigned);
    if as_designed && wells.iter().all(|w| w.rate == 0.0) {
        return Err(err(
            model,
            "layout.rate",
            "a stage runs the wells \"as designed\" but the layout gives no rate: set layout.rate (e.g. \"4 L/s\") or a rate in each stage".into(),
        ));
    }
    let aquifer = transient_aquifer(model)?;
    let schedules = schedules(model, prog, &wells)?;
    setup_with(model, &aquifer, wells, schedules, prog.duration)
}

/// Images of every well and the model, for given wells and schedules; `t_end` (s) sets the
/// reach of the image series (three Cooper–Jacob radii √(2.25·T·t/S) at t_end).
pub fn setup_with(
    model: &Model,
    aquifer: &TransientAquifer,
    wells: Vec<Well>,
    schedules: Vec<RateSchedule>,
    t_end: f64,
) -> Result<ProgrammeSetup, InputError> {
    let (t, s) = match *aquifer {
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
    };
    let reach = 3.0 * (2.25 * t * t_end.max(DAY) / s).sqrt();
    let lines: Vec<_> = model
        .boundaries
        .iter()
        .map(|b| (b.line[0], b.line[1], b.kind))
        .collect();
    let images: Vec<Vec<([f64; 2], f64)>> = wells
        .iter()
        .map(|w| {
            image_set(w.position, &lines, reach).unwrap_or_else(|_| {
                lines
                    .iter()
                    .map(|(a, c, k)| (mirror_point(w.position, *a, *c), image_sign(*k)))
                    .collect()
            })
        })
        .collect();
    let well_radius = model.wells.radius;
    let model_t = build_model(aquifer, well_radius, &wells, &schedules, &images)
        .map_err(|m| err(model, "programme", m))?;
    Ok(ProgrammeSetup {
        wells,
        schedules,
        images,
        aquifer: *aquifer,
        well_radius,
        model: model_t,
    })
}

/// A transient model of the wells with the given schedules and their images.
pub fn build_model(
    aquifer: &TransientAquifer,
    well_radius: f64,
    wells: &[Well],
    schedules: &[RateSchedule],
    images: &[Vec<([f64; 2], f64)>],
) -> Result<TransientModel, String> {
    let mut sources = Vec::new();
    for ((w, sch), imgs) in wells.iter().zip(schedules).zip(images) {
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
    }
    TransientModel::new(*aquifer, well_radius, sources)
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
