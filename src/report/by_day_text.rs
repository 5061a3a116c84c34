//! `drydig design --by-day N`: the terminal text and `by_day.csv` of a design for a date.

use super::{wrap, CAUTION};
use crate::input::model::Model;
use crate::transient::by_date::DatedDesign;
use crate::transient::programme::DAY;

/// Terminal text of a design for a date.
pub fn to_text(model: &Model, d: &DatedDesign) -> String {
    let mut s = format!(
        "DESIGN FOR DAY {}  {}\n  targets by day {} of constant pumping from day 0 (Theis/Hantush in time, no radius of influence)\n\n",
        d.day, model.name, d.day
    );
    s.push_str("  wells tried: ");
    s.push_str(
        &d.trials
            .iter()
            .map(|t| {
                format!(
                    "{}{}",
                    t.count,
                    if t.feasible {
                        format!(" ({:.1} L/s)", t.total * 1e3)
                    } else {
                        " (no)".into()
                    }
                )
            })
            .collect::<Vec<_>>()
            .join(", "),
    );
    s.push('\n');
    if d.wells.is_empty() {
        s.push_str("\n  RESULT: not met — no layout of this kind meets every target by that day\n");
    } else {
        s.push_str(&format!(
            "\n  {} wells, total {:.2} L/s ({:.0} m³/day); lowest margin below target on day {}: {:.3} m; lowest well level above its lowest allowed level up to day {:.1}: {:.3} m{}\n",
            d.wells.len(),
            d.total * 1e3,
            d.total * DAY,
            d.day,
            d.worst_margin,
            d.hold_until / DAY,
            d.well_margin,
            if d.well_margin < -1e-3 {
                "  WARNING: a well falls below its lowest allowed level"
            } else {
                ""
            }
        ));
        for w in &d.wells {
            s.push_str(&format!(
                "    {:<8} ({:>8.1}, {:>8.1})  {:>6.2} L/s\n",
                w.name,
                w.position[0],
                w.position[1],
                w.rate * 1e3
            ));
        }
        s.push_str(&format!(
            "\n  RESULT: {} by day {}\n",
            if d.met {
                "met"
            } else {
                "NOT met on re-evaluation"
            },
            d.day
        ));
    }
    for n in &d.notes {
        s.push_str(&format!("  note: {n}\n"));
    }
    s.push('\n');
    s.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, "  "));
    s
}

/// `by_day.csv`: name, x, y, rate in L/s.
pub fn to_csv(d: &DatedDesign) -> Vec<u8> {
    let mut s = String::from("name,x_m,y_m,rate_l_per_s\n");
    for w in &d.wells {
        s.push_str(&format!(
            "{},{:.3},{:.3},{:.4}\n",
            w.name,
            w.position[0],
            w.position[1],
            w.rate * 1e3
        ));
    }
    s.into_bytes()
}
