//! `[uncertainty]` checked: every distribution string parsed with its unit, its support kept
//! where the input is physical (a storage coefficient between 0 and 1, a level above the aquifer
//! base), each input refused where the model does not use it (Sichardt's C without Sichardt, an
//! aquitard resistance without a leaky aquifer), errors naming the field and what is valid.

use crate::input::error::{InputError, Reporter};
use crate::input::model::{InfluenceMethod, Model};
use crate::input::model_uncertainty::{
    Distribution, InputKind, UncertainInput, Uncertainty, DEFAULT_SAMPLES, DEFAULT_SEED,
    MAX_SAMPLES,
};
use crate::input::schema_uncertainty::UncertaintySection;
use crate::input::units::{parse, ConductivityKind, LengthKind, TimeKind, TransmissivityKind};
use crate::physics::potential::AquiferKind;
use toml::Spanned;

/// How the three forms are written, for error messages.
const FORMS: &str = "\"lognormal median 2e-4 m/s, factor 3\", \"uniform 1e-4 .. 5e-4 m/s\" or \"triangular 1e-4 2e-4 5e-4 m/s\" (low, most likely, high)";

/// A parser of one value with its unit ("2e-4 m/s"), or of a plain number.
type ValueParser = fn(&str) -> Result<f64, String>;

fn plain(text: &str) -> Result<f64, String> {
    let t = text.trim();
    t.parse::<f64>()
        .ok()
        .filter(|v| v.is_finite())
        .ok_or_else(|| format!("\"{t}\" is not a plain number (this input has no unit)"))
}

fn conductivity(t: &str) -> Result<f64, String> {
    parse::<ConductivityKind>(t)
}
fn transmissivity(t: &str) -> Result<f64, String> {
    parse::<TransmissivityKind>(t)
}
fn level(t: &str) -> Result<f64, String> {
    parse::<LengthKind>(t)
}
fn time(t: &str) -> Result<f64, String> {
    parse::<TimeKind>(t)
}

/// The number and the unit of "2e-4 m/s" (the unit may be empty).
fn number_and_unit(text: &str) -> (&str, &str) {
    let t = text.trim();
    match t.find(char::is_whitespace) {
        Some(i) => (&t[..i], t[i..].trim()),
        None => (t, ""),
    }
}

fn with_unit(number: &str, unit: &str) -> String {
    if unit.is_empty() {
        number.to_string()
    } else {
        format!("{number} {unit}")
    }
}

/// Parse one distribution string with `value` for its numbers (in SI).
pub fn parse_distribution(text: &str, value: ValueParser) -> Result<Distribution, String> {
    let t = text.trim();
    let (kind, rest) = number_and_unit(t);
    match kind.to_ascii_lowercase().as_str() {
        "lognormal" => {
            let (m, f) = rest.split_once(',').ok_or_else(|| {
                format!(
                    "a lognormal is written {FORMS:.40}…: \"lognormal median 2e-4 m/s, factor 3\""
                )
            })?;
            let m = m.trim().strip_prefix("median").ok_or_else(|| {
                "a lognormal starts \"lognormal median …\" (the median with its unit)".to_string()
            })?;
            let f = f.trim().strip_prefix("factor").ok_or_else(|| {
                "after the median comes \", factor F\": the geometric standard deviation, above 1 (3 for K spread over about one order of magnitude)".to_string()
            })?;
            let median = value(m)?;
            let factor = plain(f)?;
            if median <= 0.0 {
                return Err("a lognormal's median must be above 0".into());
            }
            if !(factor > 1.0 && factor <= 100.0) {
                return Err(format!(
                    "factor {factor} must be above 1 and at most 100 (the geometric standard deviation: 2 … 5 is usual for K)"
                ));
            }
            Ok(Distribution::Lognormal { median, factor })
        }
        "uniform" => {
            let (a, b) = rest
                .split_once("..")
                .or_else(|| rest.split_once('…'))
                .ok_or_else(|| {
                    "a uniform range is written \"uniform LOW .. HIGH unit\"".to_string()
                })?;
            let (bn, unit) = number_and_unit(b);
            let (an, aunit) = number_and_unit(a);
            let low = value(&with_unit(an, if aunit.is_empty() { unit } else { aunit }))?;
            let high = value(&with_unit(bn, unit))?;
            if low >= high {
                return Err("a uniform range needs LOW below HIGH".into());
            }
            Ok(Distribution::Uniform { low, high })
        }
        "triangular" => {
            let tokens: Vec<&str> = rest.split_whitespace().collect();
            if tokens.len() < 3 {
                return Err("a triangular is written \"triangular LOW MODE HIGH unit\"".into());
            }
            let unit = tokens[3..].join(" ");
            let v: Vec<f64> = tokens[..3]
                .iter()
                .map(|n| value(&with_unit(n, &unit)))
                .collect::<Result<_, _>>()?;
            let (low, mode, high) = (v[0], v[1], v[2]);
            if !(low <= mode && mode <= high && low < high) {
                return Err("a triangular needs LOW ≤ MODE ≤ HIGH with LOW below HIGH".into());
            }
            Ok(Distribution::Triangular { low, mode, high })
        }
        _ => Err(format!("\"{t}\" is not a distribution; write {FORMS}")),
    }
}

/// The lowest and highest value a distribution can take (a lognormal has no bounds).
fn support(d: &Distribution) -> Option<(f64, f64)> {
    match *d {
        Distribution::Lognormal { .. } => None,
        Distribution::Uniform { low, high } => Some((low, high)),
        Distribution::Triangular { low, high, .. } => Some((low, high)),
    }
}

/// The place of the section's first entry in the file (`None` when it is empty).
fn section_start(raw: &UncertaintySection) -> Option<std::ops::Range<usize>> {
    let strings = [
        &raw.conductivity,
        &raw.transmissivity,
        &raw.specific_yield,
        &raw.storativity,
        &raw.sichardt_c,
        &raw.distance,
        &raw.groundwater_level,
        &raw.aquitard_resistance,
        &raw.anisotropy,
        &raw.compressibility_factor,
    ];
    let spans = strings
        .into_iter()
        .flatten()
        .map(|s| s.span())
        .chain(raw.rank_correlation.as_ref().map(|s| s.span()))
        .chain(raw.samples.as_ref().map(|s| s.span()))
        .chain(raw.seed.as_ref().map(|s| s.span()));
    spans.min_by_key(|s| s.start)
}

/// The `[uncertainty]` of `model`, checked (`None` without the section).
pub fn uncertainty(
    rep: &Reporter,
    raw: Option<&UncertaintySection>,
    model: &Model,
) -> Result<Option<Uncertainty>, InputError> {
    let Some(raw) = raw else {
        return Ok(None);
    };
    // an error about the section as a whole is placed at its first entry
    let first = section_start(raw);
    let err_at = |field: &str, span: Option<std::ops::Range<usize>>, m: String| {
        rep.error(format!("uncertainty.{field}"), span.or(first.clone()), m)
    };
    let err = |field: &str, m: String| err_at(field, None, m);
    if model.layers.is_some() {
        return Err(err("", "sampling is for one aquifer: layered ground ([[layer]]) is not sampled yet; remove [uncertainty] or the [[layer]] entries".into()));
    }
    let given: [(InputKind, &Option<Spanned<String>>, ValueParser); 10] = [
        (InputKind::Conductivity, &raw.conductivity, conductivity),
        (
            InputKind::Transmissivity,
            &raw.transmissivity,
            transmissivity,
        ),
        (InputKind::SpecificYield, &raw.specific_yield, plain),
        (InputKind::Storativity, &raw.storativity, plain),
        (InputKind::SichardtC, &raw.sichardt_c, plain),
        (InputKind::Distance, &raw.distance, level),
        (InputKind::GroundwaterLevel, &raw.groundwater_level, level),
        (
            InputKind::AquitardResistance,
            &raw.aquitard_resistance,
            time,
        ),
        (InputKind::Anisotropy, &raw.anisotropy, plain),
        (
            InputKind::CompressibilityFactor,
            &raw.compressibility_factor,
            plain,
        ),
    ];
    let mut inputs = Vec::new();
    for (kind, text, value) in given {
        let Some(text) = text else { continue };
        let (span, text) = (Some(text.span()), text.get_ref());
        let field = kind.field();
        let d = parse_distribution(text, value).map_err(|m| err_at(field, span.clone(), m))?;
        if let Some(m) = applies(kind, &d, model) {
            return Err(err_at(field, span, m));
        }
        inputs.push(UncertainInput {
            kind,
            distribution: d,
            text: text.trim().to_string(),
        });
    }
    if inputs.is_empty() {
        return Err(err("", "no uncertain input: give at least one, e.g. conductivity = \"lognormal median 2e-4 m/s, factor 3\"".into()));
    }
    if let (Some(_), Some(t)) = (&raw.conductivity, &raw.transmissivity) {
        return Err(err_at(
            "transmissivity",
            Some(t.span()),
            "give conductivity or transmissivity, not both".into(),
        ));
    }
    if let Some(spanned) = &raw.rank_correlation {
        let (rho, span) = (*spanned.get_ref(), Some(spanned.span()));
        if !(-0.99..=0.99).contains(&rho) {
            return Err(err_at(
                "rank_correlation",
                span.clone(),
                format!("{rho} is outside −0.99 … 0.99 (the Spearman rank correlation of K and S)"),
            ));
        }
        let has = |f: fn(InputKind) -> bool| inputs.iter().any(|i| f(i.kind));
        if !(has(InputKind::is_permeability) && has(InputKind::is_storage)) {
            return Err(err_at("rank_correlation", span, "a rank correlation needs both conductivity (or transmissivity) and specific_yield (or storativity) in [uncertainty]".into()));
        }
    }
    let samples = raw
        .samples
        .as_ref()
        .map_or(DEFAULT_SAMPLES as i64, |s| *s.get_ref());
    if !(10..=MAX_SAMPLES as i64).contains(&samples) {
        return Err(err_at(
            "samples",
            raw.samples.as_ref().map(|s| s.span()),
            format!("{samples} is outside 10 … {MAX_SAMPLES} (1 000 is usual)"),
        ));
    }
    let seed = raw
        .seed
        .as_ref()
        .map_or(DEFAULT_SEED as i64, |s| *s.get_ref());
    if seed < 0 {
        return Err(err_at(
            "seed",
            raw.seed.as_ref().map(|s| s.span()),
            format!("{seed}: a seed is a whole number from 0"),
        ));
    }
    Ok(Some(Uncertainty {
        inputs,
        rank_correlation: raw.rank_correlation.as_ref().map(|r| *r.get_ref()),
        samples: samples as usize,
        seed: seed as u64,
    }))
}

/// Why `kind` with distribution `d` cannot be sampled in `model` (`None`: it can).
fn applies(kind: InputKind, d: &Distribution, model: &Model) -> Option<String> {
    let aq = &model.aquifer;
    let bounded = |lo: f64, hi: f64, what: &str| match support(d) {
        None => Some(format!(
            "{what}: give a uniform or triangular range (a lognormal has no upper bound)"
        )),
        Some((l, h)) if l <= lo || h > hi => Some(format!(
            "{what}: the range {l} … {h} must lie within {lo} … {hi} (exclusive of {lo})"
        )),
        _ => None,
    };
    let positive = |what: &str| match support(d) {
        Some((l, _)) if l <= 0.0 => Some(format!("{what} must stay above 0")),
        _ => None,
    };
    match kind {
        InputKind::Conductivity | InputKind::Transmissivity => positive("the value"),
        InputKind::SpecificYield => match aq.kind {
            AquiferKind::Unconfined => bounded(0.0, 0.5, "specific yield"),
            _ => Some("the aquifer is confined or leaky: its storage is `storativity`".into()),
        },
        InputKind::Storativity => match aq.kind {
            AquiferKind::Unconfined => {
                Some("the aquifer is unconfined: its storage is `specific_yield`".into())
            }
            _ => bounded(0.0, 0.1, "storativity"),
        },
        InputKind::SichardtC => match model.influence {
            InfluenceMethod::Sichardt { .. } => positive("Sichardt's C"),
            _ => Some("[influence] method is not \"sichardt\": C is not used".into()),
        },
        InputKind::Distance => match model.influence {
            InfluenceMethod::Fixed { .. } => positive("the distance"),
            _ => {
                Some("[influence] method is not \"fixed\": no distance of influence is used".into())
            }
        },
        InputKind::GroundwaterLevel => bounded(
            aq.base_level,
            f64::INFINITY,
            "the groundwater level (above the aquifer base)",
        ),
        InputKind::AquitardResistance => match aq.kind {
            AquiferKind::Leaky { .. } => positive("the resistance"),
            _ => Some("the aquifer is not leaky: there is no aquitard resistance".into()),
        },
        InputKind::Anisotropy => match support(d) {
            Some((l, h)) if l < 1e-4 || h > 1.0 => Some(format!(
                "K_v/K_h range {l} … {h} must lie within 0.0001 … 1"
            )),
            None => Some("anisotropy: give a uniform or triangular range within 0.0001 … 1".into()),
            _ => None,
        },
        InputKind::CompressibilityFactor => {
            let any = model.neighbours.iter().flat_map(|n| &n.layers).any(|l| {
                !matches!(
                    l.compressibility,
                    crate::input::model::Compressibility::Incompressible
                )
            });
            if any {
                positive("the factor")
            } else {
                Some(
                    "no neighbour has a compressible layer ([[neighbour.layer]] with m_v or c_c)"
                        .into(),
                )
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The three written forms read back in SI (unit factors: 1 m/d = 1/86 400 m/s, common
    /// practice (no source)).
    #[test]
    fn forms() {
        let d = parse_distribution("lognormal median 2e-4 m/s, factor 3", conductivity).unwrap();
        assert_eq!(
            d,
            Distribution::Lognormal {
                median: 2e-4,
                factor: 3.0
            }
        );
        let d = parse_distribution("uniform 8.64 .. 17.28 m/d", conductivity).unwrap();
        match d {
            Distribution::Uniform { low, high } => {
                assert!((low - 1e-4).abs() < 1e-15 && (high - 2e-4).abs() < 1e-15)
            }
            _ => panic!("{d:?}"),
        }
        let d = parse_distribution("triangular 1500 3000 3500", plain).unwrap();
        assert_eq!(
            d,
            Distribution::Triangular {
                low: 1500.0,
                mode: 3000.0,
                high: 3500.0
            }
        );
        let d = parse_distribution("uniform -0.5 .. 1.5 m", level).unwrap();
        assert_eq!(
            d,
            Distribution::Uniform {
                low: -0.5,
                high: 1.5
            }
        );
    }

    /// Bad strings are refused with a message naming what is valid.
    #[test]
    fn refusals() {
        for (t, want) in [
            ("normal 2e-4 m/s", "not a distribution"),
            ("lognormal median 2e-4 m/s, factor 0.5", "above 1"),
            ("uniform 5e-4 .. 1e-4 m/s", "LOW below HIGH"),
            ("uniform 1e-4 .. 5e-4 kg", "unit"),
            ("triangular 1 5 3 m/s", "MODE"),
        ] {
            let e = parse_distribution(t, conductivity).unwrap_err();
            assert!(e.contains(want), "{t}: {e}");
        }
    }
}
