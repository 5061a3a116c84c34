//! The uncertainty section of `report.html` (written by `drydig uncertainty`): the verdict, the
//! inputs and outputs at P10 / P50 / P90, the implied contingency, the design counts, the
//! charts inline, the notes and the caution.

use super::page::{document, facts, inline_svg, table, Part};
use crate::findings::uncertainty::UncertaintyFindings;
use crate::input::model::Model;
use crate::report::format::{esc, Fmt};
use crate::report::uncertainty_text::{implied_contingency, input_value, notes, output_value};
use crate::uncertainty::run::Mode;

/// The uncertainty part: tables and `charts` ((file name, SVG)) inline.
pub fn part(model: &Model, found: &UncertaintyFindings, charts: &[(String, String)]) -> Part {
    let run = &found.run;
    let f = Fmt::new(model.units, model.ground_level);
    let headline = crate::report::verdict::headline(&found.verdict, &f);
    let mut body = format!(
        "<p class=\"result{}\">{}</p>\n",
        if found.verdict.is_met() { "" } else { " bad" },
        esc(&headline)
    );
    let mut rows = vec![
        ("samples", format!("{} (seed {})", run.samples, run.seed)),
        (
            "evaluated",
            match run.mode {
                Mode::Check => "the file's layout at its rates".to_string(),
                Mode::Design => "the fewest-wells design on each sample".to_string(),
            },
        ),
        ("implied contingency", implied_contingency(run)),
    ];
    if let Some(r) = run.rank_correlation {
        rows.push(("rank correlation of K and S", format!("{r:.2}")));
    }
    if let Some(r) = run.convergence.and_then(|c| c.replicates) {
        rows.push((
            "sampling convergence of P90 (standard deviation over Latin hypercubes of other seeds)",
            format!(
                "{:.1} % over {} hypercubes of N = {} (largest move {:.1} %)",
                100.0 * r.relative_sd,
                r.count,
                run.samples,
                100.0 * r.relative_max
            ),
        ));
    }
    if let Some(c) = run.convergence {
        rows.push((
            "sampling convergence of P90 (95 % bootstrap, an upper bound for Latin hypercube)",
            format!(
                "± {:.1} % at N = {}",
                100.0 * c.relative_half_width,
                c.samples
            ),
        ));
    }
    match run.mode {
        Mode::Check => {
            rows.push((
                "every target met with the given rates, every well within its limits",
                format!("{:.1} % of samples", run.fraction_met * 100.0),
            ));
            rows.push((
                "samples with a well past a limit (capacity, lowest level)",
                run.wells_past_limit.to_string(),
            ));
        }
        Mode::Design => {
            rows.push((
                "P50 design (every input at its median)",
                run.p50_design
                    .map_or("no layout meets every target".into(), |(w, q)| {
                        format!("{w} wells, {}", f.flow(q))
                    }),
            ));
            rows.push((
                "robust design",
                run.robust.as_ref().map_or("none".into(), |r| {
                    format!(
                        "{} wells, {}; every target met in {:.1} % of samples ({:.0} % asked)",
                        r.wells,
                        f.flow(r.total_flow_m3_per_s),
                        r.fraction_met * 100.0,
                        run.reliability * 100.0
                    )
                }),
            ));
        }
    }
    body.push_str(&facts(&rows));
    let inputs: Vec<Vec<String>> = run
        .inputs
        .iter()
        .map(|i| {
            let q = |p: f64| esc(&input_value(i.kind, i.distribution.quantile(p), &f));
            vec![esc(i.kind.field()), esc(&i.text), q(0.1), q(0.5), q(0.9)]
        })
        .collect();
    body.push_str("<h3>Uncertain inputs</h3>\n");
    body.push_str(&table(
        &["input", "as written", "#P10", "#P50", "#P90"],
        &inputs,
    ));
    let outputs: Vec<Vec<String>> = run
        .series
        .iter()
        .map(|s| {
            let v =
                |x: Option<f64>| x.map_or("—".into(), |x| esc(&output_value(s.measure, x, &f)));
            let p = s.percentiles;
            vec![
                esc(&s.label),
                v(p.map(|p| p.p10)),
                v(p.map(|p| p.p50)),
                v(p.map(|p| p.p90)),
            ]
        })
        .collect();
    body.push_str("<h3>Outputs</h3>\n");
    body.push_str(&table(&["output", "#P10", "#P50", "#P90"], &outputs));
    for (name, svg) in charts {
        body.push_str(&format!(
            "<figure>{}<figcaption>{}</figcaption></figure>\n",
            inline_svg(svg, name.trim_end_matches(".svg")),
            esc(name)
        ));
    }
    body.push_str("<ul>\n");
    for n in notes(run) {
        body.push_str(&format!("<li>{}</li>\n", esc(&n)));
    }
    body.push_str("</ul>\n");
    Part::new("uncertainty", "Uncertainty", body)
}

/// report.html of `drydig uncertainty`: the section and the caution.
pub fn report(
    model: &Model,
    found: &UncertaintyFindings,
    charts: &[(String, String)],
    date: &str,
) -> String {
    let caution = Part::new(
        "cautions",
        "Cautions",
        format!(
            "<p class=\"caution\">{}</p>\n",
            esc(crate::caution::CAUTION)
        ),
    );
    document(
        &model.name,
        date,
        "Dewatering uncertainty report",
        &[part(model, found, charts), caution],
    )
}
