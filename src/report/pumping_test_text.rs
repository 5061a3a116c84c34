//! `drydig pumping-test`: every applicable fit with standard errors, the aquifer lines of the
//! best fit to paste into a design file, and `pumping_test.svg`.

use super::format::Fmt;
use super::pumping_test_chart::pumping_test_svg;
use crate::caution::CAUTION;
use crate::findings::commands::NamedFit;
use crate::input::units::UnitSystem;
use crate::report::words::wrap;
use crate::test_analysis::{aquifer_lines_in, Fit, Method, PumpingTestData};

/// The method named on the command line: theis, cooper-jacob, hantush, unconfined, recovery,
/// distance; `Err` lists the valid names.
pub fn method_named(name: &str) -> Result<Method, String> {
    Ok(match name.trim().to_lowercase().as_str() {
        "theis" => Method::Theis,
        "cooper-jacob" => Method::CooperJacob,
        "hantush" | "leaky" => Method::Hantush,
        "unconfined" => Method::TheisUnconfined,
        "recovery" => Method::TheisRecovery,
        "distance" | "distance-drawdown" => Method::DistanceDrawdown,
        other => {
            return Err(format!(
                "unknown method \"{other}\"; valid: theis, cooper-jacob, hantush, unconfined, recovery, distance"
            ))
        }
    })
}

/// Terminal text in `units`: a line per method, then the aquifer lines of the best fit (written
/// as a design file takes them, each value with its unit). `best` is the chosen fit
/// ([`crate::findings::commands::chosen`]).
pub fn to_text(
    data: &PumpingTestData,
    fits: &[NamedFit],
    best: Option<&Fit>,
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
    if let Some(b) = best {
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
pub fn files(data: &PumpingTestData, b: Option<&Fit>, units: UnitSystem) -> Vec<(String, Vec<u8>)> {
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
