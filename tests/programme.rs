//! The pumping programme in time: the long-time limit against Thiem, a staged programme's days
//! to dig against a hand Theis computation (scipy), volumes against ∫Q dt by hand, bad input
//! naming its field, and the new commands end to end (`programme`, `pumping-test`,
//! `design --by-day`).

use drydig::input::validate::file::from_str;
use drydig::transient::answers::answer;
use drydig::transient::programme::{setup, DAY};
use drydig::transient::{RateSchedule, TransientAquifer, TransientModel, TransientSource};
use std::path::{Path, PathBuf};
use std::process::Command;

fn manifest() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// `tests/reference/programme_theis.csv`, written by scripts/reference_programme.py (scipy 1.17.1
/// `special.exp1`, `optimize.brentq`).
fn reference(name: &str) -> f64 {
    let text = std::fs::read_to_string(manifest().join("tests/reference/programme_theis.csv"))
        .expect("reference table");
    text.lines()
        .filter(|l| !l.starts_with('#'))
        .filter_map(|l| l.split_once(','))
        .find(|(k, _)| *k == name)
        .and_then(|(_, v)| v.parse().ok())
        .unwrap_or_else(|| panic!("no {name} in the reference table"))
}

fn staged_pit() -> (PathBuf, String) {
    let path = manifest().join("tests/programme/staged_pit.toml");
    let text = std::fs::read_to_string(&path).expect("test case");
    (path, text)
}

#[test]
fn long_time_limit_is_thiem_with_the_cooper_jacob_radius() {
    // One well, 3 L/s, confined T = 2e-3 m²/s, S = 1e-3, r = 5 m, t = 1e9 s (u = 3e-9).
    // scipy: Theis drawdown (programme_theis.csv, theis_long_m). Thiem (1906) with
    // R = √(2.25·T·t/S) (Cooper & Jacob 1946) differs from Theis only by the rounding of
    // 4·e^(−γ) = 2.2459 to 2.25: Q/(4πT)·ln(2.25·e^γ/4) (plus O(u)).
    let (t, s, q, r, time) = (2e-3, 1e-3, 3e-3, 5.0, 1e9);
    let src = TransientSource {
        x: 0.0,
        y: 0.0,
        schedule: RateSchedule::constant(0.0, q).unwrap(),
        sign: 1.0,
    };
    let aq = TransientAquifer::Confined {
        transmissivity: t,
        storativity: s,
    };
    let m = TransientModel::new(aq, 0.15, vec![src]).unwrap();
    let got = m.drawdown_at([r, 0.0], time);
    let theis = reference("theis_long_m");
    assert!((got - theis).abs() < 1e-9 * theis, "{got} vs scipy {theis}");
    let big_r = (2.25 * t * time / s).sqrt();
    let thiem = q / (2.0 * std::f64::consts::PI * t) * (big_r / r).ln();
    assert!((thiem - reference("thiem_long_m")).abs() < 1e-12);
    let euler_gamma = 0.577_215_664_901_532_9_f64; // Abramowitz & Stegun (1964) 6.1.3
    let rounding = q / (4.0 * std::f64::consts::PI * t) * (2.25 * euler_gamma.exp() / 4.0).ln();
    assert!(
        ((thiem - got) - rounding).abs() < 1e-6,
        "Thiem − Theis = {} m, expected {rounding} m",
        thiem - got
    );
}

#[test]
fn staged_programme_days_to_dig_match_a_hand_theis_computation() {
    // scripts/reference_programme.py: the corner at r = √200 m reaches 1.0 m at t₁ and, with
    // the step to 6 L/s at day 3, 2.0 m at t₂ (Theis 1935, superposition in time; scipy brentq).
    let (path, text) = staged_pit();
    let model = from_str(&path, &text).unwrap();
    let s = setup(&model).unwrap();
    let a = answer(&model, &s);
    assert_eq!(a.stages.len(), 2);
    let t1 = a.stages[0].earliest.unwrap();
    let t2 = a.stages[1].earliest.unwrap();
    assert!(
        (t1 - reference("stage1_time_s")).abs() < 2.0,
        "stage 1 {t1}"
    );
    assert!(
        (t2 - reference("stage2_time_s")).abs() < 2.0,
        "stage 2 {t2}"
    );
    assert!(a.stages[0].critical_point.contains("corner"));
    // every check point's final target (3.0 m) is met by stage 2's time, the corners last
    let last = a
        .point_times
        .iter()
        .filter_map(|p| p.time)
        .fold(0.0, f64::max);
    assert!((last - t2).abs() < 2.0);
}

#[test]
fn volumes_are_the_integral_of_the_flow() {
    // By hand: 3 L/s for 3 days, then 6 L/s for 7 days; nothing after switch-off.
    // 0.003·3·86 400 = 777.6 m³; 0.006·7·86 400 = 3 628.8 m³; total 4 406.4 m³.
    let (path, text) = staged_pit();
    let model = from_str(&path, &text).unwrap();
    let a = answer(&model, &setup(&model).unwrap());
    assert!((a.stages[0].volume - 777.6).abs() < 1e-6);
    assert!((a.stages[1].volume - 3628.8).abs() < 1e-6);
    assert!((a.total_volume - 4406.4).abs() < 1e-6);
    let last = *a.volumes.last().unwrap();
    assert!((last - 4406.4).abs() < 1e-6, "volume after recovery {last}");
    let k = a
        .times
        .iter()
        .position(|t| (*t - 1.5 * DAY).abs() < 1.0)
        .unwrap();
    assert!((a.volumes[k] - 0.003 * 1.5 * DAY).abs() < 1e-6);
    assert!((a.flows[k] - 0.003).abs() < 1e-15);
    // after switch-off the flow is 0 and the levels recover (Theis recovery: the residual
    // drawdown falls with time)
    let r = a.recovery.unwrap();
    assert!(r.residual_at_end < r.drawdown_at_stop);
    assert_eq!(*a.flows.last().unwrap(), 0.0);
}

#[test]
fn bad_programme_names_the_field() {
    let (path, text) = staged_pit();
    let cases = [
        (
            "start = \"3 days\"",
            "start = \"12 days\"",
            "programme.stage[2].start",
        ),
        (
            "rate = \"6 L/s\"",
            "rate = \"6 m\"",
            "programme.stage[2].rate",
        ),
        (
            "duration = \"10 days\"",
            "duration = \"-1 days\"",
            "programme.duration",
        ),
        ("storativity = 1e-3\n", "\n", "aquifer.storativity"),
        (
            "formation_level = \"4.5 m\"",
            "formation_level = \"40 m\"",
            "programme.stage[1].formation_level",
        ),
    ];
    for (from, to, field) in cases {
        let bad = text.replacen(from, to, 1);
        assert_ne!(bad, text, "{from}");
        let e = from_str(&path, &bad).expect_err(field);
        assert_eq!(e.field, field, "{e}");
    }
    let bad = text.replacen("rate = \"3 L/s\"", "rate = \"3 L/s\"\nwells = [\"W9\"]", 1);
    let model = from_str(&path, &bad).unwrap();
    let e = setup(&model).expect_err("unknown well");
    assert_eq!(e.field, "programme.stage[1].wells");
    assert!(e.message.contains("W1"), "{e}");
}

fn run(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn read(dir: &Path, name: &str) -> String {
    std::fs::read_to_string(dir.join(name)).unwrap_or_else(|e| panic!("{name}: {e}"))
}

#[test]
fn programme_command_on_the_demo() {
    let dir = tempfile::tempdir().unwrap();
    let demo = manifest().join("layouts/riverside_basement_programme.toml");
    let (code, out, err) = run(&[
        "programme",
        demo.to_str().unwrap(),
        "-o",
        dir.path().to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "every stage of the demo is reached: {err}");
    for want in [
        "can dig from day",
        "TIME TO FLOOD",
        "volume pumped in total",
        "CAUTION",
    ] {
        assert!(out.contains(want), "{want} missing from:\n{out}");
    }
    let csv = read(dir.path(), "programme.csv");
    assert!(csv.starts_with("time_s,day,stage,total_flow_l_per_s,volume_m3"));
    assert!(csv.contains("Piezometer BH3"));
    for f in [
        "hydrographs.svg",
        "wells.svg",
        "flow.svg",
        "map_day_7.0.svg",
    ] {
        let svg = read(dir.path(), f);
        assert!(svg.starts_with("<svg"), "{f}");
        assert!(!svg.contains("NaN") && !svg.contains("inf"), "{f}");
    }
    assert!(!csv.contains("NaN") && !csv.contains("inf"));
}

#[test]
fn programme_command_on_the_test_case_prints_the_hand_days() {
    let dir = tempfile::tempdir().unwrap();
    let (path, _) = staged_pit();
    let (code, out, err) = run(&[
        "programme",
        path.to_str().unwrap(),
        "-o",
        dir.path().to_str().unwrap(),
    ]);
    assert_eq!(
        code, 0,
        "every stage is reached (after waiting for the water): {err}"
    );
    assert!(out.contains("waits"), "{out}");
    // scipy: 193 599 s = 2.2 days, 362 569 s = 4.2 days (programme_theis.csv)
    let d1 = format!("{:.1}", reference("stage1_time_s") / DAY);
    let d2 = format!("{:.1}", reference("stage2_time_s") / DAY);
    assert!(out.contains(&d1) && out.contains(&d2), "{out}");
    assert!(
        out.contains("778") && out.contains("3\u{2009}629"),
        "volumes by hand: {out}"
    );
}

#[test]
fn pumping_test_command_fits_the_published_test() {
    // Kruseman & de Ridder (1994), Oude Korendijk, Q = 788 m³/d, D = 7 m: the published Theis
    // answer (AQTESOLV via the TTim documentation, see src/test_analysis/tests.rs):
    // T = 5.354e-3 m²/s, S = 1.779e-4.
    let dir = tempfile::tempdir().unwrap();
    let csv = manifest().join("tests/reference/pumping_test_oude_korendijk.csv");
    let (code, out, err) = run(&[
        "pumping-test",
        csv.to_str().unwrap(),
        "--rate",
        "788 m3/d",
        "--thickness",
        "7 m",
        "-o",
        dir.path().to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("Theis") && out.contains("Cooper–Jacob") && out.contains("Hantush"));
    let lines: toml::Table = toml::from_str(&read(dir.path(), "aquifer_lines.toml")).unwrap();
    let s = lines["storativity"].as_float().unwrap();
    assert!((s / 1.779e-4 - 1.0).abs() < 1e-3, "S = {s}");
    let k = drydig::input::units::parse::<drydig::input::units::ConductivityKind>(
        lines["conductivity"].as_str().unwrap(),
    )
    .unwrap();
    assert!((k * 7.0 / 5.354e-3 - 1.0).abs() < 1e-3, "T = {}", k * 7.0);
    assert!(read(dir.path(), "pumping_test.svg").starts_with("<svg"));
    // a bad rate names the option
    let (code, _, err) = run(&["pumping-test", csv.to_str().unwrap(), "--rate", "788"]);
    assert_eq!(code, 2);
    assert!(err.contains("--rate"), "{err}");
}

#[test]
fn design_by_day_needs_no_more_flow_for_a_later_day() {
    // With constant rates the Theis drawdown grows with time (W(u) falls as u = r²S/(4Tt)
    // grows; Theis 1935), so rates that meet the targets by day 20 also meet them by day 60:
    // the least flow for day 60 is at most that for day 20.
    let demo = manifest().join("layouts/riverside_basement.toml");
    let mut totals = Vec::new();
    for day in ["20", "60"] {
        let dir = tempfile::tempdir().unwrap();
        let (code, out, err) = run(&[
            "design",
            demo.to_str().unwrap(),
            "--by-day",
            day,
            "-o",
            dir.path().to_str().unwrap(),
        ]);
        assert_eq!(code, 0, "{out}{err}");
        assert!(out.contains(&format!("RESULT: met by day {day}")), "{out}");
        let csv = read(dir.path(), "by_day.csv");
        let total: f64 = csv
            .lines()
            .skip(1)
            .filter_map(|l| l.rsplit(',').next()?.parse::<f64>().ok())
            .sum();
        totals.push(total);
    }
    assert!(totals[1] <= totals[0] * (1.0 + 1e-6), "{totals:?}");
}
