//! US-unit runs of every command on every demo carry no SI unit in what a person reads: the
//! terminal text, the visible text of report.html, the text of every SVG (maps, charts,
//! section) and the human columns of every CSV. SI machine columns (a CSV column named with its
//! SI unit, `x_m`, `rate_l_per_s`, `level_m W01`) are allowed beside the US ones; JSON, GeoJSON
//! and DXF are machine files and not read here. The user's own words (names, the datum text)
//! are theirs and are taken out before the search.
//!
//! What counts as SI: the unit symbols of SI practice (m, mm, m², m³, m/s, m³/day, L/s, kPa,
//! kN …), as a word of their own or straight after a number ("6.28 m", "3m"); the US words are
//! ft, in, ft², gal, gpm, psf, psi (NIST SP 811 (2008), Appendix B names both sets).
//!

use std::path::{Path, PathBuf};
use std::process::Command;

fn manifest() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// Every demo design file.
fn demos() -> Vec<PathBuf> {
    let mut v: Vec<PathBuf> = std::fs::read_dir(manifest().join("layouts"))
        .unwrap()
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .collect();
    v.sort();
    v
}

/// The SI unit symbols looked for.
const SI: &[&str] = &[
    "m", "mm", "cm", "km", "m²", "m³", "m2", "m3", "m/s", "m/d", "m/day", "m²/s", "m2/s", "m²/day",
    "m³/s", "m³/d", "m³/day", "m3/d", "m3/day", "L/s", "l/s", "L/min", "kPa", "MPa", "Pa", "kN",
    "kN/m²", "kN/m³", "kN/m2", "kN/m3",
];

/// Whether `token` (a word of the text) is an SI unit, alone or after its number ("3m").
fn is_si(token: &str) -> bool {
    let unit =
        token.trim_start_matches(|c: char| c.is_ascii_digit() || "+-−.,\u{2009}".contains(c));
    SI.contains(&unit)
}

/// The SI tokens of `text`, each with some context.
fn si_tokens(text: &str) -> Vec<String> {
    let mut hits = Vec::new();
    let words: Vec<&str> = text
        .split(|c: char| c.is_whitespace() || "()[]{},;:=\"'<>|×·…".contains(c))
        .collect();
    for (i, w) in words.iter().enumerate() {
        let w = w.trim_end_matches(['.', '!', '?']);
        if is_si(w) {
            let from = i.saturating_sub(4);
            let to = (i + 3).min(words.len());
            hits.push(format!("«{}» in “{}”", w, words[from..to].join(" ")));
        }
    }
    hits
}

/// The user's own words in a design file: names, the datum text, notes.
fn own_words(design: &Path) -> Vec<String> {
    let text = std::fs::read_to_string(design).unwrap_or_default();
    let mut out = Vec::new();
    for line in text.lines() {
        let Some((key, value)) = line.split_once('=') else {
            continue;
        };
        let key = key.trim();
        if [
            "name",
            "datum",
            "stage",
            "note",
            "description",
            "title",
            "crs",
        ]
        .contains(&key)
            || key.ends_with("_name")
        {
            let v = value.trim().trim_matches('"');
            if !v.is_empty() {
                out.push(v.to_string());
            }
        }
    }
    // longest first, so a name containing another is taken out whole
    out.sort_by_key(|s| std::cmp::Reverse(s.len()));
    out
}

/// `text` without the user's `words`; runs of white space count as one space on both sides, so
/// a name or datum wrapped over two lines of a map is still found.
fn without(text: &str, words: &[String]) -> String {
    let one_space = |s: &str| s.split_whitespace().collect::<Vec<_>>().join(" ");
    let mut t = one_space(text);
    for w in words {
        t = t.replace(&one_space(w), " ");
        t = t.replace(&one_space(&esc(w)), " ");
    }
    t
}

fn esc(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
        .replace('\'', "&#39;")
}

/// The text between `<text …>` / `<tspan …>` / `<title>` tags of an SVG.
fn svg_text(svg: &str) -> String {
    let mut out = String::new();
    for tag in ["<text", "<tspan", "<title"] {
        for part in svg.split(tag).skip(1) {
            if let Some((_, rest)) = part.split_once('>') {
                let end = rest.find('<').unwrap_or(rest.len());
                out.push_str(&rest[..end]);
                out.push('\n');
            }
        }
    }
    out
}

/// The visible text of an HTML page: tags, scripts and styles removed.
fn html_text(html: &str) -> String {
    let mut s = html.to_string();
    for (open, close) in [("<script", "</script>"), ("<style", "</style>")] {
        while let Some(a) = s.find(open) {
            let b = s[a..].find(close).map_or(s.len(), |b| a + b + close.len());
            s.replace_range(a..b, " ");
        }
    }
    let mut out = String::new();
    let mut inside = false;
    for c in s.chars() {
        match c {
            '<' => inside = true,
            '>' => {
                inside = false;
                out.push(' ');
            }
            c if !inside => out.push(c),
            _ => {}
        }
    }
    out.replace("&amp;", "&")
        .replace("&lt;", "<")
        .replace("&gt;", ">")
        .replace("&quot;", "\"")
        .replace("&#39;", "'")
}

/// A CSV column named with an SI unit: a machine column, allowed.
fn si_machine_column(header: &str) -> bool {
    let h = header.trim().to_lowercase();
    let first = h.split_whitespace().next().unwrap_or("");
    [
        "_m",
        "_m2",
        "_m3",
        "_mm",
        "_l_per_s",
        "_m3_per_day",
        "_m3_per_s",
        "_m_per_s",
        "_m2_per_s",
        "_kpa",
        "_kn",
    ]
    .iter()
    .any(|suffix| first.ends_with(suffix))
        || h.contains("_m_")
}

/// The human columns of a CSV (every cell of a column not named with an SI unit).
fn csv_human_text(csv: &str) -> String {
    let mut rows = csv.lines().filter(|l| !l.starts_with('#'));
    let Some(header) = rows.next() else {
        return String::new();
    };
    let keep: Vec<bool> = header.split(',').map(|h| !si_machine_column(h)).collect();
    let mut out = String::new();
    for row in rows {
        for (k, cell) in row.split(',').enumerate() {
            if keep.get(k).copied().unwrap_or(true) {
                out.push_str(cell);
                out.push(' ');
            }
        }
        out.push('\n');
    }
    out
}

/// What a person reads of one output file, or None for a machine file.
fn human_text(name: &str, bytes: &[u8]) -> Option<String> {
    let text = String::from_utf8_lossy(bytes);
    if name.ends_with(".svg") {
        Some(svg_text(&text))
    } else if name.ends_with(".html") {
        Some(html_text(&text))
    } else if name.ends_with(".csv") {
        Some(csv_human_text(&text))
    } else if name.ends_with(".txt") {
        Some(text.into_owned())
    } else {
        None
    }
}

/// Which outputs of a run are read.
#[derive(Clone, Copy, PartialEq)]
enum Read {
    /// The terminal text and every file.
    All,
    /// Only the files whose names end so (the parts of a run this branch formats).
    Files(&'static str),
}

/// Runs drydig with `args` (and an output folder unless `estimate`); returns every SI token
/// found in what `read` selects, each labelled with where it was found.
fn si_in_run(label: &str, args: &[&str], own: &[String], read: Read) -> Vec<String> {
    let out = tempfile::tempdir().unwrap();
    let mut cmd = Command::new(env!("CARGO_BIN_EXE_drydig"));
    cmd.args(args);
    if args[0] != "estimate" {
        cmd.arg("-o").arg(out.path());
    }
    let o = cmd.output().unwrap();
    let code = o.status.code();
    assert!(
        matches!(code, Some(0) | Some(3)),
        "{label}: exit {code:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    let mut found = Vec::new();
    let stdout = String::from_utf8_lossy(&o.stdout).replace(&out.path().display().to_string(), " ");
    if read == Read::All {
        for hit in si_tokens(&without(&stdout, own)) {
            found.push(format!("{label} terminal: {hit}"));
        }
    }
    let mut files: Vec<PathBuf> = std::fs::read_dir(out.path())
        .unwrap()
        .filter_map(|e| e.ok().map(|e| e.path()))
        .collect();
    files.sort();
    for f in files {
        let name = f.file_name().unwrap().to_string_lossy().into_owned();
        if matches!(read, Read::Files(end) if !name.ends_with(end)) {
            continue;
        }
        if let Some(text) = human_text(&name, &std::fs::read(&f).unwrap()) {
            for hit in si_tokens(&without(&text, own)) {
                found.push(format!("{label} {name}: {hit}"));
            }
        }
    }
    found
}

fn report(found: &[String]) -> String {
    let shown: Vec<&String> = found.iter().take(60).collect();
    format!(
        "{} SI tokens in US-unit output, first {}:\n{}",
        found.len(),
        shown.len(),
        shown
            .iter()
            .map(|s| s.as_str())
            .collect::<Vec<_>>()
            .join("\n")
    )
}

fn for_every_demo(
    command: &[&str],
    read: Read,
    extra: impl Fn(&Path) -> Option<Vec<String>>,
) -> Vec<String> {
    let mut found = Vec::new();
    for demo in demos() {
        let Some(more) = extra(&demo) else {
            continue;
        };
        let own = own_words(&demo);
        let path = demo.to_str().unwrap().to_string();
        let mut args: Vec<&str> = command.to_vec();
        args.push(&path);
        args.extend(["--units", "us"]);
        args.extend(more.iter().map(String::as_str));
        let label = format!(
            "{} {}",
            command.join(" "),
            demo.file_name().unwrap().to_string_lossy()
        );
        found.extend(si_in_run(&label, &args, &own, read));
    }
    found
}

fn has_section(demo: &Path, section: &str) -> bool {
    std::fs::read_to_string(demo).is_ok_and(|t| t.lines().any(|l| l.trim() == section))
}

fn layout_kind(demo: &Path) -> Option<String> {
    let text = std::fs::read_to_string(demo).ok()?;
    let table: toml::Table = toml::from_str(&text).ok()?;
    table
        .get("layout")?
        .get("kind")?
        .as_str()
        .map(str::to_string)
}

// ---------------------------------------------------------------------------------------------

#[test]
fn scanner_finds_si_and_passes_us() {
    // The scanner itself: a test that could not fail would prove nothing.
    assert_eq!(si_tokens("level 6.28 m is below").len(), 1);
    assert_eq!(si_tokens("pump capacity 6.40 L/s").len(), 1);
    assert_eq!(si_tokens("drawdown (m)").len(), 1);
    assert_eq!(si_tokens("volume 25 160 m³ over").len(), 1);
    assert_eq!(si_tokens("uplift 12 kPa; 3m deep").len(), 2);
    assert!(si_tokens("level 20.6 ft (7.9 ft bgl), 82.4 gpm, 257 psf, 1 000 gal").is_empty());
    assert!(si_tokens("Theis, Cooper–Jacob, t*: R(t) = steady R, W(u)").is_empty());
    assert!(csv_human_text("name,x_m,rate_l_per_s,x_ft\nW1,3.0 m,2 L/s,9.8\n").contains("W1"));
    assert!(si_tokens(&csv_human_text("name,x_m,note\nW1,3.0,below 2 m\n")).len() == 1);
    assert!(si_tokens(&svg_text("<svg><text x=\"1\">depth (ft)</text></svg>")).is_empty());
    assert_eq!(
        si_tokens(&html_text("<p title=\"5 m\">5 <b>kPa</b></p>")).len(),
        1
    );
}

#[test]
fn estimate_in_us_units_carries_no_si() {
    let found = for_every_demo(&["estimate"], Read::All, |_| Some(Vec::new()));
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn programme_in_us_units_carries_no_si() {
    let found = for_every_demo(&["programme"], Read::All, |d| {
        has_section(d, "[programme]").then(Vec::new)
    });
    assert!(found.is_empty(), "{}", report(&found));
}

/// The sweep's bounds for a demo: counts on a ring, spacings in ft on a line; none for a
/// listed layout (not swept).
fn sweep_range(d: &Path) -> Option<Vec<String>> {
    match layout_kind(d).as_deref() {
        Some("ring") => Some(vec!["--from".into(), "5".into(), "--to".into(), "6".into()]),
        Some("line") => Some(vec![
            "--from".into(),
            "10 ft".into(),
            "--to".into(),
            "12 ft".into(),
            "--step".into(),
            "2 ft".into(),
        ]),
        _ => None,
    }
}

#[test]
fn sweep_chart_in_us_units_carries_no_si() {
    let found = for_every_demo(&["sweep"], Read::Files(".svg"), sweep_range);
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn sweep_table_in_us_units_carries_no_si() {
    // The table and sweep.csv are design_text's, the trial words (binding limit, placement)
    // the engine's.
    let found = for_every_demo(&["sweep"], Read::All, sweep_range);
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn pumping_test_in_us_units_carries_no_si() {
    // Kruseman & de Ridder (1994), Oude Korendijk: Q = 788 m³/d = 144.6 gpm, D = 7 m = 23 ft,
    // given as a US user would.
    let csv = manifest().join("tests/reference/pumping_test_oude_korendijk.csv");
    let found = si_in_run(
        "pumping-test",
        &[
            "pumping-test",
            csv.to_str().unwrap(),
            "--rate",
            "144.6 gpm",
            "--thickness",
            "23 ft",
            "--units",
            "us",
        ],
        &[],
        Read::All,
    );
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn design_by_day_in_us_units_carries_no_si() {
    // Layered ground and walls are refused by the time methods (tests/layers.rs,
    // tests/walls.rs), so not run here.
    let found = for_every_demo(&["design"], Read::All, |d| {
        (layout_kind(d).as_deref() == Some("ring")
            && !has_section(d, "[[layer]]")
            && !has_section(d, "[[wall]]"))
        .then(|| vec!["--by-day".into(), "30".into()])
    });
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn check_in_us_units_carries_no_si() {
    let found = for_every_demo(&["check"], Read::All, |_| Some(Vec::new()));
    assert!(found.is_empty(), "{}", report(&found));
}

#[test]
fn design_in_us_units_carries_no_si() {
    let found = for_every_demo(&["design"], Read::All, |_| Some(Vec::new()));
    assert!(found.is_empty(), "{}", report(&found));
}

/// The labels of `section.svg`'s distance axis (the text on the line under the plot).
fn chainage_labels(svg: &str) -> Vec<String> {
    svg.split("<text ")
        .skip(1)
        .filter(|t| t.contains("y=\"442.0\" text-anchor=\"middle\""))
        .filter_map(|t| t.split_once('>').map(|(_, rest)| rest))
        .filter_map(|rest| rest.split_once('<').map(|(label, _)| label.to_string()))
        .collect()
}

#[test]
fn section_axis_ticks_are_round_and_printed_as_they_are() {
    // The rule (common practice (no source)): ticks 1, 2 or 5 × 10ᵏ apart from 0, each label the
    // tick itself, never rounded to a neighbour (2.5 was printed "2", 7.5 "8").
    for units in ["si", "us"] {
        let out = tempfile::tempdir().unwrap();
        let demo = manifest().join("layouts/deep_shaft.toml");
        let o = Command::new(env!("CARGO_BIN_EXE_drydig"))
            .args(["check", demo.to_str().unwrap(), "--units", units, "-o"])
            .arg(out.path())
            .output()
            .unwrap();
        assert!(matches!(o.status.code(), Some(0) | Some(3)));
        let svg = std::fs::read_to_string(out.path().join("section.svg")).unwrap();
        let labels = chainage_labels(&svg);
        assert!(labels.len() >= 4, "{units}: {labels:?}");
        let values: Vec<f64> = labels.iter().map(|l| l.parse().unwrap()).collect();
        assert_eq!(values[0], 0.0, "{units}: {labels:?}");
        let step = values[1] - values[0];
        let mant = step / 10f64.powf(step.log10().floor());
        assert!(
            [1.0, 2.0, 5.0].iter().any(|m| (mant - m).abs() < 1e-9),
            "{units}: step {step} in {labels:?}"
        );
        for (k, v) in values.iter().enumerate() {
            assert!(
                (v - k as f64 * step).abs() < step * 1e-9,
                "{units}: {labels:?}"
            );
        }
    }
}
