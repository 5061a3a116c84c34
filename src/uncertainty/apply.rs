//! One sample of the uncertain inputs put into a copy of the model.
//!
//! K (or T = K·h₀, h₀ the saturated thickness before pumping), S_y or S (with the storage of
//! Cooper–Jacob's radius), Sichardt's C (the line value scaled in proportion), the fixed
//! distance of influence, the groundwater level, the aquitard resistance c (a leaky aquifer's
//! B = √(T·c) is recomputed from the sample's T and c — with c kept at the file's B²/T when c is
//! not sampled, so a sampled K moves B as it does in the ground), K_v/K_h, and a factor on every
//! neighbour layer's m_v, C_c and C_r.

use crate::input::model::{Compressibility, InfluenceMethod, Model};
use crate::input::model_uncertainty::{InputKind, Uncertainty};
use crate::physics::potential::AquiferKind;

/// `base` with the sampled `values` (SI, in the order of `spec.inputs`).
pub fn apply(base: &Model, spec: &Uncertainty, values: &[f64]) -> Model {
    let mut m = base.clone();
    let value = |k: InputKind| {
        spec.inputs
            .iter()
            .zip(values)
            .find(|(i, _)| i.kind == k)
            .map(|(_, v)| *v)
    };
    let resistance0 = base
        .aquifer
        .leakage_factor()
        .map(|b| b * b / base.aquifer.transmissivity());
    if let Some(level) = value(InputKind::GroundwaterLevel) {
        m.aquifer.initial_level = level;
    }
    if let Some(k) = value(InputKind::Conductivity) {
        m.aquifer.conductivity = k;
    }
    if let Some(t) = value(InputKind::Transmissivity) {
        m.aquifer.conductivity = t / m.aquifer.initial_saturated_thickness().max(1e-6);
    }
    if let Some(s) = value(InputKind::SpecificYield) {
        m.aquifer.specific_yield = Some(s);
    }
    if let Some(s) = value(InputKind::Storativity) {
        m.aquifer.storativity = Some(s);
    }
    if let (Some(s), InfluenceMethod::CooperJacob { storage, .. }) = (
        value(InputKind::SpecificYield).or(value(InputKind::Storativity)),
        &mut m.influence,
    ) {
        *storage = s;
    }
    match &mut m.influence {
        InfluenceMethod::Sichardt { c_radial, c_line } => {
            if let Some(c) = value(InputKind::SichardtC) {
                *c_line *= c / *c_radial;
                *c_radial = c;
            }
        }
        InfluenceMethod::Fixed { distance } => {
            if let Some(d) = value(InputKind::Distance) {
                *distance = d;
            }
        }
        _ => {}
    }
    let t = m.aquifer.conductivity * m.aquifer.initial_saturated_thickness();
    if let (AquiferKind::Leaky { leakage_factor }, Some(c0)) = (&mut m.aquifer.kind, resistance0) {
        let c = value(InputKind::AquitardResistance).unwrap_or(c0);
        *leakage_factor = (t * c).sqrt();
    }
    if let Some(a) = value(InputKind::Anisotropy) {
        m.as_built.anisotropy = a;
    }
    if let Some(f) = value(InputKind::CompressibilityFactor) {
        for layer in m.neighbours.iter_mut().flat_map(|n| n.layers.iter_mut()) {
            layer.compressibility = match layer.compressibility {
                Compressibility::Mv(mv) => Compressibility::Mv(mv * f),
                Compressibility::Cc {
                    cc,
                    e0,
                    sigma0,
                    sigma_p,
                    cr,
                } => Compressibility::Cc {
                    cc: cc * f,
                    e0,
                    sigma0,
                    sigma_p,
                    cr: cr * f,
                },
                Compressibility::Incompressible => Compressibility::Incompressible,
            };
        }
    }
    m
}
