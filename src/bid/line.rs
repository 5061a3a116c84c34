//! One line of the bid sheet (item, quantity, unit, category, hire weeks, basis), the
//! categories a line is priced by, and the display units of the bid (SI, or US: feet, gpm, US
//! gallons, cfm, inches).
//!
//! Each line has a category ([`Category`]): capital (bought), hire per week (its quantity ×
//! the hire weeks), running (its quantity already over the pumping: days, kWh, volume),
//! one-off (labour or a service), or information (not priced). The categories are this
//! program's reading of how a dewatering bid is priced, common practice (no source).

use crate::input::units::{m3s_to_gpm, UnitSystem};
use serde::Serialize;

pub const DAY: f64 = 86_400.0;

/// Length, flow and flow-per-length display for the bid, in one unit system.
#[derive(Clone, Copy)]
pub struct BidUnits(pub UnitSystem);

impl BidUnits {
    pub fn len(self, m: f64) -> f64 {
        self.0.length(m)
    }
    pub fn len_unit(self) -> &'static str {
        self.0.length_unit()
    }
    /// A flow in m³/s as (total-flow quantity, its unit).
    pub fn total_flow(self, q: f64) -> (f64, &'static str) {
        match self.0 {
            UnitSystem::Si => (q * DAY, "m³/day"),
            UnitSystem::Us => (m3s_to_gpm(q), "gpm"),
        }
    }
    /// A volume in m³ as (number, unit): m³ or US gallons.
    pub fn volume(self, v: f64) -> (f64, &'static str) {
        match self.0 {
            UnitSystem::Si => (v, "m³"),
            UnitSystem::Us => (v / 3.785_411_784e-3, "gal"),
        }
    }
    /// A pump set's size: "150 mm", or to the nearest inch ("6 in") in US units.
    pub fn set_size(self, mm: f64) -> String {
        match self.0 {
            UnitSystem::Si => format!("{mm:.0} mm"),
            UnitSystem::Us => format!("{:.0} in", mm / 25.4),
        }
    }
    /// An air flow in m³/h (free air) as (number, the air per wellpoint, unit): m³/h or cfm.
    pub fn air(self, m3_per_h: f64) -> (f64, f64, &'static str) {
        let per = crate::bid::vacuum_sets::AIR_PER_WELLPOINT_M3_PER_H;
        match self.0 {
            UnitSystem::Si => (m3_per_h, per, "m³/h"),
            // 1 cfm = 1 ft³/min = 0.3048³ × 60 m³/h = 1.699 m³/h
            UnitSystem::Us => {
                let cfm = 0.3048_f64.powi(3) * 60.0;
                (m3_per_h / cfm, per / cfm, "cfm")
            }
        }
    }
    /// A rate in m³/s as (number, unit) for pumps and well rates.
    pub fn rate(self, q: f64) -> (f64, &'static str) {
        match self.0 {
            UnitSystem::Si => (q * 1e3, "L/s"),
            UnitSystem::Us => (m3s_to_gpm(q), "gpm"),
        }
    }
}

/// A duty as named in an item: the figure rounded to 0.1 (whole when within 0.05).
pub fn duty_figure(v: f64) -> String {
    if (v - v.round()).abs() < 0.05 {
        format!("{}", v.round())
    } else {
        format!("{v:.1}")
    }
}

/// How a bid line is priced.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Category {
    /// Bought (screen left in the ground): quantity × price.
    Capital,
    /// Hired: quantity × hire weeks × price per week.
    HirePerWeek,
    /// Running over the pumping (attendance days, energy, discharged volume): quantity × price.
    Running,
    /// Labour or a service done once (drilling, install, removal): quantity × price.
    OneOff,
    /// Shown, not priced (power, flows, the quick estimate).
    Information,
}

impl Category {
    /// Every priced category, in the order the subtotals are shown.
    pub const PRICED: [Category; 4] = [
        Category::Capital,
        Category::HirePerWeek,
        Category::Running,
        Category::OneOff,
    ];

    /// The category in words, as `bid.csv` writes it.
    pub fn name(self) -> &'static str {
        match self {
            Category::Capital => "capital",
            Category::HirePerWeek => "hire per week",
            Category::Running => "running",
            Category::OneOff => "one-off",
            Category::Information => "information",
        }
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
    /// How it is priced.
    pub category: Category,
    /// Hire weeks (hire lines): the price per week is multiplied by quantity × weeks.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub weeks: Option<f64>,
    /// How it was found.
    pub basis: String,
    /// For a pumps line, the duty, m³/s (prices name pumps by their duty in any flow unit).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub duty_m3_per_s: Option<f64>,
}

/// A line shown for information; [`BidLine::as_`] and [`BidLine::hired`] give it a priced
/// category.
pub fn line(
    item: impl Into<String>,
    quantity: f64,
    unit: &str,
    basis: impl Into<String>,
) -> BidLine {
    BidLine {
        item: item.into(),
        quantity: if quantity.is_finite() { quantity } else { 0.0 },
        unit: unit.into(),
        category: Category::Information,
        weeks: None,
        basis: basis.into(),
        duty_m3_per_s: None,
    }
}

impl BidLine {
    /// The line in `category` (not hire).
    pub fn as_(mut self, category: Category) -> BidLine {
        self.category = category;
        self
    }

    /// The line hired for `weeks`.
    pub fn hired(mut self, weeks: f64) -> BidLine {
        self.category = Category::HirePerWeek;
        self.weeks = Some(weeks);
        self
    }
}
