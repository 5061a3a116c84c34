//! Prices against the bid in the user's units and over its duration: an SI and a US prices file
//! price the bid to totals worked out by hand below (weekly hire × hire weeks, energy over the
//! pumping, days of work); units that do not fit are refused naming the price's line, never
//! multiplied silently (per day against a weekly hire, per week against metres); a duplicated
//! item, a price that overflows, and a prices file in the output folder are refused.

use drydig::bid::line::{BidLine, Category};
use drydig::bid::pricing::costs;
use drydig::bid::quantities::bid;
use drydig::bid::sheet::lines;
use drydig::field::wells::Well;
use drydig::input::model::Model;
use drydig::input::prices::{read, Price};
use drydig::input::units::UnitSystem;
use drydig::input::validate::file::load;
use drydig::report::bid_out::bid_csv;
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
    // 10 weeks of pumping ([bid] pumping_duration); every other [bid] setting at its default.
    model.bid.pumping_duration_s = Some(70.0 * 86_400.0);
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
fn a_us_prices_file_prices_the_us_bid_over_its_duration() {
    let (_, l) = us_bid_lines();
    let find = |item: &str| l.iter().find(|x| x.item == item).unwrap();
    // Hand: depth per well = ground 3.0 m − screen base −15.0 m + 1.0 m sump = 19.0 m
    // = 62.3360 ft; screen −2.5 − (−15.0) = 12.5 m = 41.0105 ft; 4 wells.
    assert_eq!(find("drilling").unit, "ft");
    assert!((find("drilling").quantity - 249.3438).abs() < 1e-3);
    assert!((find("screen").quantity - 164.0420).abs() < 1e-3);
    // Collecting main: three sides of the 100 ft square = 300 ft (91.44 m).
    assert!((find("collecting main").quantity - 300.0).abs() < 1e-9);
    // Pumps named by their duty in gpm.
    assert_eq!(find("pumps 200 gpm").quantity, 4.0);
    // Durations (defaults common practice (no source), src/input/model_bid.rs):
    // install = 4 wells ÷ 1 a day + 91.44 m ÷ 200 m a day = 4.46 → 5 days;
    // removal = 4 ÷ 4 + 91.44 ÷ 400 = 1.23 → 2 days; mobilise 2 days; pumping 70 days;
    // hire = (2 + 5 + 70 + 2) ÷ 7 = 11.29 → 12 weeks.
    assert_eq!(find("installation").quantity, 5.0);
    assert_eq!(find("removal").quantity, 2.0);
    assert_eq!(find("hire period").quantity, 12.0);
    assert_eq!(find("pumps 200 gpm").weeks, Some(12.0));
    assert_eq!(find("pumps 200 gpm").category, Category::HirePerWeek);
    // Running power, each well at 5 L/s from a level of −10.0 m (checks.md §15): lift 4.0 −
    // (−10.0) = 14.0 m (discharge 1 m above ground); riser 18.0 m of 100 mm at 5 L/s,
    // Hazen–Williams C 130: 0.09482 m; header half the main, 45.72 m of 200 mm at 20 L/s:
    // 0.10733 m; H = 14.20216 m; P = 1000 × 9.81 × 0.005 × 14.20216 / 0.6 = 1161.026 W;
    // 4 wells 4.644105 kW. Energy over the pumping = 4.644105 kW × 24 h × 70 days
    // = 7 802.096 kWh (not one day's 111.46 kWh).
    assert!(
        (find("energy").quantity - 7_802.096).abs() < 0.01,
        "{:?}",
        find("energy")
    );
    // Discharged volume = 20 L/s × 70 days = 120 960 m³ = 31 954 251.45 US gal.
    assert_eq!(find("discharged volume").unit, "gal");
    assert!((find("discharged volume").quantity - 31_954_251.45).abs() < 0.01);
    let path = write_prices(
        "us",
        "item,price,unit\ndrilling,40,ft\nscreen [ft],65,\npumps 200 gpm,120,week\ncollecting main per ft/week,0.75,\nenergy,0.12,kWh\ndischarged volume,0.25,kgal\n",
    );
    let prices = read(&path).expect("prices read");
    let c = costs(&l, &prices).expect("priced");
    assert_eq!(c.lines.len(), 6, "{c:?}");
    assert!(c.unused.is_empty(), "{:?}", c.unused);
    // Hand total:
    //   drilling        249.343832 ft × 40                = 9 973.75 (one-off)
    //   screen          164.041995 ft × 65                = 10 662.73 (capital)
    //   pumps 200 gpm   4 no. × 12 weeks × 120 a week     = 5 760.00 (hire)
    //   collecting main 300 ft × 12 weeks × 0.75 a ft-week = 2 700.00 (hire)
    //   energy          7 802.096 kWh × 0.12              = 936.25 (running)
    //   discharged      31 954.251 kgal × 0.25 a kgal     = 7 988.56 (running)
    //   total                                             = 38 021.30
    assert!((c.total - 38_021.30).abs() < 0.01, "{}", c.total);
    let sub = |cat: Category| c.subtotals.iter().find(|s| s.0 == cat).unwrap().1;
    assert!((sub(Category::HirePerWeek) - 8_460.00).abs() < 0.01);
    assert!((sub(Category::Running) - 8_924.81).abs() < 0.01);
    assert!((sub(Category::Capital) - 10_662.73).abs() < 0.01);
    assert!((sub(Category::OneOff) - 9_973.75).abs() < 0.01);
    let csv = String::from_utf8(bid_csv(&l, Some(&c)).unwrap()).unwrap();
    assert!(csv.contains("38021.30"), "{csv}");
    assert!(csv.contains("subtotal hire per week"), "{csv}");
    assert!(!csv.contains(",m,") && !csv.contains("m³"), "{csv}");
}

/// The SI shaft demo with four wells at the corners of a 20 m square pumping 5 L/s each, its
/// level at 0.0 m in every well, one duty of 8 L/s, no standby, 12 weeks of pumping.
fn si_bid_lines() -> Vec<BidLine> {
    let mut model = load(Path::new("layouts/deep_shaft.toml")).expect("demo loads");
    assert_eq!(model.units, UnitSystem::Si);
    model.design.pumps.duties = vec![0.008];
    model.wells.standby = 0;
    model.bid.pumping_duration_s = Some(84.0 * 86_400.0);
    let wells: Vec<Well> = [[0.0, 0.0], [20.0, 0.0], [20.0, 20.0], [0.0, 20.0]]
        .iter()
        .enumerate()
        .map(|(i, p)| Well::from_spec(format!("W{}", i + 1), *p, 0.005, &model.wells))
        .collect();
    let b = bid(&model, &wells, &[], &[Some(0.0); 4]);
    lines(&b, 0.02, UnitSystem::Si)
}

#[test]
fn an_si_prices_file_prices_hire_energy_and_days_over_twelve_weeks() {
    let l = si_bid_lines();
    let q = |item: &str| l.iter().find(|x| x.item == item).unwrap().quantity;
    // Hand quantities (deep_shaft.toml; defaults common practice (no source)):
    //   depth per well = 20.0 − (−11.5) + 1.0 sump = 32.5 m; drilling 4 × 32.5 = 130 m;
    //   screen 4 × (1.5 − (−11.5)) = 52 m; main = three sides of the square = 60 m;
    //   install = 4 ÷ 1 + 60 ÷ 200 = 4.3 → 5 days; removal = 4 ÷ 4 + 60 ÷ 400 = 1.15 → 2 days;
    //   hire = (2 + 5 + 84 + 2) ÷ 7 = 13.3 → 14 weeks;
    //   running power: lift 21.0 − 0.0 = 21.0 m, riser 31.5 m of 100 mm at 5 L/s 0.16594 m,
    //   header 30 m of 150 mm at 20 L/s 0.28589 m (C 130, checks.md §15), H = 21.45183 m,
    //   4 × 1000 × 9.81 × 0.005 × 21.45183 / 0.6 = 7.014749 kW; energy × 24 h × 84 days
    //   = 14 141.734 kWh;
    //   installed 4 × ρg × 8 L/s × 22.0034 m / 0.6 = 11.51 kW ÷ 0.8 = 14.4 kVA → 20 kVA, 2 sets;
    //   settlement: 30 L/s design flow × 15 min = 27 m³ → one 30 m³ tank;
    //   discharged 20 L/s × 84 days = 145 152 m³;
    //   piezometers: shaft perimeter 44 m ÷ 50 → 1, at least 4, + 1 neighbour = 5.
    assert!((q("drilling") - 130.0).abs() < 1e-9);
    assert!((q("collecting main") - 60.0).abs() < 1e-9);
    assert_eq!(
        (q("installation"), q("removal"), q("hire period")),
        (5.0, 2.0, 14.0)
    );
    assert!((q("energy") - 14_141.734).abs() < 0.01);
    assert_eq!(q("generators 20 kVA"), 2.0);
    assert_eq!(q("settlement tanks"), 1.0);
    assert!((q("discharged volume") - 145_152.0).abs() < 1e-6);
    assert_eq!(q("monitoring piezometers"), 5.0);
    let path = write_prices(
        "si",
        "item,price,unit\ndrilling,120,m\nscreen,85,m\nworking wells,1500,no.\npumps 8 L/s,95,week\ncollecting main,2.5,m/week\ngenerators 20 kVA,400,week\nsettlement tanks,150,week\nmobilisation,900,day\ninstallation,1200,day\npumping attendance,250,day\nremoval,1000,day\nenergy,0.30,kWh\ndischarged volume,0.05,m3\nmonitoring piezometers,2200,each\n",
    );
    let c = costs(&l, &read(&path).unwrap()).expect("priced");
    assert_eq!(c.lines.len(), 14, "{c:?}");
    // Hand total:
    //   drilling            130 m × 120                    = 15 600.00 (one-off)
    //   screen              52 m × 85                      = 4 420.00 (capital)
    //   working wells       4 × 1 500                      = 6 000.00 (one-off)
    //   pumps 8 L/s         4 × 14 weeks × 95              = 5 320.00 (hire)
    //   collecting main     60 m × 14 weeks × 2.50         = 2 100.00 (hire)
    //   generators 20 kVA   2 × 14 weeks × 400             = 11 200.00 (hire)
    //   settlement tanks    1 × 14 weeks × 150             = 2 100.00 (hire)
    //   mobilisation        2 days × 900                   = 1 800.00 (one-off)
    //   installation        5 days × 1 200                 = 6 000.00 (one-off)
    //   pumping attendance  84 days × 250                  = 21 000.00 (running)
    //   removal             2 days × 1 000                 = 2 000.00 (one-off)
    //   energy              14 141.734 kWh × 0.30          = 4 242.52 (running)
    //   discharged volume   145 152 m³ × 0.05              = 7 257.60 (running)
    //   piezometers         5 × 2 200                      = 11 000.00 (one-off)
    //   total                                              = 100 040.12
    //   (capital 4 420.00; hire 20 720.00; running 32 500.12; one-off 42 400.00)
    assert!((c.total - 100_040.12).abs() < 0.01, "{}", c.total);
    let sub = |cat: Category| c.subtotals.iter().find(|s| s.0 == cat).unwrap().1;
    assert!((sub(Category::Capital) - 4_420.00).abs() < 0.01);
    assert!((sub(Category::HirePerWeek) - 20_720.00).abs() < 0.01);
    assert!((sub(Category::Running) - 32_500.12).abs() < 0.01);
    assert!((sub(Category::OneOff) - 42_400.00).abs() < 0.01);
}

#[test]
fn a_price_per_the_wrong_time_or_on_an_unpriced_line_is_refused_naming_its_line() {
    let l = si_bid_lines();
    let refused = |text: &str| {
        let path = write_prices("refused", &format!("item,price,unit\n{text}\n"));
        costs(&l, &read(&path).unwrap()).unwrap_err()
    };
    // A weekly hire priced per day: never turned into a week rate.
    let e = refused("pumps 8 L/s,20,day");
    assert!(
        e.message.contains("hired by the week") && e.message.contains("per day"),
        "{e}"
    );
    assert_eq!(e.line, Some(2));
    assert!(e.to_string().contains("prices.csv"), "{e}");
    // A weekly hire priced per item, and pipework per week without its length unit.
    let e = refused("pumps 8 L/s,3500,each");
    assert!(
        e.message.contains("per each") && e.message.contains("per week"),
        "{e}"
    );
    assert!(refused("collecting main,2.5,week")
        .message
        .contains("m/week"));
    // Days of work priced per week; drilling priced per metre-week; metres priced per foot-week.
    assert!(refused("installation,5000,week").message.contains("day"));
    assert!(refused("drilling,120,m/week").message.contains("not hired"));
    // A line shown for information is not priced.
    let e = refused("daily energy,0.3,kWh");
    assert!(
        e.message.contains("information") && e.message.contains("'energy'"),
        "{e}"
    );
    // Per foot against metres on a hire line is converted (1 ft = 0.3048 m):
    // 60 m × 14 weeks × (0.762 per ft-week ÷ 0.3048) = 60 × 14 × 2.5 = 2 100.
    let path = write_prices("ftweek", "item,price,unit\ncollecting main,0.762,ft/week\n");
    let c = costs(&l, &read(&path).unwrap()).unwrap();
    assert!((c.total - 2_100.0).abs() < 1e-6, "{}", c.total);
}

#[test]
fn a_price_per_metre_is_converted_to_the_foot_and_a_wrong_unit_refused() {
    let (_, l) = us_bid_lines();
    // 131.2336 per m = 40 per ft (1 ft = 0.3048 m): the same drilling cost as above.
    let per_m = [Price::new("drilling", 40.0 / FOOT, Some("m"))];
    let c = costs(&l, &per_m).unwrap();
    assert!((c.total - 9_973.75).abs() < 0.01, "{}", c.total);
    // A pump duty given in L/s prices the gpm line (12.618 L/s = 200 gpm).
    let per_ls = [Price::new("pumps 12.618 L/s", 120.0, Some("week"))];
    let c = costs(&l, &per_ls).unwrap();
    assert_eq!(c.lines.len(), 1);
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
fn design_with_prices_on_the_shaft_demo_reproduces_a_hand_total() {
    // `drydig design layouts/deep_shaft.toml --prices`: the demo designs 5 working wells and 1
    // standby (if a change to the design alters this, the hand sum below must be redone).
    let dir = std::env::temp_dir().join(format!("drydig-prices-shaft-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let prices = dir.join("prices.csv");
    std::fs::write(
        &prices,
        "item,price,unit\ndrilling,120,m\nscreen,85,m\nworking wells,1500,no.\nstandby wells,1500,no.\npumps 12 L/s,110,week\nstandby pumps,110,week\nmobilisation,900,day\ninstallation,1200,day\npumping attendance,250,day\nremoval,1000,day\nenergy,0.30,kWh\nmonitoring piezometers,2200,each\n",
    )
    .unwrap();
    let out_dir = dir.join("out");
    let out = drydig()
        .args(["design", "layouts/deep_shaft.toml", "--prices"])
        .arg(&prices)
        .arg("-o")
        .arg(&out_dir)
        .output()
        .unwrap();
    assert!(matches!(out.status.code(), Some(0 | 3)), "{out:?}");
    let text = std::fs::read_to_string(out_dir.join("bid.csv")).unwrap();
    let mut r = csv::Reader::from_reader(text.as_bytes());
    let rows: Vec<csv::StringRecord> = r.records().map(Result::unwrap).collect();
    let get = |item: &str, col: usize| -> f64 {
        let row = rows
            .iter()
            .find(|x| &x[0] == item)
            .unwrap_or_else(|| panic!("{item}: {text}"));
        row[col]
            .parse()
            .unwrap_or_else(|_| panic!("{item}: {text}"))
    };
    // columns: item, category, quantity, unit, weeks, basis, unit_price, price_per, cost
    assert_eq!(
        (get("working wells", 2), get("standby wells", 2)),
        (5.0, 1.0),
        "{text}"
    );
    // Hand quantities (deep_shaft.toml, [bid] pumping_duration = "120 days"; rates of work at
    // their defaults, common practice (no source)):
    //   drilling 6 × (20.0 − (−11.5) + 1.0 sump) = 6 × 32.5 = 195 m; screen 6 × 13 = 78 m;
    //   install = 6 wells ÷ 1 a day + main 56.7 m ÷ 200 m a day = 6.3 → 7 days;
    //   removal = 6 ÷ 4 + 56.7 ÷ 400 = 1.6 → 2 days;
    //   hire = (2 + 7 + 120 + 2) ÷ 7 = 18.7 → 19 weeks;
    //   energy = running power × 24 h × 120 days = running power × 2 880 h;
    //   piezometers: shaft perimeter 44 m → 1, at least 4, + 1 (the valve house) = 5.
    assert_eq!(get("drilling", 2), 195.0);
    assert_eq!(get("screen", 2), 78.0);
    assert_eq!((get("installation", 2), get("removal", 2)), (7.0, 2.0));
    assert_eq!(get("pumps 12 L/s", 4), 19.0);
    let energy = get("energy", 2);
    assert!(
        (energy - get("power running", 2) * 2880.0).abs() < 0.005 * 2880.0,
        "{text}"
    );
    // Hand total:
    //   drilling              195 m × 120                = 23 400
    //   screen                78 m × 85                  =  6 630
    //   working wells         5 × 1 500                  =  7 500
    //   standby wells         1 × 1 500                  =  1 500
    //   pumps 12 L/s          5 × 19 weeks × 110         = 10 450
    //   standby pumps         1 × 19 weeks × 110         =  2 090
    //   mobilisation          2 days × 900               =  1 800
    //   installation          7 days × 1 200             =  8 400
    //   pumping attendance    120 days × 250             = 30 000
    //   removal               2 days × 1 000             =  2 000
    //   monitoring piezometers 5 × 2 200                 = 11 000
    //   subtotal without energy                          = 104 770
    //   energy                (running kW × 2 880 h) × 0.30
    let hand = 104_770.0 + energy * 0.30;
    let total = get("total of the priced lines", 8);
    assert!(
        (total - hand).abs() < 0.01,
        "{total} against {hand}: {text}"
    );
    assert!((get("subtotal hire per week", 8) - 12_540.0).abs() < 0.01);
    let html = std::fs::read_to_string(out_dir.join("report.html")).unwrap();
    assert!(html.contains("Cost by category") && html.contains(&format!("{total:.2}")));
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
        ("hire_priced_per_day.csv", "per day"),
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
