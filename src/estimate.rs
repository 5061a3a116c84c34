//! The quick estimate: the hand method an estimator runs in the first hour of a bid, done
//! properly for every excavation in the design file.
//!
//! - **Pit** (compact outline): one equivalent well of radius r_e = √(A/π) at the centre, radius of
//!   influence R₀ = r_e + L₀ counted from the centre (common practice (no source)), flow by Thiem /
//!   Dupuit–Thiem through the discharge potential: Q = 2π·(Φ₀ − Φ_t)/ln(R₀/r_e). In a leaky
//!   aquifer the finite-radius Hantush–Jacob form Q = 2π·ΔΦ·(r_e/B)·K₁(r_e/B)/K₀(r_e/B).
//! - **Trench** (long and narrow, length/width ≥ the trench ratio): flow to a line slot from both
//!   sides, q = 2·ΔΦ/L₀ per metre over the full length (L₀ from the line-flow constant), plus the
//!   two ends acting together as one radial well of radius W/2 (end allowance; common practice
//!   (no source), after the remark in TM 5-818-5 that inflow is larger near the ends of a slot).
//!
//! - **Boundaries**: each straight boundary is represented by the first-order image of the
//!   equivalent well (radius r_e at the outline's centroid, [`crate::physics::image_flow`]); the
//!   ratio of the flows with and without the images multiplies the method's flow (pit or
//!   trench), and both figures are reported. With several boundaries the images of images are
//!   left out and the estimate says so.
//!
//! The design flow adds the contingency, and a rough well count divides it by the share of one
//! well's capacity (Sichardt's entrance-gradient limit, or the pump, whichever is lower) that
//! `design` lets a well use (`allowances.capacity_fraction`).

use crate::field::shape::measure;
use crate::input::model::{Excavation, Model, ShapeChoice, WellKind};
use crate::physics::potential::{Aquifer, AquiferKind};
use crate::physics::{capacity, equivalent, special};
use geo::{Area, Euclidean, Length};
use serde::Serialize;
use std::f64::consts::PI;

/// Which flow method was used for an excavation.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum FlowMethod {
    /// Equivalent well at the centre.
    EquivalentWell,
    /// Line slot from both sides plus end allowance.
    LineSlot,
    /// Groundwater already below target: nothing to pump.
    NoneNeeded,
}

/// The quick estimate for one excavation. All values SI; keys carry their units.
#[derive(Debug, Clone, Serialize)]
pub struct ExcavationEstimate {
    /// Excavation name.
    pub name: String,
    /// Plan area.
    pub area_m2: f64,
    /// Perimeter of the outline.
    pub perimeter_m: f64,
    /// Length: along the centre line of a bent (or given) centre line, else of the smallest
    /// enclosing rectangle.
    pub length_m: f64,
    /// Width: area / length along a centre line, else of the smallest enclosing rectangle.
    pub width_m: f64,
    /// How length and width were measured, in words.
    pub length_basis: String,
    /// Equivalent radius, area form √(A/π).
    pub equivalent_radius_m: f64,
    /// Equivalent radius, perimeter form P/(2π).
    pub equivalent_radius_perimeter_form_m: f64,
    /// Formation level.
    pub formation_level_m: f64,
    /// Target level: formation − margin, or the relief head where the design works to it.
    pub target_level_m: f64,
    /// The target is the relief head against base uplift (`control = "relieve"`, or `"both"`
    /// where it is the lower).
    pub relief_head: bool,
    /// Drawdown needed at the excavation, H − h_target.
    pub drawdown_m: f64,
    /// Method used and why.
    pub flow_method: FlowMethod,
    /// Reason for the method, in words.
    pub flow_method_reason: String,
    /// Radius-of-influence method name.
    pub influence_method: String,
    /// Distance of influence L₀ beyond the excavation.
    pub distance_of_influence_m: f64,
    /// Radius of influence from the centre, R₀ = r_e + L₀ (pits), or r_e + L₀ for the trench ends.
    pub radius_of_influence_m: f64,
    /// Steady total flow.
    pub total_flow_m3_per_day: f64,
    /// Steady total flow.
    pub total_flow_l_per_s: f64,
    /// Of which, for trenches, through the two long sides.
    pub slot_sides_flow_m3_per_day: Option<f64>,
    /// Of which, for trenches, through the ends.
    pub slot_ends_flow_m3_per_day: Option<f64>,
    /// Flow per 100 m of trench (trenches only).
    pub flow_per_100m_m3_per_day: Option<f64>,
    /// Steady total flow without the boundaries (equal to the total when there are none), L/s.
    pub flow_without_boundaries_l_per_s: f64,
    /// Flow with the boundaries' images over the flow without them.
    pub boundary_factor: f64,
    /// For comparison: the equivalent-well flow (area-form r_e, radial L₀) whatever the method.
    pub equivalent_well_flow_m3_per_day: f64,
    /// Contingency fraction applied.
    pub contingency: f64,
    /// Design flow = total × (1 + contingency).
    pub design_flow_m3_per_day: f64,
    /// Design flow in L/s.
    pub design_flow_l_per_s: f64,
    /// Wetted screen length used for one well's capacity.
    pub wetted_screen_m: f64,
    /// Sichardt capacity of one well.
    pub sichardt_capacity_l_per_s: f64,
    /// Capacity used per well (lower of Sichardt and pump).
    pub well_capacity_l_per_s: f64,
    /// Share of that capacity a well is counted at: the design's `allowances.capacity_fraction`.
    pub capacity_fraction: f64,
    /// What limits the well capacity.
    pub well_capacity_limit: String,
    /// Rough count of working wells.
    pub rough_well_count: u32,
    /// Standby wells from the design file.
    pub standby_wells: u32,
    /// Warnings an engineer should read: SI numbers, worded in the user's units by
    /// `report::estimate_text` (which also writes them into the JSON).
    #[serde(skip)]
    pub notes: Vec<EstimateNote>,
}

/// How the distance of influence L₀ was found.
#[derive(Debug, Clone, PartialEq)]
pub enum InfluenceBasis {
    /// By a formula at the target drawdown `drawdown` (m): Sichardt or Kusakin, named.
    AtDrawdown { method: String, drawdown: f64 },
    /// From the pumping test's distance–drawdown line; `jacob` when the aquifer is unconfined
    /// and Jacob's correction was applied first.
    PumpingTest { jacob: bool },
    /// Given, independent of the drawdown (method named).
    Fixed { method: String },
}

/// A note on the quick estimate, numbers in SI (m, m³/s).
#[derive(Debug, Clone, PartialEq)]
pub enum EstimateNote {
    /// Sized for the relief head against base uplift, not for formation − margin.
    ReliefHead {
        head: f64,
        factor_of_safety: f64,
        formation_less_margin: f64,
    },
    /// The distance of influence used and its basis.
    Influence {
        distance: f64,
        basis: InfluenceBasis,
    },
    /// Straight boundaries taken by the image of the equivalent well: each boundary's name and
    /// its distance from the centroid (m); the flow with and without them (m³/s).
    Boundaries {
        equivalent_radius: f64,
        boundaries: Vec<(String, f64)>,
        with: f64,
        without: f64,
        factor: f64,
    },
    /// A trench shorter than twice its distance of influence; the equivalent-well flow (m³/s).
    ShortTrench {
        length: f64,
        distance: f64,
        equivalent_well_flow: f64,
    },
    /// The radius of influence is under 1.5 × the equivalent radius.
    SensitiveLogarithm { radius: f64, equivalent_radius: f64 },
    /// A leaky aquifer: B replaces the radius of influence.
    Leaky { leakage_factor: f64 },
    /// The target is below the confining top.
    BelowConfiningTop { target: f64, top: f64 },
    /// The contingency (fraction) is below the usual 50–100 %.
    LowContingency { contingency: f64 },
    /// No screen below the target level.
    NoScreenBelowTarget,
    /// A wellpoint's lowest level (header − suction limit) against the target.
    Suction {
        floor: f64,
        header: f64,
        header_is_ground: bool,
        suction_limit: f64,
        target: f64,
    },
}

/// The quick estimate for the whole design file.
#[derive(Debug, Clone, Serialize)]
pub struct Estimate {
    /// Project name.
    pub project: String,
    /// Aquifer description.
    pub aquifer: String,
    /// Conductivity, m/s.
    pub conductivity_m_per_s: f64,
    /// Transmissivity before pumping, m²/s.
    pub transmissivity_m2_per_s: f64,
    /// Groundwater level before pumping.
    pub groundwater_level_m: f64,
    /// Aquifer base level.
    pub aquifer_base_level_m: f64,
    /// Per excavation.
    pub excavations: Vec<ExcavationEstimate>,
    /// Sum over excavations (each computed alone; overlapping influence is ignored).
    pub total_flow_m3_per_day: f64,
    /// Sum of design flows.
    pub design_flow_m3_per_day: f64,
    /// The caution that goes with every output.
    pub caution: String,
}

/// Run the quick estimate on a validated model.
pub fn estimate(model: &Model) -> Estimate {
    let excavations: Vec<_> = model
        .excavations
        .iter()
        .map(|e| estimate_excavation(model, e))
        .collect();
    Estimate {
        project: model.name.clone(),
        aquifer: model.aquifer.describe().to_string(),
        conductivity_m_per_s: model.aquifer.conductivity,
        transmissivity_m2_per_s: model.aquifer.transmissivity(),
        groundwater_level_m: model.aquifer.initial_level,
        aquifer_base_level_m: model.aquifer.base_level,
        total_flow_m3_per_day: excavations.iter().map(|e| e.total_flow_m3_per_day).sum(),
        design_flow_m3_per_day: excavations.iter().map(|e| e.design_flow_m3_per_day).sum(),
        excavations,
        caution: crate::caution::CAUTION.to_string(),
    }
}

/// Radial inflow to a circular excavation of radius `r` from the potential difference ΔΦ, m³/s.
/// Thiem/Dupuit–Thiem: Q = 2π·ΔΦ/ln(R/r); leaky (Hantush–Jacob, finite radius):
/// Q = 2π·ΔΦ·(r/B)·K₁(r/B)/K₀(r/B).
fn radial_flow(aquifer: &Aquifer, delta_phi: f64, r: f64, big_r: f64) -> f64 {
    match aquifer.kind {
        AquiferKind::Leaky { leakage_factor } => {
            let x = r / leakage_factor;
            2.0 * PI * delta_phi * x * special::bessel_k1(x) / special::bessel_k0(x)
        }
        _ => 2.0 * PI * delta_phi / (big_r / r).ln(),
    }
}

/// The flow method for an excavation and the reason, in words: none needed when there is no
/// target or the water is already below it, else as set in the design file or by the aspect ratio.
fn choose_method(
    model: &Model,
    e: &Excavation,
    target_given: bool,
    target: f64,
    s: f64,
    aspect: f64,
) -> (FlowMethod, String) {
    let aq = &model.aquifer;
    if !target_given {
        (
            FlowMethod::NoneNeeded,
            "relief only, and the confined layer's head already gives the required factor of safety against uplift".to_string(),
        )
    } else if s <= 0.0 {
        (
            FlowMethod::NoneNeeded,
            format!(
                "groundwater ({:.2} m) is already at or below the target level ({target:.2} m)",
                aq.initial_level
            ),
        )
    } else {
        match e.shape {
            ShapeChoice::Pit => (FlowMethod::EquivalentWell, "set as a pit in the design file".to_string()),
            ShapeChoice::Trench => (FlowMethod::LineSlot, "set as a trench in the design file".to_string()),
            ShapeChoice::Auto if aspect >= model.trench_aspect_ratio => (
                FlowMethod::LineSlot,
                format!("long and narrow: length/width = {aspect:.1} ≥ {:.1}, so one equivalent well would misplace the inflow", model.trench_aspect_ratio),
            ),
            ShapeChoice::Auto => (
                FlowMethod::EquivalentWell,
                format!("compact: length/width = {aspect:.1} < {:.1}", model.trench_aspect_ratio),
            ),
        }
    }
}

/// The method's flow before boundaries, m³/s, with the distance and radius of influence it used.
struct MethodFlow {
    /// Distance of influence L₀ (or the leakage factor B for a leaky slot).
    l0: f64,
    /// Radius of influence counted from the centre.
    big_r: f64,
    /// Total flow.
    q: f64,
    /// Line slot only: flow through the two long sides.
    sides: Option<f64>,
    /// Line slot only: flow through the two ends together.
    ends: Option<f64>,
}

/// Flow by the chosen method, m³/s. Pit: Thiem (or Hantush–Jacob) for the equivalent well.
/// Trench: per metre from both sides, leaky q = 2·ΔΦ/B (one-dimensional leaky flow), else
/// 2·ΔΦ/L₀, plus the two ends as one radial well of radius W/2.
#[allow(clippy::too_many_arguments)]
fn method_flow(
    aq: &Aquifer,
    method: FlowMethod,
    delta_phi: f64,
    r_e: f64,
    length: f64,
    width: f64,
    l0_radial: f64,
    l0_line: f64,
) -> MethodFlow {
    let leaky = aq.leakage_factor();
    let (l0, big_r, q, sides, ends) = match method {
        FlowMethod::NoneNeeded => (l0_radial, r_e + l0_radial, 0.0, None, None),
        FlowMethod::EquivalentWell => {
            let big_r = r_e + l0_radial;
            (
                l0_radial,
                big_r,
                radial_flow(aq, delta_phi, r_e, big_r),
                None,
                None,
            )
        }
        FlowMethod::LineSlot => {
            // Per metre, both sides: leaky q = 2·ΔΦ/B (one-dimensional leaky flow), else 2·ΔΦ/L₀.
            let per_m = 2.0 * delta_phi / leaky.unwrap_or(l0_line);
            let sides = per_m * length;
            let r_end = (width / 2.0).max(0.05);
            let ends = radial_flow(aq, delta_phi, r_end, r_end + l0_radial);
            (
                leaky.unwrap_or(l0_line),
                r_end + l0_radial,
                sides + ends,
                Some(sides),
                Some(ends),
            )
        }
    };
    MethodFlow {
        l0,
        big_r,
        q,
        sides,
        ends,
    }
}

/// The note saying where the distance of influence `l0` came from (at drawdown `s`).
fn influence_note(model: &Model, s: f64, l0: f64) -> EstimateNote {
    let aq = &model.aquifer;
    let basis = match &model.influence {
        crate::input::model::InfluenceMethod::Sichardt { .. }
        | crate::input::model::InfluenceMethod::Kusakin => InfluenceBasis::AtDrawdown {
            method: model.influence.name().to_string(),
            drawdown: s,
        },
        crate::input::model::InfluenceMethod::PumpingTest { .. } => InfluenceBasis::PumpingTest {
            jacob: matches!(aq.kind, AquiferKind::Unconfined),
        },
        other => InfluenceBasis::Fixed {
            method: other.name().to_string(),
        },
    };
    EstimateNote::Influence {
        distance: l0,
        basis,
    }
}

/// First-order images of the equivalent well at `centre`, one per boundary: (distance from the
/// well to its image = twice the distance to the boundary, sign of the image).
fn boundary_images(model: &Model, centre: [f64; 2]) -> Vec<(f64, f64)> {
    model
        .boundaries
        .iter()
        .map(|b| {
            let f = crate::geometry::foot(centre, b.line[0], b.line[1]);
            let a = (f[0] - centre[0]).hypot(f[1] - centre[1]);
            (2.0 * a, crate::physics::images::image_sign(b.kind))
        })
        .collect()
}

/// One well's capacity with the screen below the target level taken as wetted:
/// (wetted screen, Sichardt capacity, capacity used, what limits it).
fn well_capacity(model: &Model, target: f64) -> (f64, f64, f64, String) {
    let w = &model.wells;
    // water enters over the filter column round the screen (the screen when none given)
    let wetted = (w.filter_top.min(target) - w.filter_base).max(0.0);
    let sichardt = capacity::sichardt_well_capacity(w.radius, wetted, model.aquifer.conductivity);
    let (cap, limit) = match w.pump_capacity {
        Some(p) if p < sichardt => (p, "pump capacity".to_string()),
        _ => (sichardt, "Sichardt entrance gradient".to_string()),
    };
    (wetted, sichardt, cap, limit)
}

/// Boundaries: first-order images of the equivalent well (radius `r_e`) at the centroid. Returns
/// the flow with boundaries and the factor on `q_free`, and adds the note listing them.
fn apply_boundaries(
    model: &Model,
    e: &Excavation,
    method: FlowMethod,
    r_e: f64,
    l0_radial: f64,
    q_free: f64,
    notes: &mut Vec<EstimateNote>,
) -> (f64, f64) {
    let leaky = model.aquifer.leakage_factor();
    let centre = geo::Centroid::centroid(&e.outline).map_or([0.0, 0.0], |c| [c.x(), c.y()]);
    let images = boundary_images(model, centre);
    let factor = if method == FlowMethod::NoneNeeded || images.is_empty() {
        1.0
    } else {
        crate::physics::image_flow::boundary_flow_factor(r_e, r_e + l0_radial, leaky, &images)
    };
    let q = q_free * factor;
    if !images.is_empty() && method != FlowMethod::NoneNeeded {
        notes.push(EstimateNote::Boundaries {
            equivalent_radius: r_e,
            boundaries: model
                .boundaries
                .iter()
                .zip(&images)
                .map(|(b, (d, _))| (b.name.clone(), d / 2.0))
                .collect(),
            with: q,
            without: q_free,
            factor,
        });
    }
    (q, factor)
}

/// The notes on the method's validity: a trench shorter than twice its distance of influence
/// (compare the equivalent well's flow), and R close to r_e where ln(R/r_e) is sensitive.
#[allow(clippy::too_many_arguments)]
fn method_notes(
    model: &Model,
    method: FlowMethod,
    flow: &MethodFlow,
    r_e: f64,
    length: f64,
    l0_line: f64,
    equivalent_well: f64,
    notes: &mut Vec<EstimateNote>,
) {
    let leaky = model.aquifer.leakage_factor();
    let big_r = flow.big_r;
    if method == FlowMethod::LineSlot && length < 2.0 * leaky.unwrap_or(l0_line) {
        notes.push(EstimateNote::ShortTrench {
            length,
            distance: leaky.unwrap_or(l0_line),
            equivalent_well_flow: equivalent_well,
        });
    }
    if method != FlowMethod::NoneNeeded && leaky.is_none() && big_r < 1.5 * r_e {
        notes.push(EstimateNote::SensitiveLogarithm {
            radius: big_r,
            equivalent_radius: r_e,
        });
    }
}

/// The notes on the setting that do not depend on the flow: leaky layer, target below the
/// confining top, low contingency.
fn setting_notes(model: &Model, target: f64, notes: &mut Vec<EstimateNote>) {
    let aq = &model.aquifer;
    if let Some(b) = aq.leakage_factor() {
        notes.push(EstimateNote::Leaky { leakage_factor: b });
    }
    if matches!(aq.kind, AquiferKind::Confined) {
        if let Some(top) = aq.top_level {
            if target < top {
                notes.push(EstimateNote::BelowConfiningTop { target, top });
            }
        }
    }
    if model.contingency < 0.5 {
        notes.push(EstimateNote::LowContingency {
            contingency: model.contingency,
        });
    }
}

/// The suction note for wellpoints: one definition with `check` and `design`: the water in a
/// wellpoint may go down to the header level less the suction limit, and it must reach below
/// the target.
fn suction_note(model: &Model, target: f64) -> EstimateNote {
    let w = &model.wells;
    let floor = model.as_built.suction_floor(w.suction_limit);
    EstimateNote::Suction {
        floor,
        header: model.as_built.header_level,
        header_is_ground: !model.as_built.header_given,
        suction_limit: w.suction_limit,
        target,
    }
}

fn estimate_excavation(model: &Model, e: &Excavation) -> ExcavationEstimate {
    let aq = &model.aquifer;
    let area = e.outline.unsigned_area();
    let perimeter = Euclidean.length(e.outline.exterior());
    let (length, width, along_centre) = measure(e);
    let r_e = equivalent::equivalent_radius_from_area(area);
    let r_p = equivalent::equivalent_radius_from_perimeter(perimeter);
    // The level the design works to: the relief head for `control = "relieve"` (or where it is
    // the lower in `"both"`), else formation − margin; the same as the check points carry.
    let design_target = crate::field::checkpoints::design_target(model, e);
    let target = design_target.level.unwrap_or(aq.initial_level);
    let s = aq.initial_level - target;
    let delta_phi = aq.initial_potential() - aq.potential(target);
    let aspect = if width > 0.0 {
        length / width
    } else {
        f64::INFINITY
    };
    let mut notes = Vec::new();

    if design_target.relief {
        notes.push(EstimateNote::ReliefHead {
            head: target,
            factor_of_safety: model.uplift.as_ref().map_or(0.0, |u| u.factor_of_safety),
            formation_less_margin: e.target_level(),
        });
    }
    let (method, reason) =
        choose_method(model, e, design_target.level.is_some(), target, s, aspect);

    let l0_radial = model.influence.distance(aq, s.max(0.0), false);
    let l0_line = model.influence.distance(aq, s.max(0.0), true);
    let flow = method_flow(
        aq, method, delta_phi, r_e, length, width, l0_radial, l0_line,
    );
    if method != FlowMethod::NoneNeeded {
        notes.push(influence_note(model, s, flow.l0));
    }
    let q_free = flow.q;
    let (q, factor) = apply_boundaries(model, e, method, r_e, l0_radial, q_free, &mut notes);
    let equivalent_well = if method == FlowMethod::NoneNeeded {
        0.0
    } else {
        radial_flow(aq, delta_phi, r_e, r_e + l0_radial)
    };
    method_notes(
        model,
        method,
        &flow,
        r_e,
        length,
        l0_line,
        equivalent_well,
        &mut notes,
    );
    setting_notes(model, target, &mut notes);

    // One well's capacity: screen length below the target level is taken as wetted.
    let w = &model.wells;
    let (wetted, sichardt, cap, limit) = well_capacity(model, target);
    let design = q * (1.0 + model.contingency);
    // The same share of each well's capacity as `design` uses (allowances.capacity_fraction).
    let fraction = model.design.capacity_fraction;
    let count = if design <= 0.0 || cap <= 0.0 {
        0
    } else {
        (design / (fraction * cap)).ceil() as u32
    };
    if wetted <= 0.0 && design > 0.0 {
        notes.push(EstimateNote::NoScreenBelowTarget);
    }
    if w.kind == WellKind::Wellpoint {
        notes.push(suction_note(model, target));
    }

    let day = 86_400.0;
    ExcavationEstimate {
        name: e.name.clone(),
        area_m2: area,
        perimeter_m: perimeter,
        length_m: length,
        width_m: width,
        length_basis: if along_centre {
            "along the centre line; width = area / length"
        } else {
            "smallest enclosing rectangle"
        }
        .to_string(),
        equivalent_radius_m: r_e,
        equivalent_radius_perimeter_form_m: r_p,
        formation_level_m: e.formation_level,
        target_level_m: target,
        relief_head: design_target.relief,
        drawdown_m: s,
        flow_method: method,
        flow_method_reason: reason,
        influence_method: model.influence.name().to_string(),
        distance_of_influence_m: flow.l0,
        radius_of_influence_m: flow.big_r,
        total_flow_m3_per_day: q * day,
        total_flow_l_per_s: q * 1e3,
        slot_sides_flow_m3_per_day: flow.sides.map(|v| v * day),
        slot_ends_flow_m3_per_day: flow.ends.map(|v| v * day),
        flow_per_100m_m3_per_day: flow.sides.map(|v| v * day * 100.0 / length.max(1e-9)),
        flow_without_boundaries_l_per_s: q_free * 1e3,
        boundary_factor: factor,
        equivalent_well_flow_m3_per_day: equivalent_well * day,
        contingency: model.contingency,
        design_flow_m3_per_day: design * day,
        design_flow_l_per_s: design * 1e3,
        wetted_screen_m: wetted,
        sichardt_capacity_l_per_s: sichardt * 1e3,
        well_capacity_l_per_s: cap * 1e3,
        well_capacity_limit: limit,
        capacity_fraction: fraction,
        rough_well_count: count,
        standby_wells: w.standby,
        notes,
    }
}
