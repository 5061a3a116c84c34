//! The aquifer (kind, conductivity, levels, storage, leakage) and the radius-of-influence method.

use crate::input::error::{InputError, Reporter};
use crate::input::model::*;
use crate::input::schema::DesignFile;
use crate::input::validate::shapes::check_positive;
use crate::physics::potential::{Aquifer, AquiferKind};
use crate::physics::{hantush, radius};

/// The aquifer section.
pub fn aquifer(rep: &Reporter, raw: &DesignFile, ground: f64) -> Result<Aquifer, InputError> {
    // Aquifer.
    let a = &raw.aquifer;
    let k = a.conductivity.si;
    if !(1e-9..=1.0).contains(&k) {
        return Err(rep.error(
            "aquifer.conductivity",
            a.conductivity.span.clone(),
            format!("{k:e} m/s is outside 1e-9 … 1 m/s; below 1e-9 m/s the ground cannot be drained by wells, above 1 m/s no soil conducts"),
        ));
    }
    let base = a.base_level.si;
    let initial = a.groundwater_level.si;
    if initial <= base {
        return Err(rep.error(
            "aquifer.groundwater_level",
            a.groundwater_level.span.clone(),
            format!(
                "the groundwater level ({initial} m) must be above the aquifer base ({base} m)"
            ),
        ));
    }
    let top = a.top_level.as_ref().map(|t| t.si);
    let kind_name = a.kind.trim().to_lowercase();
    let kind = match kind_name.as_str() {
        "unconfined" => {
            if top.is_some() {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|t| t.span.clone()),
                    "an unconfined aquifer has no top level; remove it, or set kind = \"confined\"",
                ));
            }
            if initial > ground + 1e-9 {
                return Err(rep.error("aquifer.groundwater_level", a.groundwater_level.span.clone(), format!("a water table at {initial} m is above ground level ({ground} m); the site would be flooded — for an artesian head use kind = \"confined\"")));
            }
            AquiferKind::Unconfined
        }
        "confined" | "leaky" => {
            let Some(t) = top else {
                return Err(rep.error(
                    "aquifer.top_level",
                    None,
                    format!(
                        "a {kind_name} aquifer needs top_level, the level of its confining top"
                    ),
                ));
            };
            if t <= base {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|q| q.span.clone()),
                    format!("the top ({t} m) must be above the base ({base} m)"),
                ));
            }
            if t > ground + 1e-9 {
                return Err(rep.error(
                    "aquifer.top_level",
                    a.top_level.as_ref().and_then(|q| q.span.clone()),
                    format!("the top ({t} m) is above ground level ({ground} m)"),
                ));
            }
            if initial < t {
                return Err(rep.error("aquifer.groundwater_level", a.groundwater_level.span.clone(), format!("the piezometric level ({initial} m) is below the confining top ({t} m), so the aquifer is unconfined at rest: set kind = \"unconfined\" and drop top_level")));
            }
            if kind_name == "leaky" {
                let b_conf = t - base;
                let trans = k * b_conf;
                match (&a.leakage_factor, &a.aquitard_resistance) {
                    (Some(b), None) => AquiferKind::Leaky { leakage_factor: check_positive(rep, "aquifer.leakage_factor", b, "leakage factor B = √(T·c), m")? },
                    (None, Some(c)) => AquiferKind::Leaky { leakage_factor: hantush::leakage_factor(trans, check_positive(rep, "aquifer.aquitard_resistance", c, "resistance c = b′/K′ of the aquitard, e.g. \"500 days\"")?) },
                    (Some(b), Some(_)) => return Err(rep.error("aquifer.leakage_factor", b.span.clone(), "give leakage_factor or aquitard_resistance, not both")),
                    (None, None) => return Err(rep.error("aquifer", None, "a leaky aquifer needs leakage_factor (e.g. \"800 m\") or aquitard_resistance (e.g. \"500 days\")")),
                }
            } else {
                AquiferKind::Confined
            }
        }
        other => {
            return Err(rep.error(
                "aquifer.kind",
                None,
                format!(
                "unknown aquifer kind \"{other}\"; valid: \"unconfined\", \"confined\", \"leaky\""
            ),
            ))
        }
    };
    if !matches!(kind, AquiferKind::Leaky { .. })
        && (a.leakage_factor.is_some() || a.aquitard_resistance.is_some())
    {
        return Err(rep.error(
            "aquifer.leakage_factor",
            None,
            "leakage_factor and aquitard_resistance apply only to kind = \"leaky\"",
        ));
    }
    if let Some(s) = a.storativity {
        if !(s > 0.0 && s < 0.5) {
            return Err(rep.error(
                "aquifer.storativity",
                None,
                format!("{s} is outside 0 < S < 0.5 (confined values are usually 1e-5 … 1e-3)"),
            ));
        }
    }
    if let Some(sy) = a.specific_yield {
        if !(sy > 0.0 && sy <= 0.5) {
            return Err(rep.error(
                "aquifer.specific_yield",
                None,
                format!("{sy} is outside 0 < S_y ≤ 0.5 (usual values 0.05 … 0.3)"),
            ));
        }
    }
    let aquifer = Aquifer {
        kind,
        conductivity: k,
        base_level: base,
        top_level: top,
        initial_level: initial,
        storativity: a.storativity,
        specific_yield: a.specific_yield,
    };
    Ok(aquifer)
}

/// The influence section: how the radius of influence is found.
pub fn influence(
    rep: &Reporter,
    raw: &DesignFile,
    aquifer: &Aquifer,
) -> Result<InfluenceMethod, InputError> {
    // Influence.
    let inf = &raw.influence;
    let check_c = |c: Option<f64>, default: f64, field: &str| -> Result<f64, InputError> {
        let c = c.unwrap_or(default);
        if c > 0.0 && c <= 10_000.0 {
            Ok(c)
        } else {
            Err(rep.error(
                format!("influence.{field}"),
                None,
                format!(
                    "{c} is outside 0 … 10000 (Sichardt's C: 3000 radial, 1500–2000 to a line)"
                ),
            ))
        }
    };
    let influence = match inf.method.trim().to_lowercase().as_str() {
        "sichardt" => InfluenceMethod::Sichardt {
            c_radial: check_c(inf.sichardt_c, radius::SICHARDT_C_RADIAL, "sichardt_c")?,
            c_line: check_c(inf.sichardt_c_line, radius::SICHARDT_C_LINE, "sichardt_c_line")?,
        },
        "kusakin" => InfluenceMethod::Kusakin,
        "cooper-jacob" => {
            let Some(t) = &inf.pumping_time else {
                return Err(rep.error("influence.pumping_time", None, "method \"cooper-jacob\" needs pumping_time, the time pumped before digging (e.g. \"14 days\")"));
            };
            let time = check_positive(rep, "influence.pumping_time", t, "a duration such as \"14 days\"")?;
            let Some(storage) = aquifer.storage() else {
                return Err(rep.error("aquifer", None, format!("method \"cooper-jacob\" needs the aquifer's {}", if matches!(aquifer.kind, AquiferKind::Unconfined) { "specific_yield (S_y)" } else { "storativity (S)" })));
            };
            InfluenceMethod::CooperJacob { time, storage }
        }
        "fixed" => {
            let Some(d) = &inf.distance else {
                return Err(rep.error("influence.distance", None, "method \"fixed\" needs distance, the distance of influence L₀ beyond the excavation (e.g. \"150 m\")"));
            };
            InfluenceMethod::Fixed { distance: check_positive(rep, "influence.distance", d, "distance of influence, m")? }
        }
        "pumping-test" => {
            let Some(test) = &inf.test else {
                return Err(rep.error("influence.test", None, "method \"pumping-test\" needs [influence.test] with rate and at least two [[influence.test.observation]] (distance, drawdown)"));
            };
            let q = check_positive(rep, "influence.test.rate", &test.rate, "the steady test rate")?;
            let mut obs = Vec::new();
            for (i, o) in test.observation.iter().enumerate() {
                let fname = format!("influence.test.observation[{}]", i + 1);
                obs.push((
                    check_positive(rep, &format!("{fname}.distance"), &o.distance, "distance from the test well")?,
                    check_positive(rep, &format!("{fname}.drawdown"), &o.drawdown, "steady drawdown")?,
                ));
            }
            // Unconfined: Jacob's correction s′ = s − s²/(2H) before the Thiem line (Kruseman &
            // de Ridder 1994, §5.1), so the fitted R and T are those of the linear theory.
            let fit = if matches!(aquifer.kind, AquiferKind::Unconfined) {
                let h = aquifer.initial_saturated_thickness();
                if obs.iter().any(|(_, s)| *s >= h) {
                    return Err(rep.error("influence.test.observation", None, format!("a drawdown is at or beyond the saturated thickness H = {h:.2} m: that piezometer ran dry; give steady drawdowns below H")));
                }
                crate::physics::pumping_test::distance_drawdown_fit_unconfined(&obs, h)
            } else {
                crate::physics::pumping_test::distance_drawdown_fit(&obs)
            };
            match fit {
                Some((r, slope)) => InfluenceMethod::PumpingTest {
                    radius: r,
                    transmissivity: q / (2.0 * std::f64::consts::PI * slope),
                },
                None => return Err(rep.error("influence.test.observation", None, "need at least two observations at different distances whose drawdown falls with distance")),
            }
        }
        other => {
            return Err(rep.error("influence.method", None, format!("unknown method \"{other}\"; valid: \"sichardt\", \"kusakin\", \"cooper-jacob\", \"fixed\", \"pumping-test\"")))
        }
    };

    Ok(influence)
}
