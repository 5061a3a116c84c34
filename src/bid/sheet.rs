//! The bid sheet: one list of lines (item, quantity, unit, category, basis) in the user's unit
//! system (`units = "us"`: feet, gpm, US gallons; pumps named by their duty in gpm), the one
//! list `bid.csv`, `bid.json`, the terminal sheet and report.html show and the prices multiply.
//!
//! Each line has a category ([`crate::bid::line::Category`]). Extra quantity lines (a cut-off
//! wall, say) join in [`lines`] with their category.

use crate::bid::line::{duty_figure, line, BidLine, BidUnits, Category};
use crate::bid::quantities::{Bid, SUMP_ALLOWANCE};
use crate::input::units::UnitSystem;

/// The lines of the bid sheet, quantities in `units`; `estimate_flow` is the quick
/// estimate's total flow, m³/s (shown beside the design's).
pub fn lines(bid: &Bid, estimate_flow: f64, units: UnitSystem) -> Vec<BidLine> {
    let u = BidUnits(units);
    let mut out = Vec::new();
    well_lines(&mut out, bid, u);
    rolling_lines(&mut out, bid, u);
    pump_lines(&mut out, bid, u);
    power_lines(&mut out, bid, u);
    crate::bid::time_lines::time_lines(&mut out, bid, u);
    flow_lines(&mut out, bid, u, estimate_flow);
    wall_lines(&mut out, bid, u);
    out
}

/// Cut-off walls: length and area of each, shown and not priced (drydig prices no wall).
fn wall_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    let l1 = u.len(1.0);
    for w in &bid.walls {
        out.push(line(
            format!("cut-off wall \"{}\": length", w.name),
            u.len(w.length_m),
            lu,
            "along the wall as drawn",
        ));
        out.push(line(
            format!("cut-off wall \"{}\": area", w.name),
            w.area_m2 * l1 * l1,
            &format!("{lu}²"),
            format!(
                "length × depth from ground level to the toe ({:.1} {lu})",
                u.len(w.depth_m)
            ),
        ));
    }
}

/// Wells (working, standby, recharge), drilling or jetting, and screen.
fn well_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    let what = if bid.wellpoints {
        "wellpoints"
    } else {
        "wells"
    };
    let weeks = bid.time.hire_weeks;
    let working = line(
        format!("working {what}"),
        bid.working_wells as f64,
        "no.",
        if bid.wellpoints {
            "rate above zero; wellpoint, riser and swing joint hired"
        } else {
            "rate above zero; idle wells are dropped from the layout; each completed (development, headworks)"
        },
    );
    out.push(if bid.wellpoints {
        working.hired(weeks)
    } else {
        working.as_(Category::OneOff)
    });
    if !bid.wellpoints {
        out.push(
            line(
                "standby wells",
                bid.standby_placed.len() as f64,
                "no.",
                if bid.standby_placed.is_empty() {
                    "none asked (wells.standby)".to_string()
                } else {
                    format!(
                        "placed where one well's loss hurts most: {}",
                        bid.standby_placed.join(", ")
                    )
                },
            )
            .as_(Category::OneOff),
        );
    }
    if bid.recharge_wells > 0 {
        out.push(
            line("recharge wells", bid.recharge_wells as f64, "no.", {
                let (q, qu) = u.total_flow(bid.recharge_flow_m3_per_s);
                format!("at their given rates, {q:.1} {qu} in all (not in the drilling)")
            })
            .as_(Category::OneOff),
        );
    }
    let depth = if bid.wellpoints {
        format!(
            "{:.2} {lu} each (ground to screen base; jetted, no sump)",
            u.len(bid.depth_per_well_m)
        )
    } else {
        format!(
            "{:.2} {lu} each (ground to screen base + {:.1} {lu} sump)",
            u.len(bid.depth_per_well_m),
            u.len(SUMP_ALLOWANCE)
        )
    };
    if bid.wellpoints {
        let jetting = line(
            "jetting",
            u.len(bid.jetting_m),
            lu,
            format!(
                "wellpoints: {depth}{}",
                if bid.rolling.is_some() {
                    "; the set installed at one time, priced in the jetting along the route"
                } else {
                    ""
                }
            ),
        );
        // A rolling run prices its jetting along the route (the first set included).
        out.push(if bid.rolling.is_some() {
            jetting
        } else {
            jetting.as_(Category::OneOff)
        });
    } else {
        out.push(
            line(
                "drilling",
                u.len(bid.drilling_m),
                lu,
                format!("working + standby wells: {depth}"),
            )
            .as_(Category::OneOff),
        );
    }
    let screen = line(
        "screen",
        u.len(bid.screen_m),
        lu,
        if bid.wellpoints {
            "screen top − screen base, working + standby; the wellpoints' own screens, in their hire"
        } else {
            "screen top − screen base, working + standby; bought, left in the ground"
        },
    );
    // A wellpoint's screen comes out with it (in the wellpoint hire); a well screen stays.
    out.push(if bid.wellpoints {
        screen
    } else {
        screen.as_(Category::Capital)
    });
    if let Some(f) = bid.filter_m {
        out.push(
            line(
                "filter column",
                u.len(f),
                lu,
                "filter (sand) column top − base round each screen, working + standby; sand bought, left in the ground",
            )
            .as_(Category::Capital),
        );
    }
}

/// A rolling run: wellpoints jetted and jetting along the whole route, days of digging (the
/// other lines are the set installed at one time).
fn rolling_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let Some(r) = &bid.rolling else {
        return;
    };
    let lu = u.len_unit();
    let (what, work) = if bid.wellpoints {
        ("wellpoints", "jetted")
    } else {
        ("wells", "drilled")
    };
    out.push(
        line(
            format!("{what} {work} along the route"),
            r.installations as f64,
            "no.",
            format!(
                "rolling run: the set of {:.0} {lu} (run-out + open length + run-in) pulled and {work} in again ahead along {:.0} {lu} (run-out + {:.0} {lu} trench + run-in)",
                u.len(r.installed_length_m),
                u.len(r.route_m),
                u.len(r.trench_length_m)
            ),
        )
        .as_(Category::OneOff),
    );
    out.push(
        line(
            if bid.wellpoints {
                "jetting along the route"
            } else {
                "drilling along the route"
            },
            u.len(r.jetting_route_m),
            lu,
            format!("{what} {work} along the route × depth each"),
        )
        .as_(Category::OneOff),
    );
    out.push(line(
        "days of digging",
        r.digging_days,
        "day",
        "trench length ÷ advance a day, rounded up; the pumping runs this long unless [bid] pumping_duration says otherwise",
    ));
}

/// One line per pump class (deep wells) or the header pump sets (wellpoints): duty, count,
/// head and its parts, power, running rates; hired for the hire weeks.
fn pump_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    let weeks = bid.time.hire_weeks;
    for p in &bid.pumps {
        let duty = p.duty_l_per_s / 1e3;
        let (d, du) = u.rate(duty);
        let (r0, ru) = u.rate(p.running_l_per_s[0] / 1e3);
        let (r1, _) = u.rate(p.running_l_per_s[1] / 1e3);
        let head = format!(
            "{:.1} {lu} total head (lift {:.1} + riser {:.2} + header {:.2} {lu})",
            u.len(p.head_m),
            u.len(p.head_parts.lift_m),
            u.len(p.head_parts.riser_m),
            u.len(p.head_parts.header_m),
        );
        if let (true, Some(set)) = (bid.wellpoints, bid.set_size) {
            let (points, air) = bid.set_air.unwrap_or((0, 0.0));
            let (w, wu) = u.rate(set.water_m3_per_s);
            let (set_air, per_point, au) = u.air(set.air_m3_per_h);
            let air = u.air(air).0;
            out.push(
                line(
                    format!("wellpoint sets {}", u.set_size(set.size_mm)),
                    p.count as f64,
                    "no.",
                    format!(
                        "vacuum + water pump set (up to {w:.0} {wu} of water, {set_air:.0} {au} of air; {} + {} kW) at {head}; water {r0:.2} {ru} running, {d:.1} {du} duty; air {points} wellpoints × {per_point:.2} {au} = {air:.0} {au}{}",
                        set.vacuum_kw, set.water_kw,
                        if bid.set_above_table { "; the set asks for more than the largest set in the table: split the header" } else { "" }
                    ),
                )
                .hired(weeks),
            );
            continue;
        }
        let mut l = line(
            format!("pumps {} {du}", duty_figure(d)),
            p.count as f64,
            "no.",
            format!(
                "working at {head}, {:.2} kW shaft each; running {r0:.2}–{r1:.2} {ru}{}",
                p.shaft_power_kw,
                if p.above_list {
                    "; the rate asks for more than the largest duty in the list"
                } else {
                    ""
                }
            ),
        )
        .hired(weeks);
        l.duty_m3_per_s = Some(duty);
        out.push(l);
    }
}

/// Standby pumps, header or collecting main, power installed and running, energy per day.
fn power_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits) {
    let lu = u.len_unit();
    if bid.standby_pumps > 0 {
        out.push(
            line(
                if bid.wellpoints {
                    "standby sets"
                } else {
                    "standby pumps"
                },
                bid.standby_pumps as f64,
                "no.",
                "of the largest class",
            )
            .hired(bid.time.hire_weeks),
        );
    }
    if bid.header_length_m > 0.0 {
        out.push(
            line(
                if bid.wellpoints {
                    "wellpoint header"
                } else {
                    "collecting main"
                },
                u.len(bid.header_length_m),
                lu,
                if bid.wellpoints {
                    "along the wellpoint line(s); pipework hired"
                } else {
                    "the shortest run joining the built wells; pipework hired"
                },
            )
            .hired(bid.time.hire_weeks),
        );
    }
    out.push(line(
        "power installed",
        bid.power_installed_kw,
        "kW",
        if bid.wellpoints {
            "every set (standby too) at its vacuum and water pump drives"
        } else {
            "every pump (standby too) at its duty and class head"
        },
    ));
    out.push(line(
        "power running",
        bid.power_running_kw,
        "kW",
        if bid.wellpoints {
            "working sets: vacuum pumps + water pumps at their running rates"
        } else {
            "working pumps at their running rates"
        },
    ));
    out.push(line(
        "daily energy",
        bid.energy_per_day_kwh,
        "kWh",
        format!("running power × {:.0} h", bid.hours_per_day),
    ));
}

/// Total and design flow, flow per 100 length units of header, and the quick estimate's total
/// flow `estimate_flow` (m³/s).
fn flow_lines(out: &mut Vec<BidLine>, bid: &Bid, u: BidUnits, estimate_flow: f64) {
    let lu = u.len_unit();
    let (total, fu) = u.total_flow(bid.total_flow_m3_per_s);
    let (total_rate, ru) = u.rate(bid.total_flow_m3_per_s);
    out.push(line(
        "total flow",
        total,
        fu,
        format!("sum of the well rates, {total_rate:.2} {ru}"),
    ));
    let (design_flow, _) = u.total_flow(bid.design_flow_m3_per_s);
    let (design_rate, _) = u.rate(bid.design_flow_m3_per_s);
    out.push(line(
        "design flow",
        design_flow,
        fu,
        format!(
            "total × (1 + {:.2}), {design_rate:.2} {ru}",
            bid.contingency
        ),
    ));
    if let Some(q) = bid.design_flow_per_100m_m3_per_s {
        // per 100 m of header → per 100 of the display length unit
        let (per, pu) = u.rate(q / u.len(1.0));
        out.push(line(
            format!("design flow per 100 {lu} of header"),
            per,
            pu,
            "wellpoint header pumps",
        ));
    }
    let (est, _) = u.total_flow(estimate_flow);
    out.push(line(
        "quick estimate total flow",
        est,
        fu,
        "drydig estimate (equivalent well or line slot)",
    ));
}
