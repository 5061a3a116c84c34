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
    let layers = n
        .layer
        .iter()
        .enumerate()
        .map(|(j, l)| layer(rep, &format!("neighbour[{}].layer[{}]", i + 1, j + 1), l))
        .collect::<Result<Vec<_>, _>>()?;
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
        height: n
            .height
            .as_ref()
            .map(|q| check_positive(rep, &f("height"), q, "building height, e.g. \"9 m\""))
            .transpose()?,
        dewatering_duration: n
            .dewatering_duration
            .as_ref()
            .map(|q| {
                if q.si > 0.0 {
                    Ok(q.si)
                } else {
                    Err(rep.error(
                        f("dewatering_duration"),
                        q.span.clone(),
                        "give how long the water stays lowered, greater than zero, e.g. \"120 days\"",
                    ))
                }
            })
            .transpose()?,
    })
}

/// How one layer compresses: m_v; C_c (normally consolidated); C_c with C_r and σ′_p or OCR
/// (over-consolidated); or incompressible.
fn compressibility(
    rep: &Reporter,
    lf: &str,
    l: &schema::SoilLayer,
) -> Result<Compressibility, InputError> {
    let over = l.c_r.is_some() || l.sigma_p.is_some() || l.ocr.is_some();
    if over && l.c_c.is_none() {
        return Err(rep.error(lf, None, "c_r, sigma_p and ocr belong to the C_c form: give c_c, e0, sigma0, c_r and one of sigma_p or ocr"));
    }
    Ok(match (&l.m_v, l.c_c, l.incompressible.unwrap_or(false)) {
        (Some(mv), None, false) => Compressibility::Mv(check_positive(
            rep,
            &format!("{lf}.m_v"),
            mv,
            "m_v, e.g. \"2e-4 1/kPa\"",
        )?),
        (None, Some(cc), false) => {
            let (Some(e0), Some(s0)) = (l.e0, &l.sigma0) else {
                return Err(rep.error(lf, None, "the C_c form needs c_c, e0 and sigma0 (initial effective stress, e.g. \"60 kPa\")"));
            };
            if !(cc > 0.0 && e0 > 0.0) {
                return Err(rep.error(lf, None, "c_c and e0 must be greater than zero"));
            }
            let sigma0 =
                check_positive(rep, &format!("{lf}.sigma0"), s0, "initial effective stress")?;
            let (sigma_p, cr) = over_consolidation(rep, lf, l, cc, sigma0)?;
            Compressibility::Cc {
                cc,
                e0,
                sigma0,
                sigma_p,
                cr,
            }
        }
        (None, None, true) => Compressibility::Incompressible,
        _ => {
            return Err(rep.error(
                lf,
                None,
                "give exactly one of: m_v; c_c with e0 and sigma0 (and c_r with sigma_p or ocr when over-consolidated); or incompressible = true",
            ))
        }
    })
}

/// σ′_p and C_r of a C_c layer: both from `sigma_p` or `ocr` with `c_r`; σ′₀ and 0 when none.
fn over_consolidation(
    rep: &Reporter,
    lf: &str,
    l: &schema::SoilLayer,
    cc: f64,
    sigma0: f64,
) -> Result<(f64, f64), InputError> {
    let sigma_p = match (&l.sigma_p, l.ocr) {
        (None, None) => None,
        (Some(p), None) => Some(check_positive(
            rep,
            &format!("{lf}.sigma_p"),
            p,
            "pre-consolidation pressure, e.g. \"120 kPa\"",
        )?),
        (None, Some(ocr)) if ocr.is_finite() && (1.0..=50.0).contains(&ocr) => Some(ocr * sigma0),
        (None, Some(ocr)) => {
            return Err(rep.error(
                format!("{lf}.ocr"),
                None,
                format!(
                "{ocr} is not an over-consolidation ratio; give 1 … 50 (1: normally consolidated)"
            ),
            ))
        }
        (Some(_), Some(_)) => return Err(rep.error(lf, None, "give sigma_p or ocr, not both")),
    };
    let Some(sigma_p) = sigma_p else {
        return Ok((sigma0, 0.0));
    };
    if sigma_p < sigma0 * (1.0 - 1e-9) {
        return Err(rep.error(format!("{lf}.sigma_p"), None, format!("σ′_p = {sigma_p} kPa is below σ′₀ = {sigma0} kPa; a clay cannot be under-consolidated here (give sigma_p ≥ sigma0)")));
    }
    match l.c_r {
        Some(cr) if cr > 0.0 && cr <= cc => Ok((sigma_p, cr)),
        Some(cr) => Err(rep.error(format!("{lf}.c_r"), None, format!("{cr} is not a recompression index here; give 0 < c_r ≤ c_c (usually c_c/10 … c_c/5)"))),
        None => Err(rep.error(lf, None, "an over-consolidated layer (sigma_p or ocr) needs c_r, the recompression index (usually c_c/10 … c_c/5)")),
    }
}

/// One soil layer: thickness, compressibility, unit weights, c_v and drainage, and what it does
/// above the lowered water table.
fn layer(rep: &Reporter, lf: &str, l: &schema::SoilLayer) -> Result<SoilLayer, InputError> {
    let thickness = check_positive(
        rep,
        &format!("{lf}.thickness"),
        &l.thickness,
        "layer thickness",
    )?;
    let compressibility = compressibility(rep, lf, l)?;
    let weight = |q: &Option<crate::input::units::UnitWeight>, name: &str| {
        q.as_ref()
            .map(|q| check_positive(rep, &format!("{lf}.{name}"), q, "unit weight"))
            .transpose()
    };
    let incompressible = matches!(compressibility, Compressibility::Incompressible);
    let drains_above_water_table = match l.above_water_table.as_deref() {
        None => incompressible,
        Some("saturated") => false,
        Some("drains") => true,
        Some(other) => return Err(rep.error(format!("{lf}.above_water_table"), None, format!("unknown above_water_table \"{other}\"; valid: \"saturated\" (kept saturated by suction, Δu = γ_w·Δh; default for compressible layers) or \"drains\" (u falls to zero, Δu = γ_w·(h₀ − z); default for incompressible ones)"))),
    };
    let drainage = match l.drainage.as_deref() {
        None | Some("both") => DrainageFaces::Both,
        Some("top") => DrainageFaces::Top,
        Some("bottom") => DrainageFaces::Bottom,
        Some(other) => {
            return Err(rep.error(
                format!("{lf}.drainage"),
                None,
                format!(
                "unknown drainage \"{other}\"; valid: \"both\" (default), \"top\" or \"bottom\""
            ),
            ))
        }
    };
    let consolidation = match &l.c_v {
        Some(_) if incompressible => {
            return Err(rep.error(
                format!("{lf}.c_v"),
                None,
                "an incompressible layer does not consolidate; remove c_v or give m_v / c_c",
            ))
        }
        Some(q) => Some(ConsolidationRate {
            cv: check_positive(
                rep,
                &format!("{lf}.c_v"),
                q,
                "coefficient of consolidation, e.g. \"2 m2/year\"",
            )?,
            drainage,
        }),
        None if l.drainage.is_some() => return Err(rep.error(
            format!("{lf}.drainage"),
            None,
            "drainage is used with c_v (consolidation in time); give c_v too, e.g. \"2 m2/year\"",
        )),
        None => None,
    };
    Ok(SoilLayer {
        name: l.name.clone(),
        thickness,
        compressibility,
        unit_weight: weight(&l.unit_weight, "unit_weight")?,
        moist_unit_weight: weight(&l.moist_unit_weight, "moist_unit_weight")?,
        drains_above_water_table,
        consolidation,
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
