//! `[[layer]]`: the ground below `[aquifer]`, from the top down, checked and turned into
//! [`LayeredGround`] (aquifers, the resistance between each pair, aquitards).
//!
//! Between two aquifers the resistance is the sum of the aquitards' c = thickness/K_v (or the
//! c given); two aquifers touching (one aquifer split into sublayers, e.g. for partial
//! penetration) take c = ½·d₁/K_v1 + ½·d₂/K_v2 ([`sublayer_resistance`]).

use crate::input::error::{InputError, Reporter};
use crate::input::model_layers::{GroundAquifer, GroundAquitard, LayeredGround};
use crate::input::schema::{DesignFile, Layer};
use crate::input::validate::shapes::check_positive;
use crate::physics::multi_aquifer::sublayer_resistance;
use crate::physics::potential::{Aquifer, AquiferKind};

/// The layered ground, or `None` without `[[layer]]` entries.
pub fn layers(
    rep: &Reporter,
    raw: &DesignFile,
    top: &Aquifer,
) -> Result<Option<LayeredGround>, InputError> {
    if raw.layer.is_empty() {
        return Ok(None);
    }
    if matches!(top.kind, AquiferKind::Leaky { .. }) {
        return Err(rep.error(
            "aquifer.kind",
            None,
            "with [[layer]] entries the leaky top is not offered yet: give kind = \"unconfined\" or \"confined\" and the aquitards and aquifers below as [[layer]] entries",
        ));
    }
    let top_kv = top.conductivity * raw.aquifer.anisotropy.unwrap_or(1.0);
    let top_level = top.top_level.unwrap_or(top.initial_level);
    let mut ground = LayeredGround {
        aquifers: vec![GroundAquifer {
            name: "aquifer".into(),
            aquifer: top.clone(),
            top: top_level,
            vertical_conductivity: top_kv,
        }],
        resistances: Vec::new(),
        aquitards: Vec::new(),
    };
    // (resistance gathered since the last aquifer, whether an aquitard lay between, that
    // aquifer's thickness and K_v)
    let mut pending = 0.0;
    let mut through_aquitard = false;
    let mut last = (top.initial_saturated_thickness(), top_kv);
    let mut layer_top = top.base_level;
    for (i, l) in raw.layer.iter().enumerate() {
        let field = |f: &str| format!("layer[{i}].{f}");
        if l.name.trim().is_empty() {
            return Err(rep.error(field("name"), None, "must not be empty"));
        }
        let base = l.base_level.si;
        if base >= layer_top - 1e-9 {
            return Err(rep.error(
                field("base_level"),
                l.base_level.span.clone(),
                format!("the base ({base} m) must be below the layer's top ({layer_top} m, the base of the layer above); list layers from the top down"),
            ));
        }
        let d = layer_top - base;
        match l.kind.trim() {
            "aquitard" => {
                let c = aquitard_resistance(rep, l, i, d)?;
                pending += c;
                through_aquitard = true;
                ground.aquitards.push(GroundAquitard {
                    name: l.name.trim().into(),
                    top: layer_top,
                    base,
                    resistance: c,
                });
            }
            "aquifer" => {
                let (aquifer, kv) = lower_aquifer(rep, l, i, layer_top, top.initial_level)?;
                let c = if through_aquitard {
                    pending
                } else {
                    sublayer_resistance(last.0, last.1, d, kv)
                };
                ground.resistances.push(c);
                ground.aquifers.push(GroundAquifer {
                    name: l.name.trim().into(),
                    aquifer,
                    top: layer_top,
                    vertical_conductivity: kv,
                });
                pending = 0.0;
                through_aquitard = false;
                last = (d, kv);
            }
            other => {
                return Err(rep.error(
                    field("kind"),
                    None,
                    format!("unknown layer kind \"{other}\"; valid: \"aquifer\", \"aquitard\""),
                ))
            }
        }
        layer_top = base;
    }
    if ground.aquifers.len() < 2 {
        return Err(rep.error(
            "layer",
            None,
            "the [[layer]] entries hold no aquifer: an aquitard with nothing below it changes nothing (the base is impermeable); add the aquifer below it, or leave the layers out",
        ));
    }
    if through_aquitard {
        return Err(rep.error(
            "layer",
            None,
            "the last [[layer]] is an aquitard; the base of the lowest aquifer is taken as impermeable, so leave it out",
        ));
    }
    Ok(Some(ground))
}

/// Resistance c of an aquitard of thickness `d` (m), s: given, or d/K_v.
fn aquitard_resistance(rep: &Reporter, l: &Layer, i: usize, d: f64) -> Result<f64, InputError> {
    let field = |f: &str| format!("layer[{i}].{f}");
    if l.conductivity.is_some() || l.anisotropy.is_some() || l.storativity.is_some() {
        return Err(rep.error(
            field("kind"),
            None,
            "an aquitard takes vertical_conductivity or resistance only (conductivity, anisotropy and storativity belong to aquifers)",
        ));
    }
    let c = match (&l.vertical_conductivity, &l.resistance) {
        (Some(kv), None) => d / check_positive(rep, &field("vertical_conductivity"), kv, "K_v of the aquitard, e.g. \"1e-8 m/s\"")?,
        (None, Some(c)) => check_positive(rep, &field("resistance"), c, "c = thickness/K_v, e.g. \"200 days\"")?,
        (Some(_), Some(_)) => return Err(rep.error(field("resistance"), None, "give vertical_conductivity or resistance, not both")),
        (None, None) => return Err(rep.error(field("kind"), None, "an aquitard needs vertical_conductivity (e.g. \"1e-8 m/s\") or resistance (e.g. \"200 days\")")),
    };
    if c < 60.0 {
        return Err(rep.error(
            field("resistance"),
            None,
            format!("c = {c:.3} s is no aquitard (under a minute); give the layer as an aquifer"),
        ));
    }
    Ok(c)
}

/// An aquifer below the top one: confined by the layer above, the same groundwater level at
/// rest; and its K_v, m/s.
fn lower_aquifer(
    rep: &Reporter,
    l: &Layer,
    i: usize,
    top: f64,
    initial: f64,
) -> Result<(Aquifer, f64), InputError> {
    let field = |f: &str| format!("layer[{i}].{f}");
    if l.resistance.is_some() {
        return Err(rep.error(
            field("resistance"),
            None,
            "resistance belongs to an aquitard; an aquifer takes conductivity and anisotropy or vertical_conductivity",
        ));
    }
    let Some(k) = &l.conductivity else {
        return Err(rep.error(
            field("conductivity"),
            None,
            "an aquifer layer needs conductivity (K_h, e.g. \"5e-4 m/s\")",
        ));
    };
    let kh = k.si;
    if !(1e-9..=1.0).contains(&kh) {
        return Err(rep.error(
            field("conductivity"),
            k.span.clone(),
            format!("{kh:e} m/s is outside 1e-9 … 1 m/s"),
        ));
    }
    let kv = match (&l.vertical_conductivity, l.anisotropy) {
        (Some(kv), None) => check_positive(rep, &field("vertical_conductivity"), kv, "K_v, m/s")?,
        (None, Some(a)) if a.is_finite() && (1e-4..=1.0).contains(&a) => a * kh,
        (None, Some(a)) => {
            return Err(rep.error(
                field("anisotropy"),
                None,
                format!("K_v/K_h = {a} is outside 0.0001 … 1"),
            ))
        }
        (None, None) => kh,
        (Some(_), Some(_)) => {
            return Err(rep.error(
                field("anisotropy"),
                None,
                "give anisotropy or vertical_conductivity, not both",
            ))
        }
    };
    if let Some(s) = l.storativity {
        if !(s > 0.0 && s < 0.5) {
            return Err(rep.error(
                field("storativity"),
                None,
                format!("{s} is outside 0 < S < 0.5"),
            ));
        }
    }
    let aquifer = Aquifer {
        kind: AquiferKind::Confined,
        conductivity: kh,
        base_level: l.base_level.si,
        top_level: Some(top),
        initial_level: initial.max(top),
        storativity: l.storativity,
        specific_yield: None,
    };
    Ok((aquifer, kv))
}
