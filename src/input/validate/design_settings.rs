//! Validation of the design allowances: operating margin, capacity fraction, one well out
//! (`[allowances]`), the pump list and pipework (`[pumps]`), an excavation's control
//! (`control = "dewater" | "relieve" | "both"`) and a layout's start.

use crate::input::error::{InputError, Reporter};
use crate::input::model::{
    Control, DesignSettings, PumpSettings, WellKind, DEFAULT_CAPACITY_FRACTION,
    DEFAULT_OPERATING_MARGIN,
};
use crate::input::schema::{DesignFile, Pumps};

/// Default standard pump duties, L/s: a short list of round sizes to pick the next one up
/// from (common practice (no source); not a maker's catalogue — give your supplier's list).
pub const DEFAULT_DUTIES_L_PER_S: [f64; 10] =
    [1.0, 2.0, 3.0, 5.0, 8.0, 12.0, 16.0, 25.0, 40.0, 60.0];
/// Default pump efficiency (common practice (no source): small submersibles 0.5–0.7).
pub const DEFAULT_EFFICIENCY: f64 = 0.6;
/// Default discharge level above ground, m (common practice (no source): a settling tank or
/// header about a metre above ground).
pub const DEFAULT_DISCHARGE_ABOVE_GROUND: f64 = 1.0;
/// Default riser internal diameter, m (common practice (no source): 100 mm for deep wells).
pub const DEFAULT_RISER_DIAMETER: f64 = 0.10;
/// Default header internal diameter, m (common practice (no source): 150–250 mm).
pub const DEFAULT_HEADER_DIAMETER: f64 = 0.20;
/// Default Hazen–Williams C (130 for common plastics and new steel, checks.md §15 (from memory)).
pub const DEFAULT_HAZEN_WILLIAMS_C: f64 = 130.0;
/// Default share of a pump class: rates within 25 % of the class's largest (common practice
/// (no source)).
pub const DEFAULT_CLASS_TOLERANCE: f64 = 0.25;
/// Default header length per wellpoint pump set, m (common practice (no source): one set per
/// 50–150 m of header).
pub const DEFAULT_WELLPOINT_SET_LENGTH: f64 = 100.0;

/// The design allowances and pump settings of the file, with their defaults.
pub fn design_settings(
    rep: &Reporter,
    raw: &DesignFile,
    ground: f64,
    kind: WellKind,
) -> Result<DesignSettings, InputError> {
    let allow = raw.allowances.as_ref();
    let margin = allow.and_then(|a| a.operating_margin.as_ref());
    let operating_margin = margin.map_or(DEFAULT_OPERATING_MARGIN, |q| q.si);
    if !(0.0..=5.0).contains(&operating_margin) {
        return Err(rep.error(
            "allowances.operating_margin",
            margin.and_then(|q| q.span.clone()),
            format!("{operating_margin} m is outside 0 … 5 m (usual 0.2 … 0.5 m)"),
        ));
    }
    let frac = allow.and_then(|a| a.capacity_fraction.as_ref());
    let capacity_fraction = frac.map_or(DEFAULT_CAPACITY_FRACTION, |r| r.value);
    if !(capacity_fraction > 0.0 && capacity_fraction <= 1.0) {
        return Err(rep.error(
            "allowances.capacity_fraction",
            frac.and_then(|r| r.span.clone()),
            format!(
                "{capacity_fraction} is outside 0 … 1 (a fraction of the capacity: 0.8 = 80 %)"
            ),
        ));
    }
    // One well out is the default for deep wells; a wellpoint line loses its pump set, not a
    // single point (common practice (no source)).
    let one_well_out = allow
        .and_then(|a| a.one_well_out)
        .unwrap_or(kind == WellKind::DeepWell);
    let pumps = pump_settings(rep, raw.pumps.as_ref(), ground)?;
    Ok(DesignSettings {
        operating_margin,
        capacity_fraction,
        one_well_out,
        pumps,
    })
}

/// The pumps' standard duties, m³/s, ascending without repeats: as listed (each above 0 and at
/// most 1000 L/s), else the defaults.
fn pump_duties(rep: &Reporter, p: Option<&Pumps>) -> Result<Vec<f64>, InputError> {
    let mut duties: Vec<f64> = match p.and_then(|p| p.duties.as_ref()) {
        Some(list) => {
            if list.is_empty() {
                return Err(rep.error(
                    "pumps.duties",
                    None,
                    "give at least one pump duty, e.g. [\"5 L/s\", \"8 L/s\"]",
                ));
            }
            for q in list {
                if !(q.si.is_finite() && q.si > 0.0 && q.si <= 1.0) {
                    return Err(rep.error(
                        "pumps.duties",
                        q.span.clone(),
                        format!(
                            "{} L/s is not a pump duty; give rates above 0 and at most 1000 L/s",
                            q.si * 1e3
                        ),
                    ));
                }
            }
            list.iter().map(|q| q.si).collect()
        }
        None => DEFAULT_DUTIES_L_PER_S.iter().map(|d| d / 1e3).collect(),
    };
    duties.sort_by(f64::total_cmp);
    duties.dedup();
    Ok(duties)
}

/// The pump settings (`[pumps]`): duties, efficiency, discharge level, pipe diameters,
/// Hazen–Williams C, running hours, class tolerance, wellpoint set length and rate sharing.
fn pump_settings(
    rep: &Reporter,
    p: Option<&Pumps>,
    ground: f64,
) -> Result<PumpSettings, InputError> {
    let duties = pump_duties(rep, p)?;
    let efficiency = p
        .and_then(|p| p.efficiency.as_ref())
        .map_or(DEFAULT_EFFICIENCY, |r| r.value);
    if !(efficiency > 0.05 && efficiency <= 1.0) {
        return Err(rep.error(
            "pumps.efficiency",
            None,
            format!("{efficiency} is outside 0.05 … 1 (as a fraction: 0.6 = 60 %)"),
        ));
    }
    let discharge_level = p
        .and_then(|p| p.discharge_level.as_ref())
        .map_or(ground + DEFAULT_DISCHARGE_ABOVE_GROUND, |q| q.si);
    if !discharge_level.is_finite() || (discharge_level - ground).abs() > 100.0 {
        return Err(rep.error("pumps.discharge_level", None, format!("{discharge_level} m is more than 100 m from ground ({ground} m); give the level the water is pumped up to")));
    }
    let diameter = |name: &str, v: Option<f64>, default: f64| -> Result<f64, InputError> {
        let d = v.unwrap_or(default);
        if d.is_finite() && (0.01..=2.0).contains(&d) {
            Ok(d)
        } else {
            Err(rep.error(
                format!("pumps.{name}"),
                None,
                format!("{d} m is outside 0.01 … 2 m (an internal pipe diameter, e.g. \"100 mm\")"),
            ))
        }
    };
    let riser_diameter = diameter(
        "riser_diameter",
        p.and_then(|p| p.riser_diameter.as_ref()).map(|q| q.si),
        DEFAULT_RISER_DIAMETER,
    )?;
    let header_diameter = diameter(
        "header_diameter",
        p.and_then(|p| p.header_diameter.as_ref()).map(|q| q.si),
        DEFAULT_HEADER_DIAMETER,
    )?;
    let hazen_williams_c = p
        .and_then(|p| p.hazen_williams_c)
        .unwrap_or(DEFAULT_HAZEN_WILLIAMS_C);
    if !(60.0..=160.0).contains(&hazen_williams_c) {
        return Err(rep.error("pumps.hazen_williams_c", None, format!("{hazen_williams_c} is outside 60 … 160 (Hazen–Williams C: 130 for plastics and new steel, about 100 for old iron)")));
    }
    let hours_per_day = p.and_then(|p| p.hours_per_day).unwrap_or(24.0);
    if !(hours_per_day > 0.0 && hours_per_day <= 24.0) {
        return Err(rep.error(
            "pumps.hours_per_day",
            None,
            format!("{hours_per_day} is outside 0 … 24 hours a day"),
        ));
    }
    let class_tolerance = p
        .and_then(|p| p.class_tolerance.as_ref())
        .map_or(DEFAULT_CLASS_TOLERANCE, |r| r.value);
    if !(0.0..1.0).contains(&class_tolerance) {
        return Err(rep.error(
            "pumps.class_tolerance",
            None,
            format!(
                "{class_tolerance} is outside 0 … 1 (0.25 = rates within 25 % share a pump class)"
            ),
        ));
    }
    let wellpoint_set_length = p
        .and_then(|p| p.wellpoint_set_length.as_ref())
        .map_or(DEFAULT_WELLPOINT_SET_LENGTH, |q| q.si);
    if !(5.0..=2000.0).contains(&wellpoint_set_length) {
        return Err(rep.error(
            "pumps.wellpoint_set_length",
            None,
            format!("{wellpoint_set_length} m is outside 5 … 2000 m of header per pump set"),
        ));
    }
    let rates_per_set = match p.and_then(|p| p.rates.as_deref()).map(str::trim) {
        None | Some("per-set") => true,
        Some("per-well") => false,
        Some(other) => {
            return Err(rep.error(
                "pumps.rates",
                None,
                format!("unknown value \"{other}\"; valid: \"per-set\" (the wellpoints of one pump set share its rate, the default), \"per-well\" (a valve on each wellpoint)"),
            ))
        }
    };
    Ok(PumpSettings {
        duties,
        efficiency,
        discharge_level,
        riser_diameter,
        header_diameter,
        hazen_williams_c,
        hours_per_day,
        class_tolerance,
        one_rate_per_class: p.and_then(|p| p.one_rate_per_class).unwrap_or(false),
        wellpoint_set_length,
        rates_per_set,
    })
}

/// An excavation's `control`: "dewater", "relieve" or "both" (default). "relieve" needs an
/// `[uplift]` section.
pub fn control(
    rep: &Reporter,
    field: &str,
    value: Option<&str>,
    has_uplift: bool,
) -> Result<Control, InputError> {
    let c = match value.map(str::trim) {
        None | Some("both") => Control::Both,
        Some("dewater") => Control::Dewater,
        Some("relieve") => Control::Relieve,
        Some(other) => {
            return Err(rep.error(field, None, format!("unknown control \"{other}\"; valid: \"dewater\" (to the target level), \"relieve\" (the uplift head of the [uplift] layer only, the water table left), \"both\"")))
        }
    };
    if c == Control::Relieve && !has_uplift {
        return Err(rep.error(field, None, "control = \"relieve\" needs an [uplift] section (the confined layer whose head is relieved)"));
    }
    Ok(c)
}
