//! Neighbouring buildings (footprint, foundation, soil layers, limits) and the base-uplift check.

use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema::{self, DesignFile};
use crate::input::validate::shapes::{check_positive, polygon};
use std::collections::HashSet;

/// One neighbour: name unique, footprint valid, foundation, soil layers and limits checked.
pub fn neighbour(
    rep: &Reporter,
    i: usize,
    n: &schema::Neighbour,
    names: &mut HashSet<String>,
) -> Result<Neighbour, InputError> {
    let f = |s: &str| format!("neighbour[{}].{s}", i + 1);
    if !names.insert(n.name.clone()) {
        return Err(rep.error(
            f("name"),
            Some(n.footprint.span()),
            format!(
                "duplicate neighbour name \"{}\"; each neighbour needs its own name",
                n.name
            ),
        ));
    }
    let footprint = polygon(rep, &f("footprint"), &n.footprint)?;
    let positive =
        |q: &Option<crate::input::units::Length>, name: &str| -> Result<Option<f64>, InputError> {
            q.as_ref()
                .map(|q| check_positive(rep, &f(name), q, "a limit greater than zero"))
                .transpose()
        };
    let mut layers = Vec::new();
    for (j, l) in n.layer.iter().enumerate() {
        let lf = format!("neighbour[{}].layer[{}]", i + 1, j + 1);
        let thickness = check_positive(
            rep,
            &format!("{lf}.thickness"),
            &l.thickness,
            "layer thickness",
        )?;
        let compressibility = match (&l.m_v, l.c_c, l.incompressible.unwrap_or(false)) {
            (Some(mv), None, false) => Compressibility::Mv(check_positive(
                rep,
                &format!("{lf}.m_v"),
                mv,
                "m_v, e.g. \"2e-4 1/kPa\"",
            )?),
            (None, Some(cc), false) => {
                let (Some(e0), Some(s0)) = (l.e0, &l.sigma0) else {
                    return Err(rep.error(&lf, None, "the C_c form needs c_c, e0 and sigma0 (initial effective stress, e.g. \"60 kPa\")"));
                };
                if !(cc > 0.0 && e0 > 0.0) {
                    return Err(rep.error(&lf, None, "c_c and e0 must be greater than zero"));
                }
                Compressibility::Cc {
                    cc,
                    e0,
                    sigma0: check_positive(
                        rep,
                        &format!("{lf}.sigma0"),
                        s0,
                        "initial effective stress",
                    )?,
                }
            }
            (None, None, true) => Compressibility::Incompressible,
            _ => {
                return Err(rep.error(
                    &lf,
                    None,
                    "give exactly one of: m_v; c_c with e0 and sigma0; or incompressible = true",
                ))
            }
        };
        let unit_weight = l
            .unit_weight
            .as_ref()
            .map(|q| check_positive(rep, &format!("{lf}.unit_weight"), q, "unit weight"))
            .transpose()?;
        let moist_unit_weight = l
            .moist_unit_weight
            .as_ref()
            .map(|q| check_positive(rep, &format!("{lf}.moist_unit_weight"), q, "unit weight"))
            .transpose()?;
        layers.push(SoilLayer {
            name: l.name.clone(),
            thickness,
            compressibility,
            unit_weight,
            moist_unit_weight,
        });
    }
    let buoyancy_loss = match n.stress_change.as_deref() {
        None | Some("simple") => false,
        Some("buoyancy-loss") => true,
        Some(other) => return Err(rep.error(f("stress_change"), None, format!("unknown stress_change \"{other}\"; valid: \"simple\" (γ_w·Δh, default) or \"buoyancy-loss\" (needs unit_weight and moist_unit_weight on every layer)"))),
    };
    if buoyancy_loss {
        for (j, l) in layers.iter().enumerate() {
            match (l.unit_weight, l.moist_unit_weight) {
                (Some(sat), Some(moist)) if moist <= sat => {}
                (Some(sat), Some(moist)) => return Err(rep.error(format!("neighbour[{}].layer[{}].moist_unit_weight", i + 1, j + 1), None, format!("{moist} kN/m3 is above the saturated unit weight {sat} kN/m3; a drained soil is lighter"))),
                _ => return Err(rep.error(format!("neighbour[{}].layer[{}]", i + 1, j + 1), None, "stress_change = \"buoyancy-loss\" needs unit_weight (saturated) and moist_unit_weight on every layer, e.g. \"20 kN/m3\" and \"17 kN/m3\"")),
            }
        }
    }
    if let Some(r) = &n.allowable_distortion {
        if !(r.value > 0.0 && r.value < 1.0) {
            return Err(rep.error(
                f("allowable_distortion"),
                r.span.clone(),
                format!("{} is not an angular distortion; give a fraction between 0 and 1, e.g. \"1/500\" (usual 1/1000 … 1/300)", r.value),
            ));
        }
    }
    Ok(Neighbour {
        name: n.name.clone(),
        footprint,
        foundation_level: n.foundation_level.as_ref().map(|q| q.si),
        allowable_drawdown: positive(&n.allowable_drawdown, "allowable_drawdown")?,
        allowable_rise: positive(&n.allowable_rise, "allowable_rise")?,
        allowable_settlement: positive(&n.allowable_settlement, "allowable_settlement")?,
        allowable_distortion: n.allowable_distortion.as_ref().map(|r| r.value),
        layers,
        buoyancy_loss,
        protect_with_recharge: n.protect_with_recharge.unwrap_or(false),
    })
}

/// The uplift section: a confined layer below every excavation's formation.
pub fn uplift(
    rep: &Reporter,
    raw: &DesignFile,
    excavations: &[Excavation],
) -> Result<Option<Uplift>, InputError> {
    Ok(match &raw.uplift {
        Some(u) => {
            let lowest = excavations
                .iter()
                .map(|e| e.formation_level)
                .fold(f64::INFINITY, f64::min);
            if u.layer_top.si >= lowest {
                return Err(rep.error("uplift.layer_top", u.layer_top.span.clone(), format!("the confined layer's top ({} m) must be below the formation level of every excavation (lowest {lowest} m); the uplift check is for a layer under the dig", u.layer_top.si)));
            }
            let fos = u.factor_of_safety.unwrap_or(1.2);
            if !(1.0..=3.0).contains(&fos) {
                return Err(rep.error(
                    "uplift.factor_of_safety",
                    None,
                    format!("{fos} is outside 1 … 3 (usual 1.1 … 1.5)"),
                ));
            }
            Some(Uplift {
                layer_top: u.layer_top.si,
                piezometric_level: u.piezometric_level.si,
                soil_unit_weight: check_positive(
                    rep,
                    "uplift.soil_unit_weight",
                    &u.soil_unit_weight,
                    "unit weight, e.g. \"19 kN/m3\"",
                )?,
                factor_of_safety: fos,
            })
        }
        None => None,
    })
}
