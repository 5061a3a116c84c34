//! Wells read from a CSV file (`check --wells`, `[layout] kind = "csv"`), and the CSV text
//! rules drydig's own tables follow so that its `wells.csv` reads back to the same wells:
//! size-capped, row-capped, names free of control characters, cells that a spreadsheet would
//! take for a formula or a reader for a comment prefixed with an apostrophe.

use crate::field::wells::Well;
use crate::input::error::InputError;
use crate::input::model::Model;
use crate::input::validate::ranges::MAX_WELLS;
use std::path::Path;

/// Largest wells CSV read, bytes.
pub const MAX_CSV_BYTES: u64 = crate::input::read::MAX_WELLS_CSV_BYTES;

/// Wells from a CSV file with columns `name,x_m,y_m,rate_l_per_s` (`x`, `y` also read) and
/// optional `radius_m`; columns separated by commas, or by semicolons with decimal points or
/// decimal commas (a European spreadsheet's CSV). A comma-separated file whose numbers have
/// decimal commas is refused with that hint.
pub fn read_csv(model: &Model, path: &Path) -> Result<Vec<Well>, InputError> {
    let err = |line: Option<usize>, field: &str, message: String| InputError {
        file: path.to_path_buf(),
        field: field.to_string(),
        line,
        message,
    };
    let bytes = crate::input::read::read_capped(path, MAX_CSV_BYTES, "wells CSV")?;
    // A European spreadsheet writes `;` between columns (and may use a decimal comma).
    let semicolons = header_uses_semicolons(&bytes);
    let mut reader = csv::ReaderBuilder::new()
        .trim(csv::Trim::All)
        .comment(Some(b'#'))
        .delimiter(if semicolons { b';' } else { b',' })
        .from_reader(bytes.as_slice());
    // Line of the last byte the reader has taken, i.e. the line the row just read ends on.
    // (A record's own position points at any comment or blank lines skipped before it.)
    let line_now = |r: &csv::Reader<&[u8]>| {
        let end = (r.position().byte() as usize).clamp(1, bytes.len().max(1)) - 1;
        bytes[..end].iter().filter(|b| **b == b'\n').count() + 1
    };
    let headers = reader
        .headers()
        .map_err(|e| err(Some(1), "", format!("cannot read the header row: {e}")))?
        .clone();
    let col = |name: &str| headers.iter().position(|h| h.eq_ignore_ascii_case(name));
    let either = |a: &str, b: &str| col(a).or_else(|| col(b));
    let (Some(ci_name), Some(ci_x), Some(ci_y), Some(ci_rate)) = (
        col("name"),
        either("x_m", "x"),
        either("y_m", "y"),
        col("rate_l_per_s"),
    ) else {
        return Err(err(
            Some(line_now(&reader)),
            "header",
            header_message(&headers),
        ));
    };
    let ci_radius = col("radius_m");
    let mut wells = Vec::new();
    let mut names = std::collections::HashSet::new();
    let mut rec = csv::StringRecord::new();
    loop {
        match reader.read_record(&mut rec) {
            Ok(true) => {}
            Ok(false) => break,
            Err(e) => {
                let hint = if !semicolons
                    && matches!(e.kind(), csv::ErrorKind::UnequalLengths { .. })
                {
                    "; a decimal comma (2,5) splits a number into two columns: write numbers with a decimal point, or separate the columns with semicolons (;) as European spreadsheets do"
                } else {
                    ""
                };
                return Err(err(
                    Some(line_now(&reader)),
                    "",
                    format!("bad row: {e}{hint}"),
                ));
            }
        }
        let line = line_now(&reader);
        let num = |ci: usize, field: &str| -> Result<f64, InputError> {
            let t = rec.get(ci).unwrap_or("");
            number(t, semicolons)
                .filter(|v| v.is_finite())
                .ok_or_else(|| {
                    let hint = if t.contains(',') {
                        " (a decimal comma is read only in a file whose columns are separated by semicolons)"
                    } else {
                        ""
                    };
                    err(
                        Some(line),
                        field,
                        format!("\"{}\" is not a finite number{hint}", cell_shown(t)),
                    )
                })
        };
        if wells.len() >= MAX_WELLS {
            return Err(err(
                Some(line),
                "",
                format!("the wells CSV holds more than {MAX_WELLS} wells, the most drydig builds; split the field or give fewer wells"),
            ));
        }
        let name = csv_name(rec.get(ci_name).unwrap_or(""));
        if let Some(message) = crate::input::validate::ranges::name_problem(&name) {
            return Err(err(Some(line), "name", message));
        }
        if name.is_empty() || !names.insert(name.clone()) {
            return Err(err(
                Some(line),
                "name",
                format!("well name \"{name}\" is empty or repeated; each well needs its own name"),
            ));
        }
        let (x, y) = (num(ci_x, "x")?, num(ci_y, "y")?);
        let max = crate::input::validate::ranges::MAX_COORD;
        if x.abs() > max || y.abs() > max {
            return Err(err(
                Some(line),
                "x",
                format!("({x:e}, {y:e}) lies beyond ±{max:e} m of the grid origin; give projected coordinates in metres"),
            ));
        }
        let rate = num(ci_rate, "rate_l_per_s")?;
        if rate.abs() > 1e5 {
            return Err(err(
                Some(line),
                "rate_l_per_s",
                format!("{rate} L/s is more than any well pumps (at most 1e5 L/s)"),
            ));
        }
        let mut w = Well::from_spec(name, [x, y], rate / 1e3, &model.wells);
        if let Some(ci) = ci_radius {
            let r = num(ci, "radius_m")?;
            if !(r > 0.0 && r <= 2.0) {
                return Err(err(
                    Some(line),
                    "radius_m",
                    format!("{r} m is outside 0 … 2 m"),
                ));
            }
            w.radius = r;
        }
        wells.push(w);
    }
    if wells.is_empty() {
        return Err(err(None, "", "the wells CSV has no rows".into()));
    }
    Ok(wells)
}

/// Whether the header row (the first line that is not blank or a `#` comment) separates its
/// columns by semicolons rather than commas.
fn header_uses_semicolons(bytes: &[u8]) -> bool {
    let text = String::from_utf8_lossy(&bytes[..bytes.len().min(4096)]);
    text.lines()
        .map(str::trim)
        .find(|l| !l.is_empty() && !l.starts_with('#'))
        .is_some_and(|h| h.matches(';').count() > h.matches(',').count())
}

/// A number cell: with a decimal point, or in a semicolon-separated file also with a decimal
/// comma (`2,5`, as European spreadsheets write it; a comma is then never a thousands mark).
fn number(cell: &str, semicolons: bool) -> Option<f64> {
    match cell.parse::<f64>() {
        Ok(v) => Some(v),
        Err(_) if semicolons && cell.matches(',').count() == 1 && !cell.contains('.') => {
            cell.replace(',', ".").parse().ok()
        }
        Err(_) => None,
    }
}

/// The message for a header without the needed columns. Only cells that look like column
/// names are repeated: the file may be some other file given by mistake, whose content is not
/// echoed.
fn header_message(headers: &csv::StringRecord) -> String {
    let plain = |h: &&str| {
        !h.is_empty()
            && h.len() <= 32
            && h.chars()
                .all(|c| c.is_ascii_alphanumeric() || c == '_' || c == ' ')
    };
    let shown: Vec<&str> = headers.iter().filter(plain).collect();
    let found = if shown.len() == headers.len() {
        format!("found: {}", shown.join(", "))
    } else {
        format!(
            "the first line has {}, not a header of column names — is this the wells CSV?",
            crate::plural::count(headers.len(), "cell", "cells")
        )
    };
    format!(
        "the header must have name, x_m (or x), y_m (or y), rate_l_per_s (optional radius_m), separated by commas (or all by semicolons); {found}"
    )
}

/// A name cell as written by drydig's own tables: a leading apostrophe before `=`, `+`, `-`, `@`
/// or `#` (put there so that spreadsheets do not read the cell as a formula and CSV readers not as
/// a comment) is removed again. OWASP, "CSV Injection" (prefixing such cells with `'`).
pub fn csv_name(cell: &str) -> String {
    match cell.strip_prefix('\'') {
        Some(rest) if rest.starts_with(['=', '+', '-', '@', '#']) => rest.to_string(),
        _ => cell.to_string(),
    }
}

/// A cell as an error message shows it: at most 24 characters, control characters replaced by
/// `?`, so a wrong file named as the wells CSV is not echoed to the terminal.
fn cell_shown(cell: &str) -> String {
    let mut shown: String = cell
        .chars()
        .take(24)
        .map(|c| if c.is_control() { '?' } else { c })
        .collect();
    if cell.chars().count() > 24 {
        shown.push('…');
    }
    shown
}

/// The inverse of [`csv_name`]: a text cell safe for a spreadsheet and for a CSV reader that
/// skips `#` lines.
pub fn csv_text(text: &str) -> String {
    if text.starts_with(['=', '+', '-', '@', '#']) {
        format!("'{text}")
    } else {
        text.to_string()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // A spreadsheet set to a European locale saves "2,5" for 2.5 and separates columns by ";".
    // common practice (no source).
    #[test]
    fn decimal_commas_are_read_only_between_semicolons() {
        assert_eq!(number("2,5", true), Some(2.5));
        assert_eq!(number("-12,25", true), Some(-12.25));
        assert_eq!(number("2.5", true), Some(2.5));
        assert_eq!(number("2,5", false), None);
        assert_eq!(number("1,000.5", true), None);
        assert!(header_uses_semicolons(b"# wells\nname;x;y;rate_l_per_s\n"));
        assert!(!header_uses_semicolons(b"name,x,y,rate_l_per_s\n"));
    }

    // A cell is shown, never the file: a binary or foreign file named as the wells CSV must not
    // reach the terminal (control characters would act on it). common practice (no source).
    #[test]
    fn a_bad_cell_is_shown_short_and_printable() {
        assert_eq!(cell_shown("12.x"), "12.x");
        assert_eq!(cell_shown("\u{1b}[2J"), "?[2J");
        let long = "9".repeat(100);
        let shown = cell_shown(&long);
        assert_eq!(shown.chars().count(), 25);
        assert!(shown.ends_with('…'));
    }
}
