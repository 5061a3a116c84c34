//! The bid sheet: one list of lines (item, quantity, unit, basis) written as `bid.csv`,
//! `bid.json` and the terminal table, with cost lines when the user gives unit prices.
//!
//! Every quantity carries its unit, in the user's unit system (`units = "us"`: feet, gpm;
//! pumps named by their duty in gpm). Cost lines convert a price given per another unit of the
//! same kind and refuse one of another kind ([`crate::input::prices::price_per`]); a cost that
//! is not a finite number is refused as bad input. `bid.json` keeps the SI quantities of the
//! engine under `quantities` (their names carry the unit) beside the lines in the user's units.

use crate::input::error::InputError;
use crate::input::prices::{item_key, price_per, pump_duty, Price};
use crate::input::units::{m3s_to_gpm, UnitSystem};
use crate::optimise::bid::{Bid, SUMP_ALLOWANCE};
use serde::Serialize;
use serde_json::{json, Value};

const DAY: f64 = 86_400.0;

/// Length, flow and flow-per-length display for the bid, in one unit system.
#[derive(Clone, Copy)]
struct BidUnits(UnitSystem);

impl BidUnits {
    fn len(self, m: f64) -> f64 {
        self.0.length(m)
    }
    fn len_unit(self) -> &'static str {
        self.0.length_unit()
    }
    /// A flow in m³/s as (total-flow quantity, its unit).
    fn total_flow(self, q: f64) -> (f64, &'static str) {
        match self.0 {
            UnitSystem::Si => (q * DAY, "m³/day"),
            UnitSystem::Us => (m3s_to_gpm(q), "gpm"),
        }
    }
    /// A rate in m³/s as (number, unit) for pumps and well rates.
    fn rate(self, q: f64) -> (f64, &'static str) {
        match self.0 {
            UnitSystem::Si => (q * 1e3, "L/s"),
            UnitSystem::Us => (m3s_to_gpm(q), "gpm"),
        }
    }
}

/// A duty as named in an item: the figure rounded to 0.1 (whole when within 0.05).
fn duty_figure(v: f64) -> String {
    if (v - v.round()).abs() < 0.05 {
        format!("{}", v.round())
    } else {
        format!("{v:.1}")
    }
}

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
    /// For a pumps line, the duty, m³/s (prices name pumps by their duty in any flow unit).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub duty_m3_per_s: Option<f64>,
}

fn line(item: impl Into<String>, quantity: f64, unit: &str, basis: impl Into<String>) -> BidLine {
    BidLine {
        item: item.into(),
        quantity: if quantity.is_finite() { quantity } else { 0.0 },
        unit: unit.into(),
        basis: basis.into(),
        duty_m3_per_s: None,
    }
}

/// The lines of the bid sheet, quantities in `units`; `estimate_flow` is the quick
/// estimate's total flow, m³/s (shown beside the design's).
pub fn lines(bid: &Bid, estimate_flow: f64, units: UnitSystem) -> Vec<BidLine> {
    let u = BidUnits(units);
    let mut out = Vec::new();
    well_lines(&mut out, bid, u);
    pump_lines(&mut out, bid, u);
    power_lines(&mut out, bid, u);
    flow_lines(&mut out, bid, u, estimate_flow);
    wall_lines(&mut out, bid, u);
    out
}

/// Cut-off walls: length and area of each (quantities only; drydig prices no wall).
fn wall_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    let l1 = u.len(1.0);
    for w in &bid.walls {
        out.push(line(
            format!("cut-off wall \"{}\": length", w.name),
            u.len(w.length_m),
            lu,
            "along the wall as drawn",
        ));
        out.push(line(
            format!("cut-off wall \"{}\": area", w.name),
            w.area_m2 * l1 * l1,
            &format!("{lu}²"),
            format!(
                "length × depth from ground level to the toe ({:.1} {lu})",
                u.len(w.depth_m)
            ),
        ));
    }
}

/// Wells (working, standby, recharge), drilling or jetting, and screen.
fn well_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
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
        out.push(line("recharge wells", bid.recharge_wells as f64, "no.", {
            let (q, qu) = u.total_flow(bid.recharge_flow_m3_per_s);
            format!("at their given rates, {q:.1} {qu} in all (not in the drilling)")
        }));
    }
    let depth = format!(
        "{:.2} {lu} each (ground to screen base + {:.1} {lu} sump)",
        u.len(bid.depth_per_well_m),
        u.len(SUMP_ALLOWANCE)
    );
    if bid.wellpoints {
        out.push(line(
            "jetting",
            u.len(bid.jetting_m),
            lu,
            format!("wellpoints: {depth}"),
        ));
    } else {
        out.push(line(
            "drilling",
            u.len(bid.drilling_m),
            lu,
            format!("working + standby wells: {depth}"),
        ));
    }
    out.push(line(
        "screen",
        u.len(bid.screen_m),
        lu,
        "screen top − screen base, working + standby",
    ));
}

/// One line per pump class: duty, count, head and its parts, shaft power, running rates.
fn pump_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    for p in &bid.pumps {
        let duty = p.duty_l_per_s / 1e3;
        let (d, du) = u.rate(duty);
        let (r0, ru) = u.rate(p.running_l_per_s[0] / 1e3);
        let (r1, _) = u.rate(p.running_l_per_s[1] / 1e3);
        let mut l = line(
            format!("pumps {} {du}", duty_figure(d)),
            p.count as f64,
            "no.",
            format!(
                "{} at {:.1} {lu} total head (lift {:.1} + riser {:.2} + header {:.2} {lu}), {:.2} kW shaft each; running {r0:.2}–{r1:.2} {ru}{}",
                if bid.wellpoints { "header pump sets" } else { "working" },
                u.len(p.head_m),
                u.len(p.head_parts.lift_m),
                u.len(p.head_parts.riser_m),
                u.len(p.head_parts.header_m),
                p.shaft_power_kw,
                if p.above_list { "; the rate asks for more than the largest duty in the list" } else { "" }
            ),
        );
        l.duty_m3_per_s = Some(duty);
        out.push(l);
    }
}

/// Standby pumps, header or collecting main, power installed and running, energy per day.
fn power_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
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
            u.len(bid.header_length_m),
            lu,
            if bid.wellpoints {
                "along the wellpoint line(s)"
            } else {
                "the shortest run joining the built wells"
            },
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
}

/// Total and design flow, flow per 100 length units of header, and the quick estimate's total
/// flow `estimate_flow` (m³/s).
fn flow_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits, estimate_flow: f64) {
    let lu = u.len_unit();
    let (total, fu) = u.total_flow(bid.total_flow_m3_per_s);
    let (total_rate, ru) = u.rate(bid.total_flow_m3_per_s);
    out.push(line(
        "total flow",
        total,
        fu,
        format!("sum of the well rates, {total_rate:.2} {ru}"),
    ));
    let (design_flow, _) = u.total_flow(bid.design_flow_m3_per_s);
    let (design_rate, _) = u.rate(bid.design_flow_m3_per_s);
    out.push(line(
        "design flow",
        design_flow,
        fu,
        format!(
            "total × (1 + {:.2}), {design_rate:.2} {ru}",
            bid.contingency
        ),
    ));
    if let Some(q) = bid.design_flow_per_100m_m3_per_s {
        // per 100 m of header → per 100 of the display length unit
        let (per, pu) = u.rate(q / u.len(1.0));
        out.push(line(
            format!("design flow per 100 {lu} of header"),
            per,
            pu,
            "wellpoint header pumps",
        ));
    }
    let (est, _) = u.total_flow(estimate_flow);
    out.push(line(
        "quick estimate total flow",
        est,
        fu,
        "drydig estimate (equivalent well or line slot)",
    ));
}

/// Cost lines (item, quantity, unit price per the line's unit, cost), their total, and the
/// prices not used.
pub type Costs = (Vec<(String, f64, f64, f64)>, f64, Vec<String>);

/// Whether `price` prices bid line `l`: pumps by their duty (within 0.5 %, so "pumps 200 gpm"
/// prices a 12.62 L/s duty), other items by name (case and spaces ignored).
fn prices_line(price: &Price, l: &BidLine) -> bool {
    match (pump_duty(&price.item), l.duty_m3_per_s) {
        (Some(a), Some(b)) => (a / b - 1.0).abs() < 5e-3,
        (Some(_), None) | (None, Some(_)) => false,
        (None, None) => item_key(&price.item) == item_key(&l.item),
    }
}

/// Cost lines: every bid line that has a price, quantity × price (converted to the line's
/// unit), and the total. Prices without a bid line are listed as unused. `Err` (bad input,
/// naming the price's line) when a unit does not fit its line or a cost is not finite.
pub fn costs(lines: &[BidLine], prices: &[Price]) -> Result<Costs, InputError> {
    let mut out = Vec::new();
    for l in lines {
        if let Some(p) = prices.iter().find(|p| prices_line(p, l)) {
            let per = price_per(p, &l.item, &l.unit)?;
            let cost = l.quantity * per;
            if !(per.is_finite() && cost.is_finite()) {
                return Err(p.error(
                    "price",
                    format!(
                        "{} × {} {} of '{}' is not a finite number; give a price a bid can hold",
                        p.price, l.quantity, l.unit, l.item
                    ),
                ));
            }
            out.push((l.item.clone(), l.quantity, per, cost));
        }
    }
    let unused = prices
        .iter()
        .filter(|p| !lines.iter().any(|l| prices_line(p, l)))
        .map(|p| p.item.clone())
        .collect();
    let total: f64 = out.iter().map(|c| c.3).sum();
    if !total.is_finite() {
        return Err(prices[0].error(
            "price",
            "the total of the priced lines is not a finite number; give prices a bid can hold"
                .into(),
        ));
    }
    Ok((out, total, unused))
}

/// `bid.csv`: item, quantity, unit, basis (and unit price, cost when prices are given).
pub fn bid_csv(lines: &[BidLine], prices: Option<&[Price]>) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let priced = prices.map(|p| costs(lines, p)).transpose()?;
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
    if let Some(Err(e)) = &priced {
        return json!({ "quantities": bid, "lines": lines, "costs_refused": e.to_string() });
    }
    let priced = priced.and_then(Result::ok);
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
        let (c, total, unused) = match costs(lines, p) {
            Ok(c) => c,
            Err(e) => {
                out.push_str(&format!("\ncost lines refused: {e}\n"));
                return out;
            }
        };
        out.push_str("\ncost lines (your unit prices)\n");
        for (item, q, price, cost) in &c {
            let unit = lines
                .iter()
                .find(|l| &l.item == item)
                .map_or("", |l| l.unit.as_str());
            out.push_str(&format!(
                "  {item:<34} {q:>12.1} {unit:<7} × {price:>10.2} = {cost:>12.2}\n"
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
