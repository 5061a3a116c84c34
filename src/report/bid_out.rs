//! The bid sheet written out: `bid.csv`, `bid.json` and the terminal table, with cost lines,
//! category subtotals and the total when the user gives unit prices. The lines, their
//! categories and the costs are made in [`crate::bid`]; this module only writes them.
//!
//! Every quantity carries its unit, in the user's unit system (`units = "us"`: feet, gpm, US
//! gallons; pumps named by their duty in gpm). A refused price is bad input naming the price's
//! line. `bid.json` keeps the SI quantities of the engine under `quantities` (their names carry
//! the unit) beside the lines in the user's units.

use crate::bid::line::BidLine;
use crate::bid::pricing::Costs;
use crate::bid::quantities::Bid;
use serde_json::{json, Value};

/// A quantity as the sheet shows it: counts whole, other quantities to `decimals`.
pub fn quantity_text(l_unit: &str, q: f64, decimals: usize) -> String {
    if l_unit == "no." {
        format!("{q:.0}")
    } else {
        format!("{q:.decimals$}")
    }
}

/// The hire weeks of a line as text ("" when not hired).
fn weeks_text(weeks: Option<f64>) -> String {
    weeks.map_or(String::new(), |w| format!("{w:.0}"))
}

/// `bid.csv`: item, category, quantity, unit, weeks, basis (and unit price, what it is per,
/// cost when prices are given, then each category's subtotal and the total).
pub fn bid_csv(lines: &[BidLine], priced: Option<&Costs>) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let mut head = vec!["item", "category", "quantity", "unit", "weeks", "basis"];
    if priced.is_some() {
        head.extend(["unit_price", "price_per", "cost"]);
    }
    w.write_record(&head)?;
    for l in lines {
        let mut rec = vec![
            l.item.clone(),
            l.category.name().to_string(),
            quantity_text(&l.unit, l.quantity, 2),
            l.unit.clone(),
            weeks_text(l.weeks),
            l.basis.clone(),
        ];
        if let Some(c) = priced {
            let hit = c.lines.iter().find(|c| c.item == l.item);
            rec.push(hit.map_or(String::new(), |c| format!("{:.2}", c.unit_price)));
            rec.push(hit.map_or(String::new(), |c| c.price_per.clone()));
            rec.push(hit.map_or(String::new(), |c| format!("{:.2}", c.cost)));
        }
        w.write_record(&rec)?;
    }
    if let Some(c) = priced {
        // item, category, then the cost in the last column, priced by "your unit prices"
        let mut sum_row = |item: &str, category: &str, cost: f64| {
            let cost = format!("{cost:.2}");
            w.write_record([
                item,
                category,
                "",
                "",
                "",
                "your unit prices",
                "",
                "",
                &cost,
            ])
        };
        for (cat, sum) in &c.subtotals {
            sum_row(&format!("subtotal {}", cat.name()), cat.name(), *sum)?;
        }
        sum_row("total of the priced lines", "", c.total)?;
    }
    Ok(w.into_inner()?)
}

/// `bid.json`: the quantities, the lines, and the costs when prices are given.
pub fn bid_json(bid: &Bid, lines: &[BidLine], priced: Option<&Costs>) -> Value {
    json!({
        "quantities": bid,
        "lines": lines,
        "costs": priced.map(|c: &Costs| json!({
            "lines": c.lines,
            "subtotals": c.subtotals.iter().map(|(cat, sum)| json!({"category": cat, "cost": sum})).collect::<Vec<_>>(),
            "total": c.total,
            "prices_not_used": c.unused,
        })),
    })
}

/// The bid sheet for the terminal.
pub fn bid_text(lines: &[BidLine], priced: Option<&Costs>) -> String {
    let mut out = String::from("\nbid sheet\n");
    for l in lines {
        out.push_str(&format!(
            "  {:<30} {:>11} {:<5} {:<13} {:>3} {}\n",
            l.item,
            quantity_text(&l.unit, l.quantity, 1),
            l.unit,
            l.category.name(),
            l.weeks.map_or(String::new(), |w| format!("{w:.0}w")),
            l.basis
        ));
    }
    if let Some(c) = priced {
        out.push_str("\ncost lines (your unit prices)\n");
        for l in &c.lines {
            let weeks = l
                .weeks
                .map_or(String::new(), |w| format!(" × {w:.0} weeks"));
            out.push_str(&format!(
                "  {:<30} {:>11} {:<5}{weeks} × {:.2} per {} = {:.2}\n",
                l.item,
                quantity_text(&l.unit, l.quantity, 1),
                l.unit,
                l.unit_price,
                l.price_per,
                l.cost
            ));
        }
        for (cat, sum) in &c.subtotals {
            out.push_str(&format!(
                "  {:<30} {sum:>14.2}\n",
                format!("subtotal {}", cat.name())
            ));
        }
        out.push_str(&format!(
            "  {:<30} {:>14.2}\n",
            "total of the priced lines", c.total
        ));
        if !c.unused.is_empty() {
            out.push_str(&format!(
                "  prices with no bid line of that name: {}\n",
                c.unused.join(", ")
            ));
        }
    }
    out
}
