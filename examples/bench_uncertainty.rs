//! Timing of `drydig uncertainty` for scripts/bench.sh (not a test): N samples of `check` on a
//! design file with an [uncertainty] section through the shortcut (tables built once per
//! layout), beside the naive loop — the whole `check` (field, evaluation, neighbours, findings
//! with the level grid) re-run on each sample's model, timed on a few samples and extrapolated —
//! and M samples of `design` (each sample a full fewest-wells search). The check run includes
//! the repeated hypercubes of its convergence figure (`REPLICATES` more of N samples each); the
//! ratio to the naive loop is taken per sample evaluated.
//!
//! Usage: bench_uncertainty FILE CHECK_SAMPLES DESIGN_SAMPLES NAIVE_SAMPLES

use drydig::findings::check::CheckFindings;
use drydig::uncertainty::run::{run, Mode, Settings};
use std::time::Instant;

fn main() {
    let a: Vec<String> = std::env::args().collect();
    let file = std::path::Path::new(&a[1]);
    let n_check: usize = a[2].parse().unwrap();
    let n_design: usize = a[3].parse().unwrap();
    let n_naive: usize = a[4].parse().unwrap();
    let model = drydig::input::validate::file::load(file).unwrap();
    let spec = model.uncertainty.clone().unwrap();
    let settings = |mode, n| Settings {
        mode,
        samples: Some(n),
        seed: None,
        reliability: 0.9,
        rates: drydig::optimise::rates::RateOption::Individual,
    };
    let t = Instant::now();
    let r = run(&model, settings(Mode::Check, n_check), &|| {}).unwrap();
    let fast = t.elapsed().as_secs_f64();
    let p90 = r.series[0].percentiles.map_or(f64::NAN, |p| p.p90);
    let t = Instant::now();
    for v in drydig::uncertainty::sampling::sample_values(&spec, n_naive, spec.seed) {
        let m = drydig::uncertainty::apply::apply(&model, &spec, &v);
        let found = CheckFindings::build(drydig::check::run::run(&m, None).unwrap(), None);
        std::hint::black_box(&found.verdict);
    }
    let naive = t.elapsed().as_secs_f64() / n_naive as f64 * n_check as f64;
    let t = Instant::now();
    let d = run(&model, settings(Mode::Design, n_design), &|| {}).unwrap();
    let design = t.elapsed().as_secs_f64();
    println!(
        "{{\"threads\": {}, \"check_samples\": {n_check}, \"check_hypercubes\": {}, \"check_seconds\": {fast:.3}, \"naive_samples_timed\": {n_naive}, \"naive_seconds_extrapolated\": {naive:.3}, \"check_flow_p90_m3_per_s\": {p90:.6e}, \"design_samples\": {n_design}, \"design_seconds\": {design:.3}, \"robust_wells\": {}}}",
        rayon::current_num_threads(),
        1 + drydig::uncertainty::run::REPLICATES,
        d.robust.as_ref().map_or(0, |r| r.wells)
    );
}
