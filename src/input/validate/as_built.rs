//! Wells as they are built: vertical anisotropy, wellpoint header, well loss, spacing limits and
//! recharge-well limits, checked in SI.

use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema;

/// The as-built settings from `[aquifer]` and `[wells]`.
pub fn as_built(
    rep: &Reporter,
    raw_aquifer: &schema::Aquifer,
    raw: Option<&schema::WellSpec>,
    spec: &WellSpec,
    ground: f64,
) -> Result<AsBuilt, InputError> {
    let anisotropy = raw_aquifer.anisotropy.unwrap_or(1.0);
    if !(anisotropy.is_finite() && (1e-4..=1.0).contains(&anisotropy)) {
        return Err(rep.error(
            "aquifer.anisotropy",
            None,
            format!("K_v/K_h = {anisotropy} is outside 0.0001 … 1 (layered sands are about 0.1; 1 = isotropic, the default)"),
        ));
    }
    let header = raw.and_then(|w| w.header_level.as_ref());
    let header_level = header.map_or(ground, |q| q.si);
    if !header_level.is_finite() || header_level > ground + 3.0 || header_level < spec.screen_base {
        return Err(rep.error(
            "wells.header_level",
            header.and_then(|q| q.span.clone()),
            format!("{header_level} m must lie between the screen base ({:.2} m) and 3 m above ground ({:.2} m); the header usually sits at or just below ground", spec.screen_base, ground + 3.0),
        ));
    }
    let c = raw.and_then(|w| w.loss_coefficient);
    let e = raw.and_then(|w| w.efficiency);
    let loss = match (c, e) {
        (Some(_), Some(_)) => {
            return Err(rep.error(
                "wells.loss_coefficient",
                None,
                "give either loss_coefficient (Jacob's C, s²/m⁵) or efficiency, not both",
            ))
        }
        (Some(c), None) => {
            if !(c.is_finite() && (0.0..=1e7).contains(&c)) {
                return Err(rep.error("wells.loss_coefficient", None, format!("C = {c} s²/m⁵ is outside 0 … 1e7 (Walton 1962: below 1 900 a well-developed well, above 3 800 a clogged one)")));
            }
            WellLossSpec::Jacob(c)
        }
        (None, Some(e)) => {
            if !(e.is_finite() && e > 0.05 && e <= 1.0) {
                return Err(rep.error(
                    "wells.efficiency",
                    None,
                    format!("{e} is outside 0.05 … 1 (a well efficiency; 0.7–0.9 is usual)"),
                ));
            }
            WellLossSpec::Efficiency(e)
        }
        (None, None) => WellLossSpec::None,
    };
    let (dmin, dmax) = match spec.kind {
        WellKind::Wellpoint => (DEFAULT_MIN_SPACING_WELLPOINT, DEFAULT_MAX_SPACING_WELLPOINT),
        WellKind::DeepWell => (DEFAULT_MIN_SPACING_DEEP_WELL, DEFAULT_MAX_SPACING_DEEP_WELL),
    };
    let min_q = raw.and_then(|w| w.min_spacing.as_ref());
    let max_q = raw.and_then(|w| w.max_spacing.as_ref());
    let min_spacing = min_q.map_or(dmin, |q| q.si);
    let max_spacing = max_q.map_or(dmax.max(min_spacing), |q| q.si);
    if !(min_spacing.is_finite() && (0.2..=200.0).contains(&min_spacing)) {
        return Err(rep.error(
            "wells.min_spacing",
            min_q.and_then(|q| q.span.clone()),
            format!("{min_spacing} m is outside 0.2 … 200 m"),
        ));
    }
    if !(max_spacing.is_finite() && max_spacing >= min_spacing && max_spacing <= 500.0) {
        return Err(rep.error(
            "wells.max_spacing",
            max_q.and_then(|q| q.span.clone()),
            format!(
                "{max_spacing} m must be at least min_spacing ({min_spacing} m) and at most 500 m"
            ),
        ));
    }
    let fraction = raw.and_then(|w| w.injection_fraction);
    let injection_fraction = fraction.unwrap_or(DEFAULT_INJECTION_FRACTION);
    if !(injection_fraction.is_finite() && injection_fraction > 0.0 && injection_fraction <= 1.0) {
        return Err(rep.error(
            "wells.injection_fraction",
            None,
            format!("{injection_fraction} is outside 0 … 1 (a recharge well takes a fraction of what it would give; 0.5 is common practice)"),
        ));
    }
    let margin_q = raw.and_then(|w| w.injection_margin.as_ref());
    let margin = margin_q.map_or(DEFAULT_INJECTION_MARGIN, |q| q.si);
    if !(margin.is_finite() && (0.0..=20.0).contains(&margin)) {
        return Err(rep.error(
            "wells.injection_margin",
            margin_q.and_then(|q| q.span.clone()),
            format!("{margin} m is outside 0 … 20 m below ground"),
        ));
    }
    let max_q = raw.and_then(|w| w.max_injection_level.as_ref());
    let (max_injection_level, injection_basis) = match max_q {
        Some(q) => {
            if !(q.si.is_finite() && q.si <= ground) {
                return Err(rep.error(
                    "wells.max_injection_level",
                    q.span.clone(),
                    format!(
                        "{} m is above ground level ({ground} m); water would spill",
                        q.si
                    ),
                ));
            }
            (q.si, InjectionBasis::Given { level_m: q.si })
        }
        None => (
            ground - margin,
            InjectionBasis::BelowGround {
                margin_m: margin,
                default: margin_q.is_none(),
            },
        ),
    };
    Ok(AsBuilt {
        anisotropy,
        header_level,
        header_given: header.is_some(),
        loss,
        min_spacing,
        max_spacing,
        spacing_default: min_q.is_none() && max_q.is_none(),
        injection_fraction,
        max_injection_level,
        injection_basis,
    })
}
