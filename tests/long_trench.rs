//! Long trenches: the count search finds a layout for a 1 km trench at about the wellpoints per
//! metre of a 200 m one (issue 20), and says when its cap on wells keeps it from the spacing
//! limits.
//!
//! Reference: with a radius of influence much shorter than the trench (here R = 63 m), the
//! middle of a long trench draws only on the wells within R, so it needs the same wells per
//! metre as the middle of a short one; only the ends differ (flow to a line slot per metre of
//! slot does not depend on its length: common practice (no source); the line-slot formula per
//! unit length, from memory). The soil and wellpoints are the invented bench trench of
//! `examples/bench_kernel.rs`.

use drydig::input::model::Model;
use drydig::input::validate::file::from_str;
use drydig::optimise::outcome::Outcome;
use drydig::optimise::rates::RateOption;
use drydig::optimise::search::{design, MAX_WELLS};
use drydig::optimise::search_range::cap_note;
use drydig::optimise::trial::line_length;
use std::path::Path;

fn trench(length: f64, spacing_limits: &str) -> Model {
    let text = format!(
        r#"
[site]
name = "Invented trench"
ground_level = "11.0 m"

[aquifer]
kind = "unconfined"
conductivity = "5e-5 m/s"
base_level = "0.0 m"
groundwater_level = "10.0 m"
specific_yield = 0.1

[[excavation]]
name = "Trench"
outline = [[0, -1.5], [{length}, -1.5], [{length}, 1.5], [0, 1.5]]
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
{spacing_limits}

[layout]
kind = "line"
offset = "1.0 m"
spacing = "4.0 m"
sides = "both"
rate = "0.1 L/s"

# a valve on each wellpoint: the rates of issue 20 (grouped only to keep the programme small)
[pumps]
rates = "per-well"

[checks]
grid_spacing = "2 m"
"#
    );
    from_str(Path::new("trench.toml"), &text).expect("valid trench")
}

/// Fewest wellpoints per metre of line found by the design, and the count.
fn fewest_per_metre(m: &Model) -> (f64, usize) {
    let d = design(m, RateOption::Individual).expect("design runs");
    let Outcome::Met { count, .. } = d.outcome else {
        panic!("not met: {:?}; notes {:?}", d.outcome, d.notes);
    };
    let spec = m.layout.as_ref().expect("layout");
    (count as f64 / (2.0 * line_length(m, spec)), count)
}

#[test]
fn a_1_km_trench_needs_the_wellpoints_per_metre_of_a_200_m_one() {
    // The spacing limits bracket the answer (about 1.8 m) so that the test stays short; the
    // search still tries counts on both sides of it.
    let limits = "min_spacing = \"1.4 m\"\nmax_spacing = \"2.4 m\"";
    let (short, n_short) = fewest_per_metre(&trench(200.0, limits));
    let (long, n_long) = fewest_per_metre(&trench(1000.0, limits));
    assert!(
        (long / short - 1.0).abs() < 0.05,
        "200 m: {n_short} wells, {short:.3}/m; 1 km: {n_long} wells, {long:.3}/m"
    );
}

#[test]
fn the_cap_on_wells_is_said_when_a_trench_needs_more() {
    let m = trench(4000.0, "");
    let spec = m.layout.as_ref().expect("layout");
    let note = cap_note(&m, spec, MAX_WELLS)
        .expect("a 4 km line at 3 m needs over 2000 wells")
        .words(m.units);
    assert!(
        note.contains(&format!("at most {MAX_WELLS} wells"))
            && note.contains("wider than the maximum"),
        "{note}"
    );
    // a 200 m trench is within the cap at every spacing
    let short = trench(200.0, "");
    assert!(cap_note(&short, short.layout.as_ref().expect("layout"), MAX_WELLS).is_none());
}
