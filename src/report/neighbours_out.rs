//! Neighbours, base uplift and recharge in the outputs: the terminal section, `neighbours.csv`,
//! `neighbour_points.csv`, the JSON parts of `summary.json`, and `settlement.svg`.

use super::{wrap, CAUTION};
use crate::check::run::CheckRun;
use crate::input::units::UnitSystem;
use crate::optimise::recharge::RechargeSizing;
use crate::safety::neighbours::{self, NeighbourResult, Status};
use crate::safety::uplift::{self, UpliftResult};
use geo::{BoundingRect, MultiPolygon};
use serde_json::{json, Value};
use svg::node::element::{
    Circle, ClipPath, Definitions, Group, Line, Path as SvgPath, Rectangle, Text,
};
use svg::Document;

/// The map's colouring of the neighbours by their status ([`super::map_svg`]).
pub fn map_options(run: &CheckRun) -> super::map_svg::MapOptions {
    use super::map_svg::NeighbourStatus as M;
    super::map_svg::MapOptions {
        neighbour_status: Some(
            neighbours::neighbour_status(run)
                .into_iter()
                .map(|(_, s, _)| match s {
                    Status::Pass => M::WithinLimits,
                    Status::Close => M::NearLimit,
                    Status::Fail => M::OverLimit,
                    Status::NotChecked => M::NotAssessed,
                })
                .collect(),
        ),
    }
}

/// Colour of a status on maps (also for the map owner to reuse).
pub fn status_colour(status: Status) -> &'static str {
    match status {
        Status::Pass => "#2e8b57",
        Status::Close => "#d99a00",
        Status::Fail => "#c0282d",
        Status::NotChecked => "#7a7a7a",
    }
}

fn ratio_text(beta: f64) -> String {
    if beta <= 0.0 {
        "0".into()
    } else if beta >= 1.0 {
        format!("{beta:.2}")
    } else {
        format!("1/{:.0}", 1.0 / beta)
    }
}

fn mm(x: f64) -> String {
    format!("{:.1} mm", x * 1e3)
}

/// The checks of a neighbour in one line: "drawdown 1.62/1.50 m FAIL; …".
fn checks_line(r: &NeighbourResult, units: UnitSystem) -> String {
    r.checks
        .iter()
        .map(|c| {
            let v = match c.quantity.as_str() {
                "drawdown" => format!(
                    "{:.2} of {:.2} {}",
                    units.length(c.value),
                    units.length(c.limit),
                    units.length_unit()
                ),
                "settlement" => format!("{} of {}", mm(c.value), mm(c.limit)),
                _ => format!("{} of {}", ratio_text(c.value), ratio_text(c.limit)),
            };
            let basis = if c.basis == "design file" {
                String::new()
            } else {
                format!(" [limit: {}]", c.basis)
            };
            format!(
                "{} {v} {}{basis}",
                c.quantity,
                if c.pass { "ok" } else { "OVER" }
            )
        })
        .collect::<Vec<_>>()
        .join("; ")
}

/// Terminal section: neighbours table, uplift, recharge sizing, and the neighbours verdict.
pub fn text(run: &CheckRun, recharge: Option<&RechargeSizing>, units: UnitSystem) -> String {
    let mut out = String::new();
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let results = neighbours::assess_run(run);
    if !results.is_empty() {
        out.push_str("\nneighbours (drawdown from superposition; settlement by 1D consolidation on the listed layers)\n");
        out.push_str(&format!(
            "{:<26} {:>10} {:>9} {:>11} {:>9} {:>11} {:>9}  {}\n",
            "name",
            &format!("drawdown {lu}"),
            "limit",
            "settlement",
            "limit",
            "distortion",
            "limit",
            "status"
        ));
        for r in &results {
            let find = |q: &str| r.checks.iter().find(|c| c.quantity == q);
            let lim_dd = find("drawdown").map_or("—".into(), |c| format!("{:.2}", l(c.limit)));
            let (rho, lim_rho) = match (&r.worst_settlement, find("settlement")) {
                (Some(s), Some(c)) => (
                    format!("{:.1} mm", s.settlement_m.unwrap_or(0.0) * 1e3),
                    format!(
                        "{:.1}{}",
                        c.limit * 1e3,
                        if c.basis == "design file" { "" } else { "*" }
                    ),
                ),
                _ => ("—".into(), "—".into()),
            };
            let (beta, lim_beta) = match (r.max_distortion, find("angular distortion")) {
                (Some(b), Some(c)) => (
                    ratio_text(b),
                    format!(
                        "{}{}",
                        ratio_text(c.limit),
                        if c.basis == "design file" { "" } else { "*" }
                    ),
                ),
                _ => ("—".into(), "—".into()),
            };
            let failing: Vec<&str> = r
                .checks
                .iter()
                .filter(|c| !c.pass)
                .map(|c| c.quantity.as_str())
                .collect();
            let status = if failing.is_empty() {
                r.status.word().to_string()
            } else {
                format!("FAIL ({})", failing.join(", "))
            };
            out.push_str(&format!(
                "{:<26} {:>10.2} {:>9} {:>11} {:>9} {:>11} {:>9}  {}\n",
                truncate(&r.name, 26),
                l(r.worst_drawdown.drawdown_m),
                lim_dd,
                rho,
                lim_rho,
                beta,
                lim_beta,
                status
            ));
        }
        if results
            .iter()
            .flat_map(|r| &r.checks)
            .any(|c| c.basis != "design file")
        {
            out.push_str(&wrap(
                &format!("* limit not in the design file: {} — 25 mm total settlement, angular distortion 1/500; give the building's own limits", neighbours::RULE_OF_THUMB_LABEL),
                96,
                "  ",
            ));
        }
        for r in &results {
            out.push_str(&format!(
                "  {} — layers from the {} at {:.2} {lu}; Δσ′ form: {}\n",
                r.name,
                r.profile_top_basis,
                l(r.profile_top_m),
                r.stress_change
            ));
            for c in &r.corners {
                out.push_str(&format!(
                    "    {:<10} ({:>8.1}, {:>8.1})  drawdown {:>6.2} {lu}{}\n",
                    c.name,
                    c.position[0],
                    c.position[1],
                    l(c.drawdown_m),
                    c.settlement_m.map_or(String::new(), |s| format!(
                        "  settlement {:>6.1} mm",
                        s * 1e3
                    ))
                ));
            }
            let w = &r.worst_drawdown;
            out.push_str(&format!(
                "    worst      ({:>8.1}, {:>8.1})  drawdown {:>6.2} {lu}{}  [{}, of {} points sampled]\n",
                w.position[0],
                w.position[1],
                l(w.drawdown_m),
                w.settlement_m
                    .map_or(String::new(), |s| format!("  settlement {:>6.1} mm", s * 1e3)),
                w.name,
                r.sample_count
            ));
            for s in &r.sides {
                out.push_str(&format!(
                    "    side {:<11} L {:>6.1} {lu}  Δρ {:>5.1} mm  β {}\n",
                    s.name,
                    l(s.length_m),
                    s.differential_m * 1e3,
                    ratio_text(s.distortion)
                ));
            }
            if !r.checks.is_empty() {
                out.push_str(&wrap(&checks_line(r, units), 96, "    "));
            }
            for n in &r.notes {
                out.push_str(&wrap(&format!("note: {n}"), 96, "    "));
            }
        }
    }
    let up = uplift::assess_run(run);
    for u in &up {
        out.push_str(&uplift_text(u, units));
    }
    if let Some(rs) = recharge {
        out.push_str(&recharge_text(rs, units));
    }
    if !results.is_empty() {
        let failing: Vec<&str> = results
            .iter()
            .filter(|r| r.status == Status::Fail)
            .map(|r| r.name.as_str())
            .collect();
        out.push_str(&if failing.is_empty() {
            format!(
                "\nRESULT (neighbours): all {} within their limits\n",
                results.len()
            )
        } else {
            format!(
                "\nRESULT (neighbours): {} of {} over a limit: {}\n",
                failing.len(),
                results.len(),
                failing.join(", ")
            )
        });
    }
    out
}

fn truncate(s: &str, n: usize) -> String {
    if s.chars().count() <= n {
        s.to_string()
    } else {
        let mut t: String = s.chars().take(n - 1).collect();
        t.push('…');
        t
    }
}

fn uplift_text(u: &UpliftResult, units: UnitSystem) -> String {
    let lu = units.length_unit();
    let l = |x: f64| units.length(x);
    let mut out = format!(
        "\nbase uplift — {}: {:.2} {lu} of soil at {:.1} kN/m³ between formation {:.2} {lu} and the confined layer top {:.2} {lu}: σ_v = {:.1} kPa\n",
        u.excavation,
        l(u.cover_thickness_m),
        u.soil_unit_weight_kn_per_m3,
        l(u.formation_level_m),
        l(u.layer_top_m),
        u.overburden_kpa
    );
    out.push_str(&format!(
        "  before pumping: piezometric level {:.2} {lu}, water pressure {:.1} kPa, FoS {}\n",
        l(u.piezometric_level_m),
        u.water_pressure_kpa,
        u.factor_of_safety_before
            .map_or("— (no uplift pressure)".into(), |f| format!("{f:.2}"))
    ));
    out.push_str(&format!(
        "  required FoS {:.2}: head in the layer must be at or below {:.2} {lu} (drawdown ≥ {:.2} {lu})\n",
        u.factor_of_safety_required,
        l(u.required_head_m),
        l(u.required_drawdown_m)
    ));
    out.push_str(&match u.uplift_target_m {
        None => "  no relief needed: the layer's head is already low enough\n".to_string(),
        Some(t) if u.uplift_governs => format!(
            "  uplift governs: check points \"{} uplift …\" hold the pumped level at or below {:.2} {lu} (excavation target {:.2} {lu})\n",
            u.excavation, l(t), l(u.excavation_target_m)
        ),
        Some(t) => format!(
            "  fed to the check points (\"{} uplift …\") as target min({:.2}, {:.2}) {lu}: the excavation's own target is the stricter here\n",
            u.excavation, l(t), l(u.excavation_target_m)
        ),
    });
    if let Some(h) = u.head_after_m {
        out.push_str(&format!(
            "  after pumping: highest head under the excavation {:.2} {lu}, FoS {} — {}\n",
            l(h),
            u.factor_of_safety_after
                .map_or("— (no uplift pressure left)".into(), |f| format!(
                    "{f:.2}"
                )),
            if u.pass_after == Some(true) {
                "met"
            } else {
                "NOT MET"
            }
        ));
    }
    out.push_str(&wrap(&format!("method: {}", u.method), 96, "  "));
    out
}

fn recharge_text(r: &RechargeSizing, units: UnitSystem) -> String {
    let lu = units.length_unit();
    let mut out = format!("\nrecharge sizing: {}\n", r.status);
    for p in &r.protected {
        out.push_str(&format!(
            "  protect {:<24} drawdown ≤ {:.2} {lu} ({}); {:.2} {lu} without recharge\n",
            truncate(&p.name, 24),
            units.length(p.drawdown_limit_m),
            p.basis,
            units.length(p.drawdown_without_recharge_m)
        ));
    }
    for w in &r.wells {
        out.push_str(&format!(
            "  {:<10} ({:>8.1}, {:>8.1})  injects {:>6.2} L/s of at most {:.2} L/s\n",
            w.name,
            w.position[0],
            w.position[1],
            (w.rate_m3_per_s * 1e3).max(0.0) + 0.0,
            w.capacity_m3_per_s * 1e3
        ));
    }
    out.push_str(&format!(
        "  abstraction {:.1} L/s, recharge {:.1} L/s, net flow {:.1} L/s ({:.0} m³/day)\n",
        r.abstraction_m3_per_s * 1e3,
        r.recharge_m3_per_s * 1e3,
        r.net_flow_m3_per_s * 1e3,
        r.net_flow_m3_per_s * 86_400.0
    ));
    if !r.binding.is_empty() {
        out.push_str(&format!(
            "  binding: {}{}\n",
            r.binding
                .iter()
                .take(4)
                .cloned()
                .collect::<Vec<_>>()
                .join("; "),
            if r.binding.len() > 4 {
                format!(" … ({} in all)", r.binding.len())
            } else {
                String::new()
            }
        ));
    }
    for n in &r.notes {
        out.push_str(&wrap(&format!("note: {n}"), 96, "  "));
    }
    out
}

/// The rule-of-thumb limits, for `summary.json`.
pub fn rules_of_thumb() -> Value {
    json!({
        "settlement_m": neighbours::RULE_OF_THUMB_SETTLEMENT,
        "angular_distortion": neighbours::RULE_OF_THUMB_DISTORTION,
        "label": neighbours::RULE_OF_THUMB_LABEL,
    })
}

/// `neighbours.csv`: one row per neighbour.
pub fn neighbours_csv(results: &[NeighbourResult]) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "name",
        "status",
        "max_drawdown_m",
        "max_drawdown_x",
        "max_drawdown_y",
        "allowable_drawdown_m",
        "max_settlement_mm",
        "allowable_settlement_mm",
        "settlement_limit_basis",
        "max_differential_mm",
        "max_angular_distortion",
        "allowable_angular_distortion",
        "distortion_limit_basis",
        "utilisation",
        "profile_top_m",
        "stress_change",
    ])?;
    for r in results {
        let find = |q: &str| r.checks.iter().find(|c| c.quantity == q);
        let opt = |v: Option<f64>, f: &dyn Fn(f64) -> String| v.map_or(String::new(), f);
        w.write_record([
            r.name.clone(),
            r.status.word().to_string(),
            format!("{:.4}", r.worst_drawdown.drawdown_m),
            format!("{:.2}", r.worst_drawdown.position[0]),
            format!("{:.2}", r.worst_drawdown.position[1]),
            opt(find("drawdown").map(|c| c.limit), &|v| format!("{v:.3}")),
            opt(
                r.worst_settlement.as_ref().and_then(|s| s.settlement_m),
                &|v| format!("{:.2}", v * 1e3),
            ),
            opt(find("settlement").map(|c| c.limit), &|v| {
                format!("{:.1}", v * 1e3)
            }),
            find("settlement").map_or(String::new(), |c| c.basis.clone()),
            opt(r.max_differential_m, &|v| format!("{:.2}", v * 1e3)),
            opt(r.max_distortion, &|v| format!("{v:.3e}")),
            opt(find("angular distortion").map(|c| c.limit), &|v| {
                format!("{v:.3e}")
            }),
            find("angular distortion").map_or(String::new(), |c| c.basis.clone()),
            opt(r.utilisation, &|v| format!("{v:.3}")),
            format!("{:.3}", r.profile_top_m),
            r.stress_change.clone(),
        ])?;
    }
    Ok(w.into_inner()?)
}

/// `neighbour_points.csv`: corners and the worst points of every neighbour.
pub fn neighbour_points_csv(results: &[NeighbourResult]) -> anyhow::Result<Vec<u8>> {
    let mut w = csv::Writer::from_writer(Vec::new());
    w.write_record([
        "neighbour",
        "point",
        "x",
        "y",
        "water_level_m",
        "drawdown_m",
        "settlement_mm",
    ])?;
    for r in results {
        let mut rows: Vec<(String, &neighbours::Sample)> =
            r.corners.iter().map(|c| (c.name.clone(), c)).collect();
        rows.push((
            format!("worst drawdown ({})", r.worst_drawdown.name),
            &r.worst_drawdown,
        ));
        if let Some(s) = &r.worst_settlement {
            rows.push((format!("worst settlement ({})", s.name), s));
        }
        for (label, s) in rows {
            w.write_record([
                r.name.clone(),
                label,
                format!("{:.3}", s.position[0]),
                format!("{:.3}", s.position[1]),
                s.level_m.map_or("dry".into(), |z| format!("{z:.4}")),
                format!("{:.4}", s.drawdown_m),
                s.settlement_m
                    .map_or(String::new(), |v| format!("{:.2}", v * 1e3)),
            ])?;
        }
    }
    Ok(w.into_inner()?)
}

/// Every neighbour output file (none when the design has no neighbours).
pub fn files(run: &CheckRun) -> anyhow::Result<Vec<(String, Vec<u8>)>> {
    if run.model.neighbours.is_empty() {
        return Ok(Vec::new());
    }
    let results = neighbours::assess_run(run);
    Ok(vec![
        ("neighbours.csv".into(), neighbours_csv(&results)?),
        (
            "neighbour_points.csv".into(),
            neighbour_points_csv(&results)?,
        ),
        (
            "settlement.svg".into(),
            settlement_svg(run, &results).into_bytes(),
        ),
    ])
}

// ---------------------------------------------------------------- settlement.svg

const PLOT_W: f64 = 860.0;
const PANEL_W: f64 = 250.0;
const MARGIN: f64 = 30.0;
const TITLE_H: f64 = 56.0;
const FOOT_H: f64 = 86.0;

/// World → picture transform.
struct View {
    x0: f64,
    y1: f64,
    scale: f64,
}

impl View {
    fn p(&self, x: f64, y: f64) -> (f64, f64) {
        (
            MARGIN + (x - self.x0) * self.scale,
            TITLE_H + (self.y1 - y) * self.scale,
        )
    }
}

/// A step from 1, 2, 2.5, 5 × 10ⁿ giving at most `bands` bands up to `max`.
fn nice_step(max: f64, bands: usize) -> f64 {
    if max <= 0.0 || !max.is_finite() {
        return 1.0;
    }
    let raw = max / bands as f64;
    let p = 10f64.powf(raw.log10().floor());
    for m in [1.0, 2.0, 2.5, 5.0, 10.0] {
        if m * p >= raw {
            return m * p;
        }
    }
    10.0 * p
}

/// Sequential ramp for settlement bands, light to dark (our own colours).
fn ramp(t: f64) -> String {
    let stops = [
        (0.0, [255.0, 247.0, 214.0]),
        (0.35, [246.0, 190.0, 110.0]),
        (0.7, [208.0, 92.0, 64.0]),
        (1.0, [110.0, 28.0, 72.0]),
    ];
    let t = t.clamp(0.0, 1.0);
    let mut c = stops[stops.len() - 1].1;
    for w in stops.windows(2) {
        if t <= w[1].0 {
            let f = (t - w[0].0) / (w[1].0 - w[0].0);
            c = [0, 1, 2].map(|k| w[0].1[k] + f * (w[1].1[k] - w[0].1[k]));
            break;
        }
    }
    format!(
        "#{:02x}{:02x}{:02x}",
        c[0].round() as u8,
        c[1].round() as u8,
        c[2].round() as u8
    )
}

fn path_data(mp: &MultiPolygon<f64>, view: &View) -> String {
    let mut d = String::new();
    let mut ring = |ls: &geo::LineString<f64>| {
        for (i, c) in ls.0.iter().enumerate() {
            let (x, y) = view.p(c.x, c.y);
            d.push_str(&format!(
                "{}{:.1},{:.1}",
                if i == 0 { "M" } else { "L" },
                x,
                y
            ));
        }
        d.push('Z');
    };
    for poly in &mp.0 {
        ring(poly.exterior());
        for hole in poly.interiors() {
            ring(hole);
        }
    }
    d
}

fn polyline_data(pts: &[[f64; 2]], view: &View, close: bool) -> String {
    let mut d = String::new();
    for (i, p) in pts.iter().enumerate() {
        let (x, y) = view.p(p[0], p[1]);
        d.push_str(&format!(
            "{}{:.1},{:.1}",
            if i == 0 { "M" } else { "L" },
            x,
            y
        ));
    }
    if close {
        d.push('Z');
    }
    d
}

fn label(x: f64, y: f64, size: f64, s: &str) -> Text {
    Text::new(s)
        .set("x", format!("{x:.1}"))
        .set("y", format!("{y:.1}"))
        .set("font-size", size)
        .set("font-family", "sans-serif")
}

/// A regular grid of values over `[x0, x0 + (nx−1)·h] × [y0, y0 + (ny−1)·h]`, row by row from y0.
struct Grid {
    x0: f64,
    y0: f64,
    h: f64,
    nx: usize,
    ny: usize,
    values: Vec<f64>,
}

impl Grid {
    fn points(x0: f64, y0: f64, h: f64, nx: usize, ny: usize) -> Vec<[f64; 2]> {
        let mut pts = Vec::with_capacity(nx * ny);
        for j in 0..ny {
            for i in 0..nx {
                pts.push([x0 + i as f64 * h, y0 + j as f64 * h]);
            }
        }
        pts
    }

    /// The contour builder for this grid: the crate puts value k at cell centre k + ½, so the
    /// origin is moved back half a step.
    fn builder(&self) -> contour::ContourBuilder {
        contour::ContourBuilder::new(self.nx, self.ny, true)
            .x_origin(self.x0 - 0.5 * self.h)
            .y_origin(self.y0 - 0.5 * self.h)
            .x_step(self.h)
            .y_step(self.h)
    }
}

/// `settlement.svg`: settlement bands under each neighbour (from its own soil profile and the
/// drawdown there), drawdown isolines for context, the excavation and the wells, each building
/// outlined in its status colour.
pub fn settlement_svg(run: &CheckRun, results: &[NeighbourResult]) -> String {
    let model = run.model;
    let aq = run.field.aquifer();
    let rates: Vec<f64> = run.placement.wells.iter().map(|w| w.rate).collect();
    // Extent: neighbours and excavations, and wells.
    let mut xs = Vec::new();
    let mut ys = Vec::new();
    for n in &model.neighbours {
        for c in &n.footprint.exterior().0 {
            xs.push(c.x);
            ys.push(c.y);
        }
    }
    for e in &model.excavations {
        for c in &e.outline.exterior().0 {
            xs.push(c.x);
            ys.push(c.y);
        }
    }
    for w in &run.placement.wells {
        xs.push(w.position[0]);
        ys.push(w.position[1]);
    }
    let fold = |v: &[f64], f: fn(f64, f64) -> f64, init: f64| v.iter().copied().fold(init, f);
    let (mut xmin, mut xmax) = (
        fold(&xs, f64::min, f64::INFINITY),
        fold(&xs, f64::max, f64::NEG_INFINITY),
    );
    let (mut ymin, mut ymax) = (
        fold(&ys, f64::min, f64::INFINITY),
        fold(&ys, f64::max, f64::NEG_INFINITY),
    );
    if !(xmin.is_finite() && ymin.is_finite()) {
        (xmin, xmax, ymin, ymax) = (0.0, 1.0, 0.0, 1.0);
    }
    let pad = 0.08 * (xmax - xmin).max(ymax - ymin).max(1.0);
    xmin -= pad;
    xmax += pad;
    ymin -= pad;
    ymax += pad;
    let scale = PLOT_W / (xmax - xmin);
    let plot_h = ((ymax - ymin) * scale).clamp(300.0, 900.0);
    let scale = scale.min(plot_h / (ymax - ymin));
    let view = View {
        x0: xmin,
        y1: ymax,
        scale,
    };
    let width = MARGIN * 2.0 + PLOT_W + PANEL_W;
    let height = TITLE_H + plot_h + FOOT_H;

    // Settlement grids under each neighbour with a profile.
    let mut grids: Vec<(usize, Grid)> = Vec::new();
    let mut max_rho: f64 = 0.0;
    for (i, n) in model.neighbours.iter().enumerate() {
        if n.layers.is_empty() {
            continue;
        }
        let Some(bb) = n.footprint.bounding_rect() else {
            continue;
        };
        let span = bb.width().max(bb.height());
        let h = (span / 60.0).max(0.1);
        let nx = (bb.width() / h).ceil() as usize + 3;
        let ny = (bb.height() / h).ceil() as usize + 3;
        let (gx, gy) = (bb.min().x - h, bb.min().y - h);
        let pts = Grid::points(gx, gy, h, nx, ny);
        let levels = run.field.levels(&pts, &rates);
        let h0 = aq.initial_level;
        let values: Vec<f64> = levels
            .iter()
            .map(|lv| {
                neighbours::settlement_at(model, n, h0, lv.or_base(aq.base_level)).unwrap_or(0.0)
                    * 1e3
            })
            .collect();
        max_rho = values.iter().copied().fold(max_rho, f64::max);
        grids.push((
            i,
            Grid {
                x0: gx,
                y0: gy,
                h,
                nx,
                ny,
                values,
            },
        ));
    }
    let step = nice_step(max_rho, 8);
    let n_bands = ((max_rho / step).ceil() as usize).max(1);
    let thresholds: Vec<f64> = (0..=n_bands).map(|k| k as f64 * step).collect();

    let mut doc = Document::new()
        .set("xmlns", "http://www.w3.org/2000/svg")
        .set("width", format!("{width:.0}"))
        .set("height", format!("{height:.0}"))
        .set("viewBox", format!("0 0 {width:.0} {height:.0}"));
    doc = doc.add(
        Rectangle::new()
            .set("width", "100%")
            .set("height", "100%")
            .set("fill", "#ffffff"),
    );
    doc = doc.add(
        label(
            MARGIN,
            26.0,
            17.0,
            &format!("Settlement of neighbours from dewatering — {}", model.name),
        )
        .set("font-weight", "bold"),
    );
    doc = doc.add(label(MARGIN, 45.0, 11.5, "Bands: settlement (mm) under each building from its own soil profile (1D consolidation). Grey dashed lines: drawdown (m)."));
    doc = doc.add(
        Rectangle::new()
            .set("x", MARGIN)
            .set("y", TITLE_H)
            .set("width", PLOT_W)
            .set("height", format!("{plot_h:.1}"))
            .set("fill", "#f7f7f4")
            .set("stroke", "#999"),
    );

    // Clip paths for the footprints.
    let mut defs = Definitions::new();
    for (i, n) in model.neighbours.iter().enumerate() {
        let pts: Vec<[f64; 2]> = n
            .footprint
            .exterior()
            .0
            .iter()
            .map(|c| [c.x, c.y])
            .collect();
        defs = defs.add(
            ClipPath::new()
                .set("id", format!("fp{i}"))
                .add(SvgPath::new().set("d", polyline_data(&pts, &view, true))),
        );
    }
    defs = defs.add(
        ClipPath::new().set("id", "plot").add(
            Rectangle::new()
                .set("x", MARGIN)
                .set("y", TITLE_H)
                .set("width", PLOT_W)
                .set("height", format!("{plot_h:.1}")),
        ),
    );
    doc = doc.add(defs);

    // Drawdown isolines over the whole plot, for context.
    let nxd = 120usize;
    let hd = (xmax - xmin) / (nxd - 1) as f64;
    let nyd = ((ymax - ymin) / hd).ceil() as usize + 1;
    let dpts = Grid::points(xmin, ymin, hd, nxd, nyd);
    let dvals: Vec<f64> = run
        .field
        .levels(&dpts, &rates)
        .iter()
        .map(|lv| aq.initial_level - lv.or_base(aq.base_level))
        .collect();
    let dmax = dvals.iter().copied().fold(0.0f64, f64::max);
    let dstep = nice_step(dmax, 10);
    let dgrid = Grid {
        x0: xmin,
        y0: ymin,
        h: hd,
        nx: nxd,
        ny: nyd,
        values: dvals,
    };
    let dthr: Vec<f64> = (1..=((dmax / dstep).floor() as usize).min(40))
        .map(|k| k as f64 * dstep)
        .collect();
    let mut context = Group::new().set("clip-path", "url(#plot)");
    if let Ok(lines) = dgrid.builder().lines(&dgrid.values, &dthr) {
        for line in lines {
            let mut d = String::new();
            for ls in &line.geometry().0 {
                let pts: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                d.push_str(&polyline_data(&pts, &view, false));
            }
            context = context.add(
                SvgPath::new()
                    .set("d", d)
                    .set("fill", "none")
                    .set("stroke", "#8c8c8c")
                    .set("stroke-width", 0.8)
                    .set("stroke-dasharray", "4 3"),
            );
            // Label the longest piece at the vertex nearest its middle that is well inside the
            // plot.
            let inside = |c: &geo::Coord<f64>| {
                let (x, y) = view.p(c.x, c.y);
                x > MARGIN + 30.0
                    && x < MARGIN + PLOT_W - 60.0
                    && y > TITLE_H + 30.0
                    && y < TITLE_H + plot_h - 30.0
            };
            let longest = line.geometry().0.iter().max_by_key(|ls| ls.0.len());
            if let Some(c) = longest.and_then(|ls| {
                let mid = ls.0.len() / 2;
                (0..ls.0.len())
                    .map(|k| (k as isize - mid as isize).unsigned_abs())
                    .zip(ls.0.iter())
                    .filter(|(_, c)| inside(c))
                    .min_by_key(|(d, _)| *d)
                    .map(|(_, c)| *c)
            }) {
                let (x, y) = view.p(c.x, c.y);
                context = context.add(
                    label(
                        x + 2.0,
                        y - 2.0,
                        9.0,
                        &format!("{} m", fmt_value(line.threshold(), dstep)),
                    )
                    .set("fill", "#6f6f6f"),
                );
            }
        }
    }
    doc = doc.add(context);

    // Excavations.
    for e in &model.excavations {
        let pts: Vec<[f64; 2]> = e.outline.exterior().0.iter().map(|c| [c.x, c.y]).collect();
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&pts, &view, true))
                .set("fill", "#d9d4c7")
                .set("stroke", "#5b5548")
                .set("stroke-width", 1.5),
        );
        if let Some(c) = geo::InteriorPoint::interior_point(&e.outline) {
            let (x, y) = view.p(c.x(), c.y());
            doc = doc.add(
                label(x, y, 12.0, &e.name)
                    .set("text-anchor", "middle")
                    .set("fill", "#3d3a33"),
            );
        }
    }

    // Settlement bands, clipped to each footprint.
    for (i, g) in &grids {
        let mut group = Group::new().set("clip-path", format!("url(#fp{i})"));
        if let Ok(bands) = g.builder().isobands(&g.values, &thresholds) {
            for b in bands {
                let mid = 0.5 * (b.min_v() + b.max_v());
                group = group.add(
                    SvgPath::new()
                        .set("d", path_data(b.geometry(), &view))
                        .set("fill", ramp(mid / (n_bands as f64 * step)))
                        .set("fill-rule", "evenodd")
                        .set("stroke", "none"),
                );
            }
        }
        let inner: Vec<f64> = thresholds[1..].to_vec();
        if let Ok(lines) = g.builder().lines(&g.values, &inner) {
            for line in lines {
                let mut d = String::new();
                for ls in &line.geometry().0 {
                    let pts: Vec<[f64; 2]> = ls.0.iter().map(|c| [c.x, c.y]).collect();
                    d.push_str(&polyline_data(&pts, &view, false));
                }
                group = group.add(
                    SvgPath::new()
                        .set("d", d)
                        .set("fill", "none")
                        .set("stroke", "#4a2a1a")
                        .set("stroke-width", 0.6),
                );
            }
        }
        doc = doc.add(group);
    }

    // Footprints in status colour, with labels.
    for (i, r) in results.iter().enumerate() {
        let colour = status_colour(r.status);
        doc = doc.add(
            SvgPath::new()
                .set("d", polyline_data(&r.footprint, &view, true))
                .set("fill", "none")
                .set("stroke", colour)
                .set("stroke-width", 2.5),
        );
        let top = r
            .footprint
            .iter()
            .fold(f64::NEG_INFINITY, |m, p| m.max(p[1]));
        let left = r.footprint.iter().fold(f64::INFINITY, |m, p| m.min(p[0]));
        let (x, y) = view.p(left, top);
        let rho = r
            .worst_settlement
            .as_ref()
            .and_then(|s| s.settlement_m)
            .map_or("no profile".into(), |s| format!("max {:.1} mm", s * 1e3));
        let words = format!("{} — {} — {}", r.name, rho, r.status.word());
        // Keep the label inside the plot (about 0.6 em a character).
        let width = words.chars().count() as f64 * 11.0 * 0.6;
        let x = x.min(MARGIN + PLOT_W - width - 4.0).max(MARGIN + 4.0);
        let y = if y - 5.0 < TITLE_H + 12.0 {
            y + 16.0
        } else {
            y
        };
        doc = doc.add(
            label(x, y - 5.0, 11.0, &words)
                .set("fill", colour)
                .set("font-weight", "bold"),
        );
        if let Some(s) = &r.worst_settlement {
            let (px, py) = view.p(s.position[0], s.position[1]);
            doc = doc.add(
                Circle::new()
                    .set("cx", format!("{px:.1}"))
                    .set("cy", format!("{py:.1}"))
                    .set("r", 3.0)
                    .set("fill", "none")
                    .set("stroke", "#000")
                    .set("stroke-width", 1.2)
                    .set("data-neighbour", i),
            );
        }
    }

    // Wells: abstraction filled, recharge open with a ring.
    for w in &run.placement.wells {
        let (x, y) = view.p(w.position[0], w.position[1]);
        let c = Circle::new()
            .set("cx", format!("{x:.1}"))
            .set("cy", format!("{y:.1}"))
            .set("r", 3.5);
        doc = doc.add(if w.rate < 0.0 {
            c.set("fill", "#ffffff")
                .set("stroke", "#1f6fb2")
                .set("stroke-width", 2.0)
        } else {
            c.set("fill", "#1f3b57")
        });
    }

    // Scale bar and north arrow.
    let bar = nice_step((xmax - xmin) / 6.0, 1);
    let (bx, by) = (MARGIN + 12.0, TITLE_H + 22.0);
    doc = doc.add(
        Line::new()
            .set("x1", bx)
            .set("y1", by)
            .set("x2", format!("{:.1}", bx + bar * scale))
            .set("y2", by)
            .set("stroke", "#222")
            .set("stroke-width", 2.0),
    );
    doc = doc.add(label(bx, by - 4.0, 10.0, &format!("{bar:.0} m")));
    let (nx0, ny0) = (MARGIN + PLOT_W - 22.0, TITLE_H + 16.0);
    doc = doc.add(
        SvgPath::new()
            .set("d", format!("M{nx0:.1},{ny0:.1} l-6,16 l6,-5 l6,5 Z",))
            .set("fill", "#222"),
    );
    doc = doc.add(label(nx0 - 4.0, ny0 + 28.0, 10.0, "N"));

    // Legend panel.
    let lx = MARGIN * 1.5 + PLOT_W;
    let mut ly = TITLE_H + 6.0;
    doc = doc.add(label(lx, ly + 8.0, 12.0, "settlement, mm").set("font-weight", "bold"));
    ly += 18.0;
    for k in (0..n_bands).rev() {
        let mid = (k as f64 + 0.5) * step;
        doc = doc.add(
            Rectangle::new()
                .set("x", lx)
                .set("y", format!("{ly:.1}"))
                .set("width", 22.0)
                .set("height", 14.0)
                .set("fill", ramp(mid / (n_bands as f64 * step)))
                .set("stroke", "#888")
                .set("stroke-width", 0.5),
        );
        doc = doc.add(label(
            lx + 28.0,
            ly + 11.0,
            10.5,
            &format!(
                "{} – {}",
                fmt_step(k as f64 * step),
                fmt_step((k + 1) as f64 * step)
            ),
        ));
        ly += 15.0;
    }
    ly += 12.0;
    doc = doc.add(label(lx, ly, 12.0, "buildings").set("font-weight", "bold"));
    for (what, st) in [
        ("within limits", Status::Pass),
        ("within, ≥ 80 % of a limit", Status::Close),
        ("over a limit", Status::Fail),
        ("nothing to check", Status::NotChecked),
    ] {
        ly += 17.0;
        doc = doc.add(
            Rectangle::new()
                .set("x", lx)
                .set("y", format!("{:.1}", ly - 10.0))
                .set("width", 22.0)
                .set("height", 12.0)
                .set("fill", "none")
                .set("stroke", status_colour(st))
                .set("stroke-width", 2.5),
        );
        doc = doc.add(label(lx + 28.0, ly, 10.5, what));
    }
    ly += 22.0;
    doc = doc.add(label(lx, ly, 12.0, "wells").set("font-weight", "bold"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.5)
            .set("fill", "#1f3b57"),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "abstraction"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.5)
            .set("fill", "#fff")
            .set("stroke", "#1f6fb2")
            .set("stroke-width", 2.0),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "recharge"));
    ly += 16.0;
    doc = doc.add(
        Circle::new()
            .set("cx", lx + 8.0)
            .set("cy", format!("{:.1}", ly - 4.0))
            .set("r", 3.0)
            .set("fill", "none")
            .set("stroke", "#000")
            .set("stroke-width", 1.2),
    );
    doc = doc.add(label(lx + 28.0, ly, 10.5, "largest settlement"));
    ly += 24.0;
    for r in results {
        let line = match (&r.worst_settlement, r.max_distortion) {
            (Some(s), Some(b)) => format!(
                "{}: {:.1} mm, β {}",
                truncate(&r.name, 18),
                s.settlement_m.unwrap_or(0.0) * 1e3,
                ratio_text(b)
            ),
            _ => format!(
                "{}: {:.2} m drawdown",
                truncate(&r.name, 18),
                r.worst_drawdown.drawdown_m
            ),
        };
        doc = doc.add(label(lx, ly, 10.0, &line).set("fill", status_colour(r.status)));
        ly += 14.0;
    }

    // Method and caution.
    let mut fy = TITLE_H + plot_h + 18.0;
    let method = format!(
        "Method: drawdown by superposition (Strack discharge potential); Δσ′ = γ_w·Δh below the lowered water level ({}); ρ = Σ m_v·Δσ′·Δz or C_c·H/(1+e₀)·log₁₀((σ′₀+Δσ′)/σ′₀). Limits marked * in the tables are rules of thumb (common practice, no source).",
        if model.neighbours.iter().any(|n| n.buoyancy_loss) {
            "buoyancy-loss form where chosen"
        } else {
            "simple form"
        }
    );
    for line in wrap(&method, 150, "").lines() {
        doc = doc.add(label(MARGIN, fy, 10.0, line).set("fill", "#333"));
        fy += 13.0;
    }
    for line in wrap(&format!("CAUTION: {CAUTION}"), 150, "").lines() {
        doc = doc.add(label(MARGIN, fy, 10.0, line).set("fill", "#8a1c1c"));
        fy += 13.0;
    }
    doc.to_string()
}

/// A contour value written with as many decimals as its step needs.
fn fmt_value(v: f64, step: f64) -> String {
    let decimals = if step >= 1.0 {
        0
    } else {
        (-step.log10()).ceil().clamp(0.0, 3.0) as usize
    };
    let text = format!("{v:.decimals$}");
    if decimals > 0 && format!("{:.*}", decimals + 1, step).ends_with('5') {
        format!("{v:.*}", decimals + 1)
    } else {
        text
    }
}

fn fmt_step(v: f64) -> String {
    if (v - v.round()).abs() < 1e-9 {
        format!("{v:.0}")
    } else {
        format!("{v:.1}")
    }
}
