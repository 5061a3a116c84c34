//! Inputs past the bad-input corpus (issue 9): huge files, huge layouts, many vertices, far
//! coordinates, names that read as comments or formulas, and a property test that sets every
//! number of every demo to an extreme value. drydig must answer each with exit 0, 2 or 3 — never
//! a panic (101), a hang or an abort — and no output may hold a non-finite number.
//!
//! The expectations are facts of the trade or of the formats, marked as such: common practice
//! (no source) that no site needs 10⁵ wells; RFC 4180 (CSV) for quoting; IEEE 754 for the spacing
//! of doubles.

use proptest::prelude::*;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn drydig(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(args)
        .output()
        .expect("drydig runs")
}

fn layout(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).to_string()
}

/// Whether any byte string holds `NaN`, `inf` or `Infinity` as a word.
fn non_finite(t: &str) -> bool {
    let b = t.as_bytes();
    ["NaN", "inf", "Infinity"].iter().any(|w| {
        t.match_indices(w).any(|(i, _)| {
            let before = i == 0 || !b[i - 1].is_ascii_alphanumeric();
            let e = i + w.len();
            let after = e >= b.len() || !b[e].is_ascii_alphanumeric();
            before && after
        })
    })
}

fn assert_clean_exit(run: &Output, allowed: &[i32], what: &str) {
    let err = text(&run.stderr);
    assert!(!err.contains("panicked"), "{what}: panicked: {err}");
    assert!(
        run.status.code().is_some_and(|c| allowed.contains(&c)),
        "{what}: exit {:?}, expected one of {allowed:?}: {err}",
        run.status.code()
    );
    assert!(!non_finite(&text(&run.stdout)), "{what}: stdout");
}

fn outputs_are_finite(dir: &Path) {
    for e in std::fs::read_dir(dir).into_iter().flatten().flatten() {
        let t = std::fs::read_to_string(e.path()).unwrap_or_default();
        assert!(
            !non_finite(&t),
            "{} holds a non-finite number",
            e.path().display()
        );
    }
}

/// The starter-like pit of the corpus, with `extra` appended.
fn pit(extra: &str) -> String {
    format!(
        r#"[site]
name = "Robustness pit"
ground_level = "10.0 m"

[aquifer]
kind = "unconfined"
conductivity = "2e-4 m/s"
base_level = "-6.0 m"
groundwater_level = "8.5 m"
specific_yield = 0.15

[[excavation]]
name = "Pit A"
outline = [[0, 0], [30, 0], [30, 20], [0, 20]]
formation_level = "5.0 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"

[wells]
radius = "0.15 m"
{extra}"#
    )
}

fn write(dir: &Path, name: &str, body: &str) -> PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, body).expect("write");
    p
}

#[test]
fn dev_zero_and_a_huge_file_are_refused_quickly_with_the_cap() {
    let run = drydig(&["estimate", "/dev/zero"]);
    assert_clean_exit(&run, &[2], "/dev/zero");
    assert!(
        text(&run.stderr).contains("not a regular file"),
        "{}",
        text(&run.stderr)
    );
    let d = tempfile::tempdir().unwrap();
    let mut body = pit("");
    body.push_str(&format!("# {}\n", "x".repeat(17 << 20)));
    let p = write(d.path(), "huge.toml", &body);
    let run = drydig(&["estimate", p.to_str().unwrap()]);
    assert_clean_exit(&run, &[2], "17 MiB file");
    assert!(text(&run.stderr).contains("16 MiB"));
}

#[test]
fn eleven_thousand_named_points_are_refused_naming_the_list() {
    let d = tempfile::tempdir().unwrap();
    let points: String = (0..11_000)
        .map(|i| {
            format!(
                "\n[[checks.point]]\nname = \"P{i}\"\nx = {}\ny = {}\n",
                i % 100,
                i / 100
            )
        })
        .collect();
    let p = write(d.path(), "points.toml", &pit(&points));
    let run = drydig(&["estimate", p.to_str().unwrap()]);
    assert_clean_exit(&run, &[2], "11 000 points");
    let err = text(&run.stderr);
    assert!(
        err.contains("checks.point") && err.contains("11000"),
        "{err}"
    );
}

#[test]
fn layouts_too_big_to_build_are_refused_naming_the_setting() {
    let d = tempfile::tempdir().unwrap();
    // common practice (no source): no site needs 10⁵ wells; a 1 mm spacing is a unit slip.
    for (extra, setting) in [
        (
            "[layout]\nkind = \"ring\"\nmax_spacing = \"1 mm\"\nrate = \"2 L/s\"\n",
            "layout.max_spacing",
        ),
        (
            "[layout]\nkind = \"line\"\nspacing = \"1 mm\"\nrate = \"0.2 L/s\"\n",
            "layout.spacing",
        ),
    ] {
        let p = write(d.path(), "big.toml", &pit(extra));
        let out = d.path().join("out");
        let run = drydig(&["check", p.to_str().unwrap(), "-o", out.to_str().unwrap()]);
        assert_clean_exit(&run, &[2], setting);
        let err = text(&run.stderr);
        assert!(err.contains(setting) && err.contains("wells"), "{err}");
        assert!(!out.exists(), "nothing written on bad input");
    }
}

#[test]
fn sweep_steps_that_are_not_finite_or_too_many_are_refused() {
    let trench = layout("pipeline_trench.toml");
    let basement = layout("riverside_basement.toml");
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("sweep");
    let o = out.to_str().unwrap();
    for args in [
        vec![
            "sweep",
            trench.to_str().unwrap(),
            "--from",
            "1",
            "--to",
            "2",
            "--step",
            "NaN",
            "-o",
            o,
        ],
        vec![
            "sweep",
            trench.to_str().unwrap(),
            "--from",
            "1",
            "--to",
            "1e300",
            "--step",
            "1e-300",
            "-o",
            o,
        ],
        vec![
            "sweep",
            basement.to_str().unwrap(),
            "--from",
            "4",
            "--to",
            "1e300",
            "-o",
            o,
        ],
    ] {
        let run = drydig(&args);
        assert_clean_exit(&run, &[2], &args.join(" "));
    }
}

#[test]
fn a_thick_neighbour_layer_is_sliced_within_bounds() {
    let d = tempfile::tempdir().unwrap();
    let extra = "[layout]\nkind = \"ring\"\ncount = 6\nrate = \"3 L/s\"\n\n[[neighbour]]\nname = \"Deep clay house\"\nfootprint = [[0, 40], [30, 40], [30, 52], [0, 52]]\nallowable_settlement = \"25 mm\"\n\n[[neighbour.layer]]\nname = \"clay\"\nthickness = \"9000 m\"\nm_v = \"3e-4 1/kPa\"\n";
    let p = write(d.path(), "thick.toml", &pit(extra));
    let out = d.path().join("out");
    let run = drydig(&["check", p.to_str().unwrap(), "-o", out.to_str().unwrap()]);
    assert_clean_exit(&run, &[0, 3], "9 km layer");
    outputs_are_finite(&out);
}

/// A circular shaft outline of `n` vertices (radius 7 m).
fn shaft_with(n: usize) -> String {
    let src = std::fs::read_to_string(layout("deep_shaft.toml")).unwrap();
    let pts: Vec<String> = (0..n)
        .map(|i| {
            let a = std::f64::consts::TAU * i as f64 / n as f64;
            format!("[{:.9}, {:.9}]", 7.0 * a.cos(), 7.0 * a.sin())
        })
        .collect();
    let start = src.find("outline = [[").unwrap();
    let end = start + src[start..].find("]]").unwrap() + 2;
    format!(
        "{}outline = [{}]{}",
        &src[..start],
        pts.join(", "),
        &src[end..]
    )
}

#[test]
fn an_outline_of_a_hundred_thousand_vertices_is_checked() {
    // The R-tree simple-polygon test and the 1 mm simplification keep this near-linear; in a
    // debug build it took about 2 s of CPU (scripts/bench.sh is where speed is measured).
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "shaft.toml", &shaft_with(100_000));
    let out = d.path().join("out");
    let run = drydig(&["check", p.to_str().unwrap(), "-o", out.to_str().unwrap()]);
    assert_clean_exit(&run, &[0, 3], "1e5 vertices");
    outputs_are_finite(&out);
    // More than MAX_VERTICES is refused, naming the outline.
    let p = write(d.path(), "shaft2.toml", &shaft_with(100_001));
    let run = drydig(&["estimate", p.to_str().unwrap()]);
    assert_clean_exit(&run, &[2], "1e5+1 vertices");
    assert!(text(&run.stderr).contains("excavation[1].outline"));
}

/// Every number in `csv` text of check points: (name, drawdown).
fn drawdowns(csv: &str) -> Vec<(String, f64)> {
    let mut r = csv::Reader::from_reader(csv.as_bytes());
    let h = r.headers().unwrap().clone();
    let i = h.iter().position(|c| c == "drawdown_m").unwrap();
    r.records()
        .map(|rec| {
            let rec = rec.unwrap();
            (rec[0].to_string(), rec[i].parse().unwrap())
        })
        .collect()
}

#[test]
fn far_coordinates_give_the_same_drawdowns_as_near_ones() {
    // A shift of the whole site by 4.5e6 m (a UTM-like northing) changes nothing: the doubles
    // there are 1e-9 m apart (IEEE 754), and the kernel works on coordinates about a site origin.
    let src = std::fs::read_to_string(layout("deep_shaft.toml")).unwrap();
    let start = src.find("outline = [[").unwrap();
    let end = start + src[start..].find("]]").unwrap() + 2;
    let pts: Vec<Vec<f64>> = toml::from_str::<toml::Table>(&src[start..end]).unwrap()["outline"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| {
            p.as_array()
                .unwrap()
                .iter()
                .map(|v| v.as_float().unwrap())
                .collect()
        })
        .collect();
    let shifted: Vec<String> = pts
        .iter()
        .map(|p| format!("[{}, {}]", p[0] + 500_000.0, p[1] + 4_500_000.0))
        .collect();
    let far = format!(
        "{}outline = [{}]{}",
        &src[..start],
        shifted.join(", "),
        &src[end..]
    );
    let d = tempfile::tempdir().unwrap();
    let near_p = write(d.path(), "near.toml", &src);
    let far_p = write(d.path(), "far.toml", &far);
    let (a, b) = (d.path().join("a"), d.path().join("b"));
    for (p, o) in [(&near_p, &a), (&far_p, &b)] {
        let run = drydig(&["check", p.to_str().unwrap(), "-o", o.to_str().unwrap()]);
        assert_clean_exit(&run, &[0, 3], "shaft");
    }
    let da = drawdowns(&std::fs::read_to_string(a.join("checkpoints.csv")).unwrap());
    let db = drawdowns(&std::fs::read_to_string(b.join("checkpoints.csv")).unwrap());
    assert_eq!(da.len(), db.len());
    for ((na, sa), (nb, sb)) in da.iter().zip(&db) {
        assert_eq!(na, nb);
        assert!((sa - sb).abs() < 1e-3, "{na}: {sa} vs {sb}");
    }
}

#[test]
fn names_that_read_as_comments_or_formulas_survive_a_round_trip() {
    // RFC 4180 quoting and a leading apostrophe for =, +, -, @ (OWASP "CSV Injection"); `#` is
    // the comment mark drydig's CSV reader skips.
    let wells = [
        ("#W1", -4.0, 10.0),
        ("=SUM(A1)", 34.0, 10.0),
        ("-W3", 15.0, -4.0),
        ("+W4", 15.0, 24.0),
        ("@W5", -3.0, -3.0),
        ("W6, \"quoted\"", 33.0, 23.0),
    ];
    let listed: String = wells
        .iter()
        .map(|(n, x, y)| {
            format!(
                "\n[[well]]\nname = {}\nx = {x}\ny = {y}\nrate = \"1.7 L/s\"\n",
                toml::Value::String(n.to_string())
            )
        })
        .collect();
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "names.toml",
        &pit(&format!("[layout]\nkind = \"listed\"\n{listed}")),
    );
    let (a, b) = (d.path().join("a"), d.path().join("b"));
    let run = drydig(&["check", p.to_str().unwrap(), "-o", a.to_str().unwrap()]);
    assert_clean_exit(&run, &[0, 3], "listed");
    let csv_path = d.path().join("back.csv");
    std::fs::copy(a.join("wells.csv"), &csv_path).unwrap();
    let run = drydig(&[
        "check",
        p.to_str().unwrap(),
        "--wells",
        csv_path.to_str().unwrap(),
        "-o",
        b.to_str().unwrap(),
    ]);
    assert_clean_exit(&run, &[0, 3], "read back");
    // The same wells and the same numbers, byte for byte.
    for f in ["checkpoints.csv", "wells.csv"] {
        assert_eq!(
            std::fs::read_to_string(a.join(f)).unwrap(),
            std::fs::read_to_string(b.join(f)).unwrap(),
            "{f} differs after the round trip"
        );
    }
    let back = std::fs::read_to_string(a.join("wells.csv")).unwrap();
    assert_eq!(back.lines().count(), wells.len() + 1, "{back}");
}

#[test]
fn every_demo_reads_back_its_own_wells_csv_to_the_same_results() {
    for demo in ["deep_shaft.toml", "riverside_basement.toml"] {
        let d = tempfile::tempdir().unwrap();
        let (a, b) = (d.path().join("a"), d.path().join("b"));
        let f = layout(demo);
        let run = drydig(&["check", f.to_str().unwrap(), "-o", a.to_str().unwrap()]);
        assert_clean_exit(&run, &[0, 3], demo);
        let csv_path = d.path().join("w.csv");
        std::fs::copy(a.join("wells.csv"), &csv_path).unwrap();
        let run2 = drydig(&[
            "check",
            f.to_str().unwrap(),
            "--wells",
            csv_path.to_str().unwrap(),
            "-o",
            b.to_str().unwrap(),
        ]);
        assert_eq!(run.status.code(), run2.status.code(), "{demo}");
        assert_eq!(
            std::fs::read_to_string(a.join("checkpoints.csv")).unwrap(),
            std::fs::read_to_string(b.join("checkpoints.csv")).unwrap(),
            "{demo}"
        );
    }
}

#[test]
fn a_wells_csv_with_control_characters_or_too_many_rows_is_refused() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "pit.toml", &pit(""));
    let bad = write(
        d.path(),
        "bad.csv",
        "name,x,y,rate_l_per_s\n\"W\u{1b}[2J\",1,2,3\n",
    );
    let run = drydig(&[
        "check",
        p.to_str().unwrap(),
        "--wells",
        bad.to_str().unwrap(),
        "-o",
        d.path().join("o").to_str().unwrap(),
    ]);
    assert_clean_exit(&run, &[2], "control character in CSV");
    assert!(text(&run.stderr).contains("control character"));
    let mut rows = String::from("name,x,y,rate_l_per_s\n");
    for i in 0..20_001 {
        rows.push_str(&format!("W{i},{},{},0.1\n", -5 - i % 50, i / 50));
    }
    let many = write(d.path(), "many.csv", &rows);
    let run = drydig(&[
        "check",
        p.to_str().unwrap(),
        "--wells",
        many.to_str().unwrap(),
        "-o",
        d.path().join("o").to_str().unwrap(),
    ]);
    assert_clean_exit(&run, &[2], "20 001 rows");
    assert!(text(&run.stderr).contains("20000"), "{}", text(&run.stderr));
    let far = write(d.path(), "far.csv", "name,x,y,rate_l_per_s\nW1,1e300,0,1\n");
    let run = drydig(&[
        "check",
        p.to_str().unwrap(),
        "--wells",
        far.to_str().unwrap(),
        "-o",
        d.path().join("o").to_str().unwrap(),
    ]);
    assert_clean_exit(&run, &[2], "far CSV well");
}

/// Paths to every number in a TOML document (bare numbers and quantity strings).
fn numeric_paths(v: &toml::Value, path: &mut Vec<String>, out: &mut Vec<Vec<String>>) {
    match v {
        toml::Value::Table(t) => {
            for (k, x) in t {
                path.push(k.clone());
                numeric_paths(x, path, out);
                path.pop();
            }
        }
        toml::Value::Array(a) => {
            for (i, x) in a.iter().enumerate() {
                path.push(i.to_string());
                numeric_paths(x, path, out);
                path.pop();
            }
        }
        toml::Value::Integer(_) | toml::Value::Float(_) => out.push(path.clone()),
        toml::Value::String(s) => {
            let starts_numeric = s
                .trim_start()
                .starts_with(|c: char| c.is_ascii_digit() || c == '-' || c == '.');
            if starts_numeric {
                out.push(path.clone());
            }
        }
        _ => {}
    }
}

fn set_at(v: &mut toml::Value, path: &[String], extreme: f64) {
    let Some((head, rest)) = path.split_first() else {
        *v = match v {
            toml::Value::Integer(_) if extreme.is_finite() && extreme.abs() < 9e18 => {
                toml::Value::Integer(extreme as i64)
            }
            toml::Value::String(s) => {
                let unit = s
                    .trim()
                    .trim_start_matches(|c: char| c.is_ascii_digit() || "+-.eE".contains(c))
                    .to_string();
                toml::Value::String(format!("{extreme:e}{unit}"))
            }
            _ => toml::Value::Float(extreme),
        };
        return;
    };
    match v {
        toml::Value::Table(t) => set_at(t.get_mut(head).unwrap(), rest, extreme),
        toml::Value::Array(a) => set_at(&mut a[head.parse::<usize>().unwrap()], rest, extreme),
        _ => unreachable!(),
    }
}

const DEMOS: &[&str] = &[
    "deep_shaft.toml",
    "leaky_underpass.toml",
    "pipeline_trench.toml",
    "riverside_basement.toml",
    "riverside_basement_recharge.toml",
];

const EXTREMES: &[f64] = &[
    0.0,
    -0.0,
    1e-300,
    -1e-300,
    1e-12,
    1e300,
    -1e300,
    f64::MAX,
    1e9,
    -1e9,
    1e7,
    3e4,
    -1.0,
    1e-3,
    f64::INFINITY,
    f64::NAN,
];

proptest! {
    // Kept small (each case runs the binary, up to a few seconds in a debug build).
    #![proptest_config(ProptestConfig { cases: 28, failure_persistence: None, ..ProptestConfig::default() })]
    #[test]
    fn any_number_of_any_demo_set_to_an_extreme_gives_a_clean_answer(
        demo in 0..DEMOS.len(),
        pick in any::<prop::sample::Index>(),
        extreme in 0..EXTREMES.len(),
    ) {
        let path = layout(DEMOS[demo]);
        let src = std::fs::read_to_string(&path).unwrap();
        let mut doc: toml::Value = toml::from_str(&src).unwrap();
        let mut paths = Vec::new();
        numeric_paths(&doc, &mut Vec::new(), &mut paths);
        let target = pick.get(&paths).clone();
        set_at(&mut doc, &target, EXTREMES[extreme]);
        let body = toml::to_string(&doc).unwrap();
        // Keep the demo's folder so relative paths (a layout CSV, drawings) still resolve.
        let dir = tempfile::tempdir_in(path.parent().unwrap().parent().unwrap().join("target")).unwrap();
        let p = dir.path().join("mutated.toml");
        std::fs::write(&p, &body).unwrap();
        for entry in std::fs::read_dir(path.parent().unwrap()).unwrap().flatten() {
            if entry.path().is_dir() {
                continue;
            }
            let name = entry.file_name();
            if name.to_string_lossy().ends_with(".csv") {
                std::fs::copy(entry.path(), dir.path().join(name)).unwrap();
            }
        }
        let what = format!("{} {} = {:e}", DEMOS[demo], target.join("."), EXTREMES[extreme]);
        let run = drydig(&["estimate", p.to_str().unwrap()]);
        assert_clean_exit(&run, &[0, 2], &what);
        if run.status.code() == Some(0) {
            let out = dir.path().join("out");
            let run = drydig(&["check", p.to_str().unwrap(), "-o", out.to_str().unwrap()]);
            assert_clean_exit(&run, &[0, 2, 3], &what);
            outputs_are_finite(&out);
        }
    }
}
