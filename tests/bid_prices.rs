//! Prices against the bid in the user's units: a US prices file prices the US bid to a total
//! worked out by hand below; units that do not fit are refused, never multiplied silently; a
//! duplicated item, a price that overflows, and a prices file in the output folder are refused.

use drydig::field::wells::Well;
use drydig::input::model::Model;
use drydig::input::prices::{read, Price};
use drydig::input::units::UnitSystem;
use drydig::input::validate::file::load;
use drydig::bid::quantities::bid;
use drydig::report::bid_out::{bid_csv, costs, lines, BidLine};
use std::path::Path;
use std::process::Command;

const FOOT: f64 = 0.3048;
/// 200 US gpm in m³/s (1 US gal = 3.785411784 L, exact).
const GPM_200: f64 = 200.0 * 3.785_411_784e-3 / 60.0;

/// The US demo (`units = "us"`) with one duty of 200 gpm, no capacity cap and no standby, and
/// four wells at the corners of a 100 ft square pumping 5 L/s each.
fn us_bid_lines() -> (Model, Vec<BidLine>) {
    let mut model = load(Path::new("layouts/leaky_underpass.toml")).expect("demo loads");
    assert_eq!(model.units, UnitSystem::Us);
    model.design.pumps.duties = vec![GPM_200];
    model.wells.pump_capacity = None;
    model.wells.standby = 0;
    let side = 100.0 * FOOT;
    let wells: Vec<Well> = [[0.0, 0.0], [side, 0.0], [side, side], [0.0, side]]
        .iter()
        .enumerate()
        .map(|(i, p)| Well::from_spec(format!("W{}", i + 1), *p, 0.005, &model.wells))
        .collect();
    let levels = vec![Some(-10.0); wells.len()];
    let b = bid(&model, &wells, &[], &levels);
    let l = lines(&b, 0.02, UnitSystem::Us);
    (model, l)
}

fn write_prices(name: &str, text: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("drydig-prices-{}-{name}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join("prices.csv");
    std::fs::write(&p, text).unwrap();
    p
}

#[test]
fn a_us_prices_file_prices_the_us_bid() {
    let (_, l) = us_bid_lines();
    let find = |item: &str| l.iter().find(|x| x.item == item).unwrap();
    // Hand: depth per well = ground 3.0 m − screen base −15.0 m + 1.0 m sump = 19.0 m
    // = 62.3360 ft; screen −2.5 − (−15.0) = 12.5 m = 41.0105 ft; 4 wells.
    assert_eq!(find("drilling").unit, "ft");
    assert!((find("drilling").quantity - 249.3438).abs() < 1e-3);
    assert!((find("screen").quantity - 164.0420).abs() < 1e-3);
    // Collecting main: three sides of the 100 ft square = 300 ft.
    assert!((find("collecting main").quantity - 300.0).abs() < 1e-9);
    // Pumps named by their duty in gpm.
    assert_eq!(find("pumps 200 gpm").quantity, 4.0);
    let path = write_prices(
        "us",
        "item,price,unit\ndrilling,40,ft\nscreen [ft],65,\npumps 200 gpm,3500,each\ncollecting main per ft,12,\n",
    );
    let prices = read(&path).expect("prices read");
    let (c, total, unused) = costs(&l, &prices).expect("priced");
    assert_eq!(c.len(), 4, "{c:?}");
    assert!(unused.is_empty(), "{unused:?}");
    // Hand total: 249.343832 ft × 40 = 9 973.75; 164.041995 ft × 65 = 10 662.73;
    // 4 × 3 500 = 14 000; 300 ft × 12 = 3 600; total 38 236.48.
    assert!((total - 38_236.48).abs() < 0.01, "{total}");
    let csv = String::from_utf8(bid_csv(&l, Some(&prices)).unwrap()).unwrap();
    assert!(csv.contains("38236.48"), "{csv}");
    assert!(!csv.contains(",m,") && !csv.contains("m³"), "{csv}");
}

#[test]
fn a_price_per_metre_is_converted_to_the_foot_and_a_wrong_unit_refused() {
    let (_, l) = us_bid_lines();
    // 131.2336 per m = 40 per ft (1 ft = 0.3048 m): the same drilling cost as above.
    let per_m = [Price::new("drilling", 40.0 / FOOT, Some("m"))];
    let (_, total, _) = costs(&l, &per_m).unwrap();
    assert!((total - 9_973.75).abs() < 0.01, "{total}");
    // A pump duty given in L/s prices the gpm line (12.618 L/s = 200 gpm).
    let per_ls = [Price::new("pumps 12.618 L/s", 3500.0, None)];
    let (c, _, _) = costs(&l, &per_ls).unwrap();
    assert_eq!(c.len(), 1);
    // No unit on a length line, or a unit of another kind: refused, naming the unit.
    let e = costs(&l, &[Price::new("drilling", 40.0, None)]).unwrap_err();
    assert!(
        e.message.contains("no unit") && e.message.contains("ft"),
        "{e}"
    );
    let e = costs(&l, &[Price::new("drilling", 40.0, Some("kWh"))]).unwrap_err();
    assert!(e.message.contains("kWh") && e.message.contains("ft"), "{e}");
}

#[test]
fn duplicated_and_overflowing_prices_are_refused() {
    let path = write_prices(
        "dup",
        "item,price,unit\ndrilling,40,ft\nscreen,65,ft\nDrilling ,45,ft\n",
    );
    let e = read(&path).unwrap_err();
    assert!(e.message.contains("lines 2 and 4"), "{e}");
    assert_eq!(e.line, Some(4));
    let path = write_prices(
        "dup_pumps",
        "item,price\npumps 200 gpm,1\npumps 12.618 L/s,2\n",
    );
    assert!(read(&path).unwrap_err().message.contains("lines 2 and 3"));
    let (_, l) = us_bid_lines();
    let huge = [Price::new("drilling", 1e308, Some("ft"))];
    let e = costs(&l, &huge).unwrap_err();
    assert!(e.message.contains("not a finite number"), "{e}");
    assert!(bid_csv(&l, Some(&huge)).is_err());
}

fn drydig() -> Command {
    Command::new(env!("CARGO_BIN_EXE_drydig"))
}

#[test]
fn design_refuses_its_own_prices_file_as_output_and_lists_it_as_input() {
    let dir = std::env::temp_dir().join(format!("drydig-prices-cli-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let prices = dir.join("bid.csv");
    let text = "item,price,unit\ndrilling,40,ft\n";
    std::fs::write(&prices, text).unwrap();
    let out = drydig()
        .args(["design", "layouts/leaky_underpass.toml", "--prices"])
        .arg(&prices)
        .arg("-o")
        .arg(&dir)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2), "{out:?}");
    assert!(String::from_utf8_lossy(&out.stderr).contains("overwrite"));
    assert_eq!(std::fs::read_to_string(&prices).unwrap(), text);
    // Written elsewhere, the prices file is one of the run's inputs in the manifest.
    let out_dir = dir.join("out");
    let out = drydig()
        .args(["design", "layouts/leaky_underpass.toml", "--prices"])
        .arg(&prices)
        .arg("-o")
        .arg(&out_dir)
        .output()
        .unwrap();
    assert!(matches!(out.status.code(), Some(0 | 3)), "{out:?}");
    let manifest = std::fs::read_to_string(out_dir.join("drydig-run.json")).unwrap();
    assert!(
        manifest.contains("bid.csv") && manifest.contains("prices-cli"),
        "{manifest}"
    );
    let bid = std::fs::read_to_string(out_dir.join("bid.csv")).unwrap();
    assert!(bid.contains("drilling") && bid.contains(",ft,"), "{bid}");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn prices_corpus_is_refused_with_its_reason() {
    // tests/bad_inputs/prices/: each file is refused (reading, or pricing the US bid) with a
    // message naming the line and what is wrong.
    let (_, l) = us_bid_lines();
    let cases = [
        ("duplicate_item.csv", "lines 2 and 4"),
        ("price_1e308.csv", "not a finite number"),
        ("unit_of_another_kind.csv", "kWh"),
        ("length_without_unit.csv", "no unit"),
        ("unknown_unit.csv", "furlong"),
    ];
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad_inputs/prices");
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), cases.len());
    for (file, fragment) in cases {
        let e = match read(&dir.join(file)) {
            Err(e) => e,
            Ok(p) => costs(&l, &p).expect_err(file),
        };
        assert!(e.message.contains(fragment), "{file}: {e}");
        assert!(
            e.line.is_some() && e.to_string().contains(file),
            "{file}: {e}"
        );
    }
}
