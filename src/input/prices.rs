//! The user's own unit prices for the bid (`drydig design --prices FILE`): a CSV with columns
//! `item,price` (and optionally `unit`), one row per bid item, the item named as in `bid.csv`.
//! No prices are built in.

use crate::input::error::InputError;
use std::path::Path;

/// One unit price.
#[derive(Debug, Clone)]
pub struct Price {
    /// The bid item it prices ("drilling", "pumps 8 L/s", "energy per day").
    pub item: String,
    /// Price per unit of the item's quantity, in the user's currency.
    pub price: f64,
}

/// Read a prices file. Bad rows are input errors naming the row and what would be valid.
pub fn read(path: &Path) -> Result<Vec<Price>, InputError> {
    let err = |line: Option<usize>, field: &str, message: String| InputError {
        file: path.to_path_buf(),
        field: field.into(),
        line,
        message,
    };
    let mut r = csv::ReaderBuilder::new()
        .trim(csv::Trim::All)
        .flexible(true)
        .from_path(path)
        .map_err(|e| err(None, "", format!("cannot read the prices file: {e}")))?;
    let headers = r
        .headers()
        .map_err(|e| err(Some(1), "", format!("cannot read the header row: {e}")))?
        .clone();
    let col = |name: &str| headers.iter().position(|h| h.eq_ignore_ascii_case(name));
    let (Some(ci), Some(cp)) = (col("item"), col("price")) else {
        return Err(err(
            Some(1),
            "",
            "the prices file needs a header row with columns item,price (item named as in bid.csv, price per unit of its quantity)".into(),
        ));
    };
    let mut out = Vec::new();
    for (n, rec) in r.records().enumerate() {
        let line = Some(n + 2);
        let rec = rec.map_err(|e| err(line, "", format!("unreadable row: {e}")))?;
        let item = rec.get(ci).unwrap_or("").to_string();
        if let Some(m) = crate::input::validate::ranges::name_problem(&item) {
            return Err(err(line, "item", m));
        }
        if item.is_empty() {
            return Err(err(
                line,
                "item",
                "give the bid item this price is for".into(),
            ));
        }
        let text = rec.get(cp).unwrap_or("");
        let price: f64 = text.parse().map_err(|_| {
            err(
                line,
                "price",
                format!("\"{text}\" is not a number; give the price per unit as a plain number"),
            )
        })?;
        if !(price.is_finite() && price >= 0.0) {
            return Err(err(
                line,
                "price",
                format!("{price} must be a finite number of 0 or more"),
            ));
        }
        out.push(Price { item, price });
    }
    Ok(out)
}
