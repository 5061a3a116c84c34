//! The neighbour tables: `neighbours.csv`, one row per building with its worst drawdown,
//! settlement (checked, final, at the end of the works), distortion, deflection ratio, damage
//! category, limits and their basis, and `neighbour_points.csv`, the corners and
//! worst points of every building with level, drawdown and settlement.

use crate::safety::neighbours::{NeighbourResult, Sample};

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
        "final_settlement_mm",
        "end_of_works_settlement_mm",
        "works_duration_days",
        "end_of_works_upper_bound",
        "max_deflection_ratio",
        "damage_category",
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
            opt(r.max_final_settlement_m, &|v| format!("{:.2}", v * 1e3)),
            opt(r.max_end_of_works_settlement_m, &|v| {
                format!("{:.2}", v * 1e3)
            }),
            opt(r.works_duration.as_ref().map(|w| w.0), &|v| {
                format!("{:.1}", v / 86_400.0)
            }),
            if r.max_end_of_works_settlement_m.is_some() {
                r.end_of_works_upper_bound.to_string()
            } else {
                String::new()
            },
            opt(r.max_deflection_ratio, &|v| format!("{v:.3e}")),
            r.damage.as_ref().map_or(String::new(), |(c, _, _)| {
                format!("{} {}", c.number, c.name)
            }),
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
        let mut rows: Vec<(String, &Sample)> =
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
