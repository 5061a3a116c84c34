//! The bid lines that come with time ([`crate::bid::durations`]): mobilisation, installation,
//! pumping attendance, removal, the hire period, energy over the pumping, generators,
//! settlement tanks, the discharged volume and the monitoring piezometers, in the user's units.

use crate::bid::durations::{PumpingFrom, GENERATOR_POWER_FACTOR, STANDARD_TANK_M3};
use crate::bid::line::{line, BidLine, BidUnits, Category};
use crate::bid::quantities::Bid;

/// Days of work: mobilisation, installation, removal (one-off) and pumping attendance
/// (running), and the hire period they make (information).
fn day_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let t = &bid.time;
    let r = &t.rates;
    let lu = u.len_unit();
    let built = bid.working_wells + bid.standby_placed.len();
    let header = u.len(bid.header_length_m);
    let (install, removal) = if bid.wellpoints {
        (
            format!(
                "header {header:.0} {lu} ÷ {:.0} {lu} jetted and laid a day, rounded up to whole days",
                u.len(r.header_per_day_m)
            ),
            format!(
                "header {header:.0} {lu} ÷ {:.0} {lu} pulled a day, rounded up",
                u.len(r.removal_header_per_day_m)
            ),
        )
    } else {
        (
            format!(
                "{built} wells ÷ {} a day + main {header:.0} {lu} ÷ {:.0} {lu} a day, rounded up to whole days",
                r.wells_per_day,
                u.len(r.header_per_day_m)
            ),
            format!(
                "{built} wells ÷ {} a day + main {header:.0} {lu} ÷ {:.0} {lu} a day, rounded up",
                r.removal_wells_per_day,
                u.len(r.removal_header_per_day_m)
            ),
        )
    };
    let defaults = "rates of [bid] or common practice (no source) defaults";
    out.push(
        line(
            "mobilisation",
            t.mobilise_days,
            "day",
            "plant delivered and set up ([bid] mobilise)",
        )
        .as_(Category::OneOff),
    );
    out.push(
        line(
            "installation",
            t.install_days,
            "day",
            format!("{install}; {defaults}"),
        )
        .as_(Category::OneOff),
    );
    let from = match t.pumping_from {
        PumpingFrom::Bid => "pumping duration from [bid] pumping_duration",
        PumpingFrom::Programme => "pumping duration from [programme] duration",
        PumpingFrom::Rolling => "pumping duration = the rolling run's days of digging ([bid] pumping_duration to give another)",
        PumpingFrom::NotGiven => "pumping duration NOT GIVEN: one week shown, so the hire and running lines are for one week of pumping; give [bid] pumping_duration",
    };
    out.push(
        line(
            "pumping attendance",
            t.pumping_days,
            "day",
            format!("{from}; pumps running, checked and maintained"),
        )
        .as_(Category::Running),
    );
    out.push(
        line(
            "removal",
            t.removal_days,
            "day",
            format!("{removal}; {defaults}"),
        )
        .as_(Category::OneOff),
    );
    out.push(line(
        "hire period",
        t.hire_weeks,
        "week",
        format!(
            "(mobilisation {:.0} + installation {:.0} + pumping {:.1} + removal {:.0} days) ÷ 7, rounded up: hire is charged by the week (common practice (no source)); every hired line runs this long",
            t.mobilise_days, t.install_days, t.pumping_days, t.removal_days
        ),
    ));
}

/// Energy over the pumping, generators, settlement tanks, discharged volume and piezometers.
fn running_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let t = &bid.time;
    let weeks = t.hire_weeks;
    out.push(
        line(
            "energy",
            t.energy_kwh,
            "kWh",
            format!(
                "running power {:.2} kW × {:.0} h a day × {:.1} pumping days (fuel or mains)",
                bid.power_running_kw, t.rates.hours_per_day, t.pumping_days
            ),
        )
        .as_(Category::Running),
    );
    if t.generators > 0 {
        out.push(
            line(
                format!("generators {:.0} kVA", t.generator_kva),
                f64::from(t.generators),
                "no.",
                format!(
                    "installed {:.1} kW ÷ {GENERATOR_POWER_FACTOR} power factor = {:.1} kVA, next standard size up; running + standby on changeover ([bid] generators; 0 on a mains supply; common practice (no source))",
                    bid.power_installed_kw,
                    bid.power_installed_kw / GENERATOR_POWER_FACTOR
                ),
            )
            .hired(weeks),
        );
    }
    if t.tanks > 0 {
        let (v, vu) = u.volume(t.tank_volume_m3);
        let (tank, _) = u.volume(STANDARD_TANK_M3);
        out.push(
            line(
                "settlement tanks",
                t.tanks as f64,
                "no.",
                format!(
                    "design flow × {:.0} min retention = {v:.1} {vu}, in {tank:.0} {vu} tanks (common practice (no source))",
                    t.retention_s / 60.0
                ),
            )
            .hired(weeks),
        );
    }
    let (v, vu) = u.volume(t.discharged_m3);
    out.push(
        line(
            "discharged volume",
            v,
            vu,
            format!(
                "total flow × {:.0} pumping hours (for a discharge consent or sewer charge)",
                t.pumping_hours
            ),
        )
        .as_(Category::Running),
    );
    let lu = u.len_unit();
    out.push(
        line(
            "monitoring piezometers",
            t.piezometers as f64,
            "no.",
            format!(
                "excavation perimeter {:.0} {lu} ÷ {:.0} {lu}, rounded up, at least {} per excavation, + {} for the neighbours (one each) (common practice (no source)); to the wells' screen base",
                u.len(t.perimeter_m),
                u.len(t.rates.piezometer_spacing_m),
                crate::bid::durations::MIN_PIEZOMETERS_PER_EXCAVATION,
                t.neighbours
            ),
        )
        .as_(Category::OneOff),
    );
}

/// Every line that comes with time, in the order an estimator reads them.
pub fn time_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    day_lines(out, bid, u);
    running_lines(out, bid, u);
}
