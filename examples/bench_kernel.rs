//! Benchmark of the superposition kernel, for `scripts/bench.sh`.
//!
//! `cargo run --release --example bench_kernel -- CASE DIR [GRID]` with CASE `basement` (a ring of
//! 60 deep wells around a 150 m × 100 m basement) or `trench` (wellpoints at 4 m on both sides of
//! a 2 km trench, about 1 000 of them). It writes into DIR:
//! - `design.toml`: the case as a design file (so `drydig design` can be timed on it);
//! - `wells.csv`: x, y, rate (m³/s), radius (m) of every well, full precision;
//! - `case.json`: aquifer, radius of influence and the map grid;
//! - `levels.npy`: water levels on the GRID × GRID map (default 500), NaN where dry;
//!
//! and prints one JSON line with the kernel time (best of several runs). Each well's rate varies
//! around the layout rate so that the comparison with NumPy is not blind to which well is which.

use drydig::check::run::field_for;
use drydig::field::layout::generate;
use drydig::input::validate::file::from_str;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::time::Instant;

const BASEMENT: &str = r#"
[site]
name = "Benchmark basement"
ground_level = "2.0 m"

[aquifer]
kind = "unconfined"
conductivity = "2e-4 m/s"
base_level = "-15.0 m"
groundwater_level = "0.0 m"
specific_yield = 0.15

[[excavation]]
name = "Basement"
outline = [[0, 0], [150, 0], [150, 100], [0, 100]]
formation_level = "-5.0 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"
sichardt_c = 3000

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "-2.0 m"
screen_base = "-14.5 m"
pump_intake = "-14.0 m"
submergence = "1.0 m"
pump_capacity = "1.1 L/s"
standby = 4

[layout]
kind = "ring"
offset = "3 m"
count = 60
rate = "1.2 L/s"

[checks]
grid_spacing = "2 m"
"#;

const TRENCH: &str = r#"
[site]
name = "Benchmark trench"
ground_level = "11.0 m"

[aquifer]
kind = "unconfined"
conductivity = "5e-5 m/s"
base_level = "0.0 m"
groundwater_level = "10.0 m"
specific_yield = 0.1

[[excavation]]
name = "Trench"
outline = [[0, -1.5], [2000, -1.5], [2000, 1.5], [0, 1.5]]
formation_level = "7.0 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"
sichardt_c = 3000
sichardt_c_line = 1500

[wells]
kind = "wellpoint"
radius = "0.05 m"
screen_top = "6.0 m"
screen_base = "3.0 m"
pump_intake = "3.0 m"
submergence = "0.3 m"
suction_limit = "6.0 m"

[layout]
kind = "line"
offset = "1.0 m"
spacing = "4.0 m"
sides = "both"
rate = "0.1 L/s"

[checks]
grid_spacing = "2 m"
"#;

fn fail(msg: String) -> ! {
    eprintln!("bench_kernel: {msg}");
    std::process::exit(2)
}

/// Write a little-endian f64 array in NumPy's .npy format (version 1.0), row-major (ny, nx).
fn write_npy(path: &Path, values: &[f64], ny: usize, nx: usize) -> std::io::Result<()> {
    let dict = format!("{{'descr': '<f8', 'fortran_order': False, 'shape': ({ny}, {nx}), }}");
    let unpadded = 10 + dict.len() + 1;
    let pad = (64 - unpadded % 64) % 64;
    let header = format!("{dict}{}\n", " ".repeat(pad));
    let mut out = std::io::BufWriter::new(std::fs::File::create(path)?);
    out.write_all(b"\x93NUMPY\x01\x00")?;
    out.write_all(&(header.len() as u16).to_le_bytes())?;
    out.write_all(header.as_bytes())?;
    for v in values {
        out.write_all(&v.to_le_bytes())?;
    }
    out.flush()
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if args.len() < 3 {
        fail("usage: bench_kernel basement|trench|transient|programme DIR [GRID]".into());
    }
    if args[1] == "transient" || args[1] == "programme" {
        transient_case(&args);
        return;
    }
    let (case, text) = match args[1].as_str() {
        "basement" => ("basement", BASEMENT),
        "trench" => ("trench", TRENCH),
        other => fail(format!("unknown case {other}")),
    };
    let dir = PathBuf::from(&args[2]);
    let n: usize = args
        .get(3)
        .map(|s| {
            s.parse()
                .unwrap_or_else(|_| fail(format!("bad grid size {s}")))
        })
        .unwrap_or(500);
    std::fs::create_dir_all(&dir).unwrap_or_else(|e| fail(e.to_string()));
    let toml_path = dir.join("design.toml");
    std::fs::write(&toml_path, text).unwrap_or_else(|e| fail(e.to_string()));
    let model = from_str(&toml_path, text).unwrap_or_else(|e| fail(e.to_string()));
    let spec = model
        .layout
        .clone()
        .unwrap_or_else(|| fail("no layout".into()));
    let mut placement = generate(&model, &spec, 0.0).unwrap_or_else(|e| fail(e.to_string()));
    let base_rate = spec.rate.unwrap_or(1e-3);
    for (k, w) in placement.wells.iter_mut().enumerate() {
        w.rate = base_rate * (1.0 + 0.3 * (k as f64 * 0.7).sin());
    }
    let wells = &placement.wells;

    // Map grid over the wells' extent plus a margin.
    let (mut x0, mut y0, mut x1, mut y1) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
    for w in wells {
        x0 = x0.min(w.position[0]);
        y0 = y0.min(w.position[1]);
        x1 = x1.max(w.position[0]);
        y1 = y1.max(w.position[1]);
    }
    let margin = 40.0;
    let (x0, y0, x1, y1) = (x0 - margin, y0 - margin, x1 + margin, y1 + margin);
    let (dx, dy) = ((x1 - x0) / (n - 1) as f64, (y1 - y0) / (n - 1) as f64);
    let points: Vec<[f64; 2]> = (0..n * n)
        .map(|i| [x0 + (i % n) as f64 * dx, y0 + (i / n) as f64 * dy])
        .collect();
    let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();

    // Kernel: build the field and evaluate every node; best of several runs.
    let mut best = f64::INFINITY;
    let mut levels = Vec::new();
    // (the timed kernel includes the partial-penetration near-field term; NumPy sums Thiem only,
    // so the levels it is compared with are the same kernel's with that term left out)
    let mut pp_effect: f64 = 0.0;
    for _ in 0..5 {
        let t = Instant::now();
        let field = field_for(&model, wells);
        let with_pp = field.levels(&points, &rates);
        best = best.min(t.elapsed().as_secs_f64());
        let field = field.fully_penetrating();
        levels = field.levels(&points, &rates);
        pp_effect = with_pp
            .iter()
            .zip(&levels)
            .map(|(a, b)| match (a, b) {
                (
                    drydig::physics::potential::Level::Wet(x),
                    drydig::physics::potential::Level::Wet(y),
                ) => (x - y).abs(),
                _ => 0.0,
            })
            .fold(0.0, f64::max);
    }
    let field = field_for(&model, wells).fully_penetrating();
    let values: Vec<f64> = levels
        .iter()
        .map(|l| match l {
            drydig::physics::potential::Level::Wet(z) => *z,
            drydig::physics::potential::Level::Dry => f64::NAN,
        })
        .collect();
    write_npy(&dir.join("levels.npy"), &values, n, n).unwrap_or_else(|e| fail(e.to_string()));
    let mut csv = String::from("x,y,rate_m3_per_s,radius_m\n");
    for w in wells {
        csv.push_str(&format!(
            "{:.17e},{:.17e},{:.17e},{:.17e}\n",
            w.position[0], w.position[1], w.rate, w.radius
        ));
    }
    std::fs::write(dir.join("wells.csv"), csv).unwrap_or_else(|e| fail(e.to_string()));
    let aq = &model.aquifer;
    let info = serde_json::json!({
        "case": case,
        "conductivity_m_per_s": aq.conductivity,
        "base_level_m": aq.base_level,
        "top_level_m": aq.confined_thickness().map(|b| aq.base_level + b),
        "initial_level_m": aq.initial_level,
        "radius_of_influence_m": field.radius_of_influence(),
        "grid": {"x0": x0, "y0": y0, "dx": dx, "dy": dy, "nx": n, "ny": n},
    });
    std::fs::write(dir.join("case.json"), info.to_string()).unwrap_or_else(|e| fail(e.to_string()));
    println!(
        "{}",
        serde_json::json!({
            "case": case,
            "wells": wells.len(),
            "points": points.len(),
            "threads": rayon::current_num_threads(),
            "kernel_seconds": best,
            "partial_penetration_largest_m": pp_effect,
        })
    );
}

/// The transient cases: the 60-well basement on a GRID × GRID map at 10 output times, by Theis
/// superposition in time with Jacob's correction (unconfined). `transient`: every well at its
/// own constant rate from day 0, times 1 … 10 days. `programme`: three stages — every other
/// well from day 0, every well from day 4, every well at 1.3× from day 9 — times 1, 3 … 19 days.
/// Writes `transient.json` (aquifer, grid, times), `schedules.csv` (well, x, y, t_k s, ΔQ_k m³/s
/// for each rate change) and `drawdowns.npy` (times × GRID × GRID), and prints the kernel time.
fn transient_case(args: &[String]) {
    use drydig::transient::programme::transient_aquifer;
    use drydig::transient::{RateSchedule, TransientModel, TransientSource};
    let case = args[1].as_str();
    let dir = PathBuf::from(&args[2]);
    let n: usize = args.get(3).and_then(|s| s.parse().ok()).unwrap_or(500);
    std::fs::create_dir_all(&dir).unwrap_or_else(|e| fail(e.to_string()));
    let model =
        from_str(&dir.join("design.toml"), BASEMENT).unwrap_or_else(|e| fail(e.to_string()));
    let spec = model
        .layout
        .clone()
        .unwrap_or_else(|| fail("no layout".into()));
    let wells = generate(&model, &spec, 0.0)
        .unwrap_or_else(|e| fail(e.to_string()))
        .wells;
    let base_rate = spec.rate.unwrap_or(1e-3);
    let day = 86_400.0;
    let (times, schedules): (Vec<f64>, Vec<RateSchedule>) = if case == "transient" {
        (
            (1..=10).map(|k| k as f64 * day).collect(),
            (0..wells.len())
                .map(|k| {
                    let q = base_rate * (1.0 + 0.3 * (k as f64 * 0.7).sin());
                    RateSchedule::constant(0.0, q).expect("finite")
                })
                .collect(),
        )
    } else {
        (
            (0..10).map(|k| (1 + 2 * k) as f64 * day).collect(),
            (0..wells.len())
                .map(|k| {
                    let q = base_rate * (1.0 + 0.3 * (k as f64 * 0.7).sin());
                    let first = if k % 2 == 0 { q } else { 0.0 };
                    RateSchedule::new(vec![(0.0, first), (4.0 * day, q), (9.0 * day, 1.3 * q)])
                        .expect("valid steps")
                })
                .collect(),
        )
    };
    let aquifer = transient_aquifer(&model).unwrap_or_else(|e| fail(e.to_string()));
    let sources: Vec<TransientSource> = wells
        .iter()
        .zip(&schedules)
        .map(|(w, s)| TransientSource {
            x: w.position[0],
            y: w.position[1],
            schedule: s.clone(),
            sign: 1.0,
        })
        .collect();
    let radius = model.wells.radius;
    let (mut x0, mut y0, mut x1, mut y1) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
    for w in &wells {
        x0 = x0.min(w.position[0]);
        y0 = y0.min(w.position[1]);
        x1 = x1.max(w.position[0]);
        y1 = y1.max(w.position[1]);
    }
    let margin = 40.0;
    let (x0, y0, x1, y1) = (x0 - margin, y0 - margin, x1 + margin, y1 + margin);
    let (dx, dy) = ((x1 - x0) / (n - 1) as f64, (y1 - y0) / (n - 1) as f64);
    let points: Vec<[f64; 2]> = (0..n * n)
        .map(|i| [x0 + (i % n) as f64 * dx, y0 + (i / n) as f64 * dy])
        .collect();
    let mut best = f64::INFINITY;
    let mut d = Vec::new();
    for _ in 0..3 {
        let t = Instant::now();
        let m = TransientModel::new(aquifer, radius, sources.clone()).unwrap_or_else(|e| fail(e));
        d = m.drawdowns(&points, &times);
        best = best.min(t.elapsed().as_secs_f64());
    }
    let nt = times.len();
    let mut values = vec![0.0; nt * n * n];
    for (i, row) in d.iter().enumerate() {
        for (k, v) in row.iter().enumerate() {
            values[k * n * n + i] = *v;
        }
    }
    let dict = format!("{{'descr': '<f8', 'fortran_order': False, 'shape': ({nt}, {n}, {n}), }}");
    let unpadded = 10 + dict.len() + 1;
    let pad = (64 - unpadded % 64) % 64;
    let header = format!("{dict}{}\n", " ".repeat(pad));
    let mut bytes = b"\x93NUMPY\x01\x00".to_vec();
    bytes.extend_from_slice(&(header.len() as u16).to_le_bytes());
    bytes.extend_from_slice(header.as_bytes());
    for v in &values {
        bytes.extend_from_slice(&v.to_le_bytes());
    }
    std::fs::write(dir.join("drawdowns.npy"), bytes).unwrap_or_else(|e| fail(e.to_string()));
    let mut csv = String::from("well,x,y,radius_m,t_s,dq_m3_per_s\n");
    for (k, (w, s)) in wells.iter().zip(&schedules).enumerate() {
        let mut prev = 0.0;
        for &(t, q) in s.steps() {
            if q != prev {
                csv.push_str(&format!(
                    "{k},{:.17e},{:.17e},{:.17e},{:.17e},{:.17e}\n",
                    w.position[0],
                    w.position[1],
                    radius,
                    t,
                    q - prev
                ));
            }
            prev = q;
        }
    }
    std::fs::write(dir.join("schedules.csv"), csv).unwrap_or_else(|e| fail(e.to_string()));
    let aq = &model.aquifer;
    let info = serde_json::json!({
        "case": case,
        "kind": "transient",
        "transmissivity_m2_per_s": aq.transmissivity(),
        "storage": aq.storage(),
        "saturated_thickness_m": aq.initial_saturated_thickness(),
        "unconfined": true,
        "times_s": times,
        "grid": {"x0": x0, "y0": y0, "dx": dx, "dy": dy, "nx": n, "ny": n},
    });
    std::fs::write(dir.join("case.json"), info.to_string()).unwrap_or_else(|e| fail(e.to_string()));
    println!(
        "{}",
        serde_json::json!({
            "case": case,
            "wells": wells.len(),
            "points": points.len() * nt,
            "threads": rayon::current_num_threads(),
            "kernel_seconds": best,
        })
    );
}
