//! The bid sheet: one list of lines (item, quantity, unit, basis) written as `bid.csv`,
//! `bid.json` and the terminal table, with cost lines when the user gives unit prices.

use crate::input::prices::Price;
use crate::optimise::bid::{Bid, SUMP_ALLOWANCE};
use crate::optimise::outcome::Design;
use serde::Serialize;
use serde_json::{json, Value};

const DAY: f64 = 86_400.0;

/// One line of the bid sheet.
#[derive(Debug, Clone, Serialize)]
pub struct BidLine {
    /// What is priced ("drilling", "pumps 8 L/s").
    pub item: String,
    /// How much.
    pub quantity: f64,
    /// Of what.
    pub unit: String,
    /// How it was found.
    pub basis: String,
}

fn line(item: impl Into<String>, quantity: f64, unit: &str, basis: impl Into<String>) -> BidLine {
    BidLine {
        item: item.into(),
        quantity: if quantity.is_finite() { quantity } else { 0.0 },
        unit: unit.into(),
        basis: basis.into(),
    }
}

/// The lines of the bid sheet.
pub fn lines(design: &Design, bid: &Bid) -> Vec<BidLine> {
    let mut out = Vec::new();
    let what = if bid.wellpoints {
        "wellpoints"
    } else {
        "wells"
    };
    out.push(line(
        format!("working {what}"),
        bid.working_wells as f64,
        "no.",
        "rate above zero; idle wells are dropped from the layout",
    ));
    if !bid.wellpoints {
        out.push(line(
            "standby wells",
            bid.standby_placed.len() as f64,
            "no.",
            if bid.standby_placed.is_empty() {
                "none asked (wells.standby)".to_string()
            } else {
                format!(
                    "placed where one well's loss hurts most: {}",
                    bid.standby_placed.join(", ")
                )
            },
        ));
    }
    if bid.recharge_wells > 0 {
        out.push(line(
            "recharge wells",
            bid.recharge_wells as f64,
            "no.",
            format!(
                "at their given rates, {:.1} m³/day in all (not in the drilling)",
                bid.recharge_flow_m3_per_s * DAY
            ),
        ));
    }
    let depth = format!(
        "{:.2} m each (ground to screen base + {SUMP_ALLOWANCE:.1} m sump)",
        bid.depth_per_well_m
    );
    if bid.wellpoints {
        out.push(line(
            "jetting",
            bid.jetting_m,
            "m",
            format!("wellpoints: {depth}"),
        ));
    } else {
        out.push(line(
            "drilling",
            bid.drilling_m,
            "m",
            format!("working + standby wells: {depth}"),
        ));
    }
    out.push(line(
        "screen",
        bid.screen_m,
        "m",
        "screen top − screen base, working + standby",
    ));
    for p in &bid.pumps {
        out.push(line(
            format!("pumps {} L/s", p.duty_l_per_s),
            p.count as f64,
            "no.",
            format!(
                "{} at {:.1} m total head (lift {:.1} + riser {:.2} + header {:.2} m), {:.2} kW shaft each; running {:.2}–{:.2} L/s{}",
                if bid.wellpoints { "header pump sets" } else { "working" },
                p.head_m,
                p.head_parts.lift_m,
                p.head_parts.riser_m,
                p.head_parts.header_m,
                p.shaft_power_kw,
                p.running_l_per_s[0],
                p.running_l_per_s[1],
                if p.above_list { "; the rate asks for more than the largest duty in the list" } else { "" }
            ),
        ));
    }
    if bid.standby_pumps > 0 {
        out.push(line(
            "standby pumps",
            bid.standby_pumps as f64,
            "no.",
            "of the largest class",
        ));
    }
    if bid.header_length_m > 0.0 {
        out.push(line(
            if bid.wellpoints {
                "wellpoint header"
            } else {
                "collecting main"
            },
            bid.header_length_m,
            "m",
            "along the well lines",
        ));
    }
    out.push(line(
        "power installed",
        bid.power_installed_kw,
        "kW",
        "every pump (standby too) at its duty and class head",
    ));
    out.push(line(
        "power running",
        bid.power_running_kw,
        "kW",
        "working pumps at their running rates",
    ));
    out.push(line(
        "energy per day",
        bid.energy_per_day_kwh,
        "kWh",
        format!("running power × {:.0} h", bid.hours_per_day),
    ));
    out.push(line(
        "total flow",
        bid.total_flow_m3_per_s * DAY,
        "m³/day",
        format!(
            "sum of the well rates, {:.2} L/s",
            bid.total_flow_m3_per_s * 1e3
        ),
    ));
    out.push(line(
        "design flow",
        bid.design_flow_m3_per_s * DAY,
        "m³/day",
        format!(
            "total × (1 + {:.2}), {:.2} L/s",
            bid.contingency,
            bid.design_flow_m3_per_s * 1e3
        ),
    ));
    if let Some(q) = bid.design_flow_per_100m_m3_per_s {
        out.push(line(
            "design flow per 100 m of header",
            q * 1e3,
            "L/s",
            "wellpoint header pumps",
        ));
    }
    let est = design.estimate.total_flow_l_per_s / 1e3;
    out.push(line(
        "quick estimate total flow",
        est * DAY,
        "m³/day",
        "drydig estimate (equivalent well or line slot)",
    ));
    out
}

/// Cost lines (item, quantity, unit price, cost), their total, and the prices not used.
pub type Costs = (Vec<(String, f64, f64, f64)>, f64, Vec<String>);

/// Cost lines: every bid line that has a price (matched by item, case and spaces ignored),
/// quantity × price, and the total. Prices without a bid line are listed as unused.
pub fn costs(lines: &[BidLine], prices: &[Price]) -> Costs {
    let key = |s: &str| {
        s.split_whitespace()
            .collect::<Vec<_>>()
            .join(" ")
            .to_lowercase()
    };
    let mut out = Vec::new();
    for l in lines {
        if let Some(p) = prices.iter().find(|p| key(&p.item) == key(&l.item)) {
            out.push((l.item.clone(), l.quantity, p.price, l.quantity * p.price));
        }
    }
    let unused = prices
        .iter()
        .filter(|p| !lines.iter().any(|l| key(&l.item) == key(&p.item)))
        .map(|p| p.item.clone())
        .collect();
    let total = out.iter().map(|c| c.3).sum();
    (out, total, unused)
}

/// `bid.csv`: item, quantity, unit, basis (and unit price, cost when prices are given).
pub fn bid_csv(lines: &[BidLine], prices: Option<&[Price]>) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let priced = prices.map(|p| costs(lines, p));
    if priced.is_some() {
        w.write_record(["item", "quantity", "unit", "basis", "unit_price", "cost"])?;
    } else {
        w.write_record(["item", "quantity", "unit", "basis"])?;
    }
    for l in lines {
        // Counts are whole numbers; other quantities to two decimals.
        let q = if l.unit == "no." {
            format!("{:.0}", l.quantity)
        } else {
            format!("{:.2}", l.quantity)
        };
        match &priced {
            Some((c, _, _)) => {
                let hit = c.iter().find(|c| c.0 == l.item);
                w.write_record([
                    l.item.as_str(),
                    &q,
                    &l.unit,
                    &l.basis,
                    &hit.map_or(String::new(), |c| format!("{:.2}", c.2)),
                    &hit.map_or(String::new(), |c| format!("{:.2}", c.3)),
                ])?;
            }
            None => w.write_record([l.item.as_str(), &q, &l.unit, &l.basis])?,
        }
    }
    if let Some((_, total, _)) = &priced {
        w.write_record([
            "total of the priced lines",
            "",
            "",
            "your unit prices",
            "",
            &format!("{total:.2}"),
        ])?;
    }
    Ok(w.into_inner()?)
}

/// `bid.json`: the quantities, the lines, and the costs when prices are given.
pub fn bid_json(bid: &Bid, lines: &[BidLine], prices: Option<&[Price]>) -> Value {
    let priced = prices.map(|p| costs(lines, p));
    json!({
        "quantities": bid,
        "lines": lines,
        "costs": priced.as_ref().map(|(c, total, unused)| json!({
            "lines": c.iter().map(|(item, q, p, cost)| json!({"item": item, "quantity": q, "unit_price": p, "cost": cost})).collect::<Vec<_>>(),
            "total": total,
            "prices_not_used": unused,
        })),
    })
}

/// The bid sheet for the terminal.
pub fn bid_text(lines: &[BidLine], prices: Option<&[Price]>) -> String {
    let mut out = String::from("\nbid sheet\n");
    for l in lines {
        out.push_str(&format!(
            "  {:<34} {:>12} {:<7} {}\n",
            l.item,
            if l.unit == "no." {
                format!("{:.0}", l.quantity)
            } else {
                format!("{:.1}", l.quantity)
            },
            l.unit,
            l.basis
        ));
    }
    if let Some(p) = prices {
        let (c, total, unused) = costs(lines, p);
        out.push_str("\ncost lines (your unit prices)\n");
        for (item, q, price, cost) in &c {
            out.push_str(&format!(
                "  {item:<34} {q:>12.1} × {price:>10.2} = {cost:>12.2}\n"
            ));
        }
        out.push_str(&format!(
            "  {:<34} {:>40.2}\n",
            "total of the priced lines", total
        ));
        if !unused.is_empty() {
            out.push_str(&format!(
                "  prices with no bid line of that name: {}\n",
                unused.join(", ")
            ));
        }
    }
    out
}
