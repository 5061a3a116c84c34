//! The CSV files read cleanly in a spreadsheet, and wells CSVs written by one are read:
//!
//! - headers are ASCII, positions are `x_m`/`y_m`, every cell of a numeric column (header ending
//!   in a unit: `_m`, `_l_per_s`, `_m3_per_day`) is a plain decimal number or empty, with at most
//!   the stated decimals (no binary noise such as -2.9999999999999964), and an empty level is
//!   explained by `level_status` = "dry";
//! - counts in bid.csv (unit "no.") are whole numbers;
//! - a wells CSV with `;` between columns and decimal commas (as European spreadsheets save it)
//!   is read to the same wells as the comma-separated one; a comma-separated file with decimal
//!   commas is refused with that hint.
//!
//! The format facts are RFC 4180 and common practice (no source).

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn drydig(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs")
}

fn demo(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

const NUMERIC_SUFFIXES: &[&str] = &["_m", "_l_per_s", "_m3_per_day"];

/// Checks one CSV file for spreadsheets; returns (headers, rows).
fn spreadsheet_clean(path: &Path) -> (Vec<String>, Vec<Vec<String>>) {
    let text = std::fs::read_to_string(path).unwrap();
    let mut r = csv::Reader::from_reader(text.as_bytes());
    let headers: Vec<String> = r.headers().unwrap().iter().map(String::from).collect();
    for h in &headers {
        assert!(h.is_ascii(), "{}: header {h} is not ASCII", path.display());
    }
    let rows: Vec<Vec<String>> = r
        .records()
        .map(|rec| rec.unwrap().iter().map(String::from).collect())
        .collect();
    for row in &rows {
        for (h, cell) in headers.iter().zip(row) {
            if !NUMERIC_SUFFIXES.iter().any(|s| h.ends_with(s)) || cell.is_empty() {
                continue;
            }
            assert!(
                cell.parse::<f64>().is_ok_and(f64::is_finite),
                "{}: {h} = {cell:?} is not a number",
                path.display()
            );
            let decimals = cell.split('.').nth(1).map_or(0, str::len);
            assert!(decimals <= 9, "{}: {h} = {cell} has noise", path.display());
            let negative_zero = cell.starts_with('-') && cell.parse::<f64>() == Ok(0.0);
            assert!(!negative_zero, "{}: {h} = {cell}", path.display());
        }
    }
    (headers, rows)
}

#[test]
fn check_tables_are_clean_for_spreadsheets() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let run = drydig(&[
        "check",
        demo("deep_shaft.toml").to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert!(matches!(run.status.code(), Some(0 | 3)), "{run:?}");
    for f in ["wells.csv", "checkpoints.csv"] {
        let (headers, rows) = spreadsheet_clean(&out.join(f));
        for h in ["x_m", "y_m", "water_level_m", "level_status"] {
            assert!(headers.iter().any(|x| x == h), "{f}: no {h} in {headers:?}");
        }
        let level = headers.iter().position(|h| h == "water_level_m").unwrap();
        let state = headers.iter().position(|h| h == "level_status").unwrap();
        for row in &rows {
            assert!(matches!(row[state].as_str(), "wet" | "dry"), "{row:?}");
            assert_eq!(row[level].is_empty(), row[state] == "dry", "{row:?}");
        }
    }
}

#[test]
fn bid_counts_are_whole_numbers() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let run = drydig(&[
        "design",
        demo("deep_shaft.toml").to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert!(matches!(run.status.code(), Some(0 | 3)), "{run:?}");
    let text = std::fs::read_to_string(out.join("bid.csv")).unwrap();
    let mut r = csv::Reader::from_reader(text.as_bytes());
    let head = r.headers().unwrap().clone();
    let col = |name: &str| head.iter().position(|h| h == name).unwrap();
    let (cq, cu) = (col("quantity"), col("unit"));
    let mut counts = 0;
    for rec in r.records() {
        let rec = rec.unwrap();
        if &rec[cu] == "no." {
            counts += 1;
            assert!(rec[cq].parse::<u64>().is_ok(), "{} = {}", &rec[0], &rec[cq]);
        }
    }
    assert!(counts > 0, "{text}");
}

fn wells_from(csv_text: &str, name: &str) -> Output {
    let d = tempfile::tempdir().unwrap();
    let p = d.path().join(name);
    std::fs::write(&p, csv_text).unwrap();
    let out = d.path().join("out");
    let r = drydig(&[
        "check",
        demo("deep_shaft.toml").to_str().unwrap(),
        "--wells",
        p.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    if r.status.code() != Some(2) {
        let w = std::fs::read_to_string(out.join("wells.csv")).unwrap();
        return Output {
            status: r.status,
            stdout: w.into_bytes(),
            stderr: r.stderr,
        };
    }
    r
}

#[test]
fn a_semicolon_csv_with_decimal_commas_reads_as_the_comma_one() {
    let plain = "name,x_m,y_m,rate_l_per_s\nW1,-12.5,0,2.25\nW2,12.5,0,2.25\nW3,0,12.5,2.25\n";
    let european = "name;x;y;rate_l_per_s\nW1;-12,5;0;2,25\nW2;12,5;0;2,25\nW3;0;12,5;2,25\n";
    let a = wells_from(plain, "plain.csv");
    let b = wells_from(european, "european.csv");
    assert!(matches!(a.status.code(), Some(0 | 3)), "{a:?}");
    assert_eq!(a.status.code(), b.status.code());
    assert_eq!(
        String::from_utf8_lossy(&a.stdout),
        String::from_utf8_lossy(&b.stdout)
    );
    // Decimal commas between commas: the row splits into too many columns; say why.
    let bad = "name,x,y,rate_l_per_s\nW1,-12,5,0,2,25\n";
    let c = wells_from(bad, "bad.csv");
    assert_eq!(c.status.code(), Some(2));
    let err = String::from_utf8_lossy(&c.stderr);
    assert!(
        err.contains("decimal comma") && err.contains("semicolons"),
        "{err}"
    );
}
