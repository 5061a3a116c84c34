//! One name rule for every surface a name enters by (issue 19.2): what
//! `input::validate::ranges::name_problem` accepts is printable and passes the output guard
//! (`report::files::has_non_finite`, which refuses any output holding `NaN`/`inf` words), so a
//! name can never turn a good run into an internal error; what it refuses is refused by each
//! surface with exit 2.

use drydig::input::validate::ranges::name_problem;
use drydig::report::files::has_non_finite;
use proptest::prelude::*;
use std::process::Command;

proptest! {
    #![proptest_config(ProptestConfig { cases: 2000, failure_persistence: None, ..ProptestConfig::default() })]

    // Random names, biased towards the words and characters that matter.
    #[test]
    fn accepted_names_pass_the_output_guard(
        parts in proptest::collection::vec(
            prop_oneof![
                Just("NaN".to_string()), Just("inf".to_string()), Just("Infinity".to_string()),
                Just(" ".to_string()), Just("-".to_string()), Just("\u{1b}".to_string()),
                Just("\n".to_string()), "[a-zA-Z0-9]{0,4}", any::<char>().prop_map(String::from),
            ],
            0..8,
        )
    ) {
        let name: String = parts.concat();
        if name_problem(&name).is_none() {
            prop_assert!(!name.chars().any(char::is_control), "{name:?}");
            prop_assert!(has_non_finite(name.as_bytes()).is_none(), "{name:?}");
            prop_assert!(has_non_finite(format!("x,{name},1\n").as_bytes()).is_none(), "{name:?}");
        }
    }
}

// The --wells CSV applies the rule: "inf" as a well name is bad input (exit 2), not an
// internal error at the output guard (exit 1).
#[test]
fn wells_csv_name_inf_is_bad_input() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("wells.csv");
    std::fs::write(&f, "name,x,y,rate_l_per_s\ninf,-3,-3,4\nW2,59,-3,4\n").unwrap();
    let design = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/layouts/riverside_basement.toml"
    );
    let out = Command::new(env!("CARGO_BIN_EXE_drydig"))
        .args(["check", design, "--wells", f.to_str().unwrap(), "-o"])
        .arg(d.path().join("out"))
        .output()
        .unwrap();
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(err.contains("choose another name"), "{err}");
}

// Price items and pumping-test wells apply the same rule (names that would print as a
// non-finite number or move the terminal's cursor are refused, naming the row).
#[test]
fn price_items_and_pumping_test_wells_follow_the_name_rule() {
    let d = tempfile::tempdir().unwrap();
    for (item, hint) in [
        ("NaN", "choose another name"),
        ("well\u{7}", "control character"),
    ] {
        let f = d.path().join("prices.csv");
        std::fs::write(&f, format!("item,price\n{item},12.5\n")).unwrap();
        let e = drydig::input::prices::read(&f).unwrap_err();
        assert!(e.message.contains(hint) && e.line == Some(2), "{e}");
        let text = format!("well,distance [m],time [min],drawdown [m]\n{item},20,1,0.5\n");
        let e = drydig::test_analysis::csv_input::read_observations(&text, "obs").unwrap_err();
        assert!(e.contains(hint), "{e}");
        assert!(!e.contains('\u{7}'), "{e}");
    }
}
