//! One verdict, one wording: the terminal's RESULT line, the result paragraph of report.html,
//! the result row of map.svg (its colour from the verdict) and the exit code agree on every
//! verdict the demos reach. Exit codes: 0 met, 3 computed but not met (common practice (no
//! source): a script tells a failed check from a passed one without reading text; documented in
//! `drydig --help` and DEVELOPERS.md).

use std::path::Path;
use std::process::Command;

/// The failure colour of the map (the map draws only the verdict row in it).
const FAIL: &str = "#d7191c";

struct Seen {
    code: i32,
    terminal: String,
    html_result: String,
    html_bad: bool,
    map_fill: String,
    map_first_words: String,
}

fn run(demo: &str, command: &str) -> Seen {
    let dir = tempfile::tempdir().unwrap();
    let file = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(demo);
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args([command, file.to_str().unwrap(), "-o"])
        .arg(dir.path())
        .output()
        .unwrap();
    let stdout = String::from_utf8_lossy(&out.stdout).into_owned();
    let terminal = stdout
        .lines()
        .find_map(|l| l.strip_prefix("RESULT: "))
        .unwrap_or_else(|| panic!("no RESULT line: {stdout}"))
        .to_string();
    let html = std::fs::read_to_string(dir.path().join("report.html")).unwrap();
    let p = html.find("<p class=\"result").expect("result paragraph");
    let rest = &html[p..];
    let html_bad = rest.starts_with("<p class=\"result bad\"");
    let start = rest.find('>').unwrap() + 1;
    let html_result = rest[start..rest.find("</p>").unwrap()].to_string();
    let map = std::fs::read_to_string(dir.path().join("map.svg")).unwrap();
    let at = map.find("Result: ").expect("result row on the map");
    let open = map[..at].rfind("<text").unwrap();
    let tag = &map[open..at];
    let fill = tag.split("fill=\"").nth(1).unwrap();
    let map_fill = fill[..fill.find('"').unwrap()].to_string();
    let map_first_words = map[at..at + map[at..].find('<').unwrap()]
        .trim()
        .to_string();
    Seen {
        code: out.status.code().unwrap(),
        terminal,
        html_result,
        html_bad,
        map_fill,
        map_first_words,
    }
}

fn agree(demo: &str, command: &str, met: bool, words: &str) {
    let s = run(demo, command);
    assert!(
        s.terminal.contains(words),
        "{demo} {command}: {}",
        s.terminal
    );
    assert_eq!(s.code, if met { 0 } else { 3 }, "{demo} {command}");
    // The same wording, HTML-escaped, in the report.
    let escaped = s.terminal.replace('&', "&amp;").replace('<', "&lt;");
    assert_eq!(
        s.html_result,
        format!("Result: {escaped}"),
        "{demo} {command}"
    );
    assert_eq!(s.html_bad, !met, "{demo} {command}");
    // The map wraps the row; its first line is the start of the same wording.
    let first = s.map_first_words.trim_start_matches("Result: ");
    assert!(
        s.terminal.starts_with(first),
        "{demo} {command}: map {:?} vs {:?}",
        s.map_first_words,
        s.terminal
    );
    assert_eq!(s.map_fill == FAIL, !met, "{demo} {command}: {}", s.map_fill);
}

#[test]
fn met_reads_the_same_everywhere_and_exits_zero() {
    agree("deep_shaft.toml", "check", true, "every target met");
}

#[test]
fn wells_over_their_limits_read_the_same_everywhere() {
    // The trench's wellpoints run above their suction limit in `check` (the design file's
    // rates); targets are met, but the verdict is not met.
    agree(
        "pipeline_trench.toml",
        "check",
        false,
        "wells over their limits",
    );
}

#[test]
fn a_neighbour_over_a_limit_reads_the_same_everywhere() {
    agree(
        "riverside_basement.toml",
        "check",
        false,
        "neighbours over a limit",
    );
}

#[test]
fn targets_not_met_read_the_same_everywhere() {
    agree(
        "riverside_basement_recharge.toml",
        "check",
        false,
        "check points above target",
    );
}

#[test]
fn a_design_with_no_layout_meeting_reads_the_same_everywhere() {
    agree(
        "riverside_basement_recharge.toml",
        "design",
        false,
        "no layout tried meets every target",
    );
}
