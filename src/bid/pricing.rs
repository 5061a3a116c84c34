//! The user's unit prices on the bid sheet: each priced line costs quantity × price (per the
//! line's unit, converted within a kind: per m from per ft), times the hire weeks for a hired
//! line (priced per week). A price whose unit does not fit its line is refused naming the
//! price's line: per day against a weekly hire, per week against days of work, per kWh against
//! metres, no unit against a length, a per-week price on a line that is not hired, or any price
//! on a line shown for information. The total is split by category.

use crate::bid::line::{BidLine, Category};
use crate::input::error::InputError;
use crate::input::prices::{item_key, per_time, price_per, pump_duty, Measure, Price};
use serde::Serialize;

/// One priced line.
#[derive(Debug, Clone, Serialize)]
pub struct CostLine {
    /// The bid item.
    pub item: String,
    /// How it is priced.
    pub category: Category,
    /// Its quantity, in the line's unit.
    pub quantity: f64,
    /// The line's unit.
    pub unit: String,
    /// Hire weeks (hired lines).
    pub weeks: Option<f64>,
    /// Price per one line unit (per week for a hired line), the user's price converted.
    pub unit_price: f64,
    /// What the unit price is per, as shown: "ft", "no./week", "kWh".
    pub price_per: String,
    /// quantity × unit price (× weeks).
    pub cost: f64,
}

/// The priced bid.
#[derive(Debug, Clone, Serialize)]
pub struct Costs {
    /// Every line that has a price, in the sheet's order.
    pub lines: Vec<CostLine>,
    /// The total of each priced category (those with a priced line), in [`Category::PRICED`]
    /// order.
    pub subtotals: Vec<(Category, f64)>,
    /// The total of the priced lines.
    pub total: f64,
    /// Prices that name no bid line.
    pub unused: Vec<String>,
}

/// Whether `price` prices bid line `l`: pumps by their duty (within 0.5 %, so "pumps 200 gpm"
/// prices a 12.62 L/s duty), other items by name (case and spaces ignored).
pub fn prices_line(price: &Price, l: &BidLine) -> bool {
    match (pump_duty(&price.item), l.duty_m3_per_s) {
        (Some(a), Some(b)) => (a / b - 1.0).abs() < 5e-3,
        (Some(_), None) | (None, Some(_)) => false,
        (None, None) => item_key(&price.item) == item_key(&l.item),
    }
}

/// What to price instead of an information line.
fn instead(item: &str) -> &'static str {
    match item {
        "daily energy" | "power running" => "price 'energy' (kWh over the pumping)",
        "power installed" => "price the generators or 'energy'",
        "hire period" => "price each hired line per week",
        _ => "price 'discharged volume' or the lines that carry a cost",
    }
}

/// The price per one line unit (per week for a hired line) of `l` from `p`, or the refusal.
fn rate_for(p: &Price, l: &BidLine) -> Result<f64, InputError> {
    let time = p.unit.as_deref().and_then(per_time);
    let counted = l.unit == "no.";
    let per_week_unit = if counted {
        "week".to_string()
    } else {
        format!("{}/week", l.unit)
    };
    match l.category {
        Category::Information => Err(p.error(
            "item",
            format!(
                "'{}' is shown for information, not priced; {}",
                l.item,
                instead(&l.item)
            ),
        )),
        Category::HirePerWeek => {
            let weeks = l.weeks.unwrap_or(0.0);
            let hired = format!(
                "'{}' is hired by the week ({} {} for {weeks:.0} weeks)",
                l.item, l.quantity, l.unit
            );
            match time {
                Some((base, Measure::Week)) => {
                    if base.is_none() && !counted {
                        return Err(p.error(
                            "unit",
                            format!("{hired}: give the price per {per_week_unit}, so a price per foot is never multiplied by metres"),
                        ));
                    }
                    let base_price = Price {
                        unit: base,
                        ..p.clone()
                    };
                    price_per(&base_price, &l.item, &l.unit)
                }
                Some((_, _)) => Err(p.error(
                    "unit",
                    format!("{hired}, but '{}' is priced per day; give the price per {per_week_unit} (a day rate is never turned into a week rate)", p.item),
                )),
                None => Err(p.error(
                    "unit",
                    format!(
                        "{hired}, but '{}' is priced per {}; give the price per {per_week_unit} (unit column \"{per_week_unit}\")",
                        p.item,
                        p.unit.as_deref().unwrap_or("unit (none given)")
                    ),
                )),
            }
        }
        _ => {
            let unit = p.unit.as_deref().unwrap_or("");
            if crate::input::prices::measure_of(unit).is_none() && time.is_some() {
                return Err(p.error(
                    "unit",
                    format!(
                        "'{}' is {} in {}, not hired: give the price per {} (not per {unit})",
                        l.item,
                        l.category.name(),
                        l.unit,
                        l.unit
                    ),
                ));
            }
            price_per(p, &l.item, &l.unit)
        }
    }
}

/// Cost lines: every bid line that has a price, quantity × price (converted to the line's
/// unit) × hire weeks when hired, the subtotal of each category and the total. Prices without
/// a bid line are listed as unused. `Err` (bad input, naming the price's line) when a unit does
/// not fit its line or a cost is not finite.
pub fn costs(lines: &[BidLine], prices: &[Price]) -> Result<Costs, InputError> {
    let mut out = Vec::new();
    for l in lines {
        let Some(p) = prices.iter().find(|p| prices_line(p, l)) else {
            continue;
        };
        let per = rate_for(p, l)?;
        let cost = l.quantity * per * l.weeks.unwrap_or(1.0);
        if !(per.is_finite() && cost.is_finite()) {
            return Err(p.error(
                "price",
                format!(
                    "{} × {} {} of '{}' is not a finite number; give a price a bid can hold",
                    p.price, l.quantity, l.unit, l.item
                ),
            ));
        }
        out.push(CostLine {
            item: l.item.clone(),
            category: l.category,
            quantity: l.quantity,
            unit: l.unit.clone(),
            weeks: l.weeks,
            unit_price: per,
            price_per: match (l.weeks.is_some(), l.unit == "no.") {
                (true, true) => "no./week".into(),
                (true, false) => format!("{}/week", l.unit),
                (false, _) => l.unit.clone(),
            },
            cost,
        });
    }
    let unused = prices
        .iter()
        .filter(|p| !lines.iter().any(|l| prices_line(p, l)))
        .map(|p| p.item.clone())
        .collect();
    let total: f64 = out.iter().map(|c| c.cost).sum();
    if !total.is_finite() {
        return Err(prices[0].error(
            "price",
            "the total of the priced lines is not a finite number; give prices a bid can hold"
                .into(),
        ));
    }
    let subtotals = Category::PRICED
        .iter()
        .filter(|c| out.iter().any(|l| l.category == **c))
        .map(|c| {
            let sum = out
                .iter()
                .filter(|l| l.category == *c)
                .map(|l| l.cost)
                .sum();
            (*c, sum)
        })
        .collect();
    Ok(Costs {
        lines: out,
        subtotals,
        total,
        unused,
    })
}
