//! The superposition kernel (`drydig::field::influence::Field`) against outside references:
//!
//! 1. a ring of N wells against the equivalent well inside it (mean value property of harmonic
//!    functions; Strack 1989), with the exact finite-N deviation from the factorisation of
//!    zᴺ − aᴺ over the N-th roots of unity;
//! 2. image wells for a straight boundary (Ferris et al. 1962, USGS WSP 1536-E; the values of
//!    checks.md §8);
//! 3. the R-tree cut-off against the plain all-pairs sum and a sum written out here, on seeded
//!    random layouts (rand_chacha);
//! 4. four multi-well fields against `tests/reference/superposition.csv`, written with numpy and
//!    scipy by `scripts/reference_superposition.py` (regenerated and compared by
//!    `scripts/check_references.sh`);
//! 5. the same site in projected coordinates (x ≈ 500 000 m, y ≈ 6 000 000 m) and near the
//!    origin, for the field and for the whole `check` pipeline on a design file.

use drydig::field::influence::Field;
use drydig::field::wells::Well;
use drydig::input::model::{Boundary, WellKind, WellSpec};
use drydig::physics::images::BoundaryKind;
use drydig::physics::potential::{Aquifer, AquiferKind, Level};
use drydig::physics::special::bessel_k0;
use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;
use std::f64::consts::PI;

// ---------------------------------------------------------------------------------------------
// Builders

fn spec(radius: f64) -> WellSpec {
    WellSpec {
        kind: WellKind::DeepWell,
        radius,
        screen_top: 0.0,
        screen_base: -10.0,
        filter_top: 0.0,
        filter_base: -10.0,
        pump_intake: -9.0,
        submergence: 1.0,
        pump_capacity: None,
        suction_limit: 5.5,
        standby: 0,
    }
}

fn well(name: &str, position: [f64; 2], radius: f64, rate: f64) -> Well {
    Well::from_spec(name.to_string(), position, rate, &spec(radius))
}

fn confined(conductivity: f64, base: f64, top: f64, initial: f64) -> Aquifer {
    Aquifer {
        kind: AquiferKind::Confined,
        conductivity,
        base_level: base,
        top_level: Some(top),
        initial_level: initial,
        storativity: Some(1e-4),
        specific_yield: None,
    }
}

fn boundary(name: &str, kind: BoundaryKind, a: [f64; 2], b: [f64; 2]) -> Boundary {
    Boundary {
        name: name.to_string(),
        kind,
        line: [a, b],
    }
}

fn wet(level: Level) -> f64 {
    match level {
        Level::Wet(z) => z,
        Level::Dry => panic!("a point was pumped dry where the reference is wet"),
    }
}

// ---------------------------------------------------------------------------------------------
// 1. Ring of wells against the equivalent well

/// N wells evenly on a circle of radius r_e, each pumping Q/N, in a confined aquifer. Inside the
/// circle the mean of ln|x − r_e·e^{iθ}| over the circle is ln r_e (mean value property of
/// harmonic functions; Strack (1989) *Groundwater Mechanics*), so the head tends to the
/// equivalent-well value h₀ − Q/(2πT)·ln(R/r_e) (Thiem) as N grows. For N wells at angles
/// φ + 2πk/N the deviation is exact: Π(z − r_e·ω^k·e^{iφ}) = zᴺ − r_eᴺ·e^{iNφ} (factorisation over
/// the N-th roots of unity, algebra, from memory), so
/// h − h_eq = Q/(2πT)·(1/N)·ln|1 − (z/r_e)ᴺ·e^{−iNφ}|.
#[test]
fn ring_of_wells_tends_to_the_equivalent_well_inside_the_ring() {
    // T = K·b = 1e-4 × 20 = 2e-3 m²/s; head 15 m above the top before pumping.
    let aquifer = confined(1e-4, -30.0, -10.0, 5.0);
    let t = 1e-4 * 20.0;
    let (q, r_e, big_r, phase): (f64, f64, f64, f64) = (0.02, 20.0, 1000.0, 0.3);
    let c = q / (2.0 * PI * t);
    let h_eq = 5.0 - c * (big_r / r_e).ln();
    assert!(h_eq > -10.0 + 5.0, "the test keeps the aquifer confined");

    // points within 0.5 r_e, spread by the golden angle, plus the centre and the rim of the disc
    let mut points = vec![[0.0, 0.0]];
    for i in 0..40 {
        let rho = 0.5 * r_e * ((i as f64 + 0.5) / 40.0).sqrt();
        let theta = i as f64 * 2.399_963_229_728_653;
        points.push([rho * theta.cos(), rho * theta.sin()]);
    }
    for k in 0..8 {
        let theta = k as f64 * PI / 4.0 + 0.1;
        points.push([0.5 * r_e * theta.cos(), 0.5 * r_e * theta.sin()]);
    }

    let mut max_errors = Vec::new();
    for n in [4usize, 8, 16, 32, 64] {
        let wells: Vec<Well> = (0..n)
            .map(|k| {
                let th = phase + 2.0 * PI * k as f64 / n as f64;
                well(
                    &format!("W{k}"),
                    [r_e * th.cos(), r_e * th.sin()],
                    0.15,
                    q / n as f64,
                )
            })
            .collect();
        let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();
        let field = Field::new(&aquifer, big_r, &wells, &[], [0.0, 0.0]);
        let mut max_err: f64 = 0.0;
        for p in &points {
            let h = wet(field.level(*p, &rates));
            // exact finite-N deviation: w = (z/r_e)^N e^{-iNφ}, deviation c/N·ln|1 − w|
            let (rho, theta) = (p[0].hypot(p[1]) / r_e, p[1].atan2(p[0]));
            let arg = n as f64 * (theta - phase);
            let mag = rho.powi(n as i32);
            let one_minus_w = (1.0 - mag * arg.cos()).hypot(mag * arg.sin());
            let exact = h_eq + c / n as f64 * one_minus_w.ln();
            assert!(
                (h - exact).abs() < 1e-9,
                "N = {n}, point {p:?}: head {h} vs exact {exact}"
            );
            max_err = max_err.max((h - h_eq).abs());
        }
        max_errors.push((n, max_err));
    }
    // the error falls as N grows (until it reaches rounding, ~1e-12 m)
    for w in max_errors.windows(2) {
        let ((n0, e0), (n1, e1)) = (w[0], w[1]);
        assert!(
            e1 < e0 || e1 < 1e-12,
            "error did not fall from N = {n0} ({e0:e}) to N = {n1} ({e1:e})"
        );
    }
    assert!(
        max_errors[0].1 > 1e-3,
        "N = 4 differs visibly: {max_errors:?}"
    );
    let (_, e64) = max_errors[4];
    assert!(e64 < 1e-6, "N = 64: {e64:e} m");
}

// ---------------------------------------------------------------------------------------------
// 2. Images for a straight boundary

/// Q = 0.01 m³/s, T = K·b = 1e-4 × 10 = 1e-3 m²/s, well at (50, 0), boundary on x = 0 (checks.md
/// §8). The head starts 90 m above the confining top, so every point stays confined and the
/// drawdown is the Thiem one. R = 1e6 m: with the constant head, ln(R/r) − ln(R/r_img) =
/// ln(r_img/r) and R drops out.
const Q8: f64 = 0.01;
const H0: f64 = 100.0;

fn aquifer8() -> Aquifer {
    confined(1e-4, 0.0, 10.0, H0)
}

fn field8(kind: Option<BoundaryKind>, rate: f64, radius: f64, rotate: f64) -> (Field, Vec<f64>) {
    let rot = |p: [f64; 2]| rotate_about(p, rotate);
    let wells = vec![well("W", rot([50.0, 0.0]), radius, rate)];
    let boundaries: Vec<Boundary> = kind
        .map(|k| vec![boundary("B", k, rot([0.0, -100.0]), rot([0.0, 100.0]))])
        .unwrap_or_default();
    let field = Field::new(&aquifer8(), 1.0e6, &wells, &boundaries, [0.0, 0.0]);
    (field, vec![rate])
}

/// Rotate about (20, −30) by `angle` radians (plane geometry: distances are unchanged).
fn rotate_about(p: [f64; 2], angle: f64) -> [f64; 2] {
    let (s, c) = angle.sin_cos();
    let (x, y) = (p[0] - 20.0, p[1] + 30.0);
    [20.0 + c * x - s * y, -30.0 + s * x + c * y]
}

fn drawdown(field: &Field, rates: &[f64], p: [f64; 2]) -> f64 {
    H0 - wet(field.level(p, rates))
}

#[test]
fn constant_head_boundary_matches_ferris_values() {
    // Ferris et al. (1962) USGS WSP 1536-E, method; values library-computed (checks.md §8):
    // (25, 0) → 1.74850 m; (50, 20) → 2.59271 m; printed to 5 decimals, so ±5e-6 m.
    for angle in [0.0, 0.6] {
        let (field, rates) = field8(Some(BoundaryKind::ConstantHead), Q8, 0.15, angle);
        let at = |p| drawdown(&field, &rates, rotate_about(p, angle));
        assert!(
            (at([25.0, 0.0]) - 1.74850).abs() < 5e-6,
            "{}",
            at([25.0, 0.0])
        );
        assert!(
            (at([50.0, 20.0]) - 2.59271).abs() < 5e-6,
            "{}",
            at([50.0, 20.0])
        );
        // on the boundary line the drawdown is zero (checks.md §8: "any point on the boundary")
        for y in [-500.0, -37.0, 0.0, 12.5, 80.0, 1000.0] {
            let s = at([0.0, y]);
            assert!(s.abs() < 1e-9, "angle {angle}, (0, {y}): drawdown {s}");
        }
    }
}

#[test]
fn barrier_boundary_has_no_flow_across_it() {
    // Ferris et al. (1962) USGS WSP 1536-E: an impermeable line is a same-sign image, so the
    // normal gradient ∂h/∂x vanishes on it. Central difference over ±1 mm; without the barrier
    // the same well gives |∂h/∂x| = Q/(2πT)·50/(50² + y²) (Thiem), which must be clearly
    // non-zero for the check to mean anything.
    let dx = 1e-3;
    let c = Q8 / (2.0 * PI * 1e-3);
    for angle in [0.0, 0.6] {
        let (field, rates) = field8(Some(BoundaryKind::Barrier), Q8, 0.15, angle);
        let (free, _) = field8(None, Q8, 0.15, angle);
        let level = |f: &Field, p| wet(f.level(rotate_about(p, angle), &rates));
        for y in [-200.0, -40.0, -5.0, 0.0, 7.5, 60.0, 300.0] {
            let grad = (level(&field, [dx, y]) - level(&field, [-dx, y])) / (2.0 * dx);
            let grad_free = (level(&free, [dx, y]) - level(&free, [-dx, y])) / (2.0 * dx);
            let thiem = c * 50.0 / (2500.0 + y * y);
            assert!((grad_free.abs() - thiem).abs() < 1e-6 * thiem.max(1e-3));
            assert!(
                grad.abs() < 1e-8,
                "angle {angle}, y = {y}: ∂h/∂x = {grad:e}"
            );
        }
        // drawdown with a barrier: Q/(2πT)·[ln(R/r) + ln(R/r_img)] (Ferris et al. 1962)
        let s = drawdown(&field, &rates, rotate_about([25.0, 0.0], angle));
        let expected = c * ((1.0e6f64 / 25.0).ln() + (1.0e6f64 / 75.0).ln());
        assert!((s - expected).abs() < 1e-9, "{s} vs {expected}");
    }
}

#[test]
fn well_beside_a_river_draws_down_two_metres() {
    // checks.md §8 (Ferris et al. 1962, library-computed): Q = 2πT·s_w/ln(2a/r_w) with s_w = 2,
    // a = 50, r_w = 0.1 → 1.8192e-3 m³/s.
    let (t, s_w, a, r_w) = (1e-3, 2.0, 50.0, 0.1);
    let q = 2.0 * PI * t * s_w / (2.0f64 * a / r_w).ln();
    assert!((q - 1.8192e-3).abs() < 1e-4 * 1.8192e-3, "{q}");
    // pump the published rate: the level in the well falls by 2.000 m
    let (field, rates) = field8(Some(BoundaryKind::ConstantHead), 1.8192e-3, r_w, 0.0);
    let s = drawdown(&field, &rates, [50.0, 0.0]);
    assert!((s - 2.000).abs() < 5e-4, "drawdown in the well {s}");
}

// ---------------------------------------------------------------------------------------------
// 3. The R-tree cut-off against the plain all-pairs sum

/// Reflection of p across the line through a and b, written out here (plane geometry: p minus
/// twice its component along the unit normal).
fn reflect(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> [f64; 2] {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len = dx.hypot(dy);
    let (nx, ny) = (-dy / len, dx / len);
    let d = (p[0] - a[0]) * nx + (p[1] - a[1]) * ny;
    [p[0] - 2.0 * d * nx, p[1] - 2.0 * d * ny]
}

struct Manual {
    /// (well index, position, radius, sign) of every real and image source
    sources: Vec<(usize, [f64; 2], f64, f64)>,
    leaky: Option<f64>,
    big_r: f64,
}

impl Manual {
    fn new(wells: &[Well], boundaries: &[Boundary], leaky: Option<f64>, big_r: f64) -> Manual {
        let mut sources = Vec::new();
        for (i, w) in wells.iter().enumerate() {
            sources.push((i, w.position, w.radius, 1.0));
            for b in boundaries {
                let sign = match b.kind {
                    BoundaryKind::ConstantHead => -1.0,
                    BoundaryKind::Barrier => 1.0,
                };
                sources.push((i, reflect(w.position, b.line[0], b.line[1]), w.radius, sign));
            }
        }
        Manual {
            sources,
            leaky,
            big_r,
        }
    }

    /// Cut-off distance: R (Thiem, 0 beyond R: design.md §2) or 25 B for a leaky aquifer (the
    /// documented cut-off of src/influence.rs, where K₀(25) ≈ 3.5e-12).
    fn cutoff(&self) -> f64 {
        self.leaky.map_or(self.big_r, |b| 25.0 * b)
    }

    /// Terms (well, ΔΦ per unit rate) of every source at p, zero beyond the cut-off:
    /// −ln(R/r)/(2π) (Thiem) or −K₀(r/B)/(2π) (Hantush–Jacob), r clamped at the well radius.
    fn terms(&self, p: [f64; 2]) -> Vec<(usize, f64)> {
        self.sources
            .iter()
            .map(|&(i, pos, radius, sign)| {
                let r = (pos[0] - p[0]).hypot(pos[1] - p[1]).max(radius);
                let v = if r >= self.cutoff() {
                    0.0
                } else {
                    match self.leaky {
                        Some(b) => -bessel_k0(r / b) / (2.0 * PI),
                        None => -(self.big_r / r).ln() / (2.0 * PI),
                    }
                };
                (i, sign * v)
            })
            .collect()
    }
}

#[test]
fn rtree_cutoff_equals_the_all_pairs_sum_on_random_layouts() {
    let mut near_inside = 0usize;
    let mut near_outside = 0usize;
    let mut empty_rows = 0usize;
    let mut rows_checked = 0usize;
    for seed in 1..=16u64 {
        let mut rng = ChaCha8Rng::seed_from_u64(seed);
        let n = rng.random_range(20..=200usize);
        let leaky = seed % 3 == 0;
        let big_r = rng.random_range(30.0..300.0);
        let leakage = leaky.then(|| rng.random_range(2.0..12.0));
        let aquifer = Aquifer {
            kind: match leakage {
                Some(b) => AquiferKind::Leaky { leakage_factor: b },
                None => AquiferKind::Confined,
            },
            ..confined(1e-4, -40.0, -10.0, 5.0)
        };
        let half = rng.random_range(40.0..250.0);
        let wells: Vec<Well> = (0..n)
            .map(|i| {
                let q = rng.random_range(-2e-3..6e-3);
                let r = rng.random_range(0.05..0.3);
                let p = [rng.random_range(-half..half), rng.random_range(-half..half)];
                well(&format!("W{i}"), p, r, q)
            })
            .collect();
        let n_boundaries = (seed % 4) as usize; // 0, 1, 2 or 3 boundaries
        let boundaries: Vec<Boundary> = (0..n_boundaries)
            .map(|j| {
                let a = [rng.random_range(-2.0 * half..2.0 * half), -half * 1.5];
                let b = [rng.random_range(-2.0 * half..2.0 * half), half * 1.5];
                let kind = if rng.random_bool(0.5) {
                    BoundaryKind::ConstantHead
                } else {
                    BoundaryKind::Barrier
                };
                boundary(&format!("B{j}"), kind, a, b)
            })
            .collect();
        let origin = [rng.random_range(-50.0..50.0), rng.random_range(-50.0..50.0)];
        let field = Field::new(&aquifer, big_r, &wells, &boundaries, origin);
        let manual = Manual::new(&wells, &boundaries, leakage, big_r);
        let cutoff = manual.cutoff();
        let rates: Vec<f64> = wells.iter().map(|w| w.rate).collect();

        // points: spread over the layout and beyond R, at wells, just inside and just outside
        // the cut-off of some source, and far from everything
        let mut points: Vec<[f64; 2]> = Vec::new();
        let span = half + 1.5 * cutoff;
        for _ in 0..30 {
            points.push([rng.random_range(-span..span), rng.random_range(-span..span)]);
        }
        for _ in 0..5 {
            points.push(wells[rng.random_range(0..n)].position);
        }
        for k in 0..20 {
            let s = manual.sources[rng.random_range(0..manual.sources.len())].1;
            let f = if k % 2 == 0 {
                1.0 - rng.random_range(1e-6..1e-2)
            } else {
                1.0 + rng.random_range(1e-6..1e-2)
            };
            let th = rng.random_range(0.0..2.0 * PI);
            points.push([s[0] + f * cutoff * th.cos(), s[1] + f * cutoff * th.sin()]);
        }
        points.push([span + 10.0 * cutoff, -span - 10.0 * cutoff]);

        for p in &points {
            let terms = manual.terms(*p);
            for &(_, pos, radius, _) in &manual.sources {
                let r = (pos[0] - p[0]).hypot(pos[1] - p[1]).max(radius);
                if r < cutoff && r > 0.95 * cutoff {
                    near_inside += 1;
                } else if r >= cutoff && r < 1.05 * cutoff {
                    near_outside += 1;
                }
            }
            let mut row = vec![0.0; n];
            let mut scale = vec![0.0; n];
            for &(i, v) in &terms {
                row[i] += v;
                scale[i] += v.abs();
            }
            let fast = field.unit_row(*p);
            let plain = field.unit_row_all_pairs(*p);
            for i in 0..n {
                // R-tree and all pairs use the same sources: only the order of the sum differs
                // (with images of images the written-out scale misses some terms: take |sum| too)
                let tol = 1e-12 * scale[i].max(plain[i].abs());
                // the written-out sum mirrors by its own formula: image positions differ in the
                // last bits (~1e-13 m), worth up to ~1e-16 in a unit term near the cut-off
                let tol_written = tol + 1e-16;
                assert!(
                    (fast[i] - plain[i]).abs() <= tol,
                    "seed {seed}, point {p:?}, well {i}: R-tree {} vs all pairs {}",
                    fast[i],
                    plain[i]
                );
                // The written-out sum keeps first-order images only; with two or more
                // boundaries the kernel also adds images of images (checked against the
                // boundary conditions in physics::images), so the comparison holds for one.
                assert!(
                    n_boundaries >= 2 || (plain[i] - row[i]).abs() <= tol_written,
                    "seed {seed}, point {p:?}, well {i}: all pairs {} vs written-out sum {}",
                    plain[i],
                    row[i]
                );
            }
            if n_boundaries < 2 && scale.iter().all(|s| *s == 0.0) {
                empty_rows += 1;
                assert!(fast.iter().all(|v| *v == 0.0));
            }
            let sum: f64 = terms.iter().map(|&(i, v)| rates[i] * v).sum();
            let sum_scale: f64 = terms.iter().map(|&(i, v)| (rates[i] * v).abs()).sum();
            let dp = field.delta_potential(*p, &rates);
            let q_abs: f64 = rates.iter().map(|q| q.abs()).sum();
            assert!(
                n_boundaries >= 2 || (dp - sum).abs() <= 1e-12 * sum_scale + 1e-16 * q_abs,
                "seed {seed}, point {p:?}: delta_potential {dp} vs written-out sum {sum}"
            );
            let from_rows: f64 = plain.iter().zip(&rates).map(|(u, q)| u * q).sum();
            let row_scale: f64 = plain.iter().zip(&rates).map(|(u, q)| (u * q).abs()).sum();
            assert!(
                (dp - from_rows).abs() <= 1e-12 * sum_scale.max(row_scale),
                "seed {seed}, point {p:?}: delta_potential {dp} vs all-pairs row {from_rows}"
            );
            rows_checked += 1;
        }
        // the matrix is the rows
        let matrix = field.unit_matrix(&points[..5]);
        for (p, m) in points[..5].iter().zip(&matrix) {
            assert_eq!(m, &field.unit_row(*p));
        }
    }
    // the layouts did exercise the cut-off from both sides and the empty case
    assert!(
        near_inside > 50 && near_outside > 50,
        "{near_inside} / {near_outside}"
    );
    assert!(empty_rows >= 16, "{empty_rows}");
    assert!(rows_checked > 800);
}

// ---------------------------------------------------------------------------------------------
// 4. Multi-well fields against the numpy/scipy reference table

#[derive(Default)]
struct Case {
    name: String,
    kind: String,
    params: std::collections::HashMap<String, f64>,
    wells: Vec<Well>,
    boundaries: Vec<Boundary>,
    /// (name, position, ΔΦ, level)
    points: Vec<(String, [f64; 2], f64, f64)>,
}

fn read_reference() -> Vec<Case> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/superposition.csv"
    );
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .has_headers(true)
        .from_path(path)
        .expect("tests/reference/superposition.csv is readable");
    let mut cases: Vec<Case> = Vec::new();
    for rec in reader.records() {
        let rec = rec.expect("well-formed CSV record");
        let num = |i: usize| -> f64 {
            rec[i]
                .trim()
                .parse()
                .unwrap_or_else(|_| panic!("bad number in column {i}: {:?}", &rec[i]))
        };
        let case = &rec[0];
        if cases.last().is_none_or(|c| c.name != case) {
            cases.push(Case {
                name: case.to_string(),
                ..Case::default()
            });
        }
        let c = cases.last_mut().expect("a case");
        match &rec[1] {
            "param" if &rec[2] == "kind" => c.kind = rec[3].to_string(),
            "param" => {
                c.params.insert(rec[2].to_string(), num(8));
            }
            "well" => c
                .wells
                .push(well(&rec[2], [num(4), num(5)], num(6), num(8))),
            "boundary" => c.boundaries.push(boundary(
                &rec[2],
                match &rec[3] {
                    "constant-head" => BoundaryKind::ConstantHead,
                    "barrier" => BoundaryKind::Barrier,
                    other => panic!("unknown boundary kind {other}"),
                },
                [num(4), num(5)],
                [num(6), num(7)],
            )),
            "point" => c
                .points
                .push((rec[2].to_string(), [num(4), num(5)], num(6), num(8))),
            other => panic!("unknown record {other}"),
        }
    }
    cases
}

#[test]
fn multi_well_fields_match_the_numpy_reference() {
    let cases = read_reference();
    let names: Vec<&str> = cases.iter().map(|c| c.name.as_str()).collect();
    assert_eq!(
        names,
        ["unconfined", "confined_to_unconfined", "leaky", "images"]
    );
    for c in &cases {
        let p = |k: &str| c.params[k];
        let aquifer = Aquifer {
            kind: match c.kind.as_str() {
                "unconfined" => AquiferKind::Unconfined,
                "confined" => AquiferKind::Confined,
                "leaky" => AquiferKind::Leaky {
                    leakage_factor: p("leakage_factor_m"),
                },
                other => panic!("unknown aquifer kind {other}"),
            },
            conductivity: p("conductivity_m_per_s"),
            base_level: p("base_level_m"),
            top_level: c.params.get("top_level_m").copied(),
            initial_level: p("initial_level_m"),
            storativity: None,
            specific_yield: None,
        };
        assert_eq!(c.wells.len(), 10, "{}", c.name);
        assert!(c.wells.iter().any(|w| w.rate < 0.0), "a recharge well");
        assert_eq!(c.points.len(), 50, "{}", c.name);
        let field = Field::new(
            &aquifer,
            p("radius_of_influence_m"),
            &c.wells,
            &c.boundaries,
            [3.0, -2.0],
        );
        let rates: Vec<f64> = c.wells.iter().map(|w| w.rate).collect();
        let positions: Vec<[f64; 2]> = c.points.iter().map(|x| x.1).collect();
        let levels = field.levels(&positions, &rates);
        for ((name, pos, dphi, level), got) in c.points.iter().zip(levels) {
            let z = wet(got);
            assert!(
                (z - level).abs() <= 1e-9 * level.abs().max(1.0),
                "{} {name}: level {z} vs reference {level}",
                c.name
            );
            let d = field.delta_potential(*pos, &rates);
            assert!(
                (d - dphi).abs() <= 1e-9 * dphi.abs() + 1e-18,
                "{} {name}: ΔΦ {d} vs reference {dphi}",
                c.name
            );
        }
    }
}

// ---------------------------------------------------------------------------------------------
// 5. Projected coordinates

/// The same well field near the origin and shifted to x ≈ 500 000, y ≈ 6 000 000 (a projected
/// grid) gives the same levels to 1e-9 m: geometry does not depend on where the origin is
/// (common practice (no source); georust/geo tests the same way).
#[test]
fn projected_coordinates_give_the_same_levels_in_the_field() {
    let shift = [500_000.0, 6_000_000.0];
    let moved = |p: [f64; 2]| [p[0] + shift[0], p[1] + shift[1]];
    let base_wells: Vec<Well> = (0..12)
        .map(|i| {
            let th = i as f64 * 2.0 * PI / 12.0 + 0.2;
            let q = if i == 5 {
                -1.5e-3
            } else {
                3.0e-3 + 1e-4 * i as f64
            };
            well(
                &format!("W{i}"),
                [31.25 * th.cos() + 2.5, 18.75 * th.sin() - 1.25],
                0.15,
                q,
            )
        })
        .collect();
    let base_boundaries = vec![
        boundary(
            "River",
            BoundaryKind::ConstantHead,
            [-300.0, -60.0],
            [300.0, -52.0],
        ),
        boundary("Wall", BoundaryKind::Barrier, [90.0, -200.0], [96.0, 200.0]),
    ];
    let shifted_wells: Vec<Well> = base_wells
        .iter()
        .map(|w| {
            let mut w = w.clone();
            w.position = moved(w.position);
            w
        })
        .collect();
    let shifted_boundaries: Vec<Boundary> = base_boundaries
        .iter()
        .map(|b| boundary(&b.name, b.kind, moved(b.line[0]), moved(b.line[1])))
        .collect();
    let rates: Vec<f64> = base_wells.iter().map(|w| w.rate).collect();
    let mut points: Vec<[f64; 2]> = base_wells.iter().map(|w| w.position).collect();
    for i in 0..40 {
        points.push([-60.0 + 3.5 * i as f64, -45.0 + 2.25 * ((i * 7) % 40) as f64]);
    }
    let shifted_points: Vec<[f64; 2]> = points.iter().map(|p| moved(*p)).collect();
    let aquifers = [
        confined(2e-4, -25.0, -10.0, 3.0),
        Aquifer {
            kind: AquiferKind::Unconfined,
            top_level: None,
            ..confined(2e-4, -25.0, -10.0, 3.0)
        },
        Aquifer {
            kind: AquiferKind::Leaky {
                leakage_factor: 120.0,
            },
            ..confined(2e-4, -25.0, -10.0, 3.0)
        },
    ];
    for aquifer in &aquifers {
        let near = Field::new(aquifer, 600.0, &base_wells, &base_boundaries, [0.0, 0.0]);
        let far = Field::new(
            aquifer,
            600.0,
            &shifted_wells,
            &shifted_boundaries,
            [shift[0] + 7.0, shift[1] - 3.0],
        );
        let a = near.levels(&points, &rates);
        let b = far.levels(&shifted_points, &rates);
        for ((p, za), zb) in points.iter().zip(a).zip(b) {
            let (za, zb) = (wet(za), wet(zb));
            assert!(
                (za - zb).abs() < 1e-9,
                "{:?}, {p:?}: {za} near the origin vs {zb} in projected coordinates",
                aquifer.kind
            );
        }
    }
}

/// layouts/riverside_basement.toml as it stands (copied, so that this test keeps its site when
/// the example changes).
const RIVERSIDE: &str = r#"# Invented scenario: an L-shaped two-level basement for a block of flats on a river terrace.
# Sand and gravel over stiff clay; the river bank runs east–west 45 m south of the site.
# Two older neighbours on shallow footings stand to the north and east.

[site]
name = "Willow Quay flats — L-shaped basement"
datum = "0.00 m = site datum (about mean river level)"
ground_level = "6.2 m"
grid = "local site grid"

[aquifer]
kind = "unconfined"
conductivity = "3e-4 m/s"          # medium to coarse sand and gravel (from grading, to confirm by test)
base_level = "-11.0 m"              # top of stiff clay
groundwater_level = "3.8 m"
specific_yield = 0.18

[[excavation]]
name = "Basement"
outline = [[0, 0], [56, 0], [56, 22], [30, 22], [30, 44], [0, 44]]
formation_level = "0.2 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"
sichardt_c = 3000

[allowances]
contingency = "50 %"

[wells]
kind = "deep-well"
radius = "0.15 m"
screen_top = "2.0 m"
screen_base = "-10.0 m"
pump_intake = "-9.0 m"
submergence = "1.0 m"
pump_capacity = "8 L/s"
standby = 2

[layout]
kind = "ring"
excavation = "Basement"
offset = "3 m"
count = 14
corner_wells = true
rate = "5 L/s"

[[boundary]]
name = "River bank"
kind = "constant-head"
line = [[-200, -45], [300, -45]]

[[neighbour]]
name = "Terrace houses 2–8"
footprint = [[-4, 52], [40, 52], [40, 64], [-4, 64]]
foundation_level = "5.2 m"
allowable_drawdown = "1.5 m"
allowable_settlement = "0.010 m"
allowable_distortion = "1/500"
[[neighbour.layer]]
name = "soft alluvial clay lens"
thickness = "2.0 m"
m_v = "3e-4 1/kPa"
[[neighbour.layer]]
name = "sand and gravel"
thickness = "12.0 m"
incompressible = true

[[neighbour]]
name = "Old mill warehouse"
footprint = [[66, 4], [90, 4], [90, 36], [66, 36]]
foundation_level = "4.8 m"
allowable_drawdown = "2.0 m"
allowable_settlement = "0.015 m"
allowable_distortion = "1/500"
[[neighbour.layer]]
name = "made ground"
thickness = "1.5 m"
m_v = "1e-4 1/kPa"
[[neighbour.layer]]
name = "sand and gravel"
thickness = "14.0 m"
incompressible = true

[checks]
grid_spacing = "2 m"
edge_spacing = "2 m"

[output]
units = "si"
map = "drawdown"
"#;

/// Shift every `[x, y]` pair on the `outline`, `line` and `footprint` lines by (dx, dy).
fn shift_design(text: &str, dx: f64, dy: f64) -> String {
    let mut out = String::new();
    let mut shifted_lines = 0;
    for line in text.lines() {
        let key = line.split('=').next().unwrap_or("").trim();
        if ["outline", "line", "footprint"].contains(&key) {
            let value = line.split_once('=').map(|x| x.1).unwrap_or("");
            let numbers: Vec<f64> = value
                .split(['[', ']', ','])
                .map(str::trim)
                .filter(|s| !s.is_empty())
                .map(|s| s.parse().expect("a coordinate"))
                .collect();
            assert!(
                numbers.len() >= 4 && numbers.len().is_multiple_of(2),
                "{line}"
            );
            let pairs: Vec<String> = numbers
                .chunks(2)
                .map(|p| format!("[{}, {}]", p[0] + dx, p[1] + dy))
                .collect();
            out.push_str(&format!("{key} = [{}]\n", pairs.join(", ")));
            shifted_lines += 1;
        } else {
            out.push_str(line);
            out.push('\n');
        }
    }
    assert_eq!(
        shifted_lines, 4,
        "outline, boundary line and two footprints"
    );
    out
}

#[test]
fn projected_coordinates_give_the_same_check_results() {
    let (dx, dy) = (500_000.0, 6_000_000.0);
    let dir = tempfile::tempdir().expect("a temporary directory");
    let near_path = dir.path().join("riverside_local.toml");
    let far_path = dir.path().join("riverside_projected.toml");
    std::fs::write(&near_path, shift_design(RIVERSIDE, 0.0, 0.0)).expect("written");
    let far_text = shift_design(RIVERSIDE, dx, dy);
    assert!(far_text.contains("[500000, 6000000], [500056, 6000000]"));
    std::fs::write(&far_path, far_text).expect("written");

    let near_model =
        drydig::input::validate::file::load(&near_path).expect("the local design file is valid");
    let far_model =
        drydig::input::validate::file::load(&far_path).expect("the shifted design file is valid");
    let near = drydig::check::run::run(&near_model, None).expect("check runs");
    let far = drydig::check::run::run(&far_model, None).expect("check runs");
    let (a, b) = (&near.evaluation, &far.evaluation);

    assert_eq!(a.radius_of_influence_m, b.radius_of_influence_m);
    assert_eq!(a.points.len(), b.points.len());
    assert!(a.points.len() > 100, "{} check points", a.points.len());
    for (pa, pb) in a.points.iter().zip(&b.points) {
        assert_eq!(pa.point.name, pb.point.name);
        assert!((pb.point.position[0] - pa.point.position[0] - dx).abs() < 1e-9);
        assert!((pb.point.position[1] - pa.point.position[1] - dy).abs() < 1e-9);
        let (za, zb) = (pa.level_m.expect("wet"), pb.level_m.expect("wet"));
        assert!(
            (za - zb).abs() < 1e-9,
            "{}: {za} local vs {zb} projected",
            pa.point.name
        );
        assert_eq!(pa.met, pb.met);
    }
    assert_eq!(a.wells.len(), 14);
    assert_eq!(a.wells.len(), b.wells.len());
    for (wa, wb) in a.wells.iter().zip(&b.wells) {
        assert_eq!(wa.name, wb.name);
        assert!((wb.position[0] - wa.position[0] - dx).abs() < 1e-9);
        assert!((wb.position[1] - wa.position[1] - dy).abs() < 1e-9);
        let (za, zb) = (wa.level_m.expect("wet"), wb.level_m.expect("wet"));
        assert!((za - zb).abs() < 1e-9, "{}: {za} vs {zb}", wa.name);
    }
    assert_eq!(a.unmet_count, b.unmet_count);
    assert_eq!(a.targets_met, b.targets_met);
}
