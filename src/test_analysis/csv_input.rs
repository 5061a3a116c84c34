//! Read time–drawdown observations from CSV.
//!
//! Columns are found by name, with the unit in the header: `time_min`, `time [min]` or
//! `time (min)`; `drawdown_m`, `drawdown [ft]`; optional `well` (one file holding several
//! observation wells) and `distance_m` / `distance [m]` (also `r`). Lines starting with `#` are
//! comments. Units are those of [`crate::input::units`] (time: s, min, h, d…; length: m, cm, ft…).

use super::ObservationWell;
use crate::input::units::{accepted_units, parse, LengthKind, TimeKind};

/// One observation well read from CSV: name, distance if the file gave one, (t s, s m) points.
#[derive(Debug, Clone, PartialEq)]
pub struct ObservationSeries {
    /// Well name (the `well` column, or the name given to the reader).
    pub name: String,
    /// Distance from the pumped well, m, when the file has a distance column.
    pub distance: Option<f64>,
    /// (time s, drawdown m).
    pub points: Vec<(f64, f64)>,
}

impl ObservationSeries {
    /// An [`ObservationWell`] with the file's distance or, if none, `distance` (m).
    pub fn into_well(self, distance: Option<f64>) -> Result<ObservationWell, String> {
        let d = self.distance.or(distance).ok_or_else(|| {
            format!(
                "observation well '{}': no distance column in the file and none given",
                self.name
            )
        })?;
        Ok(ObservationWell {
            name: self.name,
            distance: d,
            points: self.points,
        })
    }
}

/// Split a header like `time_min`, `time [min]`, `time (min)` into (name, unit).
fn split_header(h: &str) -> (String, Option<String>) {
    let h = h.trim();
    for (open, close) in [('[', ']'), ('(', ')')] {
        if let (Some(a), Some(b)) = (h.find(open), h.rfind(close)) {
            if b > a {
                return (
                    h[..a].trim().to_lowercase(),
                    Some(h[a + 1..b].trim().to_string()),
                );
            }
        }
    }
    if let Some(i) = h.rfind('_') {
        return (h[..i].to_lowercase(), Some(h[i + 1..].to_string()));
    }
    (h.to_lowercase(), None)
}

fn factor<K: crate::input::units::Kind>(col: &str, unit: Option<&str>) -> Result<f64, String> {
    let unit = unit.ok_or_else(|| {
        format!(
            "column '{col}' has no unit: write it like '{col}_<unit>' or '{col} [<unit>]' (units: {})",
            accepted_units::<K>()
        )
    })?;
    parse::<K>(&format!("1 {unit}")).map_err(|e| format!("column '{col}': {e}"))
}

/// Parse CSV text into one series per well (`well` column) or one series named `name`.
/// Errors name the line and column.
pub fn read_observations(text: &str, name: &str) -> Result<Vec<ObservationSeries>, String> {
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .flexible(false)
        .from_reader(text.as_bytes());
    let headers = rdr
        .headers()
        .map_err(|e| format!("CSV header: {e}"))?
        .clone();
    let (mut ti, mut si, mut wi, mut di) = (None, None, None, None);
    let (mut tf, mut sf, mut df) = (1.0, 1.0, 1.0);
    for (i, h) in headers.iter().enumerate() {
        let (n, unit) = split_header(h);
        match n.as_str() {
            "time" | "t" => {
                ti = Some(i);
                tf = factor::<TimeKind>("time", unit.as_deref())?;
            }
            "drawdown" | "s" => {
                si = Some(i);
                sf = factor::<LengthKind>("drawdown", unit.as_deref())?;
            }
            "distance" | "r" => {
                di = Some(i);
                df = factor::<LengthKind>("distance", unit.as_deref())?;
            }
            _ if h.trim().eq_ignore_ascii_case("well") => wi = Some(i),
            _ => {}
        }
    }
    let ti = ti.ok_or("CSV: no time column (e.g. 'time_min' or 'time [min]')")?;
    let si = si.ok_or("CSV: no drawdown column (e.g. 'drawdown_m' or 'drawdown [ft]')")?;
    let mut out: Vec<ObservationSeries> = Vec::new();
    let mut index: std::collections::HashMap<String, usize> = std::collections::HashMap::new();
    for (k, rec) in rdr.records().enumerate() {
        let rec = rec.map_err(|e| format!("CSV record {}: {e}", k + 1))?;
        let num = |i: usize, what: &str| -> Result<f64, String> {
            let f = rec.get(i).unwrap_or("");
            f.parse::<f64>()
                .ok()
                .filter(|v| v.is_finite())
                .ok_or_else(|| {
                    let line = rec.position().map_or(0, |p| p.line());
                    format!("CSV line {line}: {what} '{f}' is not a finite number")
                })
        };
        let t = num(ti, "time")? * tf;
        let s = num(si, "drawdown")? * sf;
        let d = di.map(|i| num(i, "distance")).transpose()?.map(|v| v * df);
        let well = wi.and_then(|i| rec.get(i)).unwrap_or(name).to_string();
        if let Some(m) = crate::input::validate::ranges::name_problem(&well) {
            return Err(format!("CSV record {}: well name: {m}", k + 1));
        }
        match index.get(&well).map(|&i| &mut out[i]) {
            Some(o) => {
                if let (Some(a), Some(b)) = (o.distance, d) {
                    if a != b {
                        return Err(format!(
                            "CSV: well '{well}' has two distances, {a} m and {b} m"
                        ));
                    }
                }
                o.points.push((t, s));
            }
            None => {
                index.insert(well.clone(), out.len());
                out.push(ObservationSeries {
                    name: well,
                    distance: d,
                    points: vec![(t, s)],
                });
            }
        }
    }
    if out.is_empty() {
        return Err("CSV: no data rows".into());
    }
    Ok(out)
}
