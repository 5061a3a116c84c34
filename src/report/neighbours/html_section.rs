//! The settlement part of the neighbours section of `report.html`: settlement per neighbour
//! (final and at the end of the works), distortion, deflection ratio and category of damage,
//! the settlement plot, and each building's soil column with its pore-pressure change. Pure
//! formatting of [`NeighbourResult`]s and the drawings already made.

use crate::input::units::UnitSystem;
use crate::report::format::{esc, Fmt};
use crate::report::neighbours::column_text::stress;
use crate::report::neighbours::numbers::ratio_text;
use crate::report::neighbours::soil_column_svg::soil_column_svg;
use crate::safety::neighbours::NeighbourResult;

fn table(head: &[&str], rows: &[Vec<String>]) -> String {
    let mut out = String::from("<table>\n<thead><tr>");
    for h in head {
        out.push_str(&format!("<th>{}</th>", esc(h)));
    }
    out.push_str("</tr></thead>\n<tbody>\n");
    for r in rows {
        out.push_str("<tr>");
        for c in r {
            out.push_str(&format!("<td>{c}</td>"));
        }
        out.push_str("</tr>\n");
    }
    out + "</tbody>\n</table>\n"
}

/// One row of the settlement table.
fn settlement_row(r: &NeighbourResult, f: &Fmt) -> Option<Vec<String>> {
    let final_m = r.max_final_settlement_m?;
    let end = match (&r.works_duration, r.max_end_of_works_settlement_m) {
        (Some((t, basis)), Some(v)) => format!(
            "{} after {:.0} days ({}){}",
            f.small_length(v),
            t / 86_400.0,
            esc(basis),
            if r.end_of_works_upper_bound {
                ", upper bound (a layer has no c_v)"
            } else {
                ""
            }
        ),
        _ => "— (no duration: the final value is the upper bound)".into(),
    };
    let damage = match &r.damage {
        Some((c, side, strain)) => format!(
            "{} “{}” ({:.3} % along {})",
            c.number,
            c.name,
            strain * 100.0,
            esc(side)
        ),
        None => "— (no height given)".into(),
    };
    Some(vec![
        esc(&r.name),
        esc(&f.small_length(final_m)),
        end,
        r.max_differential_m
            .map_or("—".into(), |d| esc(&f.small_length(d))),
        r.max_distortion.map_or("—".into(), |b| esc(&ratio_text(b))),
        r.max_deflection_ratio
            .map_or("—".into(), |b| esc(&ratio_text(b))),
        damage,
    ])
}

/// The soil column of one neighbour: a table and a drawing.
fn column_part(r: &NeighbourResult, f: &Fmt, units: UnitSystem) -> String {
    if r.column.is_empty() {
        return String::new();
    }
    let rows: Vec<Vec<String>> = r
        .column
        .iter()
        .map(|c| {
            vec![
                esc(&c.name),
                format!("{} … {}", esc(&f.length(c.top_m)), esc(&f.length(c.base_m))),
                format!(
                    "{} → {}",
                    esc(&f.length(c.head_drop.top)),
                    esc(&f.length(c.head_drop.base))
                ),
                format!(
                    "{} / {} / {}",
                    stress(c.du_kpa[0], units),
                    stress(c.du_kpa[1], units),
                    stress(c.du_kpa[2], units)
                ),
                stress(c.dsigma_mid_kpa, units),
                if c.incompressible {
                    "—".into()
                } else {
                    esc(&f.small_length(c.final_m))
                },
                c.degree_at_end
                    .map_or("—".into(), |u| format!("{:.0} %", u * 100.0)),
            ]
        })
        .collect();
    format!(
        "<h4>{} — soil column under the point that settles most</h4>\n{}<figure>{}<figcaption>Layers and the drop of pore pressure through them (steady state).</figcaption></figure>\n",
        esc(&r.name),
        table(
            &["layer", "levels", "head drop top → base", "Δu top / mid / base", "Δσ′ mid", "final settlement", "U at end of works"],
            &rows
        ),
        soil_column_svg(&r.column, units)
    )
}

/// The settlement part: table, plot, soil columns (empty when no neighbour has a profile).
pub fn settlement_section(
    results: &[NeighbourResult],
    settlement_svg: &str,
    f: &Fmt,
    units: UnitSystem,
) -> String {
    let rows: Vec<Vec<String>> = results
        .iter()
        .filter_map(|r| settlement_row(r, f))
        .collect();
    if rows.is_empty() {
        return String::new();
    }
    let mut out = String::from("<h3>Settlement</h3>\n");
    out.push_str(&table(
        &[
            "neighbour",
            "final (fully consolidated)",
            "at the end of the works",
            "largest differential",
            "angular distortion β",
            "deflection ratio Δ/L",
            "category of damage (information)",
        ],
        &rows,
    ));
    out.push_str("<p class=\"note\">Final: every layer fully consolidated under the steady pore pressures. At the end of the works: layers with c_v reach U(T_v) of their final settlement (Terzaghi); layers without c_v count in full. Category of damage: tensile strain of a deep beam (Burland &amp; Wroth 1974) from the deflection ratio, classed by the table of Boscardin &amp; Cording (1989) as given by Burland (1995) — from memory; horizontal strain not included.</p>\n");
    out.push_str(&format!(
        "<figure>{settlement_svg}<figcaption>Settlement under each neighbour (the value checked), with the drawdown for context. The same drawing is written as settlement.svg.</figcaption></figure>\n"
    ));
    for r in results {
        out.push_str(&column_part(r, f, units));
    }
    out
}
