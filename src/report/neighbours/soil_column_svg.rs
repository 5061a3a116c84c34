//! A small drawing of one neighbour's soil column: the layers as a bar (compressible ones
//! hatched brown, incompressible ones sand-coloured) against level, and beside it the change of
//! pore pressure Δu through the column (top, middle and base of each layer), in the user's units.

use crate::input::units::UnitSystem;
use crate::report::format::esc;
use crate::safety::neighbours::ColumnLayer;
use std::fmt::Write;

const W: f64 = 520.0;
const H: f64 = 300.0;
const TOP: f64 = 30.0;
const BOTTOM: f64 = 30.0;
const BAR_X: f64 = 60.0;
const BAR_W: f64 = 60.0;
const PROFILE_X: f64 = 300.0;
const PROFILE_W: f64 = 190.0;
/// 1 psf = 0.047 880 26 kPa (NIST SP 811 App. B).
const KPA_PER_PSF: f64 = 0.047_880_26;

/// The drawing as an SVG string (empty when there is no column).
pub fn soil_column_svg(column: &[ColumnLayer], units: UnitSystem) -> String {
    let (Some(first), Some(last)) = (column.first(), column.last()) else {
        return String::new();
    };
    let (z_top, z_base) = (first.top_m, last.base_m);
    let y = |z: f64| TOP + (z_top - z) / (z_top - z_base).max(1e-9) * (H - TOP - BOTTOM);
    let (stress, su) = match units {
        UnitSystem::Si => (1.0, "kPa"),
        UnitSystem::Us => (1.0 / KPA_PER_PSF, "psf"),
    };
    let du_max = column
        .iter()
        .flat_map(|c| c.du_kpa)
        .fold(1e-9_f64, f64::max);
    let x = |du: f64| PROFILE_X + du / du_max * PROFILE_W;
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{W:.0}\" height=\"{H:.0}\" viewBox=\"0 0 {W:.0} {H:.0}\" font-family=\"sans-serif\" font-size=\"10\">\n"
    );
    let _ = writeln!(s, "<rect width=\"100%\" height=\"100%\" fill=\"#fff\"/>");
    let _ = writeln!(
        s,
        "<text x=\"{BAR_X}\" y=\"16\" font-weight=\"bold\">layers (level, {})</text>",
        units.length_unit()
    );
    let _ = writeln!(
        s,
        "<text x=\"{PROFILE_X}\" y=\"16\" font-weight=\"bold\">pore-pressure drop Δu, {su}</text>"
    );
    let mut pts = Vec::new();
    for c in column {
        let (y0, y1) = (y(c.top_m), y(c.base_m));
        let fill = if c.incompressible {
            "#f3e3b5"
        } else {
            "#a9805a"
        };
        let _ = writeln!(s, "<rect x=\"{BAR_X}\" y=\"{y0:.1}\" width=\"{BAR_W}\" height=\"{:.1}\" fill=\"{fill}\" stroke=\"#555\" stroke-width=\"0.6\"/>", y1 - y0);
        let _ = writeln!(
            s,
            "<text x=\"{:.1}\" y=\"{:.1}\">{}</text>",
            BAR_X + BAR_W + 6.0,
            0.5 * (y0 + y1) + 3.0,
            esc(&c.name)
        );
        let _ = writeln!(
            s,
            "<text x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"end\">{:.1}</text>",
            BAR_X - 4.0,
            y0 + 3.0,
            units.length(c.top_m)
        );
        let ym = 0.5 * (y0 + y1);
        pts.push((x(c.du_kpa[0]), y0));
        pts.push((x(c.du_kpa[1]), ym));
        pts.push((x(c.du_kpa[2]), y1));
        let _ = writeln!(
            s,
            "<line x1=\"{PROFILE_X}\" y1=\"{y1:.1}\" x2=\"{:.1}\" y2=\"{y1:.1}\" stroke=\"#ddd\"/>",
            PROFILE_X + PROFILE_W
        );
        let _ = writeln!(
            s,
            "<text x=\"{:.1}\" y=\"{:.1}\" fill=\"#1f4f7a\">{:.0}</text>",
            x(c.du_kpa[1]) + 4.0,
            ym + 3.0,
            c.du_kpa[1] * stress
        );
    }
    let _ = writeln!(
        s,
        "<text x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"end\">{:.1}</text>",
        BAR_X - 4.0,
        y(z_base) + 3.0,
        units.length(z_base)
    );
    let d: Vec<String> = pts
        .iter()
        .map(|(px, py)| format!("{px:.1},{py:.1}"))
        .collect();
    let _ = writeln!(
        s,
        "<line x1=\"{PROFILE_X}\" y1=\"{TOP}\" x2=\"{PROFILE_X}\" y2=\"{:.1}\" stroke=\"#333\"/>",
        H - BOTTOM
    );
    let _ = writeln!(
        s,
        "<polyline points=\"{}\" fill=\"none\" stroke=\"#1f4f7a\" stroke-width=\"2\"/>",
        d.join(" ")
    );
    let _ = writeln!(s, "<text x=\"{PROFILE_X}\" y=\"{:.1}\">0</text><text x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"end\">{:.0} {su}</text>", H - BOTTOM + 14.0, PROFILE_X + PROFILE_W, H - BOTTOM + 14.0, du_max * stress);
    s.push_str("</svg>\n");
    s
}
