//! One table model for the tables a run writes for people and for spreadsheets: rows of typed
//! cells holding SI values, and columns that say which outputs show them (the terminal,
//! report.html, the CSV file). The units are applied by the renderers only: through [`Fmt`] in
//! the user's unit system for the terminal and the report, and in SI at a stated precision for
//! the CSV (its headers carry the SI unit, `x_m`, `rate_l_per_s`, see [`crate::report::tables`]).
//! The wells table ([`crate::report::tables`]), the estimate ([`crate::report::estimate_table`])
//! and the neighbours ([`crate::report::neighbours::table`]) are built this way.

use crate::check::evaluate::WellProblem;
use crate::report::format::{esc, ratio_value, Fmt};
use crate::report::problems::well_problems;
use crate::safety::limit_check::LimitQuantity;
use crate::safety::neighbours::Status;

/// `v` to `decimals` places, without a minus sign on a value that rounds to zero.
pub fn fixed(v: f64, decimals: usize) -> String {
    let t = format!("{v:.decimals$}");
    match t.strip_prefix('-') {
        Some(rest) if rest.chars().all(|c| c == '0' || c == '.') => rest.to_string(),
        _ => t,
    }
}

/// `v` to nine decimal places with trailing zeros (and a bare point) dropped: enough to read
/// back to the same run, free of binary noise such as -2.9999999999999964 (read as -3).
pub fn fine(v: f64) -> String {
    let t = fixed(v, 9);
    if t.contains('.') {
        t.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        t
    }
}

/// One cell: a value in SI, or words.
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// A name or words, shown as they are.
    Text(String),
    /// A length or a level above datum, m.
    Length(f64),
    /// A water level above datum, m; `None` when the well is dry ("dry"; empty in CSV).
    Level(Option<f64>),
    /// The depth below ground of a level above datum (the level, m); `None` shows "—".
    Depth(Option<f64>),
    /// A length or level to the finer precision margins need, m; `None` shows "—".
    Fine(Option<f64>),
    /// A rate per well, m³/s.
    Rate(f64),
    /// A flow total, m³/s ("m³/day" or "gpm" for people).
    Flow(f64),
    /// A count (wells), right-aligned, no unit.
    Count(u64),
    /// What is wrong at a well ("ok" when nothing), in the user's units.
    Status(Vec<WellProblem>),
    /// A small length (settlement, differential settlement), m ("mm" or "in" for people).
    Small(f64),
    /// A dimensionless ratio (angular distortion, deflection ratio), "1/n" for people.
    Ratio(f64),
    /// A fraction (utilisation, value ÷ limit), in per cent for people.
    Fraction(f64),
    /// A duration, s (days for people).
    Duration(f64),
    /// Nothing to show: "—" for people, an empty CSV cell.
    Empty,
    /// The inner cell followed by "*" for people (a footnote says why: a rule-of-thumb limit);
    /// the CSV writes the inner value.
    Footnoted(Box<Cell>),
    /// A neighbour's outcome and the quantities over their limits: "FAIL (drawdown)" for
    /// people (marked bad in report.html), the status word alone in the CSV.
    Neighbour(Status, Vec<LimitQuantity>),
}

/// The quantity of a column, for the unit in its heading.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Quantity {
    /// Words: no unit, left-aligned.
    Words,
    /// Lengths, levels and depths: "ft", "m".
    Length,
    /// Rates per well: "gpm", "L/s".
    Rate,
    /// Flow totals: "m³/day", "gpm".
    Flow,
    /// Counts: no unit, right-aligned.
    Count,
    /// Small lengths (settlement): "mm", "in".
    Small,
    /// Ratios ("1/500"): no unit, right-aligned.
    Ratio,
    /// Fractions shown in per cent: "%".
    Percent,
    /// Durations: "days".
    Days,
}

/// How a column is written in the CSV file.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Csv {
    /// Left out of the CSV file.
    No,
    /// Under this heading, as words.
    Words(&'static str),
    /// Under this heading, a name guarded against being read as a spreadsheet formula.
    Name(&'static str),
    /// Under this heading, the SI value × `scale` to nine decimals, trailing zeros dropped
    /// (read back by `check --wells`).
    Fine(&'static str, f64),
    /// Under this heading, the SI value × `scale` to the given decimals.
    Fixed(&'static str, f64, usize),
    /// Under this heading, the value in scientific notation to the given decimals ("2.000e-3").
    Sci(&'static str, usize),
}

/// One column: its heading for people, its quantity, where it is shown.
#[derive(Debug, Clone, Copy)]
pub struct Column {
    /// Heading people read, without the unit ("level in well").
    pub title: &'static str,
    /// What the column holds (the unit in the heading).
    pub quantity: Quantity,
    /// Shown in the terminal.
    pub terminal: bool,
    /// Shown in report.html.
    pub html: bool,
    /// Written in the CSV file.
    pub csv: Csv,
}

/// A table: columns and rows of cells, one cell per column.
#[derive(Debug, Clone)]
pub struct Table {
    /// The columns, in the order every output shows them.
    pub columns: Vec<Column>,
    /// The rows.
    pub rows: Vec<Vec<Cell>>,
}

impl Quantity {
    fn unit(self, f: &Fmt) -> Option<&'static str> {
        match self {
            Quantity::Words | Quantity::Count | Quantity::Ratio => None,
            Quantity::Length => Some(f.lu()),
            Quantity::Rate => Some(f.rate_unit()),
            Quantity::Flow => Some(f.flow_unit()),
            Quantity::Small => Some(f.small_unit()),
            Quantity::Percent => Some("%"),
            Quantity::Days => Some("days"),
        }
    }

    /// The heading for report.html: "#" marks a numeric column (right-aligned).
    fn html_heading(self, title: &str, f: &Fmt) -> String {
        match (self, self.unit(f)) {
            (_, Some(u)) => format!("#{title} ({u})"),
            (Quantity::Count | Quantity::Ratio, None) => format!("#{title}"),
            _ => title.to_string(),
        }
    }
}

/// A cell for people, as plain text (the HTML renderer escapes it).
fn person_text(cell: &Cell, f: &Fmt) -> String {
    match cell {
        Cell::Text(t) => t.clone(),
        Cell::Length(v) => f.length_value(*v),
        Cell::Level(z) => z.map_or("dry".into(), |z| f.length_value(z)),
        Cell::Depth(z) => z.map_or("—".into(), |z| f.depth_value(z)),
        Cell::Fine(z) => z.map_or("—".into(), |z| f.length_fine_value(z)),
        Cell::Rate(q) => f.rate_value(*q),
        Cell::Flow(q) => f.flow_value(*q),
        Cell::Count(n) => n.to_string(),
        Cell::Status(p) if p.is_empty() => "ok".into(),
        Cell::Status(p) => well_problems(p, f),
        Cell::Small(v) => f.small_length_value(*v),
        Cell::Ratio(b) => ratio_value(*b),
        Cell::Fraction(u) => fixed(u * 100.0, 0),
        Cell::Duration(t) => fixed(t / 86_400.0, 1),
        Cell::Empty => "—".into(),
        Cell::Footnoted(c) => person_text(c, f) + "*",
        Cell::Neighbour(status, over) if over.is_empty() => status.word().into(),
        Cell::Neighbour(status, over) => {
            let words: Vec<&str> = over.iter().map(|q| q.words()).collect();
            format!("{} ({})", status.word(), words.join(", "))
        }
    }
}

/// A cell in the CSV file: SI at the column's precision; problems worded in `f`'s units.
fn csv_text(cell: &Cell, csv: Csv, f: &Fmt) -> String {
    let number = |v: f64| match csv {
        Csv::Fine(_, scale) => fine(v * scale),
        Csv::Fixed(_, scale, decimals) => fixed(v * scale, decimals),
        Csv::Sci(_, decimals) => format!("{v:.decimals$e}"),
        Csv::Words(_) | Csv::Name(_) | Csv::No => fine(v),
    };
    match cell {
        Cell::Text(t) if matches!(csv, Csv::Name(_)) => crate::field::wells_csv::csv_text(t),
        Cell::Text(t) => t.clone(),
        Cell::Length(v)
        | Cell::Rate(v)
        | Cell::Flow(v)
        | Cell::Small(v)
        | Cell::Ratio(v)
        | Cell::Fraction(v)
        | Cell::Duration(v) => number(*v),
        Cell::Level(z) | Cell::Depth(z) | Cell::Fine(z) => z.map_or(String::new(), number),
        Cell::Count(n) => n.to_string(),
        Cell::Status(p) if p.is_empty() => "ok".into(),
        Cell::Status(p) => well_problems(p, f),
        Cell::Empty => String::new(),
        Cell::Footnoted(c) => csv_text(c, csv, f),
        Cell::Neighbour(status, _) => status.word().into(),
    }
}

impl Table {
    /// The columns shown by `pick`, with their index.
    fn shown(&self, pick: impl Fn(&Column) -> bool) -> Vec<(usize, &Column)> {
        self.columns
            .iter()
            .enumerate()
            .filter(|(_, c)| pick(c))
            .collect()
    }

    /// The terminal table: a heading line with units ("rate gpm"), numbers right-aligned,
    /// words left-aligned, each column as wide as its widest cell; the last column unpadded.
    pub fn to_text(&self, f: &Fmt) -> String {
        let cols = self.shown(|c| c.terminal);
        let head: Vec<String> = cols
            .iter()
            .map(|(_, c)| match c.quantity.unit(f) {
                Some(u) => format!("{} {u}", c.title),
                None => c.title.to_string(),
            })
            .collect();
        let body: Vec<Vec<String>> = self
            .rows
            .iter()
            .map(|r| cols.iter().map(|(i, _)| person_text(&r[*i], f)).collect())
            .collect();
        let widths: Vec<usize> = (0..cols.len())
            .map(|k| {
                body.iter()
                    .map(|r| r[k].chars().count())
                    .chain([head[k].chars().count()])
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let line = |cells: &[String]| {
            let mut s = String::new();
            for (k, cell) in cells.iter().enumerate() {
                let pad = widths[k].saturating_sub(cell.chars().count());
                let last = k + 1 == cells.len();
                if k > 0 {
                    s.push_str("  ");
                }
                match cols[k].1.quantity {
                    Quantity::Words if last => s.push_str(cell),
                    Quantity::Words => {
                        s.push_str(cell);
                        s.push_str(&" ".repeat(pad));
                    }
                    _ => {
                        s.push_str(&" ".repeat(pad));
                        s.push_str(cell);
                    }
                }
            }
            s.trim_end().to_string() + "\n"
        };
        let mut out = line(&head);
        for r in &body {
            out.push_str(&line(r));
        }
        out
    }

    /// The report.html table: headings "x (ft)", numeric columns marked for right alignment,
    /// problems in a status cell marked bad.
    pub fn to_html(&self, f: &Fmt) -> String {
        let cols = self.shown(|c| c.html);
        let head: Vec<String> = cols
            .iter()
            .map(|(_, c)| c.quantity.html_heading(c.title, f))
            .collect();
        let head: Vec<&str> = head.iter().map(String::as_str).collect();
        let rows: Vec<Vec<String>> = self
            .rows
            .iter()
            .map(|r| {
                cols.iter()
                    .map(|(i, _)| match &r[*i] {
                        c @ (Cell::Status(_) | Cell::Neighbour(..)) if is_bad(c) => {
                            format!("<span class=\"bad\">{}</span>", esc(&person_text(c, f)))
                        }
                        c => esc(&person_text(c, f)),
                    })
                    .collect()
            })
            .collect();
        crate::report::html::page::table(&head, &rows)
    }

    /// The CSV file: SI headings and values; problem words in `f`'s units.
    pub fn to_csv(&self, f: &Fmt) -> anyhow::Result<Vec<u8>> {
        let cols = self.shown(|c| c.csv != Csv::No);
        let mut w = csv::Writer::from_writer(Vec::new());
        w.write_record(cols.iter().map(|(_, c)| match c.csv {
            Csv::Words(h)
            | Csv::Name(h)
            | Csv::Fine(h, _)
            | Csv::Fixed(h, _, _)
            | Csv::Sci(h, _) => h,
            Csv::No => "",
        }))?;
        for r in &self.rows {
            w.write_record(cols.iter().map(|(i, c)| csv_text(&r[*i], c.csv, f)))?;
        }
        Ok(w.into_inner()?)
    }
}

/// A status cell that report.html marks bad: problems at a well, a neighbour over a limit.
fn is_bad(cell: &Cell) -> bool {
    match cell {
        Cell::Status(p) => !p.is_empty(),
        Cell::Neighbour(status, _) => *status == Status::Fail,
        _ => false,
    }
}

/// How many rows of a long table the terminal lists before pointing to the file.
pub const TERMINAL_ROWS: usize = 20;

/// How much of a long table the terminal lists.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rows {
    /// Up to [`TERMINAL_ROWS`], then "… N more in" and the file named.
    Short,
    /// Every row (`-v`).
    All,
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::units::UnitSystem;

    fn sample() -> Table {
        let col = |title, quantity, csv| Column {
            title,
            quantity,
            terminal: true,
            html: true,
            csv,
        };
        Table {
            columns: vec![
                col("well", Quantity::Words, Csv::Name("name")),
                col("x", Quantity::Length, Csv::Fine("x_m", 1.0)),
                col("level", Quantity::Length, Csv::Fixed("level_m", 1.0, 3)),
                col("rate", Quantity::Rate, Csv::Fine("rate_l_per_s", 1e3)),
                col("status", Quantity::Words, Csv::Words("status")),
            ],
            rows: vec![vec![
                Cell::Text("=W1".into()),
                Cell::Length(3.048),
                Cell::Level(None),
                Cell::Rate(5.2e-3),
                Cell::Status(Vec::new()),
            ]],
        }
    }

    #[test]
    fn one_table_three_outputs_units_at_the_edge() {
        // 3.048 m = 10.0 ft; 5.2 L/s = 82.4 gpm (NIST SP 811 (2008) App. B: 1 ft = 0.3048 m,
        // 1 gal = 3.785 411 784 L).
        let t = sample();
        let us = Fmt::new(UnitSystem::Us, 0.0);
        let text = t.to_text(&us);
        assert_eq!(
            text,
            "well  x ft  level ft  rate gpm  status\n\
             =W1   10.0       dry      82.4  ok\n"
        );
        let html = t.to_html(&us);
        assert!(html.contains("<th class=\"n\">x (ft)</th>"), "{html}");
        assert!(html.contains("<td class=\"n\">82.4</td>"), "{html}");
        // The CSV stays in SI whatever the user's units; a dry level is an empty cell, and a
        // name starting with '=' is not taken for a formula.
        let csv = String::from_utf8(t.to_csv(&us).unwrap()).unwrap();
        assert_eq!(
            csv,
            "name,x_m,level_m,rate_l_per_s,status\n'=W1,3.048,,5.2,ok\n"
        );
    }

    #[test]
    fn limit_cells_in_inches_and_csv_in_si() {
        // 25.4 mm = 1.00 in (NIST SP 811 (2008) App. B: 1 in = 0.0254 m); β = 0.002 = 1/500.
        let col = |title, quantity, csv| Column {
            title,
            quantity,
            terminal: true,
            html: true,
            csv,
        };
        let t = Table {
            columns: vec![
                col("settlement", Quantity::Small, Csv::Fixed("s_mm", 1e3, 1)),
                col("limit", Quantity::Ratio, Csv::Sci("beta", 3)),
                col(
                    "drawdown limit",
                    Quantity::Length,
                    Csv::Fixed("d_m", 1.0, 3),
                ),
                col("status", Quantity::Words, Csv::Words("status")),
            ],
            rows: vec![vec![
                Cell::Small(0.0254),
                Cell::Footnoted(Box::new(Cell::Ratio(0.002))),
                Cell::Empty,
                Cell::Neighbour(Status::Fail, vec![LimitQuantity::Settlement]),
            ]],
        };
        let us = Fmt::new(UnitSystem::Us, 0.0);
        assert_eq!(
            t.to_text(&us),
            "settlement in   limit  drawdown limit ft  status\n\
             \x20        1.00  1/500*                  —  FAIL (settlement)\n"
        );
        assert!(t
            .to_html(&us)
            .contains("<span class=\"bad\">FAIL (settlement)</span>"));
        let csv = String::from_utf8(t.to_csv(&us).unwrap()).unwrap();
        assert_eq!(csv, "s_mm,beta,d_m,status\n25.4,2.000e-3,,FAIL\n");
    }
}
