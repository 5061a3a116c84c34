//! The user's own unit prices for the bid (`drydig design --prices FILE`): a CSV with columns
//! `item,price` and, for every item measured in a unit, its `unit` (or the unit at the end of
//! the item: `drilling [ft]`, `drilling (ft)`, `drilling per ft`), one row per bid item, named
//! as in `bid.csv`. Pumps are named by their duty in any flow unit (`pumps 200 gpm` prices the
//! pumps of a 12.62 L/s duty). No prices are built in.
//!
//! Units are never assumed: a price per foot against a quantity in metres is converted
//! (price per metre = price per foot ÷ 0.3048), a price whose unit measures something else
//! than its line (per kWh against metres) is refused, and so is a unit missing on a line that
//! is not counted in numbers. A hired line is priced per week (`week` for counted items,
//! `ft/week` or `m/week` for pipework); a price per day is never turned into one per week, nor
//! the other way. An item priced twice is refused, naming both lines.

use crate::input::error::InputError;
use crate::input::units::{parse, FlowKind, LengthKind};
use std::path::{Path, PathBuf};

/// One unit price.
#[derive(Debug, Clone)]
pub struct Price {
    /// The bid item it prices ("drilling", "pumps 8 L/s", "energy"), without its unit.
    pub item: String,
    /// Price per unit, in the user's currency.
    pub price: f64,
    /// The unit the price is per ("ft", "m", "kWh", "no."), when the file gave one.
    pub unit: Option<String>,
    /// 1-based line of the prices file.
    pub line: usize,
    /// The prices file.
    pub file: PathBuf,
}

impl Price {
    /// A price as the file would state it (for tests and callers building prices in code).
    pub fn new(item: &str, price: f64, unit: Option<&str>) -> Price {
        Price {
            item: item.into(),
            price,
            unit: unit.map(Into::into),
            line: 0,
            file: PathBuf::new(),
        }
    }

    /// An input error about this price.
    pub fn error(&self, field: &str, message: String) -> InputError {
        InputError {
            file: self.file.clone(),
            field: field.into(),
            line: (self.line > 0).then_some(self.line),
            message,
        }
    }
}

/// What a quantity measures, and the size of one unit of it in SI (m, m³/s, W, J) or 1.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Measure {
    /// A count ("no.").
    Count,
    /// A length, m.
    Length(f64),
    /// A flow, m³/s.
    Flow(f64),
    /// A power, W.
    Power(f64),
    /// An energy, J.
    Energy(f64),
    /// A volume, m³.
    Volume(f64),
    /// A number of days (never turned into weeks: a day rate and a week rate differ).
    Day,
    /// A number of weeks.
    Week,
}

impl Measure {
    /// The SI size of one unit, with a name for what it measures.
    fn parts(self) -> (&'static str, f64) {
        match self {
            Measure::Count => ("a count", 1.0),
            Measure::Length(f) => ("a length", f),
            Measure::Flow(f) => ("a flow", f),
            Measure::Power(f) => ("a power", f),
            Measure::Energy(f) => ("an energy", f),
            Measure::Volume(f) => ("a volume", f),
            Measure::Day => ("a number of days", 1.0),
            Measure::Week => ("a number of weeks", 1.0),
        }
    }
}

/// What `unit` measures ("no.", "each", "m", "ft", "kW", "hp", "kWh", "m³/day", "gpm"…);
/// `None` when it is not a unit drydig knows.
pub fn measure_of(unit: &str) -> Option<Measure> {
    let u = unit.trim().replace('³', "3").replace('²', "2");
    let lower = u.to_lowercase();
    match lower.as_str() {
        "no." | "no" | "nr" | "nr." | "each" | "ea" | "item" | "pcs" | "number" => {
            return Some(Measure::Count)
        }
        "w" => return Some(Measure::Power(1.0)),
        "kw" => return Some(Measure::Power(1e3)),
        "hp" => return Some(Measure::Power(745.699_871_582_270_2)),
        "kwh" => return Some(Measure::Energy(3.6e6)),
        "mwh" => return Some(Measure::Energy(3.6e9)),
        "gpd" | "gal/day" | "gal/d" => return Some(Measure::Flow(3.785_411_784e-3 / 86_400.0)),
        "day" | "days" | "d" => return Some(Measure::Day),
        "week" | "weeks" | "wk" => return Some(Measure::Week),
        "m3" => return Some(Measure::Volume(1.0)),
        "l" | "litre" | "liter" => return Some(Measure::Volume(1e-3)),
        "gal" | "gallon" => return Some(Measure::Volume(3.785_411_784e-3)),
        "kgal" => return Some(Measure::Volume(3.785_411_784)),
        _ => {}
    }
    if let Ok(f) = parse::<LengthKind>(&format!("1 {u}")) {
        return Some(Measure::Length(f));
    }
    parse::<FlowKind>(&format!("1 {u}")).ok().map(Measure::Flow)
}

/// A unit per time: `week` or `day` alone (`(None, Week)`), or a unit per week or per day
/// (`ft/week`, `no. per week`, `m/day` → `(Some("ft"), Week)`); `None` for any other unit (a
/// flow such as `m3/day` is a flow, not a price per day).
pub fn per_time(unit: &str) -> Option<(Option<String>, Measure)> {
    let u = unit.trim();
    if let Some(m) = measure_of(u) {
        return matches!(m, Measure::Day | Measure::Week).then_some((None, m));
    }
    for sep in ["/", " per "] {
        if let Some(i) = u.rfind(sep) {
            let (base, time) = (u[..i].trim(), u[i + sep.len()..].trim());
            if let (Some(t @ (Measure::Day | Measure::Week)), Some(_)) =
                (measure_of(time), measure_of(base))
            {
                return Some((Some(base.to_string()), t));
            }
        }
    }
    None
}

/// Whether drydig can read `unit` on a price: a unit it knows, or one per week or per day.
pub fn known_price_unit(unit: &str) -> bool {
    measure_of(unit).is_some() || per_time(unit).is_some()
}

/// The price per one `line_unit` of a bid line from `price`: converted when the units differ
/// but measure the same thing; `Err` (naming the price's line) when they measure different
/// things or the price gives no unit for a line not counted in numbers.
pub fn price_per(price: &Price, line_item: &str, line_unit: &str) -> Result<f64, InputError> {
    let Some(line_measure) = measure_of(line_unit) else {
        return Err(price.error(
            "unit",
            format!("the bid line '{line_item}' is in {line_unit}, which cannot be priced"),
        ));
    };
    let Some(unit) = price.unit.as_deref() else {
        if line_measure == Measure::Count {
            return Ok(price.price);
        }
        return Err(price.error(
            "unit",
            format!(
                "'{}' has no unit, but its bid quantity is in {line_unit}: add a unit column (e.g. {line_unit}) so a price per foot is never multiplied by metres",
                price.item
            ),
        ));
    };
    let Some(price_measure) = measure_of(unit) else {
        return Err(price.error(
            "unit",
            format!("\"{unit}\" is not a unit drydig knows; the bid line '{line_item}' is in {line_unit}"),
        ));
    };
    let (what_line, size_line) = line_measure.parts();
    let (what_price, size_price) = price_measure.parts();
    if what_line != what_price {
        return Err(price.error(
            "unit",
            format!(
                "'{}' is priced per {unit} ({what_price}), but its bid quantity is in {line_unit} ({what_line}); give the price per {line_unit} or a unit of the same kind",
                price.item
            ),
        ));
    }
    Ok(price.price * size_line / size_price)
}

/// The key two prices collide on: the item's words in lower case, pumps by their duty.
pub fn item_key(item: &str) -> String {
    let words = item.split_whitespace().collect::<Vec<_>>().join(" ");
    let lower = words.to_lowercase();
    if let Some(q) = pump_duty(&lower) {
        return format!("pumps @ {q:.6e} m3/s");
    }
    lower
}

/// Whether two items name the same bid line: pumps of the same duty (within 0.5 %, so
/// "pumps 200 gpm" and "pumps 12.62 L/s" are one), other items by their words.
pub fn same_item(a: &str, b: &str) -> bool {
    match (pump_duty(a), pump_duty(b)) {
        (Some(x), Some(y)) => (x / y - 1.0).abs() < 5e-3,
        _ => item_key(a) == item_key(b),
    }
}

/// The duty of a pumps item ("pumps 200 gpm" → 0.01262 m³/s).
pub fn pump_duty(item: &str) -> Option<f64> {
    let rest = item.trim().to_lowercase();
    let rest = rest.strip_prefix("pumps")?.trim().replace('³', "3");
    parse::<FlowKind>(&rest).ok().filter(|q| *q > 0.0)
}

/// The item and its unit when the unit ends the item's name: `drilling [ft]`,
/// `drilling (ft)`, `drilling per ft`.
fn unit_in_name(item: &str) -> (String, Option<String>) {
    let t = item.trim();
    for (open, close) in [('[', ']'), ('(', ')')] {
        if let (Some(a), true) = (t.rfind(open), t.ends_with(close)) {
            let u = t[a + 1..t.len() - 1].trim();
            if known_price_unit(u) {
                return (t[..a].trim().to_string(), Some(u.to_string()));
            }
        }
    }
    if let Some(a) = t.rfind(" per ") {
        let u = t[a + 5..].trim();
        if known_price_unit(u) {
            return (t[..a].trim().to_string(), Some(u.to_string()));
        }
    }
    (t.to_string(), None)
}

/// Read a prices file. Bad rows are input errors naming the row and what would be valid.
pub fn read(path: &Path) -> Result<Vec<Price>, InputError> {
    let err = |line: Option<usize>, field: &str, message: String| InputError {
        file: path.to_path_buf(),
        field: field.into(),
        line,
        message,
    };
    let bytes =
        crate::input::read::read_capped(path, crate::input::read::MAX_PRICES_BYTES, "prices file")?;
    let mut r = csv::ReaderBuilder::new()
        .trim(csv::Trim::All)
        .flexible(true)
        .from_reader(bytes.as_slice());
    let headers = r
        .headers()
        .map_err(|e| err(Some(1), "", format!("cannot read the header row: {e}")))?
        .clone();
    let col = |name: &str| headers.iter().position(|h| h.eq_ignore_ascii_case(name));
    let (Some(ci), Some(cp)) = (col("item"), col("price")) else {
        return Err(err(
            Some(1),
            "",
            "the prices file needs a header row with columns item,price,unit (item named as in bid.csv, price per unit of its quantity)".into(),
        ));
    };
    let cu = col("unit");
    let mut out: Vec<Price> = Vec::new();
    for (n, rec) in r.records().enumerate() {
        let line = n + 2;
        let rec = rec.map_err(|e| err(Some(line), "", format!("unreadable row: {e}")))?;
        let (item, named_unit) = unit_in_name(rec.get(ci).unwrap_or(""));
        if let Some(m) = crate::input::validate::ranges::name_problem(&item) {
            return Err(err(Some(line), "item", m));
        }
        if item.is_empty() {
            return Err(err(
                Some(line),
                "item",
                "give the bid item this price is for".into(),
            ));
        }
        let column_unit = cu
            .and_then(|i| rec.get(i))
            .filter(|u| !u.is_empty())
            .map(str::to_string);
        if let Some(u) = column_unit.as_deref() {
            if !known_price_unit(u) {
                return Err(err(
                    Some(line),
                    "unit",
                    format!("\"{u}\" is not a unit drydig knows; use no., m, ft, kWh, m³, gal, day, or a hire unit per week (week, ft/week, m/week)"),
                ));
            }
        }
        let unit = match (column_unit, named_unit) {
            (Some(a), Some(b))
                if measure_of(&a) != measure_of(&b) || per_time(&a) != per_time(&b) =>
            {
                return Err(err(
                    Some(line),
                    "unit",
                    format!("the item names the unit {b} but the unit column says {a}; give one"),
                ))
            }
            (a, b) => a.or(b),
        };
        let text = rec.get(cp).unwrap_or("");
        let price: f64 = text.parse().map_err(|_| {
            err(
                Some(line),
                "price",
                format!("\"{text}\" is not a number; give the price per unit as a plain number"),
            )
        })?;
        if !(price.is_finite() && price >= 0.0) {
            return Err(err(
                Some(line),
                "price",
                format!("{price} must be a finite number of 0 or more"),
            ));
        }
        if let Some(first) = out.iter().find(|p| same_item(&p.item, &item)) {
            return Err(err(
                Some(line),
                "item",
                format!(
                    "'{item}' is priced twice, on lines {} and {line}; keep one",
                    first.line
                ),
            ));
        }
        out.push(Price {
            item,
            price,
            unit,
            line,
            file: path.to_path_buf(),
        });
    }
    Ok(out)
}
