//! `drydig design --by-day N`: the terminal text and `by_day.csv` of a design for a date, in
//! the user's units (the CSV keeps its SI machine columns and adds the user's beside them).

use super::format::Fmt;
use crate::caution::CAUTION;
use crate::input::model::Model;
use crate::input::units::UnitSystem;
use crate::report::words::wrap;
use crate::transient::by_date::DatedDesign;
use crate::transient::programme::DAY;

/// The allowances the design for a date keeps from the steady design, in the user's units.
fn allowances(model: &Model, d: &DatedDesign, f: &Fmt) -> String {
    let a = &model.design;
    format!(
        "allowances as in the steady design: targets by day {} with an operating margin of {}; at most {:.0} % of each well's capacity (the lower of the pump's and Sichardt's on the screen wetted at the well's lowest level in that time); {}; every well's level (after its loss) above its lowest allowed level up to day {:.1}{}",
        d.day,
        f.length(a.operating_margin),
        a.capacity_fraction * 100.0,
        if a.one_well_out {
            "every target still met with any one well out"
        } else {
            "one well out not asked"
        },
        d.hold_until / DAY,
        if model.programme.is_some() {
            " (the end of the programme's pumping)"
        } else {
            " (no [programme]: day N)"
        }
    )
}

fn trials_line(d: &DatedDesign, f: &Fmt) -> String {
    let tried = d
        .trials
        .iter()
        .map(|t| {
            if t.feasible {
                format!("{} ({})", t.count, f.rate(t.total))
            } else {
                format!("{} (no)", t.count)
            }
        })
        .collect::<Vec<_>>()
        .join(", ");
    format!("  wells tried: {tried}\n")
}

/// Terminal text of a design for a date, in `units`.
pub fn to_text(model: &Model, d: &DatedDesign, units: UnitSystem) -> String {
    let f = Fmt::new(units, model.ground_level);
    let mut s = format!(
        "DESIGN FOR DAY {}  {}\n  targets by day {} of constant pumping from day 0 (Theis/Hantush in time, no radius of influence)\n\n",
        d.day, model.name, d.day
    );
    s.push_str(&trials_line(d, &f));
    if d.wells.is_empty() {
        s.push_str("\n  RESULT: not met — no layout of this kind meets every target by that day\n");
    } else {
        s.push_str(&format!(
            "\n  {} wells, total {}{}; lowest margin below target on day {}: {}; lowest well level above its lowest allowed level up to day {:.1}: {}{}\n",
            d.wells.len(),
            f.rate(d.total),
            match units {
                UnitSystem::Si => format!(" ({})", f.flow(d.total)),
                UnitSystem::Us => String::new(),
            },
            d.day,
            f.length_fine(d.worst_margin),
            d.hold_until / DAY,
            f.length_fine(d.well_margin),
            if d.well_margin < -1e-3 {
                "  WARNING: a well falls below its lowest allowed level"
            } else {
                ""
            }
        ));
        for w in &d.wells {
            s.push_str(&format!(
                "    {:<8} ({:>8}, {:>8}) {}  {:>6} {}\n",
                w.name,
                f.length_value(w.position[0]),
                f.length_value(w.position[1]),
                f.lu(),
                f.rate_value(w.rate),
                f.rate_unit()
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
    s.push_str(&wrap(
        &format!("note: {}", allowances(model, d, &f)),
        96,
        "  ",
    ));
    for n in &d.notes {
        s.push_str(&format!("  note: {n}\n"));
    }
    s.push('\n');
    s.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, "  "));
    s
}

/// `by_day.csv`: name, x, y (m), rate (L/s) as SI machine columns; in US units the position in
/// ft and the rate in gpm follow.
pub fn to_csv(d: &DatedDesign, units: UnitSystem) -> Vec<u8> {
    let f = Fmt::new(units, 0.0);
    let us = units == UnitSystem::Us;
    let mut s = String::from("name,x_m,y_m,rate_l_per_s");
    if us {
        s.push_str(",x_ft,y_ft,rate_gpm");
    }
    s.push('\n');
    for w in &d.wells {
        s.push_str(&format!(
            "{},{:.3},{:.3},{:.4}",
            w.name,
            w.position[0],
            w.position[1],
            w.rate * 1e3
        ));
        if us {
            s.push_str(&format!(
                ",{:.2},{:.2},{:.2}",
                f.length_number(w.position[0]),
                f.length_number(w.position[1]),
                f.rate_number(w.rate)
            ));
        }
        s.push('\n');
    }
    s.into_bytes()
}
