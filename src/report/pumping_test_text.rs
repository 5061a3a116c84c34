//! `drydig pumping-test`: every applicable fit with standard errors, the aquifer lines of the
//! best fit to paste into a design file, and `pumping_test.svg`.

use super::format::Fmt;
use super::pumping_test_chart::pumping_test_svg;
use super::{wrap, CAUTION};
use crate::input::units::UnitSystem;
use crate::test_analysis::{
    aquifer_lines_in, fit_cooper_jacob, fit_distance_drawdown, fit_hantush, fit_theis,
    fit_theis_recovery, fit_theis_unconfined, Fit, Method, PumpingTestData,
};

/// The fits that apply to `data`: recovery only when `recovery_after` (s of pumping) is given;
/// otherwise Theis, Cooper–Jacob, Hantush, unconfined Theis (with a thickness) and
/// distance–drawdown (two or more wells). Each entry is the method's name and its fit or the
/// reason it could not be made.
pub fn fits(
    data: &PumpingTestData,
    recovery_after: Option<f64>,
) -> Vec<(String, Result<Fit, String>)> {
    if let Some(tp) = recovery_after {
        return vec![("Theis recovery".into(), fit_theis_recovery(data, tp, 0.0))];
    }
    let mut out = vec![
        ("Theis".to_string(), fit_theis(data)),
        ("Cooper–Jacob".to_string(), fit_cooper_jacob(data)),
        ("Hantush–Jacob (leaky)".to_string(), fit_hantush(data)),
    ];
    if data.thickness.is_some() {
        out.push((
            "Theis with Jacob's correction".into(),
            fit_theis_unconfined(data),
        ));
    }
    if data.wells.len() >= 2 {
        out.push(("distance–drawdown".into(), fit_distance_drawdown(data)));
    }
    out
}

/// The fit whose aquifer lines are printed and drawn: the one of method `prefer` when it
/// succeeded, else the first that succeeded (Theis, in the order of [`fits`]). More parameters
/// always fit closer, so the choice is the engineer's, not the least rms.
pub fn best(fits: &[(String, Result<Fit, String>)], prefer: Option<Method>) -> Option<&Fit> {
    let ok: Vec<&Fit> = fits.iter().filter_map(|(_, f)| f.as_ref().ok()).collect();
    ok.iter()
        .find(|f| Some(f.method) == prefer)
        .or(ok.first())
        .copied()
}

/// Terminal text in `units`: a line per method, then the aquifer lines of the best fit (written
/// as a design file takes them, each value with its unit).
pub fn to_text(
    data: &PumpingTestData,
    fits: &[(String, Result<Fit, String>)],
    prefer: Option<Method>,
    units: UnitSystem,
) -> String {
    let n: usize = data.wells.iter().map(|w| w.points.len()).sum();
    let u = Fmt::new(units, 0.0);
    let mut s = format!(
        "PUMPING TEST  Q = {}, {} observation well{}, {n} readings\n\n",
        u.rate(data.rate),
        data.wells.len(),
        if data.wells.len() == 1 { "" } else { "s" }
    );
    s.push_str(&format!(
        "  method                               {:<27} {:<25} {:<10} rms {}\n",
        format!("T {} (± 1 s.e.)", u.transmissivity_unit()),
        "S (± 1 s.e.)",
        format!("B {}", u.lu()),
        u.lu()
    ));
    for (name, f) in fits {
        match f {
            Ok(f) => {
                s.push_str(&format!(
                    "  {:<36} {:>10.4e} ± {:<10.2e}   {:<24} {:<10} {:.4}\n",
                    name,
                    u.transmissivity_number(f.transmissivity.value),
                    u.transmissivity_number(f.transmissivity.std_error),
                    f.storativity.map_or("—".to_string(), |e| format!(
                        "{:.4e} ± {:.2e}",
                        e.value, e.std_error
                    )),
                    f.leakage_factor.map_or("—".to_string(), |b| format!(
                        "{:.0}",
                        u.length_number(b.value)
                    )),
                    u.length_number(f.rms)
                ));
                if let Some(u) = f.earliest_u {
                    s.push_str(&format!(
                        "      straight line from u = {u:.3} at its earliest point (valid below about 0.05)\n"
                    ));
                }
            }
            Err(e) => s.push_str(&format!("  {name:<36} not fitted: {e}\n")),
        }
    }
    if let Some(b) = best(fits, prefer) {
        s.push_str(&format!(
            "\n  aquifer lines from the {} fit (paste into [aquifer]):\n\n",
            b.method.name()
        ));
        for line in aquifer_lines_in(b, units).lines() {
            s.push_str("    ");
            s.push_str(line);
            s.push('\n');
        }
    }
    s.push('\n');
    s.push_str(&wrap(&format!("CAUTION: {CAUTION}"), 96, "  "));
    s
}

/// `pumping_test.svg` with the best fit's curves over the data (lengths in `units`), and
/// `aquifer_lines.toml`.
pub fn files(
    data: &PumpingTestData,
    fits: &[(String, Result<Fit, String>)],
    prefer: Option<Method>,
    units: UnitSystem,
) -> Vec<(String, Vec<u8>)> {
    let b = best(fits, prefer);
    let mut out = vec![(
        "pumping_test.svg".to_string(),
        pumping_test_svg(&data.wells, b, units).into_bytes(),
    )];
    if let Some(b) = b {
        out.push((
            "aquifer_lines.toml".into(),
            aquifer_lines_in(b, units).into_bytes(),
        ));
    }
    out
}
