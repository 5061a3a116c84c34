//! Special functions against the reference table in `tests/reference/special_functions.csv`,
//! written by `scripts/reference_special.py` from scipy (`special.exp1`, `k0`, `k1`) and mpmath
//! (`quad` for the Hantush–Jacob W(u, r/B), 30 digits); the library versions are in the CSV's
//! header comment and pinned in `scripts/requirements.txt`. `scripts/check_references.sh`
//! regenerates the table and fails if it has drifted.

use drydig::physics::special::{bessel_k0, bessel_k1, exp1, hantush_w};

/// Relative tolerance required of every row.
const REL_TOL: f64 = 1e-8;
/// Absolute tolerance accepted instead, for values below `TINY` only.
const ABS_TOL: f64 = 1e-12;
const TINY: f64 = 1e-4;

struct Row {
    function: String,
    x1: f64,
    x2: f64,
    value: f64,
}

fn read_table() -> Vec<Row> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/special_functions.csv"
    );
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .has_headers(true)
        .from_path(path)
        .expect("reference table tests/reference/special_functions.csv is readable");
    let mut rows = Vec::new();
    for record in reader.records() {
        let record = record.expect("well-formed CSV record");
        let num = |i: usize| -> f64 {
            record[i]
                .trim()
                .parse()
                .unwrap_or_else(|_| panic!("bad number in column {i}: {:?}", &record[i]))
        };
        rows.push(Row {
            function: record[0].trim().to_string(),
            x1: num(1),
            x2: num(2),
            value: num(3),
        });
    }
    rows
}

fn close(got: f64, want: f64) -> bool {
    let diff = (got - want).abs();
    diff <= REL_TOL * want.abs() || (want.abs() < TINY && diff <= ABS_TOL)
}

fn check(function: &str, eval: impl Fn(f64, f64) -> f64, min_rows: usize) {
    let rows: Vec<Row> = read_table()
        .into_iter()
        .filter(|r| r.function == function)
        .collect();
    assert!(
        rows.len() >= min_rows,
        "expected at least {min_rows} {function} rows, found {}",
        rows.len()
    );
    let mut failures = Vec::new();
    let mut worst = 0.0_f64;
    for r in &rows {
        let got = eval(r.x1, r.x2);
        worst = worst.max(((got - r.value) / r.value).abs());
        if !close(got, r.value) {
            failures.push(format!(
                "{function}({:e}, {:e}) = {got:.15e}, reference {:.12e}, rel err {:.2e}",
                r.x1,
                r.x2,
                r.value,
                ((got - r.value) / r.value).abs()
            ));
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {} rows off (worst rel {worst:.2e}):\n{}",
        failures.len(),
        rows.len(),
        failures.join("\n")
    );
}

#[test]
fn exp1_matches_scipy() {
    // library: scipy special.exp1 (version in the CSV header)
    check("exp1", |x, _| exp1(x), 15);
}

#[test]
fn bessel_k0_matches_scipy() {
    // library: scipy special.k0 (version in the CSV header)
    check("k0", |x, _| bessel_k0(x), 10);
}

#[test]
fn bessel_k1_matches_scipy() {
    // library: scipy special.k1 (version in the CSV header)
    check("k1", |x, _| bessel_k1(x), 10);
}

#[test]
fn hantush_w_matches_mpmath() {
    // library: mpmath quad of the Hantush–Jacob integral (version in the CSV header)
    check("hantush_w", hantush_w, 40);
}

#[test]
fn table_has_its_provenance() {
    // the header comment must name the libraries and their versions
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/special_functions.csv"
    ))
    .expect("reference table is readable");
    let first = text.lines().next().unwrap_or_default();
    assert!(first.starts_with('#') && first.contains("scipy ") && first.contains("mpmath "));
}
